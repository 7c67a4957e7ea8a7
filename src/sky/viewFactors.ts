import { faceSightTables, type Face, type SightTable } from "./faceSight.js";
import { SEES_ROW, SEES_SKY, type RowScene } from "./rowScene.js";

/** Points along the slant where face view factors are taken (midpoint rule). */
export const DEFAULT_FACE_POINTS = 24;

/**
 * Face-averaged 2D view factors from one face of row 0 to the sky, the other rows and each ground
 * cell. They sum to 1 (the sight intervals partition the half-plane in front of the face).
 */
export interface FaceViewFactors {
  face: Face;
  sky: number;
  rows: number;
  ground: Float64Array;
  groundTotal: number;
}

/** Face view factors from sight tables (average over the face points of Σ (sin ψ2 − sin ψ1)/2 per class). */
export function faceViewFactorsFromTables(scene: RowScene, face: Face, tables: SightTable[]): FaceViewFactors {
  const ground = new Float64Array(scene.nCells);
  let sky = 0, rows = 0;
  const wPoint = 1 / tables.length;
  for (const t of tables) {
    for (let i = 0; i < t.cls.length; i++) {
      const f = 0.5 * (Math.sin(t.psi[i + 1]!) - Math.sin(t.psi[i]!)) * wPoint;
      const c = t.cls[i]!;
      if (c === SEES_SKY) sky += f;
      else if (c === SEES_ROW) rows += f;
      else ground[c] += f;
    }
  }
  let groundTotal = 0;
  for (const f of ground) groundTotal += f;
  return { face, sky, rows, ground, groundTotal };
}

export function faceViewFactors(scene: RowScene, face: Face, nPoints = DEFAULT_FACE_POINTS): FaceViewFactors {
  return faceViewFactorsFromTables(scene, face, faceSightTables(scene, face, nPoints));
}

/**
 * Sky view factor of a ground point at u: 1 − the rows' union of angular intervals, each measured
 * from the vertical and weighted (sin θ2 − sin θ1)/2 (2D view factor from a point).
 */
export function groundSkyViewAt(scene: RowScene, u: number): number {
  const [k0, k1] = scene.rowRange(u);
  const iv: [number, number][] = [];
  for (let k = k0; k <= k1; k++) {
    const off = scene.periodic ? k * scene.pitch : 0;
    const a = Math.atan2(scene.uA + off - u, scene.zA);
    const b = Math.atan2(scene.uB + off - u, scene.zB);
    iv.push(a < b ? [a, b] : [b, a]);
    if (!scene.periodic) break;
  }
  iv.sort((x, y) => x[0] - y[0]);
  let blocked = 0, curA = -Infinity, curB = -Infinity;
  for (const [a, b] of iv) {
    if (a > curB) {
      if (curB > curA) blocked += Math.sin(curB) - Math.sin(curA);
      curA = a; curB = b;
    } else if (b > curB) curB = b;
  }
  if (curB > curA) blocked += Math.sin(curB) - Math.sin(curA);
  return 1 - 0.5 * blocked;
}

/** Sky view factor per ground cell (average of nSub midpoints; far cells of an isolated row at 1.5 × the window edge). */
export function groundCellSkyViews(scene: RowScene, nSub = 8): Float64Array {
  const out = new Float64Array(scene.nCells);
  for (let k = 0; k < scene.nInner; k++) {
    const [u0, u1] = scene.cellBounds(k);
    let s = 0;
    for (let i = 0; i < nSub; i++) s += groundSkyViewAt(scene, u0 + ((i + 0.5) / nSub) * (u1 - u0));
    out[k] = s / nSub;
  }
  if (!scene.periodic) {
    out[scene.nInner] = groundSkyViewAt(scene, -1.5 * scene.windowM);
    out[scene.nInner + 1] = groundSkyViewAt(scene, 1.5 * scene.windowM);
  }
  return out;
}
