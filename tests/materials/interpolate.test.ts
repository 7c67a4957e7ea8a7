import { describe, expect, it } from "vitest";
import { findInterval, interpolateLinear, interpolateLogPositive } from "../../src/materials/interpolate.js";

describe("interpolateLinear(x, y, v)", () => {
  const x = Float64Array.from([400, 500, 700]);
  const y = Float64Array.from([1.5, 1.7, 1.3]);

  it("returns the tabulated value exactly at every node", () => {
    for (let i = 0; i < x.length; i++) expect(interpolateLinear(x, y, x[i]!)).toBe(y[i]!);
  });

  it("is the straight line between neighbours (definition of linear interpolation)", () => {
    expect(interpolateLinear(x, y, 450)).toBeCloseTo(1.6, 14);
    expect(interpolateLinear(x, y, 650)).toBeCloseTo(1.7 + 0.75 * (1.3 - 1.7), 14);
  });
});

describe("interpolateLogPositive(x, y, v) for k", () => {
  const x = Float64Array.from([1000, 1100, 1200, 1300]);
  const y = Float64Array.from([1e-3, 1e-7, 0, 2e-8]);

  it("is exact at the nodes", () => {
    for (let i = 0; i < x.length; i++) expect(interpolateLogPositive(x, y, x[i]!)).toBe(y[i]!);
  });

  it("gives the geometric mean half-way between two positive neighbours (ln k linear in λ)", () => {
    const mid = interpolateLogPositive(x, y, 1050);
    expect(mid / Math.sqrt(1e-3 * 1e-7)).toBeCloseTo(1, 12);
    // a quarter of the way: k0^(3/4) k1^(1/4)
    expect(interpolateLogPositive(x, y, 1025) / (1e-3 ** 0.75 * 1e-7 ** 0.25)).toBeCloseTo(1, 12);
  });

  it("falls back to linear where a neighbour is zero", () => {
    expect(interpolateLogPositive(x, y, 1150)).toBeCloseTo(0.5e-7, 20);
    expect(interpolateLogPositive(x, y, 1250)).toBeCloseTo(1e-8, 22);
  });

  it("differs from linear interpolation by a factor 50 half-way across four decades", () => {
    const lin = interpolateLinear(x, y, 1050); // (1e-3 + 1e-7)/2
    const log = interpolateLogPositive(x, y, 1050); // sqrt(1e-3 · 1e-7) = 1e-5
    expect(lin / log).toBeCloseTo(50.005, 9);
  });
});

describe("findInterval(x, v)", () => {
  it("finds the bracketing interval and maps the last node to the last interval", () => {
    const x = [1, 2, 4, 8];
    expect(findInterval(x, 1)).toBe(0);
    expect(findInterval(x, 3.9)).toBe(1);
    expect(findInterval(x, 4)).toBe(2);
    expect(findInterval(x, 8)).toBe(2);
  });
});
