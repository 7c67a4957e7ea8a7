import { describe, expect, it } from "vitest";
import { join } from "node:path";
import { loadStudy } from "../../src/study/load.js";
import { compileStack } from "../../src/trace/compile.js";
import { chooseEstimator, DEFAULT_SPLIT_MIN_WEIGHT, OPAQUE_ROULETTE_WEIGHT, TRAP_ROULETTE_WEIGHT } from "../../src/trace/estimatorChoice.js";

// The per-wavelength default (src/trace/estimatorChoice.ts); its merit against the analog estimator
// at every demo point is measured by `npm run bench` (part "merit"), never asserted in a test.
describe("default estimator per wavelength", () => {
  it("splits the way in and roulettes late where one pass takes most of the light", () => {
    expect(chooseEstimator(2, false, true)).toEqual({ estimator: "expected", rouletteWeight: OPAQUE_ROULETTE_WEIGHT, splitMinWeight: DEFAULT_SPLIT_MIN_WEIGHT });
  });
  it("in the trapping tail: early roulette, splitting only at a planar front, analog in a module", () => {
    expect(chooseEstimator(0.05, false, false)).toEqual({ estimator: "expected", rouletteWeight: TRAP_ROULETTE_WEIGHT, splitMinWeight: 0 });
    expect(chooseEstimator(0.05, true, false)).toEqual({ estimator: "expected", rouletteWeight: TRAP_ROULETTE_WEIGHT, splitMinWeight: DEFAULT_SPLIT_MIN_WEIGHT });
    expect(chooseEstimator(0.05, false, true).estimator).toBe("analog");
  });
  it("applies to the demo stacks: the glass–glass module is traced analog at 1150 nm, expected value at 800 nm", () => {
    const gg = loadStudy(join(import.meta.dirname, "../../configs/glass-glass-bifacial.study.json"));
    expect(compileStack(gg.combos[0]!.study, gg.registry, 1150).estimator).toBe("analog");
    expect(compileStack(gg.combos[0]!.study, gg.registry, 800).estimator).toBe("expected");
    const rp = loadStudy(join(import.meta.dirname, "../../configs/demo-random-pyramids.study.json"));
    const tail = compileStack(rp.combos[0]!.study, rp.registry, 1150);
    expect([tail.estimator, tail.rouletteWeight, tail.splitMinWeight]).toEqual(["expected", TRAP_ROULETTE_WEIGHT, 0]);
    // an explicit choice wins
    expect(compileStack(gg.combos[0]!.study, gg.registry, 1150, { estimator: "expected" }).estimator).toBe("expected");
  });
});
