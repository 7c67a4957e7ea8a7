/**
 * `--spectra g173 | clear-sky-model | <file.csv>` of the yield verb: builds the hourly spectra (reading
 * the user's spectral time series here, at the edge) or none for the fixed G173 shapes.
 */
import type { Site } from "../site/site.js";
import { InputError } from "../util/errors.js";
import { readInputText } from "../util/inputFile.js";
import { parseSpectralSeries } from "../weather/spectralSeries.js";
import type { MetSeries } from "../weather/stationFile.js";
import { clearSkyHourlySpectra } from "../yield/clearSkyHours.js";
import type { HourlySpectra } from "../yield/hourlySpectra.js";
import { userHourlySpectra } from "../yield/userHours.js";
import type { YearContext } from "../yield/yearContext.js";
import type { PreparedMatrix } from "../yield/yieldRun.js";

export const SPECTRA_HELP = "hourly spectra: g173 (fixed AM1.5 shapes), clear-sky-model (Bird & Riordan 1986 at each hour's sun) or a CSV time series of measured spectra (time,<nm>,<nm>,…)";

export function hourlySpectraOption(spec: string, ctx: YearContext, site: Site, met: MetSeries | undefined, pm: PreparedMatrix, gridNm: ArrayLike<number>): { mode: "clear-sky-model" | "file"; spectra: HourlySpectra } | undefined {
  if (spec === "g173") return undefined;
  if (spec === "clear-sky-model") return { mode: "clear-sky-model", spectra: clearSkyHourlySpectra(ctx, site, met, gridNm, pm.tables.weights) };
  if (spec === "") throw new InputError("--spectra: expected g173, clear-sky-model or a file");
  const text = readInputText(spec, "spectral time series", "a CSV with header time,<wavelength nm>,… and one row per measured spectrum; or --spectra g173 | clear-sky-model");
  return { mode: "file", spectra: userHourlySpectra(ctx, parseSpectralSeries(text, spec), gridNm, pm.tables.weights) };
}
