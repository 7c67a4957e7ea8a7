import { readCsvRows } from "../util/csvRows.js";
import { InputError } from "../util/errors.js";

/** A numeric CSV table: header names (lower-cased, trimmed), one Float64Array per column, source lines. */
export interface NumericTable {
  header: string[];
  columns: Float64Array[];
  /** 1-based line number in the file of each data row (for messages). */
  lines: Int32Array;
  label: string;
}

// Strict decimal number: optional sign, digits with optional fraction, optional exponent.
const NUMBER = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/;

/**
 * "Wavelength (nm)" / "wavelength [nm]" / "Wavelength, nm" / "wavelength_nm" → "wavelength_nm";
 * "N" → "n". (Cells arrive unquoted from the CSV reader.)
 */
export function normalizeHeaderCell(cell: string): string {
  return cell
    .trim()
    .toLowerCase()
    .replace(/\s*[([]\s*([^)\]]*?)\s*[)\]]\s*$/, "_$1")
    .replace(/\s*,\s*/g, "_")
    .replace(/\s+/g, "_");
}

/**
 * Parses text holding '#' comment lines, blank lines, one header line and rows of numbers
 * (readCsvRows: quoted cells allowed; commas, tabs, semicolons or spaces, chosen from the header
 * line). Every error names `label` (the file) and the line number.
 */
export function parseNumericTable(text: string, label: string): NumericTable {
  const rows = readCsvRows(text, label);
  if (rows.length === 0) throw new InputError(`${label}: no header line found (expected e.g. "wavelength_nm,n,k")`);
  const head = rows[0]!;
  const header = head.cells.map(normalizeHeaderCell);
  if (header.some((h) => h === "")) {
    throw new InputError(`${label}:${head.line}: empty column name in header "${head.cells.join(",")}"`);
  }
  const nRows = rows.length - 1;
  const columns = header.map(() => new Float64Array(nRows));
  const lines = new Int32Array(nRows);
  for (let r = 0; r < nRows; r++) {
    const { cells, line } = rows[r + 1]!;
    if (cells.length !== header.length) {
      throw new InputError(
        `${label}:${line}: row has ${cells.length} fields, the header (${header.join(",")}) has ${header.length}`,
      );
    }
    for (let c = 0; c < cells.length; c++) {
      const f = cells[c]!;
      if (!NUMBER.test(f)) throw new InputError(`${label}:${line}: column "${header[c]}": "${f}" is not a number`);
      columns[c]![r] = Number(f);
    }
    lines[r] = line;
  }
  return { header, columns, lines, label };
}

/** Throws unless column `c` is strictly increasing (names the offending line). */
export function requireStrictlyIncreasing(t: NumericTable, c: number): void {
  const x = t.columns[c]!;
  for (let i = 1; i < x.length; i++) {
    if (!(x[i]! > x[i - 1]!)) {
      throw new InputError(
        `${t.label}:${t.lines[i]}: ${t.header[c]} ${x[i]} is not greater than ${x[i - 1]} on line ${t.lines[i - 1]} (wavelengths must be strictly increasing)`,
      );
    }
  }
}

/** Throws unless every value of column `c` satisfies `ok` (names the offending line). */
export function requireEach(t: NumericTable, c: number, ok: (v: number) => boolean, expected: string): void {
  const x = t.columns[c]!;
  for (let i = 0; i < x.length; i++) {
    if (!ok(x[i]!)) throw new InputError(`${t.label}:${t.lines[i]}: ${t.header[c]} = ${x[i]}; expected ${expected}`);
  }
}

/**
 * Parses a two-column spectral table `wavelength_nm,<column>` (`shownHeader` is the header as the
 * message spells it): at least 2 rows, wavelengths positive and strictly increasing, every value
 * passing `ok`. Errors name `label` and the line.
 */
export function parseWavelengthSeries(
  text: string,
  label: string,
  column: string,
  shownHeader: string,
  ok: (v: number) => boolean,
  expected: string,
): { wavelengthNm: Float64Array; values: Float64Array } {
  const t = parseNumericTable(text, label);
  if (t.header.length !== 2 || t.header[0] !== "wavelength_nm" || t.header[1] !== column) {
    throw new InputError(`${label}: header is "${t.header.join(",")}"; expected "${shownHeader}"`);
  }
  if (t.columns[0]!.length < 2) throw new InputError(`${label}: needs at least 2 data rows, found ${t.columns[0]!.length}`);
  requireEach(t, 0, (v) => v > 0, "a positive wavelength");
  requireStrictlyIncreasing(t, 0);
  requireEach(t, 1, ok, expected);
  return { wavelengthNm: t.columns[0]!, values: t.columns[1]! };
}
