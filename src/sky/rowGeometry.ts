import { InputError } from "../util/errors.js";
import { DEG } from "../util/math.js";

/**
 * Cross-section of a mounting for the rear-light model: one module row (infinitely long along the
 * row axis), alone above flat ground or repeated at a pitch. The 2D frame has u horizontal toward
 * the direction the front faces and z up; row k's centre is at (k·pitch, centreHeight).
 */
export interface RowGeometry {
  /** 0 = facing up … 90 = vertical. */
  tiltDeg: number;
  /** Module (collector) width across the row, along the slope, m. */
  slantLengthM: number;
  /** Height of the module centre above the ground, m. */
  centreHeightM: number;
  /** Horizontal distance between rows, m; null for an isolated row. */
  pitchM: number | null;
}

/** The file/flag form: pitch or ground-coverage ratio (slant length / pitch), or neither (isolated). */
export interface RowGeometrySpec {
  tiltDeg: number;
  slantLengthM: number;
  centreHeightM: number;
  pitchM?: number;
  groundCoverageRatio?: number;
}

function positive(v: unknown, field: string, src: string, what: string): number {
  if (typeof v !== "number" || !Number.isFinite(v) || v <= 0) {
    throw new InputError(`${src}: ${field} must be a positive number (${what}), got ${JSON.stringify(v)}`);
  }
  return v;
}

/** Checks a mounting; every error names the field. */
export function checkRowGeometry(spec: RowGeometrySpec, src: string): RowGeometry {
  const t = spec.tiltDeg;
  if (typeof t !== "number" || !Number.isFinite(t) || t < 0 || t > 90) {
    throw new InputError(`${src}: tiltDeg = ${JSON.stringify(t)} must be within 0–90° for the rear-light model (0 = facing up, 90 = vertical)`);
  }
  const slant = positive(spec.slantLengthM, "slantLengthM", src, "module width across the row, m");
  const h = positive(spec.centreHeightM, "centreHeightM", src, "height of the module centre above ground, m");
  const lowEdge = h - 0.5 * slant * Math.sin(t * DEG);
  if (lowEdge < 0) {
    throw new InputError(`${src}: centreHeightM = ${h} puts the lower module edge ${(-lowEdge).toFixed(3)} m below the ground (tilt ${t}°, slantLengthM ${slant}); the centre must be at least ${(h - lowEdge).toFixed(3)} m high`);
  }
  let pitch: number | null = null;
  if (spec.pitchM !== undefined && spec.groundCoverageRatio !== undefined) {
    throw new InputError(`${src}: give pitchM or groundCoverageRatio, not both`);
  }
  if (spec.pitchM !== undefined) pitch = positive(spec.pitchM, "pitchM", src, "horizontal row pitch, m");
  if (spec.groundCoverageRatio !== undefined) {
    const g = spec.groundCoverageRatio;
    if (typeof g !== "number" || !Number.isFinite(g) || g <= 0 || g > 1) {
      throw new InputError(`${src}: groundCoverageRatio = ${JSON.stringify(g)} must be in (0, 1] (slant length / pitch)`);
    }
    pitch = slant / g;
  }
  if (pitch !== null && pitch < slant * Math.cos(t * DEG)) {
    throw new InputError(`${src}: pitchM = ${pitch} is shorter than the rows' horizontal depth ${(slant * Math.cos(t * DEG)).toFixed(3)} m: rows would overlap`);
  }
  return { tiltDeg: t, slantLengthM: slant, centreHeightM: h, pitchM: pitch };
}

/** Ground-coverage ratio slant / pitch (0 for an isolated row). */
export function groundCoverageRatio(g: RowGeometry): number {
  return g.pitchM === null ? 0 : g.slantLengthM / g.pitchM;
}

/** Row 0's edges: lower edge A and upper edge B, as [uA, zA, uB, zB]. */
export function rowEdges(g: RowGeometry): [number, number, number, number] {
  const b = g.tiltDeg * DEG, half = 0.5 * g.slantLengthM;
  return [half * Math.cos(b), g.centreHeightM - half * Math.sin(b), -half * Math.cos(b), g.centreHeightM + half * Math.sin(b)];
}

/** Unit normals in the 2D frame: front (sin β, cos β) and rear −front. */
export function faceNormal(g: RowGeometry, face: "front" | "rear"): [number, number] {
  const b = g.tiltDeg * DEG, s = face === "front" ? 1 : -1;
  return [s * Math.sin(b), s * Math.cos(b)];
}
