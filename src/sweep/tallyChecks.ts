import { initialBatches, maxBatches } from "./plan.js";
import { groupFreePathSlot, groupOffset, PAIR_GROUPS, tallyLength, tallyProblem } from "./tally.js";
import { DIAG_ENTERED, DIAG_FREE_PATH, diagOffset } from "../trace/tallyLayout.js";
import type { RaysPlan } from "../study/studyTypes.js";

/** Relative slack for the inequalities below (sums of up to 10¹² doubles). */
const SLACK = 1e-9;

/**
 * Problem of a tally read back from disk (shard output or journal line), or undefined when sound.
 * Beyond the checks every fresh task's tally passes (tallyProblem: finite, ray count, channel sums
 * = rays within 1e-9), each ray's channel weights lie in [0, 1] (they sum to 1 per ray), so per
 * channel 0 ≤ Σw² ≤ Σw and Σw² ≥ (Σw)²/n (Cauchy–Schwarz); path sums and event counts are ≥ 0.
 */
export function storedTallyProblem(t: Float64Array, nChannels: number, nRays: number): string | undefined {
  const basic = tallyProblem(t, nChannels, nRays);
  if (basic !== undefined) return basic;
  const n = nRays;
  for (let c = 0; c < nChannels; c++) {
    const s = t[2 * c]!, q = t[2 * c + 1]!;
    if (s < 0 || q < 0) return `channel ${c} has a negative sum (${s}, ${q})`;
    if (q > s * (1 + SLACK) + SLACK) return `channel ${c}: sum of squares ${q} exceeds the sum ${s} (weights are at most 1)`;
    if (n > 0 && q * n < s * s * (1 - SLACK) - SLACK) return `channel ${c}: sum of squares ${q} is below (sum)²/n = ${(s * s) / n}`;
  }
  for (let i = 2 * nChannels + 1; i < t.length; i++) if (t[i]! < 0) return `tally entry ${i} is negative (${t[i]})`;
  if (t.length === tallyLength(nChannels)) {
    // Pairing groups partition the point's batches: their channel sums, ray counts, α → 0 path and
    // entered power add up to the point's (slots of a group: channels, rays, path, entered).
    const d = diagOffset(nChannels);
    const path = groupFreePathSlot(nChannels);
    for (let slot = 0; slot <= path + 1; slot++) {
      const whole = slot < nChannels ? t[2 * slot]! : slot === nChannels ? n : t[d + (slot === path ? DIAG_FREE_PATH : DIAG_ENTERED)]!;
      let sum = 0;
      for (let g = 0; g < PAIR_GROUPS; g++) sum += t[groupOffset(nChannels, g) + slot]!;
      if (Math.abs(sum - whole) > SLACK * Math.max(1, whole)) return `pairing groups hold ${groupQuantity(slot, nChannels)} of ${sum}, the point ${whole}`;
    }
  }
  return undefined;
}

/** What slot `slot` of a pairing group holds, for messages. */
function groupQuantity(slot: number, nChannels: number): string {
  if (slot < nChannels) return `a sum of channel ${slot}`;
  if (slot === nChannels) return "a ray count";
  return slot === groupFreePathSlot(nChannels) ? "an α → 0 path" : "an entered power";
}

/**
 * Whether a finished point's ray count fits the plan: the fixed count, or in target-error mode a
 * whole number of batches from the first look (or the cap) up to the cap.
 */
export function finishedRaysProblem(rays: RaysPlan, nRays: number): string | undefined {
  if (rays.mode === "fixed") return nRays === rays.perPoint ? undefined : `${nRays} rays, expected the plan's ${rays.perPoint}`;
  const cap = rays.maxPerPoint;
  const least = Math.min(cap, initialBatches(rays) * rays.batch);
  const whole = nRays === cap || (nRays % rays.batch === 0 && nRays / rays.batch <= maxBatches(rays));
  return nRays >= least && nRays <= cap && whole ? undefined : `${nRays} rays, expected whole batches of ${rays.batch} from ${least} to ${cap}`;
}
