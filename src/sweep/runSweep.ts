import { matrixFromTallies } from "../response/fromTallies.js";
import type { ResponseMatrix } from "../response/responseMatrix.js";
import type { LoadedStudy } from "../study/load.js";
import type { StudyCombo } from "../study/studyTypes.js";
import { defaultWorkerCount, TracePool, type TraceRunner } from "../workers/pool.js";
import { loadTracer } from "../workers/tracerModule.js";
import type { WorkerSetup } from "../workers/traceTask.js";
import { drainPool } from "./drainPool.js";
import { foldResults } from "./foldResults.js";
import type { JournalWriter } from "./journal.js";
import type { ShardSpec, SweepPlan } from "./plan.js";
import { openRunJournal } from "./resumeJournal.js";
import { writeRunOutputs, type RunRecord } from "./runFiles.js";
import { scheduleOrder, Scheduler } from "./scheduler.js";
import { writeShardPartial } from "./shardFile.js";
import { shardPartialPath } from "./sweepPaths.js";
import { planSweep, type SweepRun } from "./sweepRun.js";
import { RunFolder } from "./runFolder.js";

export { sweepPlanOf } from "./sweepRun.js";
export { writeRunOutputs } from "./runFiles.js";

export interface SweepProgress {
  /** Rays in finished batches, including those taken from a journal. */
  raysDone: number;
  /** Rays planned so far (grows in target-error mode as points ask for more). */
  raysPlanned: number;
  /** Rays traced by this process (for a rate). */
  raysTracedNow: number;
  pointsDone: number;
  pointsTotal: number;
  elapsedS: number;
}

export interface SweepOptions {
  study: LoadedStudy;
  /** Run directory: journal, matrices, run.json (or the shard's partial). Omit to keep results in memory. */
  outDir?: string;
  /** Worker threads (default: Slurm's grant or all cores). Ignored when `pool` is given. */
  workers?: number;
  /** An open pool for this study (or a variant view of one, TracePool.forVariant), reused across calls (the caller closes it). */
  pool?: TraceRunner;
  shard?: ShardSpec | null;
  /** Set an existing matching journal aside instead of resuming from it. */
  fresh?: boolean;
  /** Rays per task message (default: chosen from the grid and worker count). */
  raysPerMessage?: number;
  /** Sends task messages in an order shuffled with this seed (for tests: order must not matter). */
  shuffleSeed?: number;
  onProgress?: (p: SweepProgress) => void;
  /** Called with each combination's finished matrix (not in a shard run). */
  onMatrix?: (combo: StudyCombo, m: ResponseMatrix) => void;
  /** Messages about the journal (resumed, damaged lines, set aside). */
  onNotice?: (message: string) => void;
  /** A tracer module file instead of lightfold's own (tests only). */
  tracerModule?: string;
  /** Keep the output folder's lock after the run (released by the result's releaseLock). */
  holdLock?: boolean;
}

export interface SweepResult {
  plan: SweepPlan;
  /** One per combination; empty for a shard run (merge builds them). */
  matrices: ResponseMatrix[];
  /** Merged tally of each point of this run (global point number -> tally). */
  pointTallies: Map<number, Float64Array>;
  raysTraced: number;
  raysResumed: number;
  /** Journal lines found damaged (their tasks were traced again). */
  damagedJournalLines: number[];
  wallS: number;
  workers: number;
  /** Files written (matrices and run.json, or the shard partial). */
  files: string[];
  /** What was written to run.json (whole runs with an outDir), for callers that add to it. */
  runRecord?: RunRecord;
  /** With holdLock: releases the output folder's lock (the caller's last write done). */
  releaseLock?: () => void;
}

/**
 * Runs (or resumes) a sweep in four stages: plan (points and their states, journal resumed), schedule
 * and trace (batches on the worker pool), fold (tallies merged per point in batch order, journaled),
 * write (matrices and run.json, or a shard's partial). The result is the same, bit for bit, for any
 * worker count, message grouping, order, resume or shard split. Spectral weighting is the caller's.
 */
export async function runSweep(options: SweepOptions): Promise<SweepResult> {
  const t0 = Date.now();
  const notice = options.onNotice ?? (() => {});
  const run = planSweep(options.study, await loadTracer(options.tracerModule), options.shard ?? null);
  const folder = options.outDir === undefined ? undefined : RunFolder.open(options.outDir, run.shard, notice);
  let journal: JournalWriter | undefined;
  try {
    const opened = folder === undefined ? undefined : openRunJournal(run, options.outDir as string, options.fresh === true, notice);
    journal = opened?.journal;
    run.raysDone = run.raysResumed;
    const nWorkers = options.pool?.nWorkers ?? options.workers ?? defaultWorkerCount();
    await traceAll(run, options, journal, nWorkers, t0);
    const pointTallies = new Map<number, Float64Array>();
    for (const [p, st] of run.states) pointTallies.set(p, st.merged as Float64Array);
    const result: SweepResult = {
      plan: run.plan, matrices: [], pointTallies, raysTraced: run.raysDone - run.raysResumed, raysResumed: run.raysResumed,
      damagedJournalLines: opened?.damaged ?? [], wallS: (Date.now() - t0) / 1000, workers: nWorkers, files: [],
    };
    writeStage(run, options, result);
    const release = folder?.finish(options.holdLock === true);
    if (release !== undefined) result.releaseLock = release;
    return result;
  } catch (err) {
    journal?.close();
    folder?.abandon(journal);
    throw err;
  }
}

/** Schedule, trace and fold: queues every point, drains the queue on the pool, closes the journal. */
async function traceAll(run: SweepRun, options: SweepOptions, journal: JournalWriter | undefined, nWorkers: number, t0: number): Promise<void> {
  const scheduler = new Scheduler(run);
  for (const [p, st] of scheduleOrder(run)) scheduler.advance(p, st);
  // Message size: whole batches, enough messages to keep every worker busy, few enough to be cheap.
  const raysPerMessage = Math.max(run.plan.rays.batch, options.raysPerMessage ?? Math.min(65_536, Math.ceil(run.raysPlanned / (nWorkers * 16))));
  if (options.shuffleSeed !== undefined) scheduler.shuffle(options.shuffleSeed);
  const progress = (): void => options.onProgress?.({
    raysDone: run.raysDone, raysPlanned: run.raysPlanned, raysTracedNow: run.raysDone - run.raysResumed,
    pointsDone: run.pointsDone, pointsTotal: run.states.size, elapsedS: (Date.now() - t0) / 1000,
  });
  progress();
  if (scheduler.queued() === 0) {
    journal?.close();
    return;
  }
  const own = options.pool === undefined ? new TracePool(workerSetupOf(options.study, options.tracerModule), nWorkers) : undefined;
  try {
    await drainPool(options.pool ?? (own as TracePool), nWorkers * 2, {
      queued: () => scheduler.queued(),
      take: () => scheduler.takeMessage(raysPerMessage),
      accept: (runs, out) => {
        foldResults(run, scheduler, journal, runs, out);
        progress();
      },
    });
  } finally {
    journal?.close();
    if (own !== undefined) await own.close();
  }
}

/** Write stage: a shard's partial, or the matrices (each handed to onMatrix) and run.json. */
function writeStage(run: SweepRun, options: SweepOptions, result: SweepResult): void {
  const { plan, shard } = run;
  const { outDir } = options;
  if (shard !== null) {
    if (outDir === undefined) return;
    const path = shardPartialPath(outDir, shard);
    const points = [...result.pointTallies.keys()].sort((a, b) => a - b);
    writeShardPartial(path, {
      format: "lightfold.shard", formatVersion: 1, shard, plan, points,
      tallies: points.map((p) => result.pointTallies.get(p) as Float64Array), raysTraced: result.raysTraced, wallS: result.wallS,
    });
    result.files.push(path);
    return;
  }
  plan.combos.forEach((_, ci) => {
    const m = matrixFromTallies(plan, ci, (p) => result.pointTallies.get(p), false);
    result.matrices.push(m);
    options.onMatrix?.(options.study.combos[ci], m);
  });
  if (outDir === undefined) return;
  const info = { raysTraced: result.raysTraced, raysResumed: result.raysResumed, wallS: result.wallS, workers: result.workers, studyFile: options.study.path };
  const written = writeRunOutputs(outDir, plan, result.matrices, info);
  result.files.push(...written.files);
  result.runRecord = written.record;
}

/** What every worker thread of a study's pool is given. */
export function workerSetupOf(study: LoadedStudy, tracerModule?: string): WorkerSetup {
  return {
    studies: study.combos.map((c) => c.study),
    materials: study.combos[0].study.materials,
    baseDir: study.baseDir,
    ...(tracerModule !== undefined ? { tracerModule } : {}),
  };
}
