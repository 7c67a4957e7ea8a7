import { InputError } from "../util/errors.js";
import { matrixIndex, type ResponseMatrix } from "../response/responseMatrix.js";

/** Index of an angle in the matrix's θ grid (exact to 1e-6°), else InputError listing the grid. */
export function thetaIndex(m: ResponseMatrix, angleDeg: number, source: string): number {
  const i = m.thetaDeg.findIndex((t) => Math.abs(t - angleDeg) < 1e-6);
  if (i < 0) {
    throw new InputError(
      `${source}: incidence angle ${angleDeg}° is not in the matrix grid (θ = ${m.thetaDeg.join(", ")}°)`,
      `choose --angle from the grid, e.g. --angle ${m.thetaDeg[0] ?? 0}`,
    );
  }
  return i;
}

/**
 * Azimuth-averaged spectrum of every channel at one θ index: out[c][λ]. The listed azimuths are given
 * equal weight (for "averaged" matrices there is a single entry).
 */
export function channelSpectra(m: ResponseMatrix, it: number): Float64Array[] {
  const nP = m.phiDeg.length;
  const nL = m.wavelengthNm.length;
  const out = m.channels.map(() => new Float64Array(nL));
  for (let ic = 0; ic < m.channels.length; ic++) {
    const row = out[ic]!;
    for (let il = 0; il < nL; il++) {
      let s = 0;
      for (let ip = 0; ip < nP; ip++) s += m.mean[matrixIndex(m, it, ip, il, ic)]!;
      row[il] = s / nP;
    }
  }
  return out;
}

/** Azimuth-averaged map of one channel over θ × λ, row-major [θ][λ]. */
export function channelMap(m: ResponseMatrix, channel: string): Float64Array {
  const ic = m.channels.indexOf(channel);
  const nT = m.thetaDeg.length;
  const nP = m.phiDeg.length;
  const nL = m.wavelengthNm.length;
  const out = new Float64Array(nT * nL).fill(NaN);
  if (ic < 0) return out;
  for (let it = 0; it < nT; it++) {
    for (let il = 0; il < nL; il++) {
      let s = 0;
      for (let ip = 0; ip < nP; ip++) s += m.mean[matrixIndex(m, it, ip, il, ic)]!;
      out[it * nL + il] = s / nP;
    }
  }
  return out;
}
