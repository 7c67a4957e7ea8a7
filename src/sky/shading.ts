import type { RowScene } from "./rowScene.js";

/**
 * The sun in the 2D frame of the rows: the direction toward the sun projected onto the cross-section
 * (u toward the facing azimuth, z up). Only the ratio su/sz matters for shadows (the profile angle).
 */
export function sunProfile(zenithDeg: number, sunAzimuthDeg: number, facingAzimuthDeg: number): { su: number; sz: number } {
  const z = (zenithDeg * Math.PI) / 180, da = ((sunAzimuthDeg - facingAzimuthDeg) * Math.PI) / 180;
  return { su: Math.sin(z) * Math.cos(da), sz: Math.cos(z) };
}

/**
 * Shaded fraction of each ground cell (writes `out`): row shadows cast along the sun's profile
 * direction onto z = 0, a point (u, z) landing at u − z·su/sz; with rows the shadows repeat at the
 * pitch. Modules are taken as opaque. Sun at or below the horizon: everything shaded.
 */
export function groundShadedFractions(scene: RowScene, su: number, sz: number, out: Float64Array): Float64Array {
  out.fill(0);
  if (sz <= 0) { out.fill(1); return out; }
  const r = su / sz;
  const xa = scene.uA - scene.zA * r, xb = scene.uB - scene.zB * r;
  const s0 = Math.min(xa, xb), s1 = Math.max(xa, xb);
  if (scene.periodic) {
    const p = scene.pitch;
    if (s1 - s0 >= p) { out.fill(1); return out; }
    const shift = Math.floor(s0 / p) * p;
    const a = s0 - shift, b = s1 - shift; // a ∈ [0, p)
    for (let k = 0; k < scene.nInner; k++) {
      const [c0, c1] = scene.cellBounds(k);
      let o = 0;
      for (let j = -1; j <= 1; j++) o += Math.max(0, Math.min(c1, b + j * p) - Math.max(c0, a + j * p));
      out[k] = Math.min(1, o / (c1 - c0));
    }
    return out;
  }
  for (let k = 0; k < scene.nInner; k++) {
    const [c0, c1] = scene.cellBounds(k);
    out[k] = Math.max(0, Math.min(c1, s1) - Math.max(c0, s0)) / (c1 - c0);
  }
  return out; // far cells: an isolated row's shadow there is a vanishing part of an infinite strip
}

/**
 * Shaded fraction of row 0's slant by the neighbouring rows for a sun in front of the given face
 * (2D): rows are parallel copies, so row k's shadow on row 0's line is row 0 shifted by a, where
 * k·pitch·û = a·(B − A) + λ·sun; it falls on row 0 when λ > 0 (row k lies toward the sun), covering
 * max(0, 1 − |a|) of the slant. Only the adjacent rows matter (farther shadows are shifted further).
 */
export function faceShadedFraction(scene: RowScene, su: number, sz: number): number {
  if (!scene.periodic) return 0;
  const eu = scene.uB - scene.uA, ez = scene.zB - scene.zA;
  const det = eu * sz - ez * su;
  if (Math.abs(det) < 1e-15) return 0; // sun in the module plane: no light on either face
  let shaded = 0;
  for (const k of [-1, 1]) {
    const du = k * scene.pitch;
    const a = (du * sz) / det, lambda = (eu * 0 - ez * du) / det;
    if (lambda > 0) shaded = Math.max(shaded, Math.max(0, 1 - Math.abs(a)));
  }
  return shaded;
}
