import type { Site } from "../site/site.js";
import type { ClearSkyAtmosphere } from "../spectrum/birdRiordan.js";
import { pressureRatio } from "../weather/clearSky.js";
import { precipitableWaterCm } from "../weather/precipitableWater.js";
import type { MetSeries } from "../weather/stationFile.js";
import type { YearContext } from "./yearContext.js";

/**
 * Defaults where neither the site file nor the weather file says (common practice for a rural
 * continental site; from memory): aerosol optical depth 0.1 at 500 nm, Ångström exponent 1.14 (the
 * clear-sky model's rural default), ozone 0.30 atm-cm (300 Dobson units, near the global mean),
 * precipitable water 1.42 cm (the G173 value).
 */
export const ATMOSPHERE_DEFAULTS = { aod500: 0.1, angstromExponent: 1.14, ozoneAtmCm: 0.3, precipitableWaterCm: 1.42 } as const;

/** Where each hour's precipitable water came from (counts, for the result file). */
export interface WaterSources {
  file: number;
  temperatureHumidity: number;
  siteOrDefault: number;
}

/**
 * The clear-sky atmosphere of hour h, written into `out`: pressure from the weather file when given,
 * else the ISA pressure of the site's elevation; precipitable water from the file, else from its
 * temperature and humidity (Gueymard 1994), else the site's month (or the default); aerosol and
 * ozone from the site's month (or the defaults); ground albedo of the hour.
 */
export function hourAtmosphere(ctx: YearContext, site: Site, met: MetSeries | undefined, h: number, out: ClearSkyAtmosphere, count?: WaterSources): void {
  const m = ctx.month[h]!;
  const p = met?.pressureHpa[h];
  out.pressureHpa = p !== undefined && !Number.isNaN(p) ? p : 1013.25 * pressureRatio(site.elevationM);
  out.aod500 = site.aod500Monthly?.[m] ?? ATMOSPHERE_DEFAULTS.aod500;
  out.angstromExponent = site.angstromExponentMonthly?.[m] ?? ATMOSPHERE_DEFAULTS.angstromExponent;
  out.ozoneAtmCm = site.ozoneAtmCmMonthly?.[m] ?? ATMOSPHERE_DEFAULTS.ozoneAtmCm;
  out.groundAlbedo = ctx.albedo[h]!;
  const pw = met?.precipitableWaterCm[h], t = met?.airTempC[h], rh = met?.relHumidityPct[h];
  if (pw !== undefined && !Number.isNaN(pw)) {
    out.precipitableWaterCm = pw;
    if (count) count.file++;
  } else if (t !== undefined && rh !== undefined && !Number.isNaN(t) && !Number.isNaN(rh)) {
    out.precipitableWaterCm = precipitableWaterCm(t, rh);
    if (count) count.temperatureHumidity++;
  } else {
    out.precipitableWaterCm = site.precipitableWaterCmMonthly?.[m] ?? ATMOSPHERE_DEFAULTS.precipitableWaterCm;
    if (count) count.siteOrDefault++;
  }
}
