import { readCsvRows } from "../util/csvRows.js";
import { InputError } from "../util/errors.js";
import {
  ProblemList, checkMeta, checkRowRanges, numberOrNaN, placeOnYear, type HourEndingRow, type StationMeta, type StationWeather,
} from "./stationFile.js";

/**
 * TMY3 CSV (Wilcox & Marion, "Users Manual for TMY3 Data Sets", NREL/TP-581-43156, 2008): line 1 is
 * the station header (USAF id, name, state, time zone, latitude, longitude, elevation), line 2 the
 * column names, then one row per hour: date MM/DD/YYYY, time HH:MM (01:00…24:00) in local standard
 * time; solar fields are the energy received during the 60 minutes preceding the stamp (Wh/m²).
 * Columns are found by their names; the name's part before " (" is matched (so "GHI (W/m^2)" and
 * "GHI" both work). Required: Date, Time, GHI, DNI, DHI.
 */
export const TMY3_COLUMNS = {
  date: "date", time: "time", ghi: "ghi", dni: "dni", dhi: "dhi",
  dryBulbC: "dry-bulb", relHumidityPct: "rhum", pressureMbar: "pressure", precipitableWaterCm: "pwat", albedo: "alb",
} as const;
type ColumnKey = keyof typeof TMY3_COLUMNS;
const REQUIRED: ColumnKey[] = ["date", "time", "ghi", "dni", "dhi"];

/** Missing-data value used in NSRDB/TMY3 files (from memory: −9900); empty cells are missing too. */
export const TMY3_MISSING = -9900;

function parseStationLine(f: string[], src: string): StationMeta {
  if (f.length < 7) {
    throw new InputError(`${src}: line 1: a TMY3 station header has 7 fields (id, name, state, time zone, latitude, longitude, elevation), got ${f.length}`);
  }
  return checkMeta(
    {
      format: "tmy3",
      name: [f[1], f[2]].filter((s) => s !== "" && !/^-+$/.test(s)).join(", ") || `TMY3 station ${f[0]}`,
      utcOffsetHours: numberOrNaN(f[3]),
      latitudeDeg: numberOrNaN(f[4]),
      longitudeDeg: numberOrNaN(f[5]),
      elevationM: numberOrNaN(f[6]),
    },
    src,
    1,
  );
}

function columnIndex(header: string[], src: string): Record<ColumnKey, number> {
  const names = header.map((h) => h.split(" (")[0]!.trim().toLowerCase());
  const idx = {} as Record<ColumnKey, number>;
  for (const key of Object.keys(TMY3_COLUMNS) as ColumnKey[]) idx[key] = names.indexOf(TMY3_COLUMNS[key]);
  const missing = REQUIRED.filter((k) => idx[k] < 0);
  if (missing.length > 0) {
    throw new InputError(`${src}: line 2: TMY3 column header lacks ${missing.map((k) => `"${TMY3_COLUMNS[k]}"`).join(", ")} (expected e.g. "Date (MM/DD/YYYY),Time (HH:MM),…,GHI (W/m^2),…,DNI (W/m^2),…,DHI (W/m^2),…")`);
  }
  return idx;
}

const DATE = /^(\d{1,2})\/(\d{1,2})\/(\d{4})$/;
const TIME = /^(\d{1,2}):(\d{2})$/;

function parseRow(cells: string[], idx: Record<ColumnKey, number>, nCols: number, lineNo: number, p: ProblemList): HourEndingRow | null {
  if (cells.length !== nCols) {
    p.add(lineNo, `expected ${nCols} fields like the header, got ${cells.length}`);
    return null;
  }
  const d = DATE.exec(cells[idx.date]!.trim());
  const tm = TIME.exec(cells[idx.time]!.trim());
  if (!d) { p.add(lineNo, `date "${cells[idx.date]}" is not MM/DD/YYYY`); return null; }
  if (!tm || tm[2] !== "00" || Number(tm[1]) < 1 || Number(tm[1]) > 24) {
    p.add(lineNo, `time "${cells[idx.time]}" is not an hour stamp 01:00…24:00 (hour ending)`);
    return null;
  }
  const [month, day, year] = [Number(d[1]), Number(d[2]), Number(d[3])];
  if (month < 1 || month > 12 || day < 1 || day > new Date(Date.UTC(2000, month, 0)).getUTCDate()) {
    p.add(lineNo, `date "${cells[idx.date]}" is not a calendar date`);
    return null;
  }
  let ok = true;
  const val = (key: ColumnKey, scale = 1): number => {
    if (idx[key] < 0) return NaN;
    const c = cells[idx[key]]!.trim();
    if (c === "") return NaN;
    const v = Number(c);
    if (!Number.isFinite(v)) {
      p.add(lineNo, `${TMY3_COLUMNS[key]} "${c}" is not a number`);
      ok = false;
      return NaN;
    }
    return v === TMY3_MISSING ? NaN : v * scale;
  };
  const row: HourEndingRow = {
    line: lineNo, year, month, day, hourEnding: Number(tm[1]),
    ghi: val("ghi"), dni: val("dni"), dhi: val("dhi"), albedo: val("albedo"),
    airTempC: val("dryBulbC"), relHumidityPct: val("relHumidityPct"), pressureHpa: val("pressureMbar"),
    precipitableWaterCm: val("precipitableWaterCm"),
  };
  if (!ok) return null;
  return checkRowRanges(row, p) ? row : null;
}

/** Parses TMY3 CSV text; `typicalYear` places a typical year (rows from several years) on one calendar year. */
export function parseTmy3(text: string, src: string, typicalYear: number): StationWeather {
  const records = readCsvRows(text, src, ",");
  if (records.length < 3 || records[0]!.line !== 1 || records[1]!.line !== 2) {
    throw new InputError(`${src}: a TMY3 file has a station line, a column header and hourly rows`);
  }
  const meta = parseStationLine(records[0]!.cells, src);
  const header = records[1]!.cells;
  const idx = columnIndex(header, src);
  const p = new ProblemList(src);
  const rows: HourEndingRow[] = [];
  for (let i = 2; i < records.length && !p.full; i++) {
    const row = parseRow(records[i]!.cells, idx, header.length, records[i]!.line, p);
    if (row) rows.push(row);
  }
  p.throwIfAny("TMY3 file");
  return placeOnYear(rows, meta, src, typicalYear);
}
