import { join } from "node:path";
import { insideDir, requireSafeSegment } from "../util/safePath.js";
import type { ShardSpec } from "./plan.js";

/** File layout of a run directory (docs/contracts.md, Run directory). */
export function runJsonPath(outDir: string): string {
  return join(outDir, "run.json");
}

/** A combination's matrix; the label must be a plain folder name and the path stays inside outDir. */
export function matrixPath(outDir: string, comboLabel: string): string {
  requireSafeSegment(comboLabel, "combination label");
  return insideDir(outDir, join(outDir, comboLabel, "matrix.json"));
}

export function shardDir(outDir: string, shard: ShardSpec): string {
  return join(outDir, "shards", `shard-${shard.index}-of-${shard.count}`);
}

/** Journal of a whole run (out/journal.jsonl) or of one shard (out/shards/shard-K-of-N/journal.jsonl). */
export function journalPath(outDir: string, shard: ShardSpec | null): string {
  return shard === null ? join(outDir, "journal.jsonl") : join(shardDir(outDir, shard), "journal.jsonl");
}

export function shardPartialPath(outDir: string, shard: ShardSpec): string {
  return join(shardDir(outDir, shard), "partial.json");
}
