import { mkdtempSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { describe, expect, it } from "vitest";
import { matrixFromTallies } from "../../src/response/fromTallies.js";
import { writeResponseMatrix } from "../../src/response/matrixFile.js";
import { pairedStderrMatrix } from "../../src/response/pairedDifference.js";
import { pairedMoments } from "../../src/response/pairedMoments.js";
import type { ResponseMatrix } from "../../src/response/responseMatrix.js";
import { siteFromObject } from "../../src/site/site.js";
import { loadStudyFromDocument } from "../../src/study/load.js";
import { sweepPlanOf, workerSetupOf } from "../../src/sweep/runSweep.js";
import { tallyLength } from "../../src/sweep/tally.js";
import { syntheticWeather } from "../../src/weather/synthetic.js";
import { createMessageRunner } from "../../src/workers/messageRunner.js";
import { loadTracer } from "../../src/workers/tracerModule.js";
import { bifacialDifference, type BifacialDifference } from "../../src/yield/bifacialDifference.js";
import { bifacialYield } from "../../src/yield/bifacialYield.js";
import { yearContext, type YearContext } from "../../src/yield/yearContext.js";
import { prepareMatrix } from "../../src/yield/yieldRun.js";
import { runMain } from "../helpers/cli.js";

const THETA = [0, 40, 80];
const LAMBDA = [600, 1050];
const BATCHES = 16;

/**
 * The glass–glass example (configs/glass-glass-bifacial.study.json) on a small grid, with its rear
 * SiNx at 90 nm (A) and 100 nm (B): combos p0, p1 lit from the front, p0-rear, p1-rear from the rear.
 */
function glassGlassPair(raysPerBatch: number) {
  return loadStudyFromDocument(
    {
      name: "gg-pair",
      stack: {
        incidence: "air",
        layers: [{ name: "front glass", material: "glass", thicknessUm: 2000 }, { name: "front encapsulant", material: "EVA", thicknessUm: 450 }],
        front: { texture: { type: "upright-pyramids", baseUm: 6, facetAngleDeg: 54.74 }, films: [{ material: "SiNx", thicknessNm: 75 }] },
        absorber: { material: "Si", thicknessUm: 160 },
        rear: { texture: { type: "planar" }, films: [{ material: "SiNx", thicknessNm: 90 }], exit: "EVA" },
        rearLayers: [{ name: "rear encapsulant", material: "EVA", thicknessUm: 450 }, { name: "rear glass", material: "glass", thicknessUm: 2000 }],
        rearOuter: "air",
        boundary: "periodic",
      },
      illumination: "both",
      grid: { thetaDeg: THETA, phiDeg: "averaged", wavelengthNm: LAMBDA },
      // random launch points, as measured (16 batches would get Sobol' points by default)
      rays: { perPoint: BATCHES * raysPerBatch, batch: raysPerBatch, sampling: "random" },
      seed: 42,
      sweep: { "rear.films[0].thicknessNm": [90, 100] },
    },
    { baseDir: tmpdir() },
  );
}

/** The four matrices of one replica (seed), traced point by point as a sweep does: p0, p1, p0-rear, p1-rear. */
async function traceReplica(raysPerBatch: number) {
  const study = glassGlassPair(raysPerBatch);
  const tracer = await loadTracer();
  const plan = sweepPlanOf(study, tracer);
  const run = createMessageRunner(workerSetupOf(study), tracer);
  const nL = LAMBDA.length, nT = THETA.length;
  return (seed: number): ResponseMatrix[] => {
    const tallies = new Map<number, Float64Array>();
    plan.combos.forEach((c, combo) => {
      const len = tallyLength(c.channels.length);
      THETA.forEach((thetaDeg, it) => LAMBDA.forEach((wavelengthNm, il) => {
        const out = run({ items: [{ combo, it, ip: 0, il, thetaDeg, phiDeg: null, wavelengthNm, firstBatch: 0, batchRays: Array(BATCHES).fill(raysPerBatch), seed }] });
        const acc = new Float64Array(len);
        for (let b = 0; b < BATCHES; b++) for (let i = 0; i < len; i++) acc[i] += out[b * len + i];
        tallies.set((combo * nT + it) * nL + il, acc);
      }));
    });
    return plan.combos.map((_, c) => matrixFromTallies(plan, c, (p) => tallies.get(p), false));
  };
}

const site = siteFromObject({ name: "Pair Flats", latitudeDeg: 48.7, longitudeDeg: 9.6, elevationM: 400, utcOffsetHours: 1, albedo: 0.25, monthlyClearness: Array(12).fill(0.45) }, "pair.site.json");
const plane = { tiltDeg: 30, azimuthDeg: 180, textureRotationDeg: 0 };

/**
 * The synthetic year thinned to one day in eight (46 days, every season): the yields' node weights
 * stay a year's mix of sun angles, sky and ground light, and the yields cost an eighth.
 */
function thinnedYear(): YearContext {
  const full = yearContext(site, syntheticWeather(site, 2027, 7));
  const keep: number[] = [];
  for (let h = 0; h < full.nHours; h++) if (Math.floor(h / 24) % 8 === 0) keep.push(h);
  const set = new Set(keep);
  const take = <T extends Float64Array | Int8Array>(x: T): T => x.filter((_, i) => set.has(i)) as T;
  return {
    ...full, nHours: keep.length, hourStartUtcMs: take(full.hourStartUtcMs), zenithDeg: take(full.zenithDeg), azimuthDeg: take(full.azimuthDeg),
    e0nWm2: take(full.e0nWm2), month: take(full.month), ghiWm2: take(full.ghiWm2), dniWm2: take(full.dniWm2), dhiWm2: take(full.dhiWm2), albedo: take(full.albedo),
  };
}

/** Bifacial A − B of one replica in rows at 6 m pitch, paired (pairing groups) and as if independent. */
function replicaDifference(ms: ResponseMatrix[], ctx: YearContext, pitchM: number | null): BifacialDifference {
  const [fA, fB, rA, rB] = ms.map((m, i) => prepareMatrix(m, `m${i}`));
  const mount = { slantLengthM: 2.2, centreHeightM: 1.2, pitchM };
  const a = bifacialYield(ctx, plane, mount, fA!, rA!, "perez");
  const b = bifacialYield(ctx, plane, mount, fB!, rB!, "perez");
  const front = pairedMoments(ms[0]!, ms[1]!, "A_absorber");
  const rear = pairedMoments(ms[2]!, ms[3]!, "A_absorber");
  if (typeof front === "string" || typeof rear === "string") throw new Error(`not paired: ${String(front)} / ${String(rear)}`);
  return bifacialDifference(a, b, { front, rear, frontWeights: fA!.tables.weights, rearWeights: rA!.tables.weights });
}

const mean = (xs: number[]): number => xs.reduce((s, x) => s + x, 0) / xs.length;
const sd = (xs: number[]): number => {
  const m = mean(xs);
  return Math.sqrt(xs.reduce((s, x) => s + (x - m) ** 2, 0) / (xs.length - 1));
};
const rms = (xs: number[]): number => Math.sqrt(mean(xs.map((x) => x * x)));
/** Kurtosis E(x − m)⁴/σ⁴ of a sample (3 for a normal distribution). */
const kurtosis = (xs: number[]): number => {
  const m = mean(xs), s = sd(xs);
  return mean(xs.map((x) => (x - m) ** 4)) / s ** 4;
};

const KEYS = ["front", "rear", "total", "gainPts", "benefitPct"] as const;

describe("paired errors of a bifacial comparison (front, rear, total, gain)", () => {
  it("rear SiNx 90 vs 100 nm, glass–glass in rows: 60 replica differences spread as the paired errors say, well below the independent ones", async () => {
    const trace = await traceReplica(8);
    const ctx = thinnedYear();
    const R = 60;
    const runs = KEYS.map(() => ({ delta: [] as number[], paired: [] as number[], independent: [] as number[] }));
    for (let r = 0; r < R; r++) {
      const d = replicaDifference(trace(5000 + r), ctx, 6);
      expect(d.errorKind).toBe("paired");
      KEYS.forEach((k, ik) => {
        runs[ik]!.delta.push(d[k].delta);
        runs[ik]!.paired.push(d[k].stdErr);
        runs[ik]!.independent.push(d[k].independentStdErr);
      });
    }
    KEYS.forEach((k, ik) => {
      const x = runs[ik]!;
      const ratio = sd(x.delta) / rms(x.paired);
      const gain = rms(x.independent) / rms(x.paired);
      // Standard error of a sample standard deviation relative to σ: √((κ − 1)/(4R)) for kurtosis κ
      // (large-sample variance of s², any mathematical statistics text; from memory).
      const seRatio = Math.sqrt((kurtosis(x.delta) - 1) / (4 * R));
      process.stdout.write(`bifacial ${k}: replica spread / reported paired SE = ${ratio.toFixed(3)} (± ${seRatio.toFixed(3)}), independent / paired SE = ${gain.toFixed(2)}\n`);
      expect(Math.abs(ratio - 1) / seRatio).toBeLessThan(4);
      // Issue 10 goal: the replica spread confirms the reported paired error within ±20 % — for every
      // quantity but the front charge, whose difference here is a rare event (front light meets the
      // changed rear film only at 1050 nm, where few paths part): its heavy tails (κ ≈ 5–300 per
      // point) put ±20 % beyond what 60 replicas resolve, so it gets the |z| < 4 check alone.
      if (k !== "front") expect(Math.abs(ratio - 1)).toBeLessThan(0.2);
      // Common random numbers pay: the independence assumption overstates the error.
      expect(gain).toBeGreaterThan(1.5);
    });
  }, 120_000);

  it("the paired front and rear errors equal the yield of the paired-error matrix (pairedStderrMatrix), in rows and for an isolated row", async () => {
    const ms = (await traceReplica(8))(77);
    const ctx = thinnedYear();
    const paired = [pairedStderrMatrix(ms[0]!, ms[1]!, "A_absorber")!, pairedStderrMatrix(ms[2]!, ms[3]!, "A_absorber")!];
    for (const pitchM of [6, null]) {
      const d = replicaDifference(ms, ctx, pitchM);
      // Two routes to Var(ΔQ) = Σ W² Var(a − b): moments propagated through the node weights here,
      // the yield's own linear error propagation of a matrix holding the paired errors there.
      const y = bifacialYield(ctx, plane, { slantLengthM: 2.2, centreHeightM: 1.2, pitchM }, prepareMatrix(paired[0]!, "front a−b"), prepareMatrix(paired[1]!, "rear a−b"), "perez");
      expect(d.front.stdErr).toBeCloseTo(y.front.chargeStdErrAhM2, 6);
      expect(d.rear.stdErr).toBeCloseTo(y.rear.chargeStdErrAhM2, 6);
      expect(d.total.stdErr).toBeCloseTo(Math.hypot(y.front.chargeStdErrAhM2, y.rear.chargeStdErrAhM2), 6);
      expect(y.front.model).toBe(pitchM === null ? "transposition" : "view-factors");
    }
  }, 60_000);

  it("compare --rear-matrix on sweep matrices reports paired errors of the total, gain and benefit, with the independent ones beside them", async () => {
    const ms = (await traceReplica(8))(91);
    const dir = mkdtempSync(join(tmpdir(), "lightfold-paired-bifacial-"));
    const files = ["a", "b", "a-rear", "b-rear"].map((n, i) => {
      const path = join(dir, `${n}.matrix.json`);
      writeResponseMatrix(path, ms[i]!);
      return path;
    });
    const args = ["compare", "--matrix", files[0]!, "--matrix", files[1]!, "--rear-matrix", files[2]!, "--rear-matrix", files[3]!, "--site", "configs/sites/saltmere-plain.site.json", "--tilt", "30", "--pitch", "6", "--height", "1.2", "--module-width", "2.2"];
    const res = await runMain(...args, "--json");
    expect(res.code).toBe(0);
    const doc = JSON.parse(res.out);
    expect(doc.pairing).toEqual({ errorKind: "paired" });
    const row = doc.rows[0];
    expect(row.benefitErrorKind).toBe("paired");
    expect(row.benefitStdErrPct).toBeLessThan(row.benefitIndependentStdErrPct / 1.5);
    const t = row.differences.total, g = row.differences.bifacialGain;
    expect(t.stdErrAhM2).toBeLessThan(t.independentStdErrAhM2 / 1.5);
    expect(g.stdErrPts).toBeLessThan(g.independentStdErrPts / 1.5);
    expect(t.deltaAhM2).toBeCloseTo(row.chargeAAhM2 - row.chargeBAhM2, 1);
    // the total's paired variance is the sum of the faces' (front and rear on separate streams)
    expect(t.stdErrAhM2).toBeCloseTo(Math.hypot(row.differences.front.stdErrAhM2, row.differences.rear.stdErrAhM2), 1);
    const text = await runMain(...args);
    expect(text.out).toMatch(/± = paired Monte Carlo standard error/);
    expect(text.out).toMatch(/as if A and B were independent: A − B ± \d+; Δgain ± [\d.]+; benefit ± [\d.]+/);
  }, 60_000);
});

