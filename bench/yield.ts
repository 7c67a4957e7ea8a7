/**
 * Yearly-yield speed: one year at one plane and a 19-tilt sweep (0:90:5) for a synthetic year at an
 * example site, with a response matrix of typical size built in code (θ 0–85° step 5, φ 0–45° step
 * 15 with square symmetry, λ 300–1200 nm step 10).
 */
import { readFileSync } from "node:fs";
import { RESPONSE_FORMAT, RESPONSE_FORMAT_VERSION, type ResponseMatrix } from "../src/response/responseMatrix.js";
import { siteFromJson } from "../src/site/siteFile.js";
import { packageRoot } from "../src/util/packageRoot.js";
import { syntheticWeather } from "../src/weather/synthetic.js";
import { annualYield, planeSetup } from "../src/yield/annualYield.js";
import { yearContext } from "../src/yield/yearContext.js";
import { planeList, prepareMatrix, yieldSweep } from "../src/yield/yieldRun.js";
import { clearSkyHourlySpectra } from "../src/yield/clearSkyHours.js";
import { cpuMs, timeMs } from "./timing.js";

function benchMatrix(): ResponseMatrix {
  const thetaDeg = Array.from({ length: 18 }, (_, i) => 5 * i);
  const phiDeg = [0, 15, 30, 45];
  const wavelengthNm = Array.from({ length: 91 }, (_, i) => 300 + 10 * i);
  const n = thetaDeg.length * phiDeg.length * wavelengthNm.length;
  const mean = new Float64Array(2 * n), stderr = new Float64Array(2 * n).fill(0.002);
  let k = 0;
  for (const t of thetaDeg) for (const p of phiDeg) for (const l of wavelengthNm) {
    const a = 0.92 * Math.cos((t * Math.PI) / 200) * (l < 1000 ? 1 : Math.max(0, 1 - (l - 1000) / 200)) * (1 + 0.01 * Math.cos((4 * p * Math.PI) / 180));
    mean[2 * k] = 1 - a;
    mean[2 * k + 1] = a;
    k++;
  }
  return {
    format: RESPONSE_FORMAT, formatVersion: RESPONSE_FORMAT_VERSION, toolVersion: "bench", studyName: "bench", studyHash: "0", seed: 1, combo: {},
    thetaDeg, phiDeg, phiMode: "square", wavelengthNm, channels: ["R_first", "A_absorber"], mean, stderr,
    nRays: new Float64Array(n).fill(1e4), pathRatio: new Float64Array(n).fill(1),
  };
}

export async function runYieldBench(): Promise<void> {
  const path = `${packageRoot()}/configs/sites/brevenmark.site.json`;
  const site = siteFromJson(readFileSync(path, "utf8"), path);
  let weather = syntheticWeather(site, 2027, 7);
  const tWeather = timeMs(() => { weather = syntheticWeather(site, 2027, 7); }, 5);
  let ctx = yearContext(site, weather);
  const tCtx = timeMs(() => { ctx = yearContext(site, weather); }, 5);
  const m = benchMatrix();
  let pm = prepareMatrix(m, "bench");
  const tTables = timeMs(() => { pm = prepareMatrix(m, "bench"); }, 5);
  const plane = { tiltDeg: 35, azimuthDeg: 180, textureRotationDeg: 0 };
  const tPlane = timeMs(() => planeSetup(plane, pm.grid), 5);
  const setup = planeSetup(plane, pm.grid);
  const tYear = timeMs(() => annualYield(ctx, setup, pm.grid, pm.tables, { skyModel: "perez" }), 9);
  const planes = planeList(Array.from({ length: 19 }, (_, i) => 5 * i), [180], 0);
  const tSweep = timeMs(() => yieldSweep(ctx, pm, planes, "perez"), 3);
  // hourly spectra: Bird & Riordan clear-sky spectra for every daylight hour, then the hour loop with them
  let spectra = clearSkyHourlySpectra(ctx, site, undefined, m.wavelengthNm, pm.tables.weights);
  const tSpectra = timeMs(() => { spectra = clearSkyHourlySpectra(ctx, site, undefined, m.wavelengthNm, pm.tables.weights); }, 5);
  const tYearSpectra = timeMs(() => annualYield(ctx, setup, pm.grid, pm.tables, { skyModel: "perez", spectra }), 9);
  const cSpectra = cpuMs(() => clearSkyHourlySpectra(ctx, site, undefined, m.wavelengthNm, pm.tables.weights), 5);
  const cYearSpectra = cpuMs(() => annualYield(ctx, setup, pm.grid, pm.tables, { skyModel: "perez", spectra }), 9);
  const lines = [
    `matrix ${m.thetaDeg.length}θ × ${m.phiDeg.length}φ × ${m.wavelengthNm.length}λ, synthetic year 8760 h, Perez sky (median of repeats)`,
    `synthetic weather year          ${tWeather.toFixed(1)} ms`,
    `sun track + year context        ${tCtx.toFixed(1)} ms   (once per site and weather)`,
    `matrix spectral tables          ${tTables.toFixed(1)} ms   (once per matrix)`,
    `plane quadrature (per tilt)     ${tPlane.toFixed(1)} ms`,
    `hour loop, one year, one plane  ${tYear.toFixed(1)} ms`,
    `19-tilt sweep (0:90:5)          ${tSweep.toFixed(1)} ms   (quadrature + year per tilt)`,
    `one full year from scratch      ${(tCtx + tTables + tPlane + tYear).toFixed(1)} ms   (context + tables + quadrature + hours)`,
    `clear-sky hourly spectra        ${tSpectra.toFixed(1)} ms wall, ${cSpectra.toFixed(1)} ms CPU   (${spectra.nOwnHours} daylight hours, Bird & Riordan on 122 λ → ${m.wavelengthNm.length}λ; once per site, weather and matrix grid)`,
    `hour loop with hourly spectra   ${tYearSpectra.toFixed(1)} ms wall, ${cYearSpectra.toFixed(1)} ms CPU   (one plane)`,
    `one year with hourly spectra    ${(tCtx + tTables + tPlane + tSpectra + tYearSpectra).toFixed(1)} ms   (context + tables + quadrature + spectra + hours)`,
  ];
  process.stdout.write(lines.join("\n") + "\n");
}
