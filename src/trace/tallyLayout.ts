/**
 * Layout of a point tally (docs/contracts.md, Tracer). Per channel [Σc, Σc²]; then
 * [nRays, Σp, Σp², events] (p = the photon's path in the absorber / thickness); then the light-
 * trapping diagnostics, each as [Σx, Σx²] over rays:
 *   entered       power that entered the absorber (first entry only)
 *   freePath      path in the absorber / thickness with the absorber's absorption removed
 *                 (α → 0 limit; importance-weighted, see bulkTransport)
 *   passes k      power still inside the absorber after pass k, k = 1..MAX_PASSES
 *   passes tail   Σ over k > MAX_PASSES of the same (so Σ_k remaining(k) stays complete)
 *   escape angle  power of R_escape per polar-angle bin of its direction in the incidence medium
 *   R total       R_first + R_escape of the ray (its square is the ray's, so the error of the total
 *   T total       is exact even when a split ray feeds both); the same for T_first + T_escape
 * The diagnostics have a fixed size, so the length depends on the channel count alone. A
 * generation-profile run (compile option depthEdgesUm) appends [Σg, Σg²] per depth bin.
 */
export const MAX_PASSES = 20;
export const ESCAPE_ANGLE_BINS = 18;
export const ESCAPE_ANGLE_BIN_DEG = 90 / ESCAPE_ANGLE_BINS;

/** Offsets inside the diagnostics block (each entry is a [sum, sumSq] pair). */
export const DIAG_ENTERED = 0;
export const DIAG_FREE_PATH = 2;
export const DIAG_PASSES = 4;
/** Pair of pass k (1-based; k = MAX_PASSES + 1 is the tail). */
export const diagPassOffset = (k: number): number => DIAG_PASSES + 2 * (k - 1);
export const DIAG_ESCAPE_ANGLE = DIAG_PASSES + 2 * (MAX_PASSES + 1);
export const DIAG_R_TOTAL = DIAG_ESCAPE_ANGLE + 2 * ESCAPE_ANGLE_BINS;
export const DIAG_T_TOTAL = DIAG_R_TOTAL + 2;
export const DIAG_LENGTH = DIAG_T_TOTAL + 2;

/** [nRays, Σp, Σp², events] after the channels. */
export const TALLY_TOTALS = 4;

/** Offset of the diagnostics block in a tally with nChannels channels. */
export function diagOffset(nChannels: number): number {
  return 2 * nChannels + TALLY_TOTALS;
}

/** Length of a point tally (without depth bins). */
export function baseTallyLength(nChannels: number): number {
  return 2 * nChannels + TALLY_TOTALS + DIAG_LENGTH;
}
