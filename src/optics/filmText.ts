import type { FilmPoint } from "./stackEval.js";

/** Which polarisation the film tables show: both and their mean, or one of them. */
export type FilmPolarization = "all" | "s" | "p" | "unpolarized";

const f6 = (v: number): string => v.toFixed(6);

function table(rows: string[][]): string {
  const widths = rows[0]!.map((_, c) => Math.max(...rows.map((r) => r[c]!.length)));
  return rows.map((r) => r.map((cell, c) => (c === r.length - 1 ? cell : cell.padEnd(widths[c]!))).join("  ").trimEnd()).join("\n") + "\n";
}

/** R, T and one film's A of a point in the chosen polarisation (unpolarised = mean of s and p). */
export function pick(p: FilmPoint, pol: Exclude<FilmPolarization, "all">): { R: number; T: number; A: number[] } {
  if (pol === "s") return { R: p.Rs, T: p.Ts, A: p.films.map((f) => f.As) };
  if (pol === "p") return { R: p.Rp, T: p.Tp, A: p.films.map((f) => f.Ap) };
  return { R: p.R, T: p.T, A: p.films.map((f) => f.A) };
}

/** One wavelength and angle: rows R, T and each film's A; columns s, p, unpolarised (or the one asked for). */
export function filmPointText(p: FilmPoint, label: string, exitName: string, pol: FilmPolarization): string {
  const cols: Exclude<FilmPolarization, "all">[] = pol === "all" ? ["s", "p", "unpolarized"] : [pol];
  const values = cols.map((c) => pick(p, c));
  const rows = [["", ...cols.map((c) => (c === "unpolarized" ? "unpolarised" : c))]];
  rows.push(["R", ...values.map((v) => f6(v.R))]);
  rows.push([`T (into ${exitName})`, ...values.map((v) => f6(v.T))]);
  p.films.forEach((film, j) => rows.push([`A film ${j + 1} ${film.material} ${film.thicknessNm} nm`, ...values.map((v) => f6(v.A[j]!))]));
  return `${label}\n${p.wavelengthNm} nm, ${p.angleDeg}° in the incidence medium (n0 = ${p.n0.toFixed(4)})\n\n${table(rows)}`;
}

/** A wavelength × angle sweep: one row per point. */
export function filmSweepText(points: FilmPoint[], label: string, pol: FilmPolarization): string {
  const head = pol === "all" ? ["wavelength_nm", "angle_deg", "Rs", "Rp", "R", "T"] : ["wavelength_nm", "angle_deg", `R_${pol[0]}`, `T_${pol[0]}`];
  points[0]!.films.forEach((film, j) => head.push(`A${j + 1}_${film.material}`));
  const rows = [head];
  for (const p of points) {
    const v = pick(p, pol === "all" ? "unpolarized" : pol);
    const rt = pol === "all" ? [f6(p.Rs), f6(p.Rp), f6(v.R), f6(v.T)] : [f6(v.R), f6(v.T)];
    rows.push([String(p.wavelengthNm), String(p.angleDeg), ...rt, ...v.A.map(f6)]);
  }
  const what = pol === "all" ? "R, T, A: unpolarised fractions of the incident power (mean of s and p)" : pol === "unpolarized" ? "unpolarised fractions of the incident power (mean of s and p)" : `${pol}-polarised fractions of the incident power`;
  return `${label}\n${what}\n\n${table(rows)}`;
}
