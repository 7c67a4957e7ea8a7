import { channelLabel, channelShortLabel } from "../response/channelLabels.js";
import type { PhotocurrentSummary } from "./photocurrent.js";

/** Right-aligned plain-text table (no colour), first column left-aligned. */
export function textTable(header: string[], rows: string[][]): string {
  const widths = header.map((h, c) => Math.max(h.length, ...rows.map((r) => r[c].length)));
  const line = (cells: string[]): string =>
    cells.map((cell, c) => (c === 0 ? cell.padEnd(widths[c]) : cell.padStart(widths[c]))).join("  ").trimEnd();
  return [line(header), line(widths.map((n) => "-".repeat(n))), ...rows.map(line)].join("\n") + "\n";
}

const f = (x: number, digits: number): string => x.toFixed(digits);

/** Channels that carry current in at least one direction (in matrix order), and those that never do. */
export function nonZeroLossChannels(s: PhotocurrentSummary): { shown: string[]; zero: string[] } {
  const shown: string[] = [];
  const zero: string[] = [];
  s.lossChannels.forEach((c, k) => (s.directions.some((d) => d.losses[k]!.currentMaCm2 !== 0) ? shown : zero).push(c));
  return { shown, zero };
}

/**
 * Photocurrent table: per direction Jsc ± SE, IAM ± SE, and the current of each loss channel that
 * carries any (short labels; a key below names the matrix channels, and those with no current).
 */
export function formatPhotocurrentTable(s: PhotocurrentSummary): string {
  const { shown, zero } = nonZeroLossChannels(s);
  const index = shown.map((c) => s.lossChannels.indexOf(c));
  const header = ["theta_deg", "phi_deg", "Jsc", "±SE", "IAM", "±SE", ...shown.map(channelShortLabel)];
  const rows = s.directions.map((d) => [
    String(d.thetaDeg),
    String(d.phiDeg),
    f(d.jscMaCm2, 3),
    f(d.jscStderrMaCm2, 3),
    d.iam === null ? "-" : f(d.iam, 4),
    d.iamStderr === null ? "-" : f(d.iamStderr, 4),
    ...index.map((k) => f(d.losses[k]!.currentMaCm2, 3)),
  ]);
  const averaged = s.directions.some((d) => d.phiDeg === "averaged");
  const head =
    `${s.studyName}: optical photocurrent under ${s.spectrum}, ${s.wavelengthMinNm}-${s.wavelengthMaxNm} nm ` +
    `(all currents in mA/cm²; available in this range ${f(s.totalAvailableMaCm2, 3)})\n` +
    `IAM = J(θ)/J(${s.iamReferenceThetaDeg}°) at the same azimuth${averaged ? " (azimuth averaged: one random azimuth per ray)" : ""}; ` +
    `loss columns: current carried away by each channel\n` +
    (s.partial ? "WARNING: partial matrix (incomplete shards): missing points count as zero\n\n" : "\n");
  const key = shown.map((c) => `  ${channelShortLabel(c)}: ${channelLabel(c)} [${c}]`);
  const foot = [
    ...(key.length > 0 ? ["loss columns:", ...key] : []),
    ...(zero.length > 0 ? [`no current in: ${zero.map((c) => `${channelLabel(c)} [${c}]`).join(", ")}`] : []),
  ];
  return head + textTable(header, rows) + (foot.length > 0 ? "\n" + foot.join("\n") + "\n" : "");
}
