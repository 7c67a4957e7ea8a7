import { describe, expect, it } from "vitest";
import { runSweep } from "../../src/sweep/runSweep.js";
import { resolveShard, shardFromSlurmEnv } from "../../src/sweep/shardSource.js";
import { defaultWorkerCount } from "../../src/workers/pool.js";
import { availableParallelism } from "node:os";
import { STAND_IN_TRACER, tinyStudy } from "./helpers.js";

// A stand-in tracer (tests/fixtures/standInTracer.mjs) misbehaves on purpose at 666 nm (throws)
// and at 777 nm (channels sum to 1.5), which lightfold's own tracer never does.
describe("runSweep(options): failing tasks", () => {
  it("fails loudly with the task's coordinates when a worker throws", async () => {
    const study = tinyStudy({ grid: { thetaDeg: [0, 60], phiDeg: [0], wavelengthNm: [600, 666] } });
    await expect(runSweep({ study, workers: 2, tracerModule: STAND_IN_TRACER })).rejects.toThrow(
      /task failed at combo 0, θ=(0|60)° \(index [01]\), φ=0° \(index 0\), λ=666 nm \(index 1\), batch \d+: stand-in tracer: deliberate failure/,
    );
  });

  it("fails when a task's channels do not sum to 1, instead of writing the matrix", async () => {
    const study = tinyStudy({ grid: { thetaDeg: [30], phiDeg: "averaged", wavelengthNm: [777] } });
    await expect(runSweep({ study, workers: 1, tracerModule: STAND_IN_TRACER })).rejects.toThrow(
      /task failed at combo 0, θ=30° \(index 0\), φ averaged, λ=777 nm \(index 0\), batch \d+: channels sum to 1\.5 of the incident power, expected 1/,
    );
  });
});

describe("shard and pool size from the batch system", () => {
  it("reads the Slurm array task (SLURM_ARRAY_TASK_MIN offset aware)", () => {
    expect(shardFromSlurmEnv({ SLURM_ARRAY_TASK_ID: "3", SLURM_ARRAY_TASK_COUNT: "4", SLURM_ARRAY_TASK_MIN: "1" })).toEqual({ index: 3, count: 4 });
    expect(shardFromSlurmEnv({ SLURM_ARRAY_TASK_ID: "0", SLURM_ARRAY_TASK_COUNT: "4", SLURM_ARRAY_TASK_MIN: "0" })).toEqual({ index: 1, count: 4 });
    expect(shardFromSlurmEnv({ SLURM_ARRAY_TASK_ID: "12", SLURM_ARRAY_TASK_COUNT: "3", SLURM_ARRAY_TASK_MIN: "10" })).toEqual({ index: 3, count: 3 });
    expect(shardFromSlurmEnv({})).toBeUndefined();
    expect(() => shardFromSlurmEnv({ SLURM_ARRAY_TASK_ID: "5", SLURM_ARRAY_TASK_COUNT: "4", SLURM_ARRAY_TASK_MIN: "1" })).toThrow(/1 ≤ K ≤ N, got 5\/4/);
  });

  it("prefers an explicit --shard (a re-submitted subset sees the subset's task count)", () => {
    const env = { SLURM_ARRAY_TASK_ID: "2", SLURM_ARRAY_TASK_COUNT: "1", SLURM_ARRAY_TASK_MIN: "2" };
    expect(resolveShard("2/4", env)).toEqual({ index: 2, count: 4 });
    expect(resolveShard(undefined, env)).toEqual({ index: 1, count: 1 });
    expect(resolveShard(undefined, {})).toBeNull();
    expect(() => resolveShard("0/4", {})).toThrow(/--shard: expected 1 ≤ K ≤ N/);
    expect(() => resolveShard("two of four", {})).toThrow(/--shard: expected K\/N/);
  });

  it("sizes the pool by SLURM_CPUS_PER_TASK when set, else os.availableParallelism()", () => {
    expect(defaultWorkerCount({ SLURM_CPUS_PER_TASK: "3" })).toBe(3);
    expect(defaultWorkerCount({})).toBe(availableParallelism());
    expect(() => defaultWorkerCount({ SLURM_CPUS_PER_TASK: "lots" })).toThrow(/SLURM_CPUS_PER_TASK/);
  });
});
