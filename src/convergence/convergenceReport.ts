import { stringify } from "csv-stringify/sync";
import { textTable } from "../weighting/table.js";
import type { ConvergenceResult } from "./runConvergence.js";

export const CONVERGENCE_FORMAT = "lightfold.convergence";
export const CONVERGENCE_FORMAT_VERSION = 1;
export const CONVERGENCE_FILE = "convergence.json";

/** What was converged: one channel at one point, or the absorber photocurrent over the spectrum. */
export interface ConvergenceSubject {
  mode: "point" | "spectral";
  /** e.g. "A_absorber" or "Jsc"; */
  quantity: string;
  unit: string;
  thetaDeg: number;
  phiDeg: number | null;
  /** Point mode only. */
  wavelengthNm: number | null;
  /** Spectral mode only: spectrum name and the grid's range. */
  spectrum: string | null;
  wavelengthRangeNm: [number, number] | null;
  /** "point" (point mode) or "wavelength" (spectral mode: nRays at every grid wavelength). */
  raysPer: "point" | "wavelength";
}

export interface ConvergenceReport extends ConvergenceResult, ConvergenceSubject {
  format: typeof CONVERGENCE_FORMAT;
  formatVersion: number;
  toolVersion: string;
  studyName: string;
  studyHash: string;
  combo: string;
  seed: number;
  /** Absorption sampling used by the tracer: "analog" or "expected" (expected-value weights). */
  tracerEstimator: string;
  /**
   * Launch sampling: "random" (per-ray standard errors) or "sobol" (randomized quasi-Monte Carlo;
   * each run is 16 independently scrambled replicas and its standard error comes from their spread).
   */
  launchSampling: "random" | "sobol";
}

export const CONVERGENCE_CSV_COLUMNS = [
  "n_rays",
  "value",
  "stderr",
  "deviation",
  "rms_error",
  "mean_stderr",
  "replicas",
  "predicted_rays",
] as const;

/** One row per step (replica 0's value and stderr; RMS over all replicas). */
export function convergenceCsv(r: ConvergenceReport): string {
  const rows = r.steps.map((s) => [s.nRays, s.value, s.stderr, s.deviation, s.rmsError, s.meanStderr, r.replicas, s.predictedRays ?? ""]);
  return stringify(rows, { header: true, columns: [...CONVERGENCE_CSV_COLUMNS], cast: { number: (v) => String(v) } });
}

const g = (x: number): string => (Number.isFinite(x) ? x.toPrecision(4) : String(x));

/** Printed table plus reference, slopes and prediction lines. */
export function formatConvergenceTable(r: ConvergenceReport): string {
  const where =
    r.mode === "point"
      ? `${r.quantity} at θ=${r.thetaDeg}°, φ=${r.phiDeg ?? "averaged"}, λ=${r.wavelengthNm} nm`
      : `${r.quantity} (${r.unit}) under ${r.spectrum}, ${r.wavelengthRangeNm?.[0]}–${r.wavelengthRangeNm?.[1]} nm, at θ=${r.thetaDeg}°, φ=${r.phiDeg ?? "averaged"}`;
  const lines: string[] = [];
  lines.push(`${r.studyName} (${r.combo}): convergence of ${where}, seed ${r.seed}, ${r.tracerEstimator === "default" ? "default estimator (chosen per wavelength)" : `${r.tracerEstimator} estimator`}`);
  if (r.launchSampling === "sobol") {
    lines.push("launch sampling: scrambled Sobol' points (randomized quasi-Monte Carlo); each run is 16 independent replicas, stderr from their spread");
  }
  lines.push(
    `reference: ${g(r.reference.value)} ± ${g(r.reference.stderr)}` +
      (r.reference.kind === "run" ? ` (independent run, ${r.reference.nRays} rays per ${r.raysPer})` : " (given)"),
  );
  lines.push("");
  const header = [`rays/${r.raysPer}`, "value", "stderr", "deviation", `rms err (${r.replicas})`, "mean stderr"];
  if (r.targetError !== null) header.push("rays for target");
  const rows = r.steps.map((s) => {
    const row = [String(s.nRays), g(s.value), g(s.stderr), g(s.deviation), g(s.rmsError), g(s.meanStderr)];
    if (r.targetError !== null) row.push(String(s.predictedRays));
    return row;
  });
  lines.push(textTable(header, rows).trimEnd());
  lines.push("");
  lines.push(
    `log-log slope vs rays: rms error ${r.slopes.rmsError.toFixed(3)} (± ${r.slopes.rmsErrorSd.toFixed(3)} expected scatter), ` +
      `|deviation| ${r.slopes.deviation.toFixed(3)}, reported stderr ${r.slopes.stderr.toFixed(3)}, mean stderr ${r.slopes.meanStderr.toFixed(3)} (plain Monte Carlo: -0.5${r.launchSampling === "sobol" ? "; steeper where quasi-Monte Carlo helps" : ""})`,
  );
  if (r.targetError !== null && r.predictedRays !== null) {
    lines.push(`rays per ${r.raysPer} predicted for stderr ${r.targetError}: ${r.predictedRays} (N·(stderr/target)² from the largest step)`);
  }
  return lines.join("\n") + "\n";
}
