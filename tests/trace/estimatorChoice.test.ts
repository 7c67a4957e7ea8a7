import { describe, expect, it } from "vitest";
import { join } from "node:path";
import { loadStudy } from "../../src/study/load.js";
import { compileStack } from "../../src/trace/compile.js";
import { Setting } from "../../src/trace/compiledStack.js";
import { chooseEstimator, POLARIZATION_SPLIT_DEG, QMC_TAIL_ROULETTE_WEIGHT, DEEP_TAIL_ROULETTE_WEIGHT, DEFAULT_SPLIT_MIN_WEIGHT, GRAZING_ANALOG_DEG, OPAQUE_ROULETTE_WEIGHT, TAIL_ROULETTE_WEIGHT, TAIL_SPLIT_MIN_WEIGHT } from "../../src/trace/estimatorChoice.js";
import { estimatorAt, traceBatch } from "../../src/trace/kernel.js";
import { RandomStream, streamKey } from "../../src/random/stream.js";
import { createTally, summarizeTally } from "../../src/trace/tally.js";
import { constantMaterial, expectWithin4Sigma, fresnelRsRp, registryWith, runTrace, stackOf } from "./helpers.js";

// The per-wavelength default (src/trace/estimatorChoice.ts); its merit against the analog estimator
// at every demo point is measured by `npm run bench` (part "merit"), never asserted in a test.
describe("default estimator per wavelength", () => {
  it("splits the way in and roulettes late where one pass takes most of the light", () => {
    expect(chooseEstimator(2, false, true)).toEqual({ estimator: "expected", rouletteWeight: OPAQUE_ROULETTE_WEIGHT, splitMinWeight: DEFAULT_SPLIT_MIN_WEIGHT, analogFromThetaDeg: Infinity, escapeSplitMinWeight: 0, polarizationSplitFromThetaDeg: Infinity });
  });
  it("in the tail: split where αW ≥ 0.1; in the deep tail early roulette, splitting only at a planar front, analog at grazing incidence on a texture; analog in a module", () => {
    expect(chooseEstimator(0.15, false, false)).toEqual({ estimator: "expected", rouletteWeight: TAIL_ROULETTE_WEIGHT, splitMinWeight: TAIL_SPLIT_MIN_WEIGHT, analogFromThetaDeg: Infinity, escapeSplitMinWeight: 0, polarizationSplitFromThetaDeg: Infinity });
    expect(chooseEstimator(0.05, false, false)).toEqual({ estimator: "expected", rouletteWeight: DEEP_TAIL_ROULETTE_WEIGHT, splitMinWeight: 0, analogFromThetaDeg: GRAZING_ANALOG_DEG, escapeSplitMinWeight: 0, polarizationSplitFromThetaDeg: Infinity });
    expect(chooseEstimator(0.05, true, false)).toEqual({ estimator: "expected", rouletteWeight: DEEP_TAIL_ROULETTE_WEIGHT, splitMinWeight: DEFAULT_SPLIT_MIN_WEIGHT, analogFromThetaDeg: Infinity, escapeSplitMinWeight: 0, polarizationSplitFromThetaDeg: Infinity });
    expect(chooseEstimator(0.05, false, true).estimator).toBe("analog");
  });
  it("unpolarised oblique light on an opaque bare planar front goes as its s and p halves: its reflectance is (R_s + R_p)/2 for every ray", () => {
    expect(chooseEstimator(2, true, false).polarizationSplitFromThetaDeg).toBe(POLARIZATION_SPLIT_DEG);
    // not on a texture, in a module, or where light reaches the rear
    for (const c of [chooseEstimator(2, false, false), chooseEstimator(2, true, true), chooseEstimator(0.3, true, false)]) expect(c.polarizationSplitFromThetaDeg).toBe(Infinity);
    // n = 3.5, k = 0.003 (lossless at the interface, k ≤ 10⁻³ n: the Fresnel formula itself), 1 mm: αW ≈ 38
    const mat = constantMaterial("opaque-planar", 3.5, 0.003);
    const registry = registryWith(mat);
    const stack = stackOf({ absorber: { material: mat.name, thicknessUm: 1000 }, rear: { ideal: { kind: "mirror", reflectance: 0.9 } } });
    const exact = (thetaDeg: number): number => {
      const f = fresnelRsRp(1, 3.5, Math.cos((thetaDeg * Math.PI) / 180));
      return (f.Rs + f.Rp) / 2; // unpolarised light: the mean of the two (Hecht, Optics, ch. 4; from memory)
    };
    // From 60° on: every ray reflects (R_s + R_p)/2 of its power (no spread at all).
    const halves = runTrace(stack, registry, { wavelengthNm: 1000, thetaDeg: 80, nRays: 400 }).total("R");
    expect(Math.abs(halves.mean - exact(80))).toBeLessThan(1e-12);
    expect(halves.se).toBeLessThan(1e-12);
    // Below it each ray keeps a random line of polarisation ψ: R_s cos²ψ + R_p sin²ψ, unbiased, with a spread.
    const random = runTrace(stack, registry, { wavelengthNm: 1000, thetaDeg: 50, nRays: 4000 }).total("R");
    expect(random.se).toBeGreaterThan(1e-4);
    expectWithin4Sigma("50°, random line of polarisation, R", random, exact(50));
  });
  it("on a texture in the tail the split floor is 0.1 up to αW 0.2, then falls log-linearly to the opaque floor at αW 0.5", () => {
    const floor = (aw: number, plain = false): number => chooseEstimator(aw, plain, false).splitMinWeight;
    expect([floor(0.1), floor(0.2)]).toEqual([TAIL_SPLIT_MIN_WEIGHT, TAIL_SPLIT_MIN_WEIGHT]);
    // halfway between αW 0.2 and 0.5 the geometric mean of the two floors, 0.01
    expect(floor(0.35)).toBeCloseTo(Math.sqrt(TAIL_SPLIT_MIN_WEIGHT * DEFAULT_SPLIT_MIN_WEIGHT), 12);
    expect(floor(0.5 - 1e-9)).toBeCloseTo(DEFAULT_SPLIT_MIN_WEIGHT, 8);
    expect(floor(0.5)).toBe(DEFAULT_SPLIT_MIN_WEIGHT);
    const aws = [0.2, 0.25, 0.3, 0.35, 0.4, 0.45, 0.5];
    for (let i = 1; i < aws.length; i++) expect(floor(aws[i]!)).toBeLessThan(floor(aws[i - 1]!));
    // a planar front's reflected part just leaves: it splits at the opaque floor throughout the tail
    expect([floor(0.15, true), floor(0.3, true)]).toEqual([DEFAULT_SPLIT_MIN_WEIGHT, DEFAULT_SPLIT_MIN_WEIGHT]);
  });
  it("the tail's split floor keeps the estimate unbiased: random pyramids at 1075 nm agree with the analog estimator", () => {
    // independent runs, the difference judged by its combined standard error (sampling theory, |z| < 4)
    const rp = loadStudy(join(import.meta.dirname, "../../configs/demo-random-pyramids.study.json"));
    const stack = rp.combos[0]!.study.stack;
    const opts = { wavelengthNm: 1075, thetaDeg: 10, phiDeg: null, nRays: 3000 };
    const dflt = runTrace(stack, rp.registry, { ...opts, seed: 11 });
    const analog = runTrace(stack, rp.registry, { ...opts, seed: 12, compile: { estimator: "analog" } });
    for (const [label, d, a] of [["R", dflt.total("R"), analog.total("R")], ["A_absorber", dflt.get("A_absorber"), analog.get("A_absorber")]] as const) {
      expectWithin4Sigma(`1075 nm, 10°, default − analog ${label}`, { mean: d.mean - a.mean, se: Math.hypot(d.se, a.se) }, 0);
    }
  });
  it("under Sobol' launch points the deep tail of a bare texture splits every way in and out, roulette 0.1", () => {
    expect(chooseEstimator(0.05, false, false, true)).toEqual({ estimator: "expected", rouletteWeight: QMC_TAIL_ROULETTE_WEIGHT, splitMinWeight: DEFAULT_SPLIT_MIN_WEIGHT, analogFromThetaDeg: GRAZING_ANALOG_DEG, escapeSplitMinWeight: DEFAULT_SPLIT_MIN_WEIGHT, polarizationSplitFromThetaDeg: Infinity });
    // not for a planar front, a module, or outside the deep tail
    expect(chooseEstimator(0.05, true, false, true).escapeSplitMinWeight).toBe(0);
    expect(chooseEstimator(0.05, false, true, true).estimator).toBe("analog");
    expect(chooseEstimator(0.3, false, false, true).escapeSplitMinWeight).toBe(0);
  });
  it("applies to the demo stacks: the glass–glass module is traced analog at 1150 nm, expected value at 800 nm", () => {
    const gg = loadStudy(join(import.meta.dirname, "../../configs/glass-glass-bifacial.study.json"));
    expect(compileStack(gg.combos[0]!.study, gg.registry, 1150).estimator).toBe("analog");
    expect(compileStack(gg.combos[0]!.study, gg.registry, 800).estimator).toBe("expected");
    const rp = loadStudy(join(import.meta.dirname, "../../configs/demo-random-pyramids.study.json"));
    const tail = compileStack(rp.combos[0]!.study, rp.registry, 1150);
    expect([tail.estimator, tail.estimatorSettings[Setting.ROULETTE_WEIGHT], tail.estimatorSettings[Setting.SPLIT_MIN_WEIGHT]]).toEqual(["expected", DEEP_TAIL_ROULETTE_WEIGHT, 0]);
    // 1075 nm: αW ≈ 0.13 in 180 µm Si, the first facet's reflection splits, the weaker ones after it are sampled
    const trap = compileStack(rp.combos[0]!.study, rp.registry, 1075);
    expect([trap.estimator, trap.estimatorSettings[Setting.ROULETTE_WEIGHT], trap.estimatorSettings[Setting.SPLIT_MIN_WEIGHT]]).toEqual(["expected", TAIL_ROULETTE_WEIGHT, TAIL_SPLIT_MIN_WEIGHT]);
    expect([estimatorAt(tail, 60), estimatorAt(tail, 70), estimatorAt(tail, 80)]).toEqual(["expected", "analog", "analog"]);
    // an explicit choice wins, at every angle
    expect(compileStack(gg.combos[0]!.study, gg.registry, 1150, { estimator: "expected" }).estimator).toBe("expected");
    expect(estimatorAt(compileStack(rp.combos[0]!.study, rp.registry, 1150, { estimator: "expected" }), 80)).toBe("expected");
  });
  it("a batch at grazing incidence in the tail runs analog: every ray's contribution is 0 or 1", () => {
    // all-or-nothing rays: Σc² = Σc per channel, so s² = n·m(1 − m)/(n − 1) exactly (sampling theory)
    const rp = loadStudy(join(import.meta.dirname, "../../configs/demo-random-pyramids.study.json"));
    const cs = compileStack(rp.combos[0]!.study, rp.registry, 1150);
    const allOrNothing = (thetaDeg: number): boolean => {
      const t = createTally(cs);
      const n = 400;
      traceBatch(cs, thetaDeg, null, n, new RandomStream(streamKey(3, "grazing", thetaDeg)), t);
      const s = summarizeTally(cs.channels, t);
      const i = cs.channels.indexOf("A_absorber");
      const m = s.mean[i]!;
      return Math.abs(s.stderr[i]! ** 2 - (m * (1 - m)) / (n - 1)) < 1e-12;
    };
    expect(allOrNothing(80)).toBe(true);
    expect(allOrNothing(40)).toBe(false);
  });
});
