import { execFileSync, spawnSync } from "node:child_process";
import { chmodSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { afterAll, describe, expect, it } from "vitest";
import { shellJoin, shellQuote } from "../../src/cluster/shellQuote.js";
import { checkSlurmMemory, checkSlurmTime, splitExtraSbatch } from "../../src/cluster/slurmOptions.js";
import { buildSlurmScripts, isSbatchSafePath, type SlurmScriptInput } from "../../src/cluster/slurmScripts.js";
import { InputError } from "../../src/util/errors.js";

const work = mkdtempSync(join(tmpdir(), "lf-slurm-scripts-"));
afterAll(() => rmSync(work, { recursive: true, force: true }));

function input(over: Partial<SlurmScriptInput["job"]> = {}, lightfold = "node /opt/lf/bin/lightfold.js"): SlurmScriptInput {
  return {
    studyPath: "/shared/studies/demo.study.json",
    studyName: "demo pyramids",
    studyHash: "0123456789abcdef0123456789abcdef",
    outDir: join(work, "run"),
    scriptDir: join(work, "run", "slurm"),
    lightfold,
    toolVersion: "0.1.0",
    job: {
      shards: 4,
      cpusPerTask: 2,
      time: "02:00:00",
      mem: "4G",
      mergeTime: "00:30:00",
      mergeMem: "4G",
      jobName: "lf-demo",
      extraSbatch: [],
      ...over,
    },
  };
}

/** The #SBATCH options sbatch would read: it stops at the first line that is neither blank nor a comment (sbatch(1), "DESCRIPTION"). */
function sbatchDirectives(script: string): string[] {
  const out: string[] = [];
  for (const line of script.split("\n").slice(1)) {
    if (line.startsWith("#SBATCH ")) out.push(line.slice("#SBATCH ".length));
    else if (line.trim() !== "" && !line.startsWith("#")) break;
  }
  return out;
}

describe("shellQuote", () => {
  it("survives a real POSIX shell unchanged, whatever the characters", () => {
    // Source: POSIX Shell Command Language §2.2.3 (single quotes preserve every character);
    // checked by letting /bin/sh print each word back.
    const words = ["plain", "with space", "it's", "$HOME", "a\"b", "back\\slash", "", "*", "tab\there", "new\nline", "ü-ß"];
    const printed = execFileSync("/bin/sh", ["-c", `for w in ${shellJoin(words)}; do printf '%s\\0' "$w"; done`], { encoding: "utf8" });
    expect(printed.split("\0").slice(0, -1)).toEqual(words);
    expect(shellQuote("/abs/path-1.2/x_y")).toBe("/abs/path-1.2/x_y");
  });
});

describe("Slurm option checks", () => {
  it("accepts the --time forms of the sbatch manual and rejects others", () => {
    // Source: sbatch(1), option --time: "minutes", "minutes:seconds", "hours:minutes:seconds",
    // "days-hours", "days-hours:minutes" and "days-hours:minutes:seconds".
    for (const t of ["90", "90:30", "02:00:00", "1-12", "1-12:30", "2-00:00:00"]) expect(checkSlurmTime(t, "--time")).toBe(t);
    for (const t of ["2h", "", "1:2:3:4", "-1", "1-"]) expect(() => checkSlurmTime(t, "--time")).toThrow(InputError);
  });

  it("accepts sbatch memory sizes with K/M/G/T suffixes only", () => {
    // Source: sbatch(1), option --mem: "Default units are megabytes. Different units can be specified
    // using the suffix [K|M|G|T]".
    for (const m of ["4G", "500M", "2048", "1T"]) expect(checkSlurmMemory(m, "--mem")).toBe(m);
    for (const m of ["4GB", "0", "1.5G", "-4G"]) expect(() => checkSlurmMemory(m, "--mem")).toThrow(/--mem/);
  });

  it("splits pass-through options and refuses the ones the scripts set themselves", () => {
    expect(splitExtraSbatch(["--qos=low  --constraint=avx2", "--exclusive"], "--extra-sbatch")).toEqual([
      "--qos=low",
      "--constraint=avx2",
      "--exclusive",
    ]);
    expect(() => splitExtraSbatch(["qos=low"], "--extra-sbatch")).toThrow(/starting with "-"/);
    expect(() => splitExtraSbatch(["--array=0-9"], "--extra-sbatch")).toThrow(/set by the generated scripts/);
    expect(() => splitExtraSbatch(["--comment=$USER"], "--extra-sbatch")).toThrow(/quote, \$ or backslash/);
  });

  it("knows which paths can stand on an #SBATCH line", () => {
    expect(isSbatchSafePath("/scratch/u1/run-3")).toBe(true);
    expect(isSbatchSafePath("/scratch/my run")).toBe(false);
    expect(isSbatchSafePath("/scratch/100%")).toBe(false); // % starts a filename pattern in sbatch
  });
});

describe("generated batch scripts", () => {
  it("puts every resource request on #SBATCH lines sbatch will read", () => {
    const set = buildSlurmScripts(input({ partition: "compute", account: "proj42", extraSbatch: ["--qos=low"], maxRunning: 2 }));
    const logs = join(work, "run", "slurm", "logs");
    expect(sbatchDirectives(set.arrayScript)).toEqual([
      "--job-name=lf-demo",
      "--array=1-4%2",
      "--ntasks=1",
      "--cpus-per-task=2",
      "--time=02:00:00",
      "--mem=4G",
      `--output=${logs}/%x_%A_%a.out`,
      `--error=${logs}/%x_%A_%a.err`,
      "--partition=compute",
      "--account=proj42",
      "--qos=low",
    ]);
    expect(sbatchDirectives(set.mergeScript)).toEqual([
      "--job-name=lf-demo-merge",
      "--ntasks=1",
      "--cpus-per-task=1",
      "--time=00:30:00",
      "--mem=4G",
      `--output=${logs}/%x_%j.out`,
      `--error=${logs}/%x_%j.err`,
      "--partition=compute",
      "--account=proj42",
      "--qos=low",
    ]);
  });

  it("hard-codes no partition or account when none is given", () => {
    const set = buildSlurmScripts(input());
    const all = [...sbatchDirectives(set.arrayScript), ...sbatchDirectives(set.mergeScript)];
    expect(all.some((d) => /^--(partition|account|qos)/.test(d))).toBe(false);
    expect(sbatchDirectives(set.arrayScript)).toContain("--array=1-4");
  });

  it("is valid bash (bash -n) and runs the sweep of the task's shard, the merge into <out>/merged", () => {
    const set = buildSlurmScripts(input({}, "echo lightfold"));
    for (const [name, text] of [["a.sh", set.arrayScript], ["m.sh", set.mergeScript], ["s.sh", set.submitScript]]) {
      const path = join(work, name!);
      writeFileSync(path, text!);
      const check = spawnSync("bash", ["-n", path], { encoding: "utf8" });
      expect(check.stderr).toBe("");
      expect(check.status).toBe(0);
    }
    const env = { ...process.env, SLURM_ARRAY_TASK_ID: "2", SLURM_ARRAY_TASK_COUNT: "1", SLURM_ARRAY_TASK_MIN: "2", SLURM_CPUS_PER_TASK: "2" };
    const task = execFileSync("bash", [join(work, "a.sh")], { encoding: "utf8", env });
    // A re-submitted single task sees SLURM_ARRAY_TASK_COUNT=1; the shard count must still be 4.
    expect(task.trim().split("\n").at(-1)).toBe(`lightfold sweep /shared/studies/demo.study.json --out ${join(work, "run")} --shard 2/4`);
    const merge = execFileSync("bash", [join(work, "m.sh")], { encoding: "utf8" });
    expect(merge.trim()).toBe(`lightfold merge ${join(work, "run")} --out ${join(work, "run", "merged")}`);
    const outside = spawnSync("bash", [join(work, "a.sh")], { encoding: "utf8", env: { PATH: process.env.PATH ?? "" } });
    expect(outside.status).not.toBe(0);
    expect(outside.stderr).toMatch(/Slurm array task/);
  });

  it("submit.sh chains the array and an afterok merge, and re-submits chosen shards only", () => {
    const set = buildSlurmScripts(input());
    const bin = join(work, "fakebin");
    const calls = join(work, "sbatch-calls.txt");
    execFileSync("mkdir", ["-p", bin]);
    // Stand-in for sbatch: records its arguments, answers like `sbatch --parsable` on a named cluster.
    writeFileSync(join(bin, "sbatch"), `#!/bin/bash\necho "$*" >> ${shellQuote(calls)}\nn=$(wc -l < ${shellQuote(calls)})\necho "$((100 + n));local"\n`);
    chmodSync(join(bin, "sbatch"), 0o755);
    const submit = join(work, "submit.sh");
    writeFileSync(submit, set.submitScript);
    const env = { ...process.env, PATH: `${bin}:${process.env.PATH ?? ""}` };

    const first = execFileSync("bash", [submit], { encoding: "utf8", env });
    expect(first).toMatch(/shard array job 101 \(shards 1-4 of 4\) and merge job 102/);
    const again = execFileSync("bash", [submit, "2", "--qos=high"], { encoding: "utf8", env });
    expect(again).toMatch(/shard array job 103 \(shards 2 of 4\) and merge job 104/);
    expect(readFileSync(calls, "utf8").trim().split("\n")).toEqual([
      `--parsable ${set.arrayPath}`,
      `--parsable --dependency=afterok:101 ${set.mergePath}`,
      `--parsable --array=2 --qos=high ${set.arrayPath}`,
      `--parsable --dependency=afterok:103 --qos=high ${set.mergePath}`,
    ]);
    const bad = spawnSync("bash", [submit, "0,4"], { encoding: "utf8", env });
    expect(bad.status).toBe(2);
    expect(bad.stderr).toMatch(/shard 0 does not exist \(shards 1-4\)/);
    expect(readFileSync(calls, "utf8").trim().split("\n")).toHaveLength(4);
  });
});
