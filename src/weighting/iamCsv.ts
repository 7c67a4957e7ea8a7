import { stringify } from "csv-stringify/sync";
import type { PhotocurrentSummary } from "./photocurrent.js";

/** Columns of the angular-modifier table (one row per incidence direction). */
export const IAM_CSV_COLUMNS = ["theta_deg", "phi_deg", "iam", "iam_stderr", "jsc_mA_cm2", "jsc_stderr"] as const;

/** IAM table as CSV; an undefined modifier (J at the reference angle is 0) is an empty cell. */
export function iamCsv(s: PhotocurrentSummary): string {
  const rows = s.directions.map((d) => [d.thetaDeg, d.phiDeg, d.iam ?? "", d.iamStderr ?? "", d.jscMaCm2, d.jscStderrMaCm2]);
  return stringify(rows, { header: true, columns: [...IAM_CSV_COLUMNS], cast: { number: (v) => String(v) } });
}
