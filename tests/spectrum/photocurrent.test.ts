import { readFileSync } from "node:fs";
import { join } from "node:path";
import { describe, expect, it } from "vitest";
import { RandomStream, streamKey } from "../../src/random/stream.js";
import {
  astmG173,
  photocurrentMaCm2,
  photocurrentStdErrMaCm2,
  photocurrentWeights,
  photonFluxPerNm,
  type Spectrum,
} from "../../src/spectrum/index.js";
import { InputError } from "../../src/util/errors.js";

// CODATA 2018 exact constants, written out here independently of src/util/math.ts.
const Q = 1.602176634e-19;
const H = 6.62607015e-34;
const C = 299792458;

/** Independent reading of the global-tilt column straight from the shipped CSV. */
function globalTiltFromFile(): { x: number[]; e: number[] } {
  const text = readFileSync(join(import.meta.dirname, "..", "..", "data", "spectra", "astm-g173.csv"), "utf8");
  const rows = text.split("\n").filter((l) => /^\d/.test(l)).map((l) => l.split(",").map(Number));
  return { x: rows.map((r) => r[0]!), e: rows.map((r) => r[2]!) };
}

/** Direct route: J = q ∫ E λ/(hc) dλ by the trapezoid rule on the G173 grid within [a, b] (grid nodes), in mA/cm². */
function directPhotonCurrent(a: number, b: number): number {
  const { x, e } = globalTiltFromFile();
  let s = 0;
  for (let i = 1; i < x.length; i++) {
    if (x[i - 1]! < a || x[i]! > b) continue;
    const f0 = (e[i - 1]! * x[i - 1]! * 1e-9) / (H * C);
    const f1 = (e[i]! * x[i]! * 1e-9) / (H * C);
    s += 0.5 * (x[i]! - x[i - 1]!) * (f0 + f1);
  }
  return (Q * s) / 10; // A/m² → mA/cm²
}

function range(from: number, to: number, step: number): number[] {
  const out: number[] = [];
  for (let w = from; w <= to + 1e-9; w += step) out.push(Math.round(w * 1e6) / 1e6);
  return out;
}

describe("photocurrentWeights(gridNm, spectrum)", () => {
  const am15g = astmG173("global");

  it("gives the silicon maximum photocurrent (all photons 280–1107 nm) as the direct photon-flux integral to 1e-9", () => {
    const grid = [...range(280, 1100, 10), 1107];
    const j = photocurrentMaCm2(grid, grid.map(() => 1), am15g);
    const direct = directPhotonCurrent(280, 1107);
    expect(Math.abs(j - direct) / direct).toBeLessThan(1e-9);
    // data/SOURCES.md, same quadrature computed when the tables were copied: 43.8107 mA/cm².
    expect(j).toBeCloseTo(43.8107, 3);
    // Shockley–Queisser current for Eg = 1.12 eV under AM1.5G is quoted near 43.8 mA/cm²; the often
    // quoted "about 46 mA/cm²" counts photons to about 1200 nm (both from memory, loose).
    expect(j).toBeGreaterThan(43);
    expect(j).toBeLessThan(44.5);
    const j1200 = photocurrentMaCm2(range(280, 1200, 20), range(280, 1200, 20).map(() => 1), am15g);
    expect(Math.abs(j1200 - directPhotonCurrent(280, 1200)) / j1200).toBeLessThan(1e-9);
    expect(j1200).toBeGreaterThan(45.5);
    expect(j1200).toBeLessThan(47);
  });

  it("is exact for piecewise-linear absorptance on a coarse grid off the spectrum's nodes", () => {
    const grid = range(283.3, 1190.3, 7.7);
    const rng = new RandomStream(streamKey(11, "absorptance"));
    const a = grid.map(() => rng.next());
    const j = photocurrentMaCm2(grid, a, am15g);
    // Reference: trapezoid of q·A(λ)·Φ(λ) on the union of the fine grid and the coarse nodes, with
    // A and Φ linear between their own nodes (written independently of src/spectrum).
    const { x } = globalTiltFromFile();
    const phi = photonFluxPerNm(am15g);
    const lin = (xs: ArrayLike<number>, ys: ArrayLike<number>, v: number): number => {
      let i = 0;
      while (i < xs.length - 2 && xs[i + 1]! < v) i++;
      const t = (v - xs[i]!) / (xs[i + 1]! - xs[i]!);
      return ys[i]! + t * (ys[i + 1]! - ys[i]!);
    };
    const nodes = [...new Set([...x.filter((w) => w >= grid[0]! && w <= grid[grid.length - 1]!), ...grid])].sort((p, q) => p - q);
    let ref = 0;
    for (let i = 1; i < nodes.length; i++) {
      const f = (w: number) => lin(grid, a, w) * lin(x, phi, w);
      ref += 0.5 * (nodes[i]! - nodes[i - 1]!) * (f(nodes[i - 1]!) + f(nodes[i]!));
    }
    ref *= Q / 10;
    expect(Math.abs(j - ref) / ref).toBeLessThan(1e-12);
  });

  it("weights bins by the spectrum, not by point samples: a 50 nm grid still integrates A = 1 exactly", () => {
    const grid = range(300, 1200, 50);
    const w = photocurrentWeights(grid, am15g);
    const sum = w.reduce((p, v) => p + v, 0);
    expect(Math.abs(sum - directPhotonCurrent(300, 1200)) / sum).toBeLessThan(1e-9);
    // end bins cover half intervals: first weight ≈ half of a neighbour's share in flat parts
    expect(w[0]!).toBeLessThan(w[1]!);
  });

  it("converges to the fine result for a smooth absorptance as the grid is refined", () => {
    // A(λ) = 1 − exp(−(1200 − λ)/150): smooth test curve.
    const A = (w: number) => 1 - Math.exp(-(1200 - w) / 150);
    const fine = range(300, 1200, 1);
    const jFine = photocurrentMaCm2(fine, fine.map(A), am15g);
    const errs = [40, 20, 10].map((step) => {
      const g = range(300, 1200, step);
      return Math.abs(photocurrentMaCm2(g, g.map(A), am15g) - jFine);
    });
    expect(errs[1]!).toBeLessThan(errs[0]!);
    expect(errs[2]!).toBeLessThan(errs[1]!);
    expect(errs[2]! / jFine).toBeLessThan(1e-3);
  });

  it("rejects grids outside the spectrum, non-increasing grids and length mismatches", () => {
    expect(() => photocurrentWeights([250, 300], am15g)).toThrow(InputError);
    expect(() => photocurrentWeights([300, 300, 400], am15g)).toThrow(/strictly increasing/);
    expect(() => photocurrentWeights([300], am15g)).toThrow(InputError);
    expect(() => photocurrentMaCm2([300, 400], [1], am15g)).toThrow(/2 grid/);
  });

  it("is linear in the spectrum (a 2× spectrum doubles every weight)", () => {
    const s2: Spectrum = { name: "2x", wavelengthNm: am15g.wavelengthNm, irradianceWm2PerNm: am15g.irradianceWm2PerNm.map((v) => 2 * v) };
    const grid = range(400, 800, 25);
    const w1 = photocurrentWeights(grid, am15g);
    const w2 = photocurrentWeights(grid, s2);
    for (let i = 0; i < grid.length; i++) expect(w2[i]! / w1[i]!).toBeCloseTo(2, 12);
  });
});

describe("photocurrentStdErrMaCm2(weights, stderr)", () => {
  it("equals sqrt(Σ wᵢ² seᵢ²) and matches the scatter of J over simulated noisy absorptance (|ratio − 1| < 4/√(2M))", () => {
    const grid = range(400, 1100, 50);
    const w = photocurrentWeights(grid, astmG173("global"));
    const se = grid.map((_, i) => 0.002 + 0.001 * (i % 3));
    const predicted = photocurrentStdErrMaCm2(w, se);
    let s = 0;
    for (let i = 0; i < w.length; i++) s += w[i]! ** 2 * se[i]! ** 2;
    expect(predicted).toBe(Math.sqrt(s));
    // Monte Carlo: independent Gaussian errors per wavelength (Box–Muller), M replicas.
    const M = 4000;
    const rng = new RandomStream(streamKey(5, "stderr"));
    let sum = 0;
    let sum2 = 0;
    for (let m = 0; m < M; m++) {
      let j = 0;
      for (let i = 0; i < w.length; i++) {
        const g = Math.sqrt(-2 * Math.log(rng.next())) * Math.cos(2 * Math.PI * rng.next());
        j += w[i]! * (0.8 + se[i]! * g);
      }
      sum += j;
      sum2 += j * j;
    }
    const sd = Math.sqrt((sum2 - (sum * sum) / M) / (M - 1));
    // the sample SD has relative standard error ≈ 1/√(2M) (validation-sources.md, error-bar honesty)
    expect(Math.abs(sd / predicted - 1)).toBeLessThan(4 / Math.sqrt(2 * M));
  });
});
