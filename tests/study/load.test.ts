import { mkdtempSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { describe, expect, it } from "vitest";
import { loadStudy, loadStudyFromDocument } from "../../src/study/load.js";
import { axisValues, foldSquareAzimuthDeg } from "../../src/study/grid.js";
import { InputError } from "../../src/util/errors.js";
import { baseDoc } from "./baseDoc.js";

const here = join(import.meta.dirname, "..", "..", "configs");

function errorOf(doc: unknown, dir = tmpdir()): InputError {
  try {
    loadStudyFromDocument(doc, { baseDir: dir });
  } catch (err) {
    expect(err).toBeInstanceOf(InputError);
    return err as InputError;
  }
  throw new Error("expected an InputError");
}

describe("loadStudy(path)", () => {
  it("loads every demo study in configs/", () => {
    for (const f of ["demo-random-pyramids", "demo-planar", "bench-pyramids", "thickness-sweep"]) {
      const s = loadStudy(join(here, `${f}.study.json`));
      expect(s.name).toBe(f);
      expect(s.hash).toMatch(/^[0-9a-f]{64}$/);
    }
  });

  it("expands ranges inclusive of both ends: 0..80 step 10 is 9 angles, 300..1200 step 25 is 37 wavelengths", () => {
    const s = loadStudy(join(here, "demo-random-pyramids.study.json"));
    const g = s.combos[0].study.grid;
    expect(g.thetaDeg).toEqual([0, 10, 20, 30, 40, 50, 60, 70, 80]);
    expect(g.wavelengthNm.length).toBe(37);
    expect(g.phiMode).toBe("averaged");
  });

  it("gives one study per sweep combination (cartesian product, first field slowest)", () => {
    const s = loadStudy(join(here, "thickness-sweep.study.json"));
    expect(s.combos.map((c) => c.label)).toEqual(["p0", "p1", "p2", "p3", "p4", "p5", "p6", "p7", "p8"]);
    expect(s.combos[1].values).toEqual({ "absorber.thicknessUm": 100, "front.films[0].thicknessNm": 75 });
    expect(s.combos[1].study.stack.absorber.thicknessUm).toBe(100);
    expect(s.combos[1].study.stack.front.films[0].thicknessNm).toBe(75);
    expect(s.combos[8].study.stack.absorber.thicknessUm).toBe(180);
    expect(new Set(s.combos.map((c) => c.hash)).size).toBe(9);
  });
});

describe("study validation names the field path", () => {
  it("rejects a negative step", () => {
    const d = baseDoc();
    (d.grid as Record<string, unknown>).thetaDeg = { from: 0, to: 80, step: -5 };
    expect(errorOf(d).message).toBe("grid.thetaDeg.step: expected a positive number, got -5");
  });

  it("rejects incidence angles of 90° and above (grazing incidence carries no power)", () => {
    const d = baseDoc();
    (d.grid as Record<string, unknown>).thetaDeg = { from: 0, to: 90, step: 10 };
    expect(errorOf(d).message).toBe("grid.thetaDeg.to: expected a number in [0, 90), got 90");
    (d.grid as Record<string, unknown>).thetaDeg = [0, 45, 95];
    expect(errorOf(d).message).toBe("grid.thetaDeg[2]: expected a number in [0, 90), got 95");
  });

  it("rejects unknown fields with a did-you-mean hint, at top level and deep in the stack", () => {
    const d = baseDoc();
    d.rayz = d.rays;
    delete d.rays;
    const e = errorOf(d);
    expect(e.message).toBe("rayz: unknown field");
    expect(e.hint).toBe('did you mean "rays"?');
    const d2 = baseDoc();
    (d2.grid as Record<string, unknown>).wavelenghtNm = { from: 400, to: 500, step: 50 };
    const e2 = errorOf(d2);
    expect(e2.message).toBe("grid.wavelenghtNm: unknown field");
    expect(e2.hint).toBe('did you mean "wavelengthNm"?');
    const d4 = baseDoc();
    d4.rays = { perPoint: 100, bacth: 50 };
    const e4 = errorOf(d4);
    expect(e4.message).toBe("rays.bacth: unknown field");
    expect(e4.hint).toBe('did you mean "batch"?');
    const d3 = baseDoc();
    ((d3.stack as Record<string, Record<string, unknown>>).absorber).thicknesUm = 100;
    const e3 = errorOf(d3);
    expect(e3.message).toBe("stack.absorber.thicknesUm: unknown field");
    expect(e3.hint).toBe('did you mean "thicknessUm"?');
  });

  it("rejects wrong types", () => {
    const d = baseDoc();
    d.seed = "forty-two";
    expect(errorOf(d).message).toMatch(/^seed: expected an integer in \[0, \d+\], got "forty-two"$/);
    const d2 = baseDoc();
    d2.rays = { perPoint: 100.5, batch: 50 };
    expect(errorOf(d2).message).toMatch(/^rays\.perPoint: expected an integer/);
  });

  it("rejects a target-error plan without channels and a sweep path that does not exist", () => {
    const d = baseDoc();
    d.rays = { targetStdErr: 0.01, maxPerPoint: 1000, batch: 100 };
    expect(errorOf(d).message).toBe("rays.channels: required field is missing");
    const d2 = baseDoc();
    d2.sweep = { "absorbr.thicknessUm": [100, 200] };
    const e2 = errorOf(d2);
    expect(e2.message).toBe('sweep["absorbr.thicknessUm"]: stack has no field "absorbr"');
    expect(e2.hint).toBe('did you mean "absorber"?');
    const d3 = baseDoc();
    d3.sweep = { "front.films[3].thicknessNm": [60] };
    expect(errorOf(d3).message).toBe('sweep["front.films[3].thicknessNm"]: stack.front.films has no entry [3] (it has 1)');
  });

  it("rejects a study file that is not JSON, naming the line", () => {
    const dir = mkdtempSync(join(tmpdir(), "lf-study-"));
    const p = join(dir, "bad.study.json");
    writeFileSync(p, '{\n  "name": "x",\n  "seed": 1,,\n}\n');
    expect(() => loadStudy(p)).toThrow(/bad\.study\.json: not valid JSON: line 3/);
  });
});

describe("study hash", () => {
  it("ignores key order and changes with any value or referenced file content", () => {
    const dir = mkdtempSync(join(tmpdir(), "lf-hash-"));
    writeFileSync(join(dir, "n.csv"), "wavelength_nm,n,k\n300,2.0,0\n1300,2.0,0\n");
    const withMat = (): Record<string, unknown> => ({ ...baseDoc(), materials: [{ name: "myNitride", csv: "n.csv" }] });
    const a = loadStudyFromDocument(withMat(), { baseDir: dir });
    const reordered = Object.fromEntries(Object.entries(withMat()).reverse());
    expect(loadStudyFromDocument(reordered, { baseDir: dir }).hash).toBe(a.hash);
    const d = withMat();
    d.seed = 2;
    expect(loadStudyFromDocument(d, { baseDir: dir }).hash).not.toBe(a.hash);
    writeFileSync(join(dir, "n.csv"), "wavelength_nm,n,k\n300,2.1,0\n1300,2.1,0\n");
    expect(loadStudyFromDocument(withMat(), { baseDir: dir }).hash).not.toBe(a.hash);
  });
});

describe("grid helpers", () => {
  it("axisValues rounds range steps so 0.1 steps read back as written", () => {
    expect(axisValues({ from: 0, to: 0.3, step: 0.1 }, "x")).toEqual([0, 0.1, 0.2, 0.3]);
  });
  it("foldSquareAzimuthDeg maps any azimuth into [0, 45] by the C4v mirror lines", () => {
    expect([0, 30, 45, 60, 90, 135, 200, -30].map(foldSquareAzimuthDeg)).toEqual([0, 30, 45, 30, 0, 45, 20, 30]);
  });
});
