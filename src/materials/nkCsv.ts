import { InputError } from "../util/errors.js";
import { C_LIGHT_MS, H_PLANCK_JS, Q_ELEMENTARY_C } from "../util/math.js";
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
const ENERGY_HEADERS = new Set(["energy_ev", "photon_energy_ev"]);
/**
 * Largest n or k accepted: metals reach k ≈ 100 in the far infrared (e.g. Ag, Au tables), nothing
 * optical comes near 1000; a value beyond is a typing or unit mistake (and would overflow e^(−4πkd/λ)).
 */
export const MAX_NK = 1000;
/** Most data rows of an n,k table (a published table has hundreds to a few thousand). */
export const MAX_NK_ROWS = 100_000;
/** hc in eV·nm from the exact SI constants (λ[nm] = HC_EV_NM / E[eV]). */
const HC_EV_NM = ((H_PLANCK_JS * C_LIGHT_MS) / Q_ELEMENTARY_C) * 1e9;

/**
 * Parses an optical-constants CSV: '#' comment lines, a header whose first column is
 * `wavelength_nm`, `wavelength_um` or `energy_eV` (ellipsometry exports; "Wavelength (nm)" style
 * headers are accepted) followed by `n`, `k` or both, then one row per point. Wavelengths strictly
 * increasing (energies strictly monotonic, either way), n > 0, k ≥ 0, at least 2 rows.
 */
export function parseNkCsv(text: string, label: string): NkColumns {
  // Counted before parsing, so an oversized table is refused without building its rows.
  let lines = 0;
  for (let i = text.indexOf("\n"); i >= 0 && lines <= MAX_NK_ROWS + 1000; i = text.indexOf("\n", i + 1)) lines++;
  if (lines > MAX_NK_ROWS + 1000) throw new InputError(`${label}: more than ${MAX_NK_ROWS} data rows (thin the table; the tracer interpolates)`);
  const t = parseNumericTable(text, label);
  const scale = WAVELENGTH_HEADERS[t.header[0]!];
  const energy = ENERGY_HEADERS.has(t.header[0]!);
  if (scale === undefined && !energy) {
    throw new InputError(
      `${label}: first header column is ${JSON.stringify(t.header[0]!.slice(0, 40))}; expected wavelength_nm, wavelength_um or energy_eV (header e.g. "wavelength_nm,n,k")`,
    );
  }
  const rest = t.header.slice(1);
  const iN = rest.indexOf("n");
  const iK = rest.indexOf("k");
  const unknown = rest.filter((h) => h !== "n" && h !== "k");
  if (unknown.length > 0 || (iN < 0 && iK < 0) || new Set(rest).size !== rest.length) {
    throw new InputError(`${label}: header columns after the wavelength must be n, k or both (got ${JSON.stringify(t.header.join(",").slice(0, 60))})`);
  }
  if (t.columns[0]!.length < 2) throw new InputError(`${label}: needs at least 2 data rows, found ${t.columns[0]!.length}`);
  if (t.columns[0]!.length > MAX_NK_ROWS) throw new InputError(`${label}: ${t.columns[0]!.length} data rows, more than ${MAX_NK_ROWS} (thin the table; the tracer interpolates)`);
  requireEach(t, 0, (v) => v > 0 && v <= 1e7, energy ? "a positive photon energy" : "a wavelength in (0, 10⁷]");
  if (iN >= 0) requireEach(t, iN + 1, (v) => v > 0 && v <= MAX_NK, `0 < n ≤ ${MAX_NK}`);
  if (iK >= 0) requireEach(t, iK + 1, (v) => v >= 0 && v <= MAX_NK, `0 ≤ k ≤ ${MAX_NK}`);
  const n = iN >= 0 ? t.columns[iN + 1]! : null;
  const k = iK >= 0 ? t.columns[iK + 1]! : null;
  if (!energy) {
    requireStrictlyIncreasing(t, 0);
    const wavelengthNm = scale === 1 ? t.columns[0]! : t.columns[0]!.map((v) => v * scale!);
    return { wavelengthNm, n, k };
  }
  // Photon energies (either order, strictly monotonic) → wavelengths in increasing order.
  const e = t.columns[0]!;
  const falling = e[1]! < e[0]!;
  for (let i = 1; i < e.length; i++) {
    if (falling ? !(e[i]! < e[i - 1]!) : !(e[i]! > e[i - 1]!)) {
      throw new InputError(`${label}:${t.lines[i]}: energy ${e[i]} eV breaks the monotonic order of line ${t.lines[i - 1]} (energies must be strictly increasing or strictly decreasing)`);
    }
  }
  const order = Array.from(e, (_, i) => (falling ? i : e.length - 1 - i));
  const pick = (col: Float64Array | null) => (col === null ? null : Float64Array.from(order, (i) => col[i]!));
  return { wavelengthNm: Float64Array.from(order, (i) => HC_EV_NM / e[i]!), n: pick(n), k: pick(k) };
}
