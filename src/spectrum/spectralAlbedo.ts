import { parseWavelengthSeries } from "../materials/numericTable.js";
import { InputError } from "../util/errors.js";

/** A spectral ground reflectance: wavelength (nm, strictly increasing) and reflectance 0…1. */
export interface SpectralAlbedo {
  source: string;
  wavelengthNm: Float64Array;
  reflectance: Float64Array;
}

/** Parses `wavelength_nm,reflectance` CSV text ('#' comments; at least 2 rows). Errors name file and line. */
export function parseSpectralAlbedo(text: string, src: string): SpectralAlbedo {
  const t = parseWavelengthSeries(text, src, "reflectance", "wavelength_nm,reflectance", (v) => v >= 0 && v <= 1, "a reflectance 0…1");
  return { source: src, wavelengthNm: t.wavelengthNm, reflectance: t.values };
}

/**
 * The reflectance on another grid: linear between the table's points, held at the end values
 * outside them. Only its shape matters to the yield (the broadband albedo stays the site's or the
 * weather file's); an all-zero result is refused.
 */
export function albedoShapeOn(a: SpectralAlbedo, gridNm: ArrayLike<number>): Float64Array {
  const x = a.wavelengthNm, y = a.reflectance, n = x.length;
  const out = new Float64Array(gridNm.length);
  let j = 0;
  for (let i = 0; i < gridNm.length; i++) {
    const l = gridNm[i]!;
    if (l <= x[0]!) { out[i] = y[0]!; continue; }
    if (l >= x[n - 1]!) { out[i] = y[n - 1]!; continue; }
    while (x[j + 1]! < l) j++;
    out[i] = y[j]! + ((y[j + 1]! - y[j]!) * (l - x[j]!)) / (x[j + 1]! - x[j]!);
  }
  if (!out.some((v) => v > 0)) throw new InputError(`${a.source}: the reflectance is zero over the whole spectrum`);
  return out;
}
