import { describe, expect, it } from "vitest";
import { constantMaterial, expectWithin4Sigma, expIntegral3, registryWith, runTrace, stackOf } from "./helpers.js";

const N_SLAB = 3.5;
const W_UM = 100;
const LAMBDA_NM = 1000;

function slabMaterial(alphaW: number) {
  const alphaPerUm = alphaW / W_UM;
  return constantMaterial(`slab-${alphaW}`, N_SLAB, (alphaPerUm * LAMBDA_NM * 1e-3) / (4 * Math.PI));
}

function lambertianStack(material: string, rear: "mirror" | "lambertian") {
  return stackOf({
    front: { texture: { type: "lambertian" }, films: [] },
    absorber: { material, thicknessUm: W_UM },
    rear: { ideal: { kind: rear, reflectance: 1 } },
  });
}

describe("expIntegral3", () => {
  it("E3(0) = 1/2 and satisfies the recurrence 2·E3(x) = e^−x − x·E2(x) (A&S 5.1.14)", () => {
    expect(expIntegral3(0)).toBeCloseTo(0.5, 12);
    // E2(x) = ∫₀¹ e^(−x/μ) dμ, same quadrature.
    const x = 0.7;
    const n = 20000;
    let s = 0;
    for (let i = 0; i <= n; i++) {
      const mu = i / n;
      const f = mu === 0 ? 0 : Math.exp(-x / mu);
      s += (i === 0 || i === n ? 1 : i % 2 === 1 ? 4 : 2) * f;
    }
    const e2 = s / n / 3;
    expect(2 * expIntegral3(x)).toBeCloseTo(Math.exp(-x) - x * e2, 10);
  });
});

describe("traceBatch with an ideal Lambertian front randomiser", () => {
  for (const alphaW of [0.01, 0.1, 1]) {
    const mat = slabMaterial(alphaW);
    const registry = registryWith(mat);

    it(`Lambertian rear (r = 1), αW = ${alphaW}: A = (1 − T_L²)/(1 − (1 − 1/n²)T_L²), T_L = 2E3(αW)`, () => {
      // Green, Prog. Photovolt. 10, 235 (2002); Deckman et al. 1983; Tiedje et al. 1984: every pass is
      // isotropic, one-pass transmittance of isotropic light T_L = 2E3(αW), escape fraction 1/n².
      const tL = 2 * expIntegral3(alphaW);
      const ref = (1 - tL * tL) / (1 - (1 - 1 / N_SLAB ** 2) * tL * tL);
      const run = runTrace(lambertianStack(mat.name, "lambertian"), registry, { wavelengthNm: LAMBDA_NM, nRays: 10000, seed: 5 });
      expectWithin4Sigma(`Lambertian front + Lambertian rear αW=${alphaW} A`, run.get("A_absorber"), ref);
      expectWithin4Sigma(`Lambertian front + Lambertian rear αW=${alphaW} R`, run.total("R"), 1 - ref);
    });

    it(`specular rear mirror (r = 1), αW = ${alphaW}: A = (1 − T₂)/(1 − (1 − 1/n²)T₂), T₂ = 2E3(2αW)`, () => {
      // Same derivation with a specular mirror: a ray keeps its angle over the round trip 2W/cosθ,
      // so the round-trip transmittance of Lambertian light is 2E3(2αW) (not (2E3(αW))²).
      const t2 = 2 * expIntegral3(2 * alphaW);
      const ref = (1 - t2) / (1 - (1 - 1 / N_SLAB ** 2) * t2);
      const run = runTrace(lambertianStack(mat.name, "mirror"), registry, { wavelengthNm: LAMBDA_NM, nRays: 10000, seed: 6 });
      expectWithin4Sigma(`Lambertian front + specular mirror αW=${alphaW} A`, run.get("A_absorber"), ref);
    });
  }

  it("weak absorption: mean path in the absorber → 4n²·W (Yablonovitch 1982) and A → 4n²αW/(1 + 4n²αW) (Tiedje et al. 1984)", () => {
    const alphaW = 1e-5;
    const mat = slabMaterial(alphaW);
    const run = runTrace(lambertianStack(mat.name, "mirror"), registryWith(mat), { wavelengthNm: LAMBDA_NM, nRays: 20000, seed: 9 });
    expectWithin4Sigma("Lambertian weak absorption path ratio vs 4n²", { mean: run.pathRatio, se: run.pathRatioStderr }, 4 * N_SLAB ** 2);
    const x = 4 * N_SLAB ** 2 * alphaW;
    expectWithin4Sigma("Lambertian weak absorption A vs 4n²αW/(1+4n²αW)", run.get("A_absorber"), x / (1 + x));
  });
});
