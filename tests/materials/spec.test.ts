import { describe, expect, it } from "vitest";
import { MaterialRegistry, materialFromSpec } from "../../src/materials/index.js";
import { inputErrorOf } from "../helpers/inputError.js";

describe("materialFromSpec(spec, baseDir, fieldPath): formula and constant entries", () => {
  it("constant: n, k at any wavelength in its range", () => {
    const m = materialFromSpec({ name: "encap", constant: { n: 1.5, k: 0 } }, ".", "materials[0]");
    expect(m.nk(350)).toEqual({ n: 1.5, k: 0 });
    const r = materialFromSpec({ name: "e2", constant: { n: 1.49, k: 1e-7 }, validNm: [300, 1200] }, ".", "m");
    expect(r.nk(1200)).toEqual({ n: 1.49, k: 1e-7 });
    expect(inputErrorOf(() => r.nk(1201))).toContain("300–1200 nm");
  });

  it("cauchy: n = A + B/λ² + C/λ⁴ with B in nm², C in nm⁴ (Cauchy's formula)", () => {
    const m = materialFromSpec({ name: "x", cauchy: { A: 1.5, B: 4200, C: 1e8 }, validNm: [300, 1200] }, ".", "m");
    expect(m.nk(600).n).toBeCloseTo(1.5 + 4200 / 600 ** 2 + 1e8 / 600 ** 4, 14);
    expect(m.nk(600).k).toBe(0);
  });

  it("sellmeier with Malitson's fused-silica terms (CUm2 = C²) equals the built-in SiO2-Malitson1965", () => {
    const c = [0.0684043, 0.1162414, 9.896161];
    const m = materialFromSpec(
      { name: "silica", sellmeier: { B: [0.6961663, 0.4079426, 0.8974794], CUm2: c.map((v) => v * v) }, validNm: [250, 2000] },
      ".",
      "m",
    );
    const ref = MaterialRegistry.withBuiltins().get("SiO2-Malitson1965");
    for (const w of [250, 587.6, 1000, 2000]) expect(m.nk(w).n).toBeCloseTo(ref.nk(w).n, 14);
  });

  it("optional constant k for a formula material", () => {
    const m = materialFromSpec({ name: "lossy", cauchy: { A: 2 }, k: 0.01, validNm: [300, 1200] }, ".", "m");
    expect(m.nk(500)).toEqual({ n: 2, k: 0.01 });
  });

  it("names the field path of each mistake", () => {
    expect(inputErrorOf(() => materialFromSpec({ name: "x", cauchy: { A: 1.5 } }, ".", "materials[3]"))).toContain("materials[3].validNm");
    expect(inputErrorOf(() => materialFromSpec({ name: "x", cauchy: { A: 1.5 }, validNm: [900, 300] }, ".", "m"))).toContain("m.validNm");
    expect(inputErrorOf(() => materialFromSpec({ name: "x", constant: { n: 1.5, k: -1 } }, ".", "m"))).toContain("m.constant.k");
    expect(inputErrorOf(() => materialFromSpec({ name: "x", constnt: { n: 1.5 } }, ".", "m"))).toContain("m.constnt");
    expect(inputErrorOf(() => materialFromSpec({ name: "x" }, ".", "m"))).toContain("exactly one of");
    expect(inputErrorOf(() => materialFromSpec({ name: "x", constant: { n: 1 }, csv: "a.csv" }, ".", "m"))).toContain("exactly one of");
    expect(inputErrorOf(() => materialFromSpec({ name: "a|b", constant: { n: 1.5 } }, ".", "m"))).toContain("m.name");
    expect(inputErrorOf(() => materialFromSpec("Si", ".", "materials[0]"))).toContain("materials[0]");
    expect(inputErrorOf(() => materialFromSpec({ name: "x", sellmeier: { B: [1], CUm2: [1, 2] }, validNm: [300, 900] }, ".", "m"))).toContain("m.sellmeier");
  });

  it("refuses a Sellmeier formula with a resonance inside validNm (n² < 0 there)", () => {
    // resonance at sqrt(0.36) µm = 600 nm
    const msg = inputErrorOf(() => materialFromSpec({ name: "r", sellmeier: { B: [1], CUm2: [0.36] }, validNm: [300, 900] }, ".", "m"));
    expect(msg).toContain("validNm");
  });
});
