import { describe, expect, it } from "vitest";
import { filmStack } from "../../src/optics/thinFilm.js";
import { constantMaterial, expectWithin4Sigma, registryWith, runTrace, stackOf } from "./helpers.js";

const ALPHA = Math.atan(Math.SQRT2); // (111) facet angle, 54.7356°
const ALPHA_DEG = (ALPHA * 180) / Math.PI;
const pyramids = { type: "upright-pyramids" as const, baseUm: 10, facetAngleDeg: ALPHA_DEG };

describe("bare regular upright pyramids at normal incidence", () => {
  it("reflectance = (8/9)·R1R2 + (1/9)·R1R2R3 with exact Fresnel at the three facet angles", () => {
    // Opaque substrate (n = 3.9, k = 1: α = 12.6/µm) so nothing re-escapes from inside.
    // Facet sequence (Baker-Finch & McIntosh 2011, from memory; derivable): all rays hit a facet at
    // α, then one at 180° − 3α; 1/9 hit a third at cosθ3 = |d''·n3|. All three planes of incidence
    // are the same, so s and p stay separate: R = Σ over s, p of (Rs1Rs2[Rs3]) / 2.
    const nk = { n: 3.9, k: 1 };
    const reg = registryWith(constantMaterial("opaque", nk.n, nk.k));
    const run = runTrace(
      stackOf({ absorber: { material: "opaque", thicknessUm: 100 }, rear: { ideal: { kind: "mirror", reflectance: 1 } } }, pyramids),
      reg,
      { nRays: 20000, seed: 21, compile: { estimator: "analog" } },
    );
    // Directions: d = −z; after facet 1 (normal (sinα, 0, cosα)) d' = (sin2α, 0, cos2α);
    // after facet 2 (normal (−sinα, 0, cosα)) d''; facet 3 has normal (sinα, 0, cosα).
    const c1 = Math.cos(ALPHA);
    const c2 = Math.abs(Math.cos(3 * ALPHA));
    const dpp = [Math.sin(2 * ALPHA) - 2 * Math.cos(3 * ALPHA) * -Math.sin(ALPHA), Math.cos(2 * ALPHA) - 2 * Math.cos(3 * ALPHA) * Math.cos(ALPHA)];
    const c3 = Math.abs(dpp[0] * Math.sin(ALPHA) + dpp[1] * Math.cos(ALPHA));
    const f = (c: number) => filmStack(1, [], nk, 1000, c); // complex Fresnel (no films)
    const [f1, f2, f3] = [f(c1), f(c2), f(c3)];
    const double = (f1.Rs * f2.Rs + f1.Rp * f2.Rp) / 2;
    const triple = (f1.Rs * f2.Rs * f3.Rs + f1.Rp * f2.Rp * f3.Rp) / 2;
    // Light reflected by the facets never entered the absorber: R_first carries the closed form.
    expectWithin4Sigma("pyramids opaque n=3.9+1i R_first vs 8/9·R1R2 + 1/9·R1R2R3", run.get("R_first"), (8 / 9) * double + (1 / 9) * triple);
    expect(run.get("R_escape").mean).toBeLessThan(1e-3);
    expect(run.eventsPerRay).toBeGreaterThan(1);
  });

  it("bare textured Si (Green 2008) reflects roughly 10–12 % at 700 and 800 nm (common practice)", () => {
    const reg = registryWith();
    for (const wavelengthNm of [700, 800]) {
      const run = runTrace(
        stackOf({ absorber: { material: "Si", thicknessUm: 180 }, rear: { ideal: { kind: "mirror", reflectance: 0.95 } } }, pyramids),
        reg,
        { wavelengthNm, nRays: 10000, seed: wavelengthNm, phiDeg: null },
      );
      const R = run.total("R");
      // A band, not a point value: pass when the band is within 4σ of the estimate.
      expect(R.mean).toBeGreaterThan(0.1 - 4 * R.se);
      expect(R.mean).toBeLessThan(0.12 + 4 * R.se);
    }
  });

  it("square symmetry: the same R and A at φ and 90° − φ (θ = 45°)", () => {
    const reg = registryWith();
    const stack = stackOf({ absorber: { material: "Si", thicknessUm: 180 }, rear: { ideal: { kind: "mirror", reflectance: 0.95 } } }, pyramids);
    const a = runTrace(stack, reg, { wavelengthNm: 1000, thetaDeg: 45, phiDeg: 20, nRays: 10000, seed: 1 });
    const b = runTrace(stack, reg, { wavelengthNm: 1000, thetaDeg: 45, phiDeg: 70, nRays: 10000, seed: 2 });
    for (const ch of ["R_first", "R_escape", "A_absorber", "A_rear"]) {
      const x = a.get(ch);
      const y = b.get(ch);
      // Independent runs: the difference has standard error √(σa² + σb²).
      expectWithin4Sigma(`symmetry φ=20° vs 70° ${ch} difference`, { mean: x.mean - y.mean, se: Math.hypot(x.se, y.se) }, 0);
    }
  });
});
