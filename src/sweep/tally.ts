/**
 * Tally layout of a sweep point (docs/contracts.md, Tracer and Run directory): the tracer's part,
 * per channel [sum, sumSq] then [nRays, pathSum, pathSumSq, events] and the fixed light-trapping
 * block (src/trace/tallyLayout.ts); then PAIR_GROUPS pairing
 * groups of [sum per channel…, nRays, free-path sum, entered sum]: batch b of a point adds its
 * channel sums, rays, and the light-trapping block's α → 0 path and entered power to group
 * b mod PAIR_GROUPS. Groups are independent replicas of the point, and two combinations (or two
 * studies of one seed) trace batch b with the same random stream, so the spread of per-group
 * differences gives the standard error of a difference with its correlation (src/sweep/pairing.ts).
 */
import { baseTallyLength, diagOffset, DIAG_ENTERED, DIAG_FREE_PATH } from "../trace/tallyLayout.js";
import { groupStdErr, MIN_REPLICAS, REPLICA_GROUPS } from "../random/replicaGroups.js";
import type { LaunchSampling } from "../random/sobol.js";

export const TALLY_EXTRA = 4;
export const PAIR_GROUPS = REPLICA_GROUPS;
/** Entries of a pairing group after its channel sums: its ray count, α → 0 path sum and entered power. */
const GROUP_EXTRA = 3;

/** Length of the tracer's part of a tally. */
export function traceTallyLength(nChannels: number): number {
  return baseTallyLength(nChannels);
}

/** Length of a sweep point's tally: the tracer's part and the pairing groups. */
export function tallyLength(nChannels: number): number {
  return traceTallyLength(nChannels) + PAIR_GROUPS * (nChannels + GROUP_EXTRA);
}

/** Offset of pairing group g in a sweep tally. */
export function groupOffset(nChannels: number, g: number): number {
  return traceTallyLength(nChannels) + g * (nChannels + GROUP_EXTRA);
}

/** Offset of a group's α → 0 path sum (path / thickness, summed over its rays) from its start; its entered power follows. */
export function groupFreePathSlot(nChannels: number): number {
  return nChannels + 1;
}

/** Copies a freshly traced batch tally's channel sums, ray count, α → 0 path and entered power into its pairing group (b mod PAIR_GROUPS). */
export function fillPairGroup(t: Float64Array, nChannels: number, batch: number): void {
  const o = groupOffset(nChannels, batch % PAIR_GROUPS);
  for (let c = 0; c < nChannels; c++) t[o + c] = t[2 * c];
  t[o + nChannels] = t[2 * nChannels];
  const d = diagOffset(nChannels);
  t[o + groupFreePathSlot(nChannels)] = t[d + DIAG_FREE_PATH];
  t[o + groupFreePathSlot(nChannels) + 1] = t[d + DIAG_ENTERED];
}

export function tallyRays(t: Float64Array, nChannels: number): number {
  return t[2 * nChannels];
}

/**
 * Adds batch tallies in the given (task-key) order into a fresh tally. Doing the additions in one
 * fixed order, batch by batch, is what makes results identical for any worker count or split.
 */
export function sumTallies(batches: readonly Float64Array[], length: number): Float64Array {
  const acc = new Float64Array(length);
  for (const t of batches) for (let i = 0; i < length; i++) acc[i] += t[i];
  return acc;
}

/** Mean of channel c: sum / n. */
export function channelMean(t: Float64Array, nChannels: number, c: number): number {
  const n = t[2 * nChannels];
  return n > 0 ? t[2 * c] / n : 0;
}

/**
 * Standard error of the mean of channel c from sum and sum of squares of per-ray weights:
 * s² = (Σw² − n·mean²)/(n − 1), SE = s/√n (textbook sample variance).
 */
export function channelStdErr(t: Float64Array, nChannels: number, c: number): number {
  const n = t[2 * nChannels];
  if (n < 2) return 0;
  const mean = t[2 * c] / n;
  const variance = Math.max(0, (t[2 * c + 1] - n * mean * mean) / (n - 1));
  return Math.sqrt(variance / n);
}

/**
 * Standard error of the mean of channel c from the spread of the pairing groups (independent
 * replicas; random/replicaGroups.ts). NaN when fewer than MIN_REPLICAS groups have rays.
 */
export function replicaStdErr(t: Float64Array, nChannels: number, c: number): number {
  const sums = new Float64Array(PAIR_GROUPS);
  const counts = new Float64Array(PAIR_GROUPS);
  let k = 0;
  for (let g = 0; g < PAIR_GROUPS; g++) {
    const o = groupOffset(nChannels, g);
    sums[g] = t[o + c];
    counts[g] = t[o + nChannels];
    if (counts[g] > 0) k++;
  }
  return k < MIN_REPLICAS ? NaN : groupStdErr(sums, counts);
}

/**
 * Standard error of the α → 0 path ratio Σ path / Σ entered (light-trapping block) from the spread of
 * the pairing groups: the ratio over clusters, each group weighted by its entered power
 * (groupStdErr with the entered sums as sizes). For Sobol' launch sampling. 0 where no light entered
 * (the ratio is reported as 0 there); NaN with fewer than MIN_REPLICAS groups traced, or fewer than
 * two groups into which light entered (no spread to measure).
 */
export function replicaFreePathStdErr(t: Float64Array, nChannels: number): number {
  const sums = new Float64Array(PAIR_GROUPS);
  const entered = new Float64Array(PAIR_GROUPS);
  const slot = groupFreePathSlot(nChannels);
  let traced = 0;
  let lit = 0;
  for (let g = 0; g < PAIR_GROUPS; g++) {
    const o = groupOffset(nChannels, g);
    sums[g] = t[o + slot];
    entered[g] = t[o + slot + 1];
    if (t[o + nChannels] > 0) traced++;
    if (entered[g] > 0) lit++;
  }
  if (traced < MIN_REPLICAS) return NaN;
  if (lit === 0) return 0;
  return lit < 2 ? NaN : groupStdErr(sums, entered);
}

/**
 * The standard error of channel c a point reports: from per-ray contributions under random launch
 * sampling (rays independent), from the spread of the replica groups under Sobol' sampling (rays
 * of a group are not independent, and the per-ray variance would overstate the error).
 */
export function pointStdErr(t: Float64Array, nChannels: number, c: number, sampling: LaunchSampling | undefined): number {
  return sampling === "sobol" ? replicaStdErr(t, nChannels, c) : channelStdErr(t, nChannels, c);
}

/**
 * Problem of a batch tally, or undefined when it is sound: every entry finite, ray count as asked,
 * and the channel sums adding up to the ray count (each ray's power ends in exactly one place)
 * within 1e-9 relative.
 */
export function tallyProblem(t: Float64Array, nChannels: number, nRays: number): string | undefined {
  for (let i = 0; i < t.length; i++) {
    if (!Number.isFinite(t[i])) return `tally entry ${i} is ${t[i]}`;
  }
  const n = t[2 * nChannels];
  if (n !== nRays) return `tally counts ${n} rays, expected ${nRays}`;
  let total = 0;
  for (let c = 0; c < nChannels; c++) total += t[2 * c];
  if (Math.abs(total - n) > 1e-9 * Math.max(1, n)) {
    return `channels sum to ${total / n} of the incident power, expected 1 (difference ${(total - n) / n})`;
  }
  return undefined;
}
