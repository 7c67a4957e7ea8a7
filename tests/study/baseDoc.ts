/** The small valid study document the study tests edit: textured front, SiNx film, mirror rear. */
export function baseDoc(): Record<string, any> {
  return {
    name: "t",
    stack: {
      front: { texture: { type: "upright-pyramids", baseUm: 10 }, films: [{ material: "SiNx", thicknessNm: 75 }] },
      absorber: { material: "Si", thicknessUm: 180 },
      rear: { ideal: { kind: "mirror", reflectance: 0.95 } },
    },
    grid: { thetaDeg: { from: 0, to: 80, step: 10 }, phiDeg: [0], wavelengthNm: { from: 400, to: 1100, step: 100 } },
    rays: { perPoint: 100, batch: 50 },
    seed: 1,
  };
}
