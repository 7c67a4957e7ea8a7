import type { Study } from "../study/studyTypes.js";

/**
 * One point's share of a task message: consecutive batches firstBatch, firstBatch+1, ... of the
 * point (combo, θ index, φ index, λ index). Each batch has its own random stream,
 * streamKey(seed, it, ip, il, batch) (the same for every combination: common random numbers), so how
 * batches are grouped into messages never matters.
 */
export interface TraceItem {
  combo: number;
  it: number;
  ip: number;
  il: number;
  thetaDeg: number;
  /** null = random azimuth per ray ("averaged"). */
  phiDeg: number | null;
  wavelengthNm: number;
  firstBatch: number;
  /** Rays of each batch, in batch order. */
  batchRays: number[];
  /** Seed instead of the combination's study seed (independent replicas, reference runs). */
  seed?: number;
  /**
   * Rays of a full batch of this point (default: the study's rays.batch): under Sobol' sampling
   * batch b starts at point ⌊b/16⌋·batchSize of its replica group's sequence (launchPoints.ts).
   */
  batchSize?: number;
}

/** A task message: several items, traced in order. */
export interface TraceMessage {
  items: TraceItem[];
  /**
   * Studies to trace instead of the pool's own (index = combo), under a key naming their content
   * (a study hash): one pool serves many variants of a study, e.g. an optimiser's evaluations.
   */
  variant?: TraceVariant;
}

export interface TraceVariant {
  key: string;
  studies: Study[];
}

/** Cloned once into every worker thread (piscina workerData). */
export interface WorkerSetup {
  /** One resolved study per combination (index = combo). */
  studies: Study[];
  /** User material entries of the study file, rebuilt into a registry in each thread. */
  materials: unknown[];
  baseDir: string;
  /** A tracer module file to use instead of lightfold's own (tests only). */
  tracerModule?: string;
}

/**
 * The result of a message: one tally per batch, concatenated in item then batch order, moved (not
 * copied) back to the main thread.
 */
export type TraceResult = Float64Array;

/** Prefix of a worker error message that came from bad input (error names do not cross threads). */
export const INPUT_ERROR_TAG = "[input] ";
