/**
 * The objective of a study with one or two stack fields varied: each evaluation is the study with
 * the values written into its stack, reduced to the grid the objective needs, traced as its own
 * single-combination sweep on a shared worker pool. Every evaluation of one stream uses the same
 * seed, so its rays use the same random streams streamKey(seed, 0, it, ip, il, b) at every x: common
 * random numbers. Replica r uses replicaSeed(seed, "optimize/replica<r>"). With an output folder each
 * evaluation is a journaled sweep in <out>/evaluations/<stream>_<values>/, so an interrupted
 * optimisation resumes where it stopped (the search is deterministic and replays the same points).
 */
import { join } from "node:path";
import { replicaSeed } from "../convergence/replicaSeed.js";
import { loadStudyFromDocument, withOverrides, type LoadedStudy } from "../study/load.js";
import type { RaysPlan, Study } from "../study/studyTypes.js";
import { substituteCombo } from "../study/sweepCombos.js";
import { runSweep, type SweepProgress } from "../sweep/runSweep.js";
import { InputError } from "../util/errors.js";
import type { TracePool } from "../workers/pool.js";
import { needsRearLight, objectiveGrid, objectiveValue, type ObjectiveSpec } from "./objectives.js";
import type { ParameterSpec } from "./parameters.js";
import type { Estimate, Objective } from "./types.js";

export interface StudyDocument {
  doc: unknown;
  baseDir: string;
  path: string;
}

export interface EvaluationStats {
  evaluations: number;
  raysTraced: number;
  raysResumed: number;
}

export interface StudyObjectiveOptions {
  base: StudyDocument;
  params: ParameterSpec[];
  objective: ObjectiveSpec;
  /** A pool opened for any evaluation study of this base (see evaluationStudy). */
  pool: TracePool;
  outDir?: string;
  rays?: RaysPlan;
  /** Set matching evaluation journals aside instead of resuming from them. */
  fresh?: boolean;
  onNotice?: (message: string) => void;
  onProgress?: (p: SweepProgress) => void;
}

/** Seed of a stream: −1 = the study's own; r ≥ 0 = replica r. */
export function streamSeed(studySeed: number, stream: number): number {
  return stream < 0 ? studySeed : replicaSeed(studySeed, `optimize/replica${stream}`);
}

export function streamLabel(stream: number): string {
  return stream < 0 ? "search" : `r${stream}`;
}

/** Shortest exact text of a parameter value (file-name safe: digits, ".", "-", "e", "+"). */
function valueText(v: number): string {
  return String(Number(v.toPrecision(12)));
}

/**
 * The study at parameter values x on a stream: the study file's document with the values written
 * into its stack (its own "sweep" section dropped), validated like any study, then the seed, rays
 * and grid of the evaluation.
 */
export function evaluationStudy(o: Pick<StudyObjectiveOptions, "base" | "params" | "objective" | "rays">, x: number[], stream: number): LoadedStudy {
  const raw = o.base.doc;
  if (raw === null || typeof raw !== "object" || Array.isArray(raw)) throw new InputError(`${o.base.path}: expected a JSON object`);
  const values: Record<string, number> = {};
  o.params.forEach((p, i) => (values[p.path] = x[i]));
  const { sweep: _dropped, ...rest } = raw as Record<string, unknown>;
  let loaded: LoadedStudy;
  try {
    // Light from the rear is traced only when the objective reads it (bifacial yield).
    const illumination = needsRearLight(o.objective) ? "both" : "front";
    const doc = { ...rest, illumination, stack: substituteCombo((raw as Record<string, unknown>).stack, values, "--param") };
    loaded = loadStudyFromDocument(doc, { baseDir: o.base.baseDir, path: o.base.path });
  } catch (err) {
    if (err instanceof InputError) {
      const at = o.params.map((p, i) => `${p.path} = ${valueText(x[i])}`).join(", ");
      throw new InputError(`${o.base.path}: with ${at}: ${err.message}`, err.hint ?? "check the --param bounds");
    }
    throw err;
  }
  const study = loaded.combos[0].study;
  return withOverrides(loaded, { seed: streamSeed(study.seed, stream), grid: objectiveGrid(o.objective, study.grid), ...(o.rays !== undefined ? { rays: o.rays } : {}) });
}

/**
 * Rays per task message: evaluations run one after another, so each should keep every thread busy
 * with few messages (8 per worker) yet not flood the pool with tiny ones (at least 1000 rays).
 */
function messageRays(study: Study, nWorkers: number): number {
  const g = study.grid;
  const perPoint = study.rays.mode === "fixed" ? study.rays.perPoint : study.rays.minPerPoint;
  const planned = g.thetaDeg.length * g.phiDeg.length * g.wavelengthNm.length * perPoint;
  return Math.max(study.rays.batch, 1000, Math.ceil(planned / (8 * nWorkers)));
}

/** The optimiser's objective over the study, and running totals of what it traced. */
export function studyObjective(o: StudyObjectiveOptions): { objective: Objective; stats: EvaluationStats } {
  const stats: EvaluationStats = { evaluations: 0, raysTraced: 0, raysResumed: 0 };
  const objective: Objective = async (x: number[], stream: number): Promise<Estimate> => {
    const study = evaluationStudy(o, x, stream);
    const tag = `${streamLabel(stream)}_${x.map(valueText).join("_")}`;
    const combo = study.combos[0];
    const r = await runSweep({
      study,
      pool: o.pool.forVariant(study.hash, study.combos.map((c) => c.study)),
      raysPerMessage: messageRays(combo.study, o.pool.nWorkers),
      ...(o.outDir !== undefined ? { outDir: join(o.outDir, "evaluations", tag) } : {}),
      fresh: o.fresh === true,
      onNotice: o.onNotice,
      onProgress: o.onProgress,
    });
    stats.evaluations++;
    stats.raysTraced += r.raysTraced;
    stats.raysResumed += r.raysResumed;
    return objectiveValue(o.objective, r.matrices, tag);
  };
  return { objective, stats };
}
