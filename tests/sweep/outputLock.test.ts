import { spawn, spawnSync } from "node:child_process";
import { existsSync, mkdirSync, readdirSync, readFileSync, writeFileSync } from "node:fs";
import { hostname } from "node:os";
import { join } from "node:path";
import { describe, expect, it } from "vitest";
import { runSweep } from "../../src/sweep/runSweep.js";
import { LOCK_FILE } from "../../src/util/outputLock.js";
import { runMain } from "../helpers/cli.js";
import { STAND_IN_TRACER, tempDir, tinyDoc, tinyStudy } from "./helpers.js";

/** The pid of a process that has already exited (for stale locks and temp files). */
function deadPid(): number {
  const r = spawnSync(process.execPath, ["-e", "process.stdout.write(String(process.pid))"], { encoding: "utf8" });
  return Number(r.stdout);
}

describe("one run per output folder (lock with the holder's pid)", () => {
  it("a second sweep into the same --out while the first runs is refused, naming the holder; the first finishes", async () => {
    const out = tempDir("lock");
    const study = tinyStudy({ rays: { perPoint: 2000, batch: 100 } });
    const first = runSweep({ study, outDir: out, workers: 1 });
    // Wait until the first run holds the folder.
    while (!existsSync(join(out, LOCK_FILE))) await new Promise((r) => setTimeout(r, 5));
    await expect(runSweep({ study: tinyStudy(), outDir: out, workers: 1 })).rejects.toThrow(
      new RegExp(`${out}: in use by another lightfold run \\(sweep, pid ${process.pid}, started `),
    );
    const r = await first;
    expect(r.raysTraced).toBe(6 * 2000);
    expect(existsSync(join(out, LOCK_FILE))).toBe(false);
  });

  it("the CLI refuses the same with exit 2 and the hint to wait or choose another --out", async () => {
    const dir = tempDir("lock-cli");
    const studyPath = join(dir, "tiny.study.json");
    writeFileSync(studyPath, JSON.stringify(tinyDoc()));
    const out = join(dir, "run");
    mkdirSync(out);
    // A live holder: this process, as another lightfold would be.
    writeFileSync(join(out, LOCK_FILE), JSON.stringify({ pid: process.pid, host: hostname(), startedAt: "2027-01-01T00:00:00Z", what: "sweep" }));
    const r = await runMain("sweep", studyPath, "--out", out, "--workers", "1", "--quiet", "--no-report");
    expect(r.code).toBe(2);
    expect(r.err).toMatch(/in use by another lightfold run \(sweep, pid \d+, started 2027-01-01T00:00:00Z\)/);
    expect(r.err).toMatch(/hint: wait for it to finish or choose another --out/);
    expect(readdirSync(out)).toEqual([LOCK_FILE]);
  });

  it("a stale lock (its process gone) is named and taken over; temporary files of killed runs are removed on success", async () => {
    const out = tempDir("stale");
    const pid = deadPid();
    writeFileSync(join(out, LOCK_FILE), JSON.stringify({ pid, host: hostname(), startedAt: "2027-01-01T00:00:00Z", what: "sweep" }));
    mkdirSync(join(out, "base"));
    const tmp = [join(out, `.run.json.${pid}.1.tmp`), join(out, "base", `.matrix.json.${pid}.2.tmp`)];
    for (const t of tmp) writeFileSync(t, "half a file");
    const notices: string[] = [];
    await runSweep({ study: tinyStudy(), outDir: out, workers: 1, onNotice: (m) => notices.push(m) });
    expect(notices.join("\n")).toMatch(new RegExp(`removed a stale lock .*pid ${pid}, started 2027-01-01T00:00:00Z; that process is no longer running`));
    for (const t of tmp) expect(existsSync(t)).toBe(false);
    expect(readdirSync(out).sort()).toEqual(["base", "journal.jsonl", "run.json"]);
  });

  it("a lock held by a zombie (killed, not yet reaped: as under `timeout -s KILL`) is stale too", async () => {
    // The background sleep's parent execs into a sleep that never waits for it, so once it exits
    // it stays a zombie (state Z in /proc/<pid>/stat, proc(5)) while its parent lives.
    const parent = spawn("sh", ["-c", "sleep 0.05 & echo $!; exec sleep 5"], { stdio: ["ignore", "pipe", "ignore"] });
    try {
      const pid = await new Promise<number>((resolve) => parent.stdout.once("data", (d: Buffer) => resolve(Number(String(d).trim()))));
      const state = (): string => {
        const stat = readFileSync(`/proc/${pid}/stat`, "utf8");
        return stat.charAt(stat.lastIndexOf(")") + 2);
      };
      for (let k = 0; k < 200 && state() !== "Z"; k++) await new Promise((r) => setTimeout(r, 10));
      expect(state()).toBe("Z");
      const out = tempDir("zombie");
      writeFileSync(join(out, LOCK_FILE), JSON.stringify({ pid, host: hostname(), startedAt: "2027-01-01T00:00:00Z", what: "sweep" }));
      const notices: string[] = [];
      await runSweep({ study: tinyStudy(), outDir: out, workers: 1, onNotice: (m) => notices.push(m) });
      expect(notices.join("\n")).toMatch(new RegExp(`removed a stale lock .*pid ${pid}`));
    } finally {
      parent.kill("SIGKILL");
    }
  });

  it("a run that fails before finishing any task leaves nothing behind (no journal, no folder, no lock)", async () => {
    const out = join(tempDir("nothing"), "run");
    const study = tinyStudy({ grid: { thetaDeg: [0], phiDeg: [0], wavelengthNm: [666] } });
    await expect(runSweep({ study, outDir: out, workers: 1, tracerModule: STAND_IN_TRACER })).rejects.toThrow(/deliberate failure/);
    expect(existsSync(out)).toBe(false);
  });
});
