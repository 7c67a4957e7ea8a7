/**
 * `--spectra g173 | clear-sky-model | <file.csv>` of the yield verb: builds the hourly spectra (reading
 * the user's spectral time series here, at the edge) or none for the fixed G173 shapes.
 */
import type { Site } from "../site/site.js";
import { InputError } from "../util/errors.js";
import { readInputText } from "../util/inputFile.js";
import { birdRiordanTable } from "../spectrum/birdRiordan.js";
import { albedoShapeOn, parseSpectralAlbedo } from "../spectrum/spectralAlbedo.js";
import { parseSpectralSeries } from "../weather/spectralSeries.js";
import type { MetSeries } from "../weather/stationFile.js";
import { clearSkyHourlySpectra } from "../yield/clearSkyHours.js";
import type { HourlySpectra } from "../yield/hourlySpectra.js";
import { userHourlySpectra } from "../yield/userHours.js";
import type { YearContext } from "../yield/yearContext.js";
import type { PreparedMatrix } from "../yield/yieldRun.js";

export const SPECTRA_HELP = "hourly spectra: g173 (fixed AM1.5 shapes), clear-sky-model (Bird & Riordan 1986 at each hour's sun) or a CSV time series of measured spectra (time,<nm>,<nm>,…)";

export function hourlySpectraOption(spec: string, ctx: YearContext, site: Site, met: MetSeries | undefined, pm: PreparedMatrix, gridNm: ArrayLike<number>, albedoFile?: string): { mode: "clear-sky-model" | "file"; spectra: HourlySpectra } | undefined {
  const albedo = albedoFile === undefined ? undefined : parseSpectralAlbedo(readInputText(albedoFile, "spectral albedo", "a CSV with header wavelength_nm,reflectance"), albedoFile);
  if (spec === "g173") {
    if (albedo) throw new InputError("--albedo-spectrum needs hourly spectra", "add --spectra clear-sky-model or --spectra <measured.csv>");
    return undefined;
  }
  if (spec === "clear-sky-model") {
    const shape = albedo ? albedoShapeOn(albedo, birdRiordanTable().wavelengthNm) : undefined;
    return { mode: "clear-sky-model", spectra: clearSkyHourlySpectra(ctx, site, met, gridNm, pm.tables.weights, shape) };
  }
  if (spec === "") throw new InputError("--spectra: expected g173, clear-sky-model or a file");
  const text = readInputText(spec, "spectral time series", "a CSV with header time,<wavelength nm>,… and one row per measured spectrum; or --spectra g173 | clear-sky-model");
  const series = parseSpectralSeries(text, spec);
  return { mode: "file", spectra: userHourlySpectra(ctx, series, gridNm, pm.tables.weights, albedo ? albedoShapeOn(albedo, series.wavelengthNm) : undefined) };
}
