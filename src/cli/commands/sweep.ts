import { makeReport } from "../../report/makeReport.js";
import { basename, join } from "node:path";
import type { Command } from "commander";
import { loadStudy, withOverrides } from "../../study/load.js";
import { parseRays } from "../../study/rays.js";
import { samplingFlag } from "../samplingFlag.js";
import type { RaysPlan } from "../../study/studyTypes.js";
import { InputError } from "../../util/errors.js";
import { createProgressReporter } from "../../sweep/progressReporter.js";
import { runSweep } from "../../sweep/runSweep.js";
import { resolveShard } from "../../sweep/shardSource.js";
import { journalPath } from "../../sweep/sweepPaths.js";
import { existsSync, readFileSync } from "node:fs";
import { writeRunPhotocurrent } from "../../weighting/runSummaries.js";
import { releaseAllLocks } from "../../util/outputLock.js";
import { countFlag, MAX_WORKERS } from "../countFlag.js";
import type { BestCombo } from "../../sweep/runFiles.js";

interface SweepFlags {
  report?: boolean;
  out?: string;
  workers?: string;
  resume?: boolean;
  fresh?: boolean;
  shard?: string;
  quiet?: boolean;
  json?: boolean;
  targetError?: string;
  channels?: string;
  maxRays?: string;
  sampling?: string;
}

/** A rays plan built from flags; a refusal names the flag that caused it. */
function flagRays(build: () => RaysPlan, flag: string): RaysPlan {
  try {
    return build();
  } catch (err) {
    if (err instanceof InputError) throw new InputError(`${flag}: ${err.message}`, err.hint);
    throw err;
  }
}

/** Default run directory: runs/<study file name without .study.json>. */
export function defaultOutDir(studyPath: string): string {
  return join("runs", basename(studyPath).replace(/\.study\.json$|\.json$/, ""));
}

function positiveInt(text: string, flag: string, max: number): number {
  return countFlag(text, flag, 1, max, "run `lightfold sweep --help` for each flag's form and examples");
}

export function register(program: Command): void {
  program
    .command("sweep")
    .description("trace a study's grid on a worker-thread pool into response matrices (journaled, resumable, shardable)")
    .argument("<study>", "study file (JSON)")
    .option("--out <dir>", "run directory (default: runs/<study name>)")
    .option("--workers <n>", "worker threads (default: SLURM_CPUS_PER_TASK when set, else all available cores)")
    .option("--resume", "resume from the run directory's journal (also automatic when the journal matches the study)")
    .option("--fresh", "set an existing journal aside and start again")
    .option("--shard <K/N>", "run shard K of N (default: from SLURM_ARRAY_TASK_ID/SLURM_ARRAY_TASK_COUNT inside a Slurm array)")
    .option("--target-error <se>", "per point, add batches until the standard error of each --channels entry is below <se>")
    .option("--channels <list>", "channels for --target-error, comma-separated (default: A_absorber)")
    .option("--max-rays <n>", "most rays per point with --target-error (default: 200000)")
    .option("--sampling <kind>", "launch sampling, random or sobol, instead of the study's rays.sampling (default: sobol with 16+ batches per point, else random; part of the run hash)")
    .option("--no-report", "do not write <out>/report/index.html at the end")
    .option("--quiet", "no progress output")
    .option("--json", "print the final summary as JSON")
    .addHelpText(
      "after",
      `
Examples:
  lightfold sweep configs/demo-random-pyramids.study.json
  lightfold sweep configs/bench-pyramids.study.json --out runs/bench --workers 8
  lightfold sweep my.study.json --out /scratch/run1 --shard 3/16     then: lightfold merge /scratch/run1 --out /scratch/run1/merged
  lightfold sweep my.study.json --target-error 0.002 --channels A_absorber,R
  lightfold sweep my.study.json --sampling random    (independent launch points where the study would get Sobol' points)

Interrupted runs (Ctrl-C, kill -9, a pre-empted job) resume from <out>/journal.jsonl when started again
with the same study; a changed study sets the old journal aside and starts afresh.`,
    )
    .action(async (studyPath: string, flags: SweepFlags) => {
      let study = loadStudy(studyPath);
      // The launch sampling the flag or the study names; unnamed, each plan gets its default (rays.ts).
      const sampling = samplingFlag(flags.sampling);
      const asked = sampling ?? study.raysAsWritten.sampling;
      if (sampling !== undefined && flags.targetError === undefined) {
        const rays = flagRays(() => parseRays({ ...study.raysAsWritten, sampling }, "rays"), `--sampling ${sampling}`);
        study = withOverrides(study, { rays });
      }
      if (flags.targetError !== undefined) {
        const se = Number(flags.targetError);
        if (!(se > 0 && se < 0.5)) throw new InputError(
          `--target-error: expected a standard error in (0, 0.5), got ${JSON.stringify(flags.targetError)}`,
          "a fraction of incident power, e.g. --target-error 0.002",
        );
        const base = study.combos[0].study.rays;
        const maxPerPoint = flags.maxRays === undefined ? 200_000 : positiveInt(flags.maxRays, "--max-rays", 1e9);
        const channels = (flags.channels ?? (base.mode === "target" ? base.channels.join(",") : "A_absorber")).split(",").map((c) => c.trim()).filter((c) => c !== "");
        // A sampling the flag or the study names is kept (Sobol' starts with one batch per replica
        // group); unnamed, the target-error default: random (its first look comes after two batches).
        const rays = flagRays(
          () => parseRays({ targetStdErr: se, channels, maxPerPoint, batch: base.batch, ...(asked !== undefined ? { sampling: asked } : {}) }, "rays"),
          sampling !== undefined ? `--target-error with --sampling ${sampling}` : "--target-error",
        );
        study = withOverrides(study, { rays });
      } else if (flags.channels !== undefined || flags.maxRays !== undefined) {
        throw new InputError("--channels and --max-rays go with --target-error", "e.g. --target-error 0.002 --channels A_absorber,R --max-rays 200000");
      }
      const outDir = flags.out ?? defaultOutDir(studyPath);
      const shard = resolveShard(flags.shard);
      const workers = flags.workers === undefined ? undefined : positiveInt(flags.workers, "--workers", MAX_WORKERS);
      if (flags.resume === true && flags.fresh === true) throw new InputError("--resume and --fresh exclude each other", "--resume continues the run in --out; --fresh sets its journal aside and starts again");
      const say = (line: string): void => {
        if (flags.quiet !== true) process.stderr.write(`lightfold sweep: ${line}\n`);
      };
      if (flags.resume === true && !existsSync(journalPath(outDir, shard))) say(`no journal in ${outDir} to resume from; starting`);
      if (shard !== null) say(`shard ${shard.index} of ${shard.count}`);
      const reporter = createProgressReporter(flags.quiet === true ? "quiet" : "auto");
      // Ctrl-C: say where the work is, then let the signal end the process as usual (the journal
      // already holds every finished task).
      const onInterrupt = (signal: NodeJS.Signals): void => {
        reporter.stop();
        releaseAllLocks();
        process.stderr.write(`\nlightfold sweep: interrupted; finished tasks are in ${journalPath(outDir, shard)}; run the same command again to resume\n`);
        process.kill(process.pid, signal);
      };
      process.once("SIGINT", onInterrupt);
      process.once("SIGTERM", onInterrupt);
      let result;
      try {
        result = await runSweep({
          study,
          outDir,
          workers,
          shard,
          fresh: flags.fresh === true,
          holdLock: true,
          onProgress: (p) => reporter.update(p),
          onNotice: (m) => {
            // Journal notices are worth seeing even when quiet.
            process.stderr.write(`lightfold sweep: ${m}\n`);
          },
        });
      } catch (err) {
        // Name the study file in input errors found while running (e.g. a channel name); those about
        // the run folder (lock, journal) already name it.
        if (err instanceof InputError && !err.message.startsWith(studyPath) && !err.message.startsWith(outDir)) throw new InputError(`${studyPath}: ${err.message}`, err.hint);
        throw err;
      } finally {
        reporter.stop();
        process.off("SIGINT", onInterrupt);
        process.off("SIGTERM", onInterrupt);
      }
      // The sweep writes matrices and run.json; the spectral weighting adds the photocurrent summaries
      // and the report comes last, all under the run folder's lock.
      let files: string[];
      let report: string | null;
      try {
        files = result.runRecord === undefined ? result.files
          : writeRunPhotocurrent(outDir, result.plan, result.matrices, result.runRecord, (m) => process.stderr.write(`lightfold sweep: ${m}\n`));
        report = shard === null && flags.report !== false ? makeReport([outDir]).indexPath : null;
      } finally {
        result.releaseLock?.();
      }
      const summary = {
        study: study.name,
        studyHash: study.hash,
        outDir,
        shard,
        workers: result.workers,
        wallS: result.wallS,
        raysTraced: result.raysTraced,
        raysResumed: result.raysResumed,
        raysPerS: result.wallS > 0 ? result.raysTraced / result.wallS : 0,
        damagedJournalLines: result.damagedJournalLines,
        files,
        report,
      };
      if (flags.json === true) {
        process.stdout.write(JSON.stringify(summary, null, 2) + "\n");
        return;
      }
      const lines = [
        `${study.name}: ${result.raysTraced.toExponential(3)} rays traced${result.raysResumed > 0 ? ` (+${result.raysResumed.toExponential(3)} from the journal)` : ""} in ${result.wallS.toFixed(1)} s on ${result.workers} worker(s), ${Math.round(summary.raysPerS)} rays/s`,
        ...(files.length <= 6
          ? files.map((f) => `  wrote ${f}`)
          : [`  wrote ${files.length} files under ${outDir}: run.json and per combination <combo>/matrix.json, photocurrent.json, iam.csv`]),
      ];
      if (shard === null) lines.push(...comboTable(outDir));
      if (summary.report) lines.push(`  report ${summary.report}`);
      if (shard !== null) lines.push(`  shard ${shard.index}/${shard.count} done; when all shards are done: lightfold merge ${outDir} --out <dir>`);
      process.stdout.write(lines.join("\n") + "\n");
    });
}

/**
 * Summary table from run.json, one line per combination (one line without a sweep): the values in
 * words, the absorber photocurrent at the first grid direction, the front loss there split into
 * R_first and R_escape (when photocurrent.json has them) and the hash its matrix.json carries.
 */
export function comboTable(outDir: string): string[] {
  const run = JSON.parse(readFileSync(join(outDir, "run.json"), "utf8")) as {
    combos: { label: string; title?: string; values: Record<string, number>; studyHash: string; jscFirstDirection?: { thetaDeg: number; phiDeg: number | string; jscMaCm2: number; jscStderrMaCm2: number } }[];
    bestCombo?: BestCombo;
  };
  const best = run.bestCombo;
  const first = run.combos.find((c) => c.jscFirstDirection !== undefined)?.jscFirstDirection;
  const where = first === undefined ? "" : `θ=${first.thetaDeg}°, φ ${first.phiDeg === "averaged" ? "averaged" : `${first.phiDeg}°`}`;
  const swept = run.combos.length > 1 || Object.keys(run.combos[0]!.values).length > 0;
  // The front loss split by history at the first direction, from each combination's photocurrent.json.
  const split = run.combos.map((c) => frontSplit(join(outDir, c.label, "photocurrent.json")));
  const withSplit = split.every((x) => x !== undefined);
  const head = [
    "combo",
    ...(swept ? ["parameters"] : []),
    first !== undefined ? `Jsc (${where}) mA/cm²` : "Jsc mA/cm²",
    ...(withSplit ? ["R first mA/cm²", "R escape mA/cm²"] : []),
    "matrix hash",
  ];
  const rows = run.combos.map((c, i) => [
    c.label,
    ...(swept ? [c.title ?? Object.entries(c.values).map(([k, v]) => `${k}=${v}`).join(", ")] : []),
    c.jscFirstDirection === undefined ? "–" : `${c.jscFirstDirection.jscMaCm2.toFixed(3)} ± ${c.jscFirstDirection.jscStderrMaCm2.toFixed(3)}`,
    ...(withSplit ? [split[i]![0].toFixed(3), split[i]![1].toFixed(3)] : []),
    c.studyHash.slice(0, 16),
    best !== undefined && c.label === best.label ? `← best: ${bestNote(best)}` : "",
  ]);
  head.push("");
  const widths = head.map((h, i) => Math.max(h.length, ...rows.map((r) => r[i]!.length)));
  const fmt = (r: string[]): string => ("  " + r.map((v, i) => v.padEnd(widths[i]!)).join("  ")).trimEnd();
  return [fmt(head), ...rows.map(fmt)];
}

/**
 * R_first and R_escape in mA/cm² at the first direction of a photocurrent.json written by this run,
 * or undefined when the file or the split channels are missing (older matrices carry one R).
 */
function frontSplit(path: string): [number, number] | undefined {
  if (!existsSync(path)) return undefined;
  let pc: { directions?: { losses?: { channel: string; currentMaCm2: number }[] }[] };
  try {
    pc = JSON.parse(readFileSync(path, "utf8")) as typeof pc;
  } catch {
    return undefined;
  }
  const losses = pc.directions?.[0]?.losses ?? [];
  const a = losses.find((l) => l.channel === "R_first");
  const b = losses.find((l) => l.channel === "R_escape");
  return a === undefined || b === undefined ? undefined : [a.currentMaCm2, b.currentMaCm2];
}

/**
 * "+0.0610 ± 0.0061 paired over p1 (± 0.0318 if independent)" (mA/cm²); without a paired error
 * "+0.0610 ± 0.0318 independent over p1 (not paired: <reason>)".
 */
function bestNote(b: BestCombo): string {
  const delta = `+${b.deltaJscMaCm2.toFixed(4)}`;
  if (typeof b.deltaStderrMaCm2 === "number" && Number.isFinite(b.deltaStderrMaCm2)) {
    return `${delta} ± ${b.deltaStderrMaCm2.toFixed(4)} paired over ${b.runnerUp} (± ${b.independentStderrMaCm2.toFixed(4)} if independent)`;
  }
  return `${delta} ± ${b.independentStderrMaCm2.toFixed(4)} independent over ${b.runnerUp} (not paired: ${b.pairingReason ?? "no pairing groups"})`;
}
