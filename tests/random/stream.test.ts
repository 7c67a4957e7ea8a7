import { describe, expect, it } from "vitest";
import { RandomStream, streamKey } from "../../src/random/stream.js";

describe("RandomStream(streamKey(seed, ...coords))", () => {
  it("is reproducible for the same key and differs for another key", () => {
    const a = new RandomStream(streamKey(7, 1, 2, 3));
    const b = new RandomStream(streamKey(7, 1, 2, 3));
    const c = new RandomStream(streamKey(7, 1, 2, 4));
    const xa = Array.from({ length: 5 }, () => a.next());
    const xb = Array.from({ length: 5 }, () => b.next());
    const xc = Array.from({ length: 5 }, () => c.next());
    expect(xa).toEqual(xb);
    expect(xa).not.toEqual(xc);
  });

  it("draws uniforms in (0,1) with mean 1/2 and variance 1/12 (properties of U(0,1))", () => {
    const r = new RandomStream(streamKey(1, "u"));
    const n = 200_000;
    let s = 0;
    let s2 = 0;
    for (let i = 0; i < n; i++) {
      const u = r.next();
      expect(u > 0 && u < 1).toBe(true);
      s += u;
      s2 += u * u;
    }
    const mean = s / n;
    const variance = s2 / n - mean * mean;
    // standard error of the mean of U(0,1) is sqrt(1/12/n); 4 sigma
    expect(Math.abs(mean - 0.5)).toBeLessThan(4 * Math.sqrt(1 / 12 / n));
    expect(Math.abs(variance - 1 / 12)).toBeLessThan(0.002);
  });

  it("fill(out, n) draws exactly what n calls of next() draw, and leaves the stream where they leave it", () => {
    const a = new RandomStream(streamKey(3, "fill"));
    const b = new RandomStream(streamKey(3, "fill"));
    const out = new Float64Array(5);
    for (const n of [4, 1, 5, 3]) {
      a.fill(out, n);
      for (let i = 0; i < n; i++) expect(out[i]).toBe(b.next());
    }
    a.startSubstream(12);
    b.startSubstream(12);
    a.fill(out, 4);
    const after = [a.next(), a.next()];
    for (let i = 0; i < 4; i++) expect(out[i]).toBe(b.next());
    expect(after).toEqual([b.next(), b.next()]);
  });
});
