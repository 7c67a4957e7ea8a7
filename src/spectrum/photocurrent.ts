import { InputError } from "../util/errors.js";
import { Q_ELEMENTARY_C } from "../util/math.js";
import { photonFluxPerNm } from "./photonFlux.js";
import type { Spectrum } from "./types.js";

/** 1 A/m² = 0.1 mA/cm². */
const MA_CM2_PER_A_M2 = 0.1;

function checkGrid(gridNm: ArrayLike<number>, spectrum: Spectrum): void {
  if (gridNm.length < 2) throw new InputError(`photocurrent: wavelength grid needs at least 2 points, got ${gridNm.length}`);
  for (let i = 0; i < gridNm.length; i++) {
    const g = gridNm[i]!;
    if (!Number.isFinite(g)) throw new InputError(`photocurrent: wavelength grid point ${i} is ${g}`);
    if (i > 0 && !(g > gridNm[i - 1]!)) {
      throw new InputError(`photocurrent: wavelength grid must be strictly increasing (point ${i}: ${g} nm after ${gridNm[i - 1]} nm)`);
    }
  }
  const x = spectrum.wavelengthNm;
  const lo = x[0]!;
  const hi = x[x.length - 1]!;
  if (gridNm[0]! < lo || gridNm[gridNm.length - 1]! > hi) {
    throw new InputError(
      `photocurrent: wavelength grid ${gridNm[0]}–${gridNm[gridNm.length - 1]} nm reaches outside the spectrum "${spectrum.name}" (${lo}–${hi} nm)`,
    );
  }
}

/**
 * Bin weights wᵢ (mA/cm² per unit absorptance) so that J = Σ Aᵢ wᵢ for absorptance Aᵢ on gridNm.
 *
 * wᵢ = q ∫ hatᵢ(λ) Φ(λ) dλ, hatᵢ the piecewise-linear hat function of the coarse grid (1 at gᵢ, 0 at
 * its neighbours; the first and last bins are half hats, so J covers exactly [g₀, g_last]).
 * Quadrature: trapezoid rule on the union of the spectrum's fine grid and the coarse nodes, with Φ
 * linear between fine nodes (coarse nodes get Φ by linear interpolation). Hence Σ Aᵢ wᵢ equals,
 * to rounding, the trapezoid integral of q·A(λ)·Φ(λ) with A the linear interpolant of the Aᵢ, and
 * for A = 1 between two fine nodes it equals q times the trapezoid integral of Φ on the fine grid.
 */
export function photocurrentWeights(gridNm: ArrayLike<number>, spectrum: Spectrum): Float64Array {
  checkGrid(gridNm, spectrum);
  const x = spectrum.wavelengthNm;
  const phi = photonFluxPerNm(spectrum);
  const nG = gridNm.length;
  const w = new Float64Array(nG);
  const fluxAt = (lambda: number, j: number): number => {
    // Φ at lambda with x[j] ≤ lambda ≤ x[j+1]
    if (j >= x.length - 1 || lambda === x[j + 1]) return phi[Math.min(j + 1, x.length - 1)]!;
    if (lambda === x[j]) return phi[j]!;
    const t = (lambda - x[j]!) / (x[j + 1]! - x[j]!);
    return phi[j]! + t * (phi[j + 1]! - phi[j]!);
  };
  let j = 0; // fine interval index: x[j] ≤ current position
  for (let i = 0; i + 1 < nG; i++) {
    const g0 = gridNm[i]!;
    const g1 = gridNm[i + 1]!;
    const width = g1 - g0;
    while (j + 1 < x.length - 1 && x[j + 1]! <= g0) j++;
    // Walk the sub-segments [a, b] of [g0, g1] cut at the fine nodes inside it.
    let a = g0;
    let phiA = fluxAt(a, j);
    while (a < g1) {
      let b: number;
      let phiB: number;
      if (j + 1 < x.length && x[j + 1]! < g1) {
        b = x[j + 1]!;
        phiB = phi[j + 1]!;
        j++;
      } else {
        b = g1;
        phiB = fluxAt(b, j);
      }
      const hA = (g1 - a) / width; // hatᵢ at a (hat_{i+1} = 1 − hatᵢ)
      const hB = (g1 - b) / width;
      const half = 0.5 * (b - a);
      w[i] += half * (hA * phiA + hB * phiB);
      w[i + 1] += half * ((1 - hA) * phiA + (1 - hB) * phiB);
      a = b;
      phiA = phiB;
    }
  }
  const scale = Q_ELEMENTARY_C * MA_CM2_PER_A_M2;
  for (let i = 0; i < nG; i++) w[i] *= scale;
  return w;
}

/** J = q ∫ A(λ) Φ(λ) dλ in mA/cm² for absorptance values on gridNm (A linear between grid points). */
export function photocurrentMaCm2(gridNm: ArrayLike<number>, absorptance: ArrayLike<number>, spectrum: Spectrum): number {
  if (absorptance.length !== gridNm.length) {
    throw new InputError(`photocurrent: ${absorptance.length} absorptance values for ${gridNm.length} grid wavelengths`);
  }
  return weightedSum(photocurrentWeights(gridNm, spectrum), absorptance);
}

/** Σ wᵢ Aᵢ. */
export function weightedSum(weights: ArrayLike<number>, values: ArrayLike<number>): number {
  let s = 0;
  for (let i = 0; i < weights.length; i++) s += weights[i]! * values[i]!;
  return s;
}

/**
 * Standard error of J = Σ wᵢ Aᵢ for independent per-wavelength estimates with standard errors seᵢ:
 * sqrt(Σ wᵢ² seᵢ²) (propagation of independent errors; each wavelength has its own random stream).
 */
export function photocurrentStdErrMaCm2(weights: ArrayLike<number>, stderr: ArrayLike<number>): number {
  if (weights.length !== stderr.length) throw new InputError(`photocurrent: ${stderr.length} standard errors for ${weights.length} weights`);
  let s = 0;
  for (let i = 0; i < weights.length; i++) s += (weights[i]! * stderr[i]!) ** 2;
  return Math.sqrt(s);
}
