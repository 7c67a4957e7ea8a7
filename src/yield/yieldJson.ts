import type { ResponseMatrix } from "../response/responseMatrix.js";
import type { Site } from "../site/site.js";
import type { SkyModel } from "../sky/transposition.js";
import type { YieldResult } from "./annualYield.js";
import type { Benefit } from "./compare.js";
import type { HourlySpectra } from "./hourlySpectra.js";
import type { YearContext } from "./yearContext.js";

export const YIELD_KIND = "lightfold.yield";
export const COMPARE_KIND = "lightfold.compare";
export const YIELD_FORMAT_VERSION = 1;

const MONTHS = ["Jan", "Feb", "Mar", "Apr", "May", "Jun", "Jul", "Aug", "Sep", "Oct", "Nov", "Dec"];
const r = (x: number, digits: number): number => Number(x.toFixed(digits));

export function matrixInfo(m: ResponseMatrix, file: string, channel: string): Record<string, unknown> {
  return { file, studyName: m.studyName, studyHash: m.studyHash, combo: m.combo, channel, thetaDeg: m.thetaDeg, phiMode: m.phiMode };
}

export function siteInfo(s: Site): Record<string, unknown> {
  return { name: s.name, latitudeDeg: s.latitudeDeg, longitudeDeg: s.longitudeDeg, elevationM: s.elevationM, utcOffsetHours: s.utcOffsetHours };
}

export function weatherInfo(ctx: YearContext): Record<string, unknown> {
  let g = 0, b = 0, d = 0;
  for (let i = 0; i < ctx.nHours; i++) { g += ctx.ghiWm2[i]!; b += ctx.dniWm2[i]!; d += ctx.dhiWm2[i]!; }
  return { source: ctx.weatherSource, hours: ctx.nHours, ghiKWhM2: r(g / 1000, 2), dniKWhM2: r(b / 1000, 2), dhiKWhM2: r(d / 1000, 2), warnings: ctx.warnings };
}

/** One plane's result as plain JSON. */
export function planeResultJson(y: YieldResult): Record<string, unknown> {
  const parts = (p: YieldResult["chargeByPartAhM2"], digits: number): Record<string, number> =>
    Object.fromEntries(Object.entries(p).map(([k, v]) => [k, r(v, digits)]));
  return {
    tiltDeg: y.plane.tiltDeg,
    azimuthDeg: y.plane.azimuthDeg,
    textureRotationDeg: y.plane.textureRotationDeg,
    chargeAhM2: r(y.chargeAhM2, 2),
    chargeStdErrAhM2: r(y.chargeStdErrAhM2, 3),
    poaKWhM2: r(y.poaKWhM2, 3),
    relativeToNormal: r(y.relativeToNormal, 5),
    normalIncidenceAPerW: r(y.normalIncidenceAPerW, 6),
    monthly: y.monthlyChargeAhM2.map((q, i) => ({ month: i + 1, name: MONTHS[i], chargeAhM2: r(q, 2), poaKWhM2: r(y.monthlyPoaKWhM2[i]!, 3) })),
    chargeByPartAhM2: parts(y.chargeByPartAhM2, 2),
    poaByPartKWhM2: parts(y.poaByPartKWhM2, 3),
  };
}

/** The hourly-spectra run beside the fixed-shape one: what the spectra were and the fixed-G173-shape results per plane. */
export interface SpectralRun {
  mode: "clear-sky-model" | "file";
  spectra: HourlySpectra;
  fixed: YieldResult[];
}

/** Spectral correction of one plane: charge with hourly spectra ÷ charge with the fixed G173 shapes − 1, per month and year, %. */
export function spectralCorrection(hourly: YieldResult, fixed: YieldResult): { yearPct: number; monthlyPct: number[] } {
  const pct = (a: number, b: number): number => (b > 0 ? 100 * (a / b - 1) : 0);
  return { yearPct: pct(hourly.chargeAhM2, fixed.chargeAhM2), monthlyPct: hourly.monthlyChargeAhM2.map((q, i) => pct(q, fixed.monthlyChargeAhM2[i]!)) };
}

function spectraJson(run: SpectralRun | undefined): Record<string, unknown> {
  if (!run) return { mode: "g173", source: "fixed ASTM G173 shapes (beam: direct; sky and ground: global − direct·cos 11.19°)" };
  return { mode: run.mode, source: run.spectra.source, hoursWithOwnSpectra: run.spectra.nOwnHours, daylightHoursWithG173Shapes: run.spectra.nFallbackHours, assumptions: run.spectra.notes };
}

/** `<out>/yield/yield-<site>.json` (shape documented in docs/contracts.md). */
export function yieldJson(args: {
  toolVersion: string; matrix: Record<string, unknown>; site: Site; ctx: YearContext; skyModel: SkyModel; results: YieldResult[]; best?: YieldResult; spectral?: SpectralRun;
}): Record<string, unknown> {
  const out: Record<string, unknown> = {
    kind: YIELD_KIND,
    formatVersion: YIELD_FORMAT_VERSION,
    toolVersion: args.toolVersion,
    matrix: args.matrix,
    site: siteInfo(args.site),
    weather: weatherInfo(args.ctx),
    skyModel: args.skyModel,
    units: { charge: "A·h/m²", insolation: "kWh/m²", normalIncidence: "A/W" },
    spectra: spectraJson(args.spectral),
    results: args.results.map((y, i) => {
      const j = planeResultJson(y);
      const fixed = args.spectral?.fixed[i];
      if (fixed) {
        const c = spectralCorrection(y, fixed);
        j.spectralCorrection = { chargeG173ShapesAhM2: r(fixed.chargeAhM2, 2), yearPct: r(c.yearPct, 4), monthlyPct: c.monthlyPct.map((v) => r(v, 4)) };
      }
      return j;
    }),
  };
  if (args.best) out.best = { tiltDeg: args.best.plane.tiltDeg, azimuthDeg: args.best.plane.azimuthDeg, chargeAhM2: r(args.best.chargeAhM2, 2) };
  return out;
}

export interface CompareRow {
  site: string;
  a: YieldResult;
  b: YieldResult;
  benefit: Benefit;
}

/** `<out>/yield/compare.json`. */
export function compareJson(args: {
  toolVersion: string; matrices: Record<string, unknown>[]; skyModel: SkyModel; sites: Record<string, unknown>[]; weather: Record<string, unknown>[]; rows: CompareRow[];
  pairingReason?: string;
}): Record<string, unknown> {
  const paired = args.rows.length > 0 && args.rows.every((row) => row.benefit.errorKind === "paired");
  return {
    kind: COMPARE_KIND,
    formatVersion: YIELD_FORMAT_VERSION,
    toolVersion: args.toolVersion,
    skyModel: args.skyModel,
    matrices: args.matrices,
    sites: args.sites,
    weather: args.weather,
    pairing: paired ? { errorKind: "paired" } : { errorKind: "independent", ...(args.pairingReason !== undefined ? { reason: args.pairingReason } : {}) },
    units: { charge: "A·h/m²", benefit: "%", insolation: "kWh/m²" },
    rows: args.rows.map((row) => ({
      site: row.site,
      tiltDeg: row.a.plane.tiltDeg,
      azimuthDeg: row.a.plane.azimuthDeg,
      poaKWhM2: r(row.a.poaKWhM2, 3),
      chargeAAhM2: r(row.a.chargeAhM2, 2),
      chargeAStdErrAhM2: r(row.a.chargeStdErrAhM2, 3),
      chargeBAhM2: r(row.b.chargeAhM2, 2),
      chargeBStdErrAhM2: r(row.b.chargeStdErrAhM2, 3),
      benefitPct: r(row.benefit.benefitPct, 4),
      benefitStdErrPct: r(row.benefit.benefitStdErrPct, 4),
      benefitErrorKind: row.benefit.errorKind,
      benefitIndependentStdErrPct: r(row.benefit.independentStdErrPct, 4),
    })),
  };
}

const pad = (s: string, n: number): string => s.padStart(n);
const signed = (x: number): string => (x >= 0 ? "+" : "") + x.toFixed(2);

/** Plain-text table of a yield run (one row per plane) and the best plane. */
export function formatYieldTable(siteName: string, skyModel: SkyModel, results: YieldResult[], best?: YieldResult, spectral?: SpectralRun): string {
  const lines = [`site ${siteName}, sky model ${skyModel}, spectra ${spectral ? spectral.spectra.source : "fixed G173 shapes"}`, ""];
  const corr = spectral ? results.map((y, i) => spectralCorrection(y, spectral.fixed[i]!)) : undefined;
  lines.push(`${pad("tilt°", 6)} ${pad("azim°", 6)} ${pad("POA kWh/m²", 11)} ${pad("charge A·h/m²", 14)} ${pad("± (MC)", 8)} ${pad("rel. normal", 11)}` + (corr ? ` ${pad("G173 shapes", 12)} ${pad("spectral %", 10)}` : ""));
  results.forEach((y, i) => {
    lines.push(
      `${pad(y.plane.tiltDeg.toFixed(1), 6)} ${pad(y.plane.azimuthDeg.toFixed(1), 6)} ${pad(y.poaKWhM2.toFixed(1), 11)} ${pad(y.chargeAhM2.toFixed(0), 14)} ${pad(y.chargeStdErrAhM2.toFixed(0), 8)} ${pad(y.relativeToNormal.toFixed(4), 11)}` +
        (corr ? ` ${pad(spectral!.fixed[i]!.chargeAhM2.toFixed(0), 12)} ${pad(signed(corr[i]!.yearPct), 10)}` : ""),
    );
  });
  if (results.length === 1) {
    const y = results[0]!;
    lines.push("", "month   POA kWh/m²   charge A·h/m²" + (corr ? "   spectral %" : ""));
    y.monthlyChargeAhM2.forEach((q, i) => lines.push(`${MONTHS[i]}   ${pad(y.monthlyPoaKWhM2[i]!.toFixed(1), 10)}   ${pad(q.toFixed(0), 13)}` + (corr ? `   ${pad(signed(corr[0]!.monthlyPct[i]!), 10)}` : "")));
  }
  if (spectral) {
    lines.push("", `spectral % = charge with hourly spectra ÷ charge with the fixed G173 shapes − 1 (${spectral.spectra.nOwnHours} hours with their own spectra)`);
    for (const n of spectral.spectra.notes) lines.push(`  · ${n}`);
  }
  if (best && results.length > 1) {
    lines.push("", `best: tilt ${best.plane.tiltDeg}°, azimuth ${best.plane.azimuthDeg}° → ${best.chargeAhM2.toFixed(0)} A·h/m² (POA ${best.poaKWhM2.toFixed(1)} kWh/m²)`);
  }
  lines.push("", "rel. normal = charge / (POA insolation × current per W/m² of AM1.5G light at normal incidence)");
  return lines.join("\n") + "\n";
}

/** pairingReason: why the matrices could not be paired (pairingProblem), printed under an independent ±. */
export function formatCompareTable(labelA: string, labelB: string, rows: CompareRow[], pairingReason?: string): string {
  const lines = [`texture benefit of A = ${labelA} over B = ${labelB} (yearly absorbed charge)`, ""];
  lines.push(`${"site".padEnd(16)} ${pad("tilt°", 6)} ${pad("POA kWh/m²", 11)} ${pad("A A·h/m²", 10)} ${pad("B A·h/m²", 10)} ${pad("benefit %", 10)} ${pad("± %", 7)}`);
  for (const row of rows) {
    lines.push(
      `${row.site.slice(0, 16).padEnd(16)} ${pad(row.a.plane.tiltDeg.toFixed(1), 6)} ${pad(row.a.poaKWhM2.toFixed(1), 11)} ${pad(row.a.chargeAhM2.toFixed(0), 10)} ${pad(row.b.chargeAhM2.toFixed(0), 10)} ${pad(row.benefit.benefitPct.toFixed(3), 10)} ${pad(row.benefit.benefitStdErrPct.toFixed(3), 7)}`,
    );
  }
  const paired = rows.length > 0 && rows.every((row) => row.benefit.errorKind === "paired");
  lines.push(
    "",
    paired
      ? `± = paired Monte Carlo standard error (both matrices traced on the same streams, pairing groups); as if independent: ${rows.map((row) => row.benefit.independentStdErrPct.toFixed(3)).join(", ")}`
      : "± = Monte Carlo standard error from both matrices' stderr (independent, linear propagation)",
  );
  if (!paired && pairingReason !== undefined) lines.push(`    paired errors unavailable: ${pairingReason}`);
  return lines.join("\n") + "\n";
}

/** Hourly CSV: time (local standard time with offset), sun, incidence, POA and current. */
export function hourlyCsv(ctx: YearContext, y: YieldResult, offsetLabel: string): string {
  const h = y.hourly!;
  const out = ["time,zenith_deg,azimuth_deg,incidence_deg,ghi_wm2,dni_wm2,dhi_wm2,poa_wm2,current_am2"];
  const off = ctx.utcOffsetHours * 3_600_000;
  for (let i = 0; i < ctx.nHours; i++) {
    const t = new Date(ctx.hourStartUtcMs[i]! + off).toISOString().slice(0, 19) + offsetLabel;
    const inc = Number.isNaN(h.incidenceDeg[i]!) ? "" : h.incidenceDeg[i]!.toFixed(2);
    out.push(`${t},${ctx.zenithDeg[i]!.toFixed(3)},${ctx.azimuthDeg[i]!.toFixed(3)},${inc},${ctx.ghiWm2[i]!.toFixed(1)},${ctx.dniWm2[i]!.toFixed(1)},${ctx.dhiWm2[i]!.toFixed(1)},${h.poaWm2[i]!.toFixed(2)},${h.currentAm2[i]!.toFixed(3)}`);
  }
  return out.join("\n") + "\n";
}
