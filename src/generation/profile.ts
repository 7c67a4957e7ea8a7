import type { SpectralProfile } from "./traceProfile.js";

/** Elementary charge, C (SI 2019 exact value). */
const Q_C = 1.602176634e-19;

/**
 * Generation profile under a spectrum: photon current weights w_i (mA/cm² per unit absorptance on
 * the wavelength grid, photocurrentWeights) turn the absorbed fractions per bin into
 *   G_bin = Σ_i (w_i·1e-3 / q) · f_i,bin / Δz_bin     (photons cm⁻³ s⁻¹, Δz in cm),
 * so q·Σ_bin G_bin·Δz_bin = Σ_i w_i·A_i·1e-3 A/cm², the absorber photocurrent (the bins of one
 * wavelength add up to its absorptance). Errors: independent wavelengths, sqrt(Σ (w_i se_i)²).
 */
export interface GenerationProfile {
  depthUm: Float64Array; // bin centres
  edgesUm: Float64Array;
  generationCm3S: Float64Array;
  generationStderrCm3S: Float64Array;
  /** q·∫G dz in mA/cm² and the absorber photocurrent Σ w_i A_i it must equal. */
  integratedMaCm2: number;
  absorberMaCm2: number;
  absorberStderrMaCm2: number;
}

export function generationUnderSpectrum(p: SpectralProfile, weightsMaCm2: ArrayLike<number>): GenerationProfile {
  const nB = p.edgesUm.length - 1;
  const nL = p.wavelengthNm.length;
  if (weightsMaCm2.length !== nL) throw new RangeError(`generation: ${weightsMaCm2.length} weights for ${nL} wavelengths`);
  const g = new Float64Array(nB);
  const v = new Float64Array(nB);
  for (let il = 0; il < nL; il++) {
    const photons = (weightsMaCm2[il] * 1e-3) / Q_C; // photons cm⁻² s⁻¹ per unit absorptance
    for (let b = 0; b < nB; b++) {
      g[b] += photons * p.fraction[il * nB + b];
      v[b] += (photons * p.fractionStderr[il * nB + b]) ** 2;
    }
  }
  const depthUm = new Float64Array(nB);
  const stderr = new Float64Array(nB);
  let integrated = 0;
  for (let b = 0; b < nB; b++) {
    const dzCm = (p.edgesUm[b + 1] - p.edgesUm[b]) * 1e-4;
    integrated += g[b]; // photons cm⁻² s⁻¹ absorbed in the bin
    g[b] /= dzCm;
    stderr[b] = Math.sqrt(v[b]) / dzCm;
    depthUm[b] = 0.5 * (p.edgesUm[b] + p.edgesUm[b + 1]);
  }
  let absorber = 0;
  let absorberVar = 0;
  for (let il = 0; il < nL; il++) {
    absorber += weightsMaCm2[il] * p.absorptance[il];
    absorberVar += (weightsMaCm2[il] * p.absorptanceStderr[il]) ** 2;
  }
  return {
    depthUm,
    edgesUm: p.edgesUm,
    generationCm3S: g,
    generationStderrCm3S: stderr,
    integratedMaCm2: integrated * Q_C * 1e3,
    absorberMaCm2: absorber,
    absorberStderrMaCm2: Math.sqrt(absorberVar),
  };
}

/** Per-wavelength generation per incident photon, cm⁻¹: f_i,bin / Δz_bin, [λ][bin]. */
export function spectralGenerationPerCm(p: SpectralProfile): Float64Array {
  const nB = p.edgesUm.length - 1;
  const out = new Float64Array(p.fraction.length);
  for (let i = 0; i < out.length; i++) {
    const b = i % nB;
    out[i] = p.fraction[i] / ((p.edgesUm[b + 1] - p.edgesUm[b]) * 1e-4);
  }
  return out;
}

/**
 * Optical EQE and, with a collection probability η per depth bin (0…1), the estimate of the
 * collected EQE: Σ_bin f_i,bin·η_bin. The first is optics alone (every photon absorbed in the
 * absorber counted); the second multiplies it by an assumed collection profile — an estimate,
 * never a measured EQE.
 */
export function eqeFromProfile(p: SpectralProfile, collection: Float64Array | null): { optical: Float64Array; collected: Float64Array | null } {
  const nB = p.edgesUm.length - 1;
  const nL = p.wavelengthNm.length;
  if (collection === null) return { optical: Float64Array.from(p.absorptance), collected: null };
  if (collection.length !== nB) throw new RangeError(`collection: ${collection.length} values for ${nB} depth bins`);
  const collected = new Float64Array(nL);
  for (let il = 0; il < nL; il++) {
    let s = 0;
    for (let b = 0; b < nB; b++) s += p.fraction[il * nB + b] * collection[b];
    collected[il] = s;
  }
  return { optical: Float64Array.from(p.absorptance), collected };
}
