import type { PhiMode, ResponseMatrix } from "../response/responseMatrix.js";
import { InputError } from "../util/errors.js";

/** The θ grid must reach at least this angle; from the last angle to 90° the response falls linearly to 0. */
export const MIN_LAST_THETA_DEG = 80;

/**
 * Interpolation on a response matrix's angle grid: linear in θ (degrees) and in φ (degrees, folded
 * by the matrix's φ mode). Beyond the last θ (≥ 80°) the response falls linearly to zero at 90°
 * (grazing incidence reflects everything). Node index = iθ · nPhi + iφ.
 */
export class AngularGrid {
  readonly nTheta: number;
  readonly nPhi: number;
  readonly nNodes: number;
  readonly thetaDeg: Float64Array;
  readonly phiDeg: Float64Array;
  readonly phiMode: PhiMode;

  constructor(thetaDeg: ArrayLike<number>, phiDeg: ArrayLike<number>, phiMode: PhiMode) {
    this.thetaDeg = Float64Array.from(thetaDeg);
    this.phiDeg = Float64Array.from(phiDeg);
    this.phiMode = phiMode;
    this.nTheta = this.thetaDeg.length;
    this.nPhi = this.phiDeg.length;
    this.nNodes = this.nTheta * this.nPhi;
  }

  /**
   * Interpolation weights of direction (θ, φ) in the module/texture frame: writes up to 4 node
   * indices and weights, returns their count (0 at θ ≥ 90°). The weights sum to the response factor
   * (1 inside the grid, less in the fall-off band above the last θ).
   */
  weights(thetaDeg: number, phiDeg: number, idx: Int32Array, w: Float64Array): number {
    if (thetaDeg >= 90) return 0;
    const th = this.thetaDeg;
    const last = this.nTheta - 1;
    let i0: number, i1: number, t: number, scale = 1;
    if (thetaDeg >= th[last]!) {
      i0 = i1 = last;
      t = 0;
      if (th[last]! < 90) scale = (90 - thetaDeg) / (90 - th[last]!);
    } else {
      let k = 0;
      while (k < last - 1 && th[k + 1]! <= thetaDeg) k++;
      i0 = k;
      i1 = k + 1;
      t = Math.max(0, (thetaDeg - th[k]!) / (th[k + 1]! - th[k]!));
    }
    // φ: folded position and bracketing nodes
    let j0 = 0, j1 = 0, u = 0;
    const np = this.nPhi;
    if (np > 1 && this.phiMode !== "averaged") {
      const p = this.phiDeg;
      let f: number;
      if (this.phiMode === "square") {
        f = ((phiDeg % 90) + 90) % 90;
        if (f > 45) f = 90 - f;
        if (f <= p[0]!) { j0 = j1 = 0; }
        else if (f >= p[np - 1]!) { j0 = j1 = np - 1; }
        else {
          let k = 0;
          while (k < np - 2 && p[k + 1]! <= f) k++;
          j0 = k; j1 = k + 1; u = (f - p[k]!) / (p[k + 1]! - p[k]!);
        }
      } else {
        f = ((phiDeg % 360) + 360) % 360;
        if (f < p[0]! || f >= p[np - 1]!) {
          // periodic wrap between the last and the first listed azimuth
          const span = p[0]! + 360 - p[np - 1]!;
          j0 = np - 1; j1 = 0;
          u = span > 0 ? (((f - p[np - 1]!) % 360) + 360) % 360 / span : 0;
        } else {
          let k = 0;
          while (k < np - 2 && p[k + 1]! <= f) k++;
          j0 = k; j1 = k + 1; u = (f - p[k]!) / (p[k + 1]! - p[k]!);
        }
      }
    }
    idx[0] = i0 * np + j0; w[0] = scale * (1 - t) * (1 - u);
    idx[1] = i0 * np + j1; w[1] = scale * (1 - t) * u;
    idx[2] = i1 * np + j0; w[2] = scale * t * (1 - u);
    idx[3] = i1 * np + j1; w[3] = scale * t * u;
    return 4;
  }
}

/** Checks that a matrix can serve a yearly yield and returns its grid; messages say what is missing. */
export function yieldGrid(m: ResponseMatrix, src: string): AngularGrid {
  const th = m.thetaDeg;
  for (let i = 1; i < th.length; i++) {
    if (!(th[i]! > th[i - 1]!)) throw new InputError(`${src}: θ grid must increase (thetaDeg[${i}] = ${th[i]} after ${th[i - 1]})`);
  }
  const first = th[0]!, last = th[th.length - 1]!;
  const missing: string[] = [];
  if (first > 1e-9) missing.push(`0–${first}°`);
  if (last < MIN_LAST_THETA_DEG) missing.push(`${last}–${MIN_LAST_THETA_DEG}°`);
  if (missing.length > 0) {
    throw new InputError(
      `${src}: a yearly yield needs the response from 0° to 90° incidence (sky and ground light arrive from the whole hemisphere); the matrix's θ grid covers ${first}–${last}°: missing ${missing.join(" and ")}`,
      `trace the matrix with thetaDeg from 0 to at least ${MIN_LAST_THETA_DEG}° (e.g. { "from": 0, "to": 85, "step": 5 }); above the last angle the response is taken to fall linearly to 0 at 90°`,
    );
  }
  const ph = m.phiDeg;
  if (m.phiMode === "averaged" && ph.length !== 1) throw new InputError(`${src}: phiMode "averaged" needs exactly one phiDeg entry`);
  for (let j = 1; j < ph.length; j++) {
    if (!(ph[j]! > ph[j - 1]!)) throw new InputError(`${src}: φ grid must increase (phiDeg[${j}] = ${ph[j]} after ${ph[j - 1]})`);
  }
  if (m.phiMode === "square" && (ph[0]! < 0 || ph[ph.length - 1]! > 45)) {
    throw new InputError(`${src}: phiMode "square" needs azimuths within 0–45°`);
  }
  if (m.phiMode === "list" && (ph[0]! < 0 || ph[ph.length - 1]! >= 360)) {
    throw new InputError(`${src}: azimuths must lie within 0–360°`);
  }
  return new AngularGrid(th, ph, m.phiMode);
}
