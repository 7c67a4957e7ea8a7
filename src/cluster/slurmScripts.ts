import { join } from "node:path";
import { shellQuote } from "./shellQuote.js";
import type { SlurmJobOptions } from "./slurmOptions.js";

/** Everything the generated scripts need; all paths absolute (compute nodes see a shared filesystem). */
export interface SlurmScriptInput {
  studyPath: string;
  studyName: string;
  studyHash: string;
  /** Shared run directory the shards write into (`lightfold sweep --out`). */
  outDir: string;
  /** Where the scripts are written; their logs go to <scriptDir>/logs. */
  scriptDir: string;
  /** Command that starts lightfold on a compute node, inserted as written (e.g. "node /opt/lf/bin/lightfold.js"). */
  lightfold: string;
  toolVersion: string;
  job: SlurmJobOptions;
}

export interface SlurmScriptSet {
  arrayPath: string;
  mergePath: string;
  submitPath: string;
  logDir: string;
  mergedDir: string;
  arrayScript: string;
  mergeScript: string;
  submitScript: string;
}

export const ARRAY_SCRIPT_NAME = "sweep-array.sbatch";
export const MERGE_SCRIPT_NAME = "merge.sbatch";
export const SUBMIT_SCRIPT_NAME = "submit.sh";

/** Builds the shard-array batch script, the merge batch script and the submit helper (pure). */
export function buildSlurmScripts(input: SlurmScriptInput): SlurmScriptSet {
  const { job } = input;
  const logDir = join(input.scriptDir, "logs");
  const mergedDir = join(input.outDir, "merged");
  const arrayPath = join(input.scriptDir, ARRAY_SCRIPT_NAME);
  const mergePath = join(input.scriptDir, MERGE_SCRIPT_NAME);
  const submitPath = join(input.scriptDir, SUBMIT_SCRIPT_NAME);
  // Array index = shard number (1..N, as `--shard K/N` and the shard folders count), so the numbers
  // in merge's list of missing shards are the ones to re-submit with --array.
  const arraySpec = `1-${job.shards}${job.maxRunning !== undefined ? `%${job.maxRunning}` : ""}`;
  const header = [
    `# lightfold ${input.toolVersion}: study "${oneLine(input.studyName)}" (hash ${input.studyHash.slice(0, 16)})`,
    `# study file: ${oneLine(input.studyPath)}`,
    `# run directory: ${oneLine(input.outDir)}`,
  ];
  const passThrough = [
    ...(job.partition !== undefined ? [`#SBATCH --partition=${job.partition}`] : []),
    ...(job.account !== undefined ? [`#SBATCH --account=${job.account}`] : []),
    ...job.extraSbatch.map((o) => `#SBATCH ${o}`),
  ];

  const arrayScript = [
    "#!/bin/bash",
    `#SBATCH --job-name=${job.jobName}`,
    `#SBATCH --array=${arraySpec}`,
    "#SBATCH --ntasks=1",
    `#SBATCH --cpus-per-task=${job.cpusPerTask}`,
    `#SBATCH --time=${job.time}`,
    `#SBATCH --mem=${job.mem}`,
    `#SBATCH --output=${join(logDir, "%x_%A_%a.out")}`,
    `#SBATCH --error=${join(logDir, "%x_%A_%a.err")}`,
    ...passThrough,
    ...header,
    `# Array task K = shard K of ${job.shards}. A task that failed, ran out of time or was cancelled is`,
    "# re-run alone (submit.sh K, or sbatch --array=K this script) and resumes from its journal.",
    "set -euo pipefail",
    "",
    "# The shard index comes from Slurm; the shard count is fixed here because a re-submitted",
    "# subset (--array=K) sees SLURM_ARRAY_TASK_COUNT of the subset, not of the whole study.",
    `shard="\${SLURM_ARRAY_TASK_ID:?run this script as a Slurm array task}/${job.shards}"`,
    `echo "lightfold shard \${shard} on \$(hostname) with \${SLURM_CPUS_PER_TASK:-?} CPUs (job \${SLURM_ARRAY_JOB_ID:-?}_\${SLURM_ARRAY_TASK_ID})"`,
    `${input.lightfold} sweep ${shellQuote(input.studyPath)} --out ${shellQuote(input.outDir)} --shard "\${shard}"`,
    "",
  ].join("\n");

  const mergeScript = [
    "#!/bin/bash",
    `#SBATCH --job-name=${job.jobName}-merge`,
    "#SBATCH --ntasks=1",
    "#SBATCH --cpus-per-task=1",
    `#SBATCH --time=${job.mergeTime}`,
    `#SBATCH --mem=${job.mergeMem}`,
    `#SBATCH --output=${join(logDir, "%x_%j.out")}`,
    `#SBATCH --error=${join(logDir, "%x_%j.err")}`,
    ...passThrough,
    ...header,
    `# Joins the ${job.shards} shards into one run directory; submit.sh starts it after every shard succeeded.`,
    "set -euo pipefail",
    "",
    `${input.lightfold} merge ${shellQuote(input.outDir)} --out ${shellQuote(mergedDir)}`,
    "",
  ].join("\n");

  const submitScript = [
    "#!/usr/bin/env bash",
    ...header,
    `# Submits the ${job.shards}-shard array and a merge job that starts only when every array task of`,
    "# that submission succeeded (--dependency=afterok).",
    "#",
    `#   ${SUBMIT_SCRIPT_NAME}             all shards 1-${job.shards}`,
    `#   ${SUBMIT_SCRIPT_NAME} 2           only shard 2 (e.g. after it failed); others already done are kept`,
    `#   ${SUBMIT_SCRIPT_NAME} 1,5-7       a Slurm index list of shards`,
    "#",
    "# Options after the list go to both sbatch calls (e.g. --partition=short, --qos=high).",
    "set -euo pipefail",
    `shards=${job.shards}`,
    `array_script=${shellQuote(arrayPath)}`,
    `merge_script=${shellQuote(mergePath)}`,
    `mkdir -p ${shellQuote(logDir)}`,
    "",
    "array_opt=()",
    'if [ $# -gt 0 ] && [[ "$1" != -* ]]; then',
    '  list=$1; shift',
    '  if ! [[ "$list" =~ ^[0-9]+(-[0-9]+)?(,[0-9]+(-[0-9]+)?)*(%[0-9]+)?$ ]]; then',
    '    echo "submit.sh: expected a shard list such as 2 or 1,5-7, got \\"$list\\"" >&2; exit 2',
    "  fi",
    '  for part in ${list//,/ }; do',
    '    part=${part%%\\%*}',
    '    for n in ${part//-/ }; do',
      '      if (( 10#$n < 1 || 10#$n > shards )); then echo "submit.sh: shard $n does not exist (shards 1-$shards)" >&2; exit 2; fi',
    "    done",
    "  done",
    '  array_opt=(--array="$list")',
    "fi",
    "",
    '# --parsable prints "jobid" or "jobid;cluster".',
    'array_job=$(sbatch --parsable ${array_opt[@]+"${array_opt[@]}"} "$@" "$array_script")',
    "array_job=${array_job%%;*}",
    'merge_job=$(sbatch --parsable --dependency="afterok:${array_job}" "$@" "$merge_script")',
    "merge_job=${merge_job%%;*}",
    `echo "submitted shard array job \${array_job} (shards \${list:-1-${job.shards}} of ${job.shards}) and merge job \${merge_job} (runs after they all succeed)"`,
    'echo "follow with: squeue -j ${array_job},${merge_job}"',
    "",
  ].join("\n");

  return { arrayPath, mergePath, submitPath, logDir, mergedDir, arrayScript, mergeScript, submitScript };
}

/** Text for a comment line: no line breaks. */
function oneLine(text: string): string {
  return text.replace(/[\r\n]+/g, " ");
}

/**
 * True when a path can stand on an #SBATCH line as it is: sbatch reads those lines itself, without a
 * shell, so spaces or quotes there cannot be escaped.
 */
export function isSbatchSafePath(path: string): boolean {
  return /^[A-Za-z0-9_@+=:,./-]+$/.test(path);
}
