import { InputError } from "../util/errors.js";
import type { HeightGrid } from "../study/stackTypes.js";

/**
 * Parses a height map CSV: a regular grid of heights in µm, one row per line, comma (or
 * semicolon/tab/space) separated. Blank lines and lines starting with '#' are skipped. Every row
 * must have the same number of cells; every cell must be a finite number. Errors name the file and
 * the line (1-based).
 */
export function parseHeightMapCsv(text: string, fileLabel: string): HeightGrid {
  const lines = text.split(/\r?\n/);
  const values: number[] = [];
  let nx = -1;
  let ny = 0;
  let firstRowLine = 0;
  for (let li = 0; li < lines.length; li++) {
    const line = lines[li].trim();
    if (line === "" || line.startsWith("#")) continue;
    const cells = line.split(/\s*[,;\t]\s*|\s+/);
    if (nx < 0) {
      nx = cells.length;
      firstRowLine = li + 1;
    } else if (cells.length !== nx) {
      throw new InputError(
        `${fileLabel}: line ${li + 1}: expected ${nx} cells (as on line ${firstRowLine}), got ${cells.length}`,
        "a height map must be a regular grid: every row the same length",
      );
    }
    for (let c = 0; c < cells.length; c++) {
      const cell = cells[c];
      const v = cell === "" ? NaN : Number(cell);
      if (!Number.isFinite(v)) {
        throw new InputError(
          `${fileLabel}: line ${li + 1}, column ${c + 1}: expected a number (height in µm), got ${JSON.stringify(cell)}`,
        );
      }
      values.push(v);
    }
    ny++;
  }
  if (nx < 2 || ny < 2) {
    throw new InputError(`${fileLabel}: expected a grid of at least 2 × 2 heights, got ${Math.max(nx, 0)} × ${ny}`);
  }
  return { nx, ny, heightsUm: Float64Array.from(values) };
}
