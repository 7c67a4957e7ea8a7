import { describe, expect, it } from "vitest";
import { filmStack } from "../../src/optics/thinFilm.js";
import type { StackSpec, TextureSpec } from "../../src/study/stackTypes.js";
import { validateStack } from "../../src/study/validateStack.js";
import { inputErrorOf } from "../helpers/inputError.js";
import { constantMaterial, expectWithin4Sigma, registryWith, runTrace } from "./helpers.js";

const ALPHA = Math.atan(Math.SQRT2); // (111) facet angle, 54.7356°
const pyramids = (baseUm: number): TextureSpec => ({ type: "upright-pyramids", baseUm, facetAngleDeg: (ALPHA * 180) / Math.PI });

function glassOnWafer(glass: string, topTexture: TextureSpec | undefined): StackSpec {
  return {
    incidence: "air",
    layers: [
      { name: "cover glass", material: glass, thicknessUm: 2000, topFilms: [], ...(topTexture ? { topTexture } : {}) },
      { name: "encapsulant", material: "EVA", thicknessUm: 450, topFilms: [] },
    ],
    front: { texture: pyramids(6), films: [{ material: "SiNx", thicknessNm: 75 }] },
    absorber: { material: "Si", thicknessUm: 160 },
    rear: { ideal: { kind: "mirror", reflectance: 0.9 } },
    boundary: "periodic",
  };
}

describe("texture on the outer glass face (textured glass)", () => {
  it("upright pyramids on an opaque cover reflect (8/9)·R1R2 + (1/9)·R1R2R3 with exact Fresnel at the three facet angles", () => {
    // The same reference as the wafer-front pyramids (Baker-Finch & McIntosh 2011, from memory;
    // derivable): facet sequence α, 180° − 3α, and for 1/9 of rays a third facet. The cover layer is
    // opaque (n = 3.9 + 1i, α = 12.6/µm), so what enters it never returns; here the texture sits at
    // its own scale (100 µm) on the outer face of a 2 mm layer.
    const nk = { n: 3.9, k: 1 };
    const reg = registryWith(constantMaterial("opaque", nk.n, nk.k));
    const run = runTrace(glassOnWafer("opaque", pyramids(100)), reg, { nRays: 20000, seed: 23, compile: { estimator: "analog" } });
    const c1 = Math.cos(ALPHA);
    const c2 = Math.abs(Math.cos(3 * ALPHA));
    const dpp = [Math.sin(2 * ALPHA) - 2 * Math.cos(3 * ALPHA) * -Math.sin(ALPHA), Math.cos(2 * ALPHA) - 2 * Math.cos(3 * ALPHA) * Math.cos(ALPHA)];
    const c3 = Math.abs(dpp[0]! * Math.sin(ALPHA) + dpp[1]! * Math.cos(ALPHA));
    const f = (c: number) => filmStack(1, [], nk, 1000, c);
    const [f1, f2, f3] = [f(c1), f(c2), f(c3)];
    const double = (f1.Rs * f2.Rs + f1.Rp * f2.Rp) / 2;
    const triple = (f1.Rs * f2.Rs * f3.Rs + f1.Rp * f2.Rp * f3.Rp) / 2;
    // Nothing reaches the absorber through an opaque cover: all of it is reflected before entering.
    expectWithin4Sigma("pyramids on the outer face of an opaque cover: R_first", run.get("R_first"), (8 / 9) * double + (1 / 9) * triple);
    expect(run.get("R_escape").mean).toBe(0);
    expect(run.get("A_layer:cover glass").mean).toBeCloseTo(1 - run.get("R_first").mean, 12);
  });

  it("conserves energy and lowers the front reflection of a glass-covered cell (anti-glare glass)", () => {
    // Σ channels = 1 per ray (conservation); textured cover glass reflects less at normal incidence
    // than flat glass (about 4 % for flat glass n ≈ 1.5, Fresnel; common practice for textured glass)
    const reg = registryWith();
    for (const tex of [pyramids(100), { type: "grooves", periodUm: 80, facetAngleDeg: 30, orientationDeg: 0 } as TextureSpec, { type: "inverted-pyramids", baseUm: 120, facetAngleDeg: 40 } as TextureSpec]) {
      const t = runTrace(glassOnWafer("glass", tex), reg, { wavelengthNm: 600, nRays: 4000, seed: 3 });
      expect(Math.abs(t.mean.reduce((a, b) => a + b, 0) - 1)).toBeLessThan(1e-12);
      expect(t.get("unresolved").mean).toBe(0);
    }
    const flat = runTrace(glassOnWafer("glass", undefined), reg, { wavelengthNm: 600, nRays: 20000, seed: 4 });
    const textured = runTrace(glassOnWafer("glass", pyramids(100)), reg, { wavelengthNm: 600, nRays: 20000, seed: 5 });
    // The reflection before entering is what the cover texture changes.
    const a = flat.get("R_first"), b = textured.get("R_first");
    expect(b.mean).toBeLessThan(a.mean - 4 * Math.hypot(a.se, b.se));
  });

  it("is refused on an inner layer and as an ideal randomiser, naming the field", () => {
    const raw = {
      layers: [{ material: "glass", thicknessUm: 2000 }, { material: "EVA", thicknessUm: 450, topTexture: { type: "grooves", periodUm: 50 } }],
      front: { texture: { type: "planar" } }, absorber: { thicknessUm: 150 }, rear: { ideal: { kind: "mirror" } },
    };
    expect(inputErrorOf(() => validateStack(raw, "stack"))).toMatch(/stack\.layers\[1\]\.topTexture: only the outermost layer/);
    const lamb = { ...raw, layers: [{ material: "glass", thicknessUm: 2000, topTexture: { type: "lambertian" } }] };
    expect(inputErrorOf(() => validateStack(lamb, "stack"))).toMatch(/layers\[0\]\.topTexture\.type/);
  });
});
