import type { Site } from "../site/site.js";
import { pressureRatio } from "./clearSky.js";
import type { MetSeries } from "./stationFile.js";
import { HOUR_MS } from "./weatherYear.js";

/**
 * An invented, smooth air temperature and humidity for the sample station files lightfold writes
 * (not a climate model and not for studies): annual mean 28 − 0.45·|latitude| °C with a seasonal
 * half-range 2 + 0.25·|latitude| °C peaking in mid-July (mid-January south of the equator), a daily
 * half-range of 5 °C peaking at 15:00 local standard time; relative humidity around
 * 95 − 80·(mean monthly clearness) % (drier where skies are clearer), ±15 % daily, lowest at 15:00;
 * station pressure from the elevation (ISA). Precipitable water is left missing (NaN) so readers
 * derive it from temperature and humidity.
 */
export function syntheticMet(site: Site, hourStartUtcMs: Float64Array): MetSeries {
  const n = hourStartUtcMs.length;
  const lat = Math.abs(site.latitudeDeg);
  const tMean = 28 - 0.45 * lat, tSeason = 2 + 0.25 * lat, peakDay = site.latitudeDeg >= 0 ? 196 : 15;
  const kt = site.monthlyClearness ? site.monthlyClearness.reduce((a, b) => a + b, 0) / 12 : 0.45;
  const rhMean = Math.min(90, Math.max(20, 95 - 80 * kt));
  const pHpa = 1013.25 * pressureRatio(site.elevationM);
  const met: MetSeries = { airTempC: new Float64Array(n), relHumidityPct: new Float64Array(n), pressureHpa: new Float64Array(n).fill(pHpa), precipitableWaterCm: new Float64Array(n).fill(NaN) };
  for (let i = 0; i < n; i++) {
    const local = new Date(hourStartUtcMs[i]! + site.utcOffsetHours * HOUR_MS);
    const dayOfYear = Math.floor((local.getTime() - Date.UTC(local.getUTCFullYear(), 0, 1)) / 86_400_000) + 1;
    const hourMid = local.getUTCHours() + 0.5;
    const daily = Math.cos((2 * Math.PI * (hourMid - 15)) / 24);
    met.airTempC[i] = Number((tMean + tSeason * Math.cos((2 * Math.PI * (dayOfYear - peakDay)) / 365) + 5 * daily).toFixed(1));
    met.relHumidityPct[i] = Math.round(rhMean - 15 * daily);
  }
  return met;
}
