import type { ResponseMatrix } from "../response/responseMatrix.js";
import { astmG173 } from "../spectrum/astmG173.js";
import { totalIrradianceWm2 } from "../spectrum/integrate.js";
import { photocurrentWeights } from "../spectrum/photocurrent.js";
import { DEG } from "../util/math.js";
import type { AngularGrid } from "./angularGrid.js";

/** 1 mA/cm² = 10 A/m². */
const A_M2_PER_MA_CM2 = 10;
/**
 * ASTM G173 geometry: sun at zenith 48.19° (AM1.5), surface tilted 37° toward it, so the beam meets
 * the tilted surface at 11.19°; the sky-and-ground part of "global tilt" is global − direct·cos 11.19°.
 */
export const G173_BEAM_INCIDENCE_DEG = 48.19 - 37;

/**
 * Per-wavelength current weights per W/m² of broadband irradiance with a given spectral shape
 * (A/m² per W/m² per unit absorptance), on the matrix's wavelength grid. The broadband total is the
 * full spectrum (280–4000 nm), so light outside the grid counts as irradiance but gives no current.
 */
export interface SpectralWeights {
  /** Beam and circumsolar light: ASTM G173 direct shape. */
  beam: Float64Array;
  /** Sky and ground light: G173 global − direct·cos 11.19° (clipped at 0 per bin). */
  diffuse: Float64Array;
  /** AM1.5G (global tilt) shape: reference for "normal incidence at the same insolation". */
  global: Float64Array;
}

export function g173SpectralWeights(wavelengthNm: ArrayLike<number>): SpectralWeights {
  const g = astmG173("global"), d = astmG173("direct");
  const cosB = Math.cos(G173_BEAM_INCIDENCE_DEG * DEG);
  const diffuseIrr = new Float64Array(g.wavelengthNm.length);
  for (let i = 0; i < diffuseIrr.length; i++) diffuseIrr[i] = Math.max(0, g.irradianceWm2PerNm[i]! - cosB * d.irradianceWm2PerNm[i]!);
  const diff = { name: "G173 sky+ground", wavelengthNm: g.wavelengthNm, irradianceWm2PerNm: diffuseIrr };
  const perWm2 = (spec: typeof g): Float64Array => {
    const w = photocurrentWeights(wavelengthNm, spec);
    const total = totalIrradianceWm2(spec.wavelengthNm, spec.irradianceWm2PerNm);
    for (let i = 0; i < w.length; i++) w[i] = (w[i]! * A_M2_PER_MA_CM2) / total;
    return w;
  };
  return { beam: perWm2(d), diffuse: perWm2(diff), global: perWm2(g) };
}

/** Current per W/m² at each angle node (A/m² per W/m²), for beam- and diffuse-shaped light. */
export interface SpectralTables {
  beam: Float64Array;
  diffuse: Float64Array;
  /** AM1.5G-shaped light at normal incidence (θ = 0 row, averaged over φ nodes). */
  normalGlobal: number;
  /** The per-wavelength weights and the channel's stderr, for propagating the Monte Carlo error. */
  weights: SpectralWeights;
  /** The channel's mean and standard error per angle node and wavelength, [node·nLambda + λ]. */
  absorptance: Float64Array;
  stderr: Float64Array;
  nLambda: number;
}

/** Σ_λ A(node, λ)·w_λ for the chosen channel; `stderr` is copied out as [node][λ]. */
export function spectralTables(m: ResponseMatrix, channel: string, grid: AngularGrid, weights: SpectralWeights): SpectralTables {
  const ic = m.channels.indexOf(channel);
  if (ic < 0) throw new Error(`response matrix has no channel "${channel}"`);
  const nL = m.wavelengthNm.length, nC = m.channels.length;
  const beam = new Float64Array(grid.nNodes), diffuse = new Float64Array(grid.nNodes), global = new Float64Array(grid.nNodes);
  const stderr = new Float64Array(grid.nNodes * nL), absorptance = new Float64Array(grid.nNodes * nL);
  for (let node = 0; node < grid.nNodes; node++) {
    let b = 0, d = 0, g = 0;
    for (let l = 0; l < nL; l++) {
      const k = (node * nL + l) * nC + ic;
      const a = m.mean[k]!;
      b += a * weights.beam[l]!;
      d += a * weights.diffuse[l]!;
      g += a * weights.global[l]!;
      stderr[node * nL + l] = m.stderr[k]!;
      absorptance[node * nL + l] = a;
    }
    beam[node] = b;
    diffuse[node] = d;
    global[node] = g;
  }
  let ref = 0;
  for (let j = 0; j < grid.nPhi; j++) ref += global[j]!;
  return { beam, diffuse, normalGlobal: ref / grid.nPhi, weights, absorptance, stderr, nLambda: nL };
}
