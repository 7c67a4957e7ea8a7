import { faceSightTables, facePoints, seenAt, type Face } from "../sky/faceSight.js";
import { matrixAzimuthDeg, type ModuleFrame } from "../sky/moduleFrame.js";
import type { RowLight } from "../sky/rowIrradiance.js";
import { SEES_ROW, SEES_SKY } from "../sky/rowScene.js";
import { RAD } from "../util/math.js";
import type { AngularGrid } from "./angularGrid.js";

/**
 * Quadrature of a face's response over where its light comes from, on the matrix's angle nodes: for
 * unit radiance per unit source strength (sky: DHI/π, ground cell k: B_k/π), the response-weighted
 * face irradiance is Σ q[node]·J[node]. Directions are taken in the face's own hemisphere (θ from the
 * face normal, midpoint rule in θ and azimuth) at points along the slant, and each is looked up in
 * that point's 2D sight table (infinitely long rows: what a 3D direction meets depends only on its
 * projection onto the cross-section). With J = 1 the weights sum to the face's 2D view factors.
 */
export interface FaceQuadrature {
  face: Face;
  nNodes: number;
  nCells: number;
  sky: Float64Array;
  rows: Float64Array;
  /** [cell][node]. */
  ground: Float64Array;
}

export interface FaceQuadratureOptions {
  nPoints: number;
  nTheta: number;
  nAzimuth: number;
}
export const DEFAULT_FACE_QUADRATURE: FaceQuadratureOptions = { nPoints: 12, nTheta: 45, nAzimuth: 96 };

/** `frame` is the module frame of the same plane (tilt and facing azimuth as `light`); it fixes the texture's φ axis. */
export function faceQuadrature(
  light: RowLight, frame: ModuleFrame, face: Face, grid: AngularGrid, opts: FaceQuadratureOptions = DEFAULT_FACE_QUADRATURE,
): FaceQuadrature {
  const nNodes = grid.nNodes, nCells = light.scene.nCells;
  const sky = new Float64Array(nNodes), rows = new Float64Array(nNodes), ground = new Float64Array(nCells * nNodes);
  const tables = faceSightTables(light.scene, face, opts.nPoints);
  const sign = face === "front" ? 1 : -1;
  // face normal; e1 = up-slope tangent (the 2D frame's tangent, whatever the texture rotation); e2 along the row
  const tilt = (light.scene.geometry.tiltDeg * Math.PI) / 180, facing = (light.facingAzimuthDeg * Math.PI) / 180;
  const nf = [sign * Math.sin(tilt) * Math.sin(facing), sign * Math.sin(tilt) * Math.cos(facing), sign * Math.cos(tilt)];
  const e1 = [-Math.cos(tilt) * Math.sin(facing), -Math.cos(tilt) * Math.cos(facing), Math.sin(tilt)];
  const e2 = [nf[1]! * e1[2]! - nf[2]! * e1[1]!, nf[2]! * e1[0]! - nf[0]! * e1[2]!, nf[0]! * e1[1]! - nf[1]! * e1[0]!];
  const idx = new Int32Array(4), w = new Float64Array(4), d = new Float64Array(3);
  const dth = Math.PI / 2 / opts.nTheta, dph = (2 * Math.PI) / opts.nAzimuth;
  const wPoint = 1 / facePoints(opts.nPoints).length;
  for (let i = 0; i < opts.nTheta; i++) {
    const th = (i + 0.5) * dth, st = Math.sin(th), ct = Math.cos(th);
    const base = (ct * st * dth * dph * wPoint) / Math.PI;
    for (let j = 0; j < opts.nAzimuth; j++) {
      const ph = (j + 0.5) * dph, a1 = st * Math.cos(ph), a2 = st * Math.sin(ph);
      for (let c = 0; c < 3; c++) d[c] = a1 * e1[c]! + a2 * e2[c]! + ct * nf[c]!;
      const k = grid.weights(th * RAD, matrixAzimuthDeg(frame, d), idx, w);
      if (k === 0) continue;
      const psi = Math.atan2(a1, ct);
      for (const t of tables) {
        const cls = seenAt(t, psi);
        for (let q = 0; q < k; q++) {
          const v = base * w[q]!;
          if (cls === SEES_SKY) sky[idx[q]!] += v;
          else if (cls === SEES_ROW) rows[idx[q]!] += v;
          else ground[cls * nNodes + idx[q]!] += v;
        }
      }
    }
  }
  return { face, nNodes, nCells, sky, rows, ground };
}

/** Σ_node q·J for the sky and per ground cell. */
export function faceResponse(q: FaceQuadrature, j: Float64Array): { sky: number; ground: Float64Array } {
  let sky = 0;
  for (let n = 0; n < q.nNodes; n++) sky += q.sky[n]! * j[n]!;
  const ground = new Float64Array(q.nCells);
  for (let c = 0; c < q.nCells; c++) {
    let s = 0;
    const off = c * q.nNodes;
    for (let n = 0; n < q.nNodes; n++) s += q.ground[off + n]! * j[n]!;
    ground[c] = s;
  }
  return { sky, ground };
}
