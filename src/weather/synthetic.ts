import { RandomStream, streamKey } from "../random/stream.js";
import type { Site } from "../site/site.js";
import { extraterrestrialNormalWm2 } from "../sky/irradianceBasics.js";
import { sunTrack } from "../sky/sunPosition.js";
import { InputError } from "../util/errors.js";
import { DEG } from "../util/math.js";
import { ineichenPerezGhiWm2 } from "./clearSky.js";
import { erbsDiffuseFraction } from "./diffuseFraction.js";
import { HOUR_MS, type WeatherYear } from "./weatherYear.js";

/** Hourly clearness never exceeds this (a physical bound for broadband kt; common practice ≈ 0.85). */
export const KT_HOURLY_MAX = 0.85;
/** Daily clearness bounds: at most this fraction of the day's clear-sky clearness; at least KT_DAILY_MIN. */
const KT_DAILY_CLEAR_FRACTION = 0.95;
const KT_DAILY_MIN = 0.05;
/** Lag-1 autocorrelation of the daily clearness (a first-order autoregression; typical 0.2–0.4, common practice). */
export const DAILY_AR1 = 0.3;
/** Upper bound of the daily standard deviation of Kt (before clipping at the clear-sky bound). */
const DAILY_SIGMA_MAX = 0.15;

export interface SyntheticWeather extends WeatherYear {
  /** Local-standard-time days: realised daily clearness, month (0..11), extraterrestrial sum (Wh/m²). */
  dailyKt: Float64Array;
  dailyMonth: Int8Array;
  dailyH0Whm2: Float64Array;
  /** Per month: target K̄T and the daily standard deviation used. */
  targetKt: number[];
  dailySigma: number[];
}

// TAG, Aguiar & Collares-Pereira, Solar Energy 49(3), 167–174 (1992): kt = ktm(Kt, h) + σ(Kt, h)·y,
// y a unit-variance first-order autoregression with lag-1 coefficient φ(Kt). The coefficients below
// agree with two independent open implementations of the paper (see tests/weather/synthetic.test.ts);
// the paper's body was not available to us to quote page and table.

/** TAG mean hourly clearness for a day of clearness Kt at solar altitude h (sin h given): λ + ε exp(−κ / sin h). */
export function tagMeanKt(dailyKt: number, sinAltitude: number): number {
  const lambda = -0.19 + 1.12 * dailyKt + 0.24 * Math.exp(-8 * dailyKt);
  const eps = 0.32 - 1.6 * (dailyKt - 0.5) ** 2;
  const kappa = 0.19 + 2.27 * dailyKt ** 2 - 2.51 * dailyKt ** 3;
  return lambda + eps * Math.exp(-kappa / Math.max(sinAltitude, 1e-3));
}

/** TAG lag-1 autocorrelation of the normalised hourly clearness: φ = 0.38 + 0.06 cos(7.4 Kt − 2.5). */
export function tagAr1(dailyKt: number): number {
  return 0.38 + 0.06 * Math.cos(7.4 * dailyKt - 2.5);
}

/** TAG standard deviation of the hourly clearness: σ = A exp(B (1 − sin h)), A = 0.14 exp(−20 (Kt − 0.35)²), B = 3 (Kt − 0.45)² + 16 Kt⁵. */
export function tagSigma(dailyKt: number, sinAltitude: number): number {
  const a = 0.14 * Math.exp(-20 * (dailyKt - 0.35) ** 2);
  const b = 3 * (dailyKt - 0.45) ** 2 + 16 * dailyKt ** 5;
  return a * Math.exp(b * (1 - Math.min(1, Math.max(sinAltitude, 0))));
}

function normal(r: RandomStream): number {
  // Box–Muller transform (one deviate per pair of uniforms)
  return Math.sqrt(-2 * Math.log(r.next())) * Math.cos(2 * Math.PI * r.next());
}

/** Standard normal CDF via erf, Abramowitz & Stegun 7.1.26 (|error| < 1.5e-7). */
function normalCdf(x: number): number {
  const z = Math.abs(x) / Math.SQRT2;
  const t = 1 / (1 + 0.3275911 * z);
  const erf = 1 - t * (0.254829592 + t * (-0.284496736 + t * (1.421413741 + t * (-1.453152027 + t * 1.061405429)))) * Math.exp(-z * z);
  return x >= 0 ? 0.5 * (1 + erf) : 0.5 * (1 - erf);
}
function normalPdf(x: number): number {
  return Math.exp(-0.5 * x * x) / Math.sqrt(2 * Math.PI);
}
/** E[clamp(μ + σY, lo, hi)] for Y ~ N(0, 1) (mean of a censored normal). */
export function clampedNormalMean(mu: number, sd: number, lo: number, hi: number): number {
  const a = (lo - mu) / sd, b = (hi - mu) / sd;
  const pa = normalCdf(a), pb = normalCdf(b);
  return lo * pa + hi * (1 - pb) + mu * (pb - pa) + sd * (normalPdf(a) - normalPdf(b));
}
/** Location μ whose clamped normal has mean `target` (bisection; the mean rises with μ). */
function clampedNormalLocation(target: number, sd: number, lo: number, hi: number): number {
  let a = lo - 5 * sd, b = hi + 5 * sd;
  for (let i = 0; i < 80; i++) {
    const mid = 0.5 * (a + b);
    if (clampedNormalMean(mid, sd, lo, hi) < target) a = mid;
    else b = mid;
  }
  return 0.5 * (a + b);
}

/**
 * Scales kt[h] (h in [from, to)) so that Σ kt·w = target, no kt above cap[h] (water filling:
 * hours reaching their cap are fixed, the rest rescaled until consistent).
 */
function fillToTotal(kt: Float64Array, cap: Float64Array, w: Float64Array, from: number, to: number, target: number): void {
  const fixed = new Uint8Array(to - from);
  for (let iter = 0; iter < 40; iter++) {
    let fixedSum = 0, freeSum = 0;
    for (let h = from; h < to; h++) {
      if (fixed[h - from]) fixedSum += cap[h]! * w[h]!;
      else freeSum += kt[h]! * w[h]!;
    }
    if (freeSum <= 0) return;
    const s = Math.max(0, (target - fixedSum) / freeSum);
    let newlyFixed = false;
    for (let h = from; h < to; h++) {
      if (fixed[h - from]) continue;
      kt[h] = kt[h]! * s;
      if (kt[h]! > cap[h]!) {
        kt[h] = cap[h]!;
        fixed[h - from] = 1;
        newlyFixed = true;
      }
    }
    if (!newlyFixed) return;
  }
}

/**
 * One year of synthetic hourly GHI/DNI/DHI for a site, in local standard time (hour stamps = start of
 * the hour, sun at mid-hour). Steps: extraterrestrial irradiance (Spencer eccentricity) → clear-sky
 * bound (Ineichen–Perez) → daily clearness Kt as a first-order autoregression around the month's
 * mean K̄T → hourly kt by TAG (mean profile + AR(1) fluctuation), rescaled so each day's total is
 * Kt·H0 → Erbs diffuse fraction → DHI, DNI. Seeded from `streamKey(seed, "synthetic-weather", year)`.
 */
export function syntheticWeather(site: Site, year: number, seed: number): SyntheticWeather {
  if (!Number.isInteger(year) || year < 1900 || year > 2200) throw new InputError(`--year ${year}: expected a whole year 1900–2200`);
  const target = site.monthlyClearness;
  if (!target) {
    throw new InputError(`site "${site.name}": synthetic weather needs "monthlyClearness" (12 monthly mean clearness indices) in the site file`);
  }
  const leap = (year % 4 === 0 && year % 100 !== 0) || year % 400 === 0;
  const nDays = leap ? 366 : 365;
  const nHours = nDays * 24;
  const offMs = site.utcOffsetHours * HOUR_MS;
  const start = Date.UTC(year, 0, 1) - offMs;
  const times = new Float64Array(nHours);
  for (let i = 0; i < nHours; i++) times[i] = start + i * HOUR_MS;
  const track = sunTrack(times, site.latitudeDeg, site.longitudeDeg);

  // extraterrestrial and clear-sky clearness per hour
  const i0h = new Float64Array(nHours), cap = new Float64Array(nHours), cosz = new Float64Array(nHours), e0n = new Float64Array(nHours);
  const dayMonth = new Int8Array(nDays);
  for (let i = 0; i < nHours; i++) {
    const month = new Date(times[i]! + offMs).getUTCMonth();
    if (i % 24 === 0) dayMonth[i / 24] = month;
    const z = track.zenithDeg[i]!;
    e0n[i] = extraterrestrialNormalWm2(track.dayOfYear[i]!);
    if (z >= 90) continue;
    cosz[i] = Math.cos(z * DEG);
    i0h[i] = e0n[i]! * cosz[i]!;
    const cs = ineichenPerezGhiWm2(z, e0n[i]!, site.linkeTurbidityMonthly[month]!, site.elevationM);
    cap[i] = Math.min(KT_HOURLY_MAX, cs / i0h[i]!);
  }
  const h0 = new Float64Array(nDays), kcs = new Float64Array(nDays);
  for (let d = 0; d < nDays; d++) {
    let s0 = 0, sc = 0;
    for (let h = d * 24; h < d * 24 + 24; h++) {
      s0 += i0h[h]!;
      sc += cap[h]! * i0h[h]!;
    }
    h0[d] = s0;
    kcs[d] = s0 > 0 ? sc / s0 : 0;
  }
  // per month: check the target is reachable under clear skies, choose the daily spread
  const sigma: number[] = [];
  const location: number[] = [];
  for (let m = 0; m < 12; m++) {
    let sum = 0, n = 0;
    for (let d = 0; d < nDays; d++) if (dayMonth[d] === m && h0[d]! > 0) { sum += KT_DAILY_CLEAR_FRACTION * kcs[d]!; n++; }
    const kmax = n > 0 ? sum / n : 0;
    const k = target[m]!;
    if (n > 0 && k > kmax - 0.02) {
      throw new InputError(
        `site "${site.name}": monthlyClearness[${m}] = ${k} is not reachable: clear skies give about ${(kmax / KT_DAILY_CLEAR_FRACTION).toFixed(3)} this month (Ineichen–Perez, Linke turbidity ${site.linkeTurbidityMonthly[m]}); lower it or lower linkeTurbidity`,
      );
    }
    const sd = Math.max(0.005, Math.min(DAILY_SIGMA_MAX, kmax - k, k - KT_DAILY_MIN));
    sigma.push(sd);
    location.push(clampedNormalLocation(k, sd, KT_DAILY_MIN, kmax));
  }

  const rng = new RandomStream(streamKey(seed, "synthetic-weather", year));
  const kt = new Float64Array(nHours);
  const dailyKt = new Float64Array(nDays);
  let yDay = normal(rng);
  let yHour = 0;
  const innov = Math.sqrt(1 - DAILY_AR1 * DAILY_AR1);
  for (let d = 0; d < nDays; d++) {
    // daily clearness: first-order autoregression in standard-normal space around the month's mean
    if (d > 0) yDay = DAILY_AR1 * yDay + innov * normal(rng);
    const m = dayMonth[d]!;
    const ktDay = Math.min(KT_DAILY_CLEAR_FRACTION * kcs[d]!, Math.max(KT_DAILY_MIN, location[m]! + sigma[m]! * yDay));
    const h0d = h0[d]!;
    if (h0d <= 0) continue;
    // hourly: TAG mean profile plus AR(1) fluctuation, bounded by the clear sky
    const phi = tagAr1(ktDay), hInnov = Math.sqrt(1 - phi * phi);
    for (let h = d * 24; h < d * 24 + 24; h++) {
      if (i0h[h]! <= 0) continue;
      yHour = phi * yHour + hInnov * normal(rng);
      kt[h] = Math.min(cap[h]!, Math.max(0.02, tagMeanKt(ktDay, cosz[h]!) + tagSigma(ktDay, cosz[h]!) * yHour));
    }
    fillToTotal(kt, cap, i0h, d * 24, d * 24 + 24, ktDay * h0d);
    let s = 0;
    for (let h = d * 24; h < d * 24 + 24; h++) s += kt[h]! * i0h[h]!;
    dailyKt[d] = s / h0d;
  }

  // split into beam and diffuse (Erbs et al. 1982), bounded
  const ghi = new Float64Array(nHours), dni = new Float64Array(nHours), dhi = new Float64Array(nHours);
  for (let i = 0; i < nHours; i++) {
    if (i0h[i]! <= 0) continue;
    const g = kt[i]! * i0h[i]!;
    let diffuse = erbsDiffuseFraction(kt[i]!) * g;
    let beamNormal = (g - diffuse) / cosz[i]!;
    if (beamNormal > e0n[i]!) {
      beamNormal = e0n[i]!;
      diffuse = g - beamNormal * cosz[i]!;
    }
    ghi[i] = g;
    dni[i] = beamNormal;
    dhi[i] = diffuse;
  }
  return {
    source: `synthetic (site "${site.name}", year ${year}, seed ${seed})`,
    hourStartUtcMs: times,
    ghiWm2: ghi,
    dniWm2: dni,
    dhiWm2: dhi,
    warnings: [],
    dailyKt,
    dailyMonth: dayMonth,
    dailyH0Whm2: h0,
    targetKt: target.slice(),
    dailySigma: sigma,
  };
}
