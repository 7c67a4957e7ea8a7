import { describe, expect, it } from "vitest";
import { groupStdErr } from "../../src/random/replicaGroups.js";
import { runSweep } from "../../src/sweep/runSweep.js";
import { tracePoint } from "../../src/sweep/tracePoint.js";
import { readFileSync, writeFileSync } from "node:fs";
import { join } from "node:path";
import { mergeShards } from "../../src/sweep/mergeShards.js";
import { readShardPartial } from "../../src/sweep/shardFile.js";
import { shardPartialPath } from "../../src/sweep/sweepPaths.js";
import { channelStdErr } from "../../src/sweep/tally.js";
import { readResponseMatrix } from "../../src/response/matrixFile.js";
import { runMain } from "../helpers/cli.js";
import { expectSameMatrices, tempDir, tinyDoc, tinyStudy } from "./helpers.js";

// 2 angles × 3 wavelengths, 20 batches of 40 rays per point (groups 0–3 get two batches, 4–15 one).
const sobolStudy = () => tinyStudy({ rays: { perPoint: 790, batch: 40, sampling: "sobol" } });

describe("sweeps with Sobol' launch sampling", () => {
  it("are bit-identical for 1 and 2 workers, any message size and task order, and take errors from the replica groups", async () => {
    const study = sobolStudy();
    const one = await runSweep({ study, workers: 1 });
    const two = await runSweep({ study, workers: 2, raysPerMessage: 40, shuffleSeed: 4242 });
    expectSameMatrices(one.matrices, two.matrices);
    const m = one.matrices[0];
    const nC = m.channels.length;
    const G = m.pairGroups!;
    const ia = m.channels.indexOf("A_absorber");
    for (let q = 0; q < 6; q++) {
      expect(m.nRays[q]).toBe(790);
      // The reported error is the spread of the 16 groups (Cochran's cluster estimator), not per ray.
      const counts = Array.from({ length: G }, (_, g) => m.groupRays![q * G + g]);
      const sums = counts.map((n, g) => n * m.groupMean![(q * G + g) * nC + ia]);
      expect(m.stderr[q * nC + ia]).toBeCloseTo(groupStdErr(sums, counts), 15);
    }
  });

  it("differ from random sampling only in the launch: same study, other points, same physics (|z| < 4 per point)", async () => {
    const sobol = (await runSweep({ study: sobolStudy(), workers: 1 })).matrices[0];
    const random = (await runSweep({ study: tinyStudy({ rays: { perPoint: 790, batch: 40, sampling: "random" } }), workers: 1 })).matrices[0];
    const nC = sobol.channels.length;
    const ia = sobol.channels.indexOf("A_absorber");
    for (let q = 0; q < 6; q++) {
      const d = sobol.mean[q * nC + ia] - random.mean[q * nC + ia];
      expect(Math.abs(d) / Math.hypot(sobol.stderr[q * nC + ia], random.stderr[q * nC + ia])).toBeLessThan(4);
    }
  });

  it("stop on a target error measured from the replica groups, the same batches for 1 and 2 workers", async () => {
    // Target-error mode under Sobol' sampling: 16 batches first (one per group), then batches until
    // the replica error of A_absorber is below the target or maxPerPoint is reached.
    const study = tinyStudy({ rays: { targetStdErr: 0.004, channels: ["A_absorber"], maxPerPoint: 3200, batch: 40, sampling: "sobol" } });
    const one = await runSweep({ study, workers: 1 });
    const two = await runSweep({ study, workers: 2, raysPerMessage: 80, shuffleSeed: 7 });
    expectSameMatrices(one.matrices, two.matrices);
    const m = one.matrices[0];
    const nC = m.channels.length;
    const ia = m.channels.indexOf("A_absorber");
    for (let q = 0; q < 6; q++) {
      expect(m.nRays[q]).toBeGreaterThanOrEqual(16 * 40);
      expect(m.stderr[q * nC + ia] < 0.004 || m.nRays[q] === 3200).toBe(true);
    }
    // The weakly absorbing 1100 nm points needed more than the first 16 batches.
    expect(Math.max(...m.nRays)).toBeGreaterThan(16 * 40);
  });

  it("shards merged and a resumed run equal the full run bit for bit", async () => {
    // Launch points depend on the batch's coordinates alone (launchPoints.ts), not on who traced it.
    const study = sobolStudy();
    const full = await runSweep({ study, workers: 2 });
    const out = tempDir("sobol-shards");
    for (let k = 1; k <= 2; k++) await runSweep({ study, outDir: out, workers: 1, shard: { index: k, count: 2 } });
    expectSameMatrices(full.matrices, mergeShards({ inputs: [out], outDir: join(out, "merged") }).matrices);
    // A run cut short after its first message, then resumed from its journal.
    const run = tempDir("sobol-resume");
    await runSweep({ study, outDir: run, workers: 1, raysPerMessage: 80 });
    const jPath = join(run, "journal.jsonl");
    const lines = readFileSync(jPath, "utf8").split("\n").filter((l) => l !== "");
    writeFileSync(jPath, lines.slice(0, 2).join("\n") + "\n");
    const resumed = await runSweep({ study, outDir: run, workers: 2 });
    expect(resumed.raysResumed).toBeGreaterThan(0);
    expectSameMatrices(full.matrices, resumed.matrices);
  });

  it("tracePoint reproduces a sweep point and its replica error", async () => {
    const study = sobolStudy();
    const sweep = (await runSweep({ study, workers: 1 })).matrices[0];
    const nC = sweep.channels.length;
    const p = await tracePoint({ study, workers: 1, it: 1, ip: 0, il: 2, nRays: 790 });
    // 200 rays are 5 batches of 40: too few replicas for an error, refused.
    await expect(tracePoint({ study, workers: 1, it: 0, ip: 0, il: 0, nRays: 200 })).rejects.toThrow(/at least 8 batches/);
    const q = 1 * 3 + 2;
    for (let c = 0; c < nC; c++) {
      expect(p.mean[c]).toBe(sweep.mean[q * nC + c]);
      expect(p.stderr[c]).toBe(sweep.stderr[q * nC + c]);
    }
  });
});

describe("Sobol' launch points by default (16+ batches per point)", () => {
  // 16 batches of 40 rays per point: one per replica group.
  const rays = { perPoint: 640, batch: 40 };

  it("a sweep with 16 batches per point runs them: bit-identical for 1 and 2 workers, errors from the replica groups", async () => {
    const study = tinyStudy({ rays });
    expect(study.combos[0].study.rays.sampling).toBe("sobol");
    const one = await runSweep({ study, workers: 1 });
    const two = await runSweep({ study, workers: 2, raysPerMessage: 40, shuffleSeed: 99 });
    expectSameMatrices(one.matrices, two.matrices);
    // the same run as "sampling": "sobol" written out
    expectSameMatrices(one.matrices, (await runSweep({ study: tinyStudy({ rays: { ...rays, sampling: "sobol" } }), workers: 1 })).matrices);
    const m = one.matrices[0];
    const nC = m.channels.length;
    const G = m.pairGroups!;
    const optOut = (await runSweep({ study: tinyStudy({ rays: { ...rays, sampling: "random" } }), workers: 1 })).matrices[0];
    for (let q = 0; q < 6; q++) {
      expect(m.nRays[q]).toBe(640);
      const counts = Array.from({ length: G }, (_, g) => m.groupRays![q * G + g]);
      expect(counts.every((n) => n === 40)).toBe(true);
      for (let c = 0; c < nC; c++) {
        // Cochran's cluster estimator over the 16 groups (replicaGroups.ts), not the per-ray error
        const sums = counts.map((n, g) => n * m.groupMean![(q * G + g) * nC + c]);
        expect(m.stderr[q * nC + c]).toBeCloseTo(groupStdErr(sums, counts), 15);
      }
      // "random" opts out: other launch points, the same physics (|z| < 4 per point)
      const ia = m.channels.indexOf("A_absorber");
      const z = (m.mean[q * nC + ia] - optOut.mean[q * nC + ia]) / Math.hypot(m.stderr[q * nC + ia], optOut.stderr[q * nC + ia]);
      expect(Math.abs(z)).toBeLessThan(4);
      // the α → 0 path ratio's error comes from the groups too (tests/sweep/tallyChecks.test.ts): finite, and the two runs agree
      const f = m.trapping!.freePathRatioStderr[q];
      const fr = optOut.trapping!.freePathRatioStderr[q];
      expect(f > 0 && Number.isFinite(f)).toBe(true);
      expect(Math.abs(m.trapping!.freePathRatio[q] - optOut.trapping!.freePathRatio[q]) / Math.hypot(f, fr)).toBeLessThan(4);
    }
    expect(optOut.mean).not.toEqual(m.mean);
  });

  it("shards keep it in the plan they write, and merge to the full run bit for bit", async () => {
    const study = tinyStudy({ rays });
    const full = await runSweep({ study, workers: 1 });
    const out = tempDir("sobol-default-shards");
    for (let k = 1; k <= 3; k++) await runSweep({ study, outDir: out, workers: 1, shard: { index: k, count: 3 } });
    expect(readShardPartial(shardPartialPath(out, { index: 2, count: 3 })).plan.rays).toEqual({ mode: "fixed", perPoint: 640, batch: 40, sampling: "sobol" });
    expectSameMatrices(full.matrices, mergeShards({ inputs: [out], outDir: join(out, "merged") }).matrices);
  });

  it("a matrix where no light reaches the absorber at some wavelengths is written and reads back (α → 0 path error 0 there, finite elsewhere)", async () => {
    // Glass and encapsulant in front: at 300 nm nothing gets through to the silicon.
    const stack = {
      layers: [
        { name: "glass", material: "glass-lowiron-Vogt2016", thicknessUm: 3200, topFilms: [] },
        { name: "eva", material: "EVA-S88-Vogt2016", thicknessUm: 450, topFilms: [] },
      ],
      front: { texture: { type: "upright-pyramids", baseUm: 10 }, films: [{ material: "SiNx", thicknessNm: 75 }] },
      absorber: { material: "Si", thicknessUm: 180 },
      rear: { ideal: { kind: "mirror", reflectance: 0.95 } },
    };
    const study = tinyStudy({ stack, grid: { thetaDeg: [0], phiDeg: [0], wavelengthNm: [300, 900] }, rays: { perPoint: 320, batch: 20 } });
    expect(study.combos[0].study.rays.sampling).toBe("sobol");
    const out = tempDir("sobol-dark");
    const run = await runSweep({ study, outDir: out, workers: 1 });
    const m = readResponseMatrix(join(out, "base", "matrix.json"));
    expect(m.trapping!.entered[0]).toBe(0);
    expect(m.trapping!.freePathRatioStderr[0]).toBe(0);
    expect(m.trapping!.entered[1]).toBeGreaterThan(0);
    expect(m.trapping!.freePathRatioStderr[1]).toBeGreaterThan(0);
    expect(Array.from(m.trapping!.freePathRatioStderr)).toEqual(Array.from(run.matrices[0].trapping!.freePathRatioStderr));
  });

  it("15 batches per point stay random (per-ray errors)", async () => {
    const study = tinyStudy({ rays: { perPoint: 600, batch: 40 } });
    expect(study.combos[0].study.rays.sampling).toBeUndefined();
    const m = (await runSweep({ study, workers: 1 })).matrices[0];
    const nC = m.channels.length;
    // the reported error of a random-sampling point is the per-ray one, s/√n from Σw and Σw²
    // (tracePoint reproduces the sweep's point 0, 0, 1 and its tally)
    const p = await tracePoint({ study, workers: 1, it: 0, ip: 0, il: 1, nRays: 600 });
    for (let c = 0; c < nC; c++) {
      expect(p.mean[c]).toBe(m.mean[nC + c]);
      expect(m.stderr[nC + c]).toBe(channelStdErr(p.tally, nC, c));
    }
  });
});

describe("lightfold sweep: the resolved launch sampling in run.json", () => {
  it("16 batches per point: Sobol' by default; --sampling random opts out (its folder is then another study's); --target-error gets its own default", async () => {
    const dir = tempDir("sobol-default-cli");
    const studyPath = join(dir, "s.study.json");
    writeFileSync(studyPath, JSON.stringify(tinyDoc({ grid: { thetaDeg: [0], phiDeg: [0], wavelengthNm: [900] }, rays: { perPoint: 160, batch: 10 } })));
    const runRays = async (name: string, ...flags: string[]): Promise<Record<string, unknown>> => {
      const out = join(dir, name);
      const r = await runMain("sweep", studyPath, "--out", out, "--workers", "1", "--quiet", "--no-report", ...flags);
      expect(r.code, r.err).toBe(0);
      return (JSON.parse(readFileSync(join(out, "run.json"), "utf8")) as { rays: Record<string, unknown> }).rays;
    };
    expect(await runRays("default")).toEqual({ mode: "fixed", perPoint: 160, batch: 10, sampling: "sobol" });
    expect(await runRays("random", "--sampling", "random")).toEqual({ mode: "fixed", perPoint: 160, batch: 10 });
    // the folder of that random run, swept again with the default: its journal is another study's
    // (the resolved sampling is part of the hash), set aside, never mixed in
    const again = await runMain("sweep", studyPath, "--out", join(dir, "random"), "--workers", "1", "--quiet", "--no-report", "--json");
    expect(again.err).toMatch(/belongs to a different study \(its hash differs\)/);
    expect((JSON.parse(again.out) as { raysResumed: number }).raysResumed).toBe(0);
    expect(JSON.parse(readFileSync(join(dir, "random", "run.json"), "utf8")).rays.sampling).toBe("sobol");
    // target error without minPerPoint: first look after two batches, so random unless named
    expect((await runRays("target", "--target-error", "0.01", "--max-rays", "400")).sampling).toBeUndefined();
    expect(await runRays("target-sobol", "--target-error", "0.01", "--max-rays", "400", "--sampling", "sobol")).toMatchObject({ mode: "target", minPerPoint: 160, sampling: "sobol" });
  });
});
