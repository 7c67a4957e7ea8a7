import { readCsvRows } from "../util/csvRows.js";
import { InputError } from "../util/errors.js";
import { parseIsoWithOffset } from "./weatherCsv.js";

/**
 * A time series of measured spectra (lightfold format): '#' comments, a header
 * `time,<λ1>,<λ2>,…` whose wavelength columns are in nm and strictly increasing, then one row per
 * measurement: ISO-8601 time with its UTC offset (the instant of the measurement) and the spectral
 * irradiance in W m⁻² nm⁻¹ (≥ 0) at each wavelength. Only the spectral shape is used.
 */
export interface SpectralSeries {
  source: string;
  wavelengthNm: Float64Array;
  timeUtcMs: Float64Array;
  /** Row-major: [row·nλ + j]. */
  irradianceWm2PerNm: Float64Array;
  lineOf: Int32Array;
}

const MAX_LISTED = 12;

export function parseSpectralSeries(text: string, src: string): SpectralSeries {
  const rows = readCsvRows(text, src, ",");
  if (rows.length < 2) throw new InputError(`${src}: a spectral time series needs a header "time,<wavelength nm>,…" and at least one row`);
  const head = rows[0]!;
  if (head.cells[0]!.trim().toLowerCase() !== "time") throw new InputError(`${src}: line ${head.line}: the first column must be "time", got "${head.cells[0]}"`);
  const nW = head.cells.length - 1;
  if (nW < 2) throw new InputError(`${src}: line ${head.line}: needs at least two wavelength columns after "time"`);
  const wl = new Float64Array(nW);
  for (let j = 0; j < nW; j++) {
    const v = Number(head.cells[j + 1]);
    if (!Number.isFinite(v) || v <= 0) throw new InputError(`${src}: line ${head.line}: column ${j + 2} "${head.cells[j + 1]}" is not a wavelength in nm`);
    if (j > 0 && !(v > wl[j - 1]!)) throw new InputError(`${src}: line ${head.line}: wavelengths must increase strictly (column ${j + 2}: ${v} nm after ${wl[j - 1]} nm)`);
    wl[j] = v;
  }
  const errors: string[] = [];
  const t: number[] = [], lines: number[] = [];
  const values = new Float64Array((rows.length - 1) * nW);
  for (let r = 1; r < rows.length && errors.length < MAX_LISTED; r++) {
    const { cells, line } = rows[r]!;
    if (cells.length !== nW + 1) { errors.push(`line ${line}: expected ${nW + 1} fields like the header, got ${cells.length}`); continue; }
    const ms = parseIsoWithOffset(cells[0]!.trim());
    if (Number.isNaN(ms)) { errors.push(`line ${line}: time "${cells[0]}" is not ISO-8601 with an offset`); continue; }
    const k = t.length;
    let ok = true;
    for (let j = 0; j < nW; j++) {
      const v = Number(cells[j + 1]);
      if (cells[j + 1]!.trim() === "" || !Number.isFinite(v) || v < 0) {
        errors.push(`line ${line}: irradiance "${cells[j + 1]}" at ${wl[j]} nm is not a number ≥ 0 (W m⁻² nm⁻¹)`);
        ok = false;
        break;
      }
      values[k * nW + j] = v;
    }
    if (!ok) continue;
    t.push(ms);
    lines.push(line);
  }
  if (errors.length > 0) throw new InputError(`${src}: ${errors.length} problem(s) in the spectral time series:\n  ${errors.join("\n  ")}`);
  return { source: src, wavelengthNm: wl, timeUtcMs: Float64Array.from(t), irradianceWm2PerNm: values.slice(0, t.length * nW), lineOf: Int32Array.from(lines) };
}
