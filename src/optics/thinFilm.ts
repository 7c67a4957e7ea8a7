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

// The fields [E; H] at the current boundary, s and p (real, imaginary), and the logarithm of the
// scale factored out of them: slots of `fields`.
const ESR = 0, ESI = 1, HSR = 2, HSI = 3, EPR = 4, EPI = 5, HPR = 6, HPI = 7, LOG_SCALE = 8;
const fields = new Float64Array(9);
// The incidence side's flux normalisations 4η0/|η0 B + C|², s and p.
const norms = new Float64Array(2);

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
  startAtExit(nExit, s2, fl, nF);
  for (let j = nF - 1; j >= 0; j--) {
    throughFilm(films[j]!, k0, s2);
    fl[3 * j] = fields[ESR] * fields[HSR] + fields[ESI] * fields[HSI];
    fl[3 * j + 1] = fields[EPR] * fields[HPR] + fields[EPI] * fields[HPI];
    fl[3 * j + 2] = fields[LOG_SCALE];
  }
  reflectAtTop(n0 * c0, n0 / c0, out, off);
  fluxesDown(films, fl, out, off);
}

/** ε = N² = (n² − k²) + i·2nk of a medium. */
function permittivityRe(m: NK): number {
  return m.n * m.n - m.k * m.k;
}
function permittivityIm(m: NK): number {
  return 2 * m.n * m.k;
}

/**
 * N cosθ = √(ε − (n0 sinθ0)²), the root that decays into the medium, into sq; a vanishing one is
 * nudged off zero (TINY_NC).
 */
function normalIndex(er: number, ei: number, s2: number): void {
  complexSqrtDecaying(er - s2, ei, sq, 0);
  if (sq[0] === 0 && sq[1] === 0) sq[0] = TINY_NC;
}

/** Exit medium: ηs = Nc, ηp = N²/Nc; the fields there (E = 1: s H = Nc, p H = N²/Nc) and its flux. */
function startAtExit(nExit: NK, s2: number, fl: Float64Array, nF: number): void {
  const eer = permittivityRe(nExit);
  const eei = permittivityIm(nExit);
  normalIndex(eer, eei, s2);
  const ncr = sq[0]!;
  const nci = sq[1]!;
  const d = ncr * ncr + nci * nci;
  fields[ESR] = 1;
  fields[ESI] = 0;
  fields[HSR] = ncr;
  fields[HSI] = nci;
  fields[EPR] = 1;
  fields[EPI] = 0;
  fields[HPR] = (eer * ncr + eei * nci) / d;
  fields[HPI] = (eei * ncr - eer * nci) / d;
  fields[LOG_SCALE] = 0;
  fl[3 * nF] = ncr; // Re(E H*) with E = 1
  fl[3 * nF + 1] = fields[HPR];
  fl[3 * nF + 2] = 0;
}

/** Carries the fields from a film's bottom to its top through its characteristic matrix. */
function throughFilm(f: FilmLayer, k0: number, s2: number): void {
  const er = permittivityRe(f);
  const ei = permittivityIm(f);
  normalIndex(er, ei, s2);
  const ncr = sq[0]!;
  const nci = sq[1]!;
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
    fields[LOG_SCALE] += di;
  }
  // cos δ = cos dr cosh di − i sin dr sinh di ; sin δ = sin dr cosh di + i cos dr sinh di
  const cdr = cr * ch;
  const cdi = -sr * sh;
  const sdr = sr * ch;
  const sdi = cr * sh;
  // q1 = sin δ / Nc, q2 = Nc sin δ
  const d = ncr * ncr + nci * nci;
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
  applyMatrix(cdr, cdi, q1r, q1i, q2r, q2i, ESR);
  applyMatrix(cdr, cdi, p1r, p1i, p2r, p2i, EPR);
  rescaleFields();
}

/**
 * One polarisation's fields (slots at e: E re, im, H re, im): E' = cosδ E − i a H, H' = −i b E +
 * cosδ H, with a = sinδ/η and b = η sinδ (−i(x + iy) = y − ix).
 */
function applyMatrix(cdr: number, cdi: number, ar: number, ai: number, br: number, bi: number, e: number): void {
  const er = fields[e], ei = fields[e + 1], hr = fields[e + 2], hi = fields[e + 3];
  let tr = cdr * er - cdi * ei;
  let ti = cdr * ei + cdi * er;
  let ur = ar * hr - ai * hi;
  let ui = ar * hi + ai * hr;
  fields[e] = tr + ui;
  fields[e + 1] = ti - ur;
  tr = cdr * hr - cdi * hi;
  ti = cdr * hi + cdi * hr;
  ur = br * er - bi * ei;
  ui = br * ei + bi * er;
  fields[e + 2] = tr + ui;
  fields[e + 3] = ti - ur;
}

/** Keeps the fields' magnitudes bounded (only ever triggers for extreme stacks). */
function rescaleFields(): void {
  const f = fields;
  const mag = Math.max(Math.abs(f[ESR]), Math.abs(f[ESI]), Math.abs(f[HSR]), Math.abs(f[HSI]),
    Math.abs(f[EPR]), Math.abs(f[EPI]), Math.abs(f[HPR]), Math.abs(f[HPI]));
  if (mag > BIG) {
    const inv = 1 / mag;
    for (let i = ESR; i <= HPI; i++) fields[i] *= inv;
    fields[LOG_SCALE] += Math.log(mag);
  }
}

/** At the incidence medium (η0s = n0 cosθ0, η0p = n0 / cosθ0): Rs and Rp into out, the flux norms into `norms`. */
function reflectAtTop(e0s: number, e0p: number, out: Float64Array, off: number): void {
  // s
  let ar = e0s * fields[ESR] + fields[HSR];
  let ai = e0s * fields[ESI] + fields[HSI];
  let br = e0s * fields[ESR] - fields[HSR];
  let bi = e0s * fields[ESI] - fields[HSI];
  const denS = ar * ar + ai * ai;
  out[off] = (br * br + bi * bi) / denS;
  norms[0] = (4 * e0s) / denS;
  // p
  ar = e0p * fields[EPR] + fields[HPR];
  ai = e0p * fields[EPI] + fields[HPI];
  br = e0p * fields[EPR] - fields[HPR];
  bi = e0p * fields[EPI] - fields[HPI];
  const denP = ar * ar + ai * ai;
  out[off + 1] = (br * br + bi * bi) / denP;
  norms[1] = (4 * e0p) / denP;
}

/** Normalised net flux at each boundary: film j absorbs what enters it minus what leaves; Ts, Tp what reaches the exit. */
function fluxesDown(films: readonly FilmLayer[], fl: Float64Array, out: Float64Array, off: number): void {
  const nF = films.length;
  const normS = norms[0];
  const normP = norms[1];
  const lTop = fl[2]!;
  const scaled = fields[LOG_SCALE] !== 0;
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
