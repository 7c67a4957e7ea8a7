import { existsSync, readdirSync, rmdirSync, rmSync } from "node:fs";
import { dirname, resolve } from "node:path";
import { lockOutputDir, removeStaleTempFiles, type OutputLock } from "../util/outputLock.js";
import type { JournalWriter } from "./journal.js";
import type { ShardSpec } from "./plan.js";
import { shardDir } from "./sweepPaths.js";

/**
 * The folder a sweep writes (the run folder, or its shard's folder), held under an exclusive lock
 * for the run. On failure before any task was journaled, the run leaves nothing behind: its empty
 * journal and the folders it created go. On success, temporary files of earlier killed runs go.
 */
export class RunFolder {
  private constructor(readonly dir: string, private readonly lock: OutputLock, private readonly created: string[]) {}

  static open(outDir: string, shard: ShardSpec | null, notice: (m: string) => void): RunFolder {
    const dir = shard === null ? outDir : shardDir(outDir, shard);
    const created: string[] = [];
    for (let d = resolve(dir); !existsSync(d); d = dirname(d)) created.push(d);
    const lock = lockOutputDir(dir, shard === null ? "sweep" : `sweep shard ${shard.index}/${shard.count}`, notice);
    return new RunFolder(dir, lock, created);
  }

  /** After a failure: removes a journal without finished tasks and the (then empty) folders created. */
  abandon(journal: JournalWriter | undefined): void {
    if (journal !== undefined && journal.empty) rmSync(journal.path, { force: true });
    this.lock.release();
    for (const d of this.created) {
      if (existsSync(d) && readdirSync(d).length === 0) rmdirSync(d);
    }
  }

  /**
   * After success: removes stale temporary files (not those of shards beside a whole run) and
   * releases the lock, or, with `hold`, returns the release for a caller that writes more there.
   */
  finish(hold = false): (() => void) | undefined {
    removeStaleTempFiles(this.dir, ["shards"]);
    if (hold) return () => this.lock.release();
    this.lock.release();
    return undefined;
  }
}
