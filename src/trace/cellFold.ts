import type { CompiledStack } from "./compiledStack.js";
import { DIAG_ENTERED, DIAG_ESCAPE_ANGLE, DIAG_R_TOTAL, DIAG_T_TOTAL, ESCAPE_ANGLE_BINS, diagPassOffset } from "./tallyLayout.js";
import { foldHistoryFractions } from "./history.js";
import { foldRayTotals } from "./rayFold.js";

/**
 * The fold of an analog batch on a bare cell (analogCell.ts) into the point tally: the same sums as
 * foldRay (rayFold.ts) ray by ray, in fewer steps. Every such ray has weight 1 from launch to end and
 * puts it whole into one channel; it enters the absorber at most once, ends each pass at most once,
 * and leaves by one escape angle. So its channel, R and T totals, entered power, pass and escape-angle
 * entries are each 0 or 1, equal to their squares: their sums over the batch are whole counts, and
 * whole numbers below 2^53 add exactly in any order. They stay in the scratch arrays (contrib,
 * rayPasses, rayEscape) for the whole batch and go into the tally once at its end (flushAnalogCellCounts),
 * so the tally is bit for bit the one foldRay leaves on a tally holding whole counts (as a point's
 * tally of analog batches does). Sums of fractions — the path, the α → 0 path, the pass tail (a ray
 * may pass the last bin several times) and depth deposits — are added ray by ray, in ray order.
 * Folding each ray's 7 channels and diagnostics one by one took 7–10 % of the bench case's time at
 * 600 and 1000 nm (2026-12-05).
 */

/** A finished ray's fractional sums (see above); its whole counts wait in the scratch arrays. */
export function foldAnalogCellRay(cs: CompiledStack, st: Float64Array, tally: Float64Array, sums: Float64Array): void {
  foldHistoryFractions(cs, st);
  foldRayTotals(cs, st, tally, sums);
}

/**
 * The batch's whole counts into the tally (sum and sum of squares alike) and the scratch arrays
 * cleared: channels, R and T totals, `entered` rays that entered the absorber, passes 1..maxPass,
 * escape-angle bins.
 */
export function flushAnalogCellCounts(cs: CompiledStack, tally: Float64Array, entered: number, maxPass: number): void {
  const c = cs.contrib;
  const d = cs.diag;
  const r = c[cs.chRFirst] + c[cs.chREscape];
  addCount(d, DIAG_R_TOTAL, r);
  addCount(d, DIAG_T_TOTAL, c[cs.chTFirst] + c[cs.chTEscape]);
  for (let ch = 0; ch < cs.nChannels; ch++) {
    addCount(tally, 2 * ch, c[ch]);
    c[ch] = 0;
  }
  addCount(d, DIAG_ENTERED, entered);
  const p = cs.rayPasses;
  for (let k = 1; k <= maxPass; k++) {
    addCount(d, diagPassOffset(k), p[k - 1]);
    p[k - 1] = 0;
  }
  const a = cs.rayEscape;
  for (let b = 0; b < ESCAPE_ANGLE_BINS; b++) {
    addCount(d, DIAG_ESCAPE_ANGLE + 2 * b, a[b]);
    a[b] = 0;
  }
}

/** n rays that each added 1 to the pair [Σx, Σx²] at offset o. */
function addCount(t: Float64Array, o: number, n: number): void {
  if (n === 0) return;
  t[o] += n;
  t[o + 1] += n;
}
