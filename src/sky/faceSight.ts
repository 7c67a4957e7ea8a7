import { faceNormal } from "./rowGeometry.js";
import { SEES_SKY, type RowScene } from "./rowScene.js";

export type Face = "front" | "rear";

/**
 * What one point on a face sees, as angular intervals in ψ (the angle of a 2D sightline from the
 * face normal, positive toward the up-slope direction): edges psi[0..n] and the class seen in each
 * (SEES_SKY, SEES_ROW or a ground cell). In 2D the view factor from a point to the interval
 * [ψ1, ψ2] is (sin ψ2 − sin ψ1)/2 (Modest, Radiative Heat Transfer, ch. 4; Hottel).
 */
export interface SightTable {
  psi: Float64Array;
  cls: Int32Array;
}

/** Unit up-slope tangent of row 0 in the 2D frame (from the lower edge A to the upper edge B). */
export function faceTangent(scene: RowScene): [number, number] {
  const eu = scene.uB - scene.uA, ez = scene.zB - scene.zA, len = Math.hypot(eu, ez);
  return [eu / len, ez / len];
}

/** Sightline table at fraction s ∈ (0, 1) along row 0 from its lower edge. */
export function sightTable(scene: RowScene, face: Face, s: number): SightTable {
  const [nu, nz] = faceNormal(scene.geometry, face);
  const [tu, tz] = faceTangent(scene);
  const pu = scene.uA + s * (scene.uB - scene.uA) + 1e-9 * nu;
  const pz = scene.zA + s * (scene.zB - scene.zA) + 1e-9 * nz;
  const half = Math.PI / 2;
  const edges: number[] = [-half, half];
  const add = (vu: number, vz: number): void => {
    const c = vu * nu + vz * nz;
    if (c > 0) edges.push(Math.atan2(vu * tu + vz * tz, c));
  };
  add(1, 0); add(-1, 0); // horizon both ways
  // neighbouring rows' edges
  if (scene.periodic) {
    const [k0, k1] = scene.rowRange(pu);
    for (let k = k0; k <= k1; k++) {
      if (k === 0) continue;
      add(scene.uA + k * scene.pitch - pu, scene.zA - pz);
      add(scene.uB + k * scene.pitch - pu, scene.zB - pz);
    }
  }
  // ground cell edges
  if (scene.periodic) {
    // beyond a few pitches the ground is hidden by rows or lies in a sliver at the horizon
    const w = scene.pitch / scene.nInner, reach = 4 * scene.pitch + 40 * scene.zTop;
    const j0 = Math.ceil((pu - reach) / w), j1 = Math.floor((pu + reach) / w);
    for (let j = j0; j <= j1; j++) add(j * w - pu, -pz);
  } else {
    for (let j = 0; j <= scene.nInner; j++) add(scene.edges![j]! - pu, -pz);
  }
  edges.sort((a, b) => a - b);
  const psi: number[] = [], cls: number[] = [];
  for (let i = 0; i + 1 < edges.length; i++) {
    const a = edges[i]!, b = edges[i + 1]!;
    if (b - a < 1e-13) continue;
    const m = 0.5 * (a + b), cm = Math.cos(m), sm = Math.sin(m);
    const c = scene.cast(pu, pz, cm * nu + sm * tu, cm * nz + sm * tz);
    if (cls.length > 0 && cls[cls.length - 1] === c) continue; // extends the previous interval
    psi.push(a);
    cls.push(c);
  }
  psi.push(half);
  return { psi: Float64Array.from(psi), cls: Int32Array.from(cls) };
}

/** Class seen at angle ψ (binary search in the table). */
export function seenAt(t: SightTable, psi: number): number {
  let lo = 0, hi = t.cls.length - 1;
  while (lo < hi) {
    const mid = (lo + hi + 1) >> 1;
    if (t.psi[mid]! <= psi) lo = mid; else hi = mid - 1;
  }
  return t.cls[lo]!;
}

/** Face points: midpoints of nPoints equal parts of the slant (the rule the view factors and the quadrature share). */
export function facePoints(nPoints: number): Float64Array {
  const s = new Float64Array(nPoints);
  for (let i = 0; i < nPoints; i++) s[i] = (i + 0.5) / nPoints;
  return s;
}

/** Sight tables at the face points. */
export function faceSightTables(scene: RowScene, face: Face, nPoints: number): SightTable[] {
  return Array.from(facePoints(nPoints), (s) => sightTable(scene, face, s));
}

export { SEES_SKY };
