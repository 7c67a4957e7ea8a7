import { describe, expect, it } from "vitest";
import { loadStudyFromDocument } from "../../src/study/load.js";
import { formatStudySummary, summarizeStudy } from "../../src/study/summary.js";
import { defaultSampling, parseRays } from "../../src/study/rays.js";
import { validatePlan } from "../../src/sweep/planCheck.js";
import { InputError } from "../../src/util/errors.js";
import { baseDoc } from "./baseDoc.js";

const load = (rays: Record<string, unknown>) => {
  const doc = baseDoc();
  doc.rays = rays;
  return loadStudyFromDocument(doc, { baseDir: "." });
};
const target = { targetStdErr: 0.01, channels: ["A_absorber"], maxPerPoint: 5000, batch: 100 };

describe('rays.sampling ("random" | "sobol")', () => {
  it("is Sobol' by default where every point is traced in 16+ batches (one per replica group), random below", () => {
    // Fixed rays: ⌈perPoint/batch⌉ batches; 1501 rays in batches of 100 are 16 batches (the last of 1 ray).
    expect(defaultSampling({ perPoint: 1500, batch: 100 })).toBe("random");
    expect(defaultSampling({ perPoint: 1501, batch: 100 })).toBe("sobol");
    expect(defaultSampling({ perPoint: 1600, batch: 100 })).toBe("sobol");
    expect(load({ perPoint: 1500, batch: 100 }).combos[0].study.rays.sampling).toBeUndefined();
    expect(load({ perPoint: 1600, batch: 100 }).combos[0].study.rays).toEqual({ mode: "fixed", perPoint: 1600, batch: 100, sampling: "sobol" });
    // Target error: no point stops before minPerPoint, so ⌈minPerPoint/batch⌉ decides; without
    // minPerPoint the first look comes after two batches, so the study stays random.
    expect(load({ ...target, minPerPoint: 1500 }).combos[0].study.rays.sampling).toBeUndefined();
    expect(load({ ...target, minPerPoint: 1600 }).combos[0].study.rays).toMatchObject({ mode: "target", minPerPoint: 1600, sampling: "sobol" });
    expect(load(target).combos[0].study.rays).toMatchObject({ mode: "target", minPerPoint: 200 });
    expect(load(target).combos[0].study.rays.sampling).toBeUndefined();
  });

  it('"random" opts out; random stays unset, so its study hash is that of a study without the field', () => {
    const plain = load({ perPoint: 1000, batch: 100 });
    const random = load({ perPoint: 1000, batch: 100, sampling: "random" });
    expect(plain.combos[0].study.rays.sampling).toBeUndefined();
    expect(random.hash).toBe(plain.hash);
    // 16 batches: the default is Sobol' (the same study, and hash, as "sobol" written out) ...
    const byDefault = load({ perPoint: 1600, batch: 100 });
    expect(byDefault.hash).toBe(load({ perPoint: 1600, batch: 100, sampling: "sobol" }).hash);
    // ... and "random" keeps independent launch points, under another hash (journals never mix).
    const optOut = load({ perPoint: 1600, batch: 100, sampling: "random" });
    expect(optOut.combos[0].study.rays.sampling).toBeUndefined();
    expect(optOut.hash).not.toBe(byDefault.hash);
    expect(load({ ...target, minPerPoint: 1600, sampling: "random" }).combos[0].study.rays.sampling).toBeUndefined();
  });

  it("refuses Sobol' sampling with fewer than 8 batches per point (too few replicas for an error)", () => {
    expect(load({ perPoint: 800, batch: 100, sampling: "sobol" }).combos[0].study.rays.sampling).toBe("sobol");
    expect(() => load({ perPoint: 700, batch: 100, sampling: "sobol" })).toThrow(InputError);
    expect(() => load({ perPoint: 700, batch: 100, sampling: "sobol" })).toThrow(/rays\.perPoint: Sobol' sampling .* at least 8 batches per point, got 700 rays in batches of 100 \(7 batch\(es\)\)/);
    expect(() => load({ ...target, maxPerPoint: 500, sampling: "sobol" })).toThrow(/rays\.maxPerPoint: Sobol' sampling/);
    expect(() => load({ ...target, minPerPoint: 400, sampling: "sobol" })).toThrow(/rays\.minPerPoint: Sobol' sampling/);
    expect(() => load({ perPoint: 700, batch: 100, sampling: "quasi" })).toThrow(/sampling/);
  });

  it("starts a target-error point with one batch per replica group (16) under explicit Sobol' sampling", () => {
    const rays = load({ ...target, sampling: "sobol" }).combos[0].study.rays;
    expect(rays.mode === "target" && rays.minPerPoint).toBe(1600);
  });

  it("is named in the check summary when it is Sobol', with why, and when random opts out of the default", () => {
    const text = (rays: Record<string, unknown>): string => {
      const l = load(rays);
      return formatStudySummary(l, summarizeStudy(l)).join("\n");
    };
    expect(text({ perPoint: 1600, batch: 100 })).toMatch(/sampling +Sobol' launch points \(randomized quasi-Monte Carlo, the default with 16\+ batches per point\); standard errors from 16 replica groups/);
    expect(text({ perPoint: 800, batch: 100, sampling: "sobol" })).toMatch(/sampling +Sobol' launch points \(randomized quasi-Monte Carlo, "sampling": "sobol"\)/);
    expect(text({ perPoint: 1600, batch: 100, sampling: "random" })).toMatch(/sampling +random launch points, as the study asks/);
    // fewer than 16 batches: random by default, nothing to say
    expect(text({ perPoint: 1500, batch: 100 })).not.toMatch(/Sobol|sobol|sampling/);
  });

  it("a derived plan (sweep --sampling, --target-error, optimize) parsed from the section as written keeps a named sampling", () => {
    const asWritten = load({ perPoint: 1600, batch: 100 }).raysAsWritten;
    expect(asWritten).toEqual({ perPoint: 1600, batch: 100 });
    expect(parseRays({ ...asWritten, sampling: "random" }, "rays")).toEqual({ mode: "fixed", perPoint: 1600, batch: 100 });
    // the same rays in larger batches (8 per point) get the random default; named, Sobol' is kept
    expect(parseRays({ ...asWritten, batch: 200 }, "rays").sampling).toBeUndefined();
    expect(parseRays({ ...asWritten, batch: 200, sampling: "sobol" }, "rays").sampling).toBe("sobol");
    expect(() => parseRays({ ...asWritten, batch: 400, sampling: "sobol" }, "rays")).toThrow(/at least 8 batches/);
  });

  it("the plan read back from disk keeps the resolved sampling; a plan may name random", () => {
    const rays = load({ perPoint: 1600, batch: 100 }).combos[0].study.rays;
    const plan = (r: unknown) => ({
      studyName: "t", studyHash: "h", toolVersion: "0", buildId: "b", seed: 1,
      grid: { thetaDeg: [0], phiDeg: [0], phiMode: "list", wavelengthNm: [600] },
      rays: r, combos: [{ label: "base", values: {}, hash: "h", channels: ["R", "A"], absorberThicknessUm: 180 }],
      spectrum: "AM1.5G", baseDir: ".",
    });
    const where = { file: "partial.json", path: "plan" };
    expect(validatePlan(JSON.parse(JSON.stringify(plan(rays))), where).rays).toEqual(rays);
    expect(validatePlan(plan({ mode: "fixed", perPoint: 1600, batch: 100, sampling: "random" }), where).rays).toEqual({ mode: "fixed", perPoint: 1600, batch: 100 });
    expect(() => validatePlan(plan({ mode: "fixed", perPoint: 1600, batch: 100, sampling: "lattice" }), where)).toThrow(/plan\.rays\.sampling/);
  });
});
