import { InputError } from "../util/errors.js";
import type { ShardSpec } from "./plan.js";

/** Parses "K/N" (1 ≤ K ≤ N). */
export function parseShardFlag(text: string, what = "--shard"): ShardSpec {
  const m = /^\s*(\d+)\s*\/\s*(\d+)\s*$/.exec(text);
  if (m === null) throw new InputError(`${what}: expected K/N (shard K of N, e.g. 2/8), got ${JSON.stringify(text)}`);
  const index = Number(m[1]);
  const count = Number(m[2]);
  if (!(count >= 1 && index >= 1 && index <= count)) {
    throw new InputError(`${what}: expected 1 ≤ K ≤ N, got ${index}/${count}`);
  }
  return { index, count };
}

/**
 * Shard of a Slurm array task: K = SLURM_ARRAY_TASK_ID − SLURM_ARRAY_TASK_MIN + 1 (so arrays
 * numbered 0..N−1 and 1..N both map to shards 1..N), N = SLURM_ARRAY_TASK_COUNT. Undefined outside
 * an array task.
 */
export function shardFromSlurmEnv(env: NodeJS.ProcessEnv = process.env): ShardSpec | undefined {
  const id = env.SLURM_ARRAY_TASK_ID;
  const count = env.SLURM_ARRAY_TASK_COUNT;
  if (id === undefined || id === "" || count === undefined || count === "") return undefined;
  const min = env.SLURM_ARRAY_TASK_MIN === undefined || env.SLURM_ARRAY_TASK_MIN === "" ? "0" : env.SLURM_ARRAY_TASK_MIN;
  for (const [name, v] of [["SLURM_ARRAY_TASK_ID", id], ["SLURM_ARRAY_TASK_COUNT", count], ["SLURM_ARRAY_TASK_MIN", min]]) {
    if (!/^\d+$/.test(v)) throw new InputError(`${name}: expected a non-negative integer, got ${JSON.stringify(v)}`);
  }
  return parseShardFlag(`${Number(id) - Number(min) + 1}/${Number(count)}`, "SLURM_ARRAY_TASK_ID/SLURM_ARRAY_TASK_COUNT");
}

/**
 * The shard to run: an explicit --shard wins (a re-submitted subset of an array sees the subset's
 * SLURM_ARRAY_TASK_COUNT, so scripts pass the full split explicitly); else the Slurm array task's;
 * else none (the whole study).
 */
export function resolveShard(flag: string | undefined, env: NodeJS.ProcessEnv = process.env): ShardSpec | null {
  if (flag !== undefined) return parseShardFlag(flag);
  return shardFromSlurmEnv(env) ?? null;
}
