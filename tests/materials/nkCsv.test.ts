import { mkdtempSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { describe, expect, it } from "vitest";
import { materialFromSpec, parseNkCsv } from "../../src/materials/index.js";
import { inputErrorOf } from "../helpers/inputError.js";

describe("parseNkCsv(text, label)", () => {
  it("reads comment lines, a header and rows; keeps the exact numbers", () => {
    const t = parseNkCsv("# my film\n# measured 2024\nwavelength_nm,n,k\n400,2.1,1e-2\n\n500,2.05,0\n", "f.csv");
    expect(Array.from(t.wavelengthNm)).toEqual([400, 500]);
    expect(Array.from(t.n!)).toEqual([2.1, 2.05]);
    expect(Array.from(t.k!)).toEqual([0.01, 0]);
  });

  it("converts an ellipsometry-style export in µm (header wavelength_um), tab-separated, CRLF", () => {
    const t = parseNkCsv("wavelength_um\tn\tk\r\n0.4\t2.1\t0.01\r\n0.45\t2.0\t0.005\r\n", "e.txt");
    expect(t.wavelengthNm[0]).toBeCloseTo(400, 12);
    expect(t.wavelengthNm[1]).toBeCloseTo(450, 12);
  });

  it('accepts "Wavelength (nm)" style headers and photon energies in eV (λ = hc/E, CODATA exact h, c, q)', () => {
    const a = parseNkCsv('"Wavelength (nm)",N,K\n400,2.1,0.01\n500,2.0,0.005\n', "export.csv");
    expect(Array.from(a.wavelengthNm)).toEqual([400, 500]);
    // energies falling and rising give the same increasing-wavelength table
    const hcEvNm = ((6.62607015e-34 * 299792458) / 1.602176634e-19) * 1e9; // 1239.84198… eV·nm
    for (const text of ["energy_eV,n,k\n3.0,2.2,0.02\n2.0,2.0,0.001\n1.5,1.95,0\n", "Energy (eV),n,k\n1.5,1.95,0\n2.0,2.0,0.001\n3.0,2.2,0.02\n"]) {
      const t = parseNkCsv(text, "ev.csv");
      expect(t.wavelengthNm[0]).toBeCloseTo(hcEvNm / 3, 9);
      expect(t.wavelengthNm[2]).toBeCloseTo(hcEvNm / 1.5, 9);
      expect(Array.from(t.n!)).toEqual([2.2, 2.0, 1.95]);
      expect(Array.from(t.k!)).toEqual([0.02, 0.001, 0]);
    }
    expect(inputErrorOf(() => parseNkCsv("energy_eV,n,k\n1.5,2,0\n2.0,2,0\n1.8,2,0\n", "m.csv"))).toContain("m.csv:4");
  });

  it("accepts n-only and k-only files", () => {
    expect(parseNkCsv("wavelength_nm,n\n400,1.5\n500,1.49\n", "n.csv").k).toBeNull();
    expect(parseNkCsv("wavelength_nm,k\n400,1e-5\n500,1e-6\n", "k.csv").n).toBeNull();
  });

  it("names file and line of a malformed number", () => {
    const msg = inputErrorOf(() => parseNkCsv("# c\nwavelength_nm,n,k\n400,1.5,0\n500,1.4x,0\n", "bad.csv"));
    expect(msg).toContain("bad.csv:4");
    expect(msg).toContain('"1.4x"');
  });

  it("names the line of non-increasing wavelengths (and the earlier line)", () => {
    const msg = inputErrorOf(() => parseNkCsv("wavelength_nm,n,k\n400,1.5,0\n500,1.5,0\n500,1.5,0\n", "dup.csv"));
    expect(msg).toContain("dup.csv:4");
    expect(msg).toContain("line 3");
    expect(inputErrorOf(() => parseNkCsv("wavelength_nm,n,k\n400,1.5,0\n300,1.5,0\n", "dec.csv"))).toContain("dec.csv:3");
  });

  it("names the line of k < 0 and of n ≤ 0", () => {
    expect(inputErrorOf(() => parseNkCsv("wavelength_nm,n,k\n400,1.5,0\n500,1.5,-1e-4\n", "k.csv"))).toContain("k.csv:3");
    expect(inputErrorOf(() => parseNkCsv("wavelength_nm,n,k\n400,0,0\n500,1.5,0\n", "n.csv"))).toContain("n.csv:2");
  });

  it("names the line of a ragged row", () => {
    const msg = inputErrorOf(() => parseNkCsv("wavelength_nm,n,k\n400,1.5,0\n500,1.5\n", "rag.csv"));
    expect(msg).toContain("rag.csv:3");
    expect(msg).toContain("2 fields");
  });

  it("rejects a wrong header, a single row and an empty file", () => {
    expect(inputErrorOf(() => parseNkCsv("lambda,n,k\n400,1.5,0\n500,1.5,0\n", "h.csv"))).toContain("wavelength_nm");
    expect(inputErrorOf(() => parseNkCsv("wavelength_nm,n,eps\n400,1.5,0\n500,1.5,0\n", "h2.csv"))).toContain("n, k");
    expect(inputErrorOf(() => parseNkCsv("wavelength_nm,n,k\n400,1.5,0\n", "one.csv"))).toContain("at least 2");
    expect(inputErrorOf(() => parseNkCsv("# only comments\n", "empty.csv"))).toContain("no header");
  });
});

describe("materialFromSpec({ name, csv }, baseDir, fieldPath)", () => {
  const dir = mkdtempSync(join(tmpdir(), "lightfold-nk-"));
  writeFileSync(join(dir, "film.csv"), "# test film\nwavelength_nm,n,k\n400,2.2,1e-2\n600,2.0,1e-4\n800,1.95,0\n");
  writeFileSync(join(dir, "bad.csv"), "wavelength_nm,n,k\n400,2.2,1e-2\n600,2.0\n");

  it("reads the file relative to baseDir and interpolates n linearly, k in log space", () => {
    const m = materialFromSpec({ name: "myFilm", csv: "film.csv" }, dir, "materials[0]");
    expect(m.minWavelengthNm).toBe(400);
    expect(m.maxWavelengthNm).toBe(800);
    expect(m.nk(600)).toEqual({ n: 2.0, k: 1e-4 });
    expect(m.nk(500).n).toBeCloseTo(2.1, 14);
    expect(m.nk(500).k).toBeCloseTo(1e-3, 15); // sqrt(1e-2 · 1e-4)
    expect(m.nk(700).k).toBeCloseTo(0.5e-4, 16); // zero neighbour: linear
    expect(inputErrorOf(() => m.nk(900))).toContain("myFilm");
  });

  it("reports the file and line of a bad CSV, and a missing file by name", () => {
    expect(inputErrorOf(() => materialFromSpec({ name: "b", csv: "bad.csv" }, dir, "materials[1]"))).toContain("bad.csv:3");
    expect(inputErrorOf(() => materialFromSpec({ name: "c", csv: "nope.csv" }, dir, "materials[2]"))).toContain("nope.csv");
  });
});
