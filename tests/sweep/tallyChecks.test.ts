import { describe, expect, it } from "vitest";
import { MaterialRegistry } from "../../src/materials/registry.js";
import { RandomStream, streamKey } from "../../src/random/stream.js";
import { fillPairGroup, groupFreePathSlot, groupOffset, replicaFreePathStdErr, tallyLength } from "../../src/sweep/tally.js";
import { storedTallyProblem } from "../../src/sweep/tallyChecks.js";
import { compileStack } from "../../src/trace/compile.js";
import { traceBatch } from "../../src/trace/kernel.js";
import { summarizeTrapping } from "../../src/trace/trappingSummary.js";
import { BENCH } from "../trace/replicaStacks.js";

/** A point of 16 batches of 40 rays, summed as a sweep sums them (each batch filling its pairing group). */
function pointTally(): { t: Float64Array; nC: number; nRays: number } {
  const cs = compileStack(BENCH, MaterialRegistry.withBuiltins(), 1100);
  const nC = cs.channels.length;
  const len = tallyLength(nC);
  const t = new Float64Array(len);
  const b = new Float64Array(len);
  for (let batch = 0; batch < 16; batch++) {
    b.fill(0);
    traceBatch(cs, 0, 0, 40, new RandomStream(streamKey(3, 0, 0, 0, batch)), b);
    fillPairGroup(b, nC, batch);
    for (let i = 0; i < len; i++) t[i] += b[i];
  }
  return { t, nC, nRays: 640 };
}

describe("pairing groups keep the α → 0 path and the entered power", () => {
  it("their sums match the point's, and a tally whose groups disagree is refused naming the quantity", () => {
    const { t, nC, nRays } = pointTally();
    expect(storedTallyProblem(t, nC, nRays)).toBeUndefined();
    const o = groupOffset(nC, 5) + groupFreePathSlot(nC);
    const path = t.slice();
    path[o] += 1;
    expect(storedTallyProblem(path, nC, nRays)).toMatch(/pairing groups hold an α → 0 path of .*, the point/);
    const entered = t.slice();
    entered[o + 1] *= 0.5;
    expect(storedTallyProblem(entered, nC, nRays)).toMatch(/pairing groups hold an entered power of .*, the point/);
  });

  it("the replica error of the α → 0 path ratio is that of a ratio over the groups", () => {
    const { t, nC } = pointTally();
    // Direct from the definition (Cochran's ratio over clusters): R = Σp/Σe, Var = K/(K−1) Σ (e_g/E)² (p_g/e_g − R)².
    const p: number[] = [];
    const e: number[] = [];
    for (let g = 0; g < 16; g++) {
      const o = groupOffset(nC, g) + groupFreePathSlot(nC);
      p.push(t[o]);
      e.push(t[o + 1]);
    }
    const P = p.reduce((a, x) => a + x, 0);
    const E = e.reduce((a, x) => a + x, 0);
    const R = P / E;
    const v = (16 / 15) * e.reduce((a, eg, g) => a + (eg / E) ** 2 * (p[g] / eg - R) ** 2, 0);
    expect(R).toBeCloseTo(summarizeTrapping(t, nC).freePathRatio.mean, 12);
    expect(replicaFreePathStdErr(t, nC)).toBeCloseTo(Math.sqrt(v), 12);
  });

  it("no light entered: error 0; light in only one group: no spread to measure (NaN, the matrix keeps the per-ray error)", () => {
    const { t, nC } = pointTally();
    const slot = groupFreePathSlot(nC);
    const dark = t.slice();
    for (let g = 0; g < 16; g++) dark[groupOffset(nC, g) + slot] = dark[groupOffset(nC, g) + slot + 1] = 0;
    expect(replicaFreePathStdErr(dark, nC)).toBe(0);
    const one = dark.slice();
    one[groupOffset(nC, 3) + slot] = 5;
    one[groupOffset(nC, 3) + slot + 1] = 2;
    expect(replicaFreePathStdErr(one, nC)).toBeNaN();
  });
});
