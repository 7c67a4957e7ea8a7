import { describe, expect, it } from "vitest";
import { filmStack, filmStackInto, rowStride } from "../../src/optics/thinFilm.js";
import { FRESNEL_RP, FRESNEL_RS, FRESNEL_TP, FRESNEL_TS, fresnel } from "../../src/optics/fresnel.js";
import type { FilmLayer, FilmResult } from "../../src/optics/types.js";
import { DEG } from "../../src/util/math.js";

const sum = (a: Float64Array): number => a.reduce((s, x) => s + x, 0);
const balanceS = (r: FilmResult): number => r.Rs + r.Ts + sum(r.As) - 1;
const balanceP = (r: FilmResult): number => r.Rp + r.Tp + sum(r.Ap) - 1;

describe("filmStack(n0, films, nExit, wavelengthNm, cosTheta0)", () => {
  it("without films equals the single-interface Fresnel result, also into an absorbing medium", () => {
    // same physics through a different path: Fresnel (Born & Wolf §1.5) vs characteristic matrices
    for (const [n0, ne, ke] of [[1, 1.5, 0], [1, 3.94, 0.0199], [3.572, 0.04, 6.992], [1.52, 1, 0]] as const) {
      for (const c of [1, 0.8, 0.5, 0.2, 0.05]) {
        const r = filmStack(n0, [], { n: ne, k: ke }, 600, c);
        const f = fresnel(n0, 0, ne, ke, c);
        expect(r.Rs).toBeCloseTo(f[FRESNEL_RS]!, 13);
        expect(r.Rp).toBeCloseTo(f[FRESNEL_RP]!, 13);
        expect(r.Ts).toBeCloseTo(f[FRESNEL_TS]!, 13);
        expect(r.Tp).toBeCloseTo(f[FRESNEL_TP]!, 13);
      }
    }
  });

  it("meets the quarter-wave minimum R = ((n0·ns − n1²)/(n0·ns + n1²))² at normal incidence", () => {
    // Macleod, Thin-Film Optical Filters §3.2 (single quarter-wave layer)
    const wl = 600;
    for (const [n0, n1, ns] of [[1, 2.0, 3.94], [1, 1.9849, 3.94], [1.5, 2.09, 3.94], [1, 1.45, 1.52]] as const) {
      const r = filmStack(n0, [{ n: n1, k: 0, thicknessNm: wl / (4 * n1) }], { n: ns, k: 0 }, wl, 1);
      const expected = ((n0 * ns - n1 * n1) / (n0 * ns + n1 * n1)) ** 2;
      expect(r.Rs).toBeCloseTo(expected, 13);
      expect(r.Rp).toBeCloseTo(expected, 13);
      // it is the minimum over thickness for n0 < n1 < ns (common practice: quarter-wave ARC)
      if (n0 < n1 && n1 < ns) {
        for (const f of [0.9, 1.1]) {
          const q = filmStack(n0, [{ n: n1, k: 0, thicknessNm: (f * wl) / (4 * n1) }], { n: ns, k: 0 }, wl, 1);
          expect(q.Rs).toBeGreaterThan(r.Rs);
        }
      }
    }
    // zero reflectance for n1 = √(n0·ns)
    const n1 = Math.sqrt(1 * 3.94);
    expect(filmStack(1, [{ n: n1, k: 0, thicknessNm: 600 / (4 * n1) }], { n: 3.94, k: 0 }, 600, 1).Rs).toBeLessThan(1e-28);
  });

  it("gives about 1.3 % for a quarter-wave of MgF2 (1.38) on crown glass (1.52)", () => {
    // Hecht, Optics §9.7.1 worked example: "about 1.3 %" (bare glass: about 4.3 %)
    const wl = 550;
    const r = filmStack(1, [{ n: 1.38, k: 0, thicknessNm: wl / (4 * 1.38) }], { n: 1.52, k: 0 }, wl, 1);
    expect(r.Rs).toBeGreaterThan(0.0125);
    expect(r.Rs).toBeLessThan(0.0135);
    const bare = filmStack(1, [], { n: 1.52, k: 0 }, wl, 1);
    expect(bare.Rs).toBeCloseTo(0.0426, 4);
  });

  it("meets the double quarter-wave formula R = ((n0·n2² − ns·n1²)/(n0·n2² + ns·n1²))²", () => {
    // Macleod §3.3 (quarter–quarter antireflection coating), n1 outer, n2 inner
    const wl = 550;
    for (const [n1, n2, ns] of [[1.38, 1.7, 1.52], [1.45, 2.3, 3.94], [2.09, 1.9, 3.6]] as const) {
      const films: FilmLayer[] = [
        { n: n1, k: 0, thicknessNm: wl / (4 * n1) },
        { n: n2, k: 0, thicknessNm: wl / (4 * n2) },
      ];
      const r = filmStack(1, films, { n: ns, k: 0 }, wl, 1);
      const expected = ((n2 * n2 - ns * n1 * n1) / (n2 * n2 + ns * n1 * n1)) ** 2;
      expect(r.Rs).toBeCloseTo(expected, 13);
    }
  });

  it("treats a half-wave layer as absent, at normal and at oblique incidence", () => {
    // Macleod §2.4 ("absentee layer"): a half-wave of optical thickness n·d·cosθ = λ/2 leaves R unchanged
    const wl = 700;
    const n1 = 2.09;
    for (const thetaDeg of [0, 40, 70]) {
      const c0 = Math.cos(thetaDeg * DEG);
      const s = Math.sin(thetaDeg * DEG);
      const cos1 = Math.sqrt(1 - (s / n1) ** 2);
      const film: FilmLayer = { n: n1, k: 0, thicknessNm: wl / (2 * n1 * cos1) };
      const bare = filmStack(1, [], { n: 3.78, k: 0.0076 }, wl, c0);
      const coated = filmStack(1, [film], { n: 3.78, k: 0.0076 }, wl, c0);
      expect(coated.Rs).toBeCloseTo(bare.Rs, 13);
      expect(coated.Rp).toBeCloseTo(bare.Rp, 13);
      expect(coated.Ts).toBeCloseTo(bare.Ts, 13);
    }
  });

  it("conserves energy R + T + ΣA = 1 to 1e-12 in absorbing stacks", () => {
    // energy conservation (Poynting's theorem): each film's absorptance is the net flux entering it
    const stacks: { films: FilmLayer[]; exit: { n: number; k: number }; wl: number }[] = [
      // heterojunction-like front: ITO on a-Si on c-Si (indices of the order of the tabulated data)
      { films: [{ n: 1.95, k: 0.01, thicknessNm: 80 }, { n: 4.5, k: 0.6, thicknessNm: 8 }], exit: { n: 4.29, k: 0.07 }, wl: 450 },
      // rear: SiO2 then a thin Ag film, Al exit
      { films: [{ n: 1.45, k: 0, thicknessNm: 100 }, { n: 0.05, k: 4.15, thicknessNm: 20 }], exit: { n: 1.2, k: 7.3 }, wl: 620 },
      // a 1 mm absorbing film (huge optical thickness: exercises the overflow guard)
      { films: [{ n: 3.94, k: 0.0199, thicknessNm: 1e6 }], exit: { n: 1, k: 0 }, wl: 600 },
      { films: [{ n: 5.0, k: 4.2, thicknessNm: 1e6 }, { n: 2, k: 0, thicknessNm: 70 }], exit: { n: 5, k: 4.2 }, wl: 300 },
    ];
    for (const { films, exit, wl } of stacks) {
      for (const n0 of [1, 1.5, 3.6]) {
        for (const thetaDeg of [0, 10, 30, 50, 70, 85, 89.9]) {
          const r = filmStack(n0, films, exit, wl, Math.cos(thetaDeg * DEG));
          expect(Math.abs(balanceS(r))).toBeLessThan(1e-12);
          expect(Math.abs(balanceP(r))).toBeLessThan(1e-12);
          for (const v of [r.Rs, r.Rp, r.Ts, r.Tp, ...r.As, ...r.Ap]) {
            expect(v).toBeGreaterThanOrEqual(-1e-14);
            expect(Number.isFinite(v)).toBe(true);
          }
        }
      }
    }
  });

  it("makes a thick absorbing film opaque: R is that of the bare interface, T = 0", () => {
    // Beer–Lambert: transmission through 1 mm of Si at 600 nm is exp(−4πkd/λ) ≈ e^−417 ≈ 0
    const si = { n: 3.94, k: 0.0199 };
    for (const c of [1, 0.6, 0.2]) {
      const r = filmStack(1, [{ ...si, thicknessNm: 1e6 }], { n: 1.5, k: 0 }, 600, c);
      const f = fresnel(1, 0, si.n, si.k, c);
      expect(r.Rs).toBeCloseTo(f[FRESNEL_RS]!, 13);
      expect(r.Rp).toBeCloseTo(f[FRESNEL_RP]!, 13);
      expect(r.Ts).toBeLessThan(1e-150);
      expect(r.As[0]).toBeCloseTo(f[FRESNEL_TS]!, 13);
    }
  });

  it("absorbs the single-pass Beer–Lambert fraction in a weak absorber between index-matched media", () => {
    // no interfaces (same n on both sides, k ≪ n): A = 1 − exp(−4πk·d/(λ cosθ)) (Beer–Lambert, α = 4πk/λ)
    const n = 1.5;
    const k = 1e-5;
    const d = 20000;
    const wl = 500;
    const r = filmStack(n, [{ n, k, thicknessNm: d }], { n, k: 0 }, wl, 1);
    const expected = 1 - Math.exp((-4 * Math.PI * k * d) / wl);
    expect(r.As[0]).toBeCloseTo(expected, 6);
    expect(r.Rs).toBeLessThan(1e-10);
  });

  it("filmStackInto writes the row layout [Rs, Rp, Ts, Tp, As.., Ap..] at an offset", () => {
    const films: FilmLayer[] = [{ n: 2, k: 0.1, thicknessNm: 50 }, { n: 1.5, k: 0.01, thicknessNm: 90 }];
    const r = filmStack(1, films, { n: 3.9, k: 0.02 }, 550, 0.7);
    const row = new Float64Array(3 + rowStride(2));
    filmStackInto(1, films, { n: 3.9, k: 0.02 }, 550, 0.7, row, 3);
    expect(Array.from(row.subarray(3))).toEqual([r.Rs, r.Rp, r.Ts, r.Tp, ...r.As, ...r.Ap]);
  });
});
