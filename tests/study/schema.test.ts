import { readFileSync } from "node:fs";
import { join } from "node:path";
import { describe, expect, it } from "vitest";
import { STUDY_FIELDS } from "../../src/study/resolveStudy.js";

const schema = JSON.parse(readFileSync(join(import.meta.dirname, "..", "..", "schema", "study.schema.json"), "utf8"));

describe("schema/study.schema.json", () => {
  it("is a draft 2020-12 schema whose top-level fields are exactly the loader's", () => {
    expect(schema.$schema).toBe("https://json-schema.org/draft/2020-12/schema");
    expect(schema.additionalProperties).toBe(false);
    expect(Object.keys(schema.properties).sort()).toEqual([...STUDY_FIELDS].sort());
  });

  it("documents the same grid, rays and stack fields the loader accepts", () => {
    expect(Object.keys(schema.$defs.grid.properties).sort()).toEqual(["phiDeg", "phiSymmetry", "thetaDeg", "wavelengthNm"]);
    expect(Object.keys(schema.properties.rays.then.properties).sort()).toEqual(["batch", "channels", "maxPerPoint", "minPerPoint", "sampling", "targetStdErr"]);
    expect(Object.keys(schema.properties.rays.else.properties).sort()).toEqual(["batch", "perPoint", "sampling"]);
    expect(Object.keys(schema.$defs.stack.properties).sort()).toEqual(["absorber", "boundary", "front", "incidence", "layers", "rear", "rearLayers", "rearOuter"]);
  });
});
