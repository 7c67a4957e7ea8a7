import { describe, expect, it } from "vitest";
import {
  buildInterfaceTable,
  interfacePowers,
  interfaceRowInto,
  lookupInterface,
  tableCritCos,
} from "../../src/optics/interfaceTable.js";
import { filmStack } from "../../src/optics/thinFilm.js";
import { measureTableError } from "../../src/optics/tableError.js";
import { DIR_DOWN, DIR_UP, type FilmLayer, type NK } from "../../src/optics/types.js";

// Tabulated indices used below (data/materials/, see data/SOURCES.md):
// Si, Green 2008: 600 nm n = 3.940, k = 0.01993; 1000 nm n = 3.572, k = 5.093e-4
// SiNx, Vogt 2015 (n = 2.09 film): 600 nm n = 2.094, k = 0
// EVA, Vogt 2016 (EVASKY S87): 600 nm n = 1.493, k = 3.34e-7
// Ag, Johnson & Christy 1972: 984 nm n = 0.04, k = 6.992
// glass, Rubin 1985 low-iron: n ≈ 1.52 (formula), k = 1.087e-7 at 600 nm
const air: NK = { n: 1, k: 0 };
const si600: NK = { n: 3.94, k: 0.01993 };
const si1000: NK = { n: 3.572, k: 5.093e-4 };
const sinx75: FilmLayer = { n: 2.094, k: 0, thicknessNm: 75 };
const eva: NK = { n: 1.493, k: 3.34e-7 };
const ag: NK = { n: 0.04, k: 6.992 };
const glass: NK = { n: 1.52, k: 1.087e-7 };

const rowSum = (r: Float64Array, off: number, stride: number, pol: 0 | 1, nF: number): number => {
  let s = r[off + pol]! + r[off + 2 + pol]!;
  for (let j = 0; j < nF; j++) s += r[off + 4 + pol * nF + j]!;
  return s;
};

describe("buildInterfaceTable(upper, films, lower, wavelengthNm, nCos)", () => {
  it("holds the exact rows at cosθ = i/(nCos − 1) for both directions, each summing to 1", () => {
    const films: FilmLayer[] = [sinx75, { n: 4.5, k: 0.3, thicknessNm: 10 }];
    const t = buildInterfaceTable(air, films, si600, 600, 65);
    expect(t.stride).toBe(8);
    expect(t.down.length).toBe(65 * 8);
    for (const i of [0, 1, 17, 40, 64]) {
      const c = i / 64;
      const d = filmStack(1, films, si600, 600, c);
      expect(t.down[i * 8]).toBe(d.Rs);
      expect(t.down[i * 8 + 3]).toBe(d.Tp);
      expect(t.down[i * 8 + 4]).toBe(d.As[0]);
      // up: from Si (incidence index Re n) into air through the films in reverse order;
      // absorptances are stored in the caller's film order
      const u = filmStack(si600.n, films.slice().reverse(), air, 600, c);
      const cc = tableCritCos(si600.n, air);
      const beyond = c <= cc;
      expect(t.up[i * 8]).toBeCloseTo(beyond ? u.Rs + u.Ts : u.Rs, 15);
      expect(t.up[i * 8 + 2]).toBe(beyond ? 0 : u.Ts);
      expect(t.up[i * 8 + 4]).toBe(u.As[1]);
      expect(t.up[i * 8 + 5]).toBe(u.As[0]);
      expect(t.up[i * 8 + 7]).toBe(u.Ap[0]);
      for (const rows of [t.down, t.up]) {
        expect(rowSum(rows, i * 8, 8, 0, 2)).toBeCloseTo(1, 13);
        expect(rowSum(rows, i * 8, 8, 1, 2)).toBeCloseTo(1, 13);
      }
    }
  });

  it("has Ts = Tp = 0 beyond the critical angle sinθc = n_exit/n0 and none towards silver", () => {
    // critical angle: Hecht §4.7. Si (3.94) → air: cosθc = √(1 − 1/3.94²) = 0.96721
    const t = buildInterfaceTable(air, [sinx75], si600, 600, 1024);
    expect(t.cosCritDown).toBe(-1);
    expect(t.cosCritUp).toBeCloseTo(Math.sqrt(1 - 1 / 3.94 ** 2), 14);
    const out = new Float64Array(t.stride);
    for (const c of [0, 0.3, 0.9, 0.967, t.cosCritUp]) {
      lookupInterface(t, DIR_UP, c, out);
      expect(out[2]).toBe(0);
      expect(out[3]).toBe(0);
      expect(out[0]).toBeCloseTo(1, 14); // lossless film: total internal reflection
    }
    lookupInterface(t, DIR_UP, 0.99, out);
    expect(out[2]).toBeGreaterThan(0.5);
    // silver is metal-like (k > n): light from silicon is partly absorbed at every angle
    const rear = buildInterfaceTable(si1000, [], ag, 1000, 256);
    expect(rear.cosCritDown).toBe(-1);
    for (let i = 1; i < 256; i++) expect(rear.down[i * 4 + 2]).toBeGreaterThan(0);
  });

  it("lookupInterface returns the stored rows at the nodes and interpolates between them", () => {
    const t = buildInterfaceTable(eva, [sinx75], si600, 600, 129);
    const out = new Float64Array(t.stride);
    for (const i of [0, 5, 64, 100, 128]) {
      lookupInterface(t, DIR_DOWN, i / 128, out);
      for (let k = 0; k < t.stride; k++) expect(out[k]).toBeCloseTo(t.down[i * t.stride + k]!, 14);
    }
    // halfway between two nodes below cosθc/2: the mean of the two rows
    lookupInterface(t, DIR_UP, 10.5 / 128, out);
    for (let k = 0; k < t.stride; k++) {
      expect(out[k]).toBeCloseTo(0.5 * (t.up[10 * t.stride + k]! + t.up[11 * t.stride + k]!), 14);
    }
    // clamps outside [0, 1]
    lookupInterface(t, DIR_DOWN, 1.2, out);
    expect(out[0]).toBe(t.down[128 * t.stride]);
  });

  it("stays within 1e-4 of the exact rows for the representative interfaces at nCos = 1024", () => {
    // error bound measured for this implementation (recorded in the developer notes): 6.2e-5 worst,
    // near the critical angle; probes are off-node points plus points 1e-9..1e-3 from cosθc
    const cases: [NK, FilmLayer[], NK, number, ("down" | "up")[]][] = [
      [air, [sinx75], si600, 600, ["down", "up"]],
      [si1000, [], ag, 1000, ["down"]], // "up" would be light arriving from inside the metal
      [eva, [sinx75], si600, 600, ["down", "up"]],
      [glass, [], air, 600, ["down", "up"]],
    ];
    for (const [u, f, l, wl, dirs] of cases) {
      const t = buildInterfaceTable(u, f, l, wl, 1024);
      const e = measureTableError(t, u, f, l, wl, 4000, dirs);
      expect(e.worstAbsError).toBeLessThan(1e-4);
      expect(e.nProbes).toBeGreaterThanOrEqual(4000);
    }
  });

  it("interpolates better with more rows (second order away from the critical angle)", () => {
    // linear interpolation error scales as h² (any numerical-analysis text)
    const e256 = measureTableError(buildInterfaceTable(air, [sinx75], si600, 600, 256), air, [sinx75], si600, 600, 3000, ["down"]);
    const e1024 = measureTableError(buildInterfaceTable(air, [sinx75], si600, 600, 1024), air, [sinx75], si600, 600, 3000, ["down"]);
    const ratio = e256.worstAbsError / e1024.worstAbsError;
    expect(ratio).toBeGreaterThan(12);
    expect(ratio).toBeLessThan(20);
  });

  it("interfaceRowInto counts a weakly absorbing exit medium (k ≤ 1e-3 n) as lossless", () => {
    const a = new Float64Array(4);
    const b = new Float64Array(4);
    interfaceRowInto(3.94, [], glass, 600, 0.99, tableCritCos(3.94, glass), a);
    interfaceRowInto(3.94, [], { n: glass.n, k: 0 }, 600, 0.99, tableCritCos(3.94, glass), b);
    expect(Array.from(a)).toEqual(Array.from(b));
  });

  it("interpolated rows conserve energy and are continuous across the critical angle", () => {
    // linear interpolation of rows that each sum to 1 sums to 1; the critical angle is a band node
    const films: FilmLayer[] = [{ n: 2.2, k: 0.05, thicknessNm: 60 }];
    const t = buildInterfaceTable(glass, films, si600, 450, 512);
    const out = new Float64Array(t.stride);
    for (let j = 0; j <= 3000; j++) {
      const c = j / 3000;
      for (const dir of [DIR_DOWN, DIR_UP]) {
        lookupInterface(t, dir, c, out);
        expect(rowSum(out, 0, t.stride, 0, 1)).toBeCloseTo(1, 13);
        expect(rowSum(out, 0, t.stride, 1, 1)).toBeCloseTo(1, 13);
      }
    }
    const cc = t.cosCritUp;
    const below = new Float64Array(t.stride);
    const above = new Float64Array(t.stride);
    lookupInterface(t, DIR_UP, cc - 1e-12, below);
    lookupInterface(t, DIR_UP, cc + 1e-12, above);
    // on both sides the table follows the exact row (which itself moves as √(c − cc) above cc)
    const ex = new Float64Array(t.stride);
    for (const [c, got] of [[cc - 1e-12, below], [cc + 1e-12, above]] as const) {
      interfaceRowInto(si600.n, films, glass, 450, c, cc, ex);
      for (let k = 0; k < t.stride; k++) expect(Math.abs(got[k]! - ex[k]!)).toBeLessThan(1e-6);
    }
    lookupInterface(t, DIR_UP, cc, out);
    expect(out[2]).toBe(0);
  });

  it("is finite exactly at a lossless critical angle and at grazing incidence", () => {
    // at θc the exit medium's normal component vanishes (ηp = N²/(N cosθ) diverges): R = 1
    const cc = Math.sqrt(1 - (1 / 1.5) ** 2);
    for (const films of [[], [sinx75]]) {
      const r = filmStack(1.5, films, air, 600, cc);
      expect(r.Rs).toBeCloseTo(1, 12);
      expect(r.Rp).toBeCloseTo(1, 12);
      const g = filmStack(1.5, films, air, 600, 0);
      expect([g.Rs, g.Rp, g.Ts, g.Tp]).toEqual([1, 1, 0, 0]);
    }
  });

  it("rejects a table with fewer than two rows", () => {
    expect(() => buildInterfaceTable(air, [], si600, 600, 1)).toThrow(RangeError);
  });
});

describe("interfacePowers: plain Fresnel where the table is plain, the table elsewhere", () => {
  // A direction without films into a lossless exit samples the plain Fresnel result (Born & Wolf,
  // Principles of Optics §1.5.2); interfacePowers must give the row interfaceRowInto computes there
  // (the table's exact source) at any angle, total reflection included, and the interpolated row
  // (lookupInterface) wherever films or an absorbing exit make the row more than plain Fresnel.
  const exactRow = (n0: number, films: FilmLayer[], exit: NK, cos: number, cosCrit: number): Float64Array => {
    const out = new Float64Array(4 + 2 * films.length);
    interfaceRowInto(n0, films, exit, 1000, cos, cosCrit, out, 0);
    return out;
  };
  it("Si (1000 nm, k below the lossless limit) | air and glass | EVA: both directions plain, equal to the exact row", () => {
    for (const [upper, lower] of [[air, si1000], [glass, eva]] as [NK, NK][]) {
      const t = buildInterfaceTable(upper, [], lower, 1000, 64);
      expect(t.plainDown && t.plainUp).toBe(true);
      const outDown = new Float64Array(4);
      const outUp = new Float64Array(4);
      let worst = 0;
      for (let i = 0; i <= 4000; i++) {
        const c = i / 4000;
        interfacePowers(t, DIR_DOWN, c, outDown);
        interfacePowers(t, DIR_UP, c, outUp);
        const dn = exactRow(upper.n, [], lower, c, tableCritCos(upper.n, lower));
        const up = exactRow(lower.n, [], upper, c, tableCritCos(lower.n, upper));
        for (let k = 0; k < 4; k++) worst = Math.max(worst, Math.abs(outDown[k]! - dn[k]!), Math.abs(outUp[k]! - up[k]!));
      }
      expect(worst).toBeLessThan(1e-12);
    }
    // beyond the critical angle of Si → air: total reflection
    const t = buildInterfaceTable(air, [], si1000, 1000, 64);
    const out = new Float64Array(4);
    interfacePowers(t, DIR_UP, 0.5, out);
    expect(Array.from(out)).toEqual([1, 1, 0, 0]);
  });
  it("films or an absorbing exit: the interpolated row", () => {
    const coated = buildInterfaceTable(air, [sinx75], si600, 600, 256);
    const lossy = buildInterfaceTable(air, [], si600, 600, 256);
    expect(coated.plainDown || coated.plainUp).toBe(false);
    expect(lossy.plainDown).toBe(false); // into Si at 600 nm, k = 0.02 > 1e-3·n
    expect(lossy.plainUp).toBe(true); // out of it into air
    for (const [t, dir] of [[coated, DIR_DOWN], [coated, DIR_UP], [lossy, DIR_DOWN]] as const) {
      for (const c of [0.05, 0.3, 0.77, 0.999]) {
        const a = new Float64Array(t.stride);
        const b = new Float64Array(t.stride);
        interfacePowers(t, dir, c, a);
        lookupInterface(t, dir, c, b);
        expect(Array.from(a)).toEqual(Array.from(b));
      }
    }
  });
});
