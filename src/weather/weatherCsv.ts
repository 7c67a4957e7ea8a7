import { readCsvRows } from "../util/csvRows.js";
import { InputError } from "../util/errors.js";
import { HOUR_MS, type WeatherYear } from "./weatherYear.js";

/**
 * lightfold hourly weather CSV:
 *   # comment lines (anywhere before the header, or after it)
 *   time,ghi_wm2,dni_wm2,dhi_wm2[,albedo]
 *   2027-01-01T00:00:00+01:00,0,0,0
 * `time` is ISO-8601 with an explicit offset (or Z) and marks the START of the hour; values are the
 * hour's mean irradiance in W/m² (GHI and DHI on the horizontal, DNI normal to the beam).
 */
export const WEATHER_HEADER = ["time", "ghi_wm2", "dni_wm2", "dhi_wm2"];

const ISO_WITH_OFFSET = /^(\d{4})-(\d{2})-(\d{2})T(\d{2}):(\d{2})(?::(\d{2}))?(?:\.\d+)?(Z|[+-]\d{2}:?\d{2})$/;

/** Parses an ISO-8601 timestamp that carries its offset; NaN when malformed. */
export function parseIsoWithOffset(s: string): number {
  const m = ISO_WITH_OFFSET.exec(s);
  if (!m) return NaN;
  const [y, mo, d, h, mi] = [m[1], m[2], m[3], m[4], m[5]].map(Number) as [number, number, number, number, number];
  const sec = m[6] === undefined ? 0 : Number(m[6]);
  if (mo < 1 || mo > 12 || d < 1 || d > 31 || h > 23 || mi > 59 || sec > 59) return NaN;
  const local = Date.UTC(y, mo - 1, d, h, mi, sec);
  if (new Date(local).getUTCDate() !== d) return NaN;
  let offsetMin = 0;
  if (m[7] !== "Z") {
    const sign = m[7]![0] === "-" ? -1 : 1;
    const digits = m[7]!.slice(1).replace(":", "");
    offsetMin = sign * (Number(digits.slice(0, 2)) * 60 + Number(digits.slice(2)));
  }
  return local - offsetMin * 60_000;
}

const MAX_LISTED = 12;
/** Slack for DHI > GHI (rounding of the file's numbers), W/m². */
const DHI_SLACK_WM2 = 1;

/** Parses and validates weather CSV text; `src` names the file. Errors list line numbers. */
export function parseWeatherCsv(text: string, src: string): WeatherYear {
  const rows = readCsvRows(text, src, ",");
  const errors: string[] = [];
  const fail = (msg: string): void => {
    errors.push(msg);
  };
  /** Rows refused above: the gap check does not count them as missing hours. */
  const badLines: number[] = [];
  const refuse = (lineNo: number, msg: string): void => {
    badLines.push(lineNo);
    fail(`line ${lineNo}: ${msg}`);
  };
  let headerLine = -1;
  let hasAlbedo = false;
  const t: number[] = [], ghi: number[] = [], dni: number[] = [], dhi: number[] = [], alb: number[] = [];
  const lineOf: number[] = [];
  for (let i = 0; i < rows.length && errors.length < MAX_LISTED; i++) {
    const { cells, line: lineNo } = rows[i]!;
    if (headerLine < 0) {
      const expected = WEATHER_HEADER.join(",");
      const got = cells.join(",");
      if (got === expected) hasAlbedo = false;
      else if (got === `${expected},albedo`) hasAlbedo = true;
      else {
        throw new InputError(`${src}: line ${lineNo}: header must be "${expected}" or "${expected},albedo", got "${cells.join(",")}"`);
      }
      headerLine = lineNo;
      continue;
    }
    const nCols = hasAlbedo ? 5 : 4;
    if (cells.length !== nCols) {
      refuse(lineNo, `expected ${nCols} fields, got ${cells.length}`);
      continue;
    }
    const ms = parseIsoWithOffset(cells[0]!);
    if (Number.isNaN(ms)) {
      refuse(lineNo, `time "${cells[0]}" is not ISO-8601 with an offset (e.g. 2027-06-01T12:00:00+01:00)`);
      continue;
    }
    const vals: number[] = [];
    let ok = true;
    for (let c = 1; c < nCols; c++) {
      const cell = cells[c]!;
      const v = cell === "" ? NaN : Number(cell);
      const name = c === 4 ? "albedo" : WEATHER_HEADER[c]!;
      if (!Number.isFinite(v)) {
        fail(`line ${lineNo}: ${name} "${cell}" is not a number`);
        ok = false;
      } else if (v < 0) {
        fail(`line ${lineNo}: ${name} ${v} is negative`);
        ok = false;
      } else if (c === 4 && v > 1) {
        fail(`line ${lineNo}: albedo ${v} is above 1`);
        ok = false;
      }
      vals.push(v);
    }
    if (!ok) {
      badLines.push(lineNo);
      continue;
    }
    if (vals[2]! > vals[0]! + DHI_SLACK_WM2) {
      refuse(lineNo, `dhi_wm2 ${vals[2]} exceeds ghi_wm2 ${vals[0]} (diffuse cannot exceed global)`);
      continue;
    }
    t.push(ms);
    ghi.push(vals[0]!);
    dni.push(vals[1]!);
    dhi.push(vals[2]!);
    if (hasAlbedo) alb.push(vals[3]!);
    lineOf.push(lineNo);
  }
  if (headerLine < 0) throw new InputError(`${src}: no header line "${WEATHER_HEADER.join(",")}" found`);
  // hours must follow each other exactly: no duplicates, no gaps, no disorder
  for (let k = 1; k < t.length && errors.length < MAX_LISTED; k++) {
    const dt = t[k]! - t[k - 1]!;
    if (dt === HOUR_MS) continue;
    // A refused row between the two is already reported; its hour is not "missing" as well.
    const refusedBetween = badLines.filter((l) => l > lineOf[k - 1]! && l < lineOf[k]!).length;
    if (refusedBetween > 0 && dt === (refusedBetween + 1) * HOUR_MS) continue;
    const here = `line ${lineOf[k]} (${new Date(t[k]!).toISOString()})`;
    if (dt === 0) fail(`${here}: duplicated hour (same time as line ${lineOf[k - 1]})`);
    else if (dt < 0) fail(`${here}: time goes backwards after line ${lineOf[k - 1]}`);
    else if (dt % HOUR_MS === 0) fail(`${here}: ${dt / HOUR_MS - 1} missing hour(s) after line ${lineOf[k - 1]}`);
    else fail(`${here}: not a whole number of hours after line ${lineOf[k - 1]} (records must be hourly)`);
  }
  if (errors.length > 0) {
    const more = errors.length >= MAX_LISTED ? " (further problems not listed)" : "";
    throw new InputError(`${src}: ${errors.length} problem(s) in the weather file${more}:\n  ${errors.join("\n  ")}`);
  }
  if (t.length === 0) throw new InputError(`${src}: no data rows after the header`);
  const w: WeatherYear = {
    source: src,
    hourStartUtcMs: Float64Array.from(t),
    ghiWm2: Float64Array.from(ghi),
    dniWm2: Float64Array.from(dni),
    dhiWm2: Float64Array.from(dhi),
    lineNumbers: Int32Array.from(lineOf),
    warnings: [],
  };
  if (hasAlbedo) w.albedo = Float64Array.from(alb);
  return w;
}

/** A yearly yield needs one full year of hours: 8760 or 8784 consecutive records. */
export function requireFullYear(w: WeatherYear): void {
  const n = w.hourStartUtcMs.length;
  if (n !== 8760 && n !== 8784) {
    throw new InputError(`${w.source}: a weather year needs 8760 or 8784 consecutive hourly records, found ${n}`);
  }
}

/** Writes weather CSV text (times with the given fixed offset, values to 0.1 W/m²). */
export function weatherToCsv(w: WeatherYear, utcOffsetHours: number, offsetLabel: string, comments: string[]): string {
  const out: string[] = comments.map((c) => `# ${c}`);
  out.push(WEATHER_HEADER.join(",") + (w.albedo ? ",albedo" : ""));
  const offMs = utcOffsetHours * HOUR_MS;
  for (let i = 0; i < w.hourStartUtcMs.length; i++) {
    const local = new Date(w.hourStartUtcMs[i]! + offMs).toISOString().slice(0, 19);
    let row = `${local}${offsetLabel},${w.ghiWm2[i]!.toFixed(1)},${w.dniWm2[i]!.toFixed(1)},${w.dhiWm2[i]!.toFixed(1)}`;
    if (w.albedo) row += `,${w.albedo[i]!.toFixed(3)}`;
    out.push(row);
  }
  return out.join("\n") + "\n";
}
