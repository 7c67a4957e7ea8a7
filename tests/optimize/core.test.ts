import { describe, expect, it } from "vitest";
import { RandomStream } from "../../src/random/stream.js";
import { fitQuadratic, quadraticArgmax } from "../../src/optimize/quadraticFit.js";
import { optimize } from "../../src/optimize/optimize.js";
import { studentTQuantile, twoSidedT } from "../../src/optimize/studentT.js";
import type { Objective } from "../../src/optimize/types.js";

/** Gaussian deviate (Box–Muller transform) from a uniform stream. */
function gauss(rng: RandomStream): number {
  return Math.sqrt(-2 * Math.log(rng.next())) * Math.cos(2 * Math.PI * rng.next());
}

/**
 * A smooth Monte Carlo-like objective: an exact quadratic peak at x0 plus, per stream, a random
 * offset and slope (what common random numbers leave: a smooth error, the same for every x of a
 * stream) and a little independent noise per evaluation.
 */
function syntheticObjective(x0: number[], curvature: number[], seed: number, sd = { offset: 1, slope: 0.05, point: 0.01 }): Objective {
  return async (x, stream) => {
    const s = new RandomStream(`synthetic/${seed}/${stream}`);
    const offset = sd.offset * gauss(s);
    const slopes = x.map(() => sd.slope * gauss(s));
    const p = new RandomStream(`synthetic/${seed}/${stream}/${x.join(",")}`);
    let f = 100 + offset + sd.point * gauss(p);
    x.forEach((v, d) => {
      f += -0.5 * curvature[d] * (v - x0[d]) ** 2 + slopes[d] * v;
    });
    return { value: f, stderr: Math.hypot(sd.offset, sd.point) };
  };
}

describe("studentTQuantile(p, dof)", () => {
  it("matches the critical values of the t table", () => {
    // NIST/SEMATECH e-Handbook of Statistical Methods, §1.3.6.7.2 (critical values of Student's t), from memory
    expect(studentTQuantile(0.975, 1)).toBeCloseTo(12.706, 3);
    expect(studentTQuantile(0.975, 4)).toBeCloseTo(2.776, 3);
    expect(studentTQuantile(0.95, 10)).toBeCloseTo(1.812, 3);
    expect(studentTQuantile(0.995, 5)).toBeCloseTo(4.032, 3);
    expect(studentTQuantile(0.975, 30)).toBeCloseTo(2.042, 3);
    // large ν: the normal quantile 1.959964 (any normal table)
    expect(twoSidedT(0.95, 1e6)).toBeCloseTo(1.959964, 4);
    expect(studentTQuantile(0.025, 4)).toBeCloseTo(-2.776, 3);
  });
});

describe("fitQuadratic / quadraticArgmax", () => {
  it("recovers an exact 1D parabola and its vertex; clamps to the box when the vertex lies outside", () => {
    const f = (x: number): number => 3 - 2 * (x - 1.3) ** 2;
    const xs = [0, 0.5, 1, 1.5, 2];
    const q = fitQuadratic(xs.map((x) => [x]), xs.map(f), [1], [1])!;
    expect(quadraticArgmax(q, [0], [2])[0]).toBeCloseTo(1.3, 12);
    expect(quadraticArgmax(q, [0], [1])[0]).toBeCloseTo(1, 12);
  });

  it("recovers a 2D concave surface with a cross term; a saddle peaks on the box edge", () => {
    // maximum of −(x−a)ᵀH(x−a)/2 with H positive definite is at a
    const f = (x: number, y: number): number => 5 - (x - 0.2) ** 2 - 0.5 * (x - 0.2) * (y + 0.4) - 2 * (y + 0.4) ** 2;
    const pts: number[][] = [];
    for (const u of [-1, 0, 1]) for (const v of [-1, 0, 1]) pts.push([u, v]);
    const q = fitQuadratic(pts, pts.map(([x, y]) => f(x, y)), [0, 0], [1, 1])!;
    const m = quadraticArgmax(q, [-1, -1], [1, 1]);
    expect(m[0]).toBeCloseTo(0.2, 10);
    expect(m[1]).toBeCloseTo(-0.4, 10);
    const saddle = fitQuadratic(pts, pts.map(([x, y]) => x * x - y * y + 0.1 * x), [0, 0], [1, 1])!;
    const s = quadraticArgmax(saddle, [-1, -1], [1, 1]);
    expect(s).toEqual([1, 0]);
  });
});

describe("optimize(objective, options)", () => {
  it("1D: finds an interior optimum within its interval and flags no bound", async () => {
    const r = await optimize(syntheticObjective([62], [0.02], 1), { lower: [20], upper: [120] });
    expect(r.atBound).toEqual([null]);
    expect(Math.abs(r.location[0] - 62) / r.locationStdErr[0]).toBeLessThan(4);
    expect(r.locationInterval[0][0]).toBeLessThan(r.location[0]);
    expect(r.locationInterval[0][1]).toBeGreaterThan(r.location[0]);
    expect(r.evaluations.filter((e) => e.stage === "local").length % 5).toBe(0);
  });

  it("1D: a monotonic objective stops at the upper bound and says so", async () => {
    const mono: Objective = async (x, stream) => {
      const s = new RandomStream(`mono/${stream}`);
      return { value: 20 + 0.01 * x[0] - 1e-6 * x[0] ** 2 + 0.001 * gauss(s) * x[0] / 100, stderr: 0.001 };
    };
    const r = await optimize(mono, { lower: [50], upper: [300] });
    expect(r.atBound).toEqual(["upper"]);
    expect(r.location[0]).toBeCloseTo(300, 6);
  });

  it("2D: finds the optimum of a tilted concave surface and covers it", async () => {
    const r = await optimize(syntheticObjective([0.7, -0.2], [4, 10], 5, { offset: 0.1, slope: 0.02, point: 0.001 }), { lower: [0, -1], upper: [2, 1], replicas: 10 });
    expect(r.atBound).toEqual([null, null]);
    // |z| < 4 from the reported standard errors (project rule for statistical checks)
    for (const [d, x0] of [0.7, -0.2].entries()) expect(Math.abs(r.location[d] - x0) / r.locationStdErr[d]).toBeLessThan(4);
  });

  it("replica study: the 90 % interval covers the true optimum in 90 % of independent runs (binomial error)", async () => {
    // Coverage of a t interval (Student 1908): with normal replica errors the nominal level is exact.
    const K = 120;
    const level = 0.9;
    let covered = 0;
    for (let k = 0; k < K; k++) {
      const x0 = 40 + 50 * ((k * 0.618) % 1);
      const r = await optimize(syntheticObjective([x0], [0.02], 1000 + k), { lower: [20], upper: [120], level, replicas: 4 });
      if (r.locationInterval[0][0] <= x0 && x0 <= r.locationInterval[0][1]) covered++;
    }
    const se = Math.sqrt((level * (1 - level)) / K);
    expect(Math.abs(covered / K - level) / se).toBeLessThan(4);
  });
});
