import { describe, expect, it } from "vitest";
import { owenScramble, ScrambledSobol, sobolBits, SOBOL_DIMENSIONS } from "../../src/random/sobol.js";
import { groupStdErr } from "../../src/random/replicaGroups.js";
import { batchLaunchPoints } from "../../src/trace/launchPoints.js";

const unit = (bits: number): number => (bits >>> 0) / 2 ** 32;

/** Index of the elementary box [i·2^-a, (i+1)·2^-a) × [j·2^-b, (j+1)·2^-b) holding (x, y). */
const box = (x: number, y: number, a: number, b: number): number => Math.floor(x * 2 ** a) * 2 ** b + Math.floor(y * 2 ** b);

/** Are the points (xs[i], ys[i]), i < 2^m, one per box of every shape 2^-a × 2^-(m−a)? (a (0, m, 2)-net) */
function isZeroNet(xs: number[], ys: number[], m: number): boolean {
  for (let a = 0; a <= m; a++) {
    const seen = new Set<number>();
    for (let i = 0; i < 2 ** m; i++) seen.add(box(xs[i], ys[i], a, m - a));
    if (seen.size !== 2 ** m) return false;
  }
  return true;
}

describe("Sobol' points with Joe–Kuo direction numbers", () => {
  it("start with the textbook points: 0, 1/2, then 1/4 and 3/4 in each dimension", () => {
    // Every Sobol' dimension has m_1 = 1 (V_1 = 1/2) and an odd m_2 (Joe & Kuo 2008, table
    // new-joe-kuo-6.21201): points 0 and 1 are 0 and 1/2, points 2 and 3 are {1/4, 3/4}.
    for (let d = 0; d < SOBOL_DIMENSIONS; d++) {
      expect(unit(sobolBits(0, d))).toBe(0);
      expect(unit(sobolBits(1, d))).toBe(0.5);
      expect([unit(sobolBits(2, d)), unit(sobolBits(3, d))].sort()).toEqual([0.25, 0.75]);
    }
    // Dimension 1 is the van der Corput sequence in base 2 (radical inverse of the index).
    expect([4, 5, 6, 7].map((i) => unit(sobolBits(i, 0)))).toEqual([0.125, 0.625, 0.375, 0.875]);
  });

  it("stratify every dimension: the first 2^m points hit each interval of length 2^-m once", () => {
    // Each one-dimensional Sobol' projection is a (0, 1)-sequence in base 2 (Sobol' 1967).
    for (let d = 0; d < SOBOL_DIMENSIONS; d++) {
      const seen = new Set(Array.from({ length: 1024 }, (_, i) => Math.floor(unit(sobolBits(i, d)) * 1024)));
      expect(seen.size).toBe(1024);
    }
  });

  it("form (0, m, 2)-nets in the first two dimensions, before and after Owen scrambling", () => {
    // The first two Sobol' dimensions form a (0, 2)-sequence in base 2 (Niederreiter, Random Number
    // Generation and Quasi-Monte Carlo Methods, 1992, ch. 4; from memory); a nested (Owen) scramble
    // maps elementary boxes onto elementary boxes and keeps the net property (Owen 1995).
    for (const m of [4, 8, 10]) {
      const x = Array.from({ length: 2 ** m }, (_, i) => unit(sobolBits(i, 0)));
      const y = Array.from({ length: 2 ** m }, (_, i) => unit(sobolBits(i, 1)));
      expect(isZeroNet(x, y, m)).toBe(true);
      const s = new ScrambledSobol(`net/${m}`);
      const u = new Float64Array(4);
      const sx: number[] = [];
      const sy: number[] = [];
      for (let i = 0; i < 2 ** m; i++) {
        s.point(i, u);
        sx.push(u[0]);
        sy.push(u[1]);
      }
      expect(isZeroNet(sx, sy, m)).toBe(true);
    }
  });

  it("owenScramble is a bijection whose top bit depends only on the top bit", () => {
    // Nested scrambling: output bit k depends on input bits above k only.
    const seed = 0x2545f491;
    const outs = new Set<number>();
    for (let x = 0; x < 1 << 12; x++) outs.add(owenScramble(x << 20, seed) >>> 20);
    expect(outs.size).toBe(1 << 12);
    const top = (x: number): number => owenScramble(x, seed) >>> 31;
    expect(top(0)).toBe(top(0x7fffffff));
    expect(top(0x80000000 | 0)).toBe(top(-1));
    expect(top(0)).not.toBe(top(0x80000000 | 0));
  });

  it("scrambled points are uniform: each coordinate of point i over 4000 scrambles has mean 1/2, variance 1/12", () => {
    // A uniformly random seed added before the nested permutation makes every point U(0, 1)
    // (Burley 2020, JCGT 9(4)); checked at a few indices with |z| < 4 against U(0,1)'s moments.
    const u = new Float64Array(4);
    const R = 4000;
    for (const i of [0, 1, 5, 1000]) {
      for (let d = 0; d < SOBOL_DIMENSIONS; d++) {
        let s1 = 0;
        let s2 = 0;
        for (let r = 0; r < R; r++) {
          new ScrambledSobol(`uniform/${r}`).point(i, u);
          expect(u[d] > 0 && u[d] < 1).toBe(true);
          s1 += u[d];
          s2 += u[d] * u[d];
        }
        const mean = s1 / R;
        expect(Math.abs(mean - 0.5) / Math.sqrt(1 / 12 / R)).toBeLessThan(4);
        // Var(U²) = 1/5 − 1/9 = 4/45 for U(0, 1).
        expect(Math.abs(s2 / R - 1 / 3) / Math.sqrt(4 / 45 / R)).toBeLessThan(4);
      }
    }
  });

  it("integrate a smooth function with an error falling faster than N^-1 (randomized QMC)", () => {
    // Owen-scrambled nets: RMSE O(N^-3/2 (log N)^((s−1)/2)) for smooth integrands (Owen 1997,
    // "Scrambled net variance for integrals of smooth functions"); f = x·y·z·w integrates to 1/16.
    const u = new Float64Array(4);
    const rmse = (n: number): number => {
      let ss = 0;
      for (let r = 0; r < 32; r++) {
        const s = new ScrambledSobol(`smooth/${n}/${r}`);
        let acc = 0;
        for (let i = 0; i < n; i++) {
          s.point(i, u);
          acc += u[0] * u[1] * u[2] * u[3];
        }
        ss += (acc / n - 1 / 16) ** 2;
      }
      return Math.sqrt(ss / 32);
    };
    const slope = Math.log(rmse(4096) / rmse(256)) / Math.log(16);
    expect(slope).toBeLessThan(-1);
  });
});

describe("groupStdErr", () => {
  it("is the textbook s/√K of the group means for equal groups", () => {
    const means = [0.1, 0.3, 0.2, 0.6];
    const m = 0.3;
    const s2 = means.reduce((a, x) => a + (x - m) ** 2, 0) / 3;
    expect(groupStdErr(means.map((x) => 10 * x), [10, 10, 10, 10])).toBeCloseTo(Math.sqrt(s2 / 4), 14);
    expect(groupStdErr([1, 2], [1, 0])).toBeNaN();
  });
});

describe("batchLaunchPoints (src/trace/launchPoints.ts)", () => {
  const pointsOf = (batch: number, batchSize: number, seed = 9, n = 4): number[][] => {
    const lp = batchLaunchPoints("sobol", seed, undefined, 1, 0, 2, batch, batchSize)!;
    return Array.from({ length: n }, (_, r) => (lp.load(r), Array.from(lp.u)));
  };

  it("gives two stacks traced with one seed the same points (common random numbers), other groups and seeds others", () => {
    expect(pointsOf(3, 100)).toEqual(pointsOf(3, 100));
    expect(pointsOf(3, 100)).not.toEqual(pointsOf(4, 100));
    expect(pointsOf(3, 100, 10)).not.toEqual(pointsOf(3, 100));
    expect(batchLaunchPoints("random", 9, undefined, 0, 0, 0, 0, 100)).toBeNull();
    expect(batchLaunchPoints(undefined, 9, undefined, 0, 0, 0, 0, 100)).toBeNull();
  });

  it("continues a group's sequence batch after batch: batch b + 16 starts where batch b ends", () => {
    // Group 3 holds batches 3, 19, 35 …; with batches of 4 rays, batch 19 takes points 4…7 of the
    // sequence batch 3 starts (so a group is one scrambled Sobol' set however it was scheduled).
    const first = pointsOf(3, 4, 9, 8);
    expect(pointsOf(19, 4)).toEqual(first.slice(4, 8));
  });
});
