// Sharded sweeps on a real single-node Slurm cluster (slurm-wlm + munge, started by
// scripts/slurm/start.sh): the generated job array + afterok merge must give the matrices of a
// single-process sweep bit for bit, also after one array task is cancelled mid-run and re-run alone.
// Source of the Slurm behaviour relied on: sbatch(1) (--array, --parsable, --dependency=afterok),
// scancel(1) (JOBID_TASKID), squeue(1) (-t all), slurm.conf(5) (MinJobAge); Slurm 22.05 manual pages.
import { execFile } from "node:child_process";
import { existsSync, mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from "node:fs";
import { availableParallelism, tmpdir } from "node:os";
import { join } from "node:path";
import { promisify } from "node:util";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import {
  jobStates,
  readText,
  repoRoot,
  slurm,
  slurmUnavailableReason,
  startCluster,
  stopClusterSync,
  submit,
  waitFor,
  waitForJobEnd,
  type TestCluster,
} from "./slurmHarness.js";

const runFile = promisify(execFile);
const FIXTURE = join(repoRoot, "tests", "fixtures", "cluster", "tiny.study.json");
/** Seconds one shard should trace on one worker: long enough to cancel it mid-run, short for CI. */
const SHARD_TARGET_S = 2.5;
const LIGHTFOLD = join(repoRoot, "bin", "lightfold.js");
const SHARDS = 4;
const JOB_TIMEOUT_MS = 150_000;

const unavailable = slurmUnavailableReason();
if (unavailable !== undefined) console.log(`[tests/cluster/slurm.test.ts] skipped: ${unavailable}`);

async function lightfold(args: string[], env: NodeJS.ProcessEnv = process.env): Promise<{ code: number; stdout: string; stderr: string }> {
  try {
    const { stdout, stderr } = await runFile(process.execPath, [LIGHTFOLD, ...args], { env, encoding: "utf8", timeout: 120_000 });
    return { code: 0, stdout, stderr };
  } catch (err) {
    const e = err as { code?: number; stdout?: string; stderr?: string };
    return { code: typeof e.code === "number" ? e.code : -1, stdout: e.stdout ?? "", stderr: e.stderr ?? "" };
  }
}

/** matrix.json of every combination of a run directory, by combination folder. */
function matrices(runDir: string): Map<string, { mean: number[]; stderr: number[]; nRays: number[] }> {
  const out = new Map<string, { mean: number[]; stderr: number[]; nRays: number[] }>();
  for (const entry of readdirSync(runDir, { withFileTypes: true })) {
    const file = join(runDir, entry.name, "matrix.json");
    if (entry.isDirectory() && existsSync(file)) {
      const m = JSON.parse(readFileSync(file, "utf8")) as { mean: number[]; stderr: number[]; nRays: number[] };
      out.set(entry.name, { mean: m.mean, stderr: m.stderr, nRays: m.nRays });
    }
  }
  return out;
}

/** Every task log of a run, for failure messages. */
function allLogs(logDir: string): string {
  return readdirSync(logDir).sort().map((f) => `--- ${f}:\n${readText(join(logDir, f)).slice(-2000)}`).join("\n");
}

function expectSameMatrices(actualDir: string, referenceDir: string): void {
  const ref = matrices(referenceDir);
  const got = matrices(actualDir);
  expect([...got.keys()].sort()).toEqual([...ref.keys()].sort());
  expect(ref.size).toBeGreaterThan(0);
  for (const [combo, m] of ref) {
    const g = got.get(combo)!;
    // Bit-identical: JSON numbers round-trip doubles exactly, so equal arrays = equal doubles.
    expect(g.mean, `${combo} mean`).toEqual(m.mean);
    expect(g.stderr, `${combo} stderr`).toEqual(m.stderr);
    expect(g.nRays, `${combo} nRays`).toEqual(m.nRays);
  }
}

/**
 * The fixture with rays per point chosen so one shard of four takes about SHARD_TARGET_S on one
 * worker at the rate this machine traces it now (measured on one point), whatever the tracer's speed.
 */
async function writeCalibratedStudy(path: string, calibrationDir: string, timings: Record<string, number>): Promise<void> {
  const doc = JSON.parse(readFileSync(FIXTURE, "utf8")) as { rays: { perPoint: number; batch: number }; grid: unknown };
  const r = await lightfold(["sweep", FIXTURE, "--out", calibrationDir, "--shard", "1/36", "--workers", "1", "--quiet", "--json"]);
  if (r.code !== 0) throw new Error(`calibration sweep failed (${r.code}): ${r.stderr}`);
  const raysPerS = (JSON.parse(r.stdout) as { raysPerS: number }).raysPerS;
  const pointsPerShard = 36 / SHARDS; // 2 thicknesses x 3 angles x 6 wavelengths, dealt round-robin
  const batch = doc.rays.batch;
  const perPoint = Math.min(400 * batch, Math.max(8 * batch, Math.round((raysPerS * SHARD_TARGET_S) / pointsPerShard / batch) * batch));
  doc.rays.perPoint = perPoint;
  writeFileSync(path, JSON.stringify(doc, null, 2));
  timings.calibrationRaysPerS = Math.round(raysPerS);
  timings.raysPerPoint = perPoint;
}

describe.runIf(unavailable === undefined)("sharded sweep on a real single-node Slurm cluster", () => {
  let cluster: TestCluster | undefined;
  const work = mkdtempSync(join(tmpdir(), "lf-cluster-test-"));
  const refDir = join(work, "single");
  const timings: Record<string, number> = {};
  const STUDY = join(work, "tiny.study.json");

  beforeAll(async () => {
    cluster = await startCluster();
    await writeCalibratedStudy(STUDY, join(work, "calibration"), timings);
    const t0 = Date.now();
    const single = await lightfold(["sweep", STUDY, "--out", refDir]);
    timings.singleProcessS = (Date.now() - t0) / 1000;
    if (single.code !== 0) throw new Error(`single-process sweep failed (${single.code}): ${single.stderr}`);
  }, 180_000);

  afterAll(() => {
    if (cluster !== undefined) console.log(stopClusterSync(cluster.dir).trim());
    console.log(`[cluster test] wall times (s): ${JSON.stringify(timings)}`);
    rmSync(work, { recursive: true, force: true });
    if (cluster !== undefined) rmSync(cluster.dir, { recursive: true, force: true });
  });

  async function generate(outDir: string): Promise<{ submitScript: string; logDir: string }> {
    const r = await lightfold([
      "slurm-script", STUDY, "--shards", String(SHARDS), "--cpus-per-task", "1", "--time", "00:10:00", "--mem", "1G",
      "--out-dir", outDir, "--json",
    ]);
    expect(r.stderr).toBe("");
    expect(r.code).toBe(0);
    const written = JSON.parse(r.stdout) as { submitScript: string; logDir: string };
    return written;
  }

  it("a 4-task array plus the afterok merge gives the single-process matrices bit for bit", async () => {
    const c = cluster!;
    const outDir = join(work, "array");
    const { submitScript, logDir } = await generate(outDir);
    const t0 = Date.now();
    const { arrayJob, mergeJob } = await submit(c, submitScript);
    const arrayStates = await waitForJobEnd(c, arrayJob, JOB_TIMEOUT_MS);
    const mergeStates = await waitForJobEnd(c, mergeJob, JOB_TIMEOUT_MS);
    timings.fourShardArrayS = (Date.now() - t0) / 1000;
    const logs = allLogs(logDir);
    expect([...arrayStates.entries()].sort(), logs).toEqual(
      Array.from({ length: SHARDS }, (_, i) => [`${arrayJob}_${i + 1}`, "COMPLETED"]),
    );
    expect(mergeStates.get(mergeJob), logs).toBe("COMPLETED");
    expectSameMatrices(join(outDir, "merged"), refDir);

    // Each task's pool is what Slurm granted (SLURM_CPUS_PER_TASK=1), not the node's core count.
    for (let k = 1; k <= SHARDS; k++) {
      const out = readText(join(logDir, `lf-cluster-test-tiny_${arrayJob}_${k}.out`));
      expect(out).toContain(`lightfold shard ${k}/${SHARDS} on`);
      expect(out).toContain("with 1 CPUs");
      // The sweep's own summary line: the pool it ran (from SLURM_CPUS_PER_TASK).
      expect(out).toMatch(/ on 1 worker\(s\)/);
    }
    const shardWallS = Array.from({ length: SHARDS }, (_, i) => {
      const partial = JSON.parse(readFileSync(join(outDir, "shards", `shard-${i + 1}-of-${SHARDS}`, "partial.json"), "utf8")) as { wallS: number };
      return Number(partial.wallS.toFixed(2));
    });
    console.log(`[cluster test] node CPUs ${availableParallelism()}, each shard granted 1; sweep wall time per shard (s): ${shardWallS.join(", ")}`);
  }, 2 * JOB_TIMEOUT_MS);

  it("a task cancelled mid-run, re-submitted alone, resumes and merges to the same matrices", async () => {
    const c = cluster!;
    const outDir = join(work, "cancelled");
    const { submitScript, logDir } = await generate(outDir);
    const victim = 2;
    const journal = join(outDir, "shards", `shard-${victim}-of-${SHARDS}`, "journal.jsonl");
    const partial = join(outDir, "shards", `shard-${victim}-of-${SHARDS}`, "partial.json");
    const { arrayJob, mergeJob } = await submit(c, submitScript);

    // Cancel the task once its journal holds finished batches but before the shard is done.
    await waitFor("shard 2 to journal a batch", JOB_TIMEOUT_MS, async () => readText(journal).split("\n").filter((l) => l !== "").length, (n) => n >= 2, 50);
    await slurm(c, "scancel", [`${arrayJob}_${victim}`]);
    const states = await waitForJobEnd(c, arrayJob, JOB_TIMEOUT_MS);
    expect(states.get(`${arrayJob}_${victim}`), allLogs(logDir)).toBe("CANCELLED");
    expect(existsSync(partial), "shard 2 finished before it was cancelled").toBe(false);
    for (const k of [1, 3, 4]) expect(states.get(`${arrayJob}_${k}`), allLogs(logDir)).toBe("COMPLETED");
    const journalLinesAtCancel = readText(journal).split("\n").filter((l) => l !== "").length;

    // The merge waits forever on a failed afterok; lightfold merge itself names the missing shard.
    // (the controller re-evaluates dependencies on its next scheduling pass)
    await waitFor("the merge to be marked DependencyNeverSatisfied", 30_000, () => jobStates(c, mergeJob),
      (m) => m.get(mergeJob) === "PENDING:DependencyNeverSatisfied");
    const early = await lightfold(["merge", outDir, "--out", join(outDir, "merged")]);
    expect(early.code, early.stderr).toBe(2);
    expect(early.stderr).toMatch(/missing shard 2 of 4 \(started but unfinished: 2\)/);
    expect(existsSync(join(outDir, "merged"))).toBe(false);
    await slurm(c, "scancel", [mergeJob]);

    const again = await submit(c, submitScript, [String(victim)]);
    const rerun = await waitForJobEnd(c, again.arrayJob, JOB_TIMEOUT_MS);
    expect([...rerun.entries()], allLogs(logDir)).toEqual([[`${again.arrayJob}_${victim}`, "COMPLETED"]]);
    expect((await waitForJobEnd(c, again.mergeJob, JOB_TIMEOUT_MS)).get(again.mergeJob), allLogs(logDir)).toBe("COMPLETED");
    expect(journalLinesAtCancel).toBeGreaterThanOrEqual(2);
    // The re-run took the batches journaled before the cancel instead of tracing them again.
    const rerunLog = readText(join(logDir, `lf-cluster-test-tiny_${again.arrayJob}_${victim}.out`));
    expect(rerunLog).toMatch(/rays traced \(\+[0-9.e+]+ from the journal\)/);
    expectSameMatrices(join(outDir, "merged"), refDir);
  }, 4 * JOB_TIMEOUT_MS);
});
