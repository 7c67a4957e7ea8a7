import type { Site } from "../site/site.js";
import { extraterrestrialNormalWm2 } from "../sky/irradianceBasics.js";
import { sunTrack } from "../sky/sunPosition.js";
import { requireFullYear } from "../weather/weatherCsv.js";
import { checkAgainstSun } from "../weather/sunChecks.js";
import { HOUR_MS, type WeatherYear } from "../weather/weatherYear.js";

/** Everything about the year that does not depend on the plane: computed once per site and weather. */
export interface YearContext {
  siteName: string;
  weatherSource: string;
  nHours: number;
  hourStartUtcMs: Float64Array;
  utcOffsetHours: number;
  zenithDeg: Float64Array;
  azimuthDeg: Float64Array;
  e0nWm2: Float64Array;
  /** Calendar month 0..11 of the hour start in local standard time. */
  month: Int8Array;
  ghiWm2: Float64Array;
  dniWm2: Float64Array;
  dhiWm2: Float64Array;
  albedo: Float64Array;
  warnings: string[];
}

/** Sun track at mid-hour, night handling and closure checks, per-hour albedo (file column, else the site's month). */
export function yearContext(site: Site, weather: WeatherYear): YearContext {
  requireFullYear(weather);
  const n = weather.hourStartUtcMs.length;
  const track = sunTrack(weather.hourStartUtcMs, site.latitudeDeg, site.longitudeDeg);
  const w: WeatherYear = { ...weather, dniWm2: weather.dniWm2.slice(), warnings: weather.warnings.slice() };
  checkAgainstSun(w, track);
  const offMs = site.utcOffsetHours * HOUR_MS;
  const month = new Int8Array(n), e0n = new Float64Array(n), albedo = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    month[i] = new Date(w.hourStartUtcMs[i]! + offMs).getUTCMonth();
    e0n[i] = extraterrestrialNormalWm2(track.dayOfYear[i]!);
    albedo[i] = w.albedo ? w.albedo[i]! : site.albedoMonthly[month[i]!]!;
  }
  return {
    siteName: site.name,
    weatherSource: w.source,
    nHours: n,
    hourStartUtcMs: w.hourStartUtcMs,
    utcOffsetHours: site.utcOffsetHours,
    zenithDeg: track.zenithDeg,
    azimuthDeg: track.azimuthDeg,
    e0nWm2: e0n,
    month,
    ghiWm2: w.ghiWm2,
    dniWm2: w.dniWm2,
    dhiWm2: w.dhiWm2,
    albedo,
    warnings: w.warnings,
  };
}
