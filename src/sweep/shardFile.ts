import { statSync } from "node:fs";
import { writeFileAtomic } from "../util/atomicWrite.js";
import { InputError } from "../util/errors.js";
import { parseJsonInput, readInputText } from "../util/inputFile.js";
import { at, int, num, numbers, obj, refuse, type Where } from "../util/untrustedJson.js";
import { pointCoords, totalPoints, type ShardSpec, type SweepPlan } from "./plan.js";
import { validatePlan } from "./planCheck.js";
import { tallyLength } from "./tally.js";
import { finishedRaysProblem, storedTallyProblem } from "./tallyChecks.js";

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

/**
 * Reads a shard output as untrusted: the plan field by field (combination labels confined to plain
 * folder names), points inside the plan, and every tally sound (finite, non-negative, channels
 * summing to the ray count, the plan's ray count). A file that fails is refused with the reason.
 */
export function readShardPartial(path: string): ShardPartial {
  if (statSync(path, { throwIfNoEntry: false })?.isFile() !== true) throw new InputError(`${path}: not a shard output file (partial.json)`);
  const text = readInputText(path, "shard output", "give the partial.json a `lightfold sweep --shard K/N` run wrote");
  return validateShardPartial(parseJsonInput(text, path), path);
}

export function validateShardPartial(raw: unknown, file: string): ShardPartial {
  const root: Where = { file, path: "" };
  const o = obj(raw, root);
  if (o.format !== SHARD_FORMAT) throw new InputError(`${file}: not a lightfold shard output (format ${JSON.stringify(o.format)}, expected "${SHARD_FORMAT}")`);
  if (typeof o.formatVersion !== "number" || o.formatVersion > SHARD_FORMAT_VERSION) {
    throw new InputError(`${file}: shard format version ${String(o.formatVersion)} is newer than this lightfold reads`);
  }
  const s = obj(o.shard, at(root, "shard"));
  const count = int(s.count, at(at(root, "shard"), "count"), 1, 1_000_000);
  const shard = { index: int(s.index, at(at(root, "shard"), "index"), 1, count), count };
  const plan = validatePlan(o.plan, at(root, "plan"));
  const points = numbers(o.points, at(root, "points"), { integer: true, min: 0, max: totalPoints(plan) - 1, increasing: true });
  if (!Array.isArray(o.tallies) || o.tallies.length !== points.length) refuse(at(root, "tallies"), `a list of ${points.length} tallies (one per point)`, o.tallies);
  const tallies = points.map((p, i) => {
    const nCh = plan.combos[pointCoords(plan.grid, p).combo]!.channels.length;
    const w = at(at(root, "tallies"), i);
    const t = Float64Array.from(numbers((o.tallies as unknown[])[i], w, { length: tallyLength(nCh) }));
    const nRays = t[2 * nCh]!;
    const problem = finishedRaysProblem(plan.rays, nRays) ?? storedTallyProblem(t, nCh, nRays);
    if (problem !== undefined) refuse(w, `a sound tally of point ${p}; ${problem}`);
    return t;
  });
  return {
    format: SHARD_FORMAT,
    formatVersion: o.formatVersion,
    shard,
    plan,
    points,
    tallies,
    raysTraced: num(o.raysTraced, at(root, "raysTraced"), 0),
    wallS: num(o.wallS, at(root, "wallS"), 0),
  };
}
