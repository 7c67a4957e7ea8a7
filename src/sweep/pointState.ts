import type { JournalEntry, PointKey } from "./journal.js";
import { batchRays, pointCoords, type SweepPlan } from "./plan.js";

/**
 * A point's progress. Batch tallies are folded into `acc` strictly in batch order (acc = 0;
 * acc += t_0; acc += t_1; …), which fixes the floating-point result whatever order batches finish
 * in; a batch that finishes before an earlier one waits in `pending`.
 */
export interface PointState {
  /** Batches the point is to have (grows in target-error mode). */
  planned: number;
  /** Batches queued or done so far (0 … requested−1). */
  requested: number;
  acc: Float64Array;
  /** Batches folded into acc (0 … k−1). */
  k: number;
  pending: Map<number, Float64Array>;
  merged?: Float64Array;
}

/** Folds waiting batches into the point's tally while they continue its prefix (batch order). */
export function foldPending(st: PointState): void {
  for (let t = st.pending.get(st.k); t !== undefined; t = st.pending.get(st.k)) {
    const acc = st.acc;
    for (let i = 0; i < acc.length; i++) acc[i] += t[i];
    st.pending.delete(st.k);
    st.k++;
  }
}

/** Journal entries of a point: its prefix (when asked) and the given batches still waiting. */
export function journalEntriesOf(plan: SweepPlan, p: number, st: PointState, waiting: number[], withPrefix = true): JournalEntry[] {
  const c = pointCoords(plan.grid, p);
  const point: PointKey = [c.combo, c.it, c.ip, c.il];
  const nCh = plan.combos[c.combo].channels.length;
  const entries: JournalEntry[] = [];
  if (withPrefix && st.k > 0) entries.push({ kind: "prefix", point, nBatches: st.k, planned: st.planned, nRays: st.acc[2 * nCh], tally: st.acc.slice() });
  for (const b of waiting) {
    entries.push({ kind: "batch", point, batch: b, planned: st.planned, nRays: batchRays(plan.rays, b), tally: st.pending.get(b) as Float64Array });
  }
  return entries;
}
