import { photocurrentWeights } from "../spectrum/photocurrent.js";
import type { Spectrum } from "../spectrum/types.js";

/** Photon-weighted reflectance of a surface over a wavelength range, and the currents behind it. */
export interface WeightedReflectance {
  /** R̄ = ∫ R Φ dλ / ∫ Φ dλ (Φ the photon flux of the spectrum). */
  reflectance: number;
  /** q ∫ R Φ dλ: photocurrent the reflection takes away, mA/cm². */
  reflectedMaCm2: number;
  /** q ∫ Φ dλ over the same range, mA/cm². */
  availableMaCm2: number;
}

/**
 * Photon-weighted reflectance on a wavelength grid: with R linear between grid points, the ratio of
 * the reflected to the incident photon current, R̄ = Σ Rᵢ wᵢ / Σ wᵢ with the photocurrent weights
 * wᵢ of the spectrum (the weighted average reflectance used to compare antireflection coatings).
 */
export function photonWeightedReflectance(gridNm: ArrayLike<number>, reflectance: ArrayLike<number>, spectrum: Spectrum): WeightedReflectance {
  const w = photocurrentWeights(gridNm, spectrum);
  let reflected = 0;
  let available = 0;
  for (let i = 0; i < w.length; i++) {
    reflected += reflectance[i]! * w[i]!;
    available += w[i]!;
  }
  return { reflectance: reflected / available, reflectedMaCm2: reflected, availableMaCm2: available };
}
