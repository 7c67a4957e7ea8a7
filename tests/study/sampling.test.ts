import { describe, expect, it } from "vitest";
import { loadStudyFromDocument } from "../../src/study/load.js";
import { formatStudySummary, summarizeStudy } from "../../src/study/summary.js";
import { withSampling } from "../../src/study/rays.js";
import { InputError } from "../../src/util/errors.js";
import { baseDoc } from "./baseDoc.js";

const load = (rays: Record<string, unknown>) => {
  const doc = baseDoc();
  doc.rays = rays;
  return loadStudyFromDocument(doc, { baseDir: "." });
};

describe('rays.sampling ("random" | "sobol")', () => {
  it("is unset by default and for random, so the study hash of a random-sampling study is unchanged", () => {
    const plain = load({ perPoint: 1000, batch: 100 });
    const random = load({ perPoint: 1000, batch: 100, sampling: "random" });
    expect(plain.combos[0].study.rays.sampling).toBeUndefined();
    expect(random.combos[0].study.rays.sampling).toBeUndefined();
    expect(random.hash).toBe(plain.hash);
    const sobol = load({ perPoint: 1000, batch: 100, sampling: "sobol" });
    expect(sobol.combos[0].study.rays.sampling).toBe("sobol");
    expect(sobol.hash).not.toBe(plain.hash);
  });

  it("refuses Sobol' sampling with fewer than 8 batches per point (too few replicas for an error)", () => {
    expect(() => load({ perPoint: 700, batch: 100, sampling: "sobol" })).toThrow(InputError);
    expect(() => load({ perPoint: 700, batch: 100, sampling: "sobol" })).toThrow(/rays\.perPoint: Sobol' sampling .* at least 8 batches per point, got 700 rays in batches of 100 \(7 batch\(es\)\)/);
    expect(() => load({ targetStdErr: 0.01, channels: ["A_absorber"], maxPerPoint: 500, batch: 100, sampling: "sobol" })).toThrow(/rays\.maxPerPoint: Sobol' sampling/);
    expect(() => load({ targetStdErr: 0.01, channels: ["A_absorber"], maxPerPoint: 5000, minPerPoint: 400, batch: 100, sampling: "sobol" })).toThrow(/rays\.minPerPoint: Sobol' sampling/);
    expect(() => load({ perPoint: 700, batch: 100, sampling: "quasi" })).toThrow(/sampling/);
  });

  it("starts a target-error point with one batch per replica group (16) under Sobol' sampling", () => {
    const rays = load({ targetStdErr: 0.01, channels: ["A_absorber"], maxPerPoint: 5000, batch: 100, sampling: "sobol" }).combos[0].study.rays;
    expect(rays.mode === "target" && rays.minPerPoint).toBe(1600);
    const plain = load({ targetStdErr: 0.01, channels: ["A_absorber"], maxPerPoint: 5000, batch: 100 }).combos[0].study.rays;
    expect(plain.mode === "target" && plain.minPerPoint).toBe(200);
  });

  it("is named in the check summary when it is Sobol', and suggested where a point has 16+ batches", () => {
    const text = (rays: Record<string, unknown>): string => {
      const l = load(rays);
      return formatStudySummary(l, summarizeStudy(l)).join("\n");
    };
    expect(text({ perPoint: 1600, batch: 100, sampling: "sobol" })).toMatch(/sampling +Sobol' launch points .* 16 replica groups/);
    // random sampling with 16 batches per point: the summary suggests Sobol' points; with 4 it does not
    expect(text({ perPoint: 1600, batch: 100 })).toMatch(/sampling +random launch points; with 16\+ batches per point "sampling": "sobol"/);
    expect(text({ perPoint: 400, batch: 100 })).not.toMatch(/Sobol|sobol/);
  });

  it("withSampling (sweep --sampling) switches a plan the way the study file would, defaults included", () => {
    const fixed = load({ perPoint: 1600, batch: 100 }).combos[0].study.rays;
    expect(withSampling(fixed, "sobol", "rays")).toEqual({ mode: "fixed", perPoint: 1600, batch: 100, sampling: "sobol" });
    expect(withSampling(withSampling(fixed, "sobol", "rays"), "random", "rays")).toEqual(fixed);
    const target = load({ targetStdErr: 0.01, channels: ["A_absorber"], maxPerPoint: 5000, batch: 100 }).combos[0].study.rays;
    const sobol = withSampling(target, "sobol", "rays");
    expect(sobol.mode === "target" && sobol.minPerPoint).toBe(1600);
    expect(withSampling(sobol, "random", "rays")).toEqual(target);
    expect(() => withSampling(load({ perPoint: 400, batch: 100 }).combos[0].study.rays, "sobol", "rays")).toThrow(/at least 8 batches/);
  });
});
