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

/** "Wavelength (nm)" / "wavelength [nm]" / "wavelength_nm" → "wavelength_nm"; "N" → "n". */
export function normalizeHeaderCell(cell: string): string {
  return cell
    .trim()
    .replace(/^"(.*)"$/, "$1")
    .toLowerCase()
    .replace(/\s*[([]\s*([^)\]]*?)\s*[)\]]\s*$/, "_$1")
    .replace(/\s+/g, "_");
}

/**
 * Parses text holding '#' comment lines, blank lines, one header line and rows of numbers.
 * Fields are separated by commas, tabs or semicolons (chosen from the header line). Every error
 * names `label` (the file) and the line number.
 */
export function parseNumericTable(text: string, label: string): NumericTable {
  const rawLines = text.split(/\r?\n/);
  let header: string[] | null = null;
  let sep: RegExp = /,/;
  const rows: number[][] = [];
  const lineNos: number[] = [];
  for (let li = 0; li < rawLines.length; li++) {
    const line = rawLines[li]!.replace(/^\uFEFF/, "").trim();
    const lineNo = li + 1;
    if (line === "" || line.startsWith("#")) continue;
    if (header === null) {
      sep = line.includes(",") ? /,/ : line.includes("\t") ? /\t/ : line.includes(";") ? /;/ : /\s+/;
      header = line.split(sep).map(normalizeHeaderCell);
      if (header.some((h) => h === "")) throw new InputError(`${label}:${lineNo}: empty column name in header "${line}"`);
      continue;
    }
    const fields = line.split(sep).map((f) => f.trim());
    if (fields.length !== header.length) {
      throw new InputError(
        `${label}:${lineNo}: row has ${fields.length} fields, the header (${header.join(",")}) has ${header.length}`,
      );
    }
    const row: number[] = [];
    for (let c = 0; c < fields.length; c++) {
      const f = fields[c]!;
      if (!NUMBER.test(f)) {
        throw new InputError(`${label}:${lineNo}: column "${header[c]}": "${f}" is not a number`);
      }
      row.push(Number(f));
    }
    rows.push(row);
    lineNos.push(lineNo);
  }
  if (header === null) throw new InputError(`${label}: no header line found (expected e.g. "wavelength_nm,n,k")`);
  const columns = header.map((_, c) => Float64Array.from(rows, (r) => r[c]!));
  return { header, columns, lines: Int32Array.from(lineNos), label };
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
