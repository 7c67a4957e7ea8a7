import { readCsvRows } from "../util/csvRows.js";
import { InputError } from "../util/errors.js";

/**
 * A reflectance table: rows `wavelength_nm,reflectance` (a header line is allowed), wavelengths
 * strictly increasing, reflectance within [0, 1]. Errors name the file and line.
 */
export function parseReflectanceCsv(text: string, label: string): { wavelengthNm: Float64Array; values: Float64Array } {
  const wl: number[] = [], r: number[] = [];
  for (const row of readCsvRows(text, label)) {
    const [a, b] = row.cells;
    const w = Number(a), v = Number(b);
    if (r.length === 0 && (!Number.isFinite(w) || !Number.isFinite(v))) continue; // header
    if (row.cells.length < 2 || !Number.isFinite(w) || !Number.isFinite(v)) {
      throw new InputError(`${label}:${row.line}: expected two numbers "wavelength_nm,reflectance", got ${JSON.stringify(row.cells.join(","))}`);
    }
    if (v < 0 || v > 1) throw new InputError(`${label}:${row.line}: reflectance ${v} is outside [0, 1]`, "write reflectance as a fraction (0.85, not 85)");
    if (wl.length > 0 && !(w > wl[wl.length - 1]!)) throw new InputError(`${label}:${row.line}: wavelengths must increase (${w} nm after ${wl[wl.length - 1]} nm)`);
    wl.push(w);
    r.push(v);
  }
  if (wl.length < 2) throw new InputError(`${label}: expected at least two rows "wavelength_nm,reflectance"`);
  return { wavelengthNm: Float64Array.from(wl), values: Float64Array.from(r) };
}

/** Linear interpolation of the table at λ; outside its range an InputError naming the range. */
export function reflectanceAt(t: { wavelengthNm: Float64Array; values: Float64Array }, wavelengthNm: number, label: string): number {
  const x = t.wavelengthNm, n = x.length;
  if (wavelengthNm < x[0]! || wavelengthNm > x[n - 1]!) {
    throw new InputError(`${label}: ${wavelengthNm} nm is outside the table's ${x[0]}–${x[n - 1]} nm`);
  }
  let i = 0;
  while (i < n - 2 && x[i + 1]! < wavelengthNm) i++;
  const f = (wavelengthNm - x[i]!) / (x[i + 1]! - x[i]!);
  return t.values[i]! + f * (t.values[i + 1]! - t.values[i]!);
}
