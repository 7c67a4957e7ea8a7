import { InputError } from "../util/errors.js";
import type { PhiMode } from "../response/responseMatrix.js";
import {
  describeValue,
  expectNumber,
  expectObject,
  expectOneOf,
  expectPositive,
  rejectUnknownFields,
  requireField,
  type RawObject,
} from "./fieldChecks.js";
import type { StudyGrid } from "./studyTypes.js";

/** Points of a range more than this are refused (a typo in a step must not start a week-long run). */
const MAX_AXIS_POINTS = 100_000;

/**
 * Values of a range {from, to, step} (both ends included when `to` lies on the step grid) or of a
 * list. Range values are rounded to 1e-9 so 0.1-steps read back as written.
 */
export function axisValues(raw: unknown, path: string): number[] {
  if (Array.isArray(raw)) {
    if (raw.length === 0) throw new InputError(`${path}: expected a non-empty list of numbers`);
    const values = raw.map((v, i) => expectNumber(v, `${path}[${i}]`));
    for (let i = 1; i < values.length; i++) {
      if (!(values[i] > values[i - 1])) {
        throw new InputError(`${path}[${i}]: expected values in increasing order, got ${values[i]} after ${values[i - 1]}`);
      }
    }
    return values;
  }
  if (raw === null || typeof raw !== "object") {
    throw new InputError(`${path}: expected a range {"from", "to", "step"} or a list of numbers, got ${describeValue(raw)}`);
  }
  const o = raw as RawObject;
  rejectUnknownFields(o, path, ["from", "to", "step"]);
  const from = expectNumber(requireField(o, "from", path), `${path}.from`);
  const to = expectNumber(requireField(o, "to", path), `${path}.to`);
  const step = expectPositive(requireField(o, "step", path), `${path}.step`);
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

/** Validates the "grid" section: θ in [0, 90), φ list or "averaged", λ range or list (nm). */
export function parseGrid(raw: unknown, path: string): StudyGrid {
  const o = expectObject(raw, path);
  rejectUnknownFields(o, path, ["thetaDeg", "phiDeg", "phiSymmetry", "wavelengthNm"]);
  const thetaDeg = axisValues(requireField(o, "thetaDeg", path), `${path}.thetaDeg`);
  checkAxis(o.thetaDeg, thetaDeg, `${path}.thetaDeg`, (t) => t >= 0 && t < 90, "incidence angles in [0, 90)");
  const wavelengthNm = axisValues(requireField(o, "wavelengthNm", path), `${path}.wavelengthNm`);
  checkAxis(o.wavelengthNm, wavelengthNm, `${path}.wavelengthNm`, (w) => w > 0, "positive wavelengths in nm");

  const rawPhi = o.phiDeg ?? [0];
  let phiDeg: number[];
  let phiMode: PhiMode = "list";
  if (rawPhi === "averaged") {
    if (o.phiSymmetry !== undefined) {
      throw new InputError(`${path}.phiSymmetry: has no effect with phiDeg "averaged"; remove it`);
    }
    phiDeg = [0];
    phiMode = "averaged";
  } else {
    if (typeof rawPhi === "string") {
      throw new InputError(`${path}.phiDeg: expected a list of azimuths in degrees, a range, or "averaged", got ${describeValue(rawPhi)}`);
    }
    phiDeg = axisValues(rawPhi, `${path}.phiDeg`);
    if (o.phiSymmetry !== undefined) {
      expectOneOf(o.phiSymmetry, `${path}.phiSymmetry`, ["square"]);
      phiMode = "square";
      phiDeg = [...new Set(phiDeg.map(foldSquareAzimuthDeg))].sort((a, b) => a - b);
    }
  }
  return { thetaDeg, phiDeg, phiMode, wavelengthNm };
}

/** Checks every value of an axis; the error names the list entry or the range end at fault. */
function checkAxis(raw: unknown, values: number[], path: string, ok: (v: number) => boolean, expected: string): void {
  values.forEach((v, i) => {
    if (ok(v)) return;
    const where = Array.isArray(raw) ? `${path}[${i}]` : i === 0 ? `${path}.from` : `${path}.to`;
    throw new InputError(`${where}: expected ${expected}, got ${v}`);
  });
}
