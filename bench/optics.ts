/**
 * Interface optics figures: calls per second of the exact transfer-matrix row (single-layer ARC on
 * silicon, s and p together), of Fresnel alone and of the table lookup, the table build time, and
 * the table's worst error against the exact rows for representative interfaces.
 */
import { MaterialRegistry } from "../src/materials/registry.js";
import { fresnelInto, FRESNEL_OUT_LENGTH } from "../src/optics/fresnel.js";
import { buildInterfaceTable, lookupInterface } from "../src/optics/interfaceTable.js";
import { filmStackInto, rowStride } from "../src/optics/thinFilm.js";
import { lookupLinearInCos, measureTableError } from "../src/optics/tableError.js";
import type { FilmLayer, NK } from "../src/optics/types.js";

const MIN_SECONDS = 0.8;

/** Runs body(nCalls) in growing rounds until MIN_SECONDS elapse; returns calls per second. */
function rate(body: (nCalls: number) => number): { perSecond: number; sink: number } {
  let n = 1000;
  let sink = 0;
  for (;;) {
    const t0 = process.hrtime.bigint();
    sink += body(n);
    const s = Number(process.hrtime.bigint() - t0) / 1e9;
    if (s >= MIN_SECONDS) return { perSecond: n / s, sink };
    n = Math.ceil(n * Math.min(10, Math.max(2, (1.2 * MIN_SECONDS) / Math.max(s, 1e-6))));
  }
}

const fmtRate = (r: number): string => `${(r / 1e6).toFixed(2)} M/s`;

export async function runOpticsBench(): Promise<void> {
  const reg = MaterialRegistry.withBuiltins();
  const nk = (name: string, wl: number): NK => reg.get(name).nk(wl);
  const wl = 600;
  const si = nk("Si", wl);
  const arc: FilmLayer[] = [{ ...nk("SiNx", wl), thicknessNm: 75 }];
  const out = new Float64Array(rowStride(1));
  // cos values spread over [0, 1] so no branch is favoured
  const nC = 4096;
  const cosList = new Float64Array(nC);
  for (let i = 0; i < nC; i++) cosList[i] = ((i * 2654435761) % nC) / (nC - 1);

  const exact = rate((n) => {
    let s = 0;
    for (let i = 0; i < n; i++) {
      filmStackInto(1, arc, si, wl, cosList[i & (nC - 1)]!, out, 0);
      s += out[0]!;
    }
    return s;
  });
  const fr = new Float64Array(FRESNEL_OUT_LENGTH);
  const fres = rate((n) => {
    let s = 0;
    for (let i = 0; i < n; i++) {
      fresnelInto(1, 0, si.n, si.k, cosList[i & (nC - 1)]!, fr);
      s += fr[8]!;
    }
    return s;
  });
  // table build: first (cold) call, then the mean of warm calls
  let t0 = process.hrtime.bigint();
  const table = buildInterfaceTable({ n: 1, k: 0 }, arc, si, wl, 1024);
  const coldMs = Number(process.hrtime.bigint() - t0) / 1e6;
  const nBuild = 50;
  t0 = process.hrtime.bigint();
  for (let i = 0; i < nBuild; i++) buildInterfaceTable({ n: 1, k: 0 }, arc, si, wl, 1024);
  const buildMs = Number(process.hrtime.bigint() - t0) / 1e6 / nBuild;
  const look = rate((n) => {
    let s = 0;
    for (let i = 0; i < n; i++) {
      lookupInterface(table, i & 1, cosList[i & (nC - 1)]!, out, 0);
      s += out[0]!;
    }
    return s;
  });

  process.stdout.write(`exact transfer matrix, air|SiNx 75 nm|Si at 600 nm, s+p row: ${fmtRate(exact.perSecond)}\n`);
  process.stdout.write(`exact Fresnel, air|Si, s+p amplitudes and powers:          ${fmtRate(fres.perSecond)}\n`);
  process.stdout.write(`table lookup (nCos 1024, both directions alternating):      ${fmtRate(look.perSecond)}\n`);
  process.stdout.write(`table build (1024 rows per direction + critical band):       ${buildMs.toFixed(2)} ms (first call ${coldMs.toFixed(1)} ms)\n`);

  const cases: { label: string; upper: NK; films: FilmLayer[]; lower: NK; wl: number; dirs: ("down" | "up")[] }[] = [
    { label: "air|SiNx 75 nm|Si, 600 nm", upper: nk("air", 600), films: [{ ...nk("SiNx", 600), thicknessNm: 75 }], lower: nk("Si", 600), wl: 600, dirs: ["down", "up"] },
    { label: "Si|Ag, 1000 nm (from Si)", upper: nk("Si", 1000), films: [], lower: nk("Ag", 1000), wl: 1000, dirs: ["down"] },
    { label: "EVA|SiNx 75 nm|Si, 600 nm", upper: nk("EVA", 600), films: [{ ...nk("SiNx", 600), thicknessNm: 75 }], lower: nk("Si", 600), wl: 600, dirs: ["down", "up"] },
    { label: "glass|air, 600 nm", upper: nk("glass", 600), films: [], lower: nk("air", 600), wl: 600, dirs: ["down", "up"] },
    { label: "Si|SiO2 100 nm|Al, 1000 nm (from Si)", upper: nk("Si", 1000), films: [{ ...nk("SiO2", 1000), thicknessNm: 100 }], lower: nk("Al", 1000), wl: 1000, dirs: ["down"] },
  ];
  process.stdout.write(`\nworst |table − exact| over all channels (20000 off-node probes + probes at the critical angle):\n`);
  process.stdout.write(`${"interface".padEnd(40)}  ${"1024".padStart(9)}  ${"4096".padStart(9)}  ${"1024 lin-cos".padStart(12)}\n`);
  let worst1024 = 0;
  for (const c of cases) {
    const cols: string[] = [];
    for (const nCos of [1024, 4096]) {
      const t = buildInterfaceTable(c.upper, c.films, c.lower, c.wl, nCos);
      const e = measureTableError(t, c.upper, c.films, c.lower, c.wl, 20000, c.dirs);
      if (nCos === 1024) worst1024 = Math.max(worst1024, e.worstAbsError);
      cols.push(e.worstAbsError.toExponential(2).padStart(9));
    }
    const t = buildInterfaceTable(c.upper, c.films, c.lower, c.wl, 1024);
    const lin = measureTableError(t, c.upper, c.films, c.lower, c.wl, 20000, c.dirs, lookupLinearInCos);
    process.stdout.write(`${c.label.padEnd(40)}  ${cols.join("  ")}  ${lin.worstAbsError.toExponential(2).padStart(12)}\n`);
  }
  process.stdout.write(`table worst error (nCos 1024, lookupInterface): ${worst1024.toExponential(2)}\n`);
  if (!Number.isFinite(exact.sink + fres.sink + look.sink)) process.stdout.write("(sink)\n");
}
