import { InputError } from "../util/errors.js";
import {
  ProblemList, checkMeta, checkRowRanges, numberOrNaN, placeOnYear, type HourEndingRow, type StationMeta, type StationWeather,
} from "./stationFile.js";

/**
 * EPW (EnergyPlus weather format), as described in the EnergyPlus "Auxiliary Programs" guide, section
 * "EnergyPlus Weather File (EPW) Data Dictionary": eight header records, in this order, then one
 * record per hour of 35 comma-separated fields. Times are local standard time; hour h (1–24) is the
 * interval (h − 1):00 to h:00; radiation fields are Wh/m² received during the minutes preceding the
 * stamp, so at one record per hour they equal the hour's mean irradiance in W/m².
 */
export const EPW_HEADERS = [
  "LOCATION", "DESIGN CONDITIONS", "TYPICAL/EXTREME PERIODS", "GROUND TEMPERATURES",
  "HOLIDAYS/DAYLIGHT SAVINGS", "COMMENTS 1", "COMMENTS 2", "DATA PERIODS",
] as const;

export const EPW_FIELD_COUNT = 35;

/** 0-based field positions in a data record (data dictionary N1…N34 after the flags field A1). */
export const EPW_FIELD = {
  year: 0, month: 1, day: 2, hour: 3, minute: 4, flags: 5, dryBulbC: 6, dewPointC: 7, relHumidityPct: 8,
  pressurePa: 9, ghiWh: 13, dniWh: 14, dhiWh: 15, precipitableWaterMm: 28, albedo: 32,
} as const;

/** "missing" thresholds of the data dictionary: a value at or above is missing. */
const MISSING_AT_OR_ABOVE = {
  dryBulbC: 99.9, relHumidityPct: 999, pressurePa: 999999, irradianceWh: 9999, precipitableWaterMm: 999, albedo: 999,
};

function headerName(line: string): string {
  return line.split(",")[0]!.trim().toUpperCase();
}

/** LOCATION,city,state,country,source,WMO,latitude,longitude,timezone,elevation */
function parseLocation(line: string, src: string): StationMeta {
  const f = line.split(",");
  if (f.length < 10) throw new InputError(`${src}: line 1: LOCATION needs 10 fields (city, state, country, source, WMO, latitude, longitude, time zone, elevation), got ${f.length}`);
  const name = [f[1], f[2], f[3]].map((s) => s!.trim()).filter((s) => s !== "" && s !== "-").join(", ") || "EPW station";
  return checkMeta(
    {
      format: "epw",
      name,
      latitudeDeg: numberOrNaN(f[6]),
      longitudeDeg: numberOrNaN(f[7]),
      utcOffsetHours: numberOrNaN(f[8]),
      elevationM: numberOrNaN(f[9]),
    },
    src,
    1,
  );
}

/** DATA PERIODS,count,records per hour,…: only one record per hour is read. */
function checkDataPeriods(line: string, src: string, lineNo: number): void {
  const f = line.split(",");
  const perHour = numberOrNaN(f[2]);
  if (perHour !== 1) {
    throw new InputError(`${src}: line ${lineNo}: DATA PERIODS gives ${f[2]?.trim() ?? "no"} records per hour; lightfold reads hourly EPW files (1 record per hour)`);
  }
}

const missingAbove = (v: number, limit: number): number => (v >= limit ? NaN : v);

function parseRow(cells: string[], lineNo: number, p: ProblemList): HourEndingRow | null {
  if (cells.length !== EPW_FIELD_COUNT) {
    p.add(lineNo, `expected ${EPW_FIELD_COUNT} comma-separated fields, got ${cells.length}`);
    return null;
  }
  const num = (i: number): number => numberOrNaN(cells[i]);
  const [year, month, day, hour] = [num(EPW_FIELD.year), num(EPW_FIELD.month), num(EPW_FIELD.day), num(EPW_FIELD.hour)];
  const daysIn = new Date(Date.UTC(2000, month, 0)).getUTCDate(); // month lengths of a leap year
  if (!Number.isInteger(year) || !Number.isInteger(month) || month < 1 || month > 12 || !Number.isInteger(day) || day < 1 || day > daysIn) {
    p.add(lineNo, `date fields year,month,day = ${cells.slice(0, 3).join(",")} are not a calendar date`);
    return null;
  }
  if (!Number.isInteger(hour) || hour < 1 || hour > 24) {
    p.add(lineNo, `hour ${cells[EPW_FIELD.hour]} is not 1…24 (hour 1 = 00:00–01:00)`);
    return null;
  }
  const numeric = [EPW_FIELD.dryBulbC, EPW_FIELD.relHumidityPct, EPW_FIELD.pressurePa, EPW_FIELD.ghiWh, EPW_FIELD.dniWh, EPW_FIELD.dhiWh, EPW_FIELD.precipitableWaterMm, EPW_FIELD.albedo];
  for (const i of numeric) {
    const c = cells[i]!.trim();
    if (c !== "" && !Number.isFinite(Number(c))) {
      p.add(lineNo, `field ${i + 1} "${c}" is not a number`);
      return null;
    }
  }
  const pressurePa = missingAbove(num(EPW_FIELD.pressurePa), MISSING_AT_OR_ABOVE.pressurePa);
  const pwMm = missingAbove(num(EPW_FIELD.precipitableWaterMm), MISSING_AT_OR_ABOVE.precipitableWaterMm);
  const row: HourEndingRow = {
    line: lineNo, year, month, day, hourEnding: hour,
    ghi: missingAbove(num(EPW_FIELD.ghiWh), MISSING_AT_OR_ABOVE.irradianceWh),
    dni: missingAbove(num(EPW_FIELD.dniWh), MISSING_AT_OR_ABOVE.irradianceWh),
    dhi: missingAbove(num(EPW_FIELD.dhiWh), MISSING_AT_OR_ABOVE.irradianceWh),
    albedo: missingAbove(num(EPW_FIELD.albedo), MISSING_AT_OR_ABOVE.albedo),
    airTempC: missingAbove(num(EPW_FIELD.dryBulbC), MISSING_AT_OR_ABOVE.dryBulbC),
    relHumidityPct: missingAbove(num(EPW_FIELD.relHumidityPct), MISSING_AT_OR_ABOVE.relHumidityPct),
    pressureHpa: pressurePa / 100,
    precipitableWaterCm: pwMm / 10,
  };
  return checkRowRanges(row, p) ? row : null;
}

/**
 * Parses EPW text. `typicalYear` places a typical-year file (rows from several years) on one
 * calendar year. Errors name the file and line.
 */
export function parseEpw(text: string, src: string, typicalYear: number): StationWeather {
  const lines = text.split(/\r?\n/);
  if (lines.length < EPW_HEADERS.length + 1) throw new InputError(`${src}: an EPW file has ${EPW_HEADERS.length} header lines and then hourly records; found ${lines.length} line(s)`);
  EPW_HEADERS.forEach((name, i) => {
    const got = headerName(lines[i]!);
    if (got !== name) throw new InputError(`${src}: line ${i + 1}: expected the EPW header record "${name}", got "${lines[i]!.slice(0, 40)}"`);
  });
  const meta = parseLocation(lines[0]!, src);
  checkDataPeriods(lines[7]!, src, 8);
  const p = new ProblemList(src);
  const rows: HourEndingRow[] = [];
  for (let i = EPW_HEADERS.length; i < lines.length && !p.full; i++) {
    const raw = lines[i]!.trim();
    if (raw === "") continue;
    const row = parseRow(raw.split(","), i + 1, p);
    if (row) rows.push(row);
  }
  p.throwIfAny("EPW file");
  return placeOnYear(rows, meta, src, typicalYear);
}
