/**
 * One optimisation run end to end: the study file's document, the evaluation studies, one worker
 * pool for all of them, the search and the replica fits, then <out>/optimum.json (atomic). Every
 * evaluation is a journaled sweep under <out>/evaluations/, so running the same request again
 * resumes: finished evaluations are read back, the unfinished one continues from its journal.
 */
import { join } from "node:path";
import type { LaunchSampling } from "../random/sobol.js";
import { readStudyDocument } from "../study/load.js";
import { parseRays } from "../study/rays.js";
import type { RaysPlan } from "../study/studyTypes.js";
import { InputError } from "../util/errors.js";
import { workerSetupOf } from "../sweep/runSweep.js";
import { writeFileAtomic } from "../util/atomicWrite.js";
import { toolVersion } from "../util/version.js";
import { defaultWorkerCount, TracePool } from "../workers/pool.js";
import { objectiveInfo, type ObjectiveSpec } from "./objectives.js";
import { optimize } from "./optimize.js";
import { OPTIMUM_FILE, OPTIMUM_KIND, type OptimumDocument } from "./optimumJson.js";
import type { ParameterSpec } from "./parameters.js";
import { evaluationStudy, streamLabel, studyObjective } from "./studyObjective.js";
import type { Estimate, Objective } from "./types.js";

/** Default rays per batch of an evaluation: short batches keep neighbouring evaluations' streams in step. */
export const DEFAULT_OPTIMIZE_BATCH = 100;

export interface OptimizationRequest {
  studyPath: string;
  params: ParameterSpec[];
  objective: ObjectiveSpec;
  /** What the objective was built from (site, plane, spectrum…), copied into the result file. */
  objectiveDetails: Record<string, unknown>;
  outDir: string;
  workers?: number;
  replicas?: number;
  level?: number;
  tolerance?: number[];
  raysPerPoint?: number;
  batch?: number;
  fresh?: boolean;
  /** One line per finished evaluation. */
  onEvaluation?: (line: string) => void;
  onNotice?: (message: string) => void;
}

export interface OptimizationOutcome {
  doc: OptimumDocument;
  files: string[];
}

export async function runOptimization(req: OptimizationRequest): Promise<OptimizationOutcome> {
  const t0 = Date.now();
  const base = readStudyDocument(req.studyPath);
  if (base.doc !== null && typeof base.doc === "object" && "sweep" in base.doc) {
    req.onNotice?.("the study's \"sweep\" section is ignored: the optimiser sets the parameters it varies");
  }
  const lower = req.params.map((p) => p.lower);
  const upper = req.params.map((p) => p.upper);
  // The study as written decides the default rays; evaluations trace a fixed number per point.
  const asWritten = evaluationStudy({ base, params: req.params, objective: req.objective }, lower, -1);
  const plain = asWritten.combos[0].study;
  const perPoint = req.raysPerPoint ?? (plain.rays.mode === "fixed" ? plain.rays.perPoint : plain.rays.minPerPoint);
  const batch = Math.min(perPoint, req.batch ?? Math.min(plain.rays.batch, DEFAULT_OPTIMIZE_BATCH));
  // The launch sampling the study names, else the default of these rays (Sobol' with 16+ batches).
  const rays = evaluationRays(perPoint, batch, asWritten.raysAsWritten.sampling, base.path);
  if (plain.rays.mode === "target") req.onNotice?.(`the study's target-error rays are replaced by ${perPoint} rays per point (every evaluation traces the same rays)`);
  const spec = { base, params: req.params, objective: req.objective, rays };
  // Both corners must make valid stacks before anything is traced.
  const first = evaluationStudy(spec, lower, -1);
  evaluationStudy(spec, upper, -1);
  const g = first.combos[0].study.grid;
  const raysPerEvaluation = g.thetaDeg.length * g.phiDeg.length * g.wavelengthNm.length * perPoint;

  const workers = req.workers ?? defaultWorkerCount();
  const pool = new TracePool(workerSetupOf(first), workers);
  const info = objectiveInfo(req.objective);
  try {
    const { objective: traced, stats } = studyObjective({ ...spec, pool, outDir: req.outDir, fresh: req.fresh, onNotice: req.onNotice });
    let k = 0;
    const objective: Objective = async (x, stream): Promise<Estimate> => {
      const te = Date.now();
      const e = await traced(x, stream);
      k++;
      const at = req.params.map((p, i) => `${Number(x[i].toPrecision(6))}${p.unit ? " " + p.unit : ""}`).join(", ");
      req.onEvaluation?.(`[${k}] ${streamLabel(stream)} ${at}: ${e.value.toPrecision(7)} ± ${e.stderr.toPrecision(2)} ${info.unit} (${((Date.now() - te) / 1000).toFixed(1)} s)`);
      return e;
    };
    const tolerance = req.tolerance ?? req.params.map((p) => (p.upper - p.lower) / 100);
    const result = await optimize(objective, { lower, upper, tolerance, replicas: req.replicas, level: req.level });
    const doc: OptimumDocument = {
      kind: OPTIMUM_KIND,
      formatVersion: 1,
      toolVersion: toolVersion(),
      study: {
        name: first.name,
        file: base.path,
        seed: plain.seed,
        raysPerPoint: perPoint,
        batch,
        sampling: rays.sampling ?? "random",
        grid: { nTheta: g.thetaDeg.length, nPhi: g.phiDeg.length, nWavelength: g.wavelengthNm.length },
      },
      objective: { ...info, details: req.objectiveDetails },
      parameters: req.params,
      settings: { replicas: result.replicas, level: result.level, tolerance, errorMethod: "replicas" },
      result,
      cost: { evaluations: stats.evaluations, raysTraced: stats.raysTraced, raysResumed: stats.raysResumed, raysPerEvaluation, wallS: (Date.now() - t0) / 1000, workers },
    };
    const path = join(req.outDir, OPTIMUM_FILE);
    writeFileAtomic(path, JSON.stringify(doc, null, 2) + "\n");
    return { doc, files: [path] };
  } finally {
    await pool.close();
  }
}

/** The fixed rays of every evaluation; an explicit Sobol' sampling with too few batches is refused naming the flags. */
function evaluationRays(perPoint: number, batch: number, sampling: LaunchSampling | undefined, studyPath: string): RaysPlan {
  try {
    return parseRays({ perPoint, batch, ...(sampling !== undefined ? { sampling } : {}) }, "rays");
  } catch (err) {
    if (err instanceof InputError) throw new InputError(`${studyPath}: optimisation rays (--rays ${perPoint}, --batch ${batch}): ${err.message}`, `trace more rays per point or smaller batches with --rays/--batch, or set "sampling": "random" in the study`);
    throw err;
  }
}
