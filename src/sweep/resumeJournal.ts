import { existsSync, mkdirSync, statSync } from "node:fs";
import { InputError } from "../util/errors.js";
import { dirname } from "node:path";
import { JournalWriter, readJournal, setJournalAside, type JournalEntry, type JournalHeader } from "./journal.js";
import { maxBatches, pointId, raysInBatches, batchRays } from "./plan.js";
import { foldPending, journalEntriesOf } from "./pointState.js";
import type { SweepRun } from "./sweepRun.js";
import { journalPath } from "./sweepPaths.js";
import { tallyLength } from "./tally.js";
import { storedTallyProblem } from "./tallyChecks.js";

type Prefix = JournalEntry & { kind: "prefix" };
type Batch = JournalEntry & { kind: "batch" };

/**
 * Point number of an entry that fits the plan (grid, shard, tally length, ray counts) and whose
 * tally is sound (the checks of a tally read from disk: a line resealed after editing is caught
 * here), else the reason it is refused.
 */
function fittingPoint(run: SweepRun, e: JournalEntry): number | string {
  const { grid, rays, combos } = run.plan;
  const [combo, it, ip, il] = e.point;
  if (combo >= combos.length || it >= grid.thetaDeg.length || ip >= grid.phiDeg.length || il >= grid.wavelengthNm.length) return "point outside the study's grid";
  const p = pointId(grid, { combo, it, ip, il });
  const nCh = combos[combo].channels.length;
  if (!run.states.has(p)) return "point of another shard";
  if (e.tally.length !== tallyLength(nCh)) return `tally of ${e.tally.length} values, expected ${tallyLength(nCh)}`;
  if (e.planned > maxBatches(rays)) return `${e.planned} planned batches, more than the plan's ${maxBatches(rays)}`;
  const expected = e.kind === "prefix" ? raysInBatches(rays, 0, e.nBatches) : batchRays(rays, e.batch);
  if (e.nRays !== expected || (e.kind === "prefix" ? e.nBatches > e.planned : e.batch >= e.planned)) return `${e.nRays} rays, expected ${expected}`;
  return storedTallyProblem(e.tally, nCh, e.nRays) ?? p;
}

/**
 * Restores point states from sound journal entries: per point the longest prefix, then the batch
 * entries beyond it. Entries that do not fit the plan are ignored (their tasks run again).
 * Returns the entries of the compacted journal (one prefix per point + pending batches).
 */
export function resumeFromEntries(run: SweepRun, entries: JournalEntry[], refused: string[] = []): JournalEntry[] {
  const best = new Map<number, Prefix>();
  const loose = new Map<number, Map<number, Batch>>();
  for (const e of entries) {
    const p = fittingPoint(run, e);
    if (typeof p === "string") {
      refused.push(`line ${e.line ?? "?"}: ${p}`);
      continue;
    }
    if (e.kind === "prefix") {
      if ((best.get(p)?.nBatches ?? 0) < e.nBatches) best.set(p, e);
    } else {
      let m = loose.get(p);
      if (m === undefined) loose.set(p, (m = new Map()));
      m.set(e.batch, e);
    }
  }
  const compacted: JournalEntry[] = [];
  for (const [p, st] of run.states) {
    const pre = best.get(p);
    const bs = loose.get(p);
    if (pre === undefined && bs === undefined) continue;
    if (pre !== undefined) {
      st.acc = pre.tally.slice();
      st.k = pre.nBatches;
      st.planned = Math.max(st.planned, pre.planned);
      run.raysResumed += pre.nRays;
      run.tasksResumed += pre.nBatches;
    }
    for (const [b, e] of bs ?? []) {
      if (b < st.k) continue;
      st.pending.set(b, e.tally);
      st.planned = Math.max(st.planned, e.planned);
      run.raysResumed += e.nRays;
      run.tasksResumed++;
    }
    foldPending(st);
    compacted.push(...journalEntriesOf(run.plan, p, st, [...st.pending.keys()]));
  }
  return compacted;
}

const WHOSE: Record<string, string> = {
  unreadable: "has an unreadable header",
  "other-study": "belongs to a different study (its hash differs)",
  "other-build": "was written by a different build of lightfold (code fingerprint differs)",
  "other-shard": "belongs to another shard split",
};

/** Why an existing journal's header does not fit this run (undefined: it fits). */
function headerMismatch(h: JournalHeader | undefined, header: JournalHeader): string | undefined {
  return h === undefined ? "unreadable"
    : h.studyHash !== header.studyHash ? "other-study"
    : h.toolVersion !== header.toolVersion ? "other-version"
    : h.buildId !== header.buildId ? "other-build"
    : JSON.stringify(h.shard) !== JSON.stringify(header.shard) ? "other-shard"
    : undefined;
}

/**
 * Opens the run's journal: resumes from an existing one that matches the plan, sets it aside (never
 * deletes it) when it does not or when `fresh`, then starts the compacted journal for appending.
 */
export function openRunJournal(run: SweepRun, outDir: string, fresh: boolean, notice: (m: string) => void): { journal: JournalWriter; damaged: number[] } {
  const { plan, shard } = run;
  const jPath = journalPath(outDir, shard);
  mkdirSync(dirname(jPath), { recursive: true });
  const header: JournalHeader = { studyHash: plan.studyHash, toolVersion: plan.toolVersion, buildId: plan.buildId, shard: shard === null ? null : [shard.index, shard.count] };
  let kept: JournalEntry[] = [];
  let damaged: number[] = [];
  if (existsSync(jPath)) {
    if (!statSync(jPath).isFile()) throw new InputError(`${jPath}: the run's journal is not a regular file; move it away or choose another --out`);
    const old = readJournal(jPath);
    const mismatch = headerMismatch(old.header, header);
    if (mismatch !== undefined || fresh) {
      const why = fresh ? "fresh" : (mismatch as string);
      const aside = setJournalAside(jPath, why);
      const whose = why === "other-version" ? `was written by lightfold ${old.header?.toolVersion}` : WHOSE[why];
      notice(fresh ? `journal set aside as ${aside}; starting afresh` : `journal ${jPath} ${whose}; set aside as ${aside}, starting afresh`);
    } else {
      damaged = old.damagedLines;
      const refused: string[] = [];
      kept = resumeFromEntries(run, old.entries, refused);
      notice(`resuming from ${jPath}: ${run.tasksResumed} finished tasks kept` +
        (damaged.length > 0 ? `; ${damaged.length} damaged line(s) (line ${damaged.slice(0, 5).join(", ")}${damaged.length > 5 ? ", …" : ""}) ignored, their tasks are traced again` : "") +
        (refused.length > 0 ? `; ${refused.length} line(s) refused as unsound (${refused.slice(0, 3).join("; ")}${refused.length > 3 ? "; …" : ""}), their tasks are traced again` : ""));
    }
  }
  return { journal: JournalWriter.start(jPath, header, kept), damaged };
}
