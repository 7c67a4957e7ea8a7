import { InputError } from "../util/errors.js";
import { parseNumericTable, requireEach, requireStrictlyIncreasing } from "./numericTable.js";

/** Columns of an n,k file; n or k absent when the file holds only the other. */
export interface NkColumns {
  wavelengthNm: Float64Array;
  n: Float64Array | null;
  k: Float64Array | null;
}

const WAVELENGTH_HEADERS: Record<string, number> = {
  wavelength_nm: 1,
  wavelength_um: 1000,
  "wavelength_µm": 1000,
  "wavelength_μm": 1000,
};

/**
 * Parses an optical-constants CSV: '#' comment lines, a header whose first column is
 * `wavelength_nm` or `wavelength_um` (ellipsometry exports in µm) followed by `n`, `k` or both,
 * then one row per wavelength. Wavelengths strictly increasing, n > 0, k ≥ 0, at least 2 rows.
 */
export function parseNkCsv(text: string, label: string): NkColumns {
  const t = parseNumericTable(text, label);
  const scale = WAVELENGTH_HEADERS[t.header[0]!];
  if (scale === undefined) {
    throw new InputError(
      `${label}: first header column is "${t.header[0]}"; expected wavelength_nm or wavelength_um (header e.g. "wavelength_nm,n,k")`,
    );
  }
  const rest = t.header.slice(1);
  const iN = rest.indexOf("n");
  const iK = rest.indexOf("k");
  const unknown = rest.filter((h) => h !== "n" && h !== "k");
  if (unknown.length > 0 || (iN < 0 && iK < 0) || new Set(rest).size !== rest.length) {
    throw new InputError(`${label}: header columns after the wavelength must be n, k or both (got "${t.header.join(",")}")`);
  }
  if (t.columns[0]!.length < 2) throw new InputError(`${label}: needs at least 2 data rows, found ${t.columns[0]!.length}`);
  requireEach(t, 0, (v) => v > 0, "a positive wavelength");
  requireStrictlyIncreasing(t, 0);
  if (iN >= 0) requireEach(t, iN + 1, (v) => v > 0, "n > 0");
  if (iK >= 0) requireEach(t, iK + 1, (v) => v >= 0, "k ≥ 0");
  const wavelengthNm = scale === 1 ? t.columns[0]! : t.columns[0]!.map((v) => v * scale);
  return {
    wavelengthNm,
    n: iN >= 0 ? t.columns[iN + 1]! : null,
    k: iK >= 0 ? t.columns[iK + 1]! : null,
  };
}
