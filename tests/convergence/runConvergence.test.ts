import { describe, expect, it } from "vitest";
import { RandomStream } from "../../src/random/stream.js";
import { logLogSlope } from "../../src/convergence/logLogSlope.js";
import { predictRays, runConvergence, type Estimator } from "../../src/convergence/runConvergence.js";

/** Bernoulli estimator of a known probability p: the plain Monte Carlo case. */
function bernoulli(p: number, seed: number): Estimator {
  return (nRays, ns) => {
    const rng = new RandomStream(`test/${seed}/${ns}`);
    let k = 0;
    for (let i = 0; i < nRays; i++) if (rng.next() < p) k++;
    const q = k / nRays;
    return { value: q, stderr: Math.sqrt((q * (1 - q)) / nRays), nRays };
  };
}

describe("logLogSlope(x, y)", () => {
  it("recovers the exponent of a power law exactly", () => {
    const x = [10, 20, 40, 80];
    expect(logLogSlope(x, x.map((v) => 3 * v ** -0.5))).toBeCloseTo(-0.5, 12);
    expect(logLogSlope(x, x.map((v) => v ** 2))).toBeCloseTo(2, 12);
  });
  it("leaves out non-positive values and is NaN with fewer than two points", () => {
    expect(logLogSlope([1, 2, 4], [0, 1, 0.5])).toBeCloseTo(-1, 12);
    expect(logLogSlope([1, 2], [0, 1])).toBeNaN();
  });
});

describe("predictRays(N, se, target)", () => {
  it("is N·(se/target)², rounded up (SE ∝ 1/√N for independent rays)", () => {
    expect(predictRays(1000, 0.004, 0.001)).toBe(16000);
    expect(predictRays(1000, 0.001, 0.002)).toBe(250);
    expect(predictRays(3, 1, 2)).toBe(1); // 0.75 rounds up
  });
});

describe("runConvergence(estimator, options)", () => {
  it("RMS error of plain Monte Carlo falls as N^-1/2 over more than a decade (several seeds)", () => {
    // Standard Monte Carlo result (validation-sources.md): RMS error ∝ N^-1/2. Exact reference p.
    // Pooled over 8 seeds × 8 replicas and 7 doublings (64×, 1.8 decades), the fitted slope has a
    // sampling sd near 0.025, so ±0.1 is a 4σ band.
    const p = 0.3;
    const perSeed = [1, 2, 3, 4, 5, 6, 7, 8].map((seed) =>
      runConvergence(bernoulli(p, seed), { startRays: 50, steps: 7, replicas: 8, referenceRays: 0, reference: { value: p, stderr: 0, nRays: 0 } }),
    );
    const n = perSeed[0].steps.map((s) => s.nRays);
    const pooledRms = n.map((_, k) => Math.sqrt(perSeed.reduce((a, r) => a + r.steps[k].rmsError ** 2, 0) / perSeed.length));
    expect(n[n.length - 1] / n[0]).toBeGreaterThanOrEqual(10);
    expect(Math.abs(logLogSlope(n, pooledRms) + 0.5)).toBeLessThan(0.1);
    // The reported stderr of a binomial fraction, sqrt(p̂(1-p̂)/N), has slope -1/2 up to p̂ noise:
    // sd of ln SE at N = 50 is about 0.06 for one run, so ±0.05 per run and ±0.02 for the mean over
    // 64 runs are 4σ-wide bands (slope sd ≈ sd(ln SE)/sqrt(Σ(ln N - mean)²) with Σ ≈ 13.4).
    for (const r of perSeed) expect(Math.abs(r.slopes.stderr + 0.5)).toBeLessThan(0.05);
    const pooledSe = n.map((_, k) => perSeed.reduce((a, r) => a + r.steps[k].meanStderr, 0) / perSeed.length);
    expect(Math.abs(logLogSlope(n, pooledSe) + 0.5)).toBeLessThan(0.02);
    // And the RMS error agrees with the true SE sqrt(p(1-p)/N) within the sampling error of an RMS
    // over 64 replicas (relative sd ≈ 1/sqrt(2·64) ≈ 0.09; 4σ band).
    n.forEach((nr, k) => expect(Math.abs(pooledRms[k] / Math.sqrt((p * (1 - p)) / nr) - 1)).toBeLessThan(0.36));
  });

  it("rmsErrorSd matches the seed-to-seed scatter of the fitted RMS-error slope", () => {
    // 40 seeds, 8 replicas, 7 doublings: the empirical sd of the 40 slopes should equal the predicted
    // (1/sqrt(2R))/sqrt(Σ(ln N - mean)²) within 4/sqrt(2·40) relative (sd of an sd estimate).
    const p = 0.3;
    const slopes: number[] = [];
    let predicted = 0;
    for (let seed = 100; seed < 140; seed++) {
      const r = runConvergence(bernoulli(p, seed), { startRays: 50, steps: 7, replicas: 8, referenceRays: 0, reference: { value: p, stderr: 0, nRays: 0 } });
      slopes.push(r.slopes.rmsError);
      predicted = r.slopes.rmsErrorSd;
    }
    const m = slopes.reduce((a, b) => a + b, 0) / slopes.length;
    const sd = Math.sqrt(slopes.reduce((a, b) => a + (b - m) ** 2, 0) / (slopes.length - 1));
    expect(Math.abs(sd / predicted - 1)).toBeLessThan(4 / Math.sqrt(80));
    expect(Math.abs(m + 0.5)).toBeLessThan((4 * predicted) / Math.sqrt(slopes.length));
  });

  it("runs an independent reference, replicas on distinct streams, and predicts rays for a target", () => {
    const calls: string[] = [];
    const inner = bernoulli(0.5, 11);
    const est: Estimator = (nr, ns) => {
      calls.push(`${nr}@${ns}`);
      return inner(nr, ns);
    };
    const r = runConvergence(est, { startRays: 100, steps: 3, replicas: 2, referenceRays: 10000, targetError: 0.001 });
    expect(new Set(calls).size).toBe(calls.length); // no stream namespace reused
    expect(calls.length).toBe(1 + 3 * 2);
    expect(r.reference.kind).toBe("run");
    expect(r.reference.nRays).toBe(10000);
    expect(r.steps.map((s) => s.nRays)).toEqual([100, 200, 400]);
    for (const s of r.steps) {
      expect(s.deviation).toBe(s.value - r.reference.value);
      expect(s.predictedRays).toBe(Math.ceil(s.nRays * (s.stderr / 0.001) ** 2));
    }
    const last = r.steps[2];
    expect(r.predictedRays).toBe(Math.ceil(400 * (last.stderr / 0.001) ** 2));
    // p = 0.5: SE at N rays ≈ 0.5/√N, so about 250 000 rays for SE = 0.001 (± sampling of p̂).
    expect(r.predictedRays!).toBeGreaterThan(240000);
    expect(r.predictedRays!).toBeLessThanOrEqual(250000);
  });

  it("is deterministic: the same estimator and options give identical results", () => {
    const o = { startRays: 64, steps: 4, replicas: 3, referenceRays: 4096 };
    expect(runConvergence(bernoulli(0.2, 5), o)).toEqual(runConvergence(bernoulli(0.2, 5), o));
    expect(runConvergence(bernoulli(0.2, 6), o)).not.toEqual(runConvergence(bernoulli(0.2, 5), o));
  });

  it("rejects bad options", () => {
    expect(() => runConvergence(bernoulli(0.2, 1), { startRays: 0, steps: 3, replicas: 1, referenceRays: 10 })).toThrow(/startRays/);
    expect(() => runConvergence(bernoulli(0.2, 1), { startRays: 10, steps: 1, replicas: 1, referenceRays: 10 })).toThrow(/steps/);
    expect(() => runConvergence(bernoulli(0.2, 1), { startRays: 10, steps: 3, replicas: 1, referenceRays: 10, targetError: 0 })).toThrow(/targetError/);
  });
});
