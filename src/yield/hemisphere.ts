import { matrixAzimuthDeg, type ModuleFrame } from "../sky/moduleFrame.js";
import { RAD } from "../util/math.js";
import type { AngularGrid } from "./angularGrid.js";

/**
 * Quadrature of isotropic sky, isotropic ground and the horizon band over what a tilted module sees,
 * as weights on the matrix's angle nodes: the response-weighted plane irradiance per unit source
 * strength is K = Σ q[node]·J[node]. For J = 1 on a grid reaching 90° the weights reproduce the closed
 * forms (1 + cos β)/2, (1 − cos β)/2 and sin β.
 */
export interface PlaneQuadrature {
  sky: Float64Array;
  ground: Float64Array;
  horizon: Float64Array;
}

export interface QuadratureOptions {
  /** Midpoint nodes in zenith per hemisphere and in azimuth; horizon band nodes in azimuth. */
  nZenith: number;
  nAzimuth: number;
  nHorizon: number;
}
export const DEFAULT_QUADRATURE: QuadratureOptions = { nZenith: 90, nAzimuth: 180, nHorizon: 720 };

/**
 * Midpoint rule in world zenith z and azimuth ψ over the upper (sky) and lower (ground) hemispheres:
 * radiance L = 1/π per unit source, plane irradiance ∫ L max(0, d·n) J(d) dΩ with dΩ = sin z dz dψ.
 * The horizon band is a line source of strength 1/2 per radian of azimuth: ∫ ½ max(0, d·n) J dψ.
 * The integrand is continuous (the front-side cut-off is a kink, not a step), so the error is O(h²).
 */
export function planeQuadrature(grid: AngularGrid, f: ModuleFrame, opts: QuadratureOptions = DEFAULT_QUADRATURE): PlaneQuadrature {
  const sky = new Float64Array(grid.nNodes), ground = new Float64Array(grid.nNodes), horizon = new Float64Array(grid.nNodes);
  const idx = new Int32Array(4), w = new Float64Array(4), d = new Float64Array(3);
  const dz = Math.PI / 2 / opts.nZenith, dpsi = (2 * Math.PI) / opts.nAzimuth;
  const n = f.n;
  for (let half = 0; half < 2; half++) {
    const target = half === 0 ? sky : ground;
    for (let i = 0; i < opts.nZenith; i++) {
      const z = (half * opts.nZenith + i + 0.5) * dz;
      const sz = Math.sin(z), cz = Math.cos(z);
      const dOmegaOverPi = (sz * dz * dpsi) / Math.PI;
      for (let j = 0; j < opts.nAzimuth; j++) {
        const psi = (j + 0.5) * dpsi;
        d[0] = sz * Math.sin(psi); d[1] = sz * Math.cos(psi); d[2] = cz;
        const c = n[0] * d[0] + n[1] * d[1] + n[2] * d[2];
        if (c <= 0) continue;
        const k = grid.weights(Math.acos(Math.min(1, c)) * RAD, matrixAzimuthDeg(f, d), idx, w);
        const base = c * dOmegaOverPi;
        for (let q = 0; q < k; q++) target[idx[q]!] += base * w[q]!;
      }
    }
  }
  const dh = (2 * Math.PI) / opts.nHorizon;
  for (let j = 0; j < opts.nHorizon; j++) {
    const psi = (j + 0.5) * dh;
    d[0] = Math.sin(psi); d[1] = Math.cos(psi); d[2] = 0;
    const c = n[0] * d[0] + n[1] * d[1];
    if (c <= 0) continue;
    const k = grid.weights(Math.acos(Math.min(1, c)) * RAD, matrixAzimuthDeg(f, d), idx, w);
    for (let q = 0; q < k; q++) horizon[idx[q]!] += 0.5 * c * dh * w[q]!;
  }
  return { sky, ground, horizon };
}

/** Σ q·J. */
export function dotNodes(q: Float64Array, j: Float64Array): number {
  let s = 0;
  for (let i = 0; i < q.length; i++) s += q[i]! * j[i]!;
  return s;
}
