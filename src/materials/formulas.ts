/**
 * Dispersion formulas (pure). Sellmeier with resonances in µm², Cauchy in nm, and the
 * "constant plus power terms" form used by Rubin 1985 for soda-lime glass.
 */

/** Sellmeier: n² = 1 + A + Σ Bᵢ λ² / (λ² − Cᵢ), λ in µm, Cᵢ in µm² (Born & Wolf; Malitson 1965). */
export function sellmeierIndex(wavelengthNm: number, B: ArrayLike<number>, CUm2: ArrayLike<number>, A = 0): number {
  const l2 = (wavelengthNm * 1e-3) ** 2;
  let n2 = 1 + A;
  for (let i = 0; i < B.length; i++) n2 += (B[i]! * l2) / (l2 - CUm2[i]!);
  return Math.sqrt(n2);
}

/** Cauchy: n = A + B/λ² + C/λ⁴ with λ in nm (B in nm², C in nm⁴). */
export function cauchyIndex(wavelengthNm: number, A: number, B: number, C: number): number {
  const l2 = wavelengthNm * wavelengthNm;
  return A + B / l2 + C / (l2 * l2);
}

/** n = c0 + Σ cᵢ λ^eᵢ with λ in µm (Rubin 1985: n = 1.5130 − 0.003169 λ² + 0.003962 λ⁻²). */
export function powerSeriesIndex(wavelengthNm: number, c0: number, coef: ArrayLike<number>, exponent: ArrayLike<number>): number {
  const l = wavelengthNm * 1e-3;
  let n = c0;
  for (let i = 0; i < coef.length; i++) n += coef[i]! * l ** exponent[i]!;
  return n;
}
