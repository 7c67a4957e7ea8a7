import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { siteFromJson } from "../../src/site/siteFile.js";
import { extraterrestrialNormalWm2 } from "../../src/sky/irradianceBasics.js";
import { sunTrack } from "../../src/sky/sunPosition.js";
import { DEG } from "../../src/util/math.js";
import { ineichenPerezGhiWm2 } from "../../src/weather/clearSky.js";
import { erbsDiffuseFraction } from "../../src/weather/diffuseFraction.js";
import { DAILY_AR1, KT_HOURLY_MAX, syntheticWeather, tagAr1, tagMeanKt, tagSigma } from "../../src/weather/synthetic.js";
import { kastenYoungAirMass } from "../../src/sky/irradianceBasics.js";
import { pressureRatio } from "../../src/weather/clearSky.js";
import { InputError } from "../../src/util/errors.js";

const SITES = ["nordvik-fjell", "brevenmark", "tessarit-reg"].map((n) =>
  siteFromJson(readFileSync(`configs/sites/${n}.site.json`, "utf8"), `${n}.site.json`),
);

function lag1(x: number[]): number {
  const n = x.length, mean = x.reduce((a, b) => a + b, 0) / n;
  let num = 0, den = 0;
  for (let i = 0; i < n; i++) {
    den += (x[i]! - mean) ** 2;
    if (i > 0) num += (x[i]! - mean) * (x[i - 1]! - mean);
  }
  return num / den;
}

describe("syntheticWeather(site, year, seed)", () => {
  it("is reproducible for a seed and differs for another seed", () => {
    const a = syntheticWeather(SITES[1]!, 2027, 7), b = syntheticWeather(SITES[1]!, 2027, 7), c = syntheticWeather(SITES[1]!, 2027, 8);
    expect(a.ghiWm2).toEqual(b.ghiWm2);
    expect(a.ghiWm2).not.toEqual(c.ghiWm2);
    expect(a.ghiWm2.length).toBe(8760);
    expect(syntheticWeather(SITES[1]!, 2028, 7).ghiWm2.length).toBe(8784); // leap year
  });

  it("stays physically bounded: non-negative, kt ≤ 0.85, DNI ≤ E0n, DHI ≤ GHI, closure GHI = DNI cos z + DHI, dark at night", () => {
    for (const site of SITES) {
      const w = syntheticWeather(site, 2027, 11);
      const track = sunTrack(w.hourStartUtcMs, site.latitudeDeg, site.longitudeDeg);
      for (let i = 0; i < w.ghiWm2.length; i++) {
        const z = track.zenithDeg[i]!, g = w.ghiWm2[i]!, b = w.dniWm2[i]!, d = w.dhiWm2[i]!;
        expect(g >= 0 && b >= 0 && d >= 0).toBe(true);
        if (z >= 90) {
          expect(g + b + d).toBe(0);
          continue;
        }
        const e0n = extraterrestrialNormalWm2(track.dayOfYear[i]!);
        expect(g).toBeLessThanOrEqual(KT_HOURLY_MAX * e0n * Math.cos(z * DEG) + 1e-9);
        expect(b).toBeLessThanOrEqual(e0n);
        expect(d).toBeLessThanOrEqual(g + 1e-9);
        expect(Math.abs(g - (b * Math.cos(z * DEG) + d))).toBeLessThan(1e-6);
      }
    }
  });

  it("has positive lag-1 autocorrelation of daily and hourly clearness (|z| > 4 against none, SE 1/√N)", () => {
    // Bartlett: under no autocorrelation the lag-1 estimate has standard error ≈ 1/√N
    // daily: deviations from each month's mean (no seasonal trend), three independent years pooled
    const daily: number[] = [];
    for (const seed of [5, 6, 7]) {
      const y = syntheticWeather(SITES[1]!, 2027, seed);
      for (let d = 0; d < 365; d++) {
        let s = 0, n = 0;
        for (let e = 0; e < 365; e++) if (y.dailyMonth[e] === y.dailyMonth[d]) { s += y.dailyKt[e]!; n++; }
        daily.push(y.dailyKt[d]! - s / n);
      }
    }
    expect(lag1(daily) * Math.sqrt(daily.length)).toBeGreaterThan(4);
    const w = syntheticWeather(SITES[1]!, 2027, 5);
    // hourly: consecutive daylight hours, kt = GHI / (E0n cos z), deviations from each day's mean
    const track = sunTrack(w.hourStartUtcMs, 48.7, 9.6);
    const dev: number[] = [];
    for (let d = 0; d < 365; d++) {
      const kts: number[] = [];
      for (let h = d * 24; h < d * 24 + 24; h++) {
        const z = track.zenithDeg[h]!;
        if (z < 80) kts.push(w.ghiWm2[h]! / (extraterrestrialNormalWm2(track.dayOfYear[h]!) * Math.cos(z * DEG)));
      }
      const m = kts.reduce((a, b) => a + b, 0) / kts.length;
      for (const k of kts) dev.push(k - m);
      dev.push(0); // day break
    }
    expect(lag1(dev) * Math.sqrt(dev.length)).toBeGreaterThan(4);
  });

  it("matches each month's mean clearness K̄T = ΣH/ΣH0 within 4 standard errors (3 sites × 12 months × 3 seeds)", () => {
    // SE of a month's mean of an AR(1) daily series: σ √((1 + φ)/(1 − φ)) / √n (variance inflation of
    // a first-order autoregression); σ is the spread before clipping, an upper bound of the clipped one.
    const inflation = Math.sqrt((1 + DAILY_AR1) / (1 - DAILY_AR1));
    let worst = 0;
    for (const site of SITES) {
      for (const seed of [1, 2, 3]) {
        const w = syntheticWeather(site, 2027, seed);
        const track = sunTrack(w.hourStartUtcMs, site.latitudeDeg, site.longitudeDeg);
        const off = site.utcOffsetHours * 3_600_000;
        const g = new Array(12).fill(0), h0 = new Array(12).fill(0), days = new Array(12).fill(0);
        for (let i = 0; i < w.ghiWm2.length; i++) {
          const m = new Date(w.hourStartUtcMs[i]! + off).getUTCMonth();
          const z = track.zenithDeg[i]!;
          if (i % 24 === 0) days[m]++;
          if (z >= 90) continue;
          g[m] += w.ghiWm2[i]!;
          h0[m] += extraterrestrialNormalWm2(track.dayOfYear[i]!) * Math.cos(z * DEG);
        }
        for (let m = 0; m < 12; m++) {
          const se = (w.dailySigma[m]! * inflation) / Math.sqrt(days[m]);
          const zScore = (g[m] / h0[m] - site.monthlyClearness![m]!) / se;
          worst = Math.max(worst, Math.abs(zScore));
        }
      }
    }
    expect(worst).toBeLessThan(4);
  });

  it("refuses a site without monthlyClearness and targets clearer than the clear sky", () => {
    const { monthlyClearness: _omit, ...noClear } = SITES[1]!;
    expect(() => syntheticWeather(noClear, 2027, 1)).toThrow(/monthlyClearness/);
    const tooClear = { ...SITES[0]!, monthlyClearness: new Array(12).fill(0.75) };
    expect(() => syntheticWeather(tooClear, 2027, 1)).toThrow(InputError);
  });
});

describe("erbsDiffuseFraction(kt) (Erbs, Klein & Duffie 1982)", () => {
  it("has the published values and is continuous at the break points within the correlation's rounding", () => {
    expect(erbsDiffuseFraction(0.1)).toBeCloseTo(0.991, 12);
    expect(erbsDiffuseFraction(0.9)).toBe(0.165);
    expect(Math.abs(erbsDiffuseFraction(0.2200001) - (1 - 0.09 * 0.22))).toBeLessThan(0.002);
    expect(Math.abs(erbsDiffuseFraction(0.8) - 0.165)).toBeLessThan(0.002);
  });
});

describe("ineichenPerezGhiWm2 (Ineichen & Perez 2002)", () => {
  it("agrees with the Haurwitz (1945) clear sky, GHI = 1098 cos z exp(−0.059/cos z), within 10 % at sea level, TL = 3, z ≤ 60° (common practice)", () => {
    for (const z of [0, 20, 40, 60]) {
      const cz = Math.cos(z * DEG);
      const haurwitz = 1098 * cz * Math.exp(-0.059 / cz);
      const ip = ineichenPerezGhiWm2(z, 1367, 3, 0);
      expect(Math.abs(ip / haurwitz - 1)).toBeLessThan(0.1);
    }
    expect(ineichenPerezGhiWm2(90, 1367, 3, 0)).toBe(0);
    // clearer at altitude and with lower turbidity
    expect(ineichenPerezGhiWm2(30, 1367, 3, 1500)).toBeGreaterThan(ineichenPerezGhiWm2(30, 1367, 3, 0));
    expect(ineichenPerezGhiWm2(30, 1367, 2, 0)).toBeGreaterThan(ineichenPerezGhiWm2(30, 1367, 4, 0));
  });
});

describe("TAG hourly clearness (Aguiar & Collares-Pereira, Solar Energy 49, 167, 1992)", () => {
  // Values worked by hand from the TAG expressions as written in two independent open implementations
  // of the paper that agree term for term (J. Susanto's synthetic-solar, synth_solar.py, 2014; and a
  // MATLAB synthesiser's "aguiar" option): ktm = λ + ε exp(−κ/sin h), φ = 0.38 + 0.06 cos(7.4 Kt − 2.5),
  // σ = A exp(B (1 − sin h)).
  it("mean profile at Kt = 0.5: λ = 0.374396, ε = 0.32, κ = 0.44375 → ktm(sin h = 1) = 0.57972", () => {
    expect(tagMeanKt(0.5, 1)).toBeCloseTo(0.374396 + 0.32 * Math.exp(-0.44375), 5);
    expect(tagMeanKt(0.5, 1)).toBeCloseTo(0.57972, 4);
    // lower sun, lower mean clearness (longer path)
    expect(tagMeanKt(0.5, 0.2)).toBeLessThan(tagMeanKt(0.5, 0.6));
  });
  it("lag-1 coefficient φ(0.5) = 0.38 + 0.06 cos(1.2) = 0.401742", () => {
    expect(tagAr1(0.5)).toBeCloseTo(0.401742, 5);
  });
  it("standard deviation: σ(0.35, sin h = 1) = A = 0.14; σ grows as the sun sinks (B > 0)", () => {
    expect(tagSigma(0.35, 1)).toBeCloseTo(0.14, 12);
    const b = 3 * (0.5 - 0.45) ** 2 + 16 * 0.5 ** 5; // 0.5075
    expect(tagSigma(0.5, 0.5)).toBeCloseTo(0.14 * Math.exp(-20 * 0.15 ** 2) * Math.exp(b * 0.5), 12);
    expect(tagSigma(0.5, 0.2)).toBeGreaterThan(tagSigma(0.5, 0.8));
  });
});

describe("ineichenPerezGhiWm2 air mass", () => {
  it("uses the pressure-corrected air mass: at 1000 m it equals the relative-air-mass reading within 3 % (AM 1.5, TL 3)", () => {
    // Open implementations differ on relative vs pressure-corrected air mass in the p. 156 model; the
    // size of that difference bounds what the choice can change in a synthetic year.
    const z = Math.acos(1 / 1.5) / DEG;
    const h = 1000;
    const relative = (0.868 + 5.09e-5 * h) * 1367 * Math.cos(z * DEG) * Math.exp(-(0.0387 + 3.92e-5 * h) * kastenYoungAirMass(z) * (Math.exp(-h / 8000) + Math.exp(-h / 1250) * 2));
    const ours = ineichenPerezGhiWm2(z, 1367, 3, h);
    expect(pressureRatio(h)).toBeCloseTo(0.887, 3); // ISA at 1000 m: 898.7 hPa / 1013.25 hPa
    expect(ours / relative - 1).toBeGreaterThan(0);
    expect(ours / relative - 1).toBeLessThan(0.03);
  });
});

