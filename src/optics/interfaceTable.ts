import type { CritBand, FilmLayer, InterfaceTable, NK } from "./types.js";
import { filmStackInto, rowStride } from "./thinFilm.js";
import { criticalCos } from "./fresnel.js";

/**
 * Interface coefficients tabulated over cosθ (uniform in [0, 1]) for both directions of one
 * interface, built from the exact transfer-matrix result, for the tracer's hot path.
 *
 * Rules of the tabulated ("table-exact") row, beyond filmStack:
 * - A weakly absorbing exit medium (k ≤ 1e-3·n: glass, EVA, transparent oxides) counts as lossless
 *   at the interface; a refracted ray carries its absorption (Beer–Lambert along the path). This
 *   moves R and T by about k/n, except within ~√(nk)/n0 of the critical angle where the lossy
 *   result has a feature too narrow to tabulate.
 * - Critical angle: when the exit medium is not metal-like (k < n) and n_exit < n0, no propagating
 *   refracted wave exists for cosθ ≤ cosθc = √(1 − (n_exit/n0)²); there Ts = Tp = 0, and whatever
 *   power an absorbing exit medium would take from the evanescent wave is added to R, so each row
 *   still sums to 1 (for a lossless exit medium this changes nothing).
 * - Metal-like exit media (k ≥ n: Ag, Al) have no critical angle: T is the power absorbed in the
 *   metal at every angle.
 */

/** Exit media with k ≤ WEAK_EXIT_K_RATIO·n count as lossless in the table. */
export const WEAK_EXIT_K_RATIO = 1e-3;

const exitScratch: NK = { n: 1, k: 0 };

/** The row the table samples (rules above). No allocation. */
export function interfaceRowInto(
  n0: number,
  films: readonly FilmLayer[],
  nExit: NK,
  wavelengthNm: number,
  cosTheta0: number,
  cosCrit: number,
  out: Float64Array,
  off = 0,
): void {
  exitScratch.n = nExit.n;
  exitScratch.k = nExit.k <= WEAK_EXIT_K_RATIO * nExit.n ? 0 : nExit.k;
  filmStackInto(n0, films, exitScratch, wavelengthNm, cosTheta0, out, off);
  if (cosTheta0 <= cosCrit) {
    out[off] = out[off]! + out[off + 2]!;
    out[off + 1] = out[off + 1]! + out[off + 3]!;
    out[off + 2] = 0;
    out[off + 3] = 0;
  }
}

/** cosθc in the incidence medium (index n0) towards the exit medium, −1 when the table has none. */
export function tableCritCos(n0: number, nExit: NK): number {
  if (!(nExit.k < nExit.n)) return -1;
  return criticalCos(n0, nExit.n);
}

/** Signed interpolation variable near the critical angle: t = sign(c − cc)·√|c² − cc²|. */
export function critVariable(cosTheta: number, cosCrit: number): number {
  const q = (cosTheta - cosCrit) * (cosTheta + cosCrit);
  return q >= 0 ? Math.sqrt(q) : -Math.sqrt(-q);
}


/** Film rows of the up direction come in reverse film order; store them in the caller's order. */
function storeRow(tmp: Float64Array, nF: number, reverse: boolean, dst: Float64Array, dstOff: number): void {
  dst[dstOff] = tmp[0]!;
  dst[dstOff + 1] = tmp[1]!;
  dst[dstOff + 2] = tmp[2]!;
  dst[dstOff + 3] = tmp[3]!;
  for (let j = 0; j < nF; j++) {
    const src = reverse ? nF - 1 - j : j;
    dst[dstOff + 4 + src] = tmp[4 + j]!;
    dst[dstOff + 4 + nF + src] = tmp[4 + nF + j]!;
  }
}

/** cosθ from the band variable t (inverse of critVariable). */
function cosFromCritVariable(t: number, cosCrit: number): number {
  const c2 = cosCrit * cosCrit + (t >= 0 ? t * t : -t * t);
  return Math.sqrt(c2 > 0 ? c2 : 0);
}

function fillDirection(
  n0: number,
  films: readonly FilmLayer[],
  nExit: NK,
  wavelengthNm: number,
  nCos: number,
  reverse: boolean,
  rows: Float64Array,
  cosCrit: number,
): CritBand | null {
  const nF = films.length;
  const stride = rowStride(nF);
  const stack = reverse ? films.slice().reverse() : films;
  const tmp = new Float64Array(stride);
  const m = nCos - 1;
  for (let i = 0; i < nCos; i++) {
    interfaceRowInto(n0, stack, nExit, wavelengthNm, i / m, cosCrit, tmp, 0);
    storeRow(tmp, nF, reverse, rows, i * stride);
  }
  if (!(cosCrit > 0 && cosCrit < 1)) return null;
  // band over cosθ ∈ [cc/2, 1], as many rows as the main table, split between the two sides of t = 0
  const cosLo = 0.5 * cosCrit;
  const tLo = critVariable(cosLo, cosCrit);
  const tHi = critVariable(1, cosCrit);
  const nNeg = Math.max(2, Math.round((nCos * -tLo) / (tHi - tLo)));
  const nPos = Math.max(2, nCos + 1 - nNeg);
  const dtNeg = -tLo / (nNeg - 1);
  const dtPos = tHi / (nPos - 1);
  const nRows = nNeg + nPos - 1;
  const band = new Float64Array(nRows * stride);
  for (let i = 0; i < nRows; i++) {
    const t = i < nNeg ? tLo + i * dtNeg : (i - nNeg + 1) * dtPos;
    const c = i === nNeg - 1 ? cosCrit : i === nRows - 1 ? 1 : cosFromCritVariable(t, cosCrit);
    interfaceRowInto(n0, stack, nExit, wavelengthNm, c, cosCrit, tmp, 0);
    storeRow(tmp, nF, reverse, band, i * stride);
  }
  return { cosCrit, cosLo, tLo, tHi, nNeg, nPos, dtNeg, dtPos, invDtNeg: 1 / dtNeg, invDtPos: 1 / dtPos, rows: band };
}

/**
 * Tabulates both directions of the interface upper | films | lower at one wavelength.
 * down: light from the upper medium into the lower one (incidence index Re n_upper);
 * up: light from the lower medium into the upper one, films traversed in reverse order
 * (incidence index Re n_lower, cosθ in the lower medium, e.g. in silicon).
 */
export function buildInterfaceTable(
  upper: NK,
  films: readonly FilmLayer[],
  lower: NK,
  wavelengthNm: number,
  nCos = 1024,
): InterfaceTable {
  if (!Number.isInteger(nCos) || nCos < 2) throw new RangeError(`nCos must be an integer ≥ 2, got ${nCos}`);
  const nF = films.length;
  const stride = rowStride(nF);
  const down = new Float64Array(nCos * stride);
  const up = new Float64Array(nCos * stride);
  const cosCritDown = tableCritCos(upper.n, lower);
  const cosCritUp = tableCritCos(lower.n, upper);
  const critBandDown = fillDirection(upper.n, films, lower, wavelengthNm, nCos, false, down, cosCritDown);
  const critBandUp = fillDirection(lower.n, films, upper, wavelengthNm, nCos, true, up, cosCritUp);
  const lossless = (m: NK): boolean => m.k <= WEAK_EXIT_K_RATIO * m.n;
  return {
    nCos,
    nFilms: nF,
    stride,
    down,
    up,
    cosCritDown,
    cosCritUp,
    critBandDown,
    critBandUp,
    plainDown: nF === 0 && lossless(lower),
    plainUp: nF === 0 && lossless(upper),
    nUpper: upper.n,
    nLower: lower.n,
  };
}

/**
 * Interpolated row at cosθ for direction dirFlag (0 = down, 1 = up) into out[off .. off+stride), or
 * its first `count` entries (4: Rs, Rp, Ts, Tp without the films' absorptances).
 * Linear in cosθ on the main rows; for cosθ ≥ cosθc/2 of a direction with a critical angle,
 * linear in t on the band rows (see CritBand). No allocation.
 */
export function lookupInterface(table: InterfaceTable, dirFlag: number, cosTheta: number, out: Float64Array, off = 0, count = table.stride): void {
  const up = dirFlag !== 0;
  const band = up ? table.critBandUp : table.critBandDown;
  const stride = table.stride;
  const c = cosTheta < 0 ? 0 : cosTheta > 1 ? 1 : cosTheta;
  let rows: Float64Array;
  let i: number;
  let w: number;
  if (band !== null && c >= band.cosLo) {
    rows = band.rows;
    const last = band.nNeg + band.nPos - 3; // last cell index
    const t = critVariable(c, band.cosCrit);
    const pos = t <= 0 ? (t - band.tLo) * band.invDtNeg : band.nNeg - 1 + t * band.invDtPos;
    i = Math.floor(pos);
    if (i < 0) i = 0;
    else if (i > last) i = last;
    w = pos - i;
    if (w < 0) w = 0;
    else if (w > 1) w = 1;
  } else {
    rows = up ? table.up : table.down;
    const m = table.nCos - 1;
    const x = c * m;
    i = Math.floor(x);
    if (i >= m) i = m - 1;
    w = x - i;
  }
  const aOff = i * stride;
  const bOff = aOff + stride;
  for (let k = 0; k < count; k++) {
    const va = rows[aOff + k]!;
    out[off + k] = va + w * (rows[bOff + k]! - va);
  }
}

/**
 * Rs, Rp, Ts, Tp (and the films' absorptances; `count` entries) at cosθ for direction dirFlag into
 * out[off …]: for a plain direction (no films, lossless exit) the Fresnel result itself, which is what
 * the table samples there (plainPowers), else the interpolated row (lookupInterface).
 */
export function interfacePowers(table: InterfaceTable, dirFlag: number, cosTheta: number, out: Float64Array, off = 0, count = table.stride): void {
  const up = dirFlag !== 0;
  if (up ? table.plainUp : table.plainDown) plainPowers(table, up, cosTheta, out, off);
  else lookupInterface(table, dirFlag, cosTheta, out, off, count);
}

/**
 * Rs, Rp, Ts, Tp at cosθ of a plain direction (up: from the lower medium) into out[off …]. Real
 * indices n1 → n2: rs = (n1c1 − n2c2)/(n1c1 + n2c2), rp = (n2c1 − n1c2)/(n2c1 + n1c2), R = r²,
 * T = 1 − R (Born & Wolf, Principles of Optics §1.5.2); beyond the critical angle R = 1. A function
 * of its own, calling nothing, so the analog event inlines it whatever else interfacePowers has
 * been asked for in the process (with the table lookup inlined into it, interfacePowers no longer
 * fitted the analog event's inlining budget).
 */
export function plainPowers(table: InterfaceTable, up: boolean, cosTheta: number, out: Float64Array, off: number): void {
  const n1 = up ? table.nLower : table.nUpper;
  const n2 = up ? table.nUpper : table.nLower;
  const c1 = cosTheta < 0 ? 0 : cosTheta > 1 ? 1 : cosTheta;
  const ratio = n1 / n2;
  const sin2T = ratio * ratio * (1 - c1) * (1 + c1);
  if (sin2T >= 1) {
    out[off] = 1;
    out[off + 1] = 1;
    out[off + 2] = 0;
    out[off + 3] = 0;
    return;
  }
  const c2 = Math.sqrt(1 - sin2T);
  const rs = (n1 * c1 - n2 * c2) / (n1 * c1 + n2 * c2);
  const rp = (n2 * c1 - n1 * c2) / (n2 * c1 + n1 * c2);
  const Rs = rs * rs;
  const Rp = rp * rp;
  out[off] = Rs;
  out[off + 1] = Rp;
  out[off + 2] = 1 - Rs;
  out[off + 3] = 1 - Rp;
}
