import { describe, expect, it } from "vitest";
import { loadStudyFromDocument } from "../../src/study/load.js";
import { traceGenerationProfile } from "../../src/generation/traceProfile.js";
import { eqeFromProfile, generationUnderSpectrum, spectralGenerationPerCm } from "../../src/generation/profile.js";
import { collectionAt, parseCollectionCsv } from "../../src/generation/collection.js";
import { astmG173, photocurrentWeights } from "../../src/spectrum/index.js";

/** A small study: SiNx-coated planar Si (Green 2008) on Ag, a few wavelengths. */
function planarStudy() {
  return loadStudyFromDocument(
    {
      name: "generation-test",
      stack: {
        front: { texture: { type: "planar" }, films: [{ material: "SiNx", thicknessNm: 75 }] },
        absorber: { material: "Si", thicknessUm: 150 },
        rear: { texture: { type: "planar" }, films: [], exit: "Ag" },
      },
      grid: { thetaDeg: [0], phiDeg: [0], wavelengthNm: { from: 400, to: 1100, step: 100 } },
      rays: { perPoint: 1000, batch: 500 },
      seed: 5,
    },
    { baseDir: process.cwd() },
  );
}

describe("generation profile G(z) under AM1.5G", () => {
  const loaded = planarStudy();
  const study = loaded.combos[0].study;
  const spectral = traceGenerationProfile({
    study,
    registry: loaded.registry,
    comboIndex: 0,
    thetaDeg: 0,
    phiDeg: 0,
    raysPerWavelength: 3000,
    batch: 1000,
    grid: { bins: 40, firstBinUm: 0.005 },
    seed: 5,
  });
  const weights = photocurrentWeights(study.grid.wavelengthNm, astmG173("global"));
  const g = generationUnderSpectrum(spectral, weights);

  it("q·∫G dz equals the absorber photocurrent to 1e-9 relative (the bins of each wavelength add up to its absorptance)", () => {
    // Charge conservation: every photon absorbed in the absorber lies in exactly one depth bin.
    expect(Math.abs(g.integratedMaCm2 - g.absorberMaCm2)).toBeLessThan(1e-9 * g.absorberMaCm2);
    expect(g.absorberMaCm2).toBeGreaterThan(10);
  });

  it("bins grow geometrically from the front and cover the absorber; G falls with depth at short wavelengths", () => {
    const e = spectral.edgesUm;
    expect(e[0]).toBe(0);
    expect(e[1]).toBeCloseTo(0.005, 12);
    expect(e[e.length - 1]).toBe(150);
    for (let i = 2; i < e.length; i++) expect(e[i] - e[i - 1]).toBeGreaterThan(e[i - 1] - e[i - 2]);
    // 400 nm in Si: α ≈ 1e5/cm (Green 2008), absorption depth ~0.1 µm: per-photon G decreases with depth
    // over the first micrometres (Beer–Lambert).
    const perCm = spectralGenerationPerCm(spectral);
    const nB = e.length - 1;
    const firstDeep = e.findIndex((x) => x > 2) - 1;
    expect(perCm[0]).toBeGreaterThan(perCm[firstDeep]);
    expect(perCm[nB * 0 + nB - 1]).toBeLessThan(1e-6 * perCm[0]);
  });

  it("optical EQE is the absorptance; a uniform collection η scales it, a CSV η(z) interpolates per bin", () => {
    const opt = eqeFromProfile(spectral, null);
    expect(opt.collected).toBeNull();
    const uniform = eqeFromProfile(spectral, new Float64Array(40).fill(0.9));
    uniform.collected!.forEach((v, il) => expect(v).toBeCloseTo(0.9 * spectral.absorptance[il], 9));
    const curve = parseCollectionCsv("depth_um,collection\n0,0.5\n10,1\n", "eta.csv");
    expect(Array.from(collectionAt(curve, [0, 5, 10, 100]))).toEqual([0.5, 0.75, 1, 1]);
    expect(() => parseCollectionCsv("depth_um,collection\n0,1.5\n", "eta.csv")).toThrow(/eta.csv:2: expected a collection probability in \[0, 1\]/);
  });
});
