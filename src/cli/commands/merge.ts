import type { Command } from "commander";
import { mergeShards } from "../../sweep/mergeShards.js";
import { writeRunPhotocurrent } from "../../weighting/runSummaries.js";
import { comboTable } from "./sweep.js";

export function register(program: Command): void {
  program
    .command("merge")
    .description("join the shards of a sharded sweep into the study's matrices (bit-identical to a single run)")
    .argument("<inputs...>", "run directory with shards/, shard directories, or shard partial.json files")
    .requiredOption("--out <dir>", "run directory to write (matrices + run.json)")
    .option("--allow-partial", "write matrices even when shards are missing, marked partial: true")
    .option("--json", "print the summary as JSON")
    .addHelpText(
      "after",
      `
Examples:
  lightfold merge runs/big --out runs/big/merged
  lightfold merge a/shards/shard-1-of-2 b/shards/shard-2-of-2 --out merged
  lightfold merge runs/big --out runs/big/preview --allow-partial

Refuses shards of a different study hash, lightfold version or shard count. Missing shards are
listed by number (exit 2) unless --allow-partial is given.`,
    )
    .action((inputs: string[], flags: { out: string; allowPartial?: boolean; json?: boolean }) => {
      const notice = (m: string): void => void process.stderr.write(`lightfold merge: ${m}\n`);
      const merged = mergeShards({ inputs, outDir: flags.out, allowPartial: flags.allowPartial === true, holdLock: true, onNotice: notice });
      let files: string[];
      try {
        // The merge writes matrices and run.json; the spectral weighting adds the photocurrent summaries.
        files = merged.runRecord === undefined ? merged.files : writeRunPhotocurrent(flags.out, merged.plan, merged.matrices, merged.runRecord, notice);
      } finally {
        merged.releaseLock?.();
      }
      const { releaseLock: _l, ...rest } = merged;
      const r = { ...rest, files };
      if (flags.json === true) {
        const { matrices: _m, plan, runRecord: _r, ...rest } = r;
        process.stdout.write(JSON.stringify({ study: plan.studyName, studyHash: plan.studyHash, partial: r.missing.length > 0, ...rest }, null, 2) + "\n");
        return;
      }
      const lines = [
        `${r.plan.studyName}: merged ${r.present.length} of ${r.shardCount} shards (${r.raysTraced.toExponential(3)} rays)`,
      ];
      if (r.missing.length > 0) lines.push(`  PARTIAL: missing shard${r.missing.length > 1 ? "s" : ""} ${r.missing.join(", ")}; matrices are marked partial: true`);
      lines.push(...r.files.map((f) => `  wrote ${f}`));
      if (r.plan.combos.length > 1 && r.missing.length === 0) lines.push(...comboTable(flags.out));
      process.stdout.write(lines.join("\n") + "\n");
    });
}
