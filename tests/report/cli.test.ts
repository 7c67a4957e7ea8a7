import { existsSync, mkdtempSync, readFileSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { ROOT, spawnLightfold as lightfold } from "../helpers/cli.js";
import { writeTinyRun } from "../fixtures/report/tinyRun.js";

const tmp = mkdtempSync(join(tmpdir(), "lightfold-report-cli-"));

beforeAll(() => {
  expect(existsSync(join(ROOT, "dist", "src", "cli", "commands", "report.js")), "build first: npx tsc -p .").toBe(true);
});
afterAll(() => rmSync(tmp, { recursive: true, force: true }));

describe("lightfold report", () => {
  const run = writeTinyRun(join(tmp, "run"));

  it("writes index.html and one .svg per plot, and says where", () => {
    const r = lightfold("report", run, "--angle", "30");
    expect(r.status).toBe(0);
    expect(r.stdout).toContain(`report: ${join(run, "report", "index.html")}`);
    for (const f of ["index.html", "spectral-2-planar-reference.svg", "convergence.svg", "tilt-sweep.svg"]) {
      expect(existsSync(join(run, "report", f)), f).toBe(true);
    }
    expect(readFileSync(join(run, "report", "index.html"), "utf8")).toContain("Photon ledger at θ = 30°");
  });

  it("--json prints the written files and omitted sections", () => {
    const out = join(tmp, "elsewhere");
    const r = lightfold("report", run, "--out", out, "--json");
    expect(r.status).toBe(0);
    const j = JSON.parse(r.stdout) as { indexPath: string; files: string[]; omitted: string[] };
    expect(j.indexPath).toBe(join(out, "index.html"));
    expect(j.files.length).toBe(16); // index.html + 15 plots (two ledgers, the optimum, two passes, the escape-angle and the generation plot included)
    expect(j.omitted).toEqual([]);
  });

  it("bad input: one line + hint, exit 2, nothing written", () => {
    const r = lightfold("report", run, "--angle", "45", "--out", join(tmp, "never"));
    expect(r.status).toBe(2);
    expect(r.stderr).toMatch(/^lightfold: .*incidence angle 45° is not in the matrix grid.*\nhint: /);
    expect(existsSync(join(tmp, "never"))).toBe(false);
    expect(lightfold("report", join(tmp, "missing")).status).toBe(2);
  });

  it("--help shows examples and exit codes", () => {
    const r = lightfold("report", "--help");
    expect(r.status).toBe(0);
    expect(r.stdout).toContain("Examples:");
    expect(r.stdout).toContain("Exit codes");
  });
});
