import type { JournalEntry, JournalWriter } from "./journal.js";
import { batchRays, pointCoords } from "./plan.js";
import { foldPending, journalEntriesOf, type PointState } from "./pointState.js";
import type { QueuedRun, Scheduler } from "./scheduler.js";
import type { SweepRun } from "./sweepRun.js";
import { tallyLength } from "./tally.js";

/**
 * Fold stage: a message's batch tallies (`out`, the runs' batches one after another) go into their
 * points' states in batch order; the journal gets each point's new prefix (when it grew) and the
 * batches still waiting for an earlier one; then the scheduler advances those points.
 */
export function foldResults(run: SweepRun, scheduler: Scheduler, journal: JournalWriter | undefined, runs: QueuedRun[], out: Float64Array): void {
  const { plan } = run;
  let offset = 0;
  const added = new Map<number, number[]>();
  for (const r of runs) {
    const len = tallyLength(plan.combos[pointCoords(plan.grid, r.p).combo].channels.length);
    const st = run.states.get(r.p) as PointState;
    let list = added.get(r.p);
    if (list === undefined) added.set(r.p, (list = []));
    for (let b = r.b0; b < r.b1; b++) {
      st.pending.set(b, out.slice(offset, offset + len));
      offset += len;
      run.raysDone += batchRays(plan.rays, b);
      list.push(b);
    }
  }
  if (offset !== out.length) throw new Error(`worker returned ${out.length} tally values, expected ${offset}`);
  const entries: JournalEntry[] = [];
  for (const [p, list] of added) {
    const st = run.states.get(p) as PointState;
    const k0 = st.k;
    foldPending(st);
    entries.push(...journalEntriesOf(plan, p, st, list.filter((b) => st.pending.has(b)), st.k > k0));
  }
  journal?.append(entries);
  for (const p of added.keys()) scheduler.advance(p, run.states.get(p) as PointState);
}
