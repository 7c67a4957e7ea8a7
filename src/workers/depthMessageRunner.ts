import { generationStreamKey, RandomStream } from "../random/stream.js";
import { buildMaterialRegistry } from "../study/userMaterials.js";
import { tallyProblem } from "../sweep/tally.js";
import { baseTallyLength } from "../trace/tallyLayout.js";
import { depthTallyLength, type DepthTraceItem, type DepthTraceMessage } from "./depthTask.js";
import { StackCache } from "./stackCache.js";
import { withTaskWhere } from "./taskError.js";
import type { TracerModule } from "./tracerModule.js";
import type { WorkerSetup } from "./traceTask.js";

/** Stacks with depth grids kept per thread (a generation trace needs one per wavelength). */
const DEPTH_STACK_CACHE_SIZE = 64;

/**
 * A function that traces generation-profile messages for the pool's study. A stack is compiled
 * once per (combo, λ, depth grid) with depth tallies and random launch points (the generation
 * estimator's sampling, whatever the study's rays.sampling), and cached. Each batch goes into its
 * own zeroed tally (the caller sums them in batch order) and is checked like a sweep's batch.
 */
export function createDepthMessageRunner(setup: WorkerSetup, tracer: TracerModule): (msg: DepthTraceMessage) => Float64Array {
  const { compileStack, channelNames, traceBatch } = tracer;
  const registry = buildMaterialRegistry(setup.materials, setup.baseDir);
  const cache = new StackCache<{ cs: never; nChannels: number }>(DEPTH_STACK_CACHE_SIZE);

  const compiled = (item: DepthTraceItem, edges: number[], gridKey: string): { cs: never; nChannels: number } =>
    cache.get(`${item.combo}/${item.wavelengthNm}/${gridKey}`, () => {
      const cs = compileStack(setup.studies[item.combo], registry, item.wavelengthNm, { depthEdgesUm: edges, launchSampling: "random" }) as never;
      return { cs, nChannels: channelNames(cs).length };
    });

  return (msg: DepthTraceMessage): Float64Array => {
    const gridKey = msg.depthEdgesUm.join(",");
    const stacks = msg.items.map((item) => withTaskWhere(() => depthTaskWhere(item, item.firstBatch), () => compiled(item, msg.depthEdgesUm, gridKey)));
    const lengths = stacks.map((s) => depthTallyLength(baseTallyLength(s.nChannels), msg.depthEdgesUm));
    const out = new Float64Array(msg.items.reduce((n, item, k) => n + lengths[k] * item.batchRays.length, 0));
    let offset = 0;
    msg.items.forEach((item, k) => {
      const { cs, nChannels } = stacks[k];
      const len = lengths[k];
      for (let j = 0; j < item.batchRays.length; j++) {
        const batch = item.firstBatch + j;
        const nRays = item.batchRays[j];
        const tally = out.subarray(offset, offset + len);
        withTaskWhere(() => depthTaskWhere(item, batch), () => {
          const rng = new RandomStream(generationStreamKey(item.seed, item.combo, item.thetaDeg, item.phiDeg, item.il, batch));
          traceBatch(cs, item.thetaDeg, item.phiDeg, nRays, rng, tally);
          const problem = tallyProblem(tally, nChannels, nRays);
          if (problem !== undefined) throw new Error(problem);
        });
        offset += len;
      }
    });
    return out;
  };
}

/** "generation, combo 0, θ=0°, φ averaged, λ=500 nm (index 8), batch 3". */
export function depthTaskWhere(item: DepthTraceItem, batch: number): string {
  const phi = item.phiDeg === null ? "φ averaged" : `φ=${item.phiDeg}°`;
  return `generation, combo ${item.combo}, θ=${item.thetaDeg}°, ${phi}, λ=${item.wavelengthNm} nm (index ${item.il}), batch ${batch}`;
}
