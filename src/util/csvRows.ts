import { CsvError, parse } from "csv-parse/sync";
import { InputError } from "./errors.js";

/** One record of a CSV file: its cells (trimmed strings) and the 1-based line it ends on. */
export interface CsvRow {
  cells: string[];
  line: number;
}

/** Field separators lightfold accepts; "whitespace" = runs of spaces or tabs. */
export type CsvDelimiter = "," | ";" | "\t" | "whitespace";

/**
 * Picks the separator from the first line that is neither blank nor a '#' comment, ignoring
 * anything inside double quotes (so a header `"Wavelength, nm";n;k` is semicolon-separated).
 */
export function detectDelimiter(text: string): CsvDelimiter {
  for (const raw of text.split(/\r?\n/)) {
    const line = raw.replace(/^\uFEFF/, "").trim();
    if (line === "" || line.startsWith("#")) continue;
    const bare = line.replace(/"(?:[^"]|"")*"/g, "");
    if (bare.includes(",")) return ",";
    if (bare.includes("\t")) return "\t";
    if (bare.includes(";")) return ";";
    return "whitespace";
  }
  return ",";
}

/**
 * The one CSV reader for user and shipped files (csv-parse): RFC 4180 quoting, a byte-order mark,
 * blank lines and lines starting with '#' skipped, cells trimmed. Rows keep their line number so
 * callers can name it; malformed quoting is an InputError "<label>:<line>: …".
 */
export function readCsvRows(text: string, label: string, delimiter: CsvDelimiter = detectDelimiter(text)): CsvRow[] {
  const white = delimiter === "whitespace";
  let records: { record: string[]; info: { lines: number } }[];
  try {
    records = parse(text, {
      bom: true,
      comment: "#",
      comment_no_infix: true,
      delimiter: white ? [" ", "\t"] : delimiter,
      info: true,
      relax_column_count: true,
      skip_empty_lines: true,
      trim: !white, // trimming would swallow a space separator; empty cells are dropped below
    }) as unknown as { record: string[]; info: { lines: number } }[];
  } catch (err) {
    if (err instanceof CsvError) {
      const line = (err as CsvError & { lines?: number }).lines;
      throw new InputError(
        `${label}:${line ?? "?"}: not readable as CSV (${err.message.replace(/^[^:]*:\s*/, "").replace(/ at line \d+/, "")})`,
        "quote a cell that holds the separator with double quotes, and close every quote on the same row",
      );
    }
    throw err;
  }
  const rows: CsvRow[] = [];
  for (const { record, info } of records) {
    const cells = white ? record.filter((c) => c !== "") : record;
    // a line of spaces only is blank, as an empty one is
    if (cells.length === 0 || (cells.length === 1 && cells[0] === "")) continue;
    rows.push({ cells, line: info.lines });
  }
  return rows;
}
