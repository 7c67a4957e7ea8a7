import { describe, expect, it } from "vitest";
import { RandomStream, streamKey } from "../../src/random/stream.js";
import type { ResponseMatrix } from "../../src/response/responseMatrix.js";
import { siteFromObject } from "../../src/site/site.js";
import { astmG173 } from "../../src/spectrum/astmG173.js";
import { photocurrentWeights } from "../../src/spectrum/photocurrent.js";
import { totalIrradianceWm2 } from "../../src/spectrum/integrate.js";
import { yieldGrid } from "../../src/yield/angularGrid.js";
import { annualYield, planeSetup } from "../../src/yield/annualYield.js";
import { textureBenefit } from "../../src/yield/compare.js";
import { g173SpectralWeights, spectralTables, type SpectralWeights } from "../../src/yield/spectralTables.js";
import { yearContext, type YearContext } from "../../src/yield/yearContext.js";
import { bestPlane, planeList, prepareMatrix, yieldSweep } from "../../src/yield/yieldRun.js";
import { syntheticWeather } from "../../src/weather/synthetic.js";
import { makeMatrix, range } from "./matrixFixture.js";

const site = siteFromObject(
  {
    name: "Yield Flats", latitudeDeg: 48.7, longitudeDeg: 9.6, elevationM: 400, utcOffsetHours: 1, albedo: 0.25,
    monthlyClearness: [0.34, 0.4, 0.45, 0.49, 0.5, 0.52, 0.53, 0.52, 0.5, 0.43, 0.35, 0.31],
  },
  "yield.site.json",
);
const ctx: YearContext = yearContext(site, syntheticWeather(site, 2027, 7));
const plane = (tiltDeg: number, azimuthDeg = 180, textureRotationDeg = 0) => ({ tiltDeg, azimuthDeg, textureRotationDeg });

/** Weights that turn the tables into "fraction of irradiance": one wavelength bin with weight 1. */
function unitWeights(nLambda: number, bin = 0): SpectralWeights {
  const one = new Float64Array(nLambda);
  one[bin] = 1;
  return { beam: one, diffuse: one, global: one };
}

describe("annualYield(ctx, setup, grid, tables, opts)", () => {
  it("with an ideal absorber (A = 1) gives back the transposition model's closed-form POA insolation, every sky model", () => {
    // In irradiance terms (unit spectral weight): charge [W h/m²] = POA insolation. Tolerance: the
    // hemisphere quadrature error (≤ 3e-4 of the diffuse parts, see hemisphere.test.ts).
    const m = makeMatrix({ thetaDeg: range(0, 90, 5), absorber: () => 1 });
    const grid = yieldGrid(m, "ideal");
    const tables = spectralTables(m, "A_absorber", grid, unitWeights(m.wavelengthNm.length));
    for (const skyModel of ["isotropic", "hay-davies", "perez"] as const) {
      for (const tilt of [0, 35, 90]) {
        const y = annualYield(ctx, planeSetup(plane(tilt), grid), grid, tables, { skyModel });
        expect(Math.abs(y.chargeAhM2 / (y.poaKWhM2 * 1000) - 1)).toBeLessThan(3e-4);
        expect(y.relativeToNormal).toBeCloseTo(1, 3);
      }
    }
  });

  it("weights beam light with the direct spectrum and sky/ground light with the diffuse shape", () => {
    // A = 1 only at one wavelength node: beam charge = beam POA × w_beam(node), sky charge = sky POA × w_diffuse(node)
    const m = makeMatrix({ thetaDeg: range(0, 90, 5), absorber: (_t, _p, l) => (l === 500 ? 1 : 0) });
    const grid = yieldGrid(m, "band");
    const w = g173SpectralWeights(m.wavelengthNm);
    const i = m.wavelengthNm.indexOf(500);
    const y = annualYield(ctx, planeSetup(plane(35), grid), grid, spectralTables(m, "A_absorber", grid, w), { skyModel: "perez" });
    expect(y.chargeByPartAhM2.beam / (y.poaByPartKWhM2.beam * 1000)).toBeCloseTo(w.beam[i]!, 9);
    expect(Math.abs(y.chargeByPartAhM2.sky / (y.poaByPartKWhM2.sky * 1000) / w.diffuse[i]! - 1)).toBeLessThan(3e-4);
    // the weights are photocurrentWeights of G173 (mA/cm² → ×10 A/m²) per W/m² of the whole spectrum
    const d = astmG173("direct");
    const ref = (photocurrentWeights(m.wavelengthNm, d)[i]! * 10) / totalIrradianceWm2(d.wavelengthNm, d.irradianceWm2PerNm);
    expect(w.beam[i]).toBeCloseTo(ref, 14);
    // the sky is bluer than the beam: more current per W/m² at 500 nm from diffuse light
    expect(w.diffuse[i]!).toBeGreaterThan(w.beam[i]!);
  });

  it("is linear in the matrix: Q = Σ_node (G·J_beam + D·J_diffuse) with the returned node weights", () => {
    const m = makeMatrix({ thetaDeg: range(0, 85, 5), phiDeg: [0, 15, 30, 45], phiMode: "square", absorber: (t, p) => 0.9 - 0.3 * (t / 90) ** 3 + 0.01 * Math.cos(4 * p * Math.PI / 180) });
    const pm = prepareMatrix(m, "lin");
    const y = annualYield(ctx, planeSetup(plane(30, 200, 10), pm.grid), pm.grid, pm.tables, { skyModel: "perez" });
    let q = 0;
    for (let n = 0; n < pm.grid.nNodes; n++) q += y.nodeWeights.beam[n]! * pm.tables.beam[n]! + y.nodeWeights.diffuse[n]! * pm.tables.diffuse[n]!;
    expect(q / y.chargeAhM2).toBeCloseTo(1, 10);
  });

  it("reports a Monte Carlo error that matches the spread of yields over matrices redrawn within their stderr", () => {
    // Error-bar honesty (validation-sources.md): empirical sd / reported SE ≈ 1 within 4/√(2M).
    const M = 60;
    const wl = range(300, 1200, 100);
    const base = makeMatrix({ thetaDeg: range(0, 90, 10), wavelengthNm: wl, absorber: (t) => 0.8 * Math.cos(t * Math.PI / 360), stderr: 0.01 });
    const grid = yieldGrid(base, "mc");
    const w = g173SpectralWeights(wl);
    const setup = planeSetup(plane(35), grid);
    const reported = annualYield(ctx, setup, grid, spectralTables(base, "A_absorber", grid, w), { skyModel: "perez" }).chargeStdErrAhM2;
    const rng = new RandomStream(streamKey(9, "mc-yield"));
    const qs: number[] = [];
    for (let k = 0; k < M; k++) {
      const mean = base.mean.slice();
      for (let j = 1; j < mean.length; j += 2) {
        const g = Math.sqrt(-2 * Math.log(rng.next())) * Math.cos(2 * Math.PI * rng.next());
        mean[j] = mean[j]! + 0.01 * g;
      }
      const mk: ResponseMatrix = { ...base, mean };
      qs.push(annualYield(ctx, setup, grid, spectralTables(mk, "A_absorber", grid, w), { skyModel: "perez" }).chargeAhM2);
    }
    const avg = qs.reduce((a, b) => a + b, 0) / M;
    const sd = Math.sqrt(qs.reduce((a, b) => a + (b - avg) ** 2, 0) / (M - 1));
    expect(Math.abs(sd / reported - 1)).toBeLessThan(4 / Math.sqrt(2 * M));
  });

  it("finds the best tilt of a mid-latitude site near 0.6–0.9 × latitude (common practice for yearly insolation)", () => {
    const pm = prepareMatrix(makeMatrix({ thetaDeg: range(0, 85, 5), absorber: (t) => 0.9 * Math.cos(t * Math.PI / 200) }), "tilt");
    const results = yieldSweep(ctx, pm, planeList(range(0, 90, 5), [180], 0), "perez");
    expect(results).toHaveLength(19);
    const best = bestPlane(results).plane.tiltDeg;
    expect(best).toBeGreaterThanOrEqual(0.6 * 48.7);
    expect(best).toBeLessThanOrEqual(0.9 * 48.7);
  });

  it("sums the monthly split to the year and counts more charge in June than in December (northern site)", () => {
    const pm = prepareMatrix(makeMatrix({ thetaDeg: range(0, 85, 5), absorber: () => 0.9 }), "months");
    const y = yieldSweep(ctx, pm, [plane(35)], "perez")[0]!;
    expect(y.monthlyChargeAhM2.reduce((a, b) => a + b, 0)).toBeCloseTo(y.chargeAhM2, 6);
    expect(y.monthlyChargeAhM2[5]!).toBeGreaterThan(y.monthlyChargeAhM2[11]!);
  });
});

describe("textureBenefit(a, b)", () => {
  it("is 0 ± √2·relative error for identical matrices and follows 100(Q_A/Q_B − 1)", () => {
    const m = makeMatrix({ thetaDeg: range(0, 85, 5), absorber: () => 0.8, stderr: 0.002 });
    const better = makeMatrix({ thetaDeg: range(0, 85, 5), absorber: () => 0.88, stderr: 0.002 });
    const [a] = yieldSweep(ctx, prepareMatrix(better, "a"), [plane(35)], "perez");
    const [b] = yieldSweep(ctx, prepareMatrix(m, "b"), [plane(35)], "perez");
    const same = textureBenefit(b!, b!);
    expect(same.benefitPct).toBe(0);
    expect(same.benefitStdErrPct).toBeCloseTo(100 * Math.SQRT2 * (b!.chargeStdErrAhM2 / b!.chargeAhM2), 10);
    expect(textureBenefit(a!, b!).benefitPct).toBeCloseTo(10, 6); // 0.88/0.80 at every angle and wavelength
  });

  it("with the error of Q_A − Q_B (paired) follows the delta method for a ratio of correlated totals", () => {
    // Var(r) ≈ (V_A − 2r·Cov + r²·V_B)/Q_B², Cov = (V_A + V_B − V_Δ)/2 (first-order propagation,
    // any statistics text): with V_Δ = V_A + V_B (no correlation) it is the quadrature figure; with
    // identical totals and V_Δ = 0 (perfectly paired) it is zero.
    const m = makeMatrix({ thetaDeg: range(0, 85, 5), absorber: () => 0.8, stderr: 0.002 });
    const better = makeMatrix({ thetaDeg: range(0, 85, 5), absorber: () => 0.88, stderr: 0.003 });
    const [a] = yieldSweep(ctx, prepareMatrix(better, "a"), [plane(35)], "perez");
    const [b] = yieldSweep(ctx, prepareMatrix(m, "b"), [plane(35)], "perez");
    const uncorrelated = textureBenefit(a!, b!, Math.hypot(a!.chargeStdErrAhM2, b!.chargeStdErrAhM2));
    expect(uncorrelated.errorKind).toBe("paired");
    expect(uncorrelated.benefitStdErrPct).toBeCloseTo(textureBenefit(a!, b!).benefitStdErrPct, 10);
    expect(textureBenefit(b!, b!, 0).benefitStdErrPct).toBe(0);
    expect(textureBenefit(a!, b!).errorKind).toBe("independent");
  });
});
