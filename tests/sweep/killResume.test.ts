import { spawn, spawnSync } from "node:child_process";
import { existsSync, readFileSync, writeFileSync } from "node:fs";
import { join } from "node:path";
import { describe, expect, it } from "vitest";
import { readResponseMatrix } from "../../src/response/matrixFile.js";
import { loadStudy } from "../../src/study/load.js";
import { runSweep } from "../../src/sweep/runSweep.js";
import { expectSameMatrices, tempDir, tinyDoc } from "./helpers.js";

const root = join(import.meta.dirname, "..", "..");
const cli = join(root, "bin", "lightfold.js");

function journalEntries(path: string): number {
  if (!existsSync(path)) return 0;
  return readFileSync(path, "utf8").split("\n").filter((l) => l.startsWith('{"p"')).length;
}

describe("lightfold sweep (child process)", () => {
  it("killed with SIGKILL mid-sweep, then started again, resumes to the bits of an uninterrupted run", async () => {
    const dir = tempDir("kill");
    const studyPath = join(dir, "kill.study.json");
    writeFileSync(studyPath, JSON.stringify(tinyDoc({
      name: "kill",
      grid: { thetaDeg: [0, 45, 70], phiDeg: [0], wavelengthNm: { from: 800, to: 1150, step: 50 } },
      rays: { perPoint: 24000, batch: 1000 },
    })));
    const out = join(dir, "run");
    const jPath = join(out, "journal.jsonl");

    // Start, wait until a few tasks are journaled, then kill -9.
    const child = spawn(process.execPath, [cli, "sweep", studyPath, "--out", out, "--workers", "1", "--quiet"], { stdio: "ignore" });
    const exited = new Promise<NodeJS.Signals | null>((resolve) => child.on("exit", (_code, signal) => resolve(signal)));
    const t0 = Date.now();
    while (journalEntries(jPath) < 2 && Date.now() - t0 < 60_000) await new Promise((r) => setTimeout(r, 20));
    child.kill("SIGKILL");
    expect(await exited).toBe("SIGKILL");
    expect(journalEntries(jPath)).toBeGreaterThanOrEqual(2);
    expect(existsSync(join(out, "run.json"))).toBe(false); // stopped before the end: no final output

    // Run again with the same command: resumes automatically.
    const again = spawnSync(process.execPath, [cli, "sweep", studyPath, "--out", out, "--workers", "2", "--quiet", "--json"], { encoding: "utf8" });
    expect(again.status).toBe(0);
    const summary = JSON.parse(again.stdout) as { raysResumed: number; raysTraced: number };
    // Part came from the journal, the rest was traced: it was interrupted mid-sweep.
    expect(summary.raysResumed).toBeGreaterThan(0);
    expect(summary.raysTraced).toBeGreaterThan(0);
    expect(summary.raysResumed + summary.raysTraced).toBe(3 * 8 * 24000);
    expect(again.stderr).toMatch(/resuming from .*journal\.jsonl: \d+ finished tasks kept/);

    const reference = await runSweep({ study: loadStudy(studyPath), workers: 2 });
    expectSameMatrices(reference.matrices, [readResponseMatrix(join(out, "base", "matrix.json"))]);
  });

  it("rejects a bad study with the field path and exit code 2 (check and sweep)", () => {
    const dir = tempDir("badcli");
    const studyPath = join(dir, "bad.study.json");
    writeFileSync(studyPath, JSON.stringify({ ...tinyDoc(), rays: { perPont: 100, batch: 10 } }));
    for (const args of [["check", studyPath], ["sweep", studyPath, "--quiet"]]) {
      const r = spawnSync(process.execPath, [cli, ...args], { encoding: "utf8", cwd: dir });
      expect(r.status).toBe(2);
      expect(r.stderr).toContain("rays.perPont: unknown field");
      expect(r.stderr).toContain('hint: did you mean "perPoint"?');
    }
    const ok = spawnSync(process.execPath, [cli, "check", join(root, "configs", "thickness-sweep.study.json"), "--json"], { encoding: "utf8" });
    expect(ok.status).toBe(0);
    const s = JSON.parse(ok.stdout) as { points: number; combos: unknown[]; tasksMin: number };
    // 3 angles × 1 (averaged) azimuth × 19 wavelengths × 9 combinations; 2 batches each.
    expect(s.points).toBe(3 * 19 * 9);
    expect(s.combos.length).toBe(9);
    expect(s.tasksMin).toBe(2 * 3 * 19 * 9);
  });
});
