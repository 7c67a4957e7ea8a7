import { describe, expect, it } from "vitest";
import { MaterialRegistry } from "../../src/materials/registry.js";
import { RandomStream, streamKey } from "../../src/random/stream.js";
import { compileStack } from "../../src/trace/compile.js";
import { traceBatch } from "../../src/trace/kernel.js";
import { createTally, summarizeTally } from "../../src/trace/tally.js";
import { summarizeTrapping } from "../../src/trace/trappingSummary.js";
import type { StackSpec } from "../../src/study/stackTypes.js";
import { BENCH, PLANAR, RANDOM } from "./replicaStacks.js";

const REPLICAS = 200;
const RAYS = 100;

/**
 * Spread of REPLICAS independent runs against the standard error each run reports (its RMS), for R
 * and A_absorber. The default estimator's contributions are independent from ray to ray (one
 * substream per ray), so the per-ray sample variance must describe the spread; the sampling error
 * of a standard deviation from 200 replicas is about 1/√(2·199) = 5 %, so ±15 % is a 3σ check.
 */
function spreadOverReported(stack: StackSpec, wavelengthNm: number, thetaDeg: number): { R: number; A: number } {
  const cs = compileStack(stack, MaterialRegistry.withBuiltins(), wavelengthNm);
  const ia = cs.channels.indexOf("A_absorber");
  const means: number[][] = [[], []];
  const se2 = [0, 0];
  for (let r = 0; r < REPLICAS; r++) {
    const t = createTally(cs);
    traceBatch(cs, thetaDeg, null, RAYS, new RandomStream(streamKey(5, "replica", wavelengthNm, r)), t);
    const s = summarizeTally(cs.channels, t);
    // R as a whole (R_first + R_escape), its error from the per-ray totals (src/trace/tallyLayout.ts).
    const rTotal = summarizeTrapping(t, cs.channels.length).reflectionTotal;
    means[0].push(rTotal.mean);
    se2[0] += rTotal.stderr ** 2;
    means[1].push(s.mean[ia]);
    se2[1] += s.stderr[ia] ** 2;
  }
  const ratio = (k: number): number => {
    const m = means[k].reduce((a, b) => a + b, 0) / REPLICAS;
    const spread = Math.sqrt(means[k].reduce((a, x) => a + (x - m) ** 2, 0) / (REPLICAS - 1));
    return spread / Math.sqrt(se2[k] / REPLICAS);
  };
  return { R: ratio(0), A: ratio(1) };
}

describe("reported standard errors match the spread of 200 independent replicas (±15 %)", () => {
  const cases: [string, StackSpec, number, number][] = [
    ["bench pyramids 1000 nm", BENCH, 1000, 0],
    ["bench pyramids 600 nm", BENCH, 600, 0],
    ["bench pyramids 1150 nm", BENCH, 1150, 0],
    ["planar SiNx 900 nm, 30°", PLANAR, 900, 30],
    ["random pyramids 1000 nm, 30°", RANDOM, 1000, 30],
  ];
  for (const [label, stack, wl, theta] of cases) {
    it(label, () => {
      const q = spreadOverReported(stack, wl, theta);
      process.stdout.write(`${label}: spread/reported R ${q.R.toFixed(3)}, A ${q.A.toFixed(3)}\n`);
      expect(Math.abs(q.R - 1)).toBeLessThan(0.15);
      expect(Math.abs(q.A - 1)).toBeLessThan(0.15);
    });
  }
});
