import { existsSync, readdirSync, statSync } from "node:fs";
import { basename, join } from "node:path";
import { matrixFromTallies } from "../response/fromTallies.js";
import type { ResponseMatrix } from "../response/responseMatrix.js";
import { InputError } from "../util/errors.js";
import { lockOutputDir, removeStaleTempFiles } from "../util/outputLock.js";
import { canonicalJson } from "../study/canonical.js";
import { inShard, totalPoints, type SweepPlan } from "./plan.js";
import { readShardPartial, type ShardPartial } from "./shardFile.js";
import { writeRunOutputs, type RunRecord } from "./runFiles.js";

export interface MergeOptions {
  /** Run directories (with shards/…), shard directories or partial.json files. */
  inputs: string[];
  /** Where the merged run directory goes (matrices + run.json). */
  outDir?: string;
  /** Write matrices even when shards are missing, marked `partial: true`. */
  allowPartial?: boolean;
  /** Keep the output folder's lock after the merge (released by the result's releaseLock). */
  holdLock?: boolean;
  /** Messages (a stale lock taken over). */
  onNotice?: (message: string) => void;
}

export interface MergeResult {
  plan: SweepPlan;
  shardCount: number;
  present: number[];
  /** Shard numbers with no finished output. */
  missing: number[];
  /** Of the missing ones, those that started (a journal exists) but did not finish. */
  unfinished: number[];
  matrices: ResponseMatrix[];
  files: string[];
  raysTraced: number;
  /** What was written to run.json (with an outDir), for callers that add to it. */
  runRecord?: RunRecord;
  releaseLock?: () => void;
}

const SHARD_DIR = /^shard-(\d+)-of-(\d+)$/;

interface Found {
  partials: string[];
  /** shard dirs (K, N) holding a journal but no partial.json. */
  started: [number, number][];
}

function findShardOutputs(inputs: string[]): Found {
  const found: Found = { partials: [], started: [] };
  const visitShardDir = (dir: string): void => {
    const m = SHARD_DIR.exec(basename(dir));
    if (existsSync(join(dir, "partial.json"))) found.partials.push(join(dir, "partial.json"));
    else if (m !== null && existsSync(join(dir, "journal.jsonl"))) found.started.push([Number(m[1]), Number(m[2])]);
  };
  for (const input of inputs) {
    if (!existsSync(input)) throw new InputError(`${input}: no such file or directory`);
    if (statSync(input).isFile()) {
      found.partials.push(input);
      continue;
    }
    if (SHARD_DIR.test(basename(input))) {
      visitShardDir(input);
      continue;
    }
    const shardsDir = join(input, "shards");
    if (!existsSync(shardsDir)) throw new InputError(`${input}: not a run directory with shards (no ${shardsDir})`);
    for (const name of readdirSync(shardsDir).sort()) {
      if (SHARD_DIR.test(name)) visitShardDir(join(shardsDir, name));
    }
  }
  return found;
}

/**
 * Joins finished shards into the matrices of the whole study. Point tallies are taken as the shards
 * merged them (in batch order), so the result equals a single-process run bit for bit. Refuses shards
 * of another study hash, tool version or shard count; lists missing shards by number and writes a
 * partial matrix only when asked (allowPartial), marked `partial: true`.
 */
export function mergeShards(options: MergeOptions): MergeResult {
  const found = findShardOutputs(options.inputs);
  if (found.partials.length === 0) {
    const started = found.started.map(([k, n]) => `${k}/${n}`).join(", ");
    throw new InputError(`no finished shard outputs (partial.json) in ${options.inputs.join(", ")}${started ? `; started but unfinished: ${started}` : ""}`);
  }
  const shards: { path: string; s: ShardPartial }[] = found.partials.map((path) => ({ path, s: readShardPartial(path) }));
  const ref = shards[0];
  for (const { path, s } of shards.slice(1)) {
    if (s.plan.studyHash !== ref.s.plan.studyHash) {
      throw new InputError(
        `${path}: shard of a different study (hash ${s.plan.studyHash.slice(0, 16)}, "${s.plan.studyName}") than ${ref.path} (hash ${ref.s.plan.studyHash.slice(0, 16)}, "${ref.s.plan.studyName}"); refusing to merge`,
      );
    }
    if (s.plan.toolVersion !== ref.s.plan.toolVersion) {
      throw new InputError(`${path}: written by lightfold ${s.plan.toolVersion}, ${ref.path} by ${ref.s.plan.toolVersion}; refusing to merge shards of different versions`);
    }
    if (s.plan.buildId !== ref.s.plan.buildId) {
      throw new InputError(`${path}: written by a different build of lightfold ${s.plan.toolVersion} than ${ref.path} (code fingerprint ${s.plan.buildId} vs ${ref.s.plan.buildId}); refusing to merge`);
    }
    if (s.shard.count !== ref.s.shard.count) {
      throw new InputError(`${path}: shard ${s.shard.index} of ${s.shard.count}, but ${ref.path} is of ${ref.s.shard.count}; refusing to mix shard splits`);
    }
    if (canonicalJson({ ...s.plan, baseDir: "" }) !== canonicalJson({ ...ref.s.plan, baseDir: "" })) {
      throw new InputError(`${path}: shard plan differs from ${ref.path} although the study hash matches`);
    }
  }
  const plan = ref.s.plan;
  const count = ref.s.shard.count;
  const byIndex = new Map<number, ShardPartial>();
  for (const { path, s } of shards) {
    if (!(Number.isInteger(s.shard.index) && s.shard.index >= 1 && s.shard.index <= count)) throw new InputError(`${path}: bad shard number ${s.shard.index} of ${count}`);
    const prev = byIndex.get(s.shard.index);
    if (prev !== undefined && canonicalJson(prev.points) !== canonicalJson(s.points)) {
      throw new InputError(`${path}: shard ${s.shard.index} given twice with different contents`);
    }
    byIndex.set(s.shard.index, s);
  }
  const present = [...byIndex.keys()].sort((a, b) => a - b);
  const missing: number[] = [];
  for (let k = 1; k <= count; k++) if (!byIndex.has(k)) missing.push(k);
  const unfinished = found.started.filter(([, n]) => n === count).map(([k]) => k).filter((k) => missing.includes(k));

  if (missing.length > 0 && options.allowPartial !== true) {
    throw new InputError(
      `missing shard${missing.length > 1 ? "s" : ""} ${missing.join(", ")} of ${count}` +
        (unfinished.length > 0 ? ` (started but unfinished: ${unfinished.join(", ")})` : "") +
        `; run them (lightfold sweep <study> --shard K/${count}) and merge again, or pass --allow-partial to write matrices marked partial`,
    );
  }

  // Point tallies: each shard must hold exactly its own points.
  const tallies = new Map<number, Float64Array>();
  let raysTraced = 0;
  const nTotal = totalPoints(plan);
  for (const [k, s] of byIndex) {
    let expected = 0;
    for (let p = 0; p < nTotal; p++) if (inShard(p, s.shard)) expected++;
    if (s.points.length !== expected || s.points.some((p) => !inShard(p, { index: k, count }))) {
      throw new InputError(`shard ${k} of ${count}: holds ${s.points.length} points, expected its ${expected}`);
    }
    s.points.forEach((p, i) => tallies.set(p, s.tallies[i]));
    raysTraced += s.raysTraced;
  }
  const partial = missing.length > 0;
  const matrices = plan.combos.map((_, ci) => matrixFromTallies(plan, ci, (p) => tallies.get(p), partial));
  if (options.outDir === undefined) return { plan, shardCount: count, present, missing, unfinished, matrices, files: [], raysTraced };
  const lock = lockOutputDir(options.outDir, "merge", options.onNotice);
  try {
    const written = writeRunOutputs(options.outDir, plan, matrices, {
      raysTraced,
      raysResumed: 0,
      wallS: Math.max(...[...byIndex.values()].map((s) => s.wallS)),
      shards: count,
      partial,
      missingShards: missing,
    });
    removeStaleTempFiles(options.outDir, ["shards"]);
    const result: MergeResult = { plan, shardCount: count, present, missing, unfinished, matrices, files: written.files, raysTraced, runRecord: written.record };
    if (options.holdLock === true) result.releaseLock = () => lock.release();
    else lock.release();
    return result;
  } catch (err) {
    lock.release();
    throw err;
  }
}
