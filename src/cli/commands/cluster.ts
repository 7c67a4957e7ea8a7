import { chmodSync, mkdirSync } from "node:fs";
import { basename, join, resolve } from "node:path";
import type { Command } from "commander";
import { shellQuote } from "../../cluster/shellQuote.js";
import {
  checkSlurmMemory,
  checkSlurmTime,
  checkSlurmWord,
  parseWholeNumber,
  splitExtraSbatch,
  type SlurmJobOptions,
} from "../../cluster/slurmOptions.js";
import { buildSlurmScripts, isSbatchSafePath } from "../../cluster/slurmScripts.js";
import { loadStudy } from "../../study/load.js";
import { writeFileAtomic } from "../../util/atomicWrite.js";
import { InputError } from "../../util/errors.js";
import { packageRoot } from "../../util/packageRoot.js";
import { toolVersion } from "../../util/version.js";

interface SlurmScriptFlags {
  shards: string;
  cpusPerTask: string;
  time: string;
  mem: string;
  outDir: string;
  scriptDir?: string;
  jobName?: string;
  partition?: string;
  account?: string;
  maxRunning?: string;
  extraSbatch: string[];
  mergeTime: string;
  mergeMem?: string;
  lightfold?: string;
  json?: boolean;
}

/** `lightfold slurm-script <study> --shards N --time T --mem M --out-dir DIR …` */
export function register(program: Command): void {
  program
    .command("slurm-script")
    .description("write a ready-to-submit Slurm job array (one shard per task), its merge job and a submit helper")
    .argument("<study>", "study file (*.study.json) on a filesystem the compute nodes share")
    .requiredOption("--shards <n>", "number of shards = array tasks")
    .requiredOption("--time <limit>", "wall-clock limit per shard, as sbatch --time (e.g. 02:00:00)")
    .requiredOption("--mem <size>", "memory per shard, as sbatch --mem (e.g. 4G)")
    .requiredOption("--out-dir <dir>", "shared run directory the shards write into")
    .option("--cpus-per-task <n>", "CPUs per shard; the sweep's worker pool uses what Slurm grants", "1")
    .option("--script-dir <dir>", "where to write the scripts (default <out-dir>/slurm; logs in its logs/)")
    .option("--job-name <name>", "job name (default lf-<study name>)")
    .option("--partition <name>", "sbatch --partition for both jobs")
    .option("--account <name>", "sbatch --account for both jobs")
    .option("--max-running <n>", "run at most n shards at once (--array=1-N%n)")
    .option("--extra-sbatch <options>", "further sbatch options for both jobs, e.g. \"--qos=low\" (repeatable)", collect, [])
    .option("--merge-time <limit>", "wall-clock limit of the merge job", "00:30:00")
    .option("--merge-mem <size>", "memory of the merge job (default: --mem)")
    .option("--lightfold <command>", "command that starts lightfold on the compute nodes (default: this install, absolute paths)")
    .option("--json", "print the written files as JSON")
    .addHelpText(
      "after",
      `
Examples:
  lightfold slurm-script configs/demo-random-pyramids.study.json --shards 16 --cpus-per-task 4 \\
      --time 04:00:00 --mem 8G --out-dir /scratch/$USER/demo --partition compute
      -> /scratch/$USER/demo/slurm/{sweep-array.sbatch, merge.sbatch, submit.sh}
  bash /scratch/$USER/demo/slurm/submit.sh
      submits the 16-task array, then the merge (afterok) -> /scratch/$USER/demo/merged
  bash /scratch/$USER/demo/slurm/submit.sh 5
      re-runs shard 5 alone (it resumes from its journal) and merges again
  lightfold slurm-script my.study.json --shards 4 --time 30 --mem 2G --out-dir runs/my \\
      --account proj42 --extra-sbatch "--qos=short --constraint=avx2" \\
      --lightfold "module load nodejs/20 && node /opt/lightfold/bin/lightfold.js"`,
    )
    .action((studyArg: string, flags: SlurmScriptFlags) => {
      const written = writeSlurmScripts(studyArg, flags);
      if (flags.json) {
        process.stdout.write(JSON.stringify(written) + "\n");
      } else {
        process.stdout.write(`wrote ${written.arrayScript}\nwrote ${written.mergeScript}\nwrote ${written.submitScript}\n`);
        process.stdout.write(`submit with: bash ${shellQuote(written.submitScript)}\n`);
      }
    });
}

function collect(value: string, previous: string[]): string[] {
  return [...previous, value];
}

interface WrittenScripts {
  study: string;
  studyHash: string;
  shards: number;
  outDir: string;
  mergedDir: string;
  logDir: string;
  arrayScript: string;
  mergeScript: string;
  submitScript: string;
}

function writeSlurmScripts(studyArg: string, flags: SlurmScriptFlags): WrittenScripts {
  const study = loadStudy(studyArg);
  const outDir = resolve(flags.outDir);
  const scriptDir = resolve(flags.scriptDir ?? join(outDir, "slurm"));
  for (const [option, dir] of [["--out-dir", outDir], ["--script-dir", scriptDir]] as const) {
    if (!isSbatchSafePath(dir)) {
      throw new InputError(`${option}: "${dir}" holds spaces, quotes or %, which #SBATCH lines cannot carry; choose a plain path`, "e.g. a folder name of letters, digits, '-', '_', '.' and '/'");
    }
  }
  const job: SlurmJobOptions = {
    shards: parseWholeNumber(flags.shards, "--shards", 1, 100_000),
    cpusPerTask: parseWholeNumber(flags.cpusPerTask, "--cpus-per-task", 1, 4096),
    time: checkSlurmTime(flags.time, "--time"),
    mem: checkSlurmMemory(flags.mem, "--mem"),
    mergeTime: checkSlurmTime(flags.mergeTime, "--merge-time"),
    mergeMem: checkSlurmMemory(flags.mergeMem ?? flags.mem, "--merge-mem"),
    jobName: checkSlurmWord(flags.jobName ?? defaultJobName(study.name, studyArg), "--job-name"),
    extraSbatch: splitExtraSbatch(flags.extraSbatch, "--extra-sbatch"),
    ...(flags.partition !== undefined ? { partition: checkSlurmWord(flags.partition, "--partition") } : {}),
    ...(flags.account !== undefined ? { account: checkSlurmWord(flags.account, "--account") } : {}),
    ...(flags.maxRunning !== undefined ? { maxRunning: parseWholeNumber(flags.maxRunning, "--max-running", 1, 100_000) } : {}),
  };
  const lightfold = flags.lightfold?.trim() || defaultLightfoldCommand();
  const set = buildSlurmScripts({
    studyPath: study.path,
    studyName: study.name,
    studyHash: study.hash,
    outDir,
    scriptDir,
    lightfold,
    toolVersion: toolVersion(),
    job,
  });
  // Slurm does not create the folder of --output/--error; a missing one makes the task fail unseen.
  mkdirSync(set.logDir, { recursive: true });
  for (const [path, text] of [[set.arrayPath, set.arrayScript], [set.mergePath, set.mergeScript], [set.submitPath, set.submitScript]] as const) {
    writeFileAtomic(path, text);
    chmodSync(path, 0o755);
  }
  return {
    study: study.path,
    studyHash: study.hash,
    shards: job.shards,
    outDir,
    mergedDir: set.mergedDir,
    logDir: set.logDir,
    arrayScript: set.arrayPath,
    mergeScript: set.mergePath,
    submitScript: set.submitPath,
  };
}

/** "node" and bin/lightfold.js of this install, by absolute path, so the compute node runs the same build. */
export function defaultLightfoldCommand(): string {
  return `${shellQuote(process.execPath)} ${shellQuote(join(packageRoot(), "bin", "lightfold.js"))}`;
}

function defaultJobName(studyName: string, studyArg: string): string {
  const fromName = studyName.replace(/[^A-Za-z0-9_.-]+/g, "-").replace(/^-+|-+$/g, "");
  const base = fromName !== "" ? fromName : basename(studyArg).replace(/\.study\.json$|\.json$/, "").replace(/[^A-Za-z0-9_.-]+/g, "-");
  return `lf-${base || "study"}`.slice(0, 40);
}
