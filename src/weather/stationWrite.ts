import { EPW_FIELD, EPW_FIELD_COUNT, EPW_HEADERS } from "./epw.js";
import type { MetSeries, StationMeta } from "./stationFile.js";
import { HOUR_MS, type WeatherYear } from "./weatherYear.js";

/** Local standard time parts of the hour ENDING at an internal hour (stamp = hour start, UTC). */
function hourEndingLocal(hourStartUtcMs: number, utcOffsetHours: number): { y: number; m: number; d: number; h: number } {
  // the hour ending at local hh:00 is stamped hh (1…24) on the day it started
  const start = new Date(hourStartUtcMs + utcOffsetHours * HOUR_MS);
  return { y: start.getUTCFullYear(), m: start.getUTCMonth() + 1, d: start.getUTCDate(), h: start.getUTCHours() + 1 };
}

const or = (v: number, missing: string, digits: number): string => (Number.isNaN(v) ? missing : v.toFixed(digits));

/** Dew point from temperature and relative humidity, Magnus form (Alduchov & Eskridge 1996: b = 17.625, c = 243.04 °C; from memory).
 * Used only to fill the EPW dew-point field of files lightfold writes; the readers do not use it. */
export function dewPointC(airTempC: number, relHumidityPct: number): number {
  const g = Math.log(Math.max(relHumidityPct, 0.1) / 100) + (17.625 * airTempC) / (243.04 + airTempC);
  return (243.04 * g) / (17.625 - g);
}

/**
 * Writes an EPW file (EnergyPlus Auxiliary Programs, EPW data dictionary) for an hourly year: the
 * eight header records, then 35 fields per hour; fields lightfold does not use carry their
 * "missing" codes. `comment` goes into COMMENTS 1.
 */
export function epwText(meta: StationMeta, w: WeatherYear, met: MetSeries, comment: string): string {
  const out: string[] = [
    `LOCATION,${meta.name.replace(/,/g, " ")},-,-,lightfold,000000,${meta.latitudeDeg},${meta.longitudeDeg},${meta.utcOffsetHours.toFixed(1)},${meta.elevationM}`,
    "DESIGN CONDITIONS,0",
    "TYPICAL/EXTREME PERIODS,0",
    "GROUND TEMPERATURES,0",
    "HOLIDAYS/DAYLIGHT SAVINGS,No,0,0,0",
    `COMMENTS 1,${comment.replace(/,/g, ";")}`,
    "COMMENTS 2,radiation in Wh/m2 over the hour ending at the stamp; local standard time",
    "DATA PERIODS,1,1,Data,Sunday, 1/ 1,12/31",
  ];
  if (out.length !== EPW_HEADERS.length) throw new Error("EPW header count");
  // "missing" codes of the data dictionary for the fields not written from data
  const template = ["", "", "", "", "", "?9?9?9?9E0?9?9?9?9?9?9?9?9?9?9?9?9?9?9?9*9*9?9?9?9", "99.9", "99.9", "999", "999999",
    "9999", "9999", "9999", "9999", "9999", "9999", "999999", "999999", "999999", "9999", "999", "999", "99", "99", "9999",
    "99999", "9", "999999999", "999", "0.999", "999", "99", "999", "999", "99"];
  if (template.length !== EPW_FIELD_COUNT) throw new Error("EPW field count");
  for (let i = 0; i < w.hourStartUtcMs.length; i++) {
    const t = hourEndingLocal(w.hourStartUtcMs[i]!, meta.utcOffsetHours);
    const f = template.slice();
    f[EPW_FIELD.year] = String(t.y); f[EPW_FIELD.month] = String(t.m); f[EPW_FIELD.day] = String(t.d);
    f[EPW_FIELD.hour] = String(t.h); f[EPW_FIELD.minute] = "0";
    const T = met.airTempC[i]!, rh = met.relHumidityPct[i]!;
    f[EPW_FIELD.dryBulbC] = or(T, "99.9", 1);
    f[EPW_FIELD.dewPointC] = Number.isNaN(T) || Number.isNaN(rh) ? "99.9" : dewPointC(T, rh).toFixed(1);
    f[EPW_FIELD.relHumidityPct] = or(rh, "999", 0);
    f[EPW_FIELD.pressurePa] = or(met.pressureHpa[i]! * 100, "999999", 0);
    f[EPW_FIELD.ghiWh] = w.ghiWm2[i]!.toFixed(0);
    f[EPW_FIELD.dniWh] = w.dniWm2[i]!.toFixed(0);
    f[EPW_FIELD.dhiWh] = w.dhiWm2[i]!.toFixed(0);
    f[EPW_FIELD.precipitableWaterMm] = or(met.precipitableWaterCm[i]! * 10, "999", 0);
    if (w.albedo) f[EPW_FIELD.albedo] = w.albedo[i]!.toFixed(2);
    out.push(f.join(","));
  }
  return out.join("\n") + "\n";
}

/** TMY3 column header (Users Manual for TMY3 Data Sets, NREL/TP-581-43156, Table 1-2 names). */
export const TMY3_HEADER = [
  "Date (MM/DD/YYYY)", "Time (HH:MM)", "ETR (W/m^2)", "ETRN (W/m^2)", "GHI (W/m^2)", "GHI source", "GHI uncert (%)",
  "DNI (W/m^2)", "DNI source", "DNI uncert (%)", "DHI (W/m^2)", "DHI source", "DHI uncert (%)",
  "Dry-bulb (C)", "Dry-bulb source", "Dry-bulb uncert (code)", "RHum (%)", "RHum source", "RHum uncert (code)",
  "Pressure (mbar)", "Pressure source", "Pressure uncert (code)", "Pwat (cm)", "Pwat source", "Pwat uncert (code)",
  "Alb (unitless)", "Alb source", "Alb uncert (code)",
];

/**
 * Writes a TMY3-style CSV with the columns of TMY3_HEADER (a subset of the full TMY3 column set:
 * the readers find columns by name). ETR/ETRN are left at the missing code −9900; sources "lightfold".
 */
export function tmy3Text(meta: StationMeta, stationId: string, w: WeatherYear, met: MetSeries): string {
  const out = [
    `${stationId},"${meta.name.replace(/"/g, "'")}",--,${meta.utcOffsetHours.toFixed(1)},${meta.latitudeDeg},${meta.longitudeDeg},${meta.elevationM}`,
    TMY3_HEADER.join(","),
  ];
  const pad = (x: number): string => String(x).padStart(2, "0");
  const m = (v: number, digits: number): string => or(v, "-9900", digits);
  for (let i = 0; i < w.hourStartUtcMs.length; i++) {
    const t = hourEndingLocal(w.hourStartUtcMs[i]!, meta.utcOffsetHours);
    const alb = w.albedo ? w.albedo[i]!.toFixed(2) : "-9900";
    out.push([
      `${pad(t.m)}/${pad(t.d)}/${t.y}`, `${pad(t.h)}:00`, "-9900", "-9900",
      w.ghiWm2[i]!.toFixed(0), "lightfold", "0", w.dniWm2[i]!.toFixed(0), "lightfold", "0", w.dhiWm2[i]!.toFixed(0), "lightfold", "0",
      m(met.airTempC[i]!, 1), "lightfold", "0", m(met.relHumidityPct[i]!, 0), "lightfold", "0",
      m(met.pressureHpa[i]!, 0), "lightfold", "0", m(met.precipitableWaterCm[i]!, 1), "lightfold", "0", alb, "lightfold", "0",
    ].join(","));
  }
  return out.join("\n") + "\n";
}
