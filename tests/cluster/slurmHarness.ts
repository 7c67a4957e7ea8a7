// Test helpers: a throwaway single-node Slurm cluster (scripts/slurm/start.sh) and job polling.
import { execFile, execFileSync } from "node:child_process";
import { existsSync, mkdtempSync, readFileSync } from "node:fs";
import { createServer } from "node:net";
import { tmpdir } from "node:os";
import { delimiter, join, resolve } from "node:path";
import { promisify } from "node:util";

const run = promisify(execFile);
export const repoRoot = resolve(import.meta.dirname, "..", "..");
const SLURM_BINARIES = ["munged", "slurmctld", "slurmd", "sbatch", "squeue", "scontrol", "scancel", "sinfo"];

function onPath(bin: string): boolean {
  const dirs = [...(process.env.PATH ?? "").split(delimiter), "/usr/sbin", "/sbin"];
  return dirs.some((d) => d !== "" && existsSync(join(d, bin)));
}

/** Why a real cluster cannot be started here (undefined: it can). */
export function slurmUnavailableReason(): string | undefined {
  if (process.platform !== "linux") return `Slurm needs Linux (this is ${process.platform})`;
  if (typeof process.getuid !== "function" || process.getuid() !== 0) {
    return "not running as root (slurmd, munged and the apt install of slurm-wlm/munge in .ci/run need root)";
  }
  const missing = SLURM_BINARIES.filter((b) => !onPath(b));
  if (missing.length > 0) {
    return `Slurm binaries missing after the install step of .ci/run: ${missing.join(", ")} (apt-get install slurm-wlm munge)`;
  }
  return undefined;
}

async function freePort(): Promise<number> {
  return new Promise((res, rej) => {
    const srv = createServer();
    srv.once("error", rej);
    srv.listen(0, "0.0.0.0", () => {
      const addr = srv.address();
      const port = typeof addr === "object" && addr !== null ? addr.port : 0;
      srv.close(() => res(port));
    });
  });
}

export interface TestCluster {
  dir: string;
  /** Environment for clients and for the jobs (sbatch passes it on): a plain one, plus SLURM_CONF. */
  env: NodeJS.ProcessEnv;
}

/** Starts munged + slurmctld + slurmd with state in a fresh temp dir; throws with their logs if not. */
export async function startCluster(): Promise<TestCluster> {
  const dir = mkdtempSync(join(tmpdir(), "lf-slurm-"));
  const ctld = await freePort();
  let slurmd = await freePort();
  while (slurmd === ctld) slurmd = await freePort();
  try {
    const { stdout } = await run("bash", [join(repoRoot, "scripts", "slurm", "start.sh"), dir, String(ctld), String(slurmd)], {
      encoding: "utf8",
      timeout: 60_000,
    });
    const conf = /SLURM_CONF=(\S+)/.exec(stdout)?.[1];
    if (conf === undefined) throw new Error(`start.sh printed no SLURM_CONF: ${stdout}`);
    const env: NodeJS.ProcessEnv = {
      PATH: `${process.env.PATH ?? "/usr/bin:/bin"}:/usr/sbin:/sbin`,
      HOME: process.env.HOME ?? "/root",
      LANG: "C.UTF-8",
      SLURM_CONF: conf,
    };
    return { dir, env };
  } catch (err) {
    // Whatever came up must still go down.
    stopClusterSync(dir);
    const e = err as { stderr?: string; message: string };
    throw new Error(`scripts/slurm/start.sh failed: ${e.message}\n${e.stderr ?? ""}`);
  }
}

/** Cancels the cluster's jobs and stops its daemons by the pids start.sh recorded. */
export function stopClusterSync(dir: string): string {
  return execFileSync("bash", [join(repoRoot, "scripts", "slurm", "stop.sh"), dir], { encoding: "utf8", timeout: 60_000 });
}

export async function slurm(cluster: TestCluster, cmd: string, args: string[]): Promise<string> {
  const { stdout } = await run(cmd, args, { env: cluster.env, encoding: "utf8", timeout: 30_000 });
  return stdout;
}

/** States of a job's records ("12_1" → "COMPLETED", …); finished ones stay listed for MinJobAge. */
export async function jobStates(cluster: TestCluster, jobId: string): Promise<Map<string, string>> {
  const out = await slurm(cluster, "squeue", ["-h", "-t", "all", "-j", jobId, "-o", "%i %T %r"]);
  const states = new Map<string, string>();
  for (const line of out.trim().split("\n")) {
    const [id, state, reason] = line.trim().split(/\s+/);
    if (id !== undefined && state !== undefined) states.set(id, reason && state === "PENDING" ? `${state}:${reason}` : state);
  }
  return states;
}

const ACTIVE = /^(PENDING|RUNNING|CONFIGURING|COMPLETING|SUSPENDED|REQUEUED|RESIZING|SIGNALING|STAGE_OUT)/;

export async function sleep(ms: number): Promise<void> {
  await new Promise((r) => setTimeout(r, ms));
}

/** Polls until `done()` is true; throws after timeoutMs with what was last seen. */
export async function waitFor<T>(what: string, timeoutMs: number, probe: () => Promise<T>, done: (v: T) => boolean, intervalMs = 500): Promise<T> {
  const t0 = Date.now();
  let last: T = await probe();
  while (!done(last)) {
    if (Date.now() - t0 > timeoutMs) throw new Error(`timed out after ${timeoutMs} ms waiting for ${what}; last seen: ${show(last)}`);
    await sleep(intervalMs);
    last = await probe();
  }
  return last;
}

function show(v: unknown): string {
  return v instanceof Map ? JSON.stringify([...v.entries()]) : JSON.stringify(v);
}

/** Waits until no record of the job is pending or running (dependency-blocked merges excepted). */
export async function waitForJobEnd(cluster: TestCluster, jobId: string, timeoutMs: number): Promise<Map<string, string>> {
  return waitFor(`job ${jobId} to end`, timeoutMs, () => jobStates(cluster, jobId), (m) =>
    m.size > 0 && [...m.values()].every((s) => !ACTIVE.test(s) || s === "PENDING:DependencyNeverSatisfied"));
}

/** Submits with the generated submit.sh; returns the array and merge job ids it printed. */
export async function submit(cluster: TestCluster, submitScript: string, args: string[] = []): Promise<{ arrayJob: string; mergeJob: string }> {
  const out = await slurm(cluster, "bash", [submitScript, ...args]);
  const m = /shard array job (\d+) .* merge job (\d+)/.exec(out);
  if (m === null) throw new Error(`submit.sh printed no job ids: ${out}`);
  return { arrayJob: m[1]!, mergeJob: m[2]! };
}

export function readText(path: string): string {
  return existsSync(path) ? readFileSync(path, "utf8") : "";
}
