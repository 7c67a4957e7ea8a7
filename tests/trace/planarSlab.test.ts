import { describe, expect, it } from "vitest";
import { filmStack } from "../../src/optics/thinFilm.js";
import { constantMaterial, expectWithin4Sigma, expectWithin4SigmaOrTable, fresnelRsRp, registryWith, runTrace, stackOf } from "./helpers.js";

// Thick planar slab in air: n = 3.5, α = 0.005/µm (k = αλ/4π at 1000 nm), 100 µm.
const N_SLAB = 3.5;
const ALPHA_PER_UM = 0.005;
const W_UM = 100;
const slab = constantMaterial("slab", N_SLAB, (ALPHA_PER_UM * 1.0) / (4 * Math.PI));
const registry = registryWith(slab, constantMaterial("film", 2.0, 0), constantMaterial("lossyFilm", 2.2, 0.05));
const stack = stackOf({ absorber: { material: "slab", thicknessUm: W_UM }, rear: { texture: { type: "planar" }, films: [], exit: "air" } });

/**
 * Incoherent multiple reflections in a slab between identical media (any radiometry text, e.g.
 * Born & Wolf §1.6 summed incoherently): τ = exp(−αW/cosθt), R = R1 + (1−R1)²R1τ²/(1−R1²τ²),
 * T = (1−R1)²τ/(1−R1²τ²), A = 1 − R − T. One polarisation at a time (s stays s in a planar slab).
 * Split by history (the first terms of the same series): R_first = R1 (never entered),
 * T_first = (1−R1)²τ (out at the first arrival at the rear); the rest is escape.
 */
function slabClosedForm(R1: number, cosT: number): { R: number; T: number; A: number; Rfirst: number; Tfirst: number } {
  const tau = Math.exp((-ALPHA_PER_UM * W_UM) / cosT);
  const den = 1 - R1 * R1 * tau * tau;
  const R = R1 + ((1 - R1) ** 2 * R1 * tau * tau) / den;
  const T = ((1 - R1) ** 2 * tau) / den;
  return { R, T, A: 1 - R - T, Rfirst: R1, Tfirst: (1 - R1) ** 2 * tau };
}

describe("traceBatch on a planar thick slab (incoherent Fresnel + Beer–Lambert closed form)", () => {
  for (const thetaDeg of [0, 60]) {
    const { Rs, Rp, cosT } = fresnelRsRp(1, N_SLAB, Math.cos((thetaDeg * Math.PI) / 180));
    const s = slabClosedForm(Rs, cosT);
    const p = slabClosedForm(Rp, cosT);
    const cases = [
      { pol: "s" as const, ref: s },
      { pol: "p" as const, ref: p },
      // Unpolarised: the mean of the s and p results (not of the Fresnel coefficients per bounce).
      {
        pol: "unpolarized" as const,
        ref: { R: (s.R + p.R) / 2, T: (s.T + p.T) / 2, A: (s.A + p.A) / 2, Rfirst: (s.Rfirst + p.Rfirst) / 2, Tfirst: (s.Tfirst + p.Tfirst) / 2 },
      },
    ];
    for (const { pol, ref } of cases) {
      it(`θ = ${thetaDeg}°, ${pol}: R, A, T and their first/escape split within 4σ`, () => {
        const run = runTrace(stack, registry, { thetaDeg, polarization: pol, nRays: 20000, seed: 7 + thetaDeg });
        const tag = `planar slab θ=${thetaDeg}° ${pol}`;
        expectWithin4Sigma(`${tag} R`, run.total("R"), ref.R);
        expectWithin4Sigma(`${tag} T`, run.total("T"), ref.T);
        expectWithin4Sigma(`${tag} A`, run.get("A_absorber"), ref.A);
        expectWithin4SigmaOrTable(`${tag} R_first`, run.get("R_first"), ref.Rfirst);
        expectWithin4SigmaOrTable(`${tag} R_escape`, run.get("R_escape"), ref.R - ref.Rfirst);
        expectWithin4SigmaOrTable(`${tag} T_first`, run.get("T_first"), ref.Tfirst);
        expectWithin4SigmaOrTable(`${tag} T_escape`, run.get("T_escape"), ref.T - ref.Tfirst);
      });
    }
  }

  it("analog estimator agrees with the closed form too (θ = 30°, unpolarised)", () => {
    const { Rs, Rp, cosT } = fresnelRsRp(1, N_SLAB, Math.cos(Math.PI / 6));
    const ref = (slabClosedForm(Rs, cosT).A + slabClosedForm(Rp, cosT).A) / 2;
    const run = runTrace(stack, registry, { thetaDeg: 30, nRays: 20000, seed: 3, compile: { estimator: "analog" } });
    expectWithin4Sigma("planar slab θ=30° unpolarised, analog A", run.get("A_absorber"), ref);
  });
});

describe("traceBatch on a coated planar absorber vs the transfer-matrix result", () => {
  // Opaque substrate (αW = 60): no light returns, so R and the film absorptance are those of the
  // coating alone, computed by filmStack (transfer-matrix method, Macleod).
  const opaque = constantMaterial("opaque", 3.6, (0.6 * 1.0) / (4 * Math.PI));
  const reg = registryWith(opaque, constantMaterial("lossyFilm", 2.2, 0.05));
  const coated = stackOf({
    front: { texture: { type: "planar" }, films: [{ material: "lossyFilm", thicknessNm: 90 }] },
    absorber: { material: "opaque", thicknessUm: 100 },
    rear: { ideal: { kind: "mirror", reflectance: 1 } },
  });
  for (const thetaDeg of [0, 50]) {
    it(`θ = ${thetaDeg}°: R and A_film within 4σ of filmStack (unpolarised)`, () => {
      const cos0 = Math.cos((thetaDeg * Math.PI) / 180);
      const f = filmStack(1, [{ n: 2.2, k: 0.05, thicknessNm: 90 }], { n: 3.6, k: (0.6 * 1.0) / (4 * Math.PI) }, 1000, cos0);
      const run = runTrace(coated, reg, { thetaDeg, nRays: 20000, seed: 11, compile: { estimator: "analog" } });
      const tag = `coated planar θ=${thetaDeg}°`;
      expectWithin4SigmaOrTable(`${tag} R_first`, run.get("R_first"), (f.Rs + f.Rp) / 2);
      expect(run.get("R_escape").mean).toBe(0);
      expectWithin4Sigma(`${tag} A_film`, run.get("A_film:front:0:lossyFilm"), (f.As[0] + f.Ap[0]) / 2);
      expectWithin4Sigma(`${tag} A_absorber`, run.get("A_absorber"), (f.Ts + f.Tp) / 2);
    });
  }

  it("a quarter-wave coating of index √(n0·ns) removes the reflection at normal incidence (Hecht)", () => {
    // n1 = √3.6, thickness λ/(4 n1): R = ((n0·ns − n1²)/(n0·ns + n1²))² = 0.
    const n1 = Math.sqrt(3.6);
    const lossless = constantMaterial("lossless", 3.6, 1e-3);
    const reg = registryWith(lossless, constantMaterial("qw", n1, 0));
    const qw = stackOf({
      front: { texture: { type: "planar" }, films: [{ material: "qw", thicknessNm: 1000 / (4 * n1) }] },
      absorber: { material: "lossless", thicknessUm: 10000 },
      rear: { ideal: { kind: "mirror", reflectance: 0 } },
    });
    const run = runTrace(qw, reg, { nRays: 5000, seed: 2 });
    // k = 1e-3 in the substrate changes R by ~(k/2n)² ≈ 2e-8.
    expect(run.total("R").mean).toBeLessThan(1e-6);
    expect(run.get("A_absorber").mean + run.get("A_rear").mean).toBeCloseTo(1, 6);
  });
});
