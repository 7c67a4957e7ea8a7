import { InputError } from "../util/errors.js";
import type { PhiMode } from "../response/responseMatrix.js";
import type { StudyGrid } from "./studyTypes.js";

/** Points of a range more than this are refused (a typo in a step must not start a week-long run). */
const MAX_AXIS_POINTS = 100_000;

/** An axis as the schema admits it: a range or a list of numbers (each within the axis's bounds). */
export type RawAxis = number[] | { from: number; to: number; step: number };

/**
 * Values of a range {from, to, step} (both ends included when `to` lies on the step grid) or of a
 * list, which must increase. Range values are rounded to 1e-9 so 0.1-steps read back as written.
 */
export function axisValues(raw: RawAxis, path: string): number[] {
  if (Array.isArray(raw)) {
    for (let i = 1; i < raw.length; i++) {
      if (!(raw[i]! > raw[i - 1]!)) {
        throw new InputError(`${path}[${i}]: expected values in increasing order, got ${raw[i]} after ${raw[i - 1]}`);
      }
    }
    return [...raw];
  }
  const { from, to, step } = raw;
  if (to < from) throw new InputError(`${path}.to: expected at least "from" (${from}), got ${to}`);
  const n = Math.floor((to - from) / step + 1e-9) + 1;
  if (n > MAX_AXIS_POINTS) throw new InputError(`${path}: the range has ${n} points, more than ${MAX_AXIS_POINTS}`);
  const values: number[] = [];
  for (let i = 0; i < n; i++) values.push(Math.round((from + i * step) * 1e9) / 1e9);
  return values;
}

/** Folds an azimuth into [0°, 45°] using the square (C4v) symmetry of the texture. */
export function foldSquareAzimuthDeg(phiDeg: number): number {
  let p = ((phiDeg % 90) + 90) % 90;
  if (p > 45) p = 90 - p;
  return Math.round(p * 1e9) / 1e9;
}

/** The "grid" section as the schema admits it (θ in [0, 90), λ > 0 already checked there). */
export interface RawGrid {
  thetaDeg: RawAxis;
  phiDeg?: RawAxis | "averaged";
  phiSymmetry?: "square";
  wavelengthNm: RawAxis;
}

/** Resolves the "grid" section: θ and λ values, φ list (folded by symmetry) or "averaged". */
export function parseGrid(o: RawGrid, path: string): StudyGrid {
  const thetaDeg = axisValues(o.thetaDeg, `${path}.thetaDeg`);
  const wavelengthNm = axisValues(o.wavelengthNm, `${path}.wavelengthNm`);
  const rawPhi = o.phiDeg ?? [0];
  if (rawPhi === "averaged") {
    if (o.phiSymmetry !== undefined) {
      throw new InputError(`${path}.phiSymmetry: has no effect with phiDeg "averaged"; remove it`);
    }
    return { thetaDeg, phiDeg: [0], phiMode: "averaged", wavelengthNm };
  }
  let phiDeg = axisValues(rawPhi, `${path}.phiDeg`);
  let phiMode: PhiMode = "list";
  if (o.phiSymmetry === "square") {
    phiMode = "square";
    phiDeg = [...new Set(phiDeg.map(foldSquareAzimuthDeg))].sort((a, b) => a - b);
  }
  return { thetaDeg, phiDeg, phiMode, wavelengthNm };
}
