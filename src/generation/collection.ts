import { readCsvRows } from "../util/csvRows.js";
import { InputError } from "../util/errors.js";

/** Collection probability η(z) as a table (depth µm ascending, η in [0, 1]). */
export interface CollectionCurve {
  depthUm: Float64Array;
  eta: Float64Array;
}

/**
 * A collection-probability CSV: header `depth_um,collection`, then rows with depth ascending and η
 * in [0, 1]. `label` names the file in errors (file:line).
 */
export function parseCollectionCsv(text: string, label: string): CollectionCurve {
  const rows = readCsvRows(text, label);
  if (rows.length < 2) throw new InputError(`${label}: expected a header depth_um,collection and at least one row`);
  const head = rows[0].cells.map((c) => c.toLowerCase());
  if (head[0] !== "depth_um" || head[1] !== "collection") {
    throw new InputError(`${label}:${rows[0].line}: expected the header depth_um,collection, got ${rows[0].cells.join(",")}`);
  }
  const depth: number[] = [];
  const eta: number[] = [];
  for (const r of rows.slice(1)) {
    const z = Number(r.cells[0]);
    const e = Number(r.cells[1]);
    if (r.cells.length < 2 || !Number.isFinite(z) || z < 0 || (depth.length > 0 && !(z > depth[depth.length - 1]))) {
      throw new InputError(`${label}:${r.line}: expected a depth in µm, ≥ 0 and above the previous row, got "${r.cells[0] ?? ""}"`);
    }
    if (!(e >= 0 && e <= 1)) throw new InputError(`${label}:${r.line}: expected a collection probability in [0, 1], got "${r.cells[1] ?? ""}"`);
    depth.push(z);
    eta.push(e);
  }
  return { depthUm: Float64Array.from(depth), eta: Float64Array.from(eta) };
}

/** η at each depth: linear between the rows, the end values beyond them. */
export function collectionAt(curve: CollectionCurve, depthsUm: ArrayLike<number>): Float64Array {
  const { depthUm: z, eta } = curve;
  const out = new Float64Array(depthsUm.length);
  for (let i = 0; i < depthsUm.length; i++) {
    const d = depthsUm[i];
    if (d <= z[0]) out[i] = eta[0];
    else if (d >= z[z.length - 1]) out[i] = eta[eta.length - 1];
    else {
      let k = 1;
      while (z[k] < d) k++;
      const t = (d - z[k - 1]) / (z[k] - z[k - 1]);
      out[i] = eta[k - 1] + t * (eta[k] - eta[k - 1]);
    }
  }
  return out;
}
