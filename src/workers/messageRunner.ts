import { lightStreamKey, RandomStream } from "../random/stream.js";
import { buildMaterialRegistry } from "../study/userMaterials.js";
import { batchLaunchPoints } from "../trace/launchPoints.js";
import { fillPairGroup, tallyLength, tallyProblem } from "../sweep/tally.js";
import { isIdealRear, type StackSpec, type TextureSpec } from "../study/stackTypes.js";
import type { Study } from "../study/studyTypes.js";
import type { TracerModule } from "./tracerModule.js";
import { StackCache } from "./stackCache.js";
import { withTaskWhere } from "./taskError.js";
import type { TraceItem, TraceMessage, WorkerSetup } from "./traceTask.js";

/** Compiled stacks kept per thread; (combo, λ) pairs beyond this are evicted oldest first. */
const STACK_CACHE_SIZE = 128;
/** Study variants (TraceMessage.variant) kept per thread. */
const VARIANT_CACHE_SIZE = 64;

/**
 * A function that traces task messages for one study. Stacks are compiled once per (combo, λ) and
 * cached. Every batch tally is checked (finite, ray count, channels summing to 1); a bad one throws
 * naming the task's coordinates so the run fails loudly instead of writing NaN.
 */
export function createMessageRunner(setup: WorkerSetup, tracer: TracerModule): (msg: TraceMessage) => Float64Array {
  const { compileStack, channelNames, traceBatch } = tracer;
  const registry = buildMaterialRegistry(setup.materials, setup.baseDir);
  const cache = new StackCache<{ cs: never; nChannels: number }>(STACK_CACHE_SIZE);
  const variants = new Map<string, Study[]>();
  const textures = new TextureInterner();

  /** The studies of a message: the pool's own, or a variant's (kept by key, textures shared). */
  const studiesOf = (msg: TraceMessage): { prefix: string; studies: Study[] } => {
    const v = msg.variant;
    if (v === undefined) return { prefix: "", studies: setup.studies };
    let studies = variants.get(v.key);
    if (studies === undefined) {
      studies = v.studies.map((s) => textures.intern(s));
      if (variants.size >= VARIANT_CACHE_SIZE) variants.delete(variants.keys().next().value as string);
      variants.set(v.key, studies);
    }
    return { prefix: `${v.key}/`, studies };
  };

  const compiled = (item: TraceItem, prefix: string, studies: Study[]): { cs: never; nChannels: number } => {
    return cache.get(`${prefix}${item.combo}/${item.wavelengthNm}`, () => {
      const cs = compileStack(studies[item.combo], registry, item.wavelengthNm) as never;
      return { cs, nChannels: channelNames(cs).length };
    });
  };

  return (msg: TraceMessage): Float64Array => {
    let total = 0;
    const { prefix, studies } = studiesOf(msg);
    const stacks = msg.items.map((item) => {
      const s = withCoordinates(item, item.firstBatch, () => compiled(item, prefix, studies));
      total += tallyLength(s.nChannels) * item.batchRays.length;
      return s;
    });
    const out = new Float64Array(total);
    let offset = 0;
    msg.items.forEach((item, k) => {
      const { cs, nChannels } = stacks[k];
      const len = tallyLength(nChannels);
      const seed = item.seed ?? studies[item.combo].seed;
      for (let j = 0; j < item.batchRays.length; j++) {
        const batch = item.firstBatch + j;
        const nRays = item.batchRays[j];
        const tally = out.subarray(offset, offset + len);
        withCoordinates(item, batch, () => {
          // Common random numbers: every combination traces batch b of (θ, φ, λ) with the same stream
          // (a rear-lit twin with its own: lightStreamKey).
          const study = studies[item.combo];
          const lightFrom = study.lightFrom;
          const rng = new RandomStream(lightStreamKey(seed, lightFrom, item.it, item.ip, item.il, batch));
          const launch = batchLaunchPoints(study.rays.sampling, seed, lightFrom, item.it, item.ip, item.il, batch, item.batchSize ?? study.rays.batch);
          traceBatch(cs, item.thetaDeg, item.phiDeg, nRays, rng, tally, "unpolarized", lightFrom ?? "front", launch);
          const problem = tallyProblem(tally, nChannels, nRays);
          if (problem !== undefined) throw new Error(problem);
          fillPairGroup(tally, nChannels, batch);
        });
        offset += len;
      }
    });
    return out;
  };
}

/**
 * Shares texture objects between study variants whose textures are equal: compiled surface tiles
 * are cached per texture object (src/trace/compile.ts), so variants that differ only in films or
 * thicknesses reuse the geometry instead of rebuilding it.
 */
class TextureInterner {
  private readonly seen = new Map<string, TextureSpec>();

  intern(study: Study): Study {
    const front = this.one(study.stack.front.texture);
    const rear = study.stack.rear;
    const stack: StackSpec = {
      ...study.stack,
      front: { ...study.stack.front, texture: front },
      rear: isIdealRear(rear) ? rear : { ...rear, texture: this.one(rear.texture) },
    };
    return { ...study, stack };
  }

  private one(t: TextureSpec): TextureSpec {
    const key = JSON.stringify(t);
    const known = this.seen.get(key);
    if (known !== undefined) return known;
    if (this.seen.size >= 256) this.seen.clear();
    this.seen.set(key, t);
    return t;
  }
}

/** Runs fn; an error is re-thrown with the task's coordinates in front. */
function withCoordinates<T>(item: TraceItem, batch: number, fn: () => T): T {
  return withTaskWhere(() => taskWhere(item, batch), fn);
}

/** "combo 0, θ=30° (index 2), φ=0° (index 0), λ=500 nm (index 8), batch 3". */
export function taskWhere(item: TraceItem, batch: number): string {
  const phi = item.phiDeg === null ? "φ averaged" : `φ=${item.phiDeg}° (index ${item.ip})`;
  return `combo ${item.combo}, θ=${item.thetaDeg}° (index ${item.it}), ${phi}, λ=${item.wavelengthNm} nm (index ${item.il}), batch ${batch}`;
}
