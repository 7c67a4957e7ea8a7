import { TRI_STRIDE, type SurfaceTile } from "./surfaceTile.js";

/** Returned when the ray leaves the search range without a hit. */
export const NO_HIT = -1;
/** Returned when the grid walk exceeds its step budget (a ray running parallel to the base plane). */
export const LOST = -2;

/** Slots of a hit query (see meshHit). */
export const Q_OX = 0, Q_OY = 1, Q_OZ = 2, Q_DX = 3, Q_DY = 4, Q_DZ = 5, Q_LIMIT = 6, Q_T = 7;
export const Q_LENGTH = 8;

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
  const ox = q[Q_OX];
  const oy = q[Q_OY];
  const oz = q[Q_OZ];
  const dx = q[Q_DX];
  const dy = q[Q_DY];
  const dz = q[Q_DZ];
  const tLimit = q[Q_LIMIT];
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
      const o = t0 * TRI_STRIDE;
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
      q[Q_T] = best;
      return bestTri;
    }
    if (tCellEnd >= tLimit) return NO_HIT;
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
  return LOST;
}

/**
 * Nearest hit of a ray with regular square pyramids (tile.pyramidSign ≠ 0), the same query and
 * result convention as meshHit but returning the facet (0..3: +u, −u, +v, −v; normals in
 * tile.pyramidNormals). Over the square footprint of one pyramid the upright surface is the lowest
 * of its four facet planes, h = min_k P_k, so along the ray z − h = max_k g_k(t) with g_k linear:
 * the ray is under the surface exactly on the interval [tLo, tHi] where every g_k ≤ 0 (tLo from the
 * planes it moves down through, tHi from those it moves up through). From above the hit is at tLo,
 * from below at tHi, when that lies in the ray's stretch over the footprint; the walk goes from
 * footprint to footprint (Amanatides & Woo 1987 traversal with one cell per pyramid). Inverted
 * pyramids are upright ones seen with z reversed. A plane the ray moves away from bounds the
 * interval on the far side, so the facet a ray has just left is never hit again.
 */
export function pyramidHit(s: SurfaceTile, q: Float64Array, fromBelow: boolean): number {
  const a = s.pyramidPeriodUm;
  const c = 0.5 * a;
  const T = s.pyramidTan;
  const H = s.pyramidHeightUm;
  const flip = s.pyramidSign < 0;
  const below = flip ? !fromBelow : fromBelow;
  const ox = q[Q_OX];
  const oy = q[Q_OY];
  const oz = flip ? -q[Q_OZ] : q[Q_OZ];
  const du = q[Q_DX];
  const dv = q[Q_DY];
  const dz = flip ? -q[Q_DZ] : q[Q_DZ];
  const tLimit = q[Q_LIMIT];
  const tol = EDGE_TOL_REL * (s.lxUm + s.lyUm);
  const tEps = 1e-12 * (s.lxUm + s.lyUm);
  // Origin relative to the apex of the pyramid it lies over; it shifts by ∓a per step.
  let u0 = ox - a * Math.floor(ox / a) - c;
  let v0 = oy - a * Math.floor(oy / a) - c;
  const invDu = du !== 0 ? 1 / Math.abs(du) : Infinity;
  const invDv = dv !== 0 ? 1 / Math.abs(dv) : Infinity;
  const stepU = du > 0 ? a : -a;
  const stepV = dv > 0 ? a : -a;
  let tNextU = du > 0 ? (c - u0) * invDu : du < 0 ? (c + u0) * invDu : Infinity;
  let tNextV = dv > 0 ? (c - v0) * invDv : dv < 0 ? (c + v0) * invDv : Infinity;
  const tDeltaU = a * invDu;
  const tDeltaV = a * invDv;
  // Slopes of g_k = z − P_k along the ray (the same in every footprint).
  const tdu = T * du;
  const tdv = T * dv;
  const b0 = dz + tdu, b1 = dz - tdu, b2 = dz + tdv, b3 = dz - tdv;
  const zH = oz - H;
  let tA = 0;
  for (let step = 0; step < MAX_STEPS; step++) {
    let tB = tNextU < tNextV ? tNextU : tNextV;
    if (tB > tLimit) tB = tLimit;
    let tLo = -Infinity;
    let tHi = Infinity;
    let kLo = -1;
    let kHi = -1;
    let empty = false;
    // g_k(t) = a_k + b_k t with a_k = g_k(0).
    const tu = T * u0;
    const tv = T * v0;
    const a0 = zH + tu, a1 = zH - tu, a2 = zH + tv, a3 = zH - tv;
    if (b0 > 0) { const r = -a0 / b0; if (r < tHi) { tHi = r; kHi = 0; } } else if (b0 < 0) { const r = -a0 / b0; if (r > tLo) { tLo = r; kLo = 0; } } else if (a0 > 0) empty = true;
    if (b1 > 0) { const r = -a1 / b1; if (r < tHi) { tHi = r; kHi = 1; } } else if (b1 < 0) { const r = -a1 / b1; if (r > tLo) { tLo = r; kLo = 1; } } else if (a1 > 0) empty = true;
    if (b2 > 0) { const r = -a2 / b2; if (r < tHi) { tHi = r; kHi = 2; } } else if (b2 < 0) { const r = -a2 / b2; if (r > tLo) { tLo = r; kLo = 2; } } else if (a2 > 0) empty = true;
    if (b3 > 0) { const r = -a3 / b3; if (r < tHi) { tHi = r; kHi = 3; } } else if (b3 < 0) { const r = -a3 / b3; if (r > tLo) { tLo = r; kLo = 3; } } else if (a3 > 0) empty = true;
    if (!empty) {
      if (below) {
        if (kHi >= 0 && tHi > tEps && tHi >= tA - tol && tHi <= tB + tol && tHi >= tLo - tol) {
          q[Q_T] = tHi;
          return kHi;
        }
      } else if (kLo >= 0 && tLo > tEps && tLo >= tA - tol && tLo <= tB + tol && tLo <= tHi + tol) {
        q[Q_T] = tLo;
        return kLo;
      }
    }
    if (tB >= tLimit) return NO_HIT;
    tA = tB;
    if (tNextU < tNextV) {
      u0 -= stepU;
      tNextU += tDeltaU;
    } else {
      v0 -= stepV;
      tNextV += tDeltaV;
    }
  }
  return LOST;
}
