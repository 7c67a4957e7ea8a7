import type { Site } from "../site/site.js";
import { SOLAR_CONSTANT_WM2 } from "../sky/irradianceBasics.js";
import { binProjector, projectPerWm2 } from "../spectrum/binProjector.js";
import { birdRiordanInto, birdRiordanTable, type ClearSkyAtmosphere } from "../spectrum/birdRiordan.js";
import { trapezoid } from "../spectrum/integrate.js";
import { InputError } from "../util/errors.js";
import { DEG } from "../util/math.js";
import type { MetSeries } from "../weather/stationFile.js";
import { hourAtmosphere, type WaterSources } from "./hourAtmosphere.js";
import { fixedShapeSpectra, type HourlySpectra } from "./hourlySpectra.js";
import type { SpectralWeights } from "./spectralTables.js";
import type { YearContext } from "./yearContext.js";

/** Above this zenith the hour keeps the G173 shapes (the clear-sky model is not meant for grazing sun). */
export const CLEAR_SKY_MAX_ZENITH_DEG = 89;

/**
 * Hourly spectra from the Bird & Riordan clear-sky model (src/spectrum/birdRiordan.ts). Each daylight
 * hour: direct and diffuse spectra at that hour's sun and atmosphere (hourAtmosphere), their shapes
 * scaled to the hour's DNI and DHI by the transposition; cloudy hours keep the clear-sky shapes
 * (no cloud modification of the diffuse shape — stated in the result); ground-reflected light has
 * the hour's global horizontal spectrum DNI·cos z·b̂(λ) + DHI·d̂(λ) times the spectral albedo shape
 * `albedoShape` (on the model's grid; constant when omitted).
 */
export function clearSkyHourlySpectra(ctx: YearContext, site: Site, met: MetSeries | undefined, gridNm: ArrayLike<number>, fallback: SpectralWeights, albedoShape?: Float64Array): HourlySpectra {
  const t = birdRiordanTable();
  const lo = t.wavelengthNm[0]!, hi = t.wavelengthNm[t.wavelengthNm.length - 1]!;
  if (gridNm[0]! < lo || gridNm[gridNm.length - 1]! > hi) {
    throw new InputError(`--spectra clear-sky-model: the matrix's wavelengths ${gridNm[0]}–${gridNm[gridNm.length - 1]} nm reach outside the model's ${lo}–${hi} nm`, "use --spectra g173 for this matrix, or a matrix from 300 nm up");
  }
  const p = binProjector(gridNm, t.wavelengthNm);
  const s = fixedShapeSpectra(ctx.nHours, fallback, "clear-sky model (Bird & Riordan 1986)");
  const nF = t.wavelengthNm.length, nL = s.nLambda;
  const dir = new Float64Array(nF), dif = new Float64Array(nF), gnd = new Float64Array(nF);
  const atm: ClearSkyAtmosphere = { pressureHpa: 0, precipitableWaterCm: 0, ozoneAtmCm: 0, aod500: 0, angstromExponent: 0, groundAlbedo: 0 };
  const water: WaterSources = { file: 0, temperatureHumidity: 0, siteOrDefault: 0 };
  for (let h = 0; h < ctx.nHours; h++) {
    const z = ctx.zenithDeg[h]!;
    const dni = ctx.dniWm2[h]!, dhi = ctx.dhiWm2[h]!;
    if (dni <= 0 && dhi <= 0 && ctx.ghiWm2[h]! <= 0) continue;
    if (z >= CLEAR_SKY_MAX_ZENITH_DEG) { s.nFallbackHours++; continue; }
    hourAtmosphere(ctx, site, met, h, atm, water);
    birdRiordanInto(t, z, ctx.e0nWm2[h]! / SOLAR_CONSTANT_WM2, atm, dir, dif);
    const eDir = trapezoid(t.wavelengthNm, dir), eDif = trapezoid(t.wavelengthNm, dif);
    if (!(eDir > 0 && eDif > 0)) { s.nFallbackHours++; continue; }
    projectPerWm2(p, dir, 1, s.beam, h * nL);
    projectPerWm2(p, dif, 1, s.sky, h * nL);
    // ground: the hour's global horizontal spectrum (clear-sky global where the hour has no GHI)
    const cz = Math.cos(z * DEG);
    const wb = dni + dhi > 0 ? (dni * cz) / eDir : cz / eDir, wd = dni + dhi > 0 ? dhi / eDif : 1 / eDif;
    for (let i = 0; i < nF; i++) gnd[i] = (wb * dir[i]! + wd * dif[i]!) * (albedoShape ? albedoShape[i]! : 1);
    projectPerWm2(p, gnd, 1, s.ground, h * nL);
    s.nOwnHours++;
  }
  s.notes.push(
    "direct and diffuse shapes from the Bird & Riordan (1986) clear-sky model at each hour's sun, scaled to the hour's DNI and DHI",
    "cloudy hours keep the clear-sky shapes (no cloud modification of the diffuse spectrum)",
    `ground-reflected light: the hour's global horizontal spectrum × ${albedoShape ? "the given spectral albedo shape" : "a constant spectral albedo"}`,
    `precipitable water: ${water.file} h from the weather file, ${water.temperatureHumidity} h from its temperature and humidity (Gueymard 1994), ${water.siteOrDefault} h from the site file or the 1.42 cm default`,
    `aerosol optical depth at 500 nm ${site.aod500Monthly ? "from the site file" : "0.1 (default)"}, Ångström exponent ${site.angstromExponentMonthly ? "from the site file" : "1.14 (default)"}, ozone ${site.ozoneAtmCmMonthly ? "from the site file" : "0.30 atm-cm (default)"}; pressure from the weather file, else the site's elevation (ISA)`,
  );
  if (s.nFallbackHours > 0) s.notes.push(`${s.nFallbackHours} daylight hour(s) with the sun above ${CLEAR_SKY_MAX_ZENITH_DEG}° zenith keep the G173 shapes`);
  return s;
}
