import { DEG } from "../util/math.js";
import type { WeatherYear } from "./weatherYear.js";

/**
 * Plausibility rules for hourly irradiance records, after the BSRN quality-control tests of
 * C. N. Long and Y. Shi, "An Automated Quality Assessment and Control Algorithm for Surface
 * Radiation Measurements", The Open Atmospheric Science Journal 2, 23–37 (2008), also issued as
 * the BSRN Global Network recommended QC tests V2.0 (Long & Dutton). Limits are
 *   upper = scale · Sa · μ0^exponent + offset,  μ0 = max(0, cos z),  Sa = E0n of the day (W/m²):
 * physically possible (PPL): GHI 1.5, 1.2, 100; DHI 0.95, 1.2, 50; DNI 1.0, 0, 0 (lower −4 W/m²);
 * extremely rare (ERL):      GHI 1.2, 1.2, 50;  DHI 0.75, 1.2, 30; DNI 0.95, 0.2, 10 (lower −2 W/m²).
 * Comparisons, where GHI or the component sum exceeds 50 W/m²: GHI / (DNI cos z + DHI) within
 * 1 ± 0.08 for z < 75° and 1 ± 0.15 for 75° ≤ z < 93°; DHI / GHI below 1.05 and 1.10 likewise.
 * Here a value beyond the physically possible limit is an error; beyond the extremely rare limit, or
 * failing a comparison, a warning with counts (hourly means taken with the sun at mid-hour do not
 * follow the one-minute comparisons exactly near sunrise and sunset).
 */
export interface LimitCoefficients {
  scale: number;
  exponent: number;
  offsetWm2: number;
  lowerWm2: number;
}

export type Component = "ghi" | "dni" | "dhi";

export const PHYSICALLY_POSSIBLE: Record<Component, LimitCoefficients> = {
  ghi: { scale: 1.5, exponent: 1.2, offsetWm2: 100, lowerWm2: -4 },
  dhi: { scale: 0.95, exponent: 1.2, offsetWm2: 50, lowerWm2: -4 },
  dni: { scale: 1.0, exponent: 0, offsetWm2: 0, lowerWm2: -4 },
};

export const EXTREMELY_RARE: Record<Component, LimitCoefficients> = {
  ghi: { scale: 1.2, exponent: 1.2, offsetWm2: 50, lowerWm2: -2 },
  dhi: { scale: 0.75, exponent: 1.2, offsetWm2: 30, lowerWm2: -2 },
  dni: { scale: 0.95, exponent: 0.2, offsetWm2: 10, lowerWm2: -2 },
};

/** Comparison tests apply where the compared quantity exceeds this (W/m²). */
export const COMPARISON_MIN_WM2 = 50;

/** Upper limit of a component for the sun at zenith z (deg) and extraterrestrial normal irradiance e0n. */
export function upperLimitWm2(c: LimitCoefficients, zenithDeg: number, e0nWm2: number): number {
  const mu0 = Math.max(0, Math.cos(zenithDeg * DEG));
  // 0^0 is 1: the DNI limit does not depend on the sun's height.
  return c.scale * e0nWm2 * Math.pow(mu0, c.exponent) + c.offsetWm2;
}

/** Closure band of GHI / (DNI cos z + DHI) and the highest DHI / GHI at a zenith; undefined above 93°. */
export function comparisonBounds(zenithDeg: number): { closure: [number, number]; maxDiffuseRatio: number } | undefined {
  if (zenithDeg < 75) return { closure: [0.92, 1.08], maxDiffuseRatio: 1.05 };
  if (zenithDeg < 93) return { closure: [0.85, 1.15], maxDiffuseRatio: 1.1 };
  return undefined;
}

/** A unit mistake recognised from the data's clearness. */
export interface UnitMistake {
  /** What the numbers look like. */
  unit: string;
  /** The factor the file's values carry relative to W/m². */
  factor: number;
  /** How to convert. */
  fix: string;
}

/**
 * Unit mistakes told apart by the clearness index kt = GHI / (E0n cos z) of the clearest daytime
 * hours (z < 80°): hourly kt of real skies peaks near 0.75–0.85 and stays below about 1.1 even with
 * cloud enhancement (common practice), so the 99th percentile kt99 of a year in W/m² lies in about
 * [0.3, 1.2]. A file whose kt99, divided by a unit factor, falls in that band (and does not already)
 * is named after that unit.
 */
export const UNIT_MISTAKES: readonly UnitMistake[] = [
  { unit: "kJ/m² per hour (hourly sums: W/m² × 3.6)", factor: 3.6, fix: "divide by 3.6 for W/m²" },
  { unit: "kW/m² (W/m² ÷ 1000)", factor: 1e-3, fix: "multiply by 1000 for W/m²" },
  { unit: "MJ/m² per hour (W/m² × 0.0036)", factor: 3.6e-3, fix: "divide by 0.0036 for W/m²" },
];
const KT99_BAND: [number, number] = [0.3, 1.2];
/** Fewest clear-enough daytime hours for the unit test to speak. */
const MIN_DAY_HOURS = 24;
const MAX_LISTED = 12;

export interface PlausibilityResult {
  /** Impossible values, listed with their line (first MAX_LISTED), then a count of the rest. */
  errors: string[];
  errorCount: number;
  /** Rare values and failed comparisons, one line per rule with its count and first line. */
  warnings: string[];
  unitMistake?: UnitMistake;
  /** 99th percentile of the daytime clearness index (NaN when too few daytime hours). */
  kt99: number;
}

/** Where record i came from: "line N (time)" when the reader kept line numbers, else the time. */
export function recordLabel(w: WeatherYear, i: number): string {
  const when = new Date(w.hourStartUtcMs[i]!).toISOString().slice(0, 16) + "Z";
  const line = w.lineNumbers?.[i];
  return line !== undefined ? `line ${line} (${when})` : `record ${i + 1} (${when})`;
}

/** The 99th percentile of kt over hours with z < 80° and GHI > 0. */
export function clearnessKt99(ghi: ArrayLike<number>, zenithDeg: ArrayLike<number>, e0nWm2: ArrayLike<number>): number {
  const kt: number[] = [];
  for (let i = 0; i < ghi.length; i++) {
    const z = zenithDeg[i]!;
    if (z < 80 && ghi[i]! > 0) kt.push(ghi[i]! / (e0nWm2[i]! * Math.cos(z * DEG)));
  }
  if (kt.length < MIN_DAY_HOURS) return NaN;
  kt.sort((a, b) => a - b);
  return kt[Math.min(kt.length - 1, Math.floor(0.99 * kt.length))]!;
}

/** The unit a year's numbers look like, when it is not W/m². */
export function recogniseUnitMistake(kt99: number): UnitMistake | undefined {
  const inBand = (v: number): boolean => v >= KT99_BAND[0] && v <= KT99_BAND[1];
  if (!Number.isFinite(kt99) || inBand(kt99)) return undefined;
  const fits = UNIT_MISTAKES.filter((u) => inBand(kt99 / u.factor));
  // Where two fit, the one that brings kt99 nearest a typical clear-sky 0.8.
  fits.sort((a, b) => Math.abs(Math.log(kt99 / a.factor / 0.8)) - Math.abs(Math.log(kt99 / b.factor / 0.8)));
  return fits[0];
}

const NAMES: Record<Component, string> = { ghi: "ghi_wm2", dni: "dni_wm2", dhi: "dhi_wm2" };

/** Counts of one warning rule: how many records, and the first. */
class Tally {
  count = 0;
  first = -1;
  add(i: number): void {
    if (this.count++ === 0) this.first = i;
  }
}

/**
 * Applies the rules to a weather year with its sun (zenith at the instant each record represents,
 * E0n of its day). Pure: nothing is changed; the caller decides what to refuse.
 */
export function checkPlausibility(w: WeatherYear, zenithDeg: ArrayLike<number>, e0nWm2: ArrayLike<number>): PlausibilityResult {
  const errors: string[] = [];
  let errorCount = 0;
  const rare = { ghi: new Tally(), dni: new Tally(), dhi: new Tally() };
  const closure = new Tally(), diffuse = new Tally();
  const values: Record<Component, ArrayLike<number>> = { ghi: w.ghiWm2, dni: w.dniWm2, dhi: w.dhiWm2 };
  for (let i = 0; i < w.ghiWm2.length; i++) {
    const z = zenithDeg[i]!, e0n = e0nWm2[i]!;
    for (const c of ["ghi", "dni", "dhi"] as const) {
      const v = values[c][i]!;
      const ppl = PHYSICALLY_POSSIBLE[c], erl = EXTREMELY_RARE[c];
      const hi = upperLimitWm2(ppl, z, e0n);
      if (!Number.isFinite(v) || v < ppl.lowerWm2 || v > hi) {
        if (errorCount++ < MAX_LISTED) {
          errors.push(`${recordLabel(w, i)}: ${NAMES[c]} ${v} is outside the physically possible range [${ppl.lowerWm2}, ${hi.toFixed(0)}] W/m² for the sun at z = ${z.toFixed(1)}° (${ppl.scale}·E0n·cos^${ppl.exponent} z + ${ppl.offsetWm2})`);
        }
      } else if (v < erl.lowerWm2 || v > upperLimitWm2(erl, z, e0n)) rare[c].add(i);
    }
    const b = comparisonBounds(z);
    if (b === undefined) continue;
    const ghi = w.ghiWm2[i]!, dhi = w.dhiWm2[i]!;
    const sum = w.dniWm2[i]! * Math.cos(z * DEG) + dhi;
    if (sum > COMPARISON_MIN_WM2 && (ghi / sum < b.closure[0] || ghi / sum > b.closure[1])) closure.add(i);
    if (ghi > COMPARISON_MIN_WM2 && dhi / ghi > b.maxDiffuseRatio) diffuse.add(i);
  }
  const warnings: string[] = [];
  const say = (t: Tally, what: string): void => {
    if (t.count > 0) warnings.push(`${t.count} hour(s) ${what} (first: ${recordLabel(w, t.first)})`);
  };
  for (const c of ["ghi", "dni", "dhi"] as const) {
    const e = EXTREMELY_RARE[c];
    say(rare[c], `with ${NAMES[c]} beyond the extremely rare limit (${e.scale}·E0n·cos^${e.exponent} z + ${e.offsetWm2} W/m²)`);
  }
  say(closure, "fail closure GHI ≈ DNI·cos z + DHI (ratio outside 1 ± 0.08 for z < 75°, 1 ± 0.15 up to 93°); the components are used as given");
  say(diffuse, "with DHI / GHI above 1.05 (z < 75°) or 1.10 (up to 93°)");
  const kt99 = clearnessKt99(w.ghiWm2, zenithDeg, e0nWm2);
  const unitMistake = recogniseUnitMistake(kt99);
  return { errors, errorCount, warnings, kt99, ...(unitMistake !== undefined ? { unitMistake } : {}) };
}
