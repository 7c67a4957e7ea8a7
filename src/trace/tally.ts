import type { CompiledStack } from "./compiledStack.js";
import { DIAG_LENGTH, TALLY_TOTALS, baseTallyLength } from "./tallyLayout.js";

/** Extra tally entries after the channels: [nRays, pathSum, pathSumSq, events] and the diagnostics (tallyLayout.ts). */
export const TALLY_EXTRA_ENTRIES = TALLY_TOTALS + DIAG_LENGTH;

/** Length of a compiled stack's tally: the point tally, plus [Σg, Σg²] per depth bin when it has a depth grid. */
export function tallyLengthOf(cs: CompiledStack): number {
  return baseTallyLength(cs.nChannels) + 2 * cs.rayDepth.length;
}

/** A zeroed tally for a compiled stack (docs/contracts.md, Tracer). */
export function createTally(cs: CompiledStack): Float64Array {
  return new Float64Array(tallyLengthOf(cs));
}

export interface TallySummary {
  channels: string[];
  mean: Float64Array;
  stderr: Float64Array;
  nRays: number;
  /** Mean optical path in the absorber divided by its thickness, with its standard error. */
  pathRatio: number;
  pathRatioStderr: number;
  eventsPerRay: number;
}

/** Means and standard errors (sample variance of per-ray contributions / n) of a tally. */
export function summarizeTally(channels: string[], tally: Float64Array): TallySummary {
  const nC = channels.length;
  const n = tally[2 * nC];
  const mean = new Float64Array(nC);
  const stderr = new Float64Array(nC);
  for (let c = 0; c < nC; c++) {
    [mean[c], stderr[c]] = meanAndStderr(tally[2 * c], tally[2 * c + 1], n);
  }
  const [pathRatio, pathRatioStderr] = meanAndStderr(tally[2 * nC + 1], tally[2 * nC + 2], n);
  return { channels, mean, stderr, nRays: n, pathRatio, pathRatioStderr, eventsPerRay: n > 0 ? tally[2 * nC + 3] / n : 0 };
}

function meanAndStderr(sum: number, sumSq: number, n: number): [number, number] {
  if (n <= 0) return [0, 0];
  const mean = sum / n;
  if (n < 2) return [mean, 0];
  const variance = Math.max(0, (sumSq - n * mean * mean) / (n - 1));
  return [mean, Math.sqrt(variance / n)];
}

/** Adds one ray's channel contributions (and their squares) to the tally and clears them for the next ray. */
export function foldRayContributions(contrib: Float64Array, nChannels: number, tally: Float64Array): void {
  for (let c = 0; c < nChannels; c++) {
    const v = contrib[c];
    // A ray touches few channels (an analog one, one): adding zeros would change nothing.
    if (v === 0) continue;
    tally[2 * c] += v;
    tally[2 * c + 1] += v * v;
    contrib[c] = 0;
  }
}

/** Adds a batch's ray count, path sums and event count after the channel entries. */
export function foldBatchTotals(tally: Float64Array, nChannels: number, nRays: number, pathSum: number, pathSumSq: number, events: number): void {
  tally[2 * nChannels] += nRays;
  tally[2 * nChannels + 1] += pathSum;
  tally[2 * nChannels + 2] += pathSumSq;
  tally[2 * nChannels + 3] += events;
}
