import { spawn } from "node:child_process";
import { existsSync, writeFileSync } from "node:fs";
import { join } from "node:path";
import { describe, expect, it } from "vitest";
import { LOCK_FILE } from "../../src/util/outputLock.js";
import { BIN } from "../helpers/cli.js";
import { tempDir, tinyDoc } from "./helpers.js";

describe("a sweep with a huge ray count (child process)", () => {
  it("starts at once (planning is O(points)) and ends on SIGINT with its lock released and the journal kept", async () => {
    const dir = tempDir("signal");
    const studyPath = join(dir, "huge.study.json");
    // 10⁹ rays per point in batches of 10⁴: 10⁵ batches per point (the old planner looped over them).
    writeFileSync(studyPath, JSON.stringify(tinyDoc({ rays: { perPoint: 1_000_000_000, batch: 10_000 } })));
    const out = join(dir, "run");
    const child = spawn(process.execPath, [BIN, "sweep", studyPath, "--out", out, "--workers", "1", "--quiet"], { stdio: ["ignore", "ignore", "pipe"] });
    let stderr = "";
    child.stderr.on("data", (b: Buffer) => (stderr += String(b)));
    const exited = new Promise<NodeJS.Signals | null>((resolve) => child.on("exit", (_code, signal) => resolve(signal)));
    // Wait until the first tasks are journaled (the run is tracing), then interrupt.
    const t0 = Date.now();
    while (!existsSync(join(out, "journal.jsonl")) && Date.now() - t0 < 30_000) await new Promise((r) => setTimeout(r, 20));
    expect(existsSync(join(out, LOCK_FILE))).toBe(true);
    child.kill("SIGINT");
    expect(await exited).toBe("SIGINT");
    expect(stderr).toMatch(/interrupted; finished tasks are in .*journal\.jsonl; run the same command again to resume/);
    expect(existsSync(join(out, LOCK_FILE))).toBe(false);
    expect(existsSync(join(out, "journal.jsonl"))).toBe(true);
  });
});
