import { drainPool } from "../sweep/drainPool.js";
import { sumTallies } from "../sweep/tally.js";
import type { DepthTraceMessage } from "../workers/depthTask.js";
import { depthPlanOf } from "./depthPlan.js";
import { SpectralProfileBuilder } from "./spectralProfileBuilder.js";
import type { ProfileRequest, SpectralProfile } from "./traceProfile.js";

/** What the trace needs of a pool (TracePool): its size and a way to run a depth message. */
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
 * Traces a generation profile on the worker pool: the (wavelength, batch) tasks of
 * traceGenerationProfile, each batch on its own stream and tally, the tallies of a wavelength summed
 * in batch order once all are in. The result equals traceGenerationProfile's bit for bit, for any
 * worker count. A wavelength's batches stay in one message (one stack compiled per wavelength)
 * unless there are too few wavelengths to keep every worker busy.
 */
export async function traceGenerationProfileOnPool(req: ProfileRequest, pool: DepthRunner): Promise<SpectralProfile> {
  const plan = depthPlanOf(req);
  const builder = new SpectralProfileBuilder(req, plan);
  const wl = req.study.grid.wavelengthNm;
  const nB = plan.batchRays.length;
  const per = Math.ceil(nB / Math.min(nB, Math.ceil((2 * pool.nWorkers) / wl.length)));
  const queue: BatchRun[] = [];
  for (let il = 0; il < wl.length; il++) for (let b0 = 0; b0 < nB; b0 += per) queue.push({ il, b0, b1: Math.min(nB, b0 + per) });
  const edges = Array.from(plan.edgesUm);
  const batches: Float64Array[][] = wl.map(() => []);
  const missing = wl.map(() => nB);
  let head = 0;
  let finished = 0;
  const messageOf = (r: BatchRun): DepthTraceMessage => ({
    kind: "depth",
    depthEdgesUm: edges,
    items: [{
      combo: req.comboIndex, il: r.il, wavelengthNm: wl[r.il], thetaDeg: req.thetaDeg, phiDeg: req.phiDeg, seed: req.seed,
      firstBatch: r.b0, batchRays: plan.batchRays.slice(r.b0, r.b1),
    }],
  });
  const accept = (r: BatchRun, out: Float64Array): void => {
    const len = plan.tallyLength;
    if (out.length !== (r.b1 - r.b0) * len) throw new Error(`worker returned ${out.length} tally values, expected ${(r.b1 - r.b0) * len}`);
    for (let b = r.b0; b < r.b1; b++) batches[r.il][b] = out.subarray((b - r.b0) * len, (b - r.b0 + 1) * len);
    missing[r.il] -= r.b1 - r.b0;
    if (missing[r.il] > 0) return;
    builder.addWavelength(r.il, sumTallies(batches[r.il], len));
    batches[r.il] = [];
    req.onWavelength?.(++finished, wl.length);
  };
  await drainPool<BatchRun, DepthTraceMessage>({ run: (m) => pool.runDepth(m) }, 2 * pool.nWorkers, {
    queued: () => queue.length - head,
    take: () => {
      const r = queue[head++];
      return { msg: messageOf(r), runs: r };
    },
    accept,
  });
  return builder.profile();
}
