import type { StackSpec } from "../src/study/stackTypes.js";

/**
 * Reference case: bare regular upright 54.74° pyramids of 10 µm base on the front of 180 µm Si
 * (from the pyramid base plane to the rear), planar rear with an ideal mirror of reflectance 0.95,
 * Si from Green 2008, normal incidence. The tracer bench (bench/trace.ts) and the replica tests
 * (tests/trace/replicaStacks.ts) share it.
 */
export const BENCH_STACK: StackSpec = {
  incidence: "air",
  layers: [],
  front: { texture: { type: "upright-pyramids", baseUm: 10, facetAngleDeg: 54.74 }, films: [] },
  absorber: { material: "Si-Green2008", thicknessUm: 180 },
  rear: { ideal: { kind: "mirror", reflectance: 0.95 } },
  boundary: "periodic",
};
