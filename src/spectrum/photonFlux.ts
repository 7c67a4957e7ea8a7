import { C_LIGHT_MS, H_PLANCK_JS } from "../util/math.js";
import type { Spectrum } from "./types.js";

/** Photon flux Φ(λ) = E(λ)·λ/(hc) in photons s⁻¹ m⁻² nm⁻¹ (photon energy hc/λ, λ in m). */
export function photonFluxPerNm(spectrum: Spectrum): Float64Array {
  const { wavelengthNm: x, irradianceWm2PerNm: e } = spectrum;
  const out = new Float64Array(x.length);
  for (let i = 0; i < x.length; i++) out[i] = (e[i]! * x[i]! * 1e-9) / (H_PLANCK_JS * C_LIGHT_MS);
  return out;
}
