import { describe, expect, it } from "vitest";
import { moduleFrame } from "../../src/sky/moduleFrame.js";
import { InputError } from "../../src/util/errors.js";
import { AngularGrid, yieldGrid } from "../../src/yield/angularGrid.js";
import { planeQuadrature } from "../../src/yield/hemisphere.js";
import { DEG } from "../../src/util/math.js";
import { makeMatrix, range } from "./matrixFixture.js";

const sum = (a: Float64Array): number => a.reduce((x, y) => x + y, 0);

describe("planeQuadrature(grid, frame)", () => {
  it("reproduces the view factors (1 + cos β)/2 (sky), (1 − cos β)/2 (ground), sin β (horizon band) for a unit response", () => {
    // Midpoint rule over a kinked integrand: error O(h²); at 1° × 2° measured ≤ 1.2e-4 of the
    // hemisphere. Tolerance 3e-4 (absolute, fractions of the isotropic irradiance).
    const grid = new AngularGrid(range(0, 90, 5), [0], "averaged");
    for (const beta of [0, 20, 45, 90, 135, 180]) {
      const q = planeQuadrature(grid, moduleFrame({ tiltDeg: beta, azimuthDeg: 180, textureRotationDeg: 0 }));
      expect(Math.abs(sum(q.sky) - (1 + Math.cos(beta * DEG)) / 2)).toBeLessThan(3e-4);
      expect(Math.abs(sum(q.ground) - (1 - Math.cos(beta * DEG)) / 2)).toBeLessThan(3e-4);
      expect(Math.abs(sum(q.horizon) - Math.sin(beta * DEG))).toBeLessThan(3e-4);
    }
  });

  it("keeps the view factors on azimuth-resolved grids (square folding, periodic list) with a texture rotation", () => {
    for (const grid of [new AngularGrid(range(0, 90, 10), [0, 15, 30, 45], "square"), new AngularGrid(range(0, 90, 10), [0, 90, 180, 270], "list")]) {
      const q = planeQuadrature(grid, moduleFrame({ tiltDeg: 60, azimuthDeg: 135, textureRotationDeg: 17 }));
      expect(Math.abs(sum(q.sky) - (1 + Math.cos(60 * DEG)) / 2)).toBeLessThan(3e-4);
      expect(Math.abs(sum(q.ground) - (1 - Math.cos(60 * DEG)) / 2)).toBeLessThan(3e-4);
    }
  });

  it("integrates a cos-shaped response exactly enough: ∫ cos²θ dΩ/π = 2/3 for a horizontal plane", () => {
    // response J = cos θ (linear in θ interpolation error: fine 1° grid); closed form ∫₀^{π/2} cos²θ sinθ dθ · 2π/π = 2/3
    const thetas = range(0, 90, 1);
    const grid = new AngularGrid(thetas, [0], "averaged");
    const j = Float64Array.from(thetas, (t) => Math.cos(t * DEG));
    const q = planeQuadrature(grid, moduleFrame({ tiltDeg: 0, azimuthDeg: 180, textureRotationDeg: 0 }));
    let k = 0;
    for (let i = 0; i < j.length; i++) k += q.sky[i]! * j[i]!;
    expect(Math.abs(k - 2 / 3)).toBeLessThan(3e-4);
  });
});

describe("AngularGrid.weights(θ, φ)", () => {
  const idx = new Int32Array(4), w = new Float64Array(4);
  const total = (g: AngularGrid, t: number, p: number): number => {
    const n = g.weights(t, p, idx, w);
    let s = 0;
    for (let i = 0; i < n; i++) s += w[i]!;
    return s;
  };

  it("lets the response fall linearly to 0 at 90° beyond the last θ (documented rule)", () => {
    const g = new AngularGrid(range(0, 80, 10), [0], "averaged");
    expect(total(g, 40, 0)).toBeCloseTo(1, 12);
    expect(total(g, 85, 0)).toBeCloseTo(0.5, 12);
    expect(total(g, 90, 0)).toBe(0);
  });

  it("folds azimuths for square symmetry and wraps listed azimuths periodically", () => {
    const sq = new AngularGrid([0, 45, 90], [0, 15, 30, 45], "square");
    const node = (t: number, p: number): [number, number][] => {
      const n = sq.weights(t, p, idx, w);
      return Array.from({ length: n }, (_, i) => [idx[i]!, w[i]!] as [number, number]).filter(([, x]) => x > 0).sort((a, b) => a[0] - b[0]);
    };
    expect(node(20, 80)).toEqual(node(20, 10)); // 80° ≡ 90° − 80° = 10°
    expect(node(20, 190)).toEqual(node(20, 10)); // 190° ≡ 10°
    const list = new AngularGrid([0, 90], [0, 90, 180, 270], "list");
    list.weights(0, 315, idx, w); // halfway between 270° and 360° ≡ 0°
    expect(w[0]).toBeCloseTo(0.5, 12);
    expect(idx[0]).toBe(3);
    expect(idx[1]).toBe(0);
  });
});

describe("yieldGrid(matrix, src)", () => {
  it("says which angles are missing when the θ grid does not reach 80° or does not start at 0°", () => {
    const short = makeMatrix({ thetaDeg: range(0, 60, 10), absorber: () => 0.9 });
    expect(() => yieldGrid(short, "short.json")).toThrow(InputError);
    expect(() => yieldGrid(short, "short.json")).toThrow(/covers 0–60°: missing 60–80°/);
    const late = makeMatrix({ thetaDeg: range(20, 85, 5), absorber: () => 0.9 });
    expect(() => yieldGrid(late, "late.json")).toThrow(/missing 0–20°/);
    expect(yieldGrid(makeMatrix({ thetaDeg: range(0, 80, 10), absorber: () => 0.9 }), "ok.json").nTheta).toBe(9);
  });
});
