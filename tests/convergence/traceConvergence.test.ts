import { describe, expect, it } from "vitest";
import { loadStudyFromDocument } from "../../src/study/load.js";
import { logLogSlope } from "../../src/convergence/logLogSlope.js";
import { runConvergence } from "../../src/convergence/runConvergence.js";
import { buildConvergenceReport, convergenceEstimator } from "../../src/convergence/convergeStudy.js";
import { BARE_SI_STACK } from "./bareSi.js";

/** Planar bare silicon, 180 µm, silver rear: at 400 nm the wafer is opaque, so R is pure front Fresnel reflection. */
function bareSi(seed: number) {
  return loadStudyFromDocument(
    {
      name: "bare-si-planar",
      stack: BARE_SI_STACK,
      grid: { thetaDeg: [0], phiDeg: [0], wavelengthNm: [400, 600] },
      rays: { perPoint: 1000, batch: 1000 },
      seed,
    },
    { baseDir: process.cwd() },
  );
}

/** Normal-incidence reflectance air → absorbing medium: ((n−1)² + k²)/((n+1)² + k²) (Born & Wolf, Principles of Optics). */
function fresnelNormal(n: number, k: number): number {
  return ((n - 1) ** 2 + k ** 2) / ((n + 1) ** 2 + k ** 2);
}

describe("convergence with the tracer (planar bare Si, R at 400 nm, θ = 0)", () => {
  const loaded = bareSi(1);
  const { n, k } = loaded.registry.get("Si").nk(400);
  const rExact = fresnelNormal(n, k);
  // The analog estimator: the default one (expected value with first-pass splitting) returns this
  // opaque wafer's R and A exactly, with zero spread (see the last test), so it has no N^-1/2 law.
  const analog = { estimator: "analog" as const };
  const target = { thetaDeg: 0, phiDeg: 0, wavelengthNm: 400, channel: "R_first", startRays: 1, steps: 2, replicas: 1, ...analog };

  it("RMS error falls as N^-1/2 over more than a decade, pooled over several seeds (slope -0.5 ± 0.1)", () => {
    // Standard Monte Carlo result (validation-sources.md, Convergence). Exact reference: Fresnel R.
    // 6 seeds × 8 replicas, 7 doublings (50…3200 rays, 64×): the slope's sampling sd is ≈ 0.03.
    const seeds = [1, 2, 3, 4, 5, 6];
    const runs = seeds.map((s) => {
      const l = bareSi(s);
      return runConvergence(convergenceEstimator(l, target), {
        startRays: 50,
        steps: 7,
        replicas: 8,
        referenceRays: 0,
        reference: { value: rExact, stderr: 0, nRays: 0 },
      });
    });
    const nr = runs[0].steps.map((s) => s.nRays);
    expect(nr[nr.length - 1] / nr[0]).toBeGreaterThanOrEqual(10);
    const pooled = nr.map((_, j) => Math.sqrt(runs.reduce((a, r) => a + r.steps[j].rmsError ** 2, 0) / runs.length));
    const slope = logLogSlope(nr, pooled);
    expect(Math.abs(slope + 0.5)).toBeLessThan(0.1);
    // Reported stderr, mean over all replicas: slope -0.5 within 0.02 (binomial SE; p̂ noise only).
    const se = nr.map((_, j) => runs.reduce((a, r) => a + r.steps[j].meanStderr, 0) / runs.length);
    expect(Math.abs(logLogSlope(nr, se) + 0.5)).toBeLessThan(0.02);
    // Error-bar honesty: pooled RMS error / mean reported SE ≈ 1 within 4/sqrt(2·48) per step.
    nr.forEach((_, j) => expect(Math.abs(pooled[j] / se[j] - 1)).toBeLessThan(4 / Math.sqrt(2 * 48)));
  });

  it("the independent reference run agrees with the Fresnel value (|z| < 4)", () => {
    const r = buildConvergenceReport(loaded, { thetaDeg: 0, wavelengthNm: 400, channel: "R_first", startRays: 100, steps: 3, replicas: 2, ...analog });
    expect(r.reference.kind).toBe("run");
    expect(r.reference.nRays).toBe(16 * 400);
    expect(Math.abs(r.reference.value - rExact) / r.reference.stderr).toBeLessThan(4);
  });

  it("the predicted ray count reaches the requested error: N·(SE/target)²", () => {
    const est = convergenceEstimator(loaded, target);
    const r = runConvergence(est, { startRays: 200, steps: 3, replicas: 1, referenceRays: 1000, targetError: 0.004 });
    const predicted = r.predictedRays!;
    expect(predicted).toBe(Math.ceil(800 * (r.steps[2].stderr / 0.004) ** 2));
    // A fresh run at the predicted count: its binomial SE sqrt(p̂(1-p̂)/N) is the target to within
    // the p̂ noise (p ≈ 0.49, so the SE hardly depends on p̂: a few percent at most).
    const check = est(predicted, "test/predicted");
    expect(Math.abs(check.stderr / 0.004 - 1)).toBeLessThan(0.05);
  });

  it("is deterministic for a fixed seed and changes with the seed", () => {
    const req = { thetaDeg: 0, wavelengthNm: 600, channel: "A_absorber", startRays: 100, steps: 3, replicas: 2, referenceRays: 800, ...analog };
    const a = buildConvergenceReport(bareSi(7), req);
    const b = buildConvergenceReport(bareSi(7), req);
    const c = buildConvergenceReport(bareSi(8), req);
    expect(JSON.stringify(a)).toBe(JSON.stringify(b));
    expect(a.steps.map((s) => s.value)).not.toEqual(c.steps.map((s) => s.value));
  });

  it("spectral mode converges the absorber photocurrent with SE = sqrt(Σ w² SE²)", () => {
    const r = buildConvergenceReport(loaded, { thetaDeg: 0, channel: "A_absorber", startRays: 100, steps: 3, replicas: 2, referenceRays: 1600, ...analog });
    expect(r.mode).toBe("spectral");
    expect(r.unit).toBe("mA/cm²");
    expect(r.wavelengthRangeNm).toEqual([400, 600]);
    expect(Math.abs(r.slopes.stderr + 0.5)).toBeLessThan(0.15);
    for (const s of r.steps) expect(s.value).toBeGreaterThan(0);
  });

  it("the default estimator gives the opaque wafer's Fresnel R exactly, with zero spread", () => {
    // First-pass splitting: the front reflection is an expected value and nothing comes back out of
    // an opaque wafer, so every ray reports R = Fresnel (Born & Wolf) and the spread is zero.
    const est = convergenceEstimator(loaded, { ...target, estimator: undefined });
    const r = est(500, "test/default");
    expect(Math.abs(r.value - rExact)).toBeLessThan(1e-6);
    expect(r.stderr).toBeLessThan(1e-6); // zero up to rounding in Σc² − n·mean²
  });
});
