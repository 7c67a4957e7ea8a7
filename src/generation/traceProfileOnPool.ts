import { drainPool } from "../sweep/drainPool.js";
import type { DepthTraceMessage } from "../workers/depthTask.js";
import { batchRaysOf, depthPlanOf } from "./depthPlan.js";
import { SpectralProfileBuilder } from "./spectralProfileBuilder.js";
import type { ProfileRequest, SpectralProfile } from "./traceProfile.js";

/** Most rays in one message (as a sweep's): bounds a message's tallies and the batches waiting to be added. */
const MAX_MESSAGE_RAYS = 65_536;

/** What the trace needs of a pool of the request's study file (TracePool): its size and a way to run a depth message. */
export interface DepthRunner {
  readonly nWorkers: number;
  runDepth(msg: DepthTraceMessage): Promise<Float64Array>;
}

/** Batches b0 … b1−1 of wavelength il, one message. */
interface BatchRun {
  il: number;
  b0: number;
  b1: number;
}

/**
 * Traces a generation profile on the worker pool (whose combination req.comboIndex is req.study):
 * the (wavelength, batch) tasks of traceGenerationProfile, each batch on its own stream and tally.
 * A wavelength's tallies are added in batch order as they come in (later ones wait for earlier
 * ones), so the result equals traceGenerationProfile's bit for bit, for any worker count.
 * A wavelength's batches stay in one message (one stack compiled per wavelength) unless that
 * exceeds MAX_MESSAGE_RAYS or there are too few wavelengths to keep every worker busy.
 */
export async function traceGenerationProfileOnPool(req: ProfileRequest, pool: DepthRunner): Promise<SpectralProfile> {
  const plan = depthPlanOf(req);
  const builder = new SpectralProfileBuilder(req, plan);
  const wl = req.study.grid.wavelengthNm;
  const nB = plan.nBatches;
  const len = plan.tallyLength;
  const pieces = Math.min(nB, Math.ceil((2 * pool.nWorkers) / wl.length));
  const per = Math.max(1, Math.min(Math.ceil(nB / pieces), Math.floor(MAX_MESSAGE_RAYS / plan.batch)));
  const perWavelength = Math.ceil(nB / per);
  const edges = Array.from(plan.edgesUm);
  // Per wavelength: the sum of batches 0 … next−1, and later batches waiting for an earlier one.
  const acc = wl.map(() => new Float64Array(len));
  const next = wl.map(() => 0);
  const waiting = wl.map(() => new Map<number, Float64Array>());
  let sent = 0;
  let finished = 0;

  const take = (): { msg: DepthTraceMessage; runs: BatchRun } => {
    const il = Math.floor(sent / perWavelength);
    const b0 = (sent++ % perWavelength) * per;
    const r = { il, b0, b1: Math.min(nB, b0 + per) };
    const item = {
      combo: req.comboIndex, il, wavelengthNm: wl[il], thetaDeg: req.thetaDeg, phiDeg: req.phiDeg, seed: req.seed,
      firstBatch: r.b0, batchRays: batchRaysOf(plan, r.b0, r.b1),
    };
    return { msg: { kind: "depth", depthEdgesUm: edges, items: [item] }, runs: r };
  };

  const accept = (r: BatchRun, out: Float64Array): void => {
    if (out.length !== (r.b1 - r.b0) * len) throw new Error(`worker returned ${out.length} tally values, expected ${(r.b1 - r.b0) * len}`);
    const w = waiting[r.il];
    for (let b = r.b0; b < r.b1; b++) w.set(b, out.subarray((b - r.b0) * len, (b - r.b0 + 1) * len));
    const a = acc[r.il];
    for (let t = w.get(next[r.il]); t !== undefined; t = w.get(next[r.il])) {
      for (let i = 0; i < len; i++) a[i] += t[i];
      w.delete(next[r.il]++);
    }
    if (next[r.il] < nB) return;
    builder.addWavelength(r.il, a);
    acc[r.il] = new Float64Array(0);
    req.onWavelength?.(++finished, wl.length);
  };

  await drainPool<BatchRun, DepthTraceMessage>({ run: (m) => pool.runDepth(m) }, 2 * pool.nWorkers, {
    queued: () => wl.length * perWavelength - sent,
    take,
    accept,
  });
  return builder.profile();
}
