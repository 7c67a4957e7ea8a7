import { existsSync, mkdirSync } from "node:fs";
import { dirname, relative } from "node:path";
import { spectrumFromSpec, type Spectrum } from "../spectrum/index.js";
import { writePhotocurrentSummary } from "../weighting/index.js";
import { writeResponseMatrix } from "../response/matrixFile.js";
import { matrixFromTallies } from "../response/fromTallies.js";
import type { ResponseMatrix } from "../response/responseMatrix.js";
import type { LoadedStudy } from "../study/load.js";
import type { StudyCombo } from "../study/studyTypes.js";
import { writeFileAtomic } from "../util/atomicWrite.js";
import { InputError } from "../util/errors.js";
import { nearestWord } from "../util/didYouMean.js";
import { toolVersion } from "../util/version.js";
import { buildId } from "./buildId.js";
import { defaultWorkerCount, TracePool } from "../workers/pool.js";
import { loadTracer, type TracerModule } from "../workers/tracerModule.js";
import type { WorkerSetup } from "../workers/traceTask.js";
import { INPUT_ERROR_TAG, type TraceItem, type TraceMessage } from "../workers/traceTask.js";
import { comboChannels } from "./channels.js";
import { JournalWriter, readJournal, setJournalAside, type JournalEntry } from "./journal.js";
import {
  batchRays,
  initialBatches,
  inShard,
  maxBatches,
  pointId,
  plannedBatches,
  pointCoords,
  totalPoints,
  type ShardSpec,
  type SweepPlan,
} from "./plan.js";
import { writeShardPartial } from "./shardFile.js";
import { journalPath, matrixPath, runJsonPath, shardPartialPath } from "./sweepPaths.js";
import { tallyLength } from "./tally.js";

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
  /** An open pool for this study, reused across calls (the caller closes it). */
  pool?: TracePool;
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
  /** Files written (run.json, matrices or the shard partial). */
  files: string[];
}

/**
 * A point's progress. Batch tallies are folded into `acc` strictly in batch order (acc = 0;
 * acc += t_0; acc += t_1; …), which fixes the floating-point result whatever order batches finish
 * in; a batch that finishes before an earlier one waits in `pending`.
 */
interface PointState {
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

interface QueuedRun {
  p: number;
  b0: number;
  b1: number;
}

/** The plan of a loaded study: grid, rays, combos with their channel names. */
export function sweepPlanOf(study: LoadedStudy, tracer: TracerModule): SweepPlan {
  const first = study.combos[0].study;
  return {
    studyName: study.name,
    studyHash: study.hash,
    toolVersion: toolVersion(),
    buildId: buildId(),
    seed: first.seed,
    grid: first.grid,
    rays: first.rays,
    combos: study.combos.map((c) => ({
      label: c.label,
      values: c.values,
      hash: c.hash,
      channels: comboChannels(c.study, study.registry, tracer),
      absorberThicknessUm: c.study.stack.absorber.thicknessUm,
    })),
    spectrum: first.spectrum,
    baseDir: study.baseDir,
  };
}

/**
 * Runs (or resumes) a sweep: every point of every combination (or of one shard), traced in batches
 * on the worker pool, tallies merged per point in batch order. The result is the same, bit for bit,
 * for any worker count, message grouping, order, resume or shard split.
 */
export async function runSweep(options: SweepOptions): Promise<SweepResult> {
  const t0 = Date.now();
  const { study } = options;
  const shard = options.shard ?? null;
  const tracer = await loadTracer(options.tracerModule);
  const plan = sweepPlanOf(study, tracer);
  const grid = plan.grid;
  const rays = plan.rays;
  const notice = options.onNotice ?? (() => {});
  const nChannelsOf = (combo: number): number => plan.combos[combo].channels.length;
  const targetIdx = plan.combos.map((c) => {
    if (rays.mode !== "target") return [];
    return rays.channels.map((name, i) => {
      const k = c.channels.indexOf(name);
      if (k < 0) {
        const near = nearestWord(name, c.channels);
        throw new InputError(`rays.channels[${i}]: the stack has no channel "${name}" (it has ${c.channels.join(", ")})`, near !== undefined ? `did you mean "${near}"?` : undefined);
      }
      return k;
    });
  });

  // Points of this run.
  const nTotal = totalPoints(plan);
  const states = new Map<number, PointState>();
  for (let p = 0; p < nTotal; p++) {
    if (inShard(p, shard)) {
      const len = tallyLength(nChannelsOf(pointCoords(grid, p).combo));
      states.set(p, { planned: initialBatches(rays), requested: 0, acc: new Float64Array(len), k: 0, pending: new Map() });
    }
  }

  // Journal: resume when it matches, set it aside when it does not.
  let journal: JournalWriter | undefined;
  let raysResumed = 0;
  let tasksResumed = 0;
  let damaged: number[] = [];

  /**
   * Restores point states from sound journal entries: per point the longest prefix, then the batch
   * entries beyond it. Entries that do not fit the plan are ignored (their tasks run again).
   * Returns the entries of the compacted journal (one prefix per point + pending batches).
   */
  function resumeFromEntries(entries: JournalEntry[]): JournalEntry[] {
    const best = new Map<number, JournalEntry & { kind: "prefix" }>();
    const loose = new Map<number, Map<number, JournalEntry & { kind: "batch" }>>();
    for (const e of entries) {
      const [combo, it, ip, il] = e.point;
      if (combo >= plan.combos.length || it >= grid.thetaDeg.length || ip >= grid.phiDeg.length || il >= grid.wavelengthNm.length) continue;
      const p = pointId(grid, { combo, it, ip, il });
      const st = states.get(p);
      const nCh = nChannelsOf(combo);
      if (st === undefined || e.tally.length !== tallyLength(nCh) || e.tally[2 * nCh] !== e.nRays || e.planned > maxBatches(rays)) continue;
      if (e.kind === "prefix") {
        let n = 0;
        for (let b = 0; b < e.nBatches; b++) n += batchRays(rays, b);
        if (n !== e.nRays || e.nBatches > e.planned) continue;
        if ((best.get(p)?.nBatches ?? 0) < e.nBatches) best.set(p, e);
      } else {
        if (e.nRays !== batchRays(rays, e.batch) || e.batch >= e.planned) continue;
        let m = loose.get(p);
        if (m === undefined) loose.set(p, (m = new Map()));
        m.set(e.batch, e);
      }
    }
    const compacted: JournalEntry[] = [];
    for (const [p, st] of states) {
      const pre = best.get(p);
      const bs = loose.get(p);
      if (pre === undefined && bs === undefined) continue;
      if (pre !== undefined) {
        st.acc = pre.tally.slice();
        st.k = pre.nBatches;
        st.planned = Math.max(st.planned, pre.planned);
        raysResumed += pre.nRays;
        tasksResumed += pre.nBatches;
      }
      for (const [b, e] of bs ?? []) {
        if (b < st.k) continue;
        st.pending.set(b, e.tally);
        st.planned = Math.max(st.planned, e.planned);
        raysResumed += e.nRays;
        tasksResumed++;
      }
      foldPending(st);
      compacted.push(...journalEntriesOf(p, st, [...st.pending.keys()]));
    }
    return compacted;
  }
  if (options.outDir !== undefined) {
    const jPath = journalPath(options.outDir, shard);
    mkdirSync(dirname(jPath), { recursive: true });
    const header = { studyHash: plan.studyHash, toolVersion: plan.toolVersion, buildId: plan.buildId, shard: shard === null ? null : ([shard.index, shard.count] as [number, number]) };
    let kept: JournalEntry[] = [];
    if (existsSync(jPath)) {
      const old = readJournal(jPath);
      const h = old.header;
      const mismatch = h === undefined ? "unreadable"
        : h.studyHash !== header.studyHash ? "other-study"
        : h.toolVersion !== header.toolVersion ? "other-version"
        : h.buildId !== header.buildId ? "other-build"
        : JSON.stringify(h.shard) !== JSON.stringify(header.shard) ? "other-shard"
        : undefined;
      if (mismatch !== undefined || options.fresh === true) {
        const why = options.fresh === true ? "fresh" : (mismatch as string);
        const aside = setJournalAside(jPath, why);
        const whose: Record<string, string> = {
          unreadable: "has an unreadable header",
          "other-study": "belongs to a different study (its hash differs)",
          "other-version": `was written by lightfold ${h?.toolVersion}`,
          "other-build": "was written by a different build of lightfold (code fingerprint differs)",
          "other-shard": "belongs to another shard split",
        };
        notice(
          options.fresh === true
            ? `journal set aside as ${aside}; starting afresh`
            : `journal ${jPath} ${whose[why]}; set aside as ${aside}, starting afresh`,
        );
      } else {
        damaged = old.damagedLines;
        kept = resumeFromEntries(old.entries);
        notice(`resuming from ${jPath}: ${tasksResumed} finished tasks kept` +
          (damaged.length > 0 ? `; ${damaged.length} damaged line(s) (line ${damaged.slice(0, 5).join(", ")}${damaged.length > 5 ? ", …" : ""}) ignored, their tasks are traced again` : ""));
      }
    }
    journal = JournalWriter.start(jPath, header, kept);
  }

  // Point bookkeeping: merge when the planned batches are all in; target mode may plan more.
  // FIFO of batch runs still to send: queue[qHead …] (a head index, not shift(), keeps it O(1)).
  let queue: QueuedRun[] = [];
  let qHead = 0;
  const queued = (): number => queue.length - qHead;
  /** Queued rays per wavelength block (combo · nλ + il). */
  const blockRays = new Map<number, number>();
  const nPerCombo = grid.thetaDeg.length * grid.phiDeg.length * grid.wavelengthNm.length;
  const blockOf = (p: number): number => Math.floor(p / nPerCombo) * grid.wavelengthNm.length + (p % grid.wavelengthNm.length);
  let pointsDone = 0;
  let raysPlanned = 0;
  let raysDone = raysResumed;
  const advance = (p: number, st: PointState): void => {
    const combo = pointCoords(grid, p).combo;
    for (;;) {
      for (let b = st.requested; b < st.planned; b++) raysPlanned += batchRays(rays, b);
      // Queue what is missing among the planned batches (contiguous runs).
      let b = Math.max(st.requested, st.k);
      while (b < st.planned) {
        if (st.pending.has(b)) { b++; continue; }
        const b0 = b;
        while (b < st.planned && !st.pending.has(b)) b++;
        queue.push({ p, b0, b1: b });
        let n = 0;
        for (let j = b0; j < b; j++) n += batchRays(rays, j);
        blockRays.set(blockOf(p), (blockRays.get(blockOf(p)) ?? 0) + n);
      }
      st.requested = Math.max(st.requested, st.planned);
      if (st.k < st.planned) return;
      const next = plannedBatches(rays, st.acc, nChannelsOf(combo), targetIdx[combo], st.planned);
      if (next === st.planned) {
        st.merged = st.acc;
        pointsDone++;
        return;
      }
      st.planned = next;
    }
  };
  for (const [p, st] of scheduleOrder(states, plan)) advance(p, st);

  // Message size: whole batches, enough messages to keep every worker busy, few enough to be cheap.
  const ownPool = options.pool === undefined;
  const nWorkers = options.pool?.nWorkers ?? options.workers ?? defaultWorkerCount();
  const raysPerMessage = Math.max(rays.batch, options.raysPerMessage ?? Math.min(65_536, Math.ceil(raysPlanned / (nWorkers * 16))));
  if (options.shuffleSeed !== undefined) shuffle(queue, options.shuffleSeed);

  const progress = (): void => {
    options.onProgress?.({ raysDone, raysPlanned, raysTracedNow: raysDone - raysResumed, pointsDone, pointsTotal: states.size, elapsedS: (Date.now() - t0) / 1000 });
  };
  progress();

  if (queued() > 0) {
    const pool = options.pool ?? new TracePool(workerSetupOf(study, options.tracerModule), nWorkers);
    try {
      await drain(pool, nWorkers * 2);
    } finally {
      journal?.close();
      if (ownPool) await pool.close();
    }
  } else journal?.close();

  /**
   * Keeps up to maxInFlight messages on the pool until the queue is empty. On the first failure no
   * more messages are sent; the promise rejects with it once the messages in flight have settled
   * (their results are dropped), so the pool is never closed under a running task.
   */
  async function drain(pool: TracePool, maxInFlight: number): Promise<void> {
    await new Promise<void>((resolve, reject) => {
      let inFlight = 0;
      let failure: Error | undefined;
      const settle = (): void => {
        if (inFlight > 0) return;
        if (failure !== undefined) reject(failure);
        else if (queued() === 0) resolve();
      };
      const pump = (): void => {
        while (failure === undefined && inFlight < maxInFlight && queued() > 0) {
          const { msg, runs } = takeMessage();
          inFlight++;
          pool.run(msg).then(
            (out) => {
              inFlight--;
              if (failure === undefined) {
                try {
                  accept(runs, out);
                  progress();
                } catch (err) {
                  failure = err instanceof Error ? err : new Error(String(err));
                }
              }
              if (failure === undefined) pump();
              settle();
            },
            (err: unknown) => {
              inFlight--;
              failure ??= describeFailure(err);
              settle();
            },
          );
        }
        settle();
      };
      pump();
    });
  }

  /**
   * Next message from the queue: whole batches, about raysPerMessage rays. A wavelength block (one
   * combination and λ: the unit a thread compiles a stack for) is kept in one message when it has
   * up to twice that many rays, so most stacks are compiled by one thread only.
   */
  function takeMessage(): { msg: TraceMessage; runs: QueuedRun[] } {
    const items: TraceItem[] = [];
    const runs: QueuedRun[] = [];
    let limit = raysPerMessage;
    let used = 0;
    let current = -1;
    while (queued() > 0) {
      const run = queue[qHead];
      const blk = blockOf(run.p);
      if (blk !== current) {
        const rest = blockRays.get(blk) ?? 0;
        if (items.length === 0) limit = rest <= 2 * raysPerMessage ? Math.max(rest, 1) : raysPerMessage;
        else if (used + rest > limit) break;
        current = blk;
      }
      let b1 = run.b0;
      let n = 0;
      // A message always carries at least one batch.
      while (b1 < run.b1) {
        const r = batchRays(rays, b1);
        if (used + n + r > limit && !(items.length === 0 && n === 0)) break;
        n += r;
        b1++;
      }
      if (b1 === run.b0) break;
      const piece = { p: run.p, b0: run.b0, b1 };
      if (b1 === run.b1) {
        qHead++;
        if (qHead > 4096 && 2 * qHead > queue.length) {
          queue = queue.slice(qHead);
          qHead = 0;
        }
      } else run.b0 = b1;
      blockRays.set(blk, (blockRays.get(blk) ?? 0) - n);
      runs.push(piece);
      items.push(itemOf(piece));
      used += n;
      if (used >= limit) break;
    }
    return { msg: { items }, runs };
  }

  function itemOf(r: QueuedRun): TraceItem {
    const c = pointCoords(grid, r.p);
    const sizes: number[] = [];
    for (let b = r.b0; b < r.b1; b++) sizes.push(batchRays(rays, b));
    return {
      combo: c.combo, it: c.it, ip: c.ip, il: c.il,
      thetaDeg: grid.thetaDeg[c.it],
      phiDeg: grid.phiMode === "averaged" ? null : grid.phiDeg[c.ip],
      wavelengthNm: grid.wavelengthNm[c.il],
      firstBatch: r.b0,
      batchRays: sizes,
    };
  }

  function accept(runs: QueuedRun[], out: Float64Array): void {
    let offset = 0;
    const added = new Map<number, number[]>();
    for (const r of runs) {
      const len = tallyLength(nChannelsOf(pointCoords(grid, r.p).combo));
      const st = states.get(r.p) as PointState;
      let list = added.get(r.p);
      if (list === undefined) added.set(r.p, (list = []));
      for (let b = r.b0; b < r.b1; b++) {
        st.pending.set(b, out.slice(offset, offset + len));
        offset += len;
        raysDone += batchRays(rays, b);
        list.push(b);
      }
    }
    if (offset !== out.length) throw new Error(`worker returned ${out.length} tally values, expected ${offset}`);
    // Journal: per point its new prefix (when it grew) and the batches still waiting for an earlier one.
    const entries: JournalEntry[] = [];
    for (const [p, list] of added) {
      const st = states.get(p) as PointState;
      const k0 = st.k;
      foldPending(st);
      entries.push(...journalEntriesOf(p, st, list.filter((b) => st.pending.has(b)), st.k > k0));
    }
    journal?.append(entries);
    for (const p of added.keys()) advance(p, states.get(p) as PointState);
  }

  function journalEntriesOf(p: number, st: PointState, waiting: number[], withPrefix = true): JournalEntry[] {
    const c = pointCoords(grid, p);
    const point: [number, number, number, number] = [c.combo, c.it, c.ip, c.il];
    const nCh = nChannelsOf(c.combo);
    const entries: JournalEntry[] = [];
    if (withPrefix && st.k > 0) entries.push({ kind: "prefix", point, nBatches: st.k, planned: st.planned, nRays: st.acc[2 * nCh], tally: st.acc.slice() });
    for (const b of waiting) {
      entries.push({ kind: "batch", point, batch: b, planned: st.planned, nRays: batchRays(rays, b), tally: st.pending.get(b) as Float64Array });
    }
    return entries;
  }

  // Results.
  const pointTallies = new Map<number, Float64Array>();
  for (const [p, st] of states) pointTallies.set(p, st.merged as Float64Array);
  const wallS = (Date.now() - t0) / 1000;
  const raysTraced = raysDone - raysResumed;
  const files: string[] = [];
  const matrices: ResponseMatrix[] = [];
  if (shard !== null) {
    if (options.outDir !== undefined) {
      const path = shardPartialPath(options.outDir, shard);
      const points = [...pointTallies.keys()].sort((a, b) => a - b);
      writeShardPartial(path, {
        format: "lightfold.shard", formatVersion: 1, shard, plan, points,
        tallies: points.map((p) => pointTallies.get(p) as Float64Array), raysTraced, wallS,
      });
      files.push(path);
    }
  } else {
    plan.combos.forEach((_, ci) => {
      const m = matrixFromTallies(plan, ci, (p) => pointTallies.get(p), false);
      matrices.push(m);
      options.onMatrix?.(study.combos[ci], m);
    });
    if (options.outDir !== undefined) {
      files.push(...writeRunOutputs(options.outDir, plan, matrices, { raysTraced, raysResumed, wallS, workers: nWorkers, studyFile: study.path }, notice));
    }
  }
  return { plan, matrices, pointTallies, raysTraced, raysResumed, damagedJournalLines: damaged, wallS, workers: nWorkers, files };
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

/**
 * Writes every combination's matrix, its photocurrent summary (photocurrent.json + iam.csv under
 * the study's spectrum) and run.json, each atomically; returns the paths. A photocurrent that cannot
 * be computed (e.g. a grid outside the spectrum) is reported through onNotice; the matrices stand.
 */
export function writeRunOutputs(
  outDir: string,
  plan: SweepPlan,
  matrices: ResponseMatrix[],
  info: { raysTraced: number; raysResumed: number; wallS: number; workers?: number; studyFile?: string; shards?: number; partial?: boolean; missingShards?: number[] },
  onNotice: (message: string) => void = () => {},
): string[] {
  const files: string[] = [];
  const extra: string[][] = [];
  const jscFirst: ({ thetaDeg: number; phiDeg: number; jscMaCm2: number; jscStderrMaCm2: number } | undefined)[] = [];
  let spectrum: Spectrum | undefined;
  try {
    spectrum = spectrumFromSpec(plan.spectrum, plan.baseDir);
  } catch (err) {
    onNotice(`no photocurrent summaries: ${(err as Error).message}`);
  }
  matrices.forEach((m, i) => {
    const path = matrixPath(outDir, plan.combos[i].label);
    writeResponseMatrix(path, m);
    files.push(path);
    extra[i] = [];
    if (spectrum !== undefined && m.partial !== true) {
      try {
        const w = writePhotocurrentSummary(dirname(path), m, spectrum);
        files.push(...w.files);
        const d = w.summary.directions[0];
        if (d !== undefined) jscFirst[i] = { thetaDeg: d.thetaDeg, phiDeg: d.phiDeg, jscMaCm2: d.jscMaCm2, jscStderrMaCm2: d.jscStderrMaCm2 };
        extra[i] = w.files.map((f) => relative(outDir, f));
      } catch (err) {
        onNotice(`${plan.combos[i].label}: no photocurrent summary: ${(err as Error).message}`);
      }
    }
  });
  const run = {
    format: "lightfold.run",
    formatVersion: 1,
    toolVersion: plan.toolVersion,
    studyName: plan.studyName,
    studyHash: plan.studyHash,
    ...(info.studyFile !== undefined ? { studyFile: info.studyFile } : {}),
    seed: plan.seed,
    grid: { nTheta: plan.grid.thetaDeg.length, nPhi: plan.grid.phiDeg.length, nWavelength: plan.grid.wavelengthNm.length, phiMode: plan.grid.phiMode },
    rays: plan.rays,
    combos: plan.combos.map((c, i) => ({
      label: c.label,
      values: c.values,
      studyHash: c.hash,
      matrix: `${c.label}/matrix.json`,
      ...(extra[i].length > 0 ? { summaries: extra[i] } : {}),
      // Absorber photocurrent at the first grid direction: the sweep's summary table.
      ...(jscFirst[i] !== undefined ? { jscFirstDirection: jscFirst[i] } : {}),
      rays: matrices[i].nRays.reduce((a, b) => a + b, 0),
    })),
    ...(info.partial === true ? { partial: true, missingShards: info.missingShards ?? [] } : {}),
    ...(info.shards !== undefined ? { shards: info.shards } : {}),
    timings: {
      finishedAt: new Date().toISOString(),
      wallS: info.wallS,
      raysTraced: info.raysTraced,
      raysResumed: info.raysResumed,
      raysPerS: info.wallS > 0 ? info.raysTraced / info.wallS : 0,
      ...(info.workers !== undefined ? { workers: info.workers } : {}),
    },
  };
  const runPath = runJsonPath(outDir);
  writeFileAtomic(runPath, JSON.stringify(run, null, 2) + "\n");
  files.push(runPath);
  return files;
}

/** Folds waiting batches into the point's tally while they continue its prefix (batch order). */
function foldPending(st: PointState): void {
  for (let t = st.pending.get(st.k); t !== undefined; t = st.pending.get(st.k)) {
    const acc = st.acc;
    for (let i = 0; i < acc.length; i++) acc[i] += t[i];
    st.pending.delete(st.k);
    st.k++;
  }
}

/**
 * Order in which points are queued: combination, then wavelength, then angles, so consecutive
 * messages reuse a thread's compiled stack for that wavelength.
 */
function scheduleOrder(states: Map<number, PointState>, plan: SweepPlan): [number, PointState][] {
  const g = plan.grid;
  const entries = [...states.entries()];
  const key = (p: number): number => {
    const c = pointCoords(g, p);
    return ((c.combo * g.wavelengthNm.length + c.il) * g.thetaDeg.length + c.it) * g.phiDeg.length + c.ip;
  };
  return entries.sort((a, b) => key(a[0]) - key(b[0]));
}

/** Fisher–Yates with a small LCG (Numerical Recipes constants): test-only reordering. */
function shuffle<T>(a: T[], seed: number): void {
  let s = seed >>> 0;
  for (let i = a.length - 1; i > 0; i--) {
    s = (Math.imul(s, 1664525) + 1013904223) >>> 0;
    const j = s % (i + 1);
    [a[i], a[j]] = [a[j], a[i]];
  }
}

/** A worker's error as it crossed the thread: input problems (tagged by the worker) stay InputErrors. */
function describeFailure(err: unknown): Error {
  const e = err instanceof Error ? err : new Error(String(err));
  if (e.message.startsWith(INPUT_ERROR_TAG)) return new InputError(e.message.slice(INPUT_ERROR_TAG.length));
  return e;
}
