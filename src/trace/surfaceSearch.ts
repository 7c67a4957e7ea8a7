import { Query, Hit, meshHit } from "../geometry/surfaceHit.js";
import { Tri, SurfaceKind, type SurfaceTile } from "../geometry/surfaceTile.js";
import type { CompiledStack } from "./compiledStack.js";

/** Limits of the pyramid walk: the step budget and the edge tolerance relative to the tile size. */
const PYRAMID_MAX_STEPS = 1 << 20;
const PYRAMID_EDGE_TOL_REL = 1e-10;

import { Ray, setNormal } from "./rayState.js";

/**
 * Front texture search in world coordinates (front tile frame: z is the height). Sets the hit's
 * outward normal (towards the medium above) in the state.
 */
export function frontSearch(cs: CompiledStack, st: Float64Array, fromBelow: boolean): number {
  const tile = cs.frontTile;
  const z = st[Ray.Z];
  const dz = st[Ray.DZ];
  if (tile.kind !== SurfaceKind.MESH) {
    if (fromBelow ? dz > 0 : dz < 0) {
      setNormal(st, 0, 0, 1);
      const t = -z / dz;
      st[Ray.T] = t > 0 ? t : 0;
      return Hit.HIT;
    }
    return Hit.NO_HIT;
  }
  // Regular pyramids straight to their analytic walk (one call less per search).
  if (tile.pyramidSign !== 0) return pyramidSearch(tile, st, fromBelow, 1, 0);
  return tileSearch(tile, st, cs.query, fromBelow, 1, 0);
}

/**
 * Search of the outer layer's top texture (textured glass; base plane at the layer's top plane,
 * pointing up); `fromBelow` = the ray is in the layer. Sets the outward normal (into the medium above).
 */
export function outerSearch(cs: CompiledStack, st: Float64Array, fromBelow: boolean): number {
  return tileSearch(cs.outerTile as SurfaceTile, st, cs.query, fromBelow, 1, cs.layerTopZUm[1]);
}

/**
 * Rear search for a ray in the absorber. The rear tile is a height field pointing away from the
 * absorber: local z = −(z + W). Sets the normal pointing back into the absorber (the rear table's
 * upper medium).
 */
export function rearSearch(cs: CompiledStack, st: Float64Array): number {
  return rearTileSearch(cs, st, true);
}

/**
 * Rear search for a ray behind the absorber (first rear layer or exit medium) heading up: the same
 * tile seen from outside. Sets the normal pointing into the absorber (the rear table's upper medium).
 */
export function rearSearchFromBehind(cs: CompiledStack, st: Float64Array): number {
  return rearTileSearch(cs, st, false);
}

/**
 * Rear search of a planar rear for a ray in the absorber (rearSearch for a planar rear tile): small,
 * so the ray loops (analogCell.ts, kernel.ts) inline it where rearSearch, with its texture cases,
 * used up their inlining budget.
 */
export function planarRearSearch(cs: CompiledStack, st: Float64Array): number {
  return st[Ray.DZ] < 0 ? planarRearHit(cs, st) : Hit.NO_HIT;
}

/** The ray meets the planar rear (z = −W, normal +z into the absorber) heading to it. */
function planarRearHit(cs: CompiledStack, st: Float64Array): number {
  setNormal(st, 0, 0, 1);
  const t = (-cs.thicknessUm - st[Ray.Z]) / st[Ray.DZ];
  st[Ray.T] = t > 0 ? t : 0;
  return Hit.HIT;
}

/**
 * The rear tile is a height field pointing away from the absorber: local z = −(z + W). A ray in the
 * absorber meets it heading down, a ray behind it heading up; the normal found is turned to point
 * back into the absorber.
 */
function rearTileSearch(cs: CompiledStack, st: Float64Array, inAbsorber: boolean): number {
  const tile = cs.rearTile;
  const W_ = cs.thicknessUm;
  const dz = st[Ray.DZ];
  if (tile.kind !== SurfaceKind.MESH) return (inAbsorber ? dz < 0 : dz > 0) ? planarRearHit(cs, st) : Hit.NO_HIT;
  const found = tile.pyramidSign !== 0 ? pyramidSearch(tile, st, inAbsorber, -1, -W_) : tileSearch(tile, st, cs.query, inAbsorber, -1, -W_);
  if (found === Hit.HIT) {
    st[Ray.NX] = -st[Ray.NX];
    st[Ray.NY] = -st[Ray.NY];
  }
  return found;
}

/**
 * Hit search on a mesh tile in its local frame (z = height, outward positive; xy rotated by the
 * texture orientation and wrapped into the tile) for the ray in the state; distance → st[T]. Writes
 * the outward normal (xy rotated back) to the state. Rays heading into the surface must hit it: a
 * miss there is Hit.LOST.
 */
function tileSearch(tile: SurfaceTile, st: Float64Array, q: Float64Array, fromBelow: boolean, zSign: number, zOffsetUm: number): number {
  if (tile.pyramidSign !== 0) return pyramidSearch(tile, st, fromBelow, zSign, zOffsetUm);
  const entry = slabEntry(tile, st, fromBelow, zSign, zOffsetUm);
  if (entry === Hit.NO_HIT) return Hit.NO_HIT;
  const mustHit = entry === MUST_HIT;
  const t0 = slab[0];
  const dzl = slab[3];
  const c = tile.cosRot;
  const s = tile.sinRot;
  const dxl = c * st[Ray.DX] + s * st[Ray.DY];
  const dyl = -s * st[Ray.DX] + c * st[Ray.DY];
  const lx = tile.lxUm;
  const ly = tile.lyUm;
  let px = c * st[Ray.X] + s * st[Ray.Y] + t0 * dxl;
  let py = -s * st[Ray.X] + c * st[Ray.Y] + t0 * dyl;
  px -= lx * Math.floor(px / lx);
  py -= ly * Math.floor(py / ly);
  q[Query.OX] = px;
  q[Query.OY] = py;
  q[Query.OZ] = slab[2];
  q[Query.DX] = dxl;
  q[Query.DY] = dyl;
  q[Query.DZ] = dzl;
  q[Query.LIMIT] = slab[1];
  const tri = meshHit(tile, q, fromBelow);
  if (tri < 0) return tri === Hit.NO_HIT && !mustHit ? Hit.NO_HIT : Hit.LOST;
  const o = tri * Tri.STRIDE;
  const nxl = tile.tri[o];
  const nyl = tile.tri[o + 1];
  st[Ray.NX] = c * nxl - s * nyl;
  st[Ray.NY] = s * nxl + c * nyl;
  st[Ray.NZ] = tile.tri[o + 2];
  st[Ray.T] = t0 + q[Query.T];
  return Hit.HIT;
}

/** slabEntry result: the ray heads into the surface and must hit it (a miss is Hit.LOST). */
const MUST_HIT = 1;
/** slabEntry output: [distance to the entry point, search range from there, local height there, local dz]. */
const slab = new Float64Array(4);

/**
 * Where the ray in the state enters the slab zMin..zMax of a tile, in the tile's local height: z −
 * offset (front: offset 0; outer glass texture: the glass's top plane), or for the rear tile,
 * flipped (zSign −1): −(z − (−W)) = −(z + W). Writes slab[0..3] (above). Returns Hit.NO_HIT when the ray
 * leaves the slab on the far side of the surface, MUST_HIT when it heads into the surface, else 0.
 * pyramidSearch repeats these lines with the ray in locals: change both alike.
 */
function slabEntry(tile: SurfaceTile, st: Float64Array, fromBelow: boolean, zSign: number, zOffsetUm: number): number {
  const zl = zSign * (st[Ray.Z] - zOffsetUm);
  const dzl = zSign * st[Ray.DZ];
  const zMin = tile.zMinUm;
  const zMax = tile.zMaxUm;
  let t0 = 0;
  let tLimit = Infinity;
  let mustHit = false;
  // Entry into the slab stops short of its bounding plane: flat parts of the surface lie on it.
  const margin = 1e-7 * (zMax - zMin + tile.lxUm);
  if (fromBelow) {
    if (dzl > 0) {
      if (zl < zMin - margin) t0 = (zMin - margin - zl) / dzl;
      tLimit = (zMax - zl) / dzl - t0;
      mustHit = true;
    } else if (dzl < 0) {
      if (zl <= zMin) return Hit.NO_HIT;
      tLimit = (zMin - zl) / dzl;
    }
  } else {
    if (dzl < 0) {
      if (zl > zMax + margin) t0 = (zMax + margin - zl) / dzl;
      tLimit = (zMin - zl) / dzl - t0;
      mustHit = true;
    } else if (dzl > 0) {
      if (zl >= zMax) return Hit.NO_HIT;
      tLimit = (zMax - zl) / dzl;
    }
  }
  if (mustHit) tLimit = tLimit * (1 + 1e-9) + 1e-9 * (zMax - zMin);
  slab[0] = t0;
  slab[1] = tLimit;
  slab[2] = zl + t0 * dzl;
  slab[3] = dzl;
  return mustHit ? MUST_HIT : 0;
}

/**
 * tileSearch for regular square pyramids (tile.pyramidSign ≠ 0), analytic, with the ray in locals;
 * the facet found (0..3: +u, −u, +v, −v) gives the normal from tile.pyramidNormals. Over the square
 * footprint of one pyramid the upright surface is the lowest of its four facet planes, h = min_k P_k,
 * so along the ray z − h = max_k g_k(t) with g_k linear: the ray is under the surface exactly on the
 * interval [tLo, tHi] where every g_k ≤ 0 (tLo from the planes it moves down through, tHi from those
 * it moves up through). From above the hit is at tLo, from below at tHi, when that lies in the ray's
 * stretch over the footprint; the walk goes from footprint to footprint (Amanatides & Woo 1987
 * traversal with one cell per pyramid). Inverted pyramids are upright ones seen with z reversed. A
 * plane the ray moves away from bounds the interval on the far side, so the facet a ray has just
 * left is never hit again.
 */
export function pyramidSearch(tile: SurfaceTile, st: Float64Array, fromBelow: boolean, zSign: number, zOffsetUm: number): number {
  // The slab entry of slabEntry, written out here with the ray in locals (through the shared
  // function and its output array the bench case ran 1–4 % slower; with frontSearch's dispatch,
  // 3–5 %: DEVELOPERS.md, "Tracer efficiency").
  const zl = zSign * (st[Ray.Z] - zOffsetUm);
  const dzl = zSign * st[Ray.DZ];
  const zMin = tile.zMinUm;
  const zMax = tile.zMaxUm;
  let t0 = 0;
  let tLimit = Infinity;
  let mustHit = false;
  const margin = 1e-7 * (zMax - zMin + tile.lxUm);
  if (fromBelow) {
    if (dzl > 0) {
      if (zl < zMin - margin) t0 = (zMin - margin - zl) / dzl;
      tLimit = (zMax - zl) / dzl - t0;
      mustHit = true;
    } else if (dzl < 0) {
      if (zl <= zMin) return Hit.NO_HIT;
      tLimit = (zMin - zl) / dzl;
    }
  } else if (dzl < 0) {
    if (zl > zMax + margin) t0 = (zMax + margin - zl) / dzl;
    tLimit = (zMin - zl) / dzl - t0;
    mustHit = true;
  } else if (dzl > 0) {
    if (zl >= zMax) return Hit.NO_HIT;
    tLimit = (zMax - zl) / dzl;
  }
  if (mustHit) tLimit = tLimit * (1 + 1e-9) + 1e-9 * (zMax - zMin);
  const ozl = zl + t0 * dzl;
  const dx = st[Ray.DX];
  const dy = st[Ray.DY];
  const c = tile.cosRot;
  const s = tile.sinRot;
  const du = c * dx + s * dy;
  const dv = -s * dx + c * dy;
  // Position in the tile frame at the slab entry, relative to the centre of its pyramid's footprint
  // (the tile is a whole number of pyramids, so the pyramid lattice alone sets the wrap).
  const a = tile.pyramidPeriodUm;
  const invA = tile.pyramidInvPeriod;
  const half = 0.5 * a;
  const px = c * st[Ray.X] + s * st[Ray.Y] + t0 * du;
  const py = -s * st[Ray.X] + c * st[Ray.Y] + t0 * dv;
  let u0 = px - a * Math.floor(px * invA) - half;
  let v0 = py - a * Math.floor(py * invA) - half;
  // The walk: inverted pyramids are upright ones with z reversed.
  const tanA = tile.pyramidTan;
  const flip = tile.pyramidSign < 0;
  const below = flip ? !fromBelow : fromBelow;
  const oz = flip ? -ozl : ozl;
  const dz = flip ? -dzl : dzl;
  const lxy = tile.lxUm + tile.lyUm;
  const tol = PYRAMID_EDGE_TOL_REL * lxy;
  const tEps = 1e-12 * lxy;
  // One sign test per axis (a ray along an axis, du = 0, never reaches the next footprint: 1/0 = ∞).
  const sgnU = du >= 0 ? 1 : -1;
  const sgnV = dv >= 0 ? 1 : -1;
  const invDu = 1 / Math.abs(du);
  const invDv = 1 / Math.abs(dv);
  const stepU = sgnU * a;
  const stepV = sgnV * a;
  let tNextU = (half - sgnU * u0) * invDu;
  let tNextV = (half - sgnV * v0) * invDv;
  const tDeltaU = a * invDu;
  const tDeltaV = a * invDv;
  // Facet planes k: g_k(t) = a_k + b_k t with b_k fixed along the ray; their zeros −a_k/b_k with
  // the inverses taken once per search, not once per footprint.
  const tdu = tanA * du;
  const tdv = tanA * dv;
  const b0 = dz + tdu, b1 = dz - tdu, b2 = dz + tdv, b3 = dz - tdv;
  // A ray leaving the texture faster than any facet can follow it never meets it: from below every
  // plane falls along the ray (no b_k > 0, so no footprint has an exit tHi), from above every plane
  // rises (no entry tLo). The walk would end at tLimit with nothing found; skip it.
  if (!mustHit && (below ? b0 <= 0 && b1 <= 0 && b2 <= 0 && b3 <= 0 : b0 >= 0 && b1 >= 0 && b2 >= 0 && b3 >= 0)) return Hit.NO_HIT;
  const i0 = -1 / b0, i1 = -1 / b1, i2 = -1 / b2, i3 = -1 / b3;
  const zH = oz - tile.pyramidHeightUm;
  let tA = 0;
  let k = Hit.LOST;
  let tHit = 0;
  for (let step = 0; step < PYRAMID_MAX_STEPS; step++) {
    let tB = tNextU < tNextV ? tNextU : tNextV;
    if (tB > tLimit) tB = tLimit;
    let tLo = -Infinity;
    let tHi = Infinity;
    let kLo = -1;
    let kHi = -1;
    let empty = false;
    const tu = tanA * u0;
    const tv = tanA * v0;
    const a0 = zH + tu, a1 = zH - tu, a2 = zH + tv, a3 = zH - tv;
    if (b0 > 0) { const r = a0 * i0; if (r < tHi) { tHi = r; kHi = 0; } } else if (b0 < 0) { const r = a0 * i0; if (r > tLo) { tLo = r; kLo = 0; } } else if (a0 > 0) empty = true;
    if (b1 > 0) { const r = a1 * i1; if (r < tHi) { tHi = r; kHi = 1; } } else if (b1 < 0) { const r = a1 * i1; if (r > tLo) { tLo = r; kLo = 1; } } else if (a1 > 0) empty = true;
    if (b2 > 0) { const r = a2 * i2; if (r < tHi) { tHi = r; kHi = 2; } } else if (b2 < 0) { const r = a2 * i2; if (r > tLo) { tLo = r; kLo = 2; } } else if (a2 > 0) empty = true;
    if (b3 > 0) { const r = a3 * i3; if (r < tHi) { tHi = r; kHi = 3; } } else if (b3 < 0) { const r = a3 * i3; if (r > tLo) { tLo = r; kLo = 3; } } else if (a3 > 0) empty = true;
    if (!empty) {
      if (below) {
        if (kHi >= 0 && tHi > tEps && tHi >= tA - tol && tHi <= tB + tol && tHi >= tLo - tol) {
          k = kHi;
          tHit = tHi;
          break;
        }
      } else if (kLo >= 0 && tLo > tEps && tLo >= tA - tol && tLo <= tB + tol && tLo <= tHi + tol) {
        k = kLo;
        tHit = tLo;
        break;
      }
    }
    if (tB >= tLimit) {
      k = Hit.NO_HIT;
      break;
    }
    tA = tB;
    if (tNextU < tNextV) {
      u0 -= stepU;
      tNextU += tDeltaU;
    } else {
      v0 -= stepV;
      tNextV += tDeltaV;
    }
  }
  if (k < 0) return k === Hit.NO_HIT && !mustHit ? Hit.NO_HIT : Hit.LOST;
  const nrm = tile.pyramidNormals;
  const nxl = nrm[3 * k];
  const nyl = nrm[3 * k + 1];
  st[Ray.NX] = c * nxl - s * nyl;
  st[Ray.NY] = s * nxl + c * nyl;
  st[Ray.NZ] = nrm[3 * k + 2];
  st[Ray.T] = t0 + tHit;
  return Hit.HIT;
}
