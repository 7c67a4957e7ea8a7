import { existsSync, readdirSync, readFileSync, rmSync, writeFileSync } from "node:fs";
import { join } from "node:path";
import { describe, expect, it } from "vitest";
import { readResponseMatrix } from "../../src/response/matrixFile.js";
import { headerLine } from "../../src/sweep/journal.js";
import { mergeShards } from "../../src/sweep/mergeShards.js";
import { runSweep } from "../../src/sweep/runSweep.js";
import { InputError } from "../../src/util/errors.js";
import { expectSameMatrices, matrixBytes, tempDir, tinyStudy } from "./helpers.js";

// The runner's properties are checked with lightfold's own tracer.
const TRACER: string | undefined = undefined;

describe("runSweep(options): determinism", () => {
  it("gives bit-identical matrices for 1 and 2 workers, any message size and a shuffled task order", async () => {
    const study = tinyStudy();
    const one = await runSweep({ study, workers: 1, tracerModule: TRACER });
    const two = await runSweep({ study, workers: 2, tracerModule: TRACER, raysPerMessage: 40, shuffleSeed: 12345 });
    const big = await runSweep({ study, workers: 2, tracerModule: TRACER, raysPerMessage: 10_000, shuffleSeed: 99 });
    expectSameMatrices(one.matrices, two.matrices);
    expectSameMatrices(one.matrices, big.matrices);
    expect(one.raysTraced).toBe(6 * 130);
    // Each point: 130 rays in batches 40, 40, 40, 10.
    expect(Array.from(one.matrices[0].nRays)).toEqual([130, 130, 130, 130, 130, 130]);
    // Energy conservation per point (channels sum to 1).
    const m = one.matrices[0];
    for (let q = 0; q < 6; q++) {
      let s = 0;
      for (let c = 0; c < m.channels.length; c++) s += m.mean[q * m.channels.length + c];
      expect(Math.abs(s - 1)).toBeLessThan(1e-9);
    }
  });

  it("shards 1/3, 2/3, 3/3 merged equal the full run bit for bit", async () => {
    const study = tinyStudy({ sweep: { "absorber.thicknessUm": [120, 180] } });
    const full = await runSweep({ study, workers: 2, tracerModule: TRACER });
    const out = tempDir("shards");
    for (let k = 1; k <= 3; k++) {
      const r = await runSweep({ study, outDir: out, workers: 1, shard: { index: k, count: 3 }, tracerModule: TRACER });
      expect(r.matrices).toEqual([]);
      expect(existsSync(join(out, "shards", `shard-${k}-of-3`, "partial.json"))).toBe(true);
    }
    const merged = mergeShards({ inputs: [out], outDir: join(out, "merged") });
    expect(merged.missing).toEqual([]);
    expectSameMatrices(full.matrices, merged.matrices);
    // And the files written read back to the same bits.
    const fromFile = ["p0", "p1"].map((l) => readResponseMatrix(join(out, "merged", l, "matrix.json")));
    expectSameMatrices(full.matrices, fromFile);
    expect(fromFile[0].partial).toBeUndefined();
  });
});

describe("runSweep(options): journal", () => {
  it("resumes from a journal, re-running only the tasks of a corrupted and a truncated line", async () => {
    const study = tinyStudy();
    const out = tempDir("journal");
    // Small messages on one worker: several journal lines per point.
    const first = await runSweep({ study, outDir: out, workers: 1, raysPerMessage: 40, tracerModule: TRACER });
    const jPath = join(out, "journal.jsonl");
    const lines = readFileSync(jPath, "utf8").split("\n").filter((l) => l !== "");
    const parsed = lines.slice(1).map((l) => JSON.parse(l) as { p: number[]; k: number });
    // Every line is a prefix (one worker finishes messages in order); a point's last one has k = 4.
    expect(parsed.every((e) => e.k >= 1 && e.k <= 4)).toBe(true);
    expect(parsed.filter((e) => e.k === 4).length).toBe(6);
    // Rays a damaged final prefix costs: its batches after the point's previous prefix.
    const sizes = [40, 40, 40, 10];
    const cost = (j: number): number => {
      const key = parsed[j].p.join();
      const prevK = Math.max(0, ...parsed.filter((e, m) => m !== j && e.p.join() === key && e.k < parsed[j].k).map((e) => e.k));
      return sizes.slice(prevK, parsed[j].k).reduce((a, b) => a + b, 0);
    };
    // Damage the line that completes the first point: flip a digit of its tally.
    const i = parsed.findIndex((e) => e.k === 4);
    lines[i + 1] = lines[i + 1].replace(/"t":\[(\d)/, (_, d: string) => `"t":[${(Number(d) + 1) % 10}`);
    // And cut the last line (the last point's final prefix) in half, as a kill during the write would.
    const nLines = lines.length;
    const last = lines.pop() as string;
    expect(parsed[parsed.length - 1].k).toBe(4);
    writeFileSync(jPath, lines.join("\n") + "\n" + last.slice(0, Math.floor(last.length / 2)));
    const notices: string[] = [];
    const again = await runSweep({ study, outDir: out, workers: 2, tracerModule: TRACER, onNotice: (m) => notices.push(m) });
    expect(again.damagedJournalLines).toEqual([i + 2, nLines]);
    expect(notices.join("\n")).toMatch(new RegExp(`2 damaged line\\(s\\) \\(line ${i + 2}, ${nLines}\\) ignored`));
    // Exactly the tasks of the two damaged lines were traced again.
    expect(again.raysTraced).toBe(cost(i) + cost(parsed.length - 1));
    expect(again.raysTraced).toBeGreaterThan(0);
    expect(again.raysResumed).toBe(6 * 130 - again.raysTraced);
    expectSameMatrices(first.matrices, again.matrices);
    expectSameMatrices(first.matrices, [readResponseMatrix(join(out, "base", "matrix.json"))]);
    // A third run traces nothing; it compacts the journal to one prefix per point.
    const third = await runSweep({ study, outDir: out, workers: 1, tracerModule: TRACER });
    expect(third.raysTraced).toBe(0);
    expect(third.damagedJournalLines).toEqual([]);
    expect(readFileSync(jPath, "utf8").split("\n").filter((l) => l !== "").length).toBe(1 + 6);
  });

  it("never reuses the journal of a changed study: it is set aside with a message", async () => {
    const out = tempDir("changed");
    await runSweep({ study: tinyStudy(), outDir: out, workers: 1, tracerModule: TRACER });
    const notices: string[] = [];
    const changed = await runSweep({ study: tinyStudy({ seed: 12 }), outDir: out, workers: 1, tracerModule: TRACER, onNotice: (m) => notices.push(m) });
    expect(changed.raysResumed).toBe(0);
    expect(changed.raysTraced).toBe(6 * 130);
    expect(notices.join("\n")).toMatch(/different study \(its hash differs\); set aside as .*journal\.jsonl\.other-study-/);
    expect(readdirSync(out).some((f) => f.startsWith("journal.jsonl.other-study-"))).toBe(true);

    // Same study, but the journal came from another build of the code: also set aside.
    const jPath = join(out, "journal.jsonl");
    const [head, ...rest] = readFileSync(jPath, "utf8").split("\n");
    const h = JSON.parse(head) as { studyHash: string; toolVersion: string; buildId: string; shard: null };
    writeFileSync(jPath, [headerLine({ ...h, buildId: "0123456789abcdef" }).trimEnd(), ...rest].join("\n"));
    const notes2: string[] = [];
    const rebuilt = await runSweep({ study: tinyStudy({ seed: 12 }), outDir: out, workers: 1, tracerModule: TRACER, onNotice: (m) => notes2.push(m) });
    expect(rebuilt.raysResumed).toBe(0);
    expect(notes2.join("\n")).toMatch(/different build of lightfold \(code fingerprint differs\)/);
  });
});

describe("mergeShards(options)", () => {
  it("lists missing shards by number, writes a partial matrix only when asked, refuses another study's shards", async () => {
    const study = tinyStudy();
    const out = tempDir("merge");
    await runSweep({ study, outDir: out, workers: 1, shard: { index: 1, count: 4 }, tracerModule: TRACER });
    await runSweep({ study, outDir: out, workers: 1, shard: { index: 3, count: 4 }, tracerModule: TRACER });
    // Shard 4 started but did not finish: a journal without partial.json.
    const s4 = await runSweep({ study, outDir: out, workers: 1, shard: { index: 4, count: 4 }, tracerModule: TRACER });
    rmSync(s4.files[0]);
    let err: unknown;
    try {
      mergeShards({ inputs: [out], outDir: join(out, "merged") });
    } catch (e) {
      err = e;
    }
    expect(err).toBeInstanceOf(InputError);
    expect((err as Error).message).toMatch(/^missing shards 2, 4 of 4 \(started but unfinished: 4\);.*--allow-partial/);
    expect(existsSync(join(out, "merged", "base", "matrix.json"))).toBe(false);

    const part = mergeShards({ inputs: [out], outDir: join(out, "preview"), allowPartial: true });
    expect(part.missing).toEqual([2, 4]);
    const m = readResponseMatrix(join(out, "preview", "base", "matrix.json"));
    expect(m.partial).toBe(true);
    // Points of shards 2 and 4 (round-robin: points 1, 3, 5) are empty, the others traced.
    expect(Array.from(m.nRays)).toEqual([130, 0, 130, 0, 130, 0]);
    expect(JSON.parse(readFileSync(join(out, "preview", "run.json"), "utf8")).partial).toBe(true);

    // A shard of another study (other seed) is refused, naming both hashes.
    const other = tempDir("merge-other");
    const o2 = await runSweep({ study: tinyStudy({ seed: 99 }), outDir: other, workers: 1, shard: { index: 2, count: 4 }, tracerModule: TRACER });
    expect(() => mergeShards({ inputs: [join(out, "shards", "shard-1-of-4", "partial.json"), o2.files[0]], outDir: join(out, "x") })).toThrow(
      /shard of a different study \(hash [0-9a-f]{16}, "tiny"\).*refusing to merge/,
    );
  });

  it("refuses shards written by another tool version or another build", async () => {
    const study = tinyStudy();
    const out = tempDir("merge-version");
    const a = await runSweep({ study, outDir: out, workers: 1, shard: { index: 1, count: 2 }, tracerModule: TRACER });
    const b = await runSweep({ study, outDir: out, workers: 1, shard: { index: 2, count: 2 }, tracerModule: TRACER });
    const doc = JSON.parse(readFileSync(b.files[0], "utf8"));
    doc.plan.toolVersion = "0.0.1-other";
    writeFileSync(b.files[0], JSON.stringify(doc));
    expect(() => mergeShards({ inputs: [a.files[0], b.files[0]] })).toThrow(/written by lightfold 0\.0\.1-other.*refusing to merge shards of different versions/);
    doc.plan.toolVersion = a.plan.toolVersion;
    doc.plan.buildId = "0123456789abcdef";
    writeFileSync(b.files[0], JSON.stringify(doc));
    expect(() => mergeShards({ inputs: [a.files[0], b.files[0]] })).toThrow(/different build of lightfold .*code fingerprint 0123456789abcdef.*refusing to merge/);
  });
});

describe("runSweep(options): target-error mode", () => {
  it("adds batches per point until each requested channel's standard error is below the target, the same for any worker count", async () => {
    const target = 0.03;
    const study = tinyStudy({ rays: { targetStdErr: target, channels: ["R_first", "A_absorber"], maxPerPoint: 2000, batch: 25 } });
    const a = await runSweep({ study, workers: 1, tracerModule: TRACER });
    const b = await runSweep({ study, workers: 2, tracerModule: TRACER, shuffleSeed: 7, raysPerMessage: 25 });
    expectSameMatrices(a.matrices, b.matrices);
    const m = a.matrices[0];
    const nCh = m.channels.length;
    const iR = m.channels.indexOf("R_first");
    const iA = m.channels.indexOf("A_absorber");
    for (let q = 0; q < 6; q++) {
      const done = m.stderr[q * nCh + iR] < target && m.stderr[q * nCh + iA] < target;
      expect(done || m.nRays[q] === 2000).toBe(true);
      expect(m.nRays[q] % 25).toBe(0);
      expect(m.nRays[q]).toBeGreaterThanOrEqual(50);
    }
    expect(matrixBytes(m)).not.toBe("");

    // Resumed from any cut of its journal, the same batches are chosen and the same bits result.
    const out = tempDir("target");
    const full = await runSweep({ study, outDir: out, workers: 1, raysPerMessage: 25, tracerModule: TRACER });
    expectSameMatrices(a.matrices, full.matrices);
    const jPath = join(out, "journal.jsonl");
    const lines = readFileSync(jPath, "utf8").split("\n").filter((l) => l !== "");
    for (const keep of [Math.floor(lines.length / 3), Math.floor((2 * lines.length) / 3)]) {
      writeFileSync(jPath, lines.slice(0, keep).join("\n") + "\n");
      const resumed = await runSweep({ study, outDir: out, workers: 2, tracerModule: TRACER });
      expect(resumed.raysResumed).toBeGreaterThan(0);
      expect(resumed.raysTraced).toBeGreaterThan(0);
      expectSameMatrices(a.matrices, resumed.matrices);
    }
  });
});

describe("tracePoint(options)", () => {
  it("traces one point with the sweep's streams: same rays and batch size give the sweep's tally bit for bit", async () => {
    const { tracePoint } = await import("../../src/sweep/tracePoint.js");
    const { TracePool } = await import("../../src/workers/pool.js");
    const { workerSetupOf } = await import("../../src/sweep/runSweep.js");
    const study = tinyStudy();
    const sweep = await runSweep({ study, workers: 1, tracerModule: TRACER });
    const pool = new TracePool(workerSetupOf(study, TRACER), 2);
    try {
      const pt = await tracePoint({ study, pool, it: 1, ip: 0, il: 2, nRays: 130, tracerModule: TRACER });
      // Point (θ index 1, φ 0, λ index 2) is global point 1·3 + 2 = 5.
      expect(Buffer.from(pt.tally.buffer).equals(Buffer.from((sweep.pointTallies.get(5) as Float64Array).buffer))).toBe(true);
      expect(pt.nBatches).toBe(4);
      // Another seed is an independent replica: different tally, same ray count.
      const rep = await tracePoint({ study, pool, it: 1, ip: 0, il: 2, nRays: 130, seed: 1234, tracerModule: TRACER });
      expect(rep.nRays).toBe(130);
      expect(Array.from(rep.tally)).not.toEqual(Array.from(pt.tally));
    } finally {
      await pool.close();
    }
  });
});
