import { execFileSync, spawn, spawnSync } from "node:child_process";
import { mkdtempSync, readFileSync, rmSync, writeFileSync, existsSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { afterAll, describe, expect, it } from "vitest";
import { BIN, ROOT, runMain as run } from "../helpers/cli.js";

const dir = mkdtempSync(join(tmpdir(), "lightfold-generation-cli-"));
afterAll(() => rmSync(dir, { recursive: true, force: true }));
const STUDY = join(ROOT, "configs", "demo-planar.study.json");

describe("lightfold generation", () => {
  const out = join(dir, "gen");
  const eta = join(dir, "eta.csv");
  writeFileSync(eta, "depth_um,collection\n0,0.6\n1,0.95\n150,0.9\n");

  it("writes G(z) as CSV depth_um,generation_cm3_s and NPY [bins, 2]; q·∫G dz equals the absorber current (1e-9)", async () => {
    const r = await run("generation", STUDY, "--rays", "400", "--bins", "30", "--collection", eta, "--out", out, "--json");
    expect(r.code).toBe(0);
    const s = JSON.parse(r.out) as { integratedMaCm2: number; absorberMaCm2: number; files: string[] };
    // Charge conservation (every absorbed photon lies in one bin).
    expect(Math.abs(s.integratedMaCm2 - s.absorberMaCm2)).toBeLessThan(1e-9 * s.absorberMaCm2);
    const csv = readFileSync(join(out, "generation.csv"), "utf8").trim().split("\n");
    expect(csv[0]).toBe("depth_um,generation_cm3_s");
    expect(csv.length).toBe(31);
    const eqe = readFileSync(join(out, "eqe.csv"), "utf8").split("\n");
    expect(eqe[0]).toBe("wavelength_nm,optical_eqe,optical_eqe_stderr,collected_eqe_estimate");
    const side = JSON.parse(readFileSync(join(out, "generation.json"), "utf8")) as { edgesUm: number[]; generationCm3S: number[] };
    expect(side.edgesUm.length).toBe(31);
    expect(side.generationCm3S.length).toBe(30);
  });

  // NumPy itself reads the arrays (only where python3 with numpy exists on this machine).
  const hasNumpy = spawnSync("python3", ["-c", "import numpy"], { stdio: "ignore" }).status === 0;
  it.runIf(hasNumpy)("numpy.load reads generation.npy as [bins, 2] and the spectral profiles as [wavelengths, bins]", () => {
    const script = [
      "import json, sys, numpy as np",
      "a = np.load(sys.argv[1]); s = np.load(sys.argv[2])",
      "print(json.dumps({'a': list(a.shape), 's': list(s.shape), 'z0': float(a[0, 0]), 'g0': float(a[0, 1])}))",
    ].join("\n");
    const res = JSON.parse(execFileSync("python3", ["-c", script, join(out, "generation.npy"), join(out, "generation-spectral.npy")], { encoding: "utf8" })) as { a: number[]; s: number[]; z0: number; g0: number };
    expect(res.a).toEqual([30, 2]);
    expect(res.s).toEqual([37, 30]);
    const first = readFileSync(join(out, "generation.csv"), "utf8").split("\n")[1]!.split(",").map(Number);
    expect(res.z0).toBeCloseTo(first[0]!, 9);
    expect(res.g0 / first[1]!).toBeCloseTo(1, 9);
  });

  it("refuses a collection probability outside [0, 1] and a bad CSV with exit 2, naming the flag or the line", async () => {
    const a = await run("generation", STUDY, "--collection", "1.5", "--out", join(dir, "no"));
    expect(a.code).toBe(2);
    expect(a.err).toMatch(/--collection: expected a probability in \[0, 1\]/);
    const bad = join(dir, "bad.csv");
    writeFileSync(bad, "depth_um,collection\n0,0.5\n0,0.7\n");
    const b = await run("generation", STUDY, "--rays", "10", "--bins", "4", "--collection", bad, "--out", join(dir, "no2"));
    expect(b.code).toBe(2);
    expect(b.err).toMatch(/bad\.csv:3: expected a depth in µm, ≥ 0 and above the previous row/);
    expect(existsSync(join(dir, "no2", "generation.csv"))).toBe(false);
    // --workers takes the sweep's form: a whole number from 1 in decimal digits.
    for (const w of ["0", "2.5", "1e3"]) {
      const c = await run("generation", STUDY, "--rays", "10", "--workers", w, "--out", join(dir, "no3"));
      expect(c.code).toBe(2);
      expect(c.err).toMatch(/--workers: expected a whole number from 1 to 256 in decimal digits/);
    }
    expect(existsSync(join(dir, "no3"))).toBe(false);
  });

  it("ends on SIGINT while tracing on its workers, saying so and writing nothing (child process)", async () => {
    const out = join(dir, "interrupted");
    const child = spawn(process.execPath, [BIN, "generation", STUDY, "--rays", "1000000000", "--workers", "1", "--out", out], { stdio: ["ignore", "ignore", "pipe"] });
    let stderr = "";
    child.stderr.on("data", (b: Buffer) => (stderr += String(b)));
    const exited = new Promise<NodeJS.Signals | null>((resolve) => child.on("exit", (_code, signal) => resolve(signal)));
    // 10⁹ rays per wavelength take hours: after a few seconds the run is tracing (loading takes well under one).
    await new Promise((r) => setTimeout(r, 3000));
    child.kill("SIGINT");
    expect(await exited).toBe("SIGINT");
    expect(stderr).toContain(`lightfold generation: interrupted; nothing written to ${out}`);
    expect(existsSync(out)).toBe(false);
  }, 20_000);
});
