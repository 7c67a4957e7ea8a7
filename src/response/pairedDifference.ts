import { pointMoments } from "./pairedMoments.js";
import type { ResponseMatrix } from "./responseMatrix.js";

/** A difference A − B of a linear functional of two matrices, with its standard errors. */
export interface PairedDifference {
  delta: number;
  /** From the pairing groups (common random numbers); NaN when a point lacks two shared groups. */
  pairedStderr: number;
  /** As if A and B were independent: √(SE_A² + SE_B²) of the functional. */
  independentStderr: number;
}

/**
 * Paired variance of the difference of the means of channel ca of A and cb of B at matrix point q
 * (both traced with the same streams per batch; docs/contracts.md, Run directory): Var(Ā) + Var(B̄)
 * − 2 Cov(Ā, B̄) from the pairing groups (pointMoments: the cluster-sampling estimate over groups;
 * with equal groups K/(K − 1) · Σ f_g² (d_g − D̄)² for the group differences d_g). NaN when either
 * matrix lacks groups or has fewer than two groups with rays at q.
 */
export function pairedPointVariance(a: ResponseMatrix, ca: number, b: ResponseMatrix, cb: number, q: number): number {
  const G = a.pairGroups;
  if (G === undefined || b.pairGroups !== G || a.groupMean === undefined || b.groupMean === undefined || a.groupRays === undefined || b.groupRays === undefined) return NaN;
  let kA = 0, kB = 0;
  for (let g = 0; g < G; g++) {
    if (a.groupRays[q * G + g] > 0) kA++;
    if (b.groupRays[q * G + g] > 0) kB++;
  }
  if (kA < 2 || kB < 2) return NaN;
  const m = new Float64Array(3);
  pointMoments(a, ca, b, cb, q, m);
  return Math.max(0, m[0] + m[1] - 2 * m[2]);
}

/**
 * Σ_q w_q (A_q − B_q) over the listed points q (flat point indices) of channel `channel`, with
 * the paired standard error (points are traced on independent streams, so their paired variances
 * add) and the error an independence assumption would give.
 */
export function pairedWeightedDifference(a: ResponseMatrix, b: ResponseMatrix, channel: string, points: readonly number[], w: ArrayLike<number>): PairedDifference {
  const ca = a.channels.indexOf(channel);
  const cb = b.channels.indexOf(channel);
  if (ca < 0 || cb < 0) throw new RangeError(`paired difference: channel "${channel}" missing in ${ca < 0 ? "A" : "B"}`);
  const nA = a.channels.length;
  const nB = b.channels.length;
  let delta = 0;
  let varPaired = 0;
  let varIndep = 0;
  points.forEach((q, k) => {
    const wk = w[k];
    delta += wk * (a.mean[q * nA + ca] - b.mean[q * nB + cb]);
    varPaired += wk * wk * pairedPointVariance(a, ca, b, cb, q);
    varIndep += wk * wk * (a.stderr[q * nA + ca] ** 2 + b.stderr[q * nB + cb] ** 2);
  });
  return { delta, pairedStderr: Math.sqrt(varPaired), independentStderr: Math.sqrt(varIndep) };
}

/**
 * A copy of matrix A whose standard errors of `channel` are the paired errors of A − B per point
 * (pairedPointVariance), for any functional that propagates errors linearly from a matrix (yearly
 * yield): run on this matrix, its error is the error of the difference of the functional of A and
 * B. Valid whatever the streams (groups are independent replicas either way); small when both were
 * traced with the same seed (common random numbers). Undefined when the grids differ or
 * a point has no paired error (matrices without pairing groups, or fewer than two groups with rays).
 */
export function pairedStderrMatrix(a: ResponseMatrix, b: ResponseMatrix, channel: string): ResponseMatrix | undefined {
  const same = (x: number[], y: number[]): boolean => x.length === y.length && x.every((v, i) => v === y[i]);
  // The grids must match point for point (the azimuth mode may differ: a planar stack is traced at
  // one azimuth, a texture with the azimuth averaged; groups are independent replicas either way).
  if (!same(a.thetaDeg, b.thetaDeg) || !same(a.phiDeg, b.phiDeg) || !same(a.wavelengthNm, b.wavelengthNm)) return undefined;
  const ca = a.channels.indexOf(channel);
  const cb = b.channels.indexOf(channel);
  if (ca < 0 || cb < 0) return undefined;
  const nA = a.channels.length;
  const stderr = Float64Array.from(a.stderr);
  for (let q = 0; q < a.nRays.length; q++) {
    const v = pairedPointVariance(a, ca, b, cb, q);
    if (!Number.isFinite(v)) return undefined;
    stderr[q * nA + ca] = Math.sqrt(v);
  }
  return { ...a, stderr };
}
