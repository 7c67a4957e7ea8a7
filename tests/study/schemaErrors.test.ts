import { readdirSync, readFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { Ajv2020 } from "ajv/dist/2020.js";
import { describe, expect, it } from "vitest";
import { loadStudyFromDocument } from "../../src/study/load.js";
import { InputError } from "../../src/util/errors.js";
import { baseDoc } from "./baseDoc.js";

const root = join(import.meta.dirname, "..", "..");
const schema = JSON.parse(readFileSync(join(root, "schema", "study.schema.json"), "utf8"));

function errorOf(edit: (d: Record<string, any>) => void): { message: string; hint: string | undefined } {
  const d = baseDoc();
  edit(d);
  try {
    loadStudyFromDocument(d, { baseDir: tmpdir() });
  } catch (err) {
    expect(err).toBeInstanceOf(InputError);
    return { message: (err as InputError).message, hint: (err as InputError).hint };
  }
  throw new Error("expected an InputError");
}

describe("study validation against schema/study.schema.json", () => {
  it("the example studies are valid for an independent draft 2020-12 validator (Ajv, strict) and for the loader", () => {
    const validate = new Ajv2020({ strict: true, strictRequired: false }).compile(schema);
    const files = readdirSync(join(root, "configs")).filter((f) => f.endsWith(".study.json"));
    expect(files.length).toBeGreaterThanOrEqual(4);
    for (const f of files) {
      const doc = JSON.parse(readFileSync(join(root, "configs", f), "utf8"));
      expect(validate(doc), `${f}: ${JSON.stringify(validate.errors)}`).toBe(true);
      expect(() => loadStudyFromDocument(doc, { baseDir: join(root, "configs") })).not.toThrow();
    }
  });

  // Each row: an edit of a valid study → the message (and hint) a user sees.
  const cases: [string, (d: Record<string, any>) => void, string, string?][] = [
    ["texture type typo", (d) => (d.stack.front.texture.type = "uprigth-pyramids"),
      'stack.front.texture.type: expected one of "planar", "lambertian", "upright-pyramids", "inverted-pyramids", "random-pyramids", "grooves", "spherical-caps", "height-map", got "uprigth-pyramids"',
      'did you mean "upright-pyramids"?'],
    ["a field of another texture", (d) => (d.stack.front.texture = { type: "planar", baseUm: 5 }),
      "stack.front.texture.baseUm: unknown field", "allowed fields: type"],
    ["facet angle out of (0, 90)", (d) => (d.stack.front.texture.facetAngleDeg = 95),
      "stack.front.texture.facetAngleDeg: expected a number in (0, 90), got 95"],
    ["negative film thickness", (d) => (d.stack.front.films[0].thicknessNm = -5),
      "stack.front.films[0].thicknessNm: expected a number in (0, 5000], got -5"],
    ["reflectance above 1", (d) => (d.stack.rear.ideal.reflectance = 1.2),
      "stack.rear.ideal.reflectance: expected a number in [0, 1], got 1.2"],
    ["an ideal rear with an exit medium", (d) => (d.stack.rear.exit = "Ag"),
      "stack.rear.exit: unknown field", 'allowed fields: ideal'],
    ["a real rear without its exit", (d) => (d.stack.rear = { films: [] }),
      "stack.rear.exit: required field is missing"],
    ["non-integer pyramid count", (d) => (d.stack.front.texture = { type: "random-pyramids", meanBaseUm: 5, count: 1.5 }),
      "stack.front.texture.count: expected an integer in [1, 10000], got 1.5"],
    ["absorber thickness as text", (d) => (d.stack.absorber.thicknessUm = "180"),
      'stack.absorber.thicknessUm: expected a number in [1, 10000], got "180"'],
    ["spectrum typo", (d) => (d.spectrum = "AM15G"),
      'spectrum: expected one of "AM1.5G", "AM1.5D", "G173-ETR", got "AM15G"', 'did you mean "AM1.5G"?'],
    ["spectrum object without csv", (d) => (d.spectrum = {}), "spectrum.csv: required field is missing"],
    ["azimuth word other than averaged", (d) => (d.grid.phiDeg = "averages"),
      'grid.phiDeg: expected "averaged", got "averages"', 'did you mean "averaged"?'],
    ["empty wavelength list", (d) => (d.grid.wavelengthNm = []), "grid.wavelengthNm: expected a non-empty list, got 0 entries"],
    ["negative wavelength in a list", (d) => (d.grid.wavelengthNm = [-400, 500]), "grid.wavelengthNm[0]: expected a positive number, got -400"],
    ["target error of 0.5", (d) => (d.rays = { targetStdErr: 0.5, channels: ["R"], maxPerPoint: 10, batch: 5 }),
      "rays.targetStdErr: expected a number in (0, 0.5), got 0.5"],
    ["sweep key that is no field path", (d) => (d.sweep = { "front films": [1] }),
      'sweep["front films"]: "front films" is not a field path (expected names and [index], e.g. "front.films[0].thicknessNm")'],
    ["sweep value listed twice", (d) => (d.sweep = { "absorber.thicknessUm": [100, 100] }),
      'sweep["absorber.thicknessUm"]: a value is listed twice (entries 0 and 1)'],
    ["material entry with an unknown field", (d) => (d.materials = [{ name: "x", constant: { n: 2 }, colour: "red" }]),
      "materials[0].colour: unknown field"],
    ["material name with a space", (d) => (d.materials = [{ name: "my film", constant: { n: 2 } }]),
      'materials[0].name: expected text matching ^[A-Za-z0-9][A-Za-z0-9_.+\\-]*$ (Letters, digits and _ . + - ; unique in the study.), got "my film"'],
    ["an unknown top-level field beside missing ones (the typo is named first)", (d) => { delete d.rays; d.rayz = 1; },
      "rayz: unknown field", 'did you mean "rays"?'],
  ];
  it.each(cases)("%s", (_label, edit, message, hint) => {
    const e = errorOf(edit);
    expect(e.message).toBe(message);
    if (hint !== undefined) expect(e.hint).toBe(hint);
  });

  it("names the document itself when it is not an object", () => {
    expect(() => loadStudyFromDocument([], { baseDir: tmpdir() })).toThrow("(study): expected an object, got a list");
  });

  it("checks each sweep combination after its values are written into the stack", () => {
    const e = errorOf((d) => (d.sweep = { "absorber.thicknessUm": [100, -1] }));
    expect(e.message).toBe("stack.absorber.thicknessUm: expected a number in [1, 10000], got -1 (in sweep combination absorber.thicknessUm=-1)");
  });

  it("keeps the checks that relate several fields in code", () => {
    expect(errorOf((d) => (d.grid.thetaDeg = [0, 30, 20])).message).toBe("grid.thetaDeg[2]: expected values in increasing order, got 20 after 30");
    expect(errorOf((d) => (d.grid.phiSymmetry = "square", d.grid.phiDeg = "averaged")).message).toBe(
      'grid.phiSymmetry: has no effect with phiDeg "averaged"; remove it');
    expect(errorOf((d) => (d.stack.front.texture = { type: "spherical-caps", radiusUm: 2, periodUm: 5, depthUm: 3 })).message).toBe(
      "stack.front.texture.depthUm: expected at most radiusUm (2), got 3");
    expect(errorOf((d) => (d.rays = { targetStdErr: 0.01, channels: ["R"], maxPerPoint: 10, minPerPoint: 20, batch: 5 })).message).toBe(
      "rays.minPerPoint: expected at most maxPerPoint (10), got 20");
    expect(errorOf((d) => (d.stack.layers = [{ material: "glass", thicknessUm: 3200 }, { material: "glass", thicknessUm: 10 }])).message).toBe(
      'stack.layers[1].name: layer name "glass" is used twice');
  });
});
