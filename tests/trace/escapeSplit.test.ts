import { describe, expect, it } from "vitest";
import { MaterialRegistry } from "../../src/materials/registry.js";
import { RandomStream, streamKey } from "../../src/random/stream.js";
import type { StackSpec } from "../../src/study/stackTypes.js";
import { compileStack, type CompileOptions } from "../../src/trace/compile.js";
import { traceBatch, type LightSide } from "../../src/trace/kernel.js";
import { createTally, summarizeTally } from "../../src/trace/tally.js";
import { summarizeTrapping } from "../../src/trace/trappingSummary.js";
import { BENCH } from "./replicaStacks.js";

// Splitting on the way out (src/trace/interfaceEvent.ts, estimatorChoice.ts) changes how the light's
// fate is sampled, never its expectation: every channel and the light-trapping history (entered
// power, power left after each pass, R_first/R_escape, T_first/T_escape) must agree with the analog
// estimator (|z| < 4, sampling theory), and every ray's channels still sum to 1.
const registry = MaterialRegistry.withBuiltins();

function run(stack: StackSpec, wl: number, thetaDeg: number, side: LightSide, options: CompileOptions, n: number) {
  const cs = compileStack(stack, registry, wl, options);
  const t = createTally(cs);
  traceBatch(cs, thetaDeg, null, n, new RandomStream(streamKey(5, "escape-split", wl, JSON.stringify(options))), t, "unpolarized", side);
  return { cs, t, s: summarizeTally(cs.channels, t), trap: summarizeTrapping(t, cs.channels.length) };
}

const ESCAPE: CompileOptions = { estimator: "expected", splitMinWeight: 0.001, escapeSplitMinWeight: 0.001, rouletteWeight: 0.1 };

/** A wafer with a pyramid rear into air, so light leaves through both faces. */
const TWO_FACED: StackSpec = {
  ...BENCH,
  front: { texture: { type: "planar" }, films: [{ material: "SiNx-Vogt2015-n1.91", thicknessNm: 75 }] },
  rear: { texture: { type: "upright-pyramids", baseUm: 10, facetAngleDeg: 54.74 }, films: [], exit: "air" },
};

describe("splitting on the way out", () => {
  const cases: [string, StackSpec, number, number, LightSide][] = [
    ["bench pyramids, 1150 nm, 0°", BENCH, 1150, 0, "front"],
    ["bench pyramids, 1100 nm, 40°", BENCH, 1100, 40, "front"],
    ["planar front, pyramid rear into air, 1120 nm, from the rear", TWO_FACED, 1120, 20, "rear"],
  ];
  for (const [label, stack, wl, theta, side] of cases) {
    it(`${label}: every channel and the pass history agree with the analog estimator`, () => {
      const a = run(stack, wl, theta, side, { estimator: "analog" }, 40000);
      const e = run(stack, wl, theta, side, ESCAPE, 8000);
      const z = (x: { mean: number; stderr: number }, y: { mean: number; stderr: number }): number =>
        x.stderr === 0 && y.stderr === 0 ? (x.mean === y.mean ? 0 : Infinity) : (x.mean - y.mean) / Math.hypot(x.stderr, y.stderr);
      for (const [i, ch] of a.cs.channels.entries()) {
        expect(Math.abs(z({ mean: e.s.mean[i]!, stderr: e.s.stderr[i]! }, { mean: a.s.mean[i]!, stderr: a.s.stderr[i]! })), ch).toBeLessThan(4);
      }
      expect(Math.abs(z(e.trap.entered, a.trap.entered))).toBeLessThan(4);
      for (let k = 0; k < 4; k++) expect(Math.abs(z(e.trap.passRemaining[k]!, a.trap.passRemaining[k]!)), `after pass ${k + 1}`).toBeLessThan(4);
      // each ray's power ends in exactly one place: the channel sums add up to the ray count
      const nC = e.cs.channels.length;
      let total = 0;
      for (let c = 0; c < nC; c++) total += e.t[2 * c];
      expect(Math.abs(total - 8000)).toBeLessThan(1e-9 * 8000);
      // and the split estimator's R error per ray is below the analog one's (it is an expected value)
      const exit = side === "rear" ? "transmissionTotal" : "reflectionTotal";
      expect(e.trap[exit].stderr * Math.sqrt(8000)).toBeLessThan(a.trap[exit].stderr * Math.sqrt(40000));
    });
  }
});
