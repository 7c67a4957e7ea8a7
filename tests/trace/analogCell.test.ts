import { describe, expect, it } from "vitest";
import { RandomStream, streamKey } from "../../src/random/stream.js";
import type { StackSpec } from "../../src/study/stackTypes.js";
import { compileStack } from "../../src/trace/compile.js";
import { traceBatch, type Polarization } from "../../src/trace/kernel.js";
import { createTally } from "../../src/trace/tally.js";
import { registryWith, stackOf } from "./helpers.js";

// The bare-cell analog loop (src/trace/analogCell.ts) must be the general loop (kernel.ts) call for
// call: same random draws, same arithmetic, so the tallies agree to the last bit. The general loop
// is forced by clearing the compiled flag.

const registry = registryWith();
const arc = [{ material: "SiNx", thicknessNm: 75 }];
const upright = { type: "upright-pyramids", baseUm: 10, facetAngleDeg: 54.74 } as const;

const cells: Record<string, StackSpec> = {
  "upright pyramids, ARC, ideal mirror": stackOf({ front: { texture: upright, films: arc }, absorber: { material: "Si", thicknessUm: 180 }, rear: { ideal: { kind: "mirror", reflectance: 0.95 } } }),
  "inverted pyramids, ideal Lambertian rear": stackOf({
    front: { texture: { type: "inverted-pyramids", baseUm: 6, facetAngleDeg: 54.74 }, films: arc },
    absorber: { material: "Si", thicknessUm: 120 },
    rear: { ideal: { kind: "lambertian", reflectance: 0.9 } },
  }),
  "planar, rear into air (T channels)": stackOf({ front: { texture: { type: "planar" }, films: arc }, absorber: { material: "Si", thicknessUm: 100 }, rear: { texture: { type: "planar" }, films: [], exit: "air" } }),
  "pyramids, dielectric + silver rear": stackOf({
    front: { texture: upright, films: [] },
    absorber: { material: "Si", thicknessUm: 150 },
    rear: { texture: { type: "planar" }, films: [{ material: "SiO2", thicknessNm: 100 }], exit: "Ag" },
  }),
};

function tallyOf(stack: StackSpec, cellLoop: boolean, wavelengthNm: number, thetaDeg: number, phiDeg: number | null, pol: Polarization): { tally: Float64Array; eligible: boolean } {
  const cs = compileStack(stack, registry, wavelengthNm, { estimator: "analog" });
  const eligible = cs.analogCellLoop;
  cs.analogCellLoop = cellLoop;
  const tally = createTally(cs);
  traceBatch(cs, thetaDeg, phiDeg, 1500, new RandomStream(streamKey(11, wavelengthNm, thetaDeg)), tally, pol);
  return { tally, eligible };
}

describe("bare-cell analog loop", () => {
  for (const [name, stack] of Object.entries(cells)) {
    it(`${name}: bit-identical to the general loop`, () => {
      const cases: [number, number, number | null, Polarization][] = [
        [600, 0, 0, "unpolarized"],
        [1000, 40, null, "s"],
        [1150, 75, 30, "p"],
      ];
      for (const [wl, th, ph, pol] of cases) {
        const fast = tallyOf(stack, true, wl, th, ph, pol);
        const general = tallyOf(stack, false, wl, th, ph, pol);
        expect(fast.eligible).toBe(true);
        expect(Buffer.from(fast.tally.buffer).equals(Buffer.from(general.tally.buffer))).toBe(true);
      }
    });
  }

  // The loop adds its rays' whole counts (channels, passes, escape angles) to the tally once per
  // batch (cellFold.ts): several batches into one tally, and a depth grid, still give the general
  // loop's tally to the last bit.
  it("several batches into one tally, with a depth grid: bit-identical to the general loop", () => {
    const run = (cellLoop: boolean, wl: number): Buffer => {
      const cs = compileStack(cells["upright pyramids, ARC, ideal mirror"], registry, wl, { estimator: "analog", depthEdgesUm: [0, 1, 3, 10, 30, 180] });
      cs.analogCellLoop = cellLoop;
      const tally = createTally(cs);
      for (let b = 0; b < 4; b++) traceBatch(cs, 10 * b, b === 2 ? null : 0, 700, new RandomStream(streamKey(5, wl, b)), tally);
      return Buffer.from(tally.buffer);
    };
    for (const wl of [600, 1150]) expect(run(true, wl).equals(run(false, wl))).toBe(true);
  });

  it("is not taken for modules, meshes, randomisers, rear textures or the expected-value estimator", () => {
    const module = stackOf({
      layers: [{ name: "glass", material: "glass", thicknessUm: 3200, topFilms: [] }],
      front: { texture: upright, films: arc },
      absorber: { material: "Si", thicknessUm: 180 },
      rear: { ideal: { kind: "mirror", reflectance: 0.95 } },
    });
    const randomPyramids = stackOf({
      front: { texture: { type: "random-pyramids", meanBaseUm: 4, sizeSpread: 0.3, count: 8, tileUm: 12, facetAngleDeg: 54.74, seed: 3 }, films: arc },
      absorber: { material: "Si", thicknessUm: 170 },
      rear: { ideal: { kind: "mirror", reflectance: 0.95 } },
    });
    const lambertianFront = stackOf({ front: { texture: { type: "lambertian" }, films: [] }, absorber: { material: "Si", thicknessUm: 100 }, rear: { ideal: { kind: "mirror", reflectance: 0.9 } } });
    const texturedRear = stackOf({ front: { texture: { type: "planar" }, films: arc }, absorber: { material: "Si", thicknessUm: 100 }, rear: { texture: upright, films: [], exit: "air" } });
    for (const s of [module, randomPyramids, lambertianFront, texturedRear]) expect(compileStack(s, registry, 1000, { estimator: "analog" }).analogCellLoop).toBe(false);
    // The flag marks the stack; only analog batches of front light take the loop (kernel.ts), so the
    // expected-value tally of an eligible stack is unchanged by it.
    const stack = cells["upright pyramids, ARC, ideal mirror"];
    const run = (flag: boolean): Buffer => {
      const cs = compileStack(stack, registry, 1000, { estimator: "expected" });
      cs.analogCellLoop = flag;
      const tally = createTally(cs);
      traceBatch(cs, 20, 0, 800, new RandomStream("expected"), tally);
      return Buffer.from(tally.buffer);
    };
    expect(run(true).equals(run(false))).toBe(true);
  });
});
