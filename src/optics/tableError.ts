import type { FilmLayer, InterfaceTable, NK } from "./types.js";
import { buildInterfaceTable, interfaceRowInto, lookupInterface } from "./interfaceTable.js";

export interface TableErrorReport {
  /** Largest |table − exact| over all channels, both directions and the probe points. */
  worstAbsError: number;
  /** Where it occurs. */
  worstDirection: "down" | "up";
  worstCosTheta: number;
  /** Row channel index (0 Rs, 1 Rp, 2 Ts, 3 Tp, 4.. As, then Ap). */
  worstChannel: number;
  nProbes: number;
}

/**
 * Worst interpolation error of a table against the exact row: probes at nDense cell-offset points
 * (c = (j + 0.37)/nDense) plus points within 1e-9..1e-3 of each critical angle, both directions.
 */
export function measureTableError(
  table: InterfaceTable,
  upper: NK,
  films: readonly FilmLayer[],
  lower: NK,
  wavelengthNm: number,
  nDense = 20000,
  directions: readonly ("down" | "up")[] = ["down", "up"],
  lookup: (table: InterfaceTable, dirFlag: number, cosTheta: number, out: Float64Array) => void = lookupInterface,
): TableErrorReport {
  const stride = table.stride;
  const exact = new Float64Array(stride);
  const approx = new Float64Array(stride);
  const nF = films.length;
  const reversed = films.slice().reverse();
  let worst = 0;
  let worstDir: "down" | "up" = "down";
  let worstCos = 0;
  let worstCh = 0;
  let nProbes = 0;
  for (let dir = 0; dir < 2; dir++) {
    if (!directions.includes(dir === 0 ? "down" : "up")) continue;
    const n0 = dir === 0 ? upper.n : lower.n;
    const exit = dir === 0 ? lower : upper;
    const stack = dir === 0 ? films : reversed;
    const cc = dir === 0 ? table.cosCritDown : table.cosCritUp;
    const probes: number[] = [];
    for (let j = 0; j < nDense; j++) probes.push((j + 0.37) / nDense);
    if (cc > 0) for (const e of [1e-9, 1e-7, 1e-5, 1e-4, 3e-4, 1e-3]) probes.push(cc - e, cc + e);
    for (const c of probes) {
      if (c < 0 || c > 1) continue;
      nProbes++;
      interfaceRowInto(n0, stack, exit, wavelengthNm, c, cc, exact, 0);
      lookup(table, dir, c, approx);
      for (let ch = 0; ch < stride; ch++) {
        // exact rows of the up direction list films in reverse; the table uses the caller's order
        let ex = exact[ch]!;
        if (dir === 1 && ch >= 4) {
          const pol = ch < 4 + nF ? 0 : 1;
          const jTable = ch - 4 - pol * nF;
          ex = exact[4 + pol * nF + (nF - 1 - jTable)]!;
        }
        const e = Math.abs(approx[ch]! - ex);
        if (e > worst) {
          worst = e;
          worstDir = dir === 0 ? "down" : "up";
          worstCos = c;
          worstCh = ch;
        }
      }
    }
  }
  return { worstAbsError: worst, worstDirection: worstDir, worstCosTheta: worstCos, worstChannel: worstCh, nProbes };
}

/** Builds a table and measures it (convenience for the benchmark and the docs). */
export function tableErrorFor(
  upper: NK,
  films: readonly FilmLayer[],
  lower: NK,
  wavelengthNm: number,
  nCos: number,
  nDense = 20000,
  directions: readonly ("down" | "up")[] = ["down", "up"],
): TableErrorReport {
  const table = buildInterfaceTable(upper, films, lower, wavelengthNm, nCos);
  return measureTableError(table, upper, films, lower, wavelengthNm, nDense, directions);
}

/** Plain linear interpolation in cosθ on the main rows only (reference for what the band buys). */
export function lookupLinearInCos(table: InterfaceTable, dirFlag: number, cosTheta: number, out: Float64Array): void {
  const rows = dirFlag === 0 ? table.down : table.up;
  const m = table.nCos - 1;
  const c = cosTheta < 0 ? 0 : cosTheta > 1 ? 1 : cosTheta;
  let i = Math.floor(c * m);
  if (i >= m) i = m - 1;
  const w = c * m - i;
  const a = i * table.stride;
  for (let k = 0; k < table.stride; k++) out[k] = rows[a + k]! + w * (rows[a + table.stride + k]! - rows[a + k]!);
}
