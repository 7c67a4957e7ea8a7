import type { MaterialRegistry } from "../materials/registry.js";
import { RandomStream, streamKey } from "../random/stream.js";
import { photocurrentWeights, type Spectrum } from "../spectrum/index.js";
import type { Study } from "../study/studyTypes.js";
import { channelMean, channelStdErr, tallyLength, tallyProblem } from "../sweep/tally.js";
import { channelNames, compileStack, traceBatch, type CompiledStack, type CompileOptions } from "../trace/index.js";
import { InputError } from "../util/errors.js";
import type { Estimate, Estimator } from "./runConvergence.js";

/** Default rays per batch (each batch on its own stream) when the study does not say. */
const DEFAULT_BATCH = 1000;

interface PointStack {
  cs: CompiledStack;
  channels: string[];
}

/**
 * Traces `nRays` at one direction and wavelength in batches, batch b on the stream
 * streamKey(seed, namespace, θ, φ, λ, b), and returns the merged tally. Tallies are added batch by
 * batch in order, so the result depends only on the seed, namespace and ray count.
 */
function tracePoint(
  stack: PointStack,
  seed: number,
  namespace: string,
  thetaDeg: number,
  phiDeg: number | null,
  wavelengthNm: number,
  nRays: number,
  batch: number,
): Float64Array {
  const nCh = stack.channels.length;
  const len = tallyLength(nCh);
  const acc = new Float64Array(len);
  const t = new Float64Array(len);
  for (let b = 0, done = 0; done < nRays; b++) {
    const n = Math.min(batch, nRays - done);
    t.fill(0);
    const rng = new RandomStream(streamKey(seed, namespace, thetaDeg, phiDeg ?? "avg", wavelengthNm, b));
    traceBatch(stack.cs, thetaDeg, phiDeg, n, rng, t);
    const problem = tallyProblem(t, nCh, n);
    if (problem !== undefined) {
      throw new Error(`convergence run failed at θ=${thetaDeg}°, φ=${phiDeg ?? "averaged"}, λ=${wavelengthNm} nm, ${namespace}, batch ${b}: ${problem}`);
    }
    for (let i = 0; i < len; i++) acc[i] += t[i];
    done += n;
  }
  return acc;
}

function compilePoint(study: Study, registry: MaterialRegistry, wavelengthNm: number, options?: CompileOptions): PointStack {
  const cs = compileStack(study, registry, wavelengthNm, options);
  return { cs, channels: channelNames(cs) };
}

function batchOf(study: Study): number {
  return study.rays.batch > 0 ? study.rays.batch : DEFAULT_BATCH;
}

export interface PointTarget {
  thetaDeg: number;
  phiDeg: number | null;
  wavelengthNm: number;
  channel: string;
}

/** Estimator of one channel's fraction at one direction and wavelength (in-process tracing). */
export function pointEstimator(study: Study, registry: MaterialRegistry, target: PointTarget, options?: CompileOptions): Estimator {
  const stack = compilePoint(study, registry, target.wavelengthNm, options);
  const c = stack.channels.indexOf(target.channel);
  if (c < 0) throw new InputError(`--channel: the stack has no channel "${target.channel}" (has ${stack.channels.join(", ")})`);
  const batch = batchOf(study);
  return (nRays: number, namespace: string): Estimate => {
    const t = tracePoint(stack, study.seed, namespace, target.thetaDeg, target.phiDeg, target.wavelengthNm, nRays, batch);
    const nCh = stack.channels.length;
    return { value: channelMean(t, nCh, c), stderr: channelStdErr(t, nCh, c), nRays };
  };
}

export interface SpectralTarget {
  thetaDeg: number;
  phiDeg: number | null;
  spectrum: Spectrum;
}

/**
 * Estimator of the absorber photocurrent (mA/cm²) at one direction over the study's wavelength grid:
 * J = Σ w_i A_i, SE = sqrt(Σ w_i² SE_i²) (independent streams per wavelength); `nRays` rays at every wavelength.
 */
export function spectralEstimator(study: Study, registry: MaterialRegistry, target: SpectralTarget, options?: CompileOptions): Estimator {
  const grid = study.grid.wavelengthNm;
  const w = photocurrentWeights(grid, target.spectrum);
  const stacks = grid.map((l) => compilePoint(study, registry, l, options));
  const batch = batchOf(study);
  return (nRays: number, namespace: string): Estimate => {
    let j = 0;
    let var2 = 0;
    grid.forEach((l, i) => {
      const stack = stacks[i];
      const c = stack.channels.indexOf("A_absorber");
      const nCh = stack.channels.length;
      const t = tracePoint(stack, study.seed, namespace, target.thetaDeg, target.phiDeg, l, nRays, batch);
      j += w[i] * channelMean(t, nCh, c);
      var2 += (w[i] * channelStdErr(t, nCh, c)) ** 2;
    });
    return { value: j, stderr: Math.sqrt(var2), nRays };
  };
}
