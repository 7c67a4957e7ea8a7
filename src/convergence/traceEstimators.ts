import { lightStreamKey, RandomStream } from "../random/stream.js";
import type { LoadedStudy } from "../study/load.js";
import { channelMean, fillPairGroup, pointStdErr, tallyLength, tallyProblem } from "../sweep/tally.js";
import { REPLICA_GROUPS } from "../random/replicaGroups.js";
import { batchLaunchPoints } from "../trace/launchPoints.js";
import type { RaysPlan } from "../study/studyTypes.js";
import { channelNames, compileStack, traceBatch, type CompiledStack, type CompileOptions } from "../trace/index.js";
import type { TracePool } from "../workers/pool.js";
import type { TraceItem } from "../workers/traceTask.js";
import { InputError } from "../util/errors.js";
import { replicaSeed } from "./replicaSeed.js";
import type { AsyncEstimator, Estimate, Estimator } from "./runConvergence.js";

/**
 * A convergence subject traced on a one-direction study: `study` is the loaded study with its grid
 * reduced to θ = [thetaDeg], one azimuth, and the wavelengths of interest (see convergeStudy.ts).
 * Run (namespace) traces batch b of wavelength il on streamKey(replicaSeed(seed, namespace),
 * 0, 0, il, b), in this thread or on the pool alike, so both give the same numbers. Under Sobol'
 * launch sampling a run of N rays is REPLICA_GROUPS batches of ⌈N/16⌉ rays, each batch one
 * independently scrambled replica, and its standard error comes from their spread.
 */
export interface TraceSubject {
  study: LoadedStudy;
  combo: number;
}

/** Per-wavelength result of one run: mean and standard error of every channel. */
interface PointResult {
  mean: Float64Array;
  stderr: Float64Array;
}

/** Rays per batch of a run of nRays: the study's batch, or one batch per replica group under Sobol' sampling. */
function runBatch(rays: RaysPlan, nRays: number): number {
  return rays.sampling === "sobol" ? Math.ceil(nRays / REPLICA_GROUPS) : rays.batch;
}

/** Traces wavelength index il of the subject in this thread (compiled stacks cached). */
function inThreadTracer(subject: TraceSubject, options?: CompileOptions): { channels: string[]; run: (il: number, nRays: number, seed: number) => PointResult } {
  const combo = subject.study.combos[subject.combo];
  const study = combo.study;
  const g = study.grid;
  const stacks: CompiledStack[] = g.wavelengthNm.map((l) => compileStack(study, subject.study.registry, l, options));
  const channels = channelNames(stacks[0]);
  const nCh = channels.length;
  const len = tallyLength(nCh);
  const thetaDeg = g.thetaDeg[0];
  const phiDeg = g.phiMode === "averaged" ? null : g.phiDeg[0];
  const run = (il: number, nRays: number, seed: number): PointResult => {
    const acc = new Float64Array(len);
    const t = new Float64Array(len);
    const batch = runBatch(study.rays, nRays);
    for (let b = 0, done = 0; done < nRays; b++) {
      const n = Math.min(batch, nRays - done);
      t.fill(0);
      const launch = batchLaunchPoints(study.rays.sampling, seed, study.lightFrom, 0, 0, il, b, batch);
      traceBatch(stacks[il], thetaDeg, phiDeg, n, new RandomStream(lightStreamKey(seed, study.lightFrom, 0, 0, il, b)), t, "unpolarized", study.lightFrom ?? "front", launch);
      const problem = tallyProblem(t, nCh, n);
      if (problem !== undefined) {
        throw new Error(`convergence run failed at θ=${thetaDeg}°, φ=${phiDeg ?? "averaged"}, λ=${g.wavelengthNm[il]} nm, seed ${seed}, batch ${b}: ${problem}`);
      }
      fillPairGroup(t, nCh, b);
      for (let i = 0; i < len; i++) acc[i] += t[i];
      done += n;
    }
    const mean = new Float64Array(nCh);
    const stderr = new Float64Array(nCh);
    for (let c = 0; c < nCh; c++) {
      mean[c] = channelMean(acc, nCh, c);
      stderr[c] = pointStdErr(acc, nCh, c, study.rays.sampling);
    }
    return { mean, stderr };
  };
  return { channels, run };
}

function channelOf(channels: string[], name: string): number {
  const c = channels.indexOf(name);
  if (c < 0) throw new InputError(`--channel: the stack has no channel "${name}" (has ${channels.join(", ")})`);
  return c;
}

/**
 * Combines per-wavelength results into the estimate: point mode (weights = null) takes channel c of
 * the single wavelength; spectral mode J = Σ w_i A_i with SE = sqrt(Σ w_i² SE_i²) (independent
 * streams per wavelength).
 */
function combine(results: PointResult[], c: number, weights: ArrayLike<number> | null, nRays: number): Estimate {
  if (weights === null) return { value: results[0].mean[c], stderr: results[0].stderr[c], nRays };
  let j = 0;
  let var2 = 0;
  results.forEach((r, i) => {
    j += weights[i] * r.mean[c];
    var2 += (weights[i] * r.stderr[c]) ** 2;
  });
  return { value: j, stderr: Math.sqrt(var2), nRays };
}

/**
 * Estimator traced in this thread. `channel` is the channel estimated; `weights` (one per
 * wavelength of the subject) turn it into a spectral sum, null for a single point.
 */
export function inThreadEstimator(subject: TraceSubject, channel: string, weights: ArrayLike<number> | null, options?: CompileOptions): Estimator {
  const tracer = inThreadTracer(subject, options);
  const c = channelOf(tracer.channels, channel);
  const seedOf = subject.study.combos[subject.combo].study.seed;
  const nL = subject.study.combos[subject.combo].study.grid.wavelengthNm.length;
  return (nRays, namespace) => {
    const seed = replicaSeed(seedOf, namespace);
    const results = Array.from({ length: nL }, (_, il) => tracer.run(il, nRays, seed));
    return combine(results, c, weights, nRays);
  };
}

/**
 * The same estimator on a worker pool: every wavelength's batches go out as messages of a few
 * batches each, all in flight together; tallies are summed per wavelength in batch order, so the
 * numbers equal the in-thread ones for any worker count.
 */
export function poolEstimator(subject: TraceSubject, channel: string, weights: ArrayLike<number> | null, pool: TracePool): AsyncEstimator {
  const study = subject.study.combos[subject.combo].study;
  const g = study.grid;
  const nL = g.wavelengthNm.length;
  // Channel names from one stack compiled here (the workers compile the same stacks).
  const channels = channelNames(compileStack(study, subject.study.registry, g.wavelengthNm[0]));
  const c = channelOf(channels, channel);
  const nCh = channels.length;
  const len = tallyLength(nCh);
  const phiDeg = g.phiMode === "averaged" ? null : g.phiDeg[0];
  return async (nRays, namespace) => {
    const seed = replicaSeed(study.seed, namespace);
    const batch = runBatch(study.rays, nRays);
    const nBatches = Math.ceil(nRays / batch);
    const sizes = Array.from({ length: nBatches }, (_, j) => Math.min(batch, nRays - j * batch));
    // About four messages per worker per run in total, at least one batch each.
    const per = Math.max(1, Math.ceil((nBatches * nL) / (4 * pool.nWorkers)));
    const jobs: Promise<Float64Array>[][] = [];
    for (let il = 0; il < nL; il++) {
      const mine: Promise<Float64Array>[] = [];
      for (let j0 = 0; j0 < nBatches; j0 += per) {
        const item: TraceItem = {
          combo: subject.combo,
          it: 0,
          ip: 0,
          il,
          thetaDeg: g.thetaDeg[0],
          phiDeg,
          wavelengthNm: g.wavelengthNm[il],
          firstBatch: j0,
          batchRays: sizes.slice(j0, j0 + per),
          batchSize: batch,
          seed,
        };
        mine.push(pool.run({ items: [item] }));
      }
      jobs.push(mine);
    }
    // One await over everything, so a failing message never leaves others' rejections unhandled.
    const all = await Promise.all(jobs.map((mine) => Promise.all(mine)));
    const results: PointResult[] = [];
    for (let il = 0; il < nL; il++) {
      const outs = all[il];
      const acc = new Float64Array(len);
      // Batch tallies in batch order (messages are in batch order, batches within a message too).
      for (const out of outs) for (let k = 0; k < out.length; k += len) for (let i = 0; i < len; i++) acc[i] += out[k + i];
      const mean = new Float64Array(nCh);
      const stderr = new Float64Array(nCh);
      for (let ch = 0; ch < nCh; ch++) {
        mean[ch] = channelMean(acc, nCh, ch);
        stderr[ch] = pointStdErr(acc, nCh, ch, study.rays.sampling);
      }
      results.push({ mean, stderr });
    }
    return combine(results, c, weights, nRays);
  };
}
