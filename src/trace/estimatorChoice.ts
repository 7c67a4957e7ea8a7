import type { Estimator } from "./compiledStack.js";

/**
 * The default estimator of one grid point, chosen from the absorber's single-pass optical depth αW
 * and the shape of the stack. Every rule was measured with `npm run bench` (parts "trace" and
 * "merit": the figure of merit 1/(SE² × CPU time) of R and A_absorber against the analog estimator
 * at every point of the demo studies; DEVELOPERS.md "Tracer efficiency").
 */
export interface EstimatorChoice {
  estimator: Estimator;
  /** Expected-value mode: below this weight a ray continues with analog absorption. */
  rouletteWeight: number;
  /** Expected-value mode: least weight of both parts for a split on the way in (0 = never split). */
  splitMinWeight: number;
  /** From this polar angle of incidence on, the point is traced analog (Infinity = never). */
  analogFromThetaDeg: number;
  /** Expected-value mode: least weight of both parts for a split on the way out (0 = never split). */
  escapeSplitMinWeight: number;
  /** Expected-value mode, unpolarised light from the front: from this polar angle on each ray is traced as its s and p halves (Infinity = never). */
  polarizationSplitFromThetaDeg: number;
}

/** From this αW on one pass takes most of the light; below it lies the light-trapping tail. */
export const OPAQUE_DEPTH = 0.5;
/** Below this αW the deep tail: no split on a texture, early roulette. */
export const DEEP_TAIL_DEPTH = 0.1;
export const OPAQUE_ROULETTE_WEIGHT = 0.02;
export const TAIL_ROULETTE_WEIGHT = 0.2;
export const DEEP_TAIL_ROULETTE_WEIGHT = 0.5;
/**
 * Oblique light on a bare planar front where the absorber is opaque: each expected-value ray goes as
 * its s and p halves from this polar angle on (the kernel, traceBatch).
 */
export const POLARIZATION_SPLIT_DEG = 60;
/** Grazing incidence on a texture in the deep tail: traced analog from this polar angle on. */
export const GRAZING_ANALOG_DEG = 70;
/** Both parts of a split on the way in weigh at least this much (a first reflection of 0.3 % still splits). */
export const DEFAULT_SPLIT_MIN_WEIGHT = 0.001;
/**
 * On a texture where 0.1 ≤ αW ≤ TAIL_SPLIT_DEPTH: both parts weigh at least this much, so the first
 * facet's reflection splits and the weaker reflections after it are sampled.
 */
export const TAIL_SPLIT_MIN_WEIGHT = 0.1;
/** From this αW up to OPAQUE_DEPTH the texture's split floor falls log-linearly to DEFAULT_SPLIT_MIN_WEIGHT. */
export const TAIL_SPLIT_DEPTH = 0.2;

/** Split floor on a texture in the trapping tail (0.1 ≤ αW < 0.5), continuous with the opaque one at αW 0.5. */
export function tailSplitMinWeight(singlePassDepth: number): number {
  if (singlePassDepth <= TAIL_SPLIT_DEPTH) return TAIL_SPLIT_MIN_WEIGHT;
  const f = Math.min(1, (singlePassDepth - TAIL_SPLIT_DEPTH) / (OPAQUE_DEPTH - TAIL_SPLIT_DEPTH));
  return TAIL_SPLIT_MIN_WEIGHT * Math.pow(DEFAULT_SPLIT_MIN_WEIGHT / TAIL_SPLIT_MIN_WEIGHT, f);
}
/** Deep tail under Sobol' launch points: roulette this late, every way in and out split. */
export const QMC_TAIL_ROULETTE_WEIGHT = 0.1;

/**
 * The rules serve the photocurrent and the yield, sums over wavelengths: there a point's share of the
 * summed variance counts against its share of the summed time, and the tail wavelengths carry most of
 * the variance. Per point, each rule was also compared with the analog estimator ("merit" bench).
 * - Where αW ≥ 0.1: expected value and splitting on the way in, so the first reflection is an
 *   expected value; roulette at weight 0.02 where αW ≥ 0.5 (the few passes are cheap to follow),
 *   0.2 below. Below αW 0.5 on a texture every reflected part re-enters through another facet and
 *   runs the trap again, so small parts are sampled instead: both parts of a split weigh at least
 *   0.1 where αW ≤ 0.2, the floor falling log-linearly to 0.001 at αW 0.5. Random pyramids at
 *   1075 nm (αW 0.13), 0–20°: merit 1.02–1.11 of analog against 0.86–0.94 with the floor 0.001,
 *   the photocurrent's merit within 1 % on the demo stack and 3.4 % on the thickness sweep. Measured
 *   against it: the floor 0.1 up to αW 0.5 (photocurrent up to −4.4 %), 0.2 (−5 to −28 %: the first
 *   reflection itself no longer splits), 0.03 (points 0.94–1.02), 0.06 (first looks at 0.95), no
 *   split (−9 to −18 %); roulette 0.3 or 0.5 with the 0.001 floor left the points below 1.
 * - In the deep tail (αW < 0.1) rays run long and weighted paths cost more than they save: roulette
 *   at weight 0.5, and splitting only when the light meets a planar front (its reflected part just
 *   leaves; on a texture it re-enters through the next facet and runs the whole trap a second time).
 * - Analog in the trapping tail (αW < 0.5) of a module (thick layers in front of or behind the
 *   absorber): light leaving the cell is partly sent back by the glass, the escape stays a long chain
 *   of sampled events, and weighted absorption lost R up to 40 % of its merit at 1050–1150 nm on the
 *   glass–glass demo stack.
 * - Analog at grazing incidence (θ ≥ 70°) on a texture in the deep tail: much of the light is
 *   reflected before it enters, and the weighted rays' extra events cost about what the variance
 *   they save is worth (random pyramids at 1100 nm, 70° and 80°: merit R 1.00 / 0.90, A 1.06 / 0.95
 *   of analog; 1125–1150 nm 1.01–1.39; 4 × 20 000 rays, 2026-12-05). Not where 0.1 ≤ αW < 0.5:
 *   there the split floor makes expected value the better estimator at grazing incidence too
 *   (random pyramids at 70° / 80°: 1025 nm (αW 0.63, opaque) 14 / 8, 1050 nm (αW 0.29) 3.8 / 3.2,
 *   1075 nm (αW 0.13) 1.6 / 1.6 for R and A alike; the rule was set before the split floor, when
 *   1050–1125 nm measured 0.89–0.99).
 * - Under Sobol' launch points (`rays.sampling: "sobol"`), in the deep tail on a textured front (no
 *   module): split every way in and every way out (light in the absorber meeting the face it may
 *   leave through: the escaping part goes on, the returned part waits), roulette at 0.1. With every
 *   reflect-or-transmit choice an expected value, a ray's R and A are nearly a function of its launch
 *   point, which the Sobol' points integrate far better than random ones: on the bench case at
 *   1150 nm, from the spread of 24 independent runs of 64 000 rays, merit 2.1 (R) and 2.5 (A) of the
 *   native analog kernel (roulette 0.2: 1.8 / 1.9; 0.05: 1.5 / 2.1) against 0.5 / 0.8 for the random
 *   default, while with random launch points the same splitting loses (0.3–0.5 / 0.7–0.9).
 * The weights are set in every case, for a caller who asks for expected value where analog is the default.
 */
export function chooseEstimator(singlePassDepth: number, plainFront: boolean, hasThickLayers: boolean, sobol = false): EstimatorChoice {
  const opaque = singlePassDepth >= OPAQUE_DEPTH;
  const deepTail = singlePassDepth < DEEP_TAIL_DEPTH;
  const qmcTail = sobol && deepTail && !plainFront && !hasThickLayers;
  return {
    estimator: !opaque && hasThickLayers ? "analog" : "expected",
    rouletteWeight: opaque ? OPAQUE_ROULETTE_WEIGHT : qmcTail ? QMC_TAIL_ROULETTE_WEIGHT : deepTail ? DEEP_TAIL_ROULETTE_WEIGHT : TAIL_ROULETTE_WEIGHT,
    splitMinWeight: opaque || plainFront || qmcTail ? DEFAULT_SPLIT_MIN_WEIGHT : deepTail ? 0 : tailSplitMinWeight(singlePassDepth),
    analogFromThetaDeg: deepTail && !plainFront ? GRAZING_ANALOG_DEG : Infinity,
    escapeSplitMinWeight: qmcTail ? DEFAULT_SPLIT_MIN_WEIGHT : 0,
    polarizationSplitFromThetaDeg: opaque && plainFront && !hasThickLayers ? POLARIZATION_SPLIT_DEG : Infinity,
  };
}
