import { trapezoid } from "./integrate.js";
import { photocurrentWeights } from "./photocurrent.js";

/** 1 mA/cm² = 10 A/m². */
const A_M2_PER_MA_CM2 = 10;

/**
 * The linear map from a spectrum sampled on a fixed fine grid to photocurrent bin weights on a
 * coarse grid (photocurrentWeights, which is linear in the irradiance values), stored sparsely:
 * built once from unit spectra, then applied per hour without allocation.
 */
export interface BinProjector {
  fineNm: Float64Array;
  nCoarse: number;
  /** CSR rows per coarse point: start offsets, fine indices and coefficients (A/m² per (W m⁻² nm⁻¹)). */
  rowStart: Int32Array;
  col: Int32Array;
  coef: Float64Array;
}

export function binProjector(coarseNm: ArrayLike<number>, fineNm: Float64Array): BinProjector {
  const nF = fineNm.length, nC = coarseNm.length;
  const dense = new Float64Array(nC * nF);
  const unit = new Float64Array(nF);
  for (let k = 0; k < nF; k++) {
    unit.fill(0);
    unit[k] = 1;
    const w = photocurrentWeights(coarseNm, { name: "unit", wavelengthNm: fineNm, irradianceWm2PerNm: unit });
    for (let i = 0; i < nC; i++) dense[i * nF + k] = w[i]! * A_M2_PER_MA_CM2;
  }
  const rowStart = new Int32Array(nC + 1), col: number[] = [], coef: number[] = [];
  for (let i = 0; i < nC; i++) {
    for (let k = 0; k < nF; k++) {
      const c = dense[i * nF + k]!;
      if (c !== 0) { col.push(k); coef.push(c); }
    }
    rowStart[i + 1] = col.length;
  }
  return { fineNm, nCoarse: nC, rowStart, col: Int32Array.from(col), coef: Float64Array.from(coef) };
}

/**
 * Current weights per W/m² of broadband light with the spectral shape `e` (on the projector's fine
 * grid): out[i] = (P·e)ᵢ · inBandFraction / ∫e. `inBandFraction` is the share of the broadband
 * irradiance that the fine grid covers (1 when it spans the whole spectrum). Returns ∫e (trapezoid).
 */
export function projectPerWm2(p: BinProjector, e: ArrayLike<number>, inBandFraction: number, out: Float64Array, outOffset = 0): number {
  const total = trapezoid(p.fineNm, e);
  const scale = total > 0 ? inBandFraction / total : 0;
  for (let i = 0; i < p.nCoarse; i++) {
    let s = 0;
    for (let j = p.rowStart[i]!; j < p.rowStart[i + 1]!; j++) s += p.coef[j]! * e[p.col[j]!]!;
    out[outOffset + i] = s * scale;
  }
  return total;
}
