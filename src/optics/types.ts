import type { NK } from "../materials/types.js";

export type { NK };

/** A coherent thin film: complex index N = n + ik (k ≥ 0) and physical thickness. */
export interface FilmLayer {
  n: number;
  k: number;
  thicknessNm: number;
}

/** Power fractions of a film stack for s and p light (incident power = 1). */
export interface FilmResult {
  Rs: number;
  Rp: number;
  /** Power crossing into the exit medium (absorbed there when it absorbs). */
  Ts: number;
  Tp: number;
  /** Absorptance of each film, same order as the films passed in. */
  As: Float64Array;
  Ap: Float64Array;
}

/**
 * Interface coefficients tabulated over cosθ of the incidence side, both directions of one interface.
 * Row i sits at cosθ = i/(nCos-1); row layout [Rs, Rp, Ts, Tp, As_0..As_{F-1}, Ap_0..Ap_{F-1}].
 * Film indices follow the `films` order given to buildInterfaceTable (films[0] touches the upper
 * medium) in both directions.
 */
export interface InterfaceTable {
  nCos: number;
  nFilms: number;
  /** 4 + 2*nFilms */
  stride: number;
  /** Light travelling from the upper into the lower medium (cosθ in the upper medium). */
  down: Float64Array;
  /** Light travelling from the lower into the upper medium (cosθ in the lower medium). */
  up: Float64Array;
  /** cosθ (incidence side) of the critical angle, or -1 when there is none. Below it Ts = Tp = 0. */
  cosCritDown: number;
  cosCritUp: number;
  /** Extra rows near the critical angle, uniform in t (see CritBand); null when there is none. */
  critBandDown: CritBand | null;
  critBandUp: CritBand | null;
  /**
   * Direction without films whose exit medium counts as lossless (interfaceTable.ts): its row is the
   * plain Fresnel result of two real indices, which interfacePowers computes instead of interpolating.
   */
  plainDown: boolean;
  plainUp: boolean;
  /** Real indices of the upper and lower media. */
  nUpper: number;
  nLower: number;
}

/**
 * Rows for cosθ ∈ [cosLo, 1] of a direction with a critical angle cc, uniform in the signed variable
 * t = sign(c − cc)·√|c² − cc²| (∝ the exit medium's normal wave-vector component, in which the
 * coefficients are smooth; in cosθ they have a square-root branch point at cc). Rows 0..nNeg-1
 * cover t ∈ [tLo, 0] with step dtNeg, rows nNeg-1..nNeg+nPos-2 cover [0, tHi] with step dtPos
 * (row nNeg-1 sits exactly at the critical angle). Same row layout as the main table.
 */
export interface CritBand {
  cosCrit: number;
  cosLo: number;
  tLo: number;
  tHi: number;
  nNeg: number;
  nPos: number;
  dtNeg: number;
  dtPos: number;
  /** 1/dtNeg and 1/dtPos (the lookup multiplies). */
  invDtNeg: number;
  invDtPos: number;
  rows: Float64Array;
}

/** Direction flags for lookupInterface. */
export const DIR_DOWN = 0;
export const DIR_UP = 1;
