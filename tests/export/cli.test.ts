import { mkdtempSync, readFileSync, readdirSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { afterAll, describe, expect, it } from "vitest";
import { runMain as run } from "../helpers/cli.js";
import { writeResponseMatrix } from "../../src/response/matrixFile.js";
import { parseCsv } from "./csvReader.js";
import { smallMatrix } from "./matrixFixture.js";

const dir = mkdtempSync(join(tmpdir(), "lightfold-export-cli-"));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

describe("lightfold export", () => {
  const matrixPath = join(dir, "matrix.json");
  writeResponseMatrix(matrixPath, smallMatrix());

  it("--format csv writes matrix.csv beside the matrix", async () => {
    const r = await run("export", matrixPath, "--format", "csv");
    expect(r.code).toBe(0);
    expect(r.out).toContain("matrix.csv");
    const rows = parseCsv(readFileSync(join(dir, "matrix.csv"), "utf8"));
    expect(rows.length).toBe(1 + 3 * 2 * 4 * 6); // header + θ·φ·λ·channel rows
  });

  it("--format npy --json lists the arrays and the sidecar", async () => {
    const r = await run("export", matrixPath, "--format", "npy", "--json");
    expect(r.code).toBe(0);
    const files = (JSON.parse(r.out) as { files: string[] }).files.map((f) => f.slice(dir.length + 1));
    expect(files).toEqual(["matrix_mean.npy", "matrix_stderr.npy", "matrix_nrays.npy", "matrix_path_ratio.npy", "matrix.npy.json"]);
  });

  it("an unknown format or a bad matrix file exits 2 naming the problem, writing nothing", async () => {
    const before = readdirSync(dir).sort();
    const bad = await run("export", matrixPath, "--format", "xlsx");
    expect(bad.code).toBe(2);
    expect(bad.err).toMatch(/--format: expected one of csv, json, npy/);
    const broken = join(dir, "broken.json");
    writeFileSync(broken, '{"format": "something else"}');
    const r2 = await run("export", broken, "--format", "csv");
    expect(r2.code).toBe(2);
    expect(r2.err).toMatch(/broken\.json: not a lightfold response matrix/);
    expect(readdirSync(dir).sort()).toEqual([...before, "broken.json"].sort());
  });
});

describe("lightfold spectral", () => {
  it("prints the per-angle table and, with --json, the photocurrent summary", async () => {
    const m = smallMatrix();
    const p = join(dir, "spectral.json");
    writeResponseMatrix(p, m);
    const t = await run("spectral", p);
    expect(t.code).toBe(0);
    expect(t.out).toMatch(/theta_deg\s+phi_deg\s+Jsc/);
    const j = await run("spectral", p, "--json");
    const s = JSON.parse(j.out) as { format: string; directions: unknown[]; spectrum: string };
    expect(s.format).toBe("lightfold.photocurrent");
    expect(s.spectrum).toBe("AM1.5G");
    expect(s.directions.length).toBe(6);
    const bad = await run("spectral", p, "--spectrum", "AM9");
    expect(bad.code).toBe(2);
    expect(bad.err).toMatch(/--spectrum/);
  });
});

describe("lightfold spectral --spectrum file.csv", () => {
  it("a flat 1 W/m²/nm spectrum gives J = q·E·(λ2² − λ1²)/(2hc) for a fully absorbing matrix", async () => {
    const spec = join(dir, "flat.csv");
    writeFileSync(spec, "# flat test spectrum\nwavelength_nm,irradiance_W_m2_nm\n400,1\n1000,1\n");
    const m = smallMatrix(); // grid 400…1000 nm
    const ia = m.channels.indexOf("A_absorber");
    for (let p = 0; p < m.nRays.length; p++)
      for (let c = 0; c < m.channels.length; c++) {
        m.mean[p * m.channels.length + c] = c === ia ? 1 : 0;
        m.stderr[p * m.channels.length + c] = 0;
      }
    const p = join(dir, "absorbing.json");
    writeResponseMatrix(p, m);
    const r = await run("spectral", p, "--spectrum", spec, "--json");
    expect(r.code).toBe(0);
    const s = JSON.parse(r.out) as { totalAvailableMaCm2: number; directions: { jscMaCm2: number }[] };
    // Photon flux E·λ/(hc) is linear in λ, so its integral is exact: q·E/(hc)·(λ2² − λ1²)/2 (λ in m,
    // dλ in nm), ×0.1 for A/m² → mA/cm². CODATA 2018 exact constants. ≈ 33.87 mA/cm².
    const expected = ((1.602176634e-19 / (6.62607015e-34 * 299792458)) * 1e-9 * (1000 ** 2 - 400 ** 2)) / 2 * 0.1;
    expect(Math.abs(s.totalAvailableMaCm2 / expected - 1)).toBeLessThan(1e-12);
    for (const d of s.directions) expect(Math.abs(d.jscMaCm2 / expected - 1)).toBeLessThan(1e-12);
  });
});
