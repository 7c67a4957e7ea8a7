import { mkdtempSync, readFileSync, readdirSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { afterAll, describe, expect, it, vi } from "vitest";
import { main } from "../../src/cli/main.js";
import { writeResponseMatrix } from "../../src/response/matrixFile.js";
import { parseCsv } from "./csvReader.js";
import { smallMatrix } from "./matrixFixture.js";

const dir = mkdtempSync(join(tmpdir(), "lightfold-export-cli-"));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

async function run(...args: string[]): Promise<{ code: number; out: string; err: string }> {
  let out = "";
  let err = "";
  const o = vi.spyOn(process.stdout, "write").mockImplementation((s: string | Uint8Array) => ((out += String(s)), true));
  const e = vi.spyOn(process.stderr, "write").mockImplementation((s: string | Uint8Array) => ((err += String(s)), true));
  try {
    const code = await main(["node", "lightfold", ...args]);
    return { code, out, err };
  } finally {
    o.mockRestore();
    e.mockRestore();
  }
}

describe("lightfold export", () => {
  const matrixPath = join(dir, "matrix.json");
  writeResponseMatrix(matrixPath, smallMatrix());

  it("--format csv writes matrix.csv beside the matrix", async () => {
    const r = await run("export", matrixPath, "--format", "csv");
    expect(r.code).toBe(0);
    expect(r.out).toContain("matrix.csv");
    const rows = parseCsv(readFileSync(join(dir, "matrix.csv"), "utf8"));
    expect(rows.length).toBe(1 + 3 * 2 * 4 * 4);
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
