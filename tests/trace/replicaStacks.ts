import type { StackSpec } from "../../src/study/stackTypes.js";
import { BENCH_STACK } from "../../bench/benchStack.js";

/** Stacks of the replica-error tests (random and Sobol' launch sampling). */
// The tracer benchmark stack: bare upright pyramids, 180 µm Si, ideal mirror 0.95.
export const BENCH: StackSpec = BENCH_STACK;
export const PLANAR: StackSpec = { ...BENCH, front: { texture: { type: "planar" }, films: [{ material: "SiNx-Vogt2015-n1.91", thicknessNm: 75 }] } };
// The demo random-pyramid texture (configs/demo-random-pyramids.study.json) on a silver rear.
export const RANDOM: StackSpec = {
  ...BENCH,
  front: { texture: { type: "random-pyramids", meanBaseUm: 5, sizeSpread: 0.3, count: 16, tileUm: 10, facetAngleDeg: 54.74, seed: 7 }, films: [{ material: "SiNx-Vogt2015-n1.91", thicknessNm: 75 }] },
  rear: { texture: { type: "planar" }, films: [], exit: "Ag-JohnsonChristy1972" },
};
