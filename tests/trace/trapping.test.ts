import { describe, expect, it } from "vitest";
import { filmStack } from "../../src/optics/thinFilm.js";
import { compileStack } from "../../src/trace/compile.js";
import { traceBatch } from "../../src/trace/kernel.js";
import { createTally } from "../../src/trace/tally.js";
import { MAX_PASSES } from "../../src/trace/tallyLayout.js";
import { summarizeDepthBins, summarizeTrapping } from "../../src/trace/trappingSummary.js";
import { RandomStream, streamKey } from "../../src/random/stream.js";
import { constantMaterial, expectWithin4Sigma, expectWithin4SigmaOrTable, expIntegral3, fresnelRsRp, registryWith, runTrace, stackOf } from "./helpers.js";

const N = 3.5;
const W_UM = 100;
const LAMBDA_NM = 1000;
const kOf = (alphaPerUm: number): number => (alphaPerUm * LAMBDA_NM * 1e-3) / (4 * Math.PI); // α = 4πk/λ

describe("passes behind an ideal Lambertian front (light-trapping series)", () => {
  // Derivation (Green, Prog. Photovolt. 10, 235 (2002); Yablonovitch 1982): behind an ideal
  // randomiser every pass is isotropic (cosine-weighted), so one traversal transmits T_L = 2E3(αW);
  // the Lambertian rear returns a fraction r; at the front a fraction 1/n² escapes. Pass k ends at
  // the rear for odd k and at the front for even k, so the power still inside after pass k is
  //   remaining(k) = T_L^k · r^⌈k/2⌉ · (1 − 1/n²)^⌊k/2⌋   (per unit entered power; all of it enters).
  const lambertianSlab = (alphaW: number, r: number) => {
    const mat = constantMaterial(`slab-passes-${alphaW}`, N, kOf(alphaW / W_UM));
    const stack = stackOf({
      front: { texture: { type: "lambertian" }, films: [] },
      absorber: { material: mat.name, thicknessUm: W_UM },
      rear: { ideal: { kind: "lambertian", reflectance: r } },
    });
    const tL = 2 * expIntegral3(alphaW);
    const remaining = (k: number): number => tL ** k * r ** Math.ceil(k / 2) * (1 - 1 / N ** 2) ** Math.floor(k / 2);
    return { mat, stack, remaining };
  };

  for (const estimator of ["expected", "analog"] as const) {
    it(`${estimator}: remaining after passes 1…10 match the geometric series within 4σ (αW = 0.3, r = 0.9)`, () => {
      const { mat, stack, remaining } = lambertianSlab(0.3, 0.9);
      const run = runTrace(stack, registryWith(mat), { nRays: 20000, seed: 31, compile: { estimator } });
      const t = summarizeTrapping(run.tally, run.channels.length);
      expect(t.entered.mean).toBe(1);
      // Passes 1…10 (remaining(10) ≈ 3e-3: some 60 of the 20000 rays still inside, enough for a sample error).
      for (let k = 1; k <= 10; k++) {
        const est = t.passRemaining[k - 1];
        expectWithin4Sigma(`Lambertian ${estimator} remaining after pass ${k}`, { mean: est.mean, se: est.stderr }, remaining(k));
      }
      // Nothing is reflected before entering behind an ideal randomiser.
      expect(run.get("R_first").mean).toBe(0);
    });
  }

  it(`the tail bin holds Σ over passes beyond ${MAX_PASSES} (αW = 0.02, r = 1)`, () => {
    const { mat, stack, remaining } = lambertianSlab(0.02, 1);
    const run = runTrace(stack, registryWith(mat), { nRays: 20000, seed: 32 });
    const t = summarizeTrapping(run.tally, run.channels.length);
    let tail = 0;
    for (let k = MAX_PASSES + 1; k < 3000; k++) tail += remaining(k);
    expectWithin4Sigma("Lambertian pass tail", { mean: t.passTail.mean, se: t.passTail.stderr }, tail);
  });

  it("weak-absorption path enhancement with absorption removed → 4n² (Yablonovitch 1982), while the photon path falls short", () => {
    // αW = 0.01 (4n²αW ≈ 0.5, inside the range the README gives for this tally): the photon path per
    // incident photon is A/(αW) with A = 4n²αW/(1 + 4n²αW) (Tiedje et al. 1984), about 2/3 of 4n²,
    // while the tally with the absorber's absorption removed gives the α → 0 limit 4n² itself.
    const a = 0.01;
    const m = constantMaterial("slab-free", N, kOf(a / W_UM));
    const mirror = stackOf({ front: { texture: { type: "lambertian" }, films: [] }, absorber: { material: m.name, thicknessUm: W_UM }, rear: { ideal: { kind: "mirror", reflectance: 1 } } });
    for (const estimator of ["expected", "analog"] as const) {
      const run = runTrace(mirror, registryWith(m), { nRays: 20000, seed: 5, compile: { estimator } });
      const t = summarizeTrapping(run.tally, run.channels.length);
      expectWithin4Sigma(`α→0 path ratio (${estimator}, αW = ${a}) vs 4n²`, { mean: t.freePathRatio.mean, se: t.freePathRatio.stderr }, 4 * N * N);
      expect(run.pathRatio).toBeLessThan(0.75 * 4 * N * N);
    }
  });
});

describe("R_first of a coated planar wafer equals the thin-film result (transfer-matrix method, Macleod)", () => {
  // A weakly absorbing wafer on a perfect mirror: most of the light that enters comes back out as
  // R_escape, yet R_first is the coating's reflectance alone.
  const wafer = constantMaterial("wafer", 3.6, kOf(0.002));
  const film = constantMaterial("arc", 2.0, 0);
  const stack = stackOf({
    front: { texture: { type: "planar" }, films: [{ material: "arc", thicknessNm: 75 }] },
    absorber: { material: "wafer", thicknessUm: W_UM },
    rear: { ideal: { kind: "mirror", reflectance: 1 } },
  });
  for (const thetaDeg of [0, 45]) {
    it(`θ = ${thetaDeg}°: R_first vs filmStack; R_escape carries the rest of the reflection`, () => {
      const f = filmStack(1, [{ n: 2.0, k: 0, thicknessNm: 75 }], { n: 3.6, k: kOf(0.002) }, LAMBDA_NM, Math.cos((thetaDeg * Math.PI) / 180));
      const run = runTrace(stack, registryWith(wafer, film), { thetaDeg, nRays: 20000, seed: 13 });
      expectWithin4SigmaOrTable(`coated wafer θ=${thetaDeg}° R_first`, run.get("R_first"), (f.Rs + f.Rp) / 2);
      expect(run.get("R_escape").mean).toBeGreaterThan(0.3);
    });
  }
});

describe("generation profile of a planar bare wafer at normal incidence (Beer–Lambert, pass by pass)", () => {
  // Slab n = 3.5 in air, rear to air: every pass is a straight beam; the down-going beams carry
  // (1−R)(R²e^{−2αW})^j e^{−αz}, the up-going ones (1−R)R e^{−αW}(R²e^{−2αW})^j e^{−α(W−z)} (R the
  // internal and external Fresnel reflectance at normal incidence, Hecht eq. 4.47). Summed, the
  // absorbed power in [a, b] per incident photon is
  //   (1−R)/(1 − R²e^{−2αW}) · [(e^{−αa} − e^{−αb}) + R e^{−2αW}(e^{αb} − e^{αa})].
  const alpha = 0.02;
  const mat = constantMaterial("slab-depth", N, kOf(alpha));
  const stack = stackOf({ absorber: { material: mat.name, thicknessUm: W_UM }, rear: { texture: { type: "planar" }, films: [], exit: "air" } });
  const R = fresnelRsRp(1, N, 1).Rs;
  const edges = [0, 0.5, 2, 5, 10, 20, 40, 70, 100];
  const binRef = (a: number, b: number): number =>
    ((1 - R) / (1 - R * R * Math.exp(-2 * alpha * W_UM))) * (Math.exp(-alpha * a) - Math.exp(-alpha * b) + R * Math.exp(-2 * alpha * W_UM) * (Math.exp(alpha * b) - Math.exp(alpha * a)));

  for (const estimator of ["expected", "analog"] as const) {
    it(`${estimator}: absorbed power per depth bin within 4σ; the bins add up to A_absorber (1e-9)`, () => {
      const cs = compileStack(stack, registryWith(mat), LAMBDA_NM, { estimator, depthEdgesUm: edges });
      const tally = createTally(cs);
      traceBatch(cs, 0, 0, 20000, new RandomStream(streamKey(3, "depth", estimator)), tally);
      const nC = cs.channels.length;
      const bins = summarizeDepthBins(tally, nC, edges.length - 1);
      let sum = 0;
      bins.forEach((b, i) => {
        expectWithin4Sigma(`planar G(z) ${estimator} bin [${edges[i]}, ${edges[i + 1]}] µm`, { mean: b.mean, se: b.stderr }, binRef(edges[i], edges[i + 1]));
        sum += b.mean;
      });
      const ia = cs.channels.indexOf("A_absorber");
      const absorber = tally[2 * ia] / tally[2 * nC];
      expect(Math.abs(sum - absorber)).toBeLessThan(1e-9 * absorber);
    });
  }
});
