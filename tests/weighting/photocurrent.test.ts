import { describe, expect, it } from "vitest";
import { matrixIndex } from "../../src/response/responseMatrix.js";
import { RandomStream } from "../../src/random/stream.js";
import { photocurrentSummary } from "../../src/weighting/photocurrent.js";
import { iamCsv } from "../../src/weighting/iamCsv.js";
import { ratioIndependent } from "../../src/weighting/weightedSum.js";
import { emptyMatrix, fresnelR } from "./fixtures.js";

const CH = ["R", "A_film:front:0:SiNx", "A_absorber", "A_rear", "T", "unresolved"];

/** Synthetic photocurrent weights (mA/cm² per unit absorptance) on a grid. */
function someWeights(n: number): Float64Array {
  return Float64Array.from({ length: n }, (_, i) => 0.3 + 0.7 * Math.sin(1 + i) ** 2);
}

describe("photocurrentSummary(m, w)", () => {
  it("the loss breakdown plus the absorber current sums to the total available current", () => {
    const m = emptyMatrix([0, 20, 40, 60, 80], [0, 45], [400, 500, 600, 700, 800, 900, 1000, 1100], CH);
    const rng = new RandomStream("test/loss-sum");
    const nPts = m.nRays.length;
    for (let p = 0; p < nPts; p++) {
      const raw = CH.map(() => rng.next());
      const s = raw.reduce((a, b) => a + b, 0);
      raw.forEach((v, c) => {
        m.mean[p * CH.length + c] = v / s;
        m.stderr[p * CH.length + c] = 0.01 * rng.next();
      });
    }
    const w = someWeights(m.wavelengthNm.length);
    const total = w.reduce((a, b) => a + b, 0);
    const s = photocurrentSummary(m, w, { spectrumName: "synthetic" });
    expect(s.totalAvailableMaCm2).toBeCloseTo(total, 14);
    expect(s.lossChannels).toEqual(["R", "A_film:front:0:SiNx", "A_rear", "T", "unresolved"]);
    expect(s.directions.length).toBe(10);
    for (const d of s.directions) {
      const sum = d.jscMaCm2 + d.losses.reduce((a, l) => a + l.currentMaCm2, 0);
      // Channels sum to 1 per point, so the currents sum to Σw up to rounding (a few ulps × terms).
      expect(Math.abs(sum - total)).toBeLessThan(1e-12 * total);
    }
  });

  it("reports SE = sqrt(Σ w_i² SE_i²) (weighted sums over independent estimates)", () => {
    const m = emptyMatrix([0], [0], [500, 600, 700], CH);
    const ia = CH.indexOf("A_absorber");
    const se = [0.01, 0.02, 0.005];
    se.forEach((v, il) => {
      m.mean[matrixIndex(m, 0, 0, il, ia)] = 0.8;
      m.stderr[matrixIndex(m, 0, 0, il, ia)] = v;
    });
    const w = [2, 3, 4];
    const s = photocurrentSummary(m, w, { spectrumName: "synthetic" });
    // Worked by hand: J = 0.8·9 = 7.2; SE = sqrt(4·1e-4 + 9·4e-4 + 16·2.5e-5) = sqrt(4.4e-3).
    expect(s.directions[0].jscMaCm2).toBeCloseTo(7.2, 14);
    expect(s.directions[0].jscStderrMaCm2).toBeCloseTo(Math.sqrt(4.4e-3), 14);
  });

  it("the reported SE matches the spread of J over independent simulated replicas", () => {
    // Error-bar honesty (validation-sources.md, Monte Carlo statistics): sd over M replicas divided
    // by the mean reported SE is 1 within 4/sqrt(2M). Each wavelength: N binomial rays, SE = sqrt(p̂(1-p̂)/N).
    const wavelengths = Array.from({ length: 12 }, (_, i) => 400 + 50 * i);
    const pTrue = wavelengths.map((_, i) => 0.2 + 0.06 * i);
    const w = someWeights(wavelengths.length);
    const nRays = 200;
    const M = 400;
    const js: number[] = [];
    const ses: number[] = [];
    for (let r = 0; r < M; r++) {
      const m = emptyMatrix([0], [0], wavelengths, ["A_absorber", "R"]);
      wavelengths.forEach((_, il) => {
        const rng = new RandomStream(`test/honesty/${r}/${il}`);
        let k = 0;
        for (let i = 0; i < nRays; i++) if (rng.next() < pTrue[il]) k++;
        const p = k / nRays;
        m.mean[matrixIndex(m, 0, 0, il, 0)] = p;
        m.stderr[matrixIndex(m, 0, 0, il, 0)] = Math.sqrt((p * (1 - p)) / nRays);
        m.mean[matrixIndex(m, 0, 0, il, 1)] = 1 - p;
      });
      const d = photocurrentSummary(m, w, { spectrumName: "synthetic" }).directions[0];
      js.push(d.jscMaCm2);
      ses.push(d.jscStderrMaCm2);
    }
    const meanJ = js.reduce((a, b) => a + b, 0) / M;
    const sd = Math.sqrt(js.reduce((a, b) => a + (b - meanJ) ** 2, 0) / (M - 1));
    const meanSe = ses.reduce((a, b) => a + b, 0) / M;
    expect(Math.abs(sd / meanSe - 1)).toBeLessThan(4 / Math.sqrt(2 * M));
    // And the replica mean agrees with the exact Σ w p within 4 standard errors of that mean.
    const exact = w.reduce((a, wi, i) => a + wi * pTrue[i], 0);
    expect(Math.abs(meanJ - exact) / (sd / Math.sqrt(M))).toBeLessThan(4);
  });

  it("IAM(0) = 1 with zero error; other angles carry relative errors added in quadrature", () => {
    const m = emptyMatrix([0, 50], [0], [600, 800], CH);
    const ia = CH.indexOf("A_absorber");
    const set = (it: number, il: number, v: number, e: number) => {
      m.mean[matrixIndex(m, it, 0, il, ia)] = v;
      m.stderr[matrixIndex(m, it, 0, il, ia)] = e;
    };
    set(0, 0, 0.9, 0.01);
    set(0, 1, 0.8, 0.02);
    set(1, 0, 0.7, 0.03);
    set(1, 1, 0.6, 0.01);
    const w = [1, 2];
    const s = photocurrentSummary(m, w, { spectrumName: "synthetic" });
    const [d0, d1] = s.directions;
    expect(d0.iam).toBe(1);
    expect(d0.iamStderr).toBe(0);
    const j0 = 0.9 + 1.6;
    const s0 = Math.sqrt(0.01 ** 2 + 0.04 ** 2);
    const j1 = 0.7 + 1.2;
    const s1 = Math.sqrt(0.03 ** 2 + 0.02 ** 2);
    expect(d1.iam).toBeCloseTo(j1 / j0, 14);
    // Independent points (own random streams per angle): (σ_q/q)² = (σ_a/a)² + (σ_b/b)² (Taylor §3.8).
    expect(d1.iamStderr).toBeCloseTo((j1 / j0) * Math.sqrt((s1 / j1) ** 2 + (s0 / j0) ** 2), 14);
  });

  it("planar bare Si (thick, opaque): IAM(θ) follows the Fresnel transmission ratio (1-R(θ))/(1-R(0))", () => {
    // Opaque planar absorber: everything not reflected at the front is absorbed, A = 1 - R_Fresnel.
    // Constant n = 3.5 (close to Si in the near infrared, common practice), so the ratio is the same
    // at every wavelength and the spectral weighting must reproduce it exactly.
    const n = 3.5;
    const thetas = [0, 10, 20, 30, 40, 50, 60, 70, 80, 85];
    const m = emptyMatrix(thetas, [0], [700, 800, 900, 1000], ["R", "A_absorber"]);
    thetas.forEach((t, it) =>
      m.wavelengthNm.forEach((_, il) => {
        m.mean[matrixIndex(m, it, 0, il, 0)] = fresnelR(n, t);
        m.mean[matrixIndex(m, it, 0, il, 1)] = 1 - fresnelR(n, t);
      }),
    );
    const s = photocurrentSummary(m, someWeights(4), { spectrumName: "synthetic" });
    // Normal incidence: R = ((n-1)/(n+1))² = (2.5/4.5)² = 0.308642 (Hecht, Optics, normal-incidence Fresnel reflectance).
    expect(fresnelR(n, 0)).toBeCloseTo(0.308642, 6);
    s.directions.forEach((d, it) => {
      expect(d.iam).toBeCloseTo((1 - fresnelR(n, thetas[it])) / (1 - fresnelR(n, 0)), 12);
    });
    // The curve stays flat to within a few % up to 50° and falls steeply near grazing incidence.
    expect(s.directions[5].iam!).toBeGreaterThan(0.97);
    expect(s.directions[9].iam!).toBeLessThan(0.7);

    // Dispersive variant: n(λ) differs per wavelength; IAM is the weighted ratio Σw(1-R(θ))/Σw(1-R(0)).
    const nOf = [3.8, 3.7, 3.6, 3.55];
    thetas.forEach((t, it) =>
      nOf.forEach((ni, il) => {
        m.mean[matrixIndex(m, it, 0, il, 0)] = fresnelR(ni, t);
        m.mean[matrixIndex(m, it, 0, il, 1)] = 1 - fresnelR(ni, t);
      }),
    );
    const w = someWeights(4);
    const s2 = photocurrentSummary(m, w, { spectrumName: "synthetic" });
    const jOf = (t: number) => nOf.reduce((a, ni, il) => a + w[il] * (1 - fresnelR(ni, t)), 0);
    s2.directions.forEach((d, it) => expect(d.iam).toBeCloseTo(jOf(thetas[it]) / jOf(0), 12));
  });

  it("uses the smallest angle as the IAM reference when the grid has no 0°", () => {
    const m = emptyMatrix([60, 15, 30], [0], [600], ["A_absorber", "R"]);
    [0.5, 0.8, 0.7].forEach((v, it) => (m.mean[matrixIndex(m, it, 0, 0, 0)] = v));
    const s = photocurrentSummary(m, [1], { spectrumName: "synthetic" });
    expect(s.iamReferenceThetaDeg).toBe(15);
    expect(s.directions.map((d) => d.iam)).toEqual([0.5 / 0.8, 1, 0.7 / 0.8]);
  });

  it("rejects weights of the wrong length and a matrix without an absorber channel", () => {
    const m = emptyMatrix([0], [0], [600, 700], ["R", "T"]);
    expect(() => photocurrentSummary(m, [1], { spectrumName: "x" })).toThrow(/1 values for 2 wavelengths/);
    expect(() => photocurrentSummary(m, [1, 1], { spectrumName: "x" })).toThrow(/no "A_absorber" channel/);
  });
});

describe("iamCsv(summary)", () => {
  it("writes theta_deg, phi_deg, iam, iam_stderr, jsc_mA_cm2, jsc_stderr rows that parse back exactly", () => {
    const m = emptyMatrix([0, 45], [0], [600], ["A_absorber", "R"]);
    m.mean[0] = 0.9;
    m.stderr[0] = 0.003;
    m.mean[2] = 0.7;
    m.stderr[2] = 0.004;
    const s = photocurrentSummary(m, [1 / 3], { spectrumName: "synthetic" });
    const lines = iamCsv(s).trim().split("\n");
    expect(lines[0]).toBe("theta_deg,phi_deg,iam,iam_stderr,jsc_mA_cm2,jsc_stderr");
    const row = lines[2].split(",").map(Number);
    expect(row[0]).toBe(45);
    expect(row[2]).toBe(s.directions[1].iam);
    expect(row[3]).toBe(s.directions[1].iamStderr);
    expect(row[4]).toBe(s.directions[1].jscMaCm2);
    expect(row[5]).toBe(s.directions[1].jscStderrMaCm2);
  });
});

describe("ratioIndependent(a, b)", () => {
  it("propagates errors to first order, also when the numerator is 0 (IAM at grazing incidence)", () => {
    // Taylor, An Introduction to Error Analysis, general propagation formula (§3.11, section from memory): q = a/b, σq² = (∂q/∂a σa)² + (∂q/∂b σb)²
    //   = (σa/b)² + (a σb/b²)². a = 0 ± 0.02, b = 10 ± 0.1 → q = 0 ± 0.002.
    const zero = ratioIndependent({ value: 0, stderr: 0.02 }, { value: 10, stderr: 0.1 });
    expect(zero.value).toBe(0);
    expect(zero.stderr).toBeCloseTo(0.002, 15);
    expect(ratioIndependent({ value: 0, stderr: 0 }, { value: 10, stderr: 0.1 }).stderr).toBe(0);
    // a = 4 ± 0.03, b = 8 ± 0.04: q = 0.5, relative errors 0.0075 and 0.005 in quadrature.
    const r = ratioIndependent({ value: 4, stderr: 0.03 }, { value: 8, stderr: 0.04 });
    expect(r.value).toBe(0.5);
    expect(r.stderr).toBeCloseTo(0.5 * Math.hypot(0.0075, 0.005), 15);
  });
});
