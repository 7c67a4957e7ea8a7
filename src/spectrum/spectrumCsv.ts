import { readDataFile } from "../util/inputFile.js";
import { parseWavelengthSeries } from "../materials/numericTable.js";
import type { Spectrum } from "./types.js";

/**
 * Parses a spectrum CSV: '#' comment lines, header `wavelength_nm,irradiance_W_m2_nm`, then rows
 * (wavelength strictly increasing, irradiance ≥ 0 in W m⁻² nm⁻¹, at least 2 rows).
 */
export function parseSpectrumCsv(text: string, label: string, name = label): Spectrum {
  const t = parseWavelengthSeries(text, label, "irradiance_w_m2_nm", "wavelength_nm,irradiance_W_m2_nm", (v) => v >= 0, "irradiance ≥ 0");
  return { name, wavelengthNm: t.wavelengthNm, irradianceWm2PerNm: t.values };
}

/** Reads a spectrum CSV file (see parseSpectrumCsv); errors name the file and line. */
export function loadSpectrumCsv(path: string): Spectrum {
  const text = readDataFile(path, "spectrum file", "give a CSV with header wavelength_nm,irradiance_W_m2_nm, or the built-in name AM1.5G");
  return parseSpectrumCsv(text, path);
}
