import { writeResponseMatrix } from "../response/matrixFile.js";
import type { ResponseMatrix } from "../response/responseMatrix.js";
import { writeFileAtomic } from "../util/atomicWrite.js";
import type { SweepPlan } from "./plan.js";
import { matrixPath, runJsonPath } from "./sweepPaths.js";

/** How a run went (run.json's timings and shard fields). */
export interface RunInfo {
  raysTraced: number;
  raysResumed: number;
  wallS: number;
  workers?: number;
  studyFile?: string;
  shards?: number;
  partial?: boolean;
  missingShards?: number[];
}

/** Absorber photocurrent at the first grid direction (the sweep's summary table). */
export interface JscFirstDirection {
  thetaDeg: number;
  phiDeg: number | "averaged";
  jscMaCm2: number;
  jscStderrMaCm2: number;
}

/**
 * The sweep summary's best combination (highest Jsc at the first direction) and its difference to
 * the runner-up, with the paired standard error (common random numbers, pairing groups) and the
 * one an independence assumption would give.
 */
export interface BestCombo {
  label: string;
  runnerUp: string;
  thetaDeg: number;
  phiDeg: number | "averaged";
  deltaJscMaCm2: number;
  /** Paired (pairing groups); NaN (null in run.json) when the two cannot be paired. */
  deltaStderrMaCm2: number;
  independentStderrMaCm2: number;
  /** Which error the summary quotes: "paired", or "independent" with the reason pairing failed. */
  errorKind?: "paired" | "independent";
  pairingReason?: string;
}

/** One combination in run.json. */
export interface RunCombo {
  label: string;
  values: Record<string, number>;
  /** The values in words with units, e.g. "Si 180 µm · SiNx 65 nm" (sweeps only). */
  title?: string;
  studyHash: string;
  matrix: string;
  summaries?: string[];
  jscFirstDirection?: JscFirstDirection;
  rays: number;
}

/** run.json (format "lightfold.run"), docs/contracts.md "Run directory". */
export interface RunRecord {
  format: "lightfold.run";
  formatVersion: 1;
  toolVersion: string;
  studyName: string;
  studyHash: string;
  studyFile?: string;
  seed: number;
  grid: { nTheta: number; nPhi: number; nWavelength: number; phiMode: string };
  rays: SweepPlan["rays"];
  combos: RunCombo[];
  bestCombo?: BestCombo;
  partial?: true;
  missingShards?: number[];
  shards?: number;
  timings: { finishedAt: string; wallS: number; raysTraced: number; raysResumed: number; raysPerS: number; workers?: number };
}

export function runRecordOf(plan: SweepPlan, matrices: ResponseMatrix[], info: RunInfo): RunRecord {
  return {
    format: "lightfold.run",
    formatVersion: 1,
    toolVersion: plan.toolVersion,
    studyName: plan.studyName,
    studyHash: plan.studyHash,
    ...(info.studyFile !== undefined ? { studyFile: info.studyFile } : {}),
    seed: plan.seed,
    grid: { nTheta: plan.grid.thetaDeg.length, nPhi: plan.grid.phiDeg.length, nWavelength: plan.grid.wavelengthNm.length, phiMode: plan.grid.phiMode },
    rays: plan.rays,
    combos: plan.combos.map((c, i) => ({
      label: c.label,
      values: c.values,
      ...(c.title !== undefined ? { title: c.title } : {}),
      studyHash: c.hash,
      matrix: `${c.label}/matrix.json`,
      rays: matrices[i].nRays.reduce((a, b) => a + b, 0),
    })),
    ...(info.partial === true ? { partial: true as const, missingShards: info.missingShards ?? [] } : {}),
    ...(info.shards !== undefined ? { shards: info.shards } : {}),
    timings: {
      finishedAt: new Date().toISOString(),
      wallS: info.wallS,
      raysTraced: info.raysTraced,
      raysResumed: info.raysResumed,
      raysPerS: info.wallS > 0 ? info.raysTraced / info.wallS : 0,
      ...(info.workers !== undefined ? { workers: info.workers } : {}),
    },
  };
}

/** Writes run.json atomically; returns its path. */
export function writeRunJson(outDir: string, record: RunRecord): string {
  const path = runJsonPath(outDir);
  writeFileAtomic(path, JSON.stringify(record, null, 2) + "\n");
  return path;
}

/**
 * Write stage: every combination's matrix, then run.json, each atomically. Returns the record
 * written and the paths (matrices in combination order, run.json last).
 */
export function writeRunOutputs(outDir: string, plan: SweepPlan, matrices: ResponseMatrix[], info: RunInfo): { record: RunRecord; files: string[] } {
  const files = matrices.map((m, i) => {
    const path = matrixPath(outDir, plan.combos[i].label);
    writeResponseMatrix(path, m);
    return path;
  });
  const record = runRecordOf(plan, matrices, info);
  files.push(writeRunJson(outDir, record));
  return { record, files };
}
