import type { LoadedStudy } from "../study/load.js";
import { InputError } from "../util/errors.js";
import { defaultWorkerCount, TracePool } from "../workers/pool.js";
import type { TraceItem } from "../workers/traceTask.js";
import { loadTracer } from "../workers/tracerModule.js";
import { comboChannels } from "./channels.js";
import { channelMean, pointStdErr, sumTallies, tallyLength } from "./tally.js";
import { MIN_REPLICAS, REPLICA_GROUPS } from "../random/replicaGroups.js";
import { workerSetupOf } from "./runSweep.js";

export interface TracePointOptions {
  study: LoadedStudy;
  /** An open pool of this study (reused; the caller closes it). Without one, a pool is opened and closed. */
  pool?: TracePool;
  workers?: number;
  combo?: number;
  /** Grid indices of the point (the stream keys use indices, as in a sweep). */
  it: number;
  ip: number;
  il: number;
  nRays: number;
  /** Rays per batch (default: the study's batch). */
  batch?: number;
  /** First batch number (default 0): batches firstBatch… extend an earlier call without overlap. */
  firstBatch?: number;
  /** Seed instead of the study's (an independent replica or reference run). */
  seed?: number;
  tracerModule?: string;
}

export interface TracePointResult {
  channels: string[];
  /** Merged tally of the batches, summed in batch order. */
  tally: Float64Array;
  nRays: number;
  mean: Float64Array;
  stderr: Float64Array;
  /** Batches traced: firstBatch … firstBatch + nBatches − 1. */
  nBatches: number;
}

/**
 * Traces one grid point with nRays in batches spread over the pool. Batch b uses
 * streamKey(seed, it, ip, il, b), exactly as a sweep does, so with firstBatch 0, the same
 * batch size and nRays = the study's perPoint, the tally equals that point's tally in a sweep.
 * Under Sobol' launch sampling (the study's, as resolved: the default with 16+ batches per point)
 * the standard errors come from the replica groups (batch b → group
 * b mod 16), and fewer than MIN_REPLICAS batches are refused. (A call with firstBatch > 0 reports the
 * error of its own batches only.)
 */
export async function tracePoint(o: TracePointOptions): Promise<TracePointResult> {
  const combo = o.combo ?? 0;
  const c = o.study.combos[combo];
  if (c === undefined) throw new InputError(`combo: no combination ${combo} (the study has ${o.study.combos.length})`);
  const g = c.study.grid;
  if (!(o.it >= 0 && o.it < g.thetaDeg.length && o.ip >= 0 && o.ip < g.phiDeg.length && o.il >= 0 && o.il < g.wavelengthNm.length)) {
    throw new InputError(`point (${o.it}, ${o.ip}, ${o.il}) is outside the grid (${g.thetaDeg.length} × ${g.phiDeg.length} × ${g.wavelengthNm.length})`);
  }
  if (!(Number.isInteger(o.nRays) && o.nRays >= 1)) throw new InputError(`nRays: expected a positive integer, got ${o.nRays}`);
  const batch = o.batch ?? c.study.rays.batch;
  const firstBatch = o.firstBatch ?? 0;
  const nBatches = Math.ceil(o.nRays / batch);
  if (c.study.rays.sampling === "sobol" && Math.min(nBatches, REPLICA_GROUPS) < MIN_REPLICAS) {
    throw new InputError(
      `nRays: Sobol' sampling takes the standard error from independent replica groups and needs at least ${MIN_REPLICAS} batches, got ${o.nRays} rays in batches of ${batch} (${nBatches})`,
      `trace at least ${MIN_REPLICAS * batch} rays, or smaller batches (a study with 16+ batches per point gets Sobol' points by default; "sampling": "random" opts out)`,
    );
  }
  const sizes = Array.from({ length: nBatches }, (_, j) => Math.min(batch, o.nRays - j * batch));
  const channels = comboChannels(c.study, o.study.registry, await loadTracer(o.tracerModule));
  const len = tallyLength(channels.length);

  const pool = o.pool ?? new TracePool(workerSetupOf(o.study, o.tracerModule), o.workers ?? defaultWorkerCount());
  try {
    const nMessages = Math.min(nBatches, pool.nWorkers * 2);
    const per = Math.ceil(nBatches / nMessages);
    const jobs: Promise<Float64Array>[] = [];
    for (let j0 = 0; j0 < nBatches; j0 += per) {
      const item: TraceItem = {
        combo, it: o.it, ip: o.ip, il: o.il,
        thetaDeg: g.thetaDeg[o.it],
        phiDeg: g.phiMode === "averaged" ? null : g.phiDeg[o.ip],
        wavelengthNm: g.wavelengthNm[o.il],
        firstBatch: firstBatch + j0,
        batchRays: sizes.slice(j0, j0 + per),
        batchSize: batch,
        ...(o.seed !== undefined ? { seed: o.seed } : {}),
      };
      jobs.push(pool.run({ items: [item] }));
    }
    const outs = await Promise.all(jobs);
    const batches: Float64Array[] = [];
    for (const out of outs) for (let k = 0; k < out.length; k += len) batches.push(out.subarray(k, k + len));
    const tally = sumTallies(batches, len);
    const nCh = channels.length;
    const mean = new Float64Array(nCh);
    const stderr = new Float64Array(nCh);
    for (let i = 0; i < nCh; i++) {
      mean[i] = channelMean(tally, nCh, i);
      stderr[i] = pointStdErr(tally, nCh, i, c.study.rays.sampling);
    }
    return { channels, tally, nRays: tally[2 * nCh], mean, stderr, nBatches };
  } finally {
    if (o.pool === undefined) await pool.close();
  }
}
