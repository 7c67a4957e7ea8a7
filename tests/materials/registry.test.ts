import { describe, expect, it } from "vitest";
import { MaterialRegistry, materialFromSpec, registerStudyMaterials } from "../../src/materials/index.js";
import { editDistance } from "../../src/util/didYouMean.js";
import { inputErrorOf } from "../helpers/inputError.js";

const userSi = () => materialFromSpec({ name: "Si", constant: { n: 3.5, k: 0 } }, ".", "m");

describe("MaterialRegistry.add(m, { override })", () => {
  it("refuses a user material with a built-in's name or alias unless override is true", () => {
    const r = MaterialRegistry.withBuiltins();
    expect(inputErrorOf(() => r.add(userSi()))).toContain('"override": true');
    expect(inputErrorOf(() => r.add(materialFromSpec({ name: "Si-Green2008", constant: { n: 3.5 } }, ".", "m")))).toContain("built-in");
    expect(r.get("Si").name).toBe("Si-Green2008");
  });

  it("with override the user material answers to that name; the full built-in name still resolves", () => {
    const r = MaterialRegistry.withBuiltins();
    r.add(userSi(), { override: true });
    expect(r.get("Si").nk(600)).toEqual({ n: 3.5, k: 0 });
    expect(r.get("Si-Green2008").nk(600).n).toBe(3.94);
  });

  it("adds new names freely and refuses a second user material of the same name", () => {
    const r = MaterialRegistry.withBuiltins();
    const m = materialFromSpec({ name: "myNitride", constant: { n: 2.05 } }, ".", "m");
    r.add(m);
    expect(r.get("myNitride")).toBe(m);
    expect(r.list()).toContain(m);
    expect(inputErrorOf(() => r.add(materialFromSpec({ name: "myNitride", constant: { n: 2 } }, ".", "m"), { override: true }))).toContain("twice");
  });
});

describe("registerStudyMaterials(registry, specs, baseDir)", () => {
  it("honours each entry's override flag and names the entry in errors", () => {
    const r = MaterialRegistry.withBuiltins();
    registerStudyMaterials(r, [{ name: "encap", constant: { n: 1.5 } }, { name: "Si", constant: { n: 3.6 }, override: true }], ".");
    expect(r.get("Si").nk(800).n).toBe(3.6);
    const r2 = MaterialRegistry.withBuiltins();
    const msg = inputErrorOf(() => registerStudyMaterials(r2, [{ name: "ok", constant: { n: 1.5 } }, { name: "SiNx", constant: { n: 2 } }], "."));
    expect(msg).toContain("materials[1]");
  });
});

describe("MaterialRegistry.get(name) on unknown names", () => {
  const r = MaterialRegistry.withBuiltins();

  it("suggests the closest names (edit distance)", () => {
    expect(inputErrorOf(() => r.get("Si-Gren2008"))).toContain('did you mean "Si-Green2008"');
    expect(inputErrorOf(() => r.get("sinx"))).toContain('"SiNx"');
    expect(inputErrorOf(() => r.get("Al203"))).toContain('"Al2O3"'); // digit zero for the letter O
  });

  it("makes no suggestion when nothing is close", () => {
    const msg = inputErrorOf(() => r.get("unobtainium"));
    expect(msg).toContain('unknown material "unobtainium"');
    expect(msg).not.toContain("did you mean");
  });

  it("editDistance is the Levenshtein distance (kitten → sitting = 3, the textbook example)", () => {
    expect(editDistance("kitten", "sitting")).toBe(3);
    expect(editDistance("", "abc")).toBe(3);
    expect(editDistance("SiNx", "sinx")).toBe(0);
  });
});
