import type { CompiledStack } from "./compiledStack.js";

/**
 * Generation-profile tally: power absorbed in the absorber per depth bin, for one ray (cs.rayDepth,
 * folded into the point tally as [Σg, Σg²] per bin when the ray ends). Depth is measured down from
 * the plane through the highest points of the front texture (cs.depthTopZUm: the pyramid tips, the
 * rim of inverted pyramids; the surface itself when planar).
 */

/** Index of the bin of depth d (edges ascending, edges[0] = 0); clamped to the first and last bin. */
export function depthBin(edges: Float64Array, d: number): number {
  const nB = edges.length - 1;
  if (!(d > edges[1])) return 0;
  if (d >= edges[nB - 1]) return nB - 1;
  let lo = 1;
  let hi = nB - 1; // edges[lo] < d < edges[hi]
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (edges[mid] < d) lo = mid;
    else hi = mid;
  }
  return lo;
}

/**
 * Expected-value deposit of weight w over a straight stretch from height z0 (µm, world z) of length
 * lenUm with direction cosine dz and absorption coefficient α (1/µm): the part absorbed between path
 * lengths s₁ and s₂ is w(e^{−αs₁} − e^{−αs₂}) (Beer–Lambert), so each depth bin the stretch crosses
 * gets its exact share and the shares add up to w(1 − e^{−αL}).
 */
export function depositSegment(cs: CompiledStack, w: number, z0: number, lenUm: number, dz: number, alpha: number): void {
  const edges = cs.depthEdgesUm as Float64Array;
  const g = cs.rayDepth;
  const nB = edges.length - 1;
  const d0 = cs.depthTopZUm - z0;
  const mu = -dz; // depth grows downwards
  let bin = depthBin(edges, d0);
  const att = Math.exp(-alpha * lenUm);
  if (mu > -1e-12 && mu < 1e-12) {
    g[bin] += w - w * att;
    return;
  }
  let ePrev = 1;
  for (;;) {
    // Path length to the next bin boundary in the direction of travel.
    let sNext: number;
    if (mu > 0) sNext = bin < nB - 1 ? (edges[bin + 1] - d0) / mu : Infinity;
    else sNext = bin > 0 ? (edges[bin] - d0) / mu : Infinity;
    if (!(sNext < lenUm)) {
      g[bin] += w * (ePrev - att);
      return;
    }
    const e = Math.exp(-alpha * (sNext > 0 ? sNext : 0));
    g[bin] += w * (ePrev - e);
    ePrev = e;
    bin += mu > 0 ? 1 : -1;
  }
}

/** Analog deposit: the whole weight at path length s along the stretch. */
export function depositPoint(cs: CompiledStack, w: number, z0: number, s: number, dz: number): void {
  cs.rayDepth[depthBin(cs.depthEdgesUm as Float64Array, cs.depthTopZUm - (z0 + s * dz))] += w;
}

/** Adds the ray's depth deposits (and squares) at tally[offset…] and clears them. */
export function foldDepth(cs: CompiledStack, tally: Float64Array, offset: number): void {
  const g = cs.rayDepth;
  for (let i = 0; i < g.length; i++) {
    const v = g[i];
    if (v !== 0) {
      tally[offset + 2 * i] += v;
      tally[offset + 2 * i + 1] += v * v;
      g[i] = 0;
    }
  }
}

/**
 * Default depth grid: nBins bins whose widths grow geometrically from firstUm (w_i = firstUm·r^i,
 * Σ w_i = depthUm), fine near the front where short wavelengths are absorbed, coarse in the bulk.
 * Uniform bins when firstUm·nBins ≥ depthUm. Edges ascending from 0, the last exactly depthUm.
 */
export function geometricDepthEdges(depthUm: number, nBins: number, firstUm: number): Float64Array {
  if (!(depthUm > 0) || !(firstUm > 0) || !Number.isInteger(nBins) || nBins < 2) {
    throw new RangeError(`depth grid: need depth > 0, first bin > 0 and at least 2 bins (got ${depthUm}, ${firstUm}, ${nBins})`);
  }
  const edges = new Float64Array(nBins + 1);
  let ratio = 1;
  if (firstUm * nBins < depthUm) {
    // Σ_{i<N} w0 r^i = w0 (r^N − 1)/(r − 1) grows with r: bisection for the total depth.
    const total = (r: number): number => (firstUm * (Math.pow(r, nBins) - 1)) / (r - 1);
    let lo = 1 + 1e-12;
    let hi = 2;
    while (total(hi) < depthUm) hi *= 2;
    for (let k = 0; k < 200; k++) {
      const mid = 0.5 * (lo + hi);
      if (total(mid) < depthUm) lo = mid;
      else hi = mid;
    }
    ratio = 0.5 * (lo + hi);
  }
  const w0 = ratio === 1 ? depthUm / nBins : firstUm;
  let w = w0;
  for (let i = 1; i <= nBins; i++) {
    edges[i] = edges[i - 1] + w;
    w *= ratio;
  }
  edges[nBins] = depthUm;
  return edges;
}
