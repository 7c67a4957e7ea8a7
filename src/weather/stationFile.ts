import { InputError } from "../util/errors.js";
import { HOUR_MS, type WeatherYear } from "./weatherYear.js";

/** Site metadata read from a weather file's header (EPW LOCATION line, TMY3 first line). */
export interface StationMeta {
  format: "epw" | "tmy3";
  name: string;
  latitudeDeg: number;
  /** East positive. */
  longitudeDeg: number;
  /** Local standard time − UTC, hours. */
  utcOffsetHours: number;
  elevationM: number;
}

/** Hourly meteorology that drives the clear-sky spectral model; NaN where the file marks a value missing. */
export interface MetSeries {
  airTempC: Float64Array;
  relHumidityPct: Float64Array;
  pressureHpa: Float64Array;
  precipitableWaterCm: Float64Array;
}

/** A weather file of a station: the hourly year (stamps = hour START, UTC), its meteorology and header. */
export interface StationWeather {
  meta: StationMeta;
  weather: WeatherYear;
  met: MetSeries;
  /** 1-based file line of each hour, for messages. */
  lineOf: Int32Array;
}

/** One data row before it is placed on the internal year. Irradiance is Wh/m² over the hour ending at the stamp. */
export interface HourEndingRow {
  line: number;
  year: number;
  month: number;
  day: number;
  /** 1..24: the hour ENDING at hh:00 local standard time (hour 1 = 00:00–01:00). */
  hourEnding: number;
  ghi: number;
  dni: number;
  dhi: number;
  albedo: number;
  airTempC: number;
  relHumidityPct: number;
  pressureHpa: number;
  precipitableWaterCm: number;
}

/** Collects per-line problems and throws them together (at most MAX_LISTED listed). */
export class ProblemList {
  static readonly MAX_LISTED = 12;
  readonly items: string[] = [];
  constructor(readonly src: string) {}
  add(line: number, msg: string): void {
    if (this.items.length < ProblemList.MAX_LISTED) this.items.push(`line ${line}: ${msg}`);
    else this.overflow = true;
  }
  overflow = false;
  get full(): boolean {
    return this.overflow;
  }
  throwIfAny(what: string): void {
    if (this.items.length === 0) return;
    const more = this.overflow ? " (further problems not listed)" : "";
    throw new InputError(`${this.src}: ${this.items.length} problem(s) in the ${what}${more}:\n  ${this.items.join("\n  ")}`);
  }
}

/** A numeric field: NaN when empty; throws nothing (callers name the field). */
export function numberOrNaN(cell: string | undefined): number {
  if (cell === undefined) return NaN;
  const t = cell.trim();
  return t === "" ? NaN : Number(t);
}

/**
 * Range rules per meteorological field (EnergyPlus EPW data dictionary limits, Auxiliary Programs
 * guide, "EPW Data Dictionary"): dry bulb −70…70 °C, relative humidity 0…110 %, station pressure
 * 310…1200 hPa; precipitable water 0…15 cm (common practice: the wettest columns hold about 7 cm).
 */
export const FIELD_LIMITS = {
  airTempC: [-70, 70] as const,
  relHumidityPct: [0, 110] as const,
  pressureHpa: [310, 1200] as const,
  precipitableWaterCm: [0, 15] as const,
};

/** Checks the fields of one row; missing values are NaN and pass. Adds problems to `p`. */
export function checkRowRanges(r: HourEndingRow, p: ProblemList): boolean {
  let ok = true;
  const bad = (msg: string): void => {
    p.add(r.line, msg);
    ok = false;
  };
  // irradiance limits against the sun (physically possible, extremely rare, closure, unit mistakes)
  // are the shared plausibility rules (src/weather/plausibility.ts), applied to every weather year
  const range = (name: string, v: number, [lo, hi]: readonly [number, number], unit: string): void => {
    if (!Number.isNaN(v) && (v < lo || v > hi)) bad(`${name} ${v} ${unit} is outside ${lo}…${hi} ${unit}`);
  };
  range("dry-bulb temperature", r.airTempC, FIELD_LIMITS.airTempC, "°C");
  range("relative humidity", r.relHumidityPct, FIELD_LIMITS.relHumidityPct, "%");
  range("station pressure", r.pressureHpa, FIELD_LIMITS.pressureHpa, "hPa");
  range("precipitable water", r.precipitableWaterCm, FIELD_LIMITS.precipitableWaterCm, "cm");
  if (!Number.isNaN(r.albedo) && (r.albedo < 0 || r.albedo > 1)) bad(`albedo ${r.albedo} is outside 0…1`);
  if (!Number.isNaN(r.ghi) && !Number.isNaN(r.dhi) && r.dhi > r.ghi + 1) bad(`DHI ${r.dhi} exceeds GHI ${r.ghi} (diffuse cannot exceed global)`);
  return ok;
}

function isLeap(y: number): boolean {
  return (y % 4 === 0 && y % 100 !== 0) || y % 400 === 0;
}

/**
 * Places hour-ending rows on the internal hourly year. A file whose rows all carry one year keeps it;
 * a typical-year file (months taken from different years) is placed on `typicalYear`. Hour h of a
 * day covers (h − 1):00 to h:00 local standard time, so the internal stamp (hour START, UTC) is
 * local (h − 1):00 − utcOffset; the sun is then taken at mid-hour, the centre of the hour the energy
 * was accumulated over. Hours must follow each other without gaps or repeats.
 */
export function placeOnYear(rows: HourEndingRow[], meta: StationMeta, src: string, typicalYear: number): StationWeather {
  if (rows.length === 0) throw new InputError(`${src}: no hourly data rows`);
  const years = new Set(rows.map((r) => r.year));
  const year = years.size === 1 ? rows[0]!.year : typicalYear;
  const p = new ProblemList(src);
  const n = rows.length;
  const t = new Float64Array(n);
  const offMs = meta.utcOffsetHours * HOUR_MS;
  for (let i = 0; i < n; i++) {
    const r = rows[i]!;
    if (r.month === 2 && r.day === 29 && !isLeap(year)) {
      p.add(r.line, `29 February in a file placed on ${year}, which is not a leap year (choose a leap year with --year)`);
      continue;
    }
    t[i] = Date.UTC(year, r.month - 1, r.day, r.hourEnding - 1) - offMs;
  }
  p.throwIfAny("weather file");
  for (let k = 1; k < n; k++) {
    const dt = t[k]! - t[k - 1]!;
    if (dt === HOUR_MS) continue;
    const here = rows[k]!.line;
    if (dt === 0) p.add(here, `repeats the hour of line ${rows[k - 1]!.line}`);
    else if (dt < 0) p.add(here, `time goes backwards after line ${rows[k - 1]!.line}`);
    else p.add(here, `${Math.round(dt / HOUR_MS) - 1} missing hour(s) after line ${rows[k - 1]!.line}`);
    if (p.full) break;
  }
  p.throwIfAny("weather file's hour sequence");
  return assemble(rows, t, meta, src, year, years.size > 1);
}

function assemble(rows: HourEndingRow[], t: Float64Array, meta: StationMeta, src: string, year: number, typical: boolean): StationWeather {
  const n = rows.length;
  const ghi = new Float64Array(n), dni = new Float64Array(n), dhi = new Float64Array(n), alb = new Float64Array(n);
  const met: MetSeries = {
    airTempC: new Float64Array(n), relHumidityPct: new Float64Array(n), pressureHpa: new Float64Array(n), precipitableWaterCm: new Float64Array(n),
  };
  let missingIrr = 0, firstMissing = 0, albedoComplete = true;
  for (let i = 0; i < n; i++) {
    const r = rows[i]!;
    if (Number.isNaN(r.ghi) || Number.isNaN(r.dni) || Number.isNaN(r.dhi)) {
      if (missingIrr++ === 0) firstMissing = r.line;
    }
    // Wh/m² over one hour = the hour's mean irradiance in W/m²; missing irradiance → 0 (EPW data dictionary rule)
    ghi[i] = Number.isNaN(r.ghi) ? 0 : r.ghi;
    dni[i] = Number.isNaN(r.dni) ? 0 : r.dni;
    dhi[i] = Number.isNaN(r.dhi) ? 0 : r.dhi;
    alb[i] = r.albedo;
    if (Number.isNaN(r.albedo)) albedoComplete = false;
    met.airTempC[i] = r.airTempC;
    met.relHumidityPct[i] = r.relHumidityPct;
    met.pressureHpa[i] = r.pressureHpa;
    met.precipitableWaterCm[i] = r.precipitableWaterCm;
  }
  const warnings: string[] = [];
  if (typical) warnings.push(`typical-year file (rows from several years) placed on ${year}`);
  if (missingIrr > 0) warnings.push(`${missingIrr} hour(s) with missing irradiance set to 0 (first at line ${firstMissing})`);
  const weather: WeatherYear = {
    source: src, hourStartUtcMs: t, ghiWm2: ghi, dniWm2: dni, dhiWm2: dhi, warnings, lineNumbers: Int32Array.from(rows, (r) => r.line),
  };
  if (albedoComplete) weather.albedo = alb;
  return { meta, weather, met, lineOf: Int32Array.from(rows, (r) => r.line) };
}

/** Checks header metadata ranges (EPW LOCATION limits; the same for TMY3). */
export function checkMeta(meta: StationMeta, src: string, line: number): StationMeta {
  const checks: [string, number, number, number][] = [
    ["latitude", meta.latitudeDeg, -90, 90],
    ["longitude", meta.longitudeDeg, -180, 180],
    ["time zone", meta.utcOffsetHours, -12, 14],
    ["elevation", meta.elevationM, -1000, 9999.9],
  ];
  for (const [name, v, lo, hi] of checks) {
    if (!Number.isFinite(v)) throw new InputError(`${src}: line ${line}: ${name} is missing or not a number`);
    if (v < lo || v > hi) throw new InputError(`${src}: line ${line}: ${name} ${v} is outside ${lo}…${hi}`);
  }
  return meta;
}
