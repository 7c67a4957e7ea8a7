import { mkdtempSync, readFileSync, readdirSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { afterAll, describe, expect, it } from "vitest";
import { runMain as run } from "../helpers/cli.js";
import { CONVERGENCE_CSV_COLUMNS, type ConvergenceReport } from "../../src/convergence/convergenceReport.js";
import { BARE_SI_STACK } from "./bareSi.js";

const dir = mkdtempSync(join(tmpdir(), "lightfold-converge-cli-"));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

const studyPath = join(dir, "bare.study.json");
writeFileSync(
  studyPath,
  JSON.stringify({
    name: "bare-si-planar",
    stack: BARE_SI_STACK,
    grid: { thetaDeg: [0, 30], phiDeg: [0], wavelengthNm: [500, 700] },
    rays: { perPoint: 1000, batch: 500 },
    seed: 3,
  }),
);

describe("lightfold converge", () => {
  it("prints the step table with slopes and the predicted rays", async () => {
    const r = await run("converge", studyPath, "--wavelength", "500", "--channel", "R_first", "--start", "100", "--steps", "3", "--target-error", "0.01", "--quiet");
    expect(r.code).toBe(0);
    expect(r.out).toMatch(/rays\/point\s+value\s+stderr\s+deviation\s+rms err \(4\)/);
    expect(r.out).toMatch(/log-log slope vs rays: rms error -?\d/);
    expect(r.out).toMatch(/predicted for stderr 0\.01: \d+/);
    expect(r.err).toBe("");
  });

  it("--spectral --json --out --csv: JSON on stdout equals convergence.json; CSV has one row per step", async () => {
    const out = join(dir, "run");
    const csv = join(dir, "conv.csv");
    const r = await run("converge", studyPath, "--spectral", "--angle", "30", "--start", "50", "--steps", "3", "--replicas", "2", "--json", "--out", out, "--csv", csv, "--quiet");
    expect(r.code).toBe(0);
    const rep = JSON.parse(r.out) as ConvergenceReport;
    expect(rep.format).toBe("lightfold.convergence");
    expect(rep.mode).toBe("spectral");
    expect(rep.thetaDeg).toBe(30);
    expect(rep.tracerEstimator).toBe("default");
    expect(JSON.parse(readFileSync(join(out, "convergence.json"), "utf8"))).toEqual(rep);
    const lines = readFileSync(csv, "utf8").trim().split("\n");
    expect(lines[0]).toBe(CONVERGENCE_CSV_COLUMNS.join(","));
    expect(lines.length).toBe(4);
    expect(Number(lines[3].split(",")[0])).toBe(200);
  });

  it("bad flags exit 2 with the flag named, and write nothing", async () => {
    const before = readdirSync(dir).sort();
    const both = await run("converge", studyPath, "--spectral", "--wavelength", "500", "--out", join(dir, "x"));
    expect(both.code).toBe(2);
    expect(both.err).toMatch(/exactly one of --wavelength <nm> or --spectral/);
    const steps = await run("converge", studyPath, "--wavelength", "500", "--steps", "1", "--out", join(dir, "x"));
    expect(steps.code).toBe(2);
    expect(steps.err).toMatch(/--steps: expected a whole number from 2 to 20 in decimal digits, got "1"/);
    const ch = await run("converge", studyPath, "--wavelength", "500", "--channel", "A_nothing", "--out", join(dir, "x"));
    expect(ch.code).toBe(2);
    expect(ch.err).toMatch(/no channel "A_nothing"/);
    const est = await run("converge", studyPath, "--wavelength", "500", "--estimator", "fancy");
    expect(est.code).toBe(2);
    expect(readdirSync(dir).sort()).toEqual(before);
  });
});

describe("lightfold converge --workers", () => {
  it("gives the same numbers on a worker pool as in one thread (spectral and point mode, Sobol' launch points)", async () => {
    // Workers load the compiled tracer from dist/ (npm test builds first).
    for (const mode of [["--spectral", "--angle", "30"], ["--wavelength", "700", "--phi", "0"], ["--wavelength", "700", "--sampling", "sobol"]]) {
      const args = ["converge", studyPath, ...mode, "--start", "600", "--steps", "2", "--replicas", "2", "--json", "--quiet"];
      const one = await run(...args, "--workers", "1");
      const two = await run(...args, "--workers", "2");
      expect(one.code).toBe(0);
      expect(two.code).toBe(0);
      expect(two.out).toBe(one.out);
    }
  });
});
