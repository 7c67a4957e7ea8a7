import { LOST, NO_HIT, Q_DX, Q_DY, Q_DZ, Q_LIMIT, Q_OX, Q_OY, Q_OZ, Q_T, meshHit, pyramidHit } from "../geometry/surfaceHit.js";
import { SURFACE_MESH, TRI_STRIDE, type SurfaceTile } from "../geometry/surfaceTile.js";
import type { CompiledStack } from "./compiledStack.js";
import { DX, DY, DZ, HIT, NX, NY, NZ, T, X, Y, Z, setNormal } from "./rayState.js";

/**
 * Front texture search in world coordinates (front tile frame: z is the height). Sets the hit's
 * outward normal (towards the medium above) in the state.
 */
export function frontSearch(cs: CompiledStack, st: Float64Array, fromBelow: boolean): number {
  const tile = cs.frontTile;
  const z = st[Z];
  const dz = st[DZ];
  if (tile.kind !== SURFACE_MESH) {
    if (fromBelow ? dz > 0 : dz < 0) {
      setNormal(st, 0, 0, 1);
      const t = -z / dz;
      st[T] = t > 0 ? t : 0;
      return HIT;
    }
    return NO_HIT;
  }
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
  const tile = cs.rearTile;
  const W_ = cs.thicknessUm;
  const dz = st[DZ];
  if (tile.kind !== SURFACE_MESH) {
    if (dz < 0) {
      setNormal(st, 0, 0, 1);
      const t = (-W_ - st[Z]) / dz;
      st[T] = t > 0 ? t : 0;
      return HIT;
    }
    return NO_HIT;
  }
  const found = tileSearch(tile, st, cs.query, true, -1, -W_);
  if (found === HIT) {
    st[NX] = -st[NX];
    st[NY] = -st[NY];
  }
  return found;
}

/**
 * Rear search for a ray behind the absorber (first rear layer or exit medium) heading up: the same
 * tile seen from outside. Sets the normal pointing into the absorber (the rear table's upper medium).
 */
export function rearSearchFromBehind(cs: CompiledStack, st: Float64Array): number {
  const tile = cs.rearTile;
  const W_ = cs.thicknessUm;
  const dz = st[DZ];
  if (tile.kind !== SURFACE_MESH) {
    if (dz > 0) {
      setNormal(st, 0, 0, 1);
      const t = (-W_ - st[Z]) / dz;
      st[T] = t > 0 ? t : 0;
      return HIT;
    }
    return NO_HIT;
  }
  const found = tileSearch(tile, st, cs.query, false, -1, -W_);
  if (found === HIT) {
    st[NX] = -st[NX];
    st[NY] = -st[NY];
  }
  return found;
}

/**
 * Hit search on a mesh tile in its local frame (z = height, outward positive; xy rotated by the
 * texture orientation and wrapped into the tile) for the ray in the state; distance → st[T]. Writes
 * the outward normal (xy rotated back) to the state. Rays heading into the surface must hit it: a
 * miss there is LOST.
 */
function tileSearch(tile: SurfaceTile, st: Float64Array, q: Float64Array, fromBelow: boolean, zSign: number, zOffsetUm: number): number {
  const x = st[X];
  const y = st[Y];
  const dx = st[DX];
  const dy = st[DY];
  // Local height: z − offset (front: offset 0; outer glass texture: the glass's top plane), or for
  // the rear tile, flipped: −(z − (−W)) = −(z + W).
  const zl = zSign * (st[Z] - zOffsetUm);
  const dzl = zSign * st[DZ];
  const c = tile.cosRot;
  const s = tile.sinRot;
  const dxl = c * dx + s * dy;
  const dyl = -s * dx + c * dy;
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
      if (zl <= zMin) return NO_HIT;
      tLimit = (zMin - zl) / dzl;
    }
  } else {
    if (dzl < 0) {
      if (zl > zMax + margin) t0 = (zMax + margin - zl) / dzl;
      tLimit = (zMin - zl) / dzl - t0;
      mustHit = true;
    } else if (dzl > 0) {
      if (zl >= zMax) return NO_HIT;
      tLimit = (zMax - zl) / dzl;
    }
  }
  if (mustHit) tLimit = tLimit * (1 + 1e-9) + 1e-9 * (zMax - zMin);
  const lx = tile.lxUm;
  const ly = tile.lyUm;
  let px = c * x + s * y + t0 * dxl;
  let py = -s * x + c * y + t0 * dyl;
  px -= lx * Math.floor(px / lx);
  py -= ly * Math.floor(py / ly);
  q[Q_OX] = px;
  q[Q_OY] = py;
  q[Q_OZ] = zl + t0 * dzl;
  q[Q_DX] = dxl;
  q[Q_DY] = dyl;
  q[Q_DZ] = dzl;
  q[Q_LIMIT] = tLimit;
  let nxl: number, nyl: number, nzl: number;
  if (tile.pyramidSign !== 0) {
    const k = pyramidHit(tile, q, fromBelow);
    if (k < 0) return k === NO_HIT && !mustHit ? NO_HIT : LOST;
    const nrm = tile.pyramidNormals;
    nxl = nrm[3 * k];
    nyl = nrm[3 * k + 1];
    nzl = nrm[3 * k + 2];
  } else {
    const tri = meshHit(tile, q, fromBelow);
    if (tri < 0) return tri === NO_HIT && !mustHit ? NO_HIT : LOST;
    const o = tri * TRI_STRIDE;
    nxl = tile.tri[o];
    nyl = tile.tri[o + 1];
    nzl = tile.tri[o + 2];
  }
  st[NX] = c * nxl - s * nyl;
  st[NY] = s * nxl + c * nyl;
  st[NZ] = nzl;
  st[T] = t0 + q[Q_T];
  return HIT;
}
