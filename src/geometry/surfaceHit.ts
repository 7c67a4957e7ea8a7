import { Tri, type SurfaceTile } from "./surfaceTile.js";

/**
 * Search results: a hit (its distance in the state's T slot, src/trace/rayState.ts), none in the
 * search range, or lost (the walk exceeded its step budget: a ray running parallel to the base
 * plane). A const enum, like Query below, for the reason given at the ray state's slots
 * (src/trace/rayState.ts, Ray).
 */
export const enum Hit {
  HIT = 0,
  NO_HIT = -1,
  LOST = -2,
}

/** Slots of a hit query (see meshHit); LENGTH is their number. */
export const enum Query {
  OX = 0, OY = 1, OZ = 2, DX = 3, DY = 4, DZ = 5, LIMIT = 6, T = 7, LENGTH = 8,
}

const MAX_STEPS = 1 << 20;
/** Edge tolerance relative to the tile size: rays through shared edges must not slip between triangles. */
const EDGE_TOL_REL = 1e-10;

/**
 * Nearest hit of a ray with a mesh tile, walking the periodic uniform grid (Amanatides & Woo 1987
 * traversal). Coordinates are the tile's own: the origin (ox, oy) must lie in [0, lx) × [0, ly); z is
 * the height (outward positive). `fromBelow` = the ray is on the absorber side and can only hit
 * triangles whose outward normal it travels along (n·d > 0); from above the opposite. That sign test
 * also keeps a ray from hitting the triangle it has just left. Hits must lie within t ∈ (0, tLimit].
 *
 * The query q holds [ox, oy, oz, dx, dy, dz, tLimit, t] (slots Q_*): numbers travel in a typed
 * array, and the result is an integer, so the hot path allocates no boxed doubles. Returns the
 * triangle index (≥ 0) with the distance t (in units of the direction vector, here µm) in q[Q_T],
 * or NO_HIT / LOST.
 */
export function meshHit(s: SurfaceTile, q: Float64Array, fromBelow: boolean): number {
  const ox = q[Query.OX];
  const oy = q[Query.OY];
  const oz = q[Query.OZ];
  const dx = q[Query.DX];
  const dy = q[Query.DY];
  const dz = q[Query.DZ];
  const tLimit = q[Query.LIMIT];
  const gx = s.gx;
  const gy = s.gy;
  const lx = s.lxUm;
  const ly = s.lyUm;
  const csx = s.cellXUm;
  const csy = s.cellYUm;
  const tri = s.tri;
  const cellStart = s.cellStart;
  const cellTri = s.cellTri;
  const tol = EDGE_TOL_REL * (lx + ly);
  const tEps = 1e-12 * (lx + ly);
  // The ray may only meet triangles from its own side: n·d > 0 from below, < 0 from above.
  const side = fromBelow ? 1 : -1;

  let ix = Math.floor(ox * s.invCellXUm);
  let iy = Math.floor(oy * s.invCellYUm);
  if (ix >= gx) ix = gx - 1;
  else if (ix < 0) ix = 0;
  if (iy >= gy) iy = gy - 1;
  else if (iy < 0) iy = 0;

  // Offsets of the tile copy the ray is currently in (the ray origin stays fixed).
  let offX = 0;
  let offY = 0;
  const stepX = dx > 0 ? 1 : -1;
  const stepY = dy > 0 ? 1 : -1;
  const invDx = dx !== 0 ? 1 / Math.abs(dx) : Infinity;
  const invDy = dy !== 0 ? 1 / Math.abs(dy) : Infinity;
  let tNextX = dx > 0 ? ((ix + 1) * csx - ox) * invDx : dx < 0 ? (ox - ix * csx) * invDx : Infinity;
  let tNextY = dy > 0 ? ((iy + 1) * csy - oy) * invDy : dy < 0 ? (oy - iy * csy) * invDy : Infinity;
  const tDeltaX = csx * invDx;
  const tDeltaY = csy * invDy;

  const cellZMin = s.cellZMin;
  const cellZMax = s.cellZMax;
  let tCellStart = 0;
  for (let step = 0; step < MAX_STEPS; step++) {
    let tCellEnd = tNextX < tNextY ? tNextX : tNextY;
    if (tCellEnd > tLimit) tCellEnd = tLimit;
    // Test the cell's triangles; accept the nearest hit inside this cell's stretch of the ray.
    let best = tCellEnd + tol;
    let bestTri = -1;
    const c = iy * gx + ix;
    const px0 = ox - offX;
    const py0 = oy - offY;
    // Skip the cell when the ray's stretch over it stays clear of the cell's height range.
    const zA = oz + tCellStart * dz;
    const zB = oz + tCellEnd * dz;
    const clear = fromBelow ? (zA > zB ? zA : zB) < cellZMin[c] - tol : (zA < zB ? zA : zB) > cellZMax[c] + tol;
    const kStart = clear ? 0 : cellStart[c];
    const kStop = clear ? 0 : cellStart[c + 1];
    for (let k = kStart; k < kStop; k++) {
      const t0 = cellTri[k];
      const o = t0 * Tri.STRIDE;
      const nx = tri[o];
      const ny = tri[o + 1];
      const nz = tri[o + 2];
      const den = nx * dx + ny * dy + nz * dz;
      if (den * side <= 0) continue;
      const t = (tri[o + 3] - (nx * px0 + ny * py0 + nz * oz)) / den;
      if (t <= tEps || t >= best) continue;
      const hx = px0 + t * dx;
      const hy = py0 + t * dy;
      if (tri[o + 4] * hx + tri[o + 5] * hy + tri[o + 6] < -tol) continue;
      if (tri[o + 7] * hx + tri[o + 8] * hy + tri[o + 9] < -tol) continue;
      if (tri[o + 10] * hx + tri[o + 11] * hy + tri[o + 12] < -tol) continue;
      best = t;
      bestTri = t0;
    }
    if (bestTri >= 0) {
      q[Query.T] = best;
      return bestTri;
    }
    if (tCellEnd >= tLimit) return Hit.NO_HIT;
    tCellStart = tCellEnd;
    // Step to the next cell, wrapping into the neighbouring tile copy.
    if (tNextX < tNextY) {
      ix += stepX;
      if (ix >= gx) {
        ix = 0;
        offX += lx;
      } else if (ix < 0) {
        ix = gx - 1;
        offX -= lx;
      }
      tNextX += tDeltaX;
    } else {
      iy += stepY;
      if (iy >= gy) {
        iy = 0;
        offY += ly;
      } else if (iy < 0) {
        iy = gy - 1;
        offY -= ly;
      }
      tNextY += tDeltaY;
    }
  }
  return Hit.LOST;
}
