import type { PhotocurrentSummary } from "./photocurrent.js";

/** Right-aligned plain-text table (no colour), first column left-aligned. */
export function textTable(header: string[], rows: string[][]): string {
  const widths = header.map((h, c) => Math.max(h.length, ...rows.map((r) => r[c].length)));
  const line = (cells: string[]): string =>
    cells.map((cell, c) => (c === 0 ? cell.padEnd(widths[c]) : cell.padStart(widths[c]))).join("  ").trimEnd();
  return [line(header), line(widths.map((n) => "-".repeat(n))), ...rows.map(line)].join("\n") + "\n";
}

const f = (x: number, digits: number): string => x.toFixed(digits);

/** Photocurrent table: per direction Jsc ± SE, IAM ± SE, and each loss channel in mA/cm². */
export function formatPhotocurrentTable(s: PhotocurrentSummary): string {
  const header = ["theta_deg", "phi_deg", "Jsc", "±SE", "IAM", "±SE", ...s.lossChannels];
  const rows = s.directions.map((d) => [
    String(d.thetaDeg),
    String(d.phiDeg),
    f(d.jscMaCm2, 3),
    f(d.jscStderrMaCm2, 3),
    d.iam === null ? "-" : f(d.iam, 4),
    d.iamStderr === null ? "-" : f(d.iamStderr, 4),
    ...d.losses.map((l) => f(l.currentMaCm2, 3)),
  ]);
  const head =
    `${s.studyName}: optical photocurrent under ${s.spectrum}, ${s.wavelengthMinNm}-${s.wavelengthMaxNm} nm ` +
    `(all currents in mA/cm²; available in this range ${f(s.totalAvailableMaCm2, 3)})\n` +
    `IAM = J(θ)/J(${s.iamReferenceThetaDeg}°) at the same azimuth; loss columns: current carried away by each channel\n` +
    (s.partial ? "WARNING: partial matrix (incomplete shards): missing points count as zero\n\n" : "\n");
  return head + textTable(header, rows);
}
