import { DEG, RAD } from "../util/math.js";
import type { Plane } from "../site/site.js";

/**
 * Orthonormal module frame in east–north–up coordinates: n = front normal, x = up-slope direction in
 * the plane (from the lower edge toward the upper edge; for tilt 0 it points away from the facing
 * azimuth), y = n × x (counter-clockwise from x seen from the front). The texture's φ = 0 axis is x
 * rotated by textureRotationDeg about n.
 */
export interface ModuleFrame {
  n: Float64Array;
  x: Float64Array;
  y: Float64Array;
  cosTilt: number;
  sinTilt: number;
}

export function moduleFrame(plane: Plane): ModuleFrame {
  const b = plane.tiltDeg * DEG;
  const g = plane.azimuthDeg * DEG;
  const r = plane.textureRotationDeg * DEG;
  const n = new Float64Array([Math.sin(b) * Math.sin(g), Math.sin(b) * Math.cos(g), Math.cos(b)]);
  const u = [-Math.cos(b) * Math.sin(g), -Math.cos(b) * Math.cos(g), Math.sin(b)];
  const v = [n[1] * u[2] - n[2] * u[1], n[2] * u[0] - n[0] * u[2], n[0] * u[1] - n[1] * u[0]];
  // rotate the in-plane axes by the texture rotation
  const cr = Math.cos(r), sr = Math.sin(r);
  const x = new Float64Array([cr * u[0] + sr * v[0], cr * u[1] + sr * v[1], cr * u[2] + sr * v[2]]);
  const y = new Float64Array([-sr * u[0] + cr * v[0], -sr * u[1] + cr * v[1], -sr * u[2] + cr * v[2]]);
  return { n, x, y, cosTilt: Math.cos(b), sinTilt: Math.sin(b) };
}

/** Unit vector (east, north, up) toward a direction given by zenith and azimuth (from north, clockwise). */
export function directionEnu(zenithDeg: number, azimuthDeg: number, out: Float64Array): Float64Array {
  const z = zenithDeg * DEG, a = azimuthDeg * DEG;
  out[0] = Math.sin(z) * Math.sin(a);
  out[1] = Math.sin(z) * Math.cos(a);
  out[2] = Math.cos(z);
  return out;
}

/** Cosine of the angle between the direction toward the sun and the module normal. */
export function cosIncidence(f: ModuleFrame, zenithDeg: number, azimuthDeg: number): number {
  const z = zenithDeg * DEG, a = azimuthDeg * DEG;
  const sz = Math.sin(z);
  return f.n[0] * sz * Math.sin(a) + f.n[1] * sz * Math.cos(a) + f.n[2] * Math.cos(z);
}

/**
 * Module-relative azimuth (degrees, 0..360) of a direction d in the texture frame: atan2(d·y, d·x).
 * For d toward the source this is where the light comes from; the response matrix is indexed by
 * the travel direction instead (see matrixAzimuthDeg).
 */
export function moduleAzimuthDeg(f: ModuleFrame, d: ArrayLike<number>): number {
  const px = f.x[0] * d[0] + f.x[1] * d[1] + f.x[2] * d[2];
  const py = f.y[0] * d[0] + f.y[1] * d[1] + f.y[2] * d[2];
  let phi = Math.atan2(py, px) * RAD;
  if (phi < 0) phi += 360;
  return phi;
}

/**
 * Azimuth (degrees, 0..360) at which to read the response matrix for light arriving from direction
 * d (toward the source). The tracer launches a ray at (θ, φ) travelling along
 * (sinθ cosφ, sinθ sinφ, −cosθ) in the texture frame (src/trace/launch.ts), so the matrix φ
 * is the azimuth of the travel direction −d: the source's module azimuth + 180°. (Textures with
 * 180° rotational symmetry, e.g. pyramids and V-grooves, cannot tell the two apart; height maps can.)
 */
export function matrixAzimuthDeg(f: ModuleFrame, d: ArrayLike<number>): number {
  const px = f.x[0] * d[0] + f.x[1] * d[1] + f.x[2] * d[2];
  const py = f.y[0] * d[0] + f.y[1] * d[1] + f.y[2] * d[2];
  let phi = Math.atan2(-py, -px) * RAD;
  if (phi < 0) phi += 360;
  return phi;
}
