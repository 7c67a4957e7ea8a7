/** The convergence tests' stack: polished 180 µm Si, no coating, planar silver rear (study-file form). */
export const BARE_SI_STACK = {
  incidence: "air",
  front: { texture: { type: "planar" }, films: [] },
  absorber: { material: "Si", thicknessUm: 180 },
  rear: { texture: { type: "planar" }, films: [], exit: "Ag" },
};
