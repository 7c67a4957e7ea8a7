import type { FilmLayer, FilmResult, NK } from "./types.js";
import { complexSqrtDecaying } from "./normalCosine.js";

/**
 * Coherent thin-film stack by the characteristic-matrix (transfer-matrix) method
 * (H. A. Macleod, Thin-Film Optical Filters, ch. 2), written for N = n + ik and exp(−iωt):
 *   film j: δ = 2π·N_j cosθ_j·d_j/λ, admittance ηs = N cosθ, ηp = N/cosθ (free-space units),
 *   [E; H]_top = [[cos δ, −i sin δ/η], [−i η sin δ, cos δ]] · [E; H]_bottom, starting from
 *   [1; η_exit] at the exit medium. With B, C the fields at the top:
 *   r = (η0 B − C)/(η0 B + C), net flux at any plane = 4η0·Re(E·H*)/|η0 B + C|².
 * T = flux into the exit medium (absorbed there when it absorbs), A_j = flux entering film j
 * minus flux leaving it, so R + T + ΣA = 1 to rounding.
 * The incidence medium is lossless with real index n0 (an absorbing one: pass Re n).
 * Very thick absorbing films are handled by factoring e^{Im δ} out of each matrix and carrying
 * the logarithm, so nothing overflows.
 */

/** Offsets within a row written by filmStackInto: [Rs, Rp, Ts, Tp, As_0.., Ap_0..]. */
export const ROW_RS = 0;
export const ROW_RP = 1;
export const ROW_TS = 2;
export const ROW_TP = 3;
export const ROW_A0 = 4;
export const rowStride = (nFilms: number): number => 4 + 2 * nFilms;

// Scratch per boundary b = 0..F (b = 0 top of the first film, b = F the exit interface):
// unnormalised flux s, flux p, log scale. Grows when a longer stack is seen.
let scratch = new Float64Array(3 * 9);
const sq = new Float64Array(2);

const GRAZING_COS = 1e-150;
// A vanishing normal component (exactly at a lossless critical angle) is nudged off zero so that
// ηp = N²/(N cosθ) stays finite; the change is far below rounding of every result.
const TINY_NC = 1e-100;
const BIG = 1e150;

/**
 * Writes the stack's power fractions for incidence at cosθ0 (angle in the incidence medium)
 * into out[off .. off + 4 + 2F): [Rs, Rp, Ts, Tp, As_0..As_{F-1}, Ap_0..Ap_{F-1}].
 * films[0] touches the incidence medium. No allocation (after the first call with F films).
 */
export function filmStackInto(
  n0: number,
  films: readonly FilmLayer[],
  nExit: NK,
  wavelengthNm: number,
  cosTheta0: number,
  out: Float64Array,
  off = 0,
): void {
  const nF = films.length;
  const c0 = cosTheta0 < 0 ? 0 : cosTheta0 > 1 ? 1 : cosTheta0;
  if (c0 < GRAZING_COS) {
    // grazing incidence: every stack reflects fully (η0s → 0, η0p → ∞)
    out[off] = 1;
    out[off + 1] = 1;
    for (let i = 2; i < 4 + 2 * nF; i++) out[off + i] = 0;
    return;
  }
  if (scratch.length < 3 * (nF + 1)) scratch = new Float64Array(3 * (nF + 1));
  const fl = scratch;
  const s2 = n0 * n0 * (1 - c0) * (1 + c0); // (n0 sinθ0)², Snell's invariant squared
  const k0 = (2 * Math.PI) / wavelengthNm;

  // exit medium: ηs = Nc, ηp = N²/Nc
  const ne = nExit.n;
  const ke = nExit.k;
  const eer = ne * ne - ke * ke;
  const eei = 2 * ne * ke;
  complexSqrtDecaying(eer - s2, eei, sq, 0);
  let ncr = sq[0]!;
  let nci = sq[1]!;
  if (ncr === 0 && nci === 0) ncr = TINY_NC;
  let d = ncr * ncr + nci * nci;
  // fields (E = 1): s: H = Nc ; p: H = N²/Nc
  let esr = 1, esi = 0, hsr = ncr, hsi = nci;
  let epr = 1, epi = 0;
  let hpr = (eer * ncr + eei * nci) / d;
  let hpi = (eei * ncr - eer * nci) / d;
  let logScale = 0;
  fl[3 * nF] = hsr; // Re(E H*) with E = 1
  fl[3 * nF + 1] = hpr;
  fl[3 * nF + 2] = 0;

  for (let j = nF - 1; j >= 0; j--) {
    const f = films[j]!;
    const n = f.n;
    const k = f.k;
    const er = n * n - k * k;
    const ei = 2 * n * k;
    complexSqrtDecaying(er - s2, ei, sq, 0);
    ncr = sq[0]!;
    nci = sq[1]!;
    if (ncr === 0 && nci === 0) ncr = TINY_NC;
    // δ = k0 d Nc = dr + i di (di ≥ 0)
    const kd = k0 * f.thicknessNm;
    const dr = kd * ncr;
    const di = kd * nci;
    const cr = Math.cos(dr);
    const sr = Math.sin(dr);
    let ch: number, sh: number;
    if (di === 0) {
      ch = 1;
      sh = 0;
    } else if (di < 20) {
      ch = Math.cosh(di);
      sh = Math.sinh(di);
    } else {
      // factor e^{di} out of the matrix
      const e = Math.exp(-2 * di);
      ch = 0.5 * (1 + e);
      sh = 0.5 * (1 - e);
      logScale += di;
    }
    // cos δ = cos dr cosh di − i sin dr sinh di ; sin δ = sin dr cosh di + i cos dr sinh di
    const cdr = cr * ch;
    const cdi = -sr * sh;
    const sdr = sr * ch;
    const sdi = cr * sh;
    // q1 = sin δ / Nc, q2 = Nc sin δ
    d = ncr * ncr + nci * nci;
    const q1r = (sdr * ncr + sdi * nci) / d;
    const q1i = (sdi * ncr - sdr * nci) / d;
    const q2r = ncr * sdr - nci * sdi;
    const q2i = ncr * sdi + nci * sdr;
    // s: sinδ/η = q1, η sinδ = q2 ; p: sinδ/η = q2/N², η sinδ = N² q1
    const de = er * er + ei * ei;
    const p1r = (q2r * er + q2i * ei) / de;
    const p1i = (q2i * er - q2r * ei) / de;
    const p2r = er * q1r - ei * q1i;
    const p2i = er * q1i + ei * q1r;

    // s: E' = cosδ E − i q1 H ; H' = −i q2 E + cosδ H   (−i(x + iy) = y − ix)
    let tr = cdr * esr - cdi * esi;
    let ti = cdr * esi + cdi * esr;
    let ur = q1r * hsr - q1i * hsi;
    let ui = q1r * hsi + q1i * hsr;
    const nEsr = tr + ui;
    const nEsi = ti - ur;
    tr = cdr * hsr - cdi * hsi;
    ti = cdr * hsi + cdi * hsr;
    ur = q2r * esr - q2i * esi;
    ui = q2r * esi + q2i * esr;
    hsr = tr + ui;
    hsi = ti - ur;
    esr = nEsr;
    esi = nEsi;

    // p: same with p1, p2
    tr = cdr * epr - cdi * epi;
    ti = cdr * epi + cdi * epr;
    ur = p1r * hpr - p1i * hpi;
    ui = p1r * hpi + p1i * hpr;
    const nEpr = tr + ui;
    const nEpi = ti - ur;
    tr = cdr * hpr - cdi * hpi;
    ti = cdr * hpi + cdi * hpr;
    ur = p2r * epr - p2i * epi;
    ui = p2r * epi + p2i * epr;
    hpr = tr + ui;
    hpi = ti - ur;
    epr = nEpr;
    epi = nEpi;

    // keep magnitudes bounded (only ever triggers for extreme stacks)
    const mag = Math.max(Math.abs(esr), Math.abs(esi), Math.abs(hsr), Math.abs(hsi),
      Math.abs(epr), Math.abs(epi), Math.abs(hpr), Math.abs(hpi));
    if (mag > BIG) {
      const inv = 1 / mag;
      esr *= inv; esi *= inv; hsr *= inv; hsi *= inv;
      epr *= inv; epi *= inv; hpr *= inv; hpi *= inv;
      logScale += Math.log(mag);
    }
    fl[3 * j] = esr * hsr + esi * hsi;
    fl[3 * j + 1] = epr * hpr + epi * hpi;
    fl[3 * j + 2] = logScale;
  }

  // incidence medium: η0s = n0 cosθ0, η0p = n0 / cosθ0
  const e0s = n0 * c0;
  const e0p = n0 / c0;
  // s
  let ar = e0s * esr + hsr;
  let ai = e0s * esi + hsi;
  let br = e0s * esr - hsr;
  let bi = e0s * esi - hsi;
  const denS = ar * ar + ai * ai;
  const Rs = (br * br + bi * bi) / denS;
  const normS = (4 * e0s) / denS;
  // p
  ar = e0p * epr + hpr;
  ai = e0p * epi + hpi;
  br = e0p * epr - hpr;
  bi = e0p * epi - hpi;
  const denP = ar * ar + ai * ai;
  const Rp = (br * br + bi * bi) / denP;
  const normP = (4 * e0p) / denP;

  const lTop = fl[2]!;
  const scaled = logScale !== 0;
  // normalised net flux at boundary b
  let prevS = fl[0]! * normS;
  let prevP = fl[1]! * normP;
  for (let j = 0; j < nF; j++) {
    const b = 3 * (j + 1);
    let w = 1;
    if (scaled) w = Math.exp(2 * (fl[b + 2]! - lTop));
    const fS = fl[b]! * normS * w;
    const fP = fl[b + 1]! * normP * w;
    if (films[j]!.k === 0) {
      out[off + 4 + j] = 0;
      out[off + 4 + nF + j] = 0;
    } else {
      out[off + 4 + j] = prevS - fS;
      out[off + 4 + nF + j] = prevP - fP;
    }
    prevS = fS;
    prevP = fP;
  }
  out[off] = Rs;
  out[off + 1] = Rp;
  out[off + 2] = prevS;
  out[off + 3] = prevP;
}

/** Allocating form of filmStackInto (for the CLI and tests; use filmStackInto in hot loops). */
export function filmStack(n0: number, films: readonly FilmLayer[], nExit: NK, wavelengthNm: number, cosTheta0: number): FilmResult {
  const nF = films.length;
  const row = new Float64Array(rowStride(nF));
  filmStackInto(n0, films, nExit, wavelengthNm, cosTheta0, row, 0);
  return {
    Rs: row[0]!,
    Rp: row[1]!,
    Ts: row[2]!,
    Tp: row[3]!,
    As: row.slice(4, 4 + nF),
    Ap: row.slice(4 + nF, 4 + 2 * nF),
  };
}
