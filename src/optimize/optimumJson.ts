/**
 * The optimisation's result file, <out>/optimum.json (kind "lightfold.optimum"), and its text table.
 */
import type { LaunchSampling } from "../random/sobol.js";
import type { ObjectiveInfo } from "./objectives.js";
import type { ParameterSpec } from "./parameters.js";
import type { OptimumResult } from "./types.js";

export const OPTIMUM_KIND = "lightfold.optimum";
export const OPTIMUM_FILE = "optimum.json";

export interface OptimumCost {
  evaluations: number;
  raysTraced: number;
  raysResumed: number;
  /** Rays of one evaluation (all its grid points). */
  raysPerEvaluation: number;
  wallS: number;
  workers: number;
}

export interface OptimumDocument {
  kind: typeof OPTIMUM_KIND;
  formatVersion: 1;
  toolVersion: string;
  study: { name: string; file: string; seed: number; raysPerPoint: number; batch: number; /** Launch sampling of every evaluation (rays.ts, parseRays). */ sampling: LaunchSampling; grid: { nTheta: number; nPhi: number; nWavelength: number } };
  objective: ObjectiveInfo & { details: Record<string, unknown> };
  parameters: ParameterSpec[];
  /**
   * errorMethod "replicas": every ± and interval comes from the spread of the replicas' fits (Student
   * t), never from a per-evaluation error or an independence assumption between evaluations.
   */
  settings: { replicas: number; level: number; tolerance: number[]; errorMethod?: "replicas" };
  result: OptimumResult;
  cost: OptimumCost;
}

/** A number with about `digits` significant figures of its error: "75.3 ± 1.2". */
export function withError(value: number, err: number, minDecimals = 0): string {
  const decimals = err > 0 && Number.isFinite(err) ? Math.max(minDecimals, Math.min(8, 1 - Math.floor(Math.log10(err)))) : 3;
  return `${value.toFixed(decimals)} ± ${err.toFixed(decimals)}`;
}

function fmtRange(lo: number, hi: number, decimals: number): string {
  return `[${lo.toFixed(decimals)}, ${hi.toFixed(decimals)}]`;
}

function decimalsFor(err: number): number {
  return err > 0 && Number.isFinite(err) ? Math.max(0, Math.min(8, 1 - Math.floor(Math.log10(err)))) : 3;
}

/** The summary printed by `lightfold optimize`. */
export function formatOptimum(doc: OptimumDocument): string {
  const r = doc.result;
  const pct = `${Math.round(doc.settings.level * 100)} %`;
  const lines: string[] = [];
  lines.push(`${doc.study.name}: maximise ${doc.objective.description}`);
  const rows: string[][] = [["parameter", "bounds", "optimum", `${pct} interval`, "note"]];
  doc.parameters.forEach((p, d) => {
    const dec = decimalsFor(r.locationStdErr[d] || (p.upper - p.lower) / 1000);
    const unit = p.unit ? ` ${p.unit}` : "";
    rows.push([
      p.path,
      `${p.lower}–${p.upper}${unit}`,
      `${r.location[d].toFixed(dec)}${unit}`,
      fmtRange(r.locationInterval[d][0], r.locationInterval[d][1], dec),
      r.atBound[d] === null ? "" : `at the ${r.atBound[d]} bound: the optimum may lie beyond it`,
    ]);
  });
  const dv = decimalsFor(r.valueStdErr);
  rows.push([doc.objective.name, "", `${r.value.toFixed(dv)} ${doc.objective.unit}`, fmtRange(r.valueInterval[0], r.valueInterval[1], dv), `± ${r.valueStdErr.toFixed(dv)} (standard error)`]);
  const w = rows[0].map((_, c) => Math.max(...rows.map((row) => row[c].length)));
  for (const row of rows) lines.push("  " + row.map((cell, c) => cell.padEnd(w[c])).join("  ").trimEnd());
  const c = doc.cost;
  lines.push(
    `  ${r.replicas} independent replicas of a ${r.design.points.length}-point local fit; ${c.evaluations} evaluations × ${c.raysPerEvaluation.toExponential(2)} rays` +
      ` = ${c.raysTraced.toExponential(3)} rays traced${c.raysResumed > 0 ? ` (+${c.raysResumed.toExponential(3)} from journals)` : ""} in ${c.wallS.toFixed(1)} s on ${c.workers} worker(s)`,
    `  ± and intervals: spread of the ${r.replicas} replicas' fits (Student t, ${r.replicas - 1} degrees of freedom); each replica traces its whole design on one seed (paired), the replicas on independent seeds`,
  );
  return lines.join("\n") + "\n";
}
