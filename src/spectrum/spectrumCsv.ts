import { readDataFile } from "../util/inputFile.js";
import { InputError } from "../util/errors.js";
import { parseNumericTable, requireEach, requireStrictlyIncreasing } from "../materials/numericTable.js";
import type { Spectrum } from "./types.js";

/**
 * Parses a spectrum CSV: '#' comment lines, header `wavelength_nm,irradiance_W_m2_nm`, then rows
 * (wavelength strictly increasing, irradiance ≥ 0 in W m⁻² nm⁻¹, at least 2 rows).
 */
export function parseSpectrumCsv(text: string, label: string, name = label): Spectrum {
  const t = parseNumericTable(text, label);
  if (t.header.length !== 2 || t.header[0] !== "wavelength_nm" || t.header[1] !== "irradiance_w_m2_nm") {
    throw new InputError(`${label}: header is "${t.header.join(",")}"; expected "wavelength_nm,irradiance_W_m2_nm"`);
  }
  if (t.columns[0]!.length < 2) throw new InputError(`${label}: needs at least 2 data rows, found ${t.columns[0]!.length}`);
  requireEach(t, 0, (v) => v > 0, "a positive wavelength");
  requireStrictlyIncreasing(t, 0);
  requireEach(t, 1, (v) => v >= 0, "irradiance ≥ 0");
  return { name, wavelengthNm: t.columns[0]!, irradianceWm2PerNm: t.columns[1]! };
}

/** Reads a spectrum CSV file (see parseSpectrumCsv); errors name the file and line. */
export function loadSpectrumCsv(path: string): Spectrum {
  const text = readDataFile(path, "spectrum file", "give a CSV with header wavelength_nm,irradiance_W_m2_nm, or the built-in name AM1.5G");
  return parseSpectrumCsv(text, path);
}
