import type { Material } from "./types.js";

/** Absorption coefficient α = 4πk/λ in 1/cm (any optics text; λ = vacuum wavelength, 1 nm = 1e-7 cm). */
export function absorptionCoefficientPerCm(material: Material, wavelengthNm: number): number {
  return alphaPerCm(material.nk(wavelengthNm).k, wavelengthNm);
}

/** α = 4πk/λ in 1/cm from k and the vacuum wavelength in nm. */
export function alphaPerCm(k: number, wavelengthNm: number): number {
  return (4 * Math.PI * k) / (wavelengthNm * 1e-7);
}
