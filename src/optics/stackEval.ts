import type { Material } from "../materials/types.js";
import type { StackSpec } from "./stackSpec.js";
import { filmStack } from "./thinFilm.js";
import { DEG } from "../util/math.js";

/** One evaluated point of a film stack (unpolarised = mean of s and p). */
export interface FilmPoint {
  wavelengthNm: number;
  angleDeg: number;
  /** Index used for the incidence medium (Re n when it absorbs). */
  n0: number;
  Rs: number;
  Rp: number;
  R: number;
  Ts: number;
  Tp: number;
  T: number;
  films: { material: string; thicknessNm: number; As: number; Ap: number; A: number }[];
}

/**
 * Evaluates a parsed stack at one wavelength and incidence angle (degrees, in the incidence
 * medium), resolving material names with `resolve` (e.g. a MaterialRegistry's get).
 * Throws the materials' InputError when λ lies outside a material's data range.
 */
export function evaluateStack(
  spec: StackSpec,
  resolve: (name: string) => Material,
  wavelengthNm: number,
  angleDeg: number,
): FilmPoint {
  const inc = resolve(spec.incidence).nk(wavelengthNm);
  const exit = resolve(spec.exit).nk(wavelengthNm);
  const films = spec.films.map((f) => ({ ...resolve(f.material).nk(wavelengthNm), thicknessNm: f.thicknessNm }));
  const r = filmStack(inc.n, films, exit, wavelengthNm, Math.cos(angleDeg * DEG));
  return {
    wavelengthNm,
    angleDeg,
    n0: inc.n,
    Rs: r.Rs,
    Rp: r.Rp,
    R: 0.5 * (r.Rs + r.Rp),
    Ts: r.Ts,
    Tp: r.Tp,
    T: 0.5 * (r.Ts + r.Tp),
    films: spec.films.map((f, j) => ({
      material: f.material,
      thicknessNm: f.thicknessNm,
      As: r.As[j]!,
      Ap: r.Ap[j]!,
      A: 0.5 * (r.As[j]! + r.Ap[j]!),
    })),
  };
}
