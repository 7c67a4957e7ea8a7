import { interpolateLinear, interpolateLogPositive } from "./interpolate.js";

/** One optical constant (n or k) as a function of wavelength in nm over [minNm, maxNm]. */
export interface Curve {
  readonly minNm: number;
  readonly maxNm: number;
  at(wavelengthNm: number): number;
}

/** Tabulated curve; "linear" for n, "logPositive" for k (log space where both neighbours are > 0). */
export function tableCurve(wavelengthNm: Float64Array, values: Float64Array, mode: "linear" | "logPositive"): Curve {
  const x = wavelengthNm;
  const y = values;
  const minNm = x[0]!;
  const maxNm = x[x.length - 1]!;
  return mode === "linear"
    ? { minNm, maxNm, at: (w) => interpolateLinear(x, y, w) }
    : { minNm, maxNm, at: (w) => interpolateLogPositive(x, y, w) };
}

/** Curve given by a formula valid on [minNm, maxNm]. */
export function formulaCurve(fn: (wavelengthNm: number) => number, minNm: number, maxNm: number): Curve {
  return { minNm, maxNm, at: fn };
}

/** Constant value on [minNm, maxNm]. */
export function constantCurve(value: number, minNm: number, maxNm: number): Curve {
  return { minNm, maxNm, at: () => value };
}
