import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { filmStack } from "../../src/optics/thinFilm.js";
import { buildInterfaceTable, lookupInterface } from "../../src/optics/interfaceTable.js";
import { dataPath } from "../../src/util/packageRoot.js";

/** Rows of a wavelength_nm,n,k table (comment lines start with #). */
function readNk(file: string): { wl: number; n: number; k: number }[] {
  const lines = readFileSync(dataPath("materials", file), "utf8").split(/\r?\n/);
  const rows: { wl: number; n: number; k: number }[] = [];
  for (const line of lines) {
    if (line.startsWith("#") || line.trim() === "" || line.startsWith("wavelength")) continue;
    const [a, b, c] = line.split(",").map(Number);
    rows.push({ wl: a!, n: b!, k: c! });
  }
  return rows;
}

describe("silver mirror from the Johnson & Christy (1972) n, k table", () => {
  const ag = readNk("ag_johnson_christy1972.csv");

  it("reflects |(N − 1)/(N + 1)|² at normal incidence at every tabulated wavelength", () => {
    // closed form for a metal (Born & Wolf §14.2): R = ((n − 1)² + k²)/((n + 1)² + k²)
    expect(ag.length).toBeGreaterThan(40);
    for (const { wl, n, k } of ag) {
      const r = filmStack(1, [], { n, k }, wl, 1);
      expect(r.Rs).toBeCloseTo(((n - 1) ** 2 + k * k) / ((n + 1) ** 2 + k * k), 13);
      expect(r.Rs + r.Ts).toBeCloseTo(1, 14);
    }
  });

  it("reflects more than 95 % from 500 to 1100 nm and dips near 320 nm (fact of the trade, from memory)", () => {
    for (const { wl, n, k } of ag) {
      const r = filmStack(1, [], { n, k }, wl, 1).Rs;
      if (wl >= 500 && wl <= 1100) expect(r).toBeGreaterThan(0.95);
      if (wl > 315 && wl < 325) expect(r).toBeLessThan(0.2);
    }
  });

  it("an optically thick silver film behaves as a silver exit medium", () => {
    // skin depth λ/(4πk) ≈ 12 nm at 617 nm: the wave returning from the back of a 600 nm film has
    // amplitude e^{−2·2πkd/λ} ≈ 1e-22, so reflectance and absorptance match the semi-infinite metal
    const row = ag.find((x) => x.wl === 616.8)!;
    const film = filmStack(1.5, [{ n: row.n, k: row.k, thicknessNm: 600 }], { n: 1, k: 0 }, row.wl, 0.8);
    const bulk = filmStack(1.5, [], { n: row.n, k: row.k }, row.wl, 0.8);
    expect(film.Rs).toBeCloseTo(bulk.Rs, 12);
    expect(film.Ap[0]).toBeCloseTo(bulk.Tp, 12);
    expect(film.Ts).toBeLessThan(1e-20);
  });

  it("a silicon | silver rear reflector table absorbs the rest in the metal", () => {
    // at 984 nm: Si (Green 2008, interpolated) n ≈ 3.58, k ≈ 8e-4; Ag n = 0.04, k = 6.992
    const row = ag.find((x) => x.wl === 984)!;
    const t = buildInterfaceTable({ n: 3.58, k: 8e-4 }, [], { n: row.n, k: row.k }, 984, 512);
    const out = new Float64Array(4);
    lookupInterface(t, 0, 1, out);
    const n0 = 3.58;
    const expected = ((n0 - row.n) ** 2 + row.k ** 2) / ((n0 + row.n) ** 2 + row.k ** 2);
    expect(out[0]).toBeCloseTo(expected, 12);
    expect(out[0]! + out[2]!).toBeCloseTo(1, 13);
  });
});
