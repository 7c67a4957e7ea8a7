import { astmG173 } from "../spectrum/astmG173.js";
import { binProjector, projectPerWm2 } from "../spectrum/binProjector.js";
import { bandIntegral, trapezoid } from "../spectrum/integrate.js";
import { InputError } from "../util/errors.js";
import type { SpectralSeries } from "../weather/spectralSeries.js";
import { HOUR_MS } from "../weather/weatherYear.js";
import { fixedShapeSpectra, type HourlySpectra } from "./hourlySpectra.js";
import type { SpectralWeights } from "./spectralTables.js";
import type { YearContext } from "./yearContext.js";

/**
 * Hourly spectra from measured spectra. Each measurement belongs to the weather hour it falls in
 * (start ≤ t < start + 1 h); several in one hour are averaged. The hour's measured shape is used for
 * its beam, sky and ground light alike (a global spectrum carries no split). A measured range [a, b]
 * narrower than the whole spectrum covers a share of the broadband irradiance; that share is taken
 * from the AM1.5G spectrum (G173 global over [a, b] ÷ its total), so the weights stay per W/m² of
 * broadband light. Ground-reflected light is the measured shape times `albedoShape` (on the
 * series' wavelengths) when given. Hours without a measurement keep the G173 shapes.
 */
export function userHourlySpectra(ctx: YearContext, series: SpectralSeries, gridNm: ArrayLike<number>, fallback: SpectralWeights, albedoShape?: Float64Array): HourlySpectra {
  const wl = series.wavelengthNm, nW = wl.length;
  const a = wl[0]!, b = wl[nW - 1]!;
  if (gridNm[0]! < a || gridNm[gridNm.length - 1]! > b) {
    throw new InputError(`${series.source}: the measured spectra cover ${a}–${b} nm but the matrix's wavelengths span ${gridNm[0]}–${gridNm[gridNm.length - 1]} nm`, "measure over the matrix's whole range, or trace a matrix within the measured range");
  }
  const g = astmG173("global");
  const share = Math.min(1, bandIntegral(g.wavelengthNm, g.irradianceWm2PerNm, a, b) / trapezoid(g.wavelengthNm, g.irradianceWm2PerNm));
  const s = fixedShapeSpectra(ctx.nHours, fallback, `measured spectra ${series.source}`);
  const sum = new Float64Array(ctx.nHours * nW), count = new Int32Array(ctx.nHours);
  const t0 = ctx.hourStartUtcMs[0]!;
  let outside = 0;
  for (let r = 0; r < series.timeUtcMs.length; r++) {
    const h = Math.floor((series.timeUtcMs[r]! - t0) / HOUR_MS);
    if (h < 0 || h >= ctx.nHours) { outside++; continue; }
    count[h]++;
    for (let j = 0; j < nW; j++) sum[h * nW + j] += series.irradianceWm2PerNm[r * nW + j]!;
  }
  if (outside === series.timeUtcMs.length) {
    throw new InputError(`${series.source}: none of its ${outside} spectra falls within the weather year (${new Date(t0).toISOString()} and the following ${ctx.nHours} hours)`);
  }
  const p = binProjector(gridNm, wl);
  const nL = s.nLambda, mean = new Float64Array(nW);
  let daylightWithout = 0;
  for (let h = 0; h < ctx.nHours; h++) {
    const light = ctx.ghiWm2[h]! > 0 || ctx.dniWm2[h]! > 0;
    if (count[h] === 0) { if (light) daylightWithout++; continue; }
    for (let j = 0; j < nW; j++) mean[j] = sum[h * nW + j]! / count[h]!;
    if (!(trapezoid(wl, mean) > 0)) continue;
    projectPerWm2(p, mean, share, s.beam, h * nL);
    s.sky.set(s.beam.subarray(h * nL, (h + 1) * nL), h * nL);
    if (albedoShape) {
      for (let j = 0; j < nW; j++) mean[j] *= albedoShape[j]!;
      projectPerWm2(p, mean, share, s.ground, h * nL);
    } else s.ground.set(s.beam.subarray(h * nL, (h + 1) * nL), h * nL);
    s.nOwnHours++;
  }
  s.nFallbackHours = daylightWithout;
  s.notes.push(
    `measured global spectra (${a}–${b} nm; AM1.5G puts ${(100 * share).toFixed(1)} % of the broadband irradiance in that range) give each measured hour's shape for beam, sky and ground light${albedoShape ? " (ground: times the given spectral albedo)" : ""}`,
    `${daylightWithout} daylight hour(s) without a measurement keep the G173 shapes` + (outside > 0 ? `; ${outside} measurement(s) outside the weather year ignored` : ""),
  );
  return s;
}
