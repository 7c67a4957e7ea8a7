import type { StudyGrid, RaysPlan, SpectrumChoice } from "../study/studyTypes.js";
import { pointStdErr } from "./tally.js";

/** A deterministic subset of the points: shard `index` (1-based) of `count`. */
export interface ShardSpec {
  index: number;
  count: number;
}

/** What a run needs to know about each combination (also stored in shard outputs for merging). */
export interface ComboPlan {
  label: string;
  values: Record<string, number>;
  hash: string;
  channels: string[];
  absorberThicknessUm: number;
  /** The combination's values in words with units ("Si 180 µm · SiNx 65 nm"); absent without a sweep. */
  title?: string;
  /** "rear": traced with light from behind the rear (unset: from the front). */
  lightFrom?: "rear";
}

/** Everything that fixes the work of a sweep; plain JSON (written into shard partials). */
export interface SweepPlan {
  studyName: string;
  studyHash: string;
  toolVersion: string;
  /** Fingerprint of the running code (see buildId.ts). */
  buildId: string;
  seed: number;
  grid: StudyGrid;
  rays: RaysPlan;
  combos: ComboPlan[];
  /** Spectrum for the photocurrent summaries, and the directory a CSV spectrum is relative to. */
  spectrum: SpectrumChoice;
  baseDir: string;
}

export interface PointCoords {
  combo: number;
  it: number;
  ip: number;
  il: number;
}

export function pointsPerCombo(grid: StudyGrid): number {
  return grid.thetaDeg.length * grid.phiDeg.length * grid.wavelengthNm.length;
}

export function totalPoints(plan: SweepPlan): number {
  return plan.combos.length * pointsPerCombo(plan.grid);
}

/** Global point number, order [combo][theta][phi][lambda] (the matrix order inside a combo). */
export function pointId(grid: StudyGrid, c: PointCoords): number {
  return ((c.combo * grid.thetaDeg.length + c.it) * grid.phiDeg.length + c.ip) * grid.wavelengthNm.length + c.il;
}

export function pointCoords(grid: StudyGrid, p: number): PointCoords {
  const nL = grid.wavelengthNm.length;
  const nP = grid.phiDeg.length;
  const nT = grid.thetaDeg.length;
  const il = p % nL;
  const ip = Math.floor(p / nL) % nP;
  const it = Math.floor(p / (nL * nP)) % nT;
  const combo = Math.floor(p / (nL * nP * nT));
  return { combo, it, ip, il };
}

/** Points are dealt round-robin, so every shard gets a similar mix of angles and wavelengths. */
export function inShard(p: number, shard: ShardSpec | null): boolean {
  return shard === null || p % shard.count === shard.index - 1;
}

/** Rays of batch b of a point (0 when the plan never traces that batch). */
export function batchRays(rays: RaysPlan, b: number): number {
  const cap = rays.mode === "fixed" ? rays.perPoint : rays.maxPerPoint;
  return Math.max(0, Math.min(rays.batch, cap - b * rays.batch));
}

/**
 * Rays of batches b0 … b1−1 of a point, in closed form (batches fill [0, cap) in order, so the sum
 * is the overlap of [b0·batch, b1·batch) with it): planning stays O(points), whatever the ray count.
 */
export function raysInBatches(rays: RaysPlan, b0: number, b1: number): number {
  const cap = rays.mode === "fixed" ? rays.perPoint : rays.maxPerPoint;
  const at = (b: number): number => Math.max(0, Math.min(cap, b * rays.batch));
  return b1 > b0 ? at(b1) - at(b0) : 0;
}

/** Most batches a point can have. */
export function maxBatches(rays: RaysPlan): number {
  return Math.ceil((rays.mode === "fixed" ? rays.perPoint : rays.maxPerPoint) / rays.batch);
}

/** Batches scheduled before the first look at a point. */
export function initialBatches(rays: RaysPlan): number {
  if (rays.mode === "fixed") return maxBatches(rays);
  return Math.min(maxBatches(rays), Math.max(1, Math.ceil(rays.minPerPoint / rays.batch)));
}

/**
 * Target-error mode: given the merged tally of the first `planned` batches of a point, the number of
 * batches it should have in total (== planned: the point is done). Depends only on that tally, so
 * the sequence of batches of a point is the same for any worker count, order or resume. The next
 * checkpoint is the predicted need, SE ∝ 1/√N (under Sobol' sampling the error falls faster, so
 * this overshoots a little), with 10% margin, at least one more batch and at most
 * four times the current count (an early, noisy estimate must not overshoot by much).
 * Stopping on the estimated standard error is a sequential rule, so the final mean is not exactly
 * unbiased (the decision depends on the same batches); the bias is of second order in the per-point
 * error, far below the reported stderr at the batch sizes used, and vanishes in fixed-rays mode.
 */
export function plannedBatches(rays: RaysPlan, merged: Float64Array, nChannels: number, channelIdx: readonly number[], planned: number): number {
  if (rays.mode === "fixed") return planned;
  const cap = maxBatches(rays);
  if (planned >= cap) return planned;
  let worst = 0;
  // Sobol' sampling: the error of the replica groups (a group without rays yet counts as unknown).
  for (const c of channelIdx) {
    const se = pointStdErr(merged, nChannels, c, rays.sampling);
    worst = Math.max(worst, Number.isFinite(se) ? se / rays.targetStdErr : Infinity);
  }
  if (worst < 1) return planned;
  const nRays = merged[2 * nChannels];
  const needRays = nRays * worst * worst * 1.1;
  const need = Math.ceil(needRays / rays.batch);
  return Math.min(cap, Math.max(planned + 1, Math.min(need, 4 * planned)));
}
