import { tmpdir } from "node:os";
import { describe, expect, it } from "vitest";
import { matrixFromTallies } from "../../src/response/fromTallies.js";
import { pairedPointVariance, pairedStderrMatrix, pairedWeightedDifference } from "../../src/response/pairedDifference.js";
import { siteFromObject } from "../../src/site/site.js";
import { syntheticWeather } from "../../src/weather/synthetic.js";
import { pairedDeltaStdErr, textureBenefit } from "../../src/yield/compare.js";
import { pairedMoments } from "../../src/response/pairedMoments.js";
import { bestComboOf } from "../../src/weighting/runSummaries.js";
import type { RunCombo } from "../../src/sweep/runFiles.js";
import { yearContext } from "../../src/yield/yearContext.js";
import { prepareMatrix, yieldSweep } from "../../src/yield/yieldRun.js";
import type { ResponseMatrix } from "../../src/response/responseMatrix.js";
import { photocurrentWeights, spectrumFromSpec } from "../../src/spectrum/index.js";
import { loadStudyFromDocument } from "../../src/study/load.js";
import { sweepPlanOf, workerSetupOf } from "../../src/sweep/runSweep.js";
import { tallyLength } from "../../src/sweep/tally.js";
import { createMessageRunner } from "../../src/workers/messageRunner.js";
import { loadTracer } from "../../src/workers/tracerModule.js";

/** A matrix of one point and one channel with the given pairing groups (rays, means). */
function groupMatrix(rays: number[], means: number[]): ResponseMatrix {
  const n = rays.reduce((a, b) => a + b, 0);
  const mean = rays.reduce((a, r, g) => a + r * means[g], 0) / n;
  return {
    format: "lightfold.response", formatVersion: 1, toolVersion: "test", studyName: "t", studyHash: "h", seed: 1, combo: {},
    thetaDeg: [0], phiDeg: [0], phiMode: "list", wavelengthNm: [500], channels: ["A_absorber"],
    mean: Float64Array.of(mean), stderr: Float64Array.of(0), nRays: Float64Array.of(n), pathRatio: Float64Array.of(0),
    pairGroups: rays.length, groupMean: Float64Array.from(means), groupRays: Float64Array.from(rays),
  } as unknown as ResponseMatrix;
}

/**
 * The demo textured stack (configs/demo-random-pyramids.study.json) with SiNx 75 and 80 nm as a
 * two-combination sweep on a small grid (few wavelengths and small batches keep replicas cheap).
 * Random launch points unless asked: the cases below were measured with them (16+ batches per point
 * would get Sobol' points by default; the Sobol' case names them).
 */
function sinxStudy(thetaDeg: number[], wavelengthNm: number[], perPoint: number, batch: number, sampling: "random" | "sobol" = "random") {
  return loadStudyFromDocument(
    {
      name: "sinx-pair",
      stack: {
        front: { texture: { type: "random-pyramids", meanBaseUm: 5, sizeSpread: 0.3, count: 16, tileUm: 10, seed: 7 }, films: [{ material: "SiNx", thicknessNm: 75 }] },
        absorber: { material: "Si", thicknessUm: 180 },
        rear: { texture: { type: "planar" }, exit: "Ag" },
      },
      grid: { thetaDeg, phiDeg: "averaged", wavelengthNm },
      rays: { perPoint, batch, sampling },
      seed: 42,
      sweep: { "front.films[0].thicknessNm": [75, 80] },
    },
    { baseDir: tmpdir() },
  );
}

/**
 * Traces the two-combination study `replicas` times with independent seeds (seedBase + replica; A
 * and B with batches[0] and batches[1] batches of 30 rays per point, as a sweep traces them) and
 * compares the spread of the photocurrent difference with the paired error each replica reports;
 * also the independent-streams error against the paired one. `check` sees each replica's matrices.
 */
async function replicaDifferences(
  study: ReturnType<typeof sinxStudy>,
  replicas: number,
  label: string,
  o: { batches?: [number, number]; seedBase?: number; check?: (a: ResponseMatrix, b: ResponseMatrix) => void } = {},
): Promise<{ ratio: number; gain: number }> {
  const tracer = await loadTracer();
  const plan = sweepPlanOf(study, tracer);
  const run = createMessageRunner(workerSetupOf(study), tracer);
  const nL = plan.grid.wavelengthNm.length;
  const batches = o.batches ?? [16, 16];
  const w = photocurrentWeights(plan.grid.wavelengthNm, spectrumFromSpec("AM1.5G", tmpdir()));
  const deltas: number[] = [];
  const paired: number[] = [];
  const independent: number[] = [];
  for (let r = 0; r < replicas; r++) {
    const tallies = new Map<number, Float64Array>();
    for (let combo = 0; combo < 2; combo++) {
      const len = tallyLength(plan.combos[combo].channels.length);
      const nb = batches[combo]!;
      for (let il = 0; il < nL; il++) {
        const out = run({ items: [{ combo, it: 0, ip: 0, il, thetaDeg: 0, phiDeg: null, wavelengthNm: plan.grid.wavelengthNm[il], firstBatch: 0, batchRays: Array(nb).fill(30), seed: (o.seedBase ?? 1000) + r }] });
        // each batch's tally holds its rays in pairing group b mod 16 (src/sweep/tally.ts): summing folds them
        const acc = new Float64Array(len);
        for (let b = 0; b < nb; b++) for (let i = 0; i < len; i++) acc[i] += out[b * len + i];
        tallies.set(combo * nL + il, acc);
      }
    }
    const [a, b] = [0, 1].map((c) => matrixFromTallies(plan, c, (p) => tallies.get(p), false));
    o.check?.(a!, b!);
    const d = pairedWeightedDifference(a!, b!, "A_absorber", [0, 1, 2], w);
    deltas.push(d.delta);
    paired.push(d.pairedStderr);
    independent.push(d.independentStderr);
  }
  const mean = deltas.reduce((s, x) => s + x, 0) / deltas.length;
  const spread = Math.sqrt(deltas.reduce((s, x) => s + (x - mean) ** 2, 0) / (deltas.length - 1));
  const rms = (xs: number[]): number => Math.sqrt(xs.reduce((s, x) => s + x * x, 0) / xs.length);
  const ratio = spread / rms(paired);
  const gain = rms(independent) / rms(paired);
  process.stdout.write(`${label}: spread ${spread.toFixed(5)}, reported ${rms(paired).toFixed(5)} (ratio ${ratio.toFixed(3)}), independent ${rms(independent).toFixed(5)} (gain ${gain.toFixed(2)})\n`);
  return { ratio, gain };
}

describe("paired standard error of a difference", () => {
  it("equal groups give the textbook variance of a mean of K replicas, s²/K", () => {
    // Differences 1, 2, 3, 6: mean 3, s² = (4 + 1 + 0 + 9)/3 = 14/3, variance of the mean 14/12
    // (sample variance of K independent replicas divided by K; any statistics textbook).
    const a = groupMatrix([10, 10, 10, 10], [1, 2, 3, 6]);
    const b = groupMatrix([10, 10, 10, 10], [0, 0, 0, 0]);
    expect(pairedPointVariance(a, 0, b, 0, 0)).toBeCloseTo(14 / 12, 12);
    // A common offset of every group cancels in the pairing.
    const a2 = groupMatrix([10, 10, 10, 10], [1.5, 2.5, 3.5, 6.5]);
    const b2 = groupMatrix([10, 10, 10, 10], [0.5, 0.5, 0.5, 0.5]);
    expect(pairedPointVariance(a2, 0, b2, 0, 0)).toBeCloseTo(14 / 12, 12);
  });

  it("is unavailable with fewer than two groups with rays; groups of other sizes in B still pair", () => {
    expect(pairedPointVariance(groupMatrix([10, 0], [1, 0]), 0, groupMatrix([10, 0], [0, 0]), 0, 0)).toBeNaN();
    expect(pairedPointVariance(groupMatrix([10, 10], [1, 2]), 0, groupMatrix([10, 0], [0, 0]), 0, 0)).toBeNaN();
    // B constant: only A's variance is left, s²/K = 0.5/2 of the two replicas 1 and 2 (any statistics
    // textbook), whatever B's group sizes
    expect(pairedPointVariance(groupMatrix([10, 10], [1, 2]), 0, groupMatrix([10, 9], [0, 0]), 0, 0)).toBeCloseTo(0.25, 12);
  });

  it("the sweep summary's best combination says which error it quotes: paired, or independent with the reason", () => {
    const am15 = spectrumFromSpec("AM1.5G", tmpdir());
    const combo = (label: string, jsc: number): RunCombo => ({ label, values: {}, studyHash: label, matrix: `${label}/matrix.json`, rays: 40, jscFirstDirection: { thetaDeg: 0, phiDeg: 0, jscMaCm2: jsc, jscStderrMaCm2: 0.1 } });
    // two wavelengths (500, 600 nm) at one direction, the same groups at both
    const twoWavelengths = (rays: number[], means: number[]): ResponseMatrix => {
      const m = groupMatrix(rays, means);
      const dup = (x: Float64Array): Float64Array => Float64Array.from([...x, ...x]);
      return { ...m, wavelengthNm: [500, 600], mean: dup(m.mean), stderr: dup(m.stderr), nRays: dup(m.nRays), pathRatio: dup(m.pathRatio), groupMean: dup(m.groupMean!), groupRays: dup(m.groupRays!) };
    };
    const a = twoWavelengths([10, 10, 10, 10], [0.9, 0.8, 0.85, 0.95]);
    const b = twoWavelengths([10, 10, 10, 10], [0.88, 0.79, 0.84, 0.92]);
    const paired = bestComboOf([combo("p0", 2), combo("p1", 1)], [a, b], am15)!;
    expect(paired.errorKind).toBe("paired");
    expect(paired.pairingReason).toBeUndefined();
    // groups of different sizes (target-error rays stopping at different batches) still pair
    const c = twoWavelengths([10, 10, 10, 5], [0.88, 0.79, 0.84, 0.92]);
    expect(bestComboOf([combo("p0", 2), combo("p1", 1)], [a, c], am15)!.errorKind).toBe("paired");
    // a matrix without pairing groups (written before lightfold kept them): independent, and why
    const { pairGroups: _g, groupMean: _m, groupRays: _r, ...old } = b;
    const unpaired = bestComboOf([combo("p0", 2), combo("p1", 1)], [a, old as ResponseMatrix], am15)!;
    expect(unpaired.errorKind).toBe("independent");
    expect(unpaired.deltaStderrMaCm2).toBeNaN();
    expect(unpaired.pairingReason).toMatch(/^p1 has no pairing groups/);
    // one group with rays is no replica: refused by name and point
    const one = twoWavelengths([40, 0, 0, 0], [0.88, 0, 0, 0]);
    expect(bestComboOf([combo("p0", 2), combo("p1", 1)], [a, one], am15)!.pairingReason).toMatch(/fewer than two pairing groups of p1 hold rays at θ 0°, φ 0°, λ 500 nm/);
  });

  it("compare's yearly benefit gets the paired error from the pairing groups, below the quadrature figure", async () => {
    const study = sinxStudy([0, 30, 60, 80], [450, 750, 1000], 320, 20);
    const tracer = await loadTracer();
    const plan = sweepPlanOf(study, tracer);
    const run = createMessageRunner(workerSetupOf(study), tracer);
    const g = plan.grid;
    const tallies = new Map<number, Float64Array>();
    for (let combo = 0; combo < 2; combo++) {
      const len = tallyLength(plan.combos[combo].channels.length);
      g.thetaDeg.forEach((thetaDeg, it) => g.wavelengthNm.forEach((wavelengthNm, il) => {
        const out = run({ items: [{ combo, it, ip: 0, il, thetaDeg, phiDeg: null, wavelengthNm, firstBatch: 0, batchRays: Array(16).fill(20) }] });
        const acc = new Float64Array(len);
        for (let b = 0; b < 16; b++) for (let i = 0; i < len; i++) acc[i] += out[b * len + i];
        tallies.set((combo * g.thetaDeg.length + it) * g.wavelengthNm.length + il, acc);
      }));
    }
    const [a, b] = [0, 1].map((c) => matrixFromTallies(plan, c, (p) => tallies.get(p), false));
    const paired = pairedStderrMatrix(a, b, "A_absorber");
    expect(paired).toBeDefined();
    const site = siteFromObject({ name: "Pair Flats", latitudeDeg: 48.7, longitudeDeg: 9.6, elevationM: 400, utcOffsetHours: 1, albedo: 0.2, monthlyClearness: Array(12).fill(0.45) }, "pair.site.json");
    const ctx = yearContext(site, syntheticWeather(site, 2027, 7));
    const plane = [{ tiltDeg: 35, azimuthDeg: 180, textureRotationDeg: 0 }];
    const [ya] = yieldSweep(ctx, prepareMatrix(a, "a"), plane, "perez");
    const [yb] = yieldSweep(ctx, prepareMatrix(b, "b"), plane, "perez");
    const [yd] = yieldSweep(ctx, prepareMatrix(paired as ResponseMatrix, "a−b"), plane, "perez");
    // compare's route: the group moments through both yields' node weights, the same figure
    const moments = pairedMoments(a, b, "A_absorber");
    if (typeof moments === "string") throw new Error(moments);
    expect(pairedDeltaStdErr(ya!, yb!, prepareMatrix(a, "a").tables.weights, moments)).toBeCloseTo(yd!.chargeStdErrAhM2, 6);
    const benefit = textureBenefit(ya!, yb!, yd!.chargeStdErrAhM2);
    process.stdout.write(`paired yearly benefit: ${benefit.benefitPct.toFixed(3)} ± ${benefit.benefitStdErrPct.toFixed(3)} % (independent ± ${benefit.independentStdErrPct.toFixed(3)})\n`);
    expect(benefit.errorKind).toBe("paired");
    expect(benefit.benefitStdErrPct).toBeGreaterThan(0);
    expect(benefit.benefitStdErrPct).toBeLessThan(benefit.independentStdErrPct / 1.5);
    // Grids that differ give no paired matrix (compare falls back to the quadrature figure).
    expect(pairedStderrMatrix(a, { ...b, wavelengthNm: [450, 750, 1001] }, "A_absorber")).toBeUndefined();
  }, 60_000);

  it("SiNx 75 vs 80 nm on random pyramids: 100 replica differences of Jsc spread as the paired error says", async () => {
    // 16 batches of 30 rays per point = 16 pairing groups.
    const { ratio, gain } = await replicaDifferences(sinxStudy([0], [450, 750, 1000], 480, 30), 100, "paired ΔJsc replicas");
    // Issue goal: the replica spread confirms the reported paired error within ±20 %.
    expect(Math.abs(ratio - 1)).toBeLessThan(0.2);
    // Common random numbers must pay: the independent-streams error is clearly larger.
    expect(gain).toBeGreaterThan(1.5);
  }, 120_000);

  it("the same under Sobol' launch points in the light-trapping tail (every way in and out split): the spread confirms the paired error", async () => {
    // 1100 and 1150 nm lie in the deep tail (αW < 0.1), where the default under Sobol' points splits
    // every way in and out (src/trace/estimatorChoice.ts); every error then comes from the 16 groups.
    const { ratio, gain } = await replicaDifferences(sinxStudy([0], [1000, 1100, 1150], 480, 30, "sobol"), 100, "paired ΔJsc replicas, Sobol' tail");
    expect(Math.abs(ratio - 1)).toBeLessThan(0.2);
    expect(gain).toBeGreaterThan(1.5);
  }, 120_000);

  it("SiNx 75 vs 80 nm with 20 and 36 batches per point (groups of other sizes): 80 replica differences spread as the paired error says", async () => {
    // B traced further than A on the same streams (a target-error run stopping later): B's groups
    // 0–3 hold 3 batches, A's 2; the other groups 2 and 1. The shared batches 0–19 pair.
    const { ratio, gain } = await replicaDifferences(sinxStudy([0], [450, 750, 1000], 600, 30), 80, "paired ΔJsc, 20 vs 36 batches", {
      batches: [20, 36],
      seedBase: 3000,
      check: (a, b) => {
        expect(b.groupRays![0]).toBe(90);
        expect(a.groupRays![0]).toBe(60);
      },
    });
    // Issue 10 goal: the replica spread confirms the reported paired error within ±20 %.
    expect(Math.abs(ratio - 1)).toBeLessThan(0.2);
    // B's 16 batches beyond A's are independent of A, so pairing gains less than with equal runs.
    expect(gain).toBeGreaterThan(1.25);
  }, 120_000);
});
