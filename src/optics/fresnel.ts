import { complexSqrtDecaying } from "./normalCosine.js";

/**
 * Fresnel coefficients of one plane interface between media of complex index N1 = n1 + ik1
 * (incidence side) and N2 = n2 + ik2, time dependence exp(−iωt) (k ≥ 0 absorbs).
 * Amplitudes in the Born & Wolf convention (Principles of Optics §1.5.2; Hecht, Optics §4.6):
 *   rs = (N1c1 − N2c2)/(N1c1 + N2c2),          ts = 2N1c1/(N1c1 + N2c2)
 *   rp = (N2²·N1c1 − N1²·N2c2)/(N2²·N1c1 + N1²·N2c2),  tp = 2N1N2·N1c1/(N2²·N1c1 + N1²·N2c2)
 * with Nc = N cosθ (N2c2 on the branch decaying into medium 2). Powers R = |r|², T = flux ratio
 * of the normal Poynting components (Re of the admittances); R + T = 1 when k1 = 0.
 * An absorbing incidence medium only enters the amplitudes; its power coefficients use Re of its
 * admittance (the usual convention; the incident flux is then not uniquely defined).
 */
export const FRESNEL_RS_RE = 0;
export const FRESNEL_RS_IM = 1;
export const FRESNEL_RP_RE = 2;
export const FRESNEL_RP_IM = 3;
export const FRESNEL_TS_RE = 4;
export const FRESNEL_TS_IM = 5;
export const FRESNEL_TP_RE = 6;
export const FRESNEL_TP_IM = 7;
export const FRESNEL_RS = 8;
export const FRESNEL_RP = 9;
export const FRESNEL_TS = 10;
export const FRESNEL_TP = 11;
/** Complex cosθt (cos of the angle in medium 2; imaginary part > 0 beyond the critical angle). */
export const FRESNEL_COS_T_RE = 12;
export const FRESNEL_COS_T_IM = 13;
export const FRESNEL_OUT_LENGTH = 14;

const sq = new Float64Array(2);

/**
 * Writes the Fresnel coefficients for incidence at cosθ1 ∈ [0, 1] (real angle in medium 1)
 * into out[0..FRESNEL_OUT_LENGTH-1] (layout FRESNEL_*). No allocation.
 */
export function fresnelInto(n1: number, k1: number, n2: number, k2: number, cosTheta1: number, out: Float64Array): void {
  const c1 = cosTheta1 < 0 ? 0 : cosTheta1 > 1 ? 1 : cosTheta1;
  const sin2 = (1 - c1) * (1 + c1);
  // N1², N2²
  const e1r = n1 * n1 - k1 * k1;
  const e1i = 2 * n1 * k1;
  const e2r = n2 * n2 - k2 * k2;
  const e2i = 2 * n2 * k2;
  // N1c1 = N1 cosθ1 (real angle in medium 1)
  const a1r = n1 * c1;
  const a1i = k1 * c1;
  // N2c2 = √(N2² − N1² sin²θ1), decaying branch (Snell: N1 sinθ1 = N2 sinθ2)
  complexSqrtDecaying(e2r - e1r * sin2, e2i - e1i * sin2, sq, 0);
  const a2r = sq[0]!;
  const a2i = sq[1]!;

  // s: rs = (a1 − a2)/(a1 + a2), ts = 2a1/(a1 + a2)
  const dsr = a1r + a2r;
  const dsi = a1i + a2i;
  const ds2 = dsr * dsr + dsi * dsi;
  const nsr = a1r - a2r;
  const nsi = a1i - a2i;
  let rsr: number, rsi: number, tsr: number, tsi: number;
  if (ds2 === 0) {
    // both normal components vanish (grazing onto an identical lossless medium): treat as reflecting
    rsr = 1; rsi = 0; tsr = 0; tsi = 0;
  } else {
    rsr = (nsr * dsr + nsi * dsi) / ds2;
    rsi = (nsi * dsr - nsr * dsi) / ds2;
    tsr = (2 * (a1r * dsr + a1i * dsi)) / ds2;
    tsi = (2 * (a1i * dsr - a1r * dsi)) / ds2;
  }

  // p: u = N2²·a1, v = N1²·a2 ; rp = (u − v)/(u + v), tp = 2 N1 N2 a1/(u + v)
  const ur = e2r * a1r - e2i * a1i;
  const ui = e2r * a1i + e2i * a1r;
  const vr = e1r * a2r - e1i * a2i;
  const vi = e1r * a2i + e1i * a2r;
  const dpr = ur + vr;
  const dpi = ui + vi;
  const dp2 = dpr * dpr + dpi * dpi;
  let rpr: number, rpi: number, tpr: number, tpi: number;
  if (dp2 === 0) {
    rpr = 1; rpi = 0; tpr = 0; tpi = 0;
  } else {
    const npr = ur - vr;
    const npi = ui - vi;
    rpr = (npr * dpr + npi * dpi) / dp2;
    rpi = (npi * dpr - npr * dpi) / dp2;
    // w = 2 N1 N2 a1
    const n12r = n1 * n2 - k1 * k2;
    const n12i = n1 * k2 + k1 * n2;
    const wr = 2 * (n12r * a1r - n12i * a1i);
    const wi = 2 * (n12r * a1i + n12i * a1r);
    tpr = (wr * dpr + wi * dpi) / dp2;
    tpi = (wi * dpr - wr * dpi) / dp2;
  }

  // powers: flux through the interface ∝ Re(η)|E_tangential|², ηs = Nc, ηp = N²/Nc
  // (Macleod, Thin-Film Optical Filters §2.4); written without dividing by Nc:
  //   Ts = Re(a2)/Re(a1)·|ts|²,  Tp = [Re(N2²·conj a2)/|N2|²] / [Re(N1²·conj a1)/|N1|²] · |tp|²
  const fluxS1 = a1r;
  const fluxP1 = (e1r * a1r + e1i * a1i) / (n1 * n1 + k1 * k1);
  const fluxS2 = a2r;
  const fluxP2 = (e2r * a2r + e2i * a2i) / (n2 * n2 + k2 * k2);
  let Ts = fluxS1 > 0 ? (fluxS2 / fluxS1) * (tsr * tsr + tsi * tsi) : 0;
  let Tp = fluxP1 > 0 ? (fluxP2 / fluxP1) * (tpr * tpr + tpi * tpi) : 0;
  if (!(Ts > 0)) Ts = 0;
  if (!(Tp > 0)) Tp = 0;

  out[FRESNEL_RS_RE] = rsr;
  out[FRESNEL_RS_IM] = rsi;
  out[FRESNEL_RP_RE] = rpr;
  out[FRESNEL_RP_IM] = rpi;
  out[FRESNEL_TS_RE] = tsr;
  out[FRESNEL_TS_IM] = tsi;
  out[FRESNEL_TP_RE] = tpr;
  out[FRESNEL_TP_IM] = tpi;
  out[FRESNEL_RS] = rsr * rsr + rsi * rsi;
  out[FRESNEL_RP] = rpr * rpr + rpi * rpi;
  out[FRESNEL_TS] = Ts;
  out[FRESNEL_TP] = Tp;
  // cosθ2 = N2c2 / N2
  const m2 = n2 * n2 + k2 * k2;
  out[FRESNEL_COS_T_RE] = (a2r * n2 + a2i * k2) / m2;
  out[FRESNEL_COS_T_IM] = (a2i * n2 - a2r * k2) / m2;
}

/** Allocating convenience form of fresnelInto (not for hot loops). */
export function fresnel(n1: number, k1: number, n2: number, k2: number, cosTheta1: number): Float64Array {
  const out = new Float64Array(FRESNEL_OUT_LENGTH);
  fresnelInto(n1, k1, n2, k2, cosTheta1, out);
  return out;
}

/** Brewster angle (Rp = 0) in radians between lossless media: tanθB = n2/n1 (Hecht §8.6). */
export function brewsterAngleRad(n1: number, n2: number): number {
  return Math.atan2(n2, n1);
}

/**
 * Critical angle in radians for light in medium n1 meeting a lossless medium n2 < n1:
 * sinθc = n2/n1 (Hecht §4.7). NaN when n2 ≥ n1 (no total internal reflection).
 */
export function criticalAngleRad(n1: number, n2: number): number {
  return n2 < n1 ? Math.asin(n2 / n1) : Number.NaN;
}

/** cosθc of the critical angle in medium n1 (−1 when n2 ≥ n1): cosθc = √(1 − (n2/n1)²). */
export function criticalCos(n1: number, n2: number): number {
  if (!(n2 < n1)) return -1;
  const q = n2 / n1;
  return Math.sqrt((1 - q) * (1 + q));
}
