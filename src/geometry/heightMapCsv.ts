import { readCsvRows } from "../util/csvRows.js";
import { InputError } from "../util/errors.js";
import type { HeightGrid } from "../study/stackTypes.js";

/** Largest |height| of a height map, µm (a surface texture is microns to tens of microns deep). */
export const MAX_HEIGHT_UM = 10_000;
/** Most cells of a height map (4 × 10⁶: a 2000 × 2000 scan). */
export const MAX_HEIGHT_CELLS = 4_000_000;

/**
 * Parses a height map CSV: a regular grid of heights in µm, one row per line, comma (or
 * semicolon/tab/space) separated (readCsvRows). Blank lines and lines starting with '#' are
 * skipped. Every row must have the same number of cells; every cell must be a finite number.
 * Errors name the file and the line (1-based).
 */
export function parseHeightMapCsv(text: string, fileLabel: string): HeightGrid {
  const rows = readCsvRows(text, fileLabel);
  const nx = rows.length > 0 ? rows[0]!.cells.length : 0;
  const ny = rows.length;
  if (nx * ny > MAX_HEIGHT_CELLS) throw new InputError(`${fileLabel}: ${nx} × ${ny} heights, more than ${MAX_HEIGHT_CELLS} (resample the map; an AFM scan is typically 512 × 512)`);
  const heightsUm = new Float64Array(nx * ny);
  for (let j = 0; j < ny; j++) {
    const { cells, line } = rows[j]!;
    if (cells.length !== nx) {
      throw new InputError(
        `${fileLabel}: line ${line}: expected ${nx} cells (as on line ${rows[0]!.line}), got ${cells.length}`,
        "a height map must be a regular grid: every row the same length",
      );
    }
    for (let c = 0; c < nx; c++) {
      const cell = cells[c]!;
      const v = cell === "" ? NaN : Number(cell);
      if (!Number.isFinite(v)) {
        throw new InputError(
          `${fileLabel}: line ${line}, column ${c + 1}: expected a number (height in µm), got ${JSON.stringify(cell)}`,
        );
      }
      if (Math.abs(v) > MAX_HEIGHT_UM) {
        throw new InputError(`${fileLabel}: line ${line}, column ${c + 1}: expected a height within ±${MAX_HEIGHT_UM} µm, got ${v}`);
      }
      heightsUm[j * nx + c] = v;
    }
  }
  if (nx < 2 || ny < 2) {
    throw new InputError(`${fileLabel}: expected a grid of at least 2 × 2 heights, got ${nx} × ${ny}`);
  }
  return { nx, ny, heightsUm };
}
