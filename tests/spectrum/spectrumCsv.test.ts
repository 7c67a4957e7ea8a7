import { mkdtempSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { describe, expect, it } from "vitest";
import { loadSpectrumCsv, parseSpectrumCsv, spectrumFromSpec, trapezoid } from "../../src/spectrum/index.js";
import { inputErrorOf } from "../helpers/inputError.js";

describe("parseSpectrumCsv / loadSpectrumCsv", () => {
  it("reads wavelength_nm,irradiance_W_m2_nm with comments", () => {
    const s = parseSpectrumCsv("# lamp\nwavelength_nm,irradiance_W_m2_nm\n400,1.0\n500,1.5\n600,1.0\n", "lamp.csv");
    expect(trapezoid(s.wavelengthNm, s.irradianceWm2PerNm)).toBeCloseTo(250, 12);
  });

  it("names the line of each error", () => {
    expect(inputErrorOf(() => parseSpectrumCsv("wavelength_nm,irradiance_W_m2_nm\n400,1\n400,2\n", "a.csv"))).toContain("a.csv:3");
    expect(inputErrorOf(() => parseSpectrumCsv("wavelength_nm,irradiance_W_m2_nm\n400,1\n500,-2\n", "b.csv"))).toContain("b.csv:3");
    expect(inputErrorOf(() => parseSpectrumCsv("wavelength_nm,irradiance_W_m2_nm\n400,1\n500,x\n", "c.csv"))).toContain("c.csv:3");
    expect(inputErrorOf(() => parseSpectrumCsv("wavelength_nm,irradiance_W_m2_nm\n400,1\n500\n", "d.csv"))).toContain("d.csv:3");
    expect(inputErrorOf(() => parseSpectrumCsv("wavelength_nm,W\n400,1\n500,1\n", "e.csv"))).toContain("irradiance_W_m2_nm");
  });

  it("loads a file and reports a missing one by path", () => {
    const dir = mkdtempSync(join(tmpdir(), "lightfold-spec-"));
    writeFileSync(join(dir, "s.csv"), "wavelength_nm,irradiance_W_m2_nm\n300,0\n1200,1\n");
    expect(loadSpectrumCsv(join(dir, "s.csv")).wavelengthNm.length).toBe(2);
    expect(inputErrorOf(() => loadSpectrumCsv(join(dir, "missing.csv")))).toContain("missing.csv");
    expect(spectrumFromSpec({ csv: "s.csv" }, dir).name).toBe("s.csv");
  });
});

describe("spectrumFromSpec(spec, baseDir)", () => {
  it("knows AM1.5G (default), AM1.5D and G173-ETR and names the field on a bad value", () => {
    expect(spectrumFromSpec(undefined, ".").name).toBe("AM1.5G");
    expect(spectrumFromSpec("AM1.5D", ".").name).toBe("AM1.5D");
    expect(inputErrorOf(() => spectrumFromSpec("AM1.5", ".", "spectrum"))).toContain("spectrum");
    expect(inputErrorOf(() => spectrumFromSpec({ file: "x" }, ".", "spectrum"))).toContain("csv");
  });
});
