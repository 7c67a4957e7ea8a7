import type { CompiledStack } from "./compiledStack.js";
import { Ray } from "./rayState.js";
import { foldRayContributions } from "./tally.js";
import { DIAG_LENGTH, diagOffset } from "./tallyLayout.js";
import { foldHistory } from "./history.js";
import { foldDepth } from "./depthTally.js";

/**
 * A finished ray into the point tally (docs/contracts.md, Tracer): its history (passes, escape
 * angles, α → 0 path), its channel contributions and their squares, its depth deposits; sums gets
 * [events, Σp, Σp²] with p its optical path in the absorber over the absorber's thickness (batch
 * sums kept in a typed array: doubles carried from ray to ray in locals across calls were boxed).
 */
export function foldRay(cs: CompiledStack, tally: Float64Array, sums: Float64Array): void {
  const st = cs.state;
  foldHistory(cs, st);
  foldRayContributions(cs.contrib, cs.nChannels, tally);
  foldRayTotals(cs, st, tally, sums);
}

/** The ray's events and path into sums (above), its depth deposits into the tally. */
export function foldRayTotals(cs: CompiledStack, st: Float64Array, tally: Float64Array, sums: Float64Array): void {
  sums[0] += st[Ray.EVENTS];
  if (cs.depthEdgesUm !== null) foldDepth(cs, tally, diagOffset(cs.nChannels) + DIAG_LENGTH);
  const p = st[Ray.PATH] * cs.invThicknessUm;
  sums[1] += p;
  sums[2] += p * p;
}
