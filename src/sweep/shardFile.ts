import { readFileSync } from "node:fs";
import { writeFileAtomic } from "../util/atomicWrite.js";
import { InputError } from "../util/errors.js";
import type { ShardSpec, SweepPlan } from "./plan.js";

export const SHARD_FORMAT = "lightfold.shard";
export const SHARD_FORMAT_VERSION = 1;

/** A finished shard: the merged tally of each of its points (written once, atomically, at the end). */
export interface ShardPartial {
  format: typeof SHARD_FORMAT;
  formatVersion: number;
  shard: ShardSpec;
  plan: SweepPlan;
  /** Global point numbers of this shard, increasing. */
  points: number[];
  /** Merged tally per point, same order as points. */
  tallies: Float64Array[];
  raysTraced: number;
  wallS: number;
}

export function writeShardPartial(path: string, s: ShardPartial): void {
  writeFileAtomic(path, JSON.stringify({ ...s, tallies: s.tallies.map((t) => Array.from(t)) }));
}

export function readShardPartial(path: string): ShardPartial {
  let raw: Record<string, unknown>;
  try {
    raw = JSON.parse(readFileSync(path, "utf8")) as Record<string, unknown>;
  } catch (err) {
    throw new InputError(`${path}: cannot read shard output (${(err as Error).message})`);
  }
  if (raw.format !== SHARD_FORMAT) throw new InputError(`${path}: not a lightfold shard output (format ${JSON.stringify(raw.format)})`);
  if (typeof raw.formatVersion !== "number" || raw.formatVersion > SHARD_FORMAT_VERSION) {
    throw new InputError(`${path}: shard format version ${String(raw.formatVersion)} is newer than this lightfold reads`);
  }
  const points = raw.points as number[];
  const tallies = raw.tallies as number[][];
  if (!Array.isArray(points) || !Array.isArray(tallies) || points.length !== tallies.length) {
    throw new InputError(`${path}: points and tallies must be lists of the same length`);
  }
  return { ...(raw as unknown as ShardPartial), tallies: tallies.map((t) => Float64Array.from(t)) };
}
