import { parse } from "csv-parse/sync";

/** RFC 4180 reading by csv-parse (a general-purpose reference library), independent of our writer. */
export function parseCsv(text: string): string[][] {
  return parse(text, { relax_column_count: true }) as string[][];
}
