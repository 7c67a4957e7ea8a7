import { describe, expect, it } from "vitest";
import { runMain as run } from "../helpers/cli.js";

interface Point { wavelengthNm: number; angleDeg: number; Rs: number; Rp: number; R: number; T: number; Ts: number; Tp: number; films: { As: number; Ap: number; A: number }[] }

describe("lightfold film", () => {
  it("prints Rs, Rp, R, T and film absorptance for air|SiNx:75|Si at 600 nm", async () => {
    const r = await run("film", "--stack", "air|SiNx:75|Si", "--wavelength", "600", "--angle", "0");
    expect(r.code).toBe(0);
    expect(r.out).toMatch(/air \| SiNx \(SiNx-Vogt2015-n2\.09\) 75 nm \| Si \(Si-Green2008\)/);
    expect(r.out).toMatch(/^R\s+0\.\d{6}\s+0\.\d{6}\s+0\.\d{6}$/m);
    expect(r.out).toMatch(/^T \(into Si\)\s/m);
    expect(r.out).toMatch(/^A film 1 SiNx 75 nm\s/m);
  });

  it("--json gives the numbers; a 75 nm SiNx coating cuts silicon's reflectance at 600 nm below 2 %", async () => {
    // common practice: a ~75 nm SiNx ARC is tuned for a minimum near 600 nm; bare Si reflects ~35 %
    const r = await run("film", "--stack", "air|SiNx:75|Si", "--wavelength", "600", "--json");
    expect(r.code).toBe(0);
    const p = (JSON.parse(r.out) as { points: Point[] }).points[0]!;
    expect(p.R).toBeLessThan(0.02);
    expect(p.R).toBeCloseTo(0.5 * (p.Rs + p.Rp), 15);
    expect(p.R + p.T + p.films[0]!.A).toBeCloseTo(1, 12);
    const bare = (JSON.parse((await run("film", "--stack", "air|Si", "--json")).out) as { points: Point[] }).points[0]!;
    expect(bare.R).toBeGreaterThan(0.3);
    expect(bare.R).toBeLessThan(0.4);
  });

  it("sweeps wavelengths × angles into a table", async () => {
    const r = await run("film", "--stack", "EVA|SiNx:70|Si", "--wavelength", "500:700:100", "--angle", "0,60");
    expect(r.code).toBe(0);
    const lines = r.out.split("\n").filter((l) => /^\d/.test(l));
    expect(lines.length).toBe(6);
    expect(r.out).toMatch(/wavelength_nm\s+angle_deg\s+Rs\s+Rp\s+R\s+T\s+A1_SiNx/);
  });

  it("shows total internal reflection from glass into air beyond the critical angle", async () => {
    // Hecht §4.7: sinθc = 1/n ≈ 1/1.51 → 41.4°
    const r = await run("film", "--stack", "glass|air", "--angle", "30,60", "--json");
    const [a, b] = (JSON.parse(r.out) as { points: Point[] }).points;
    expect(a!.T).toBeGreaterThan(0.9);
    expect(b!.R).toBeCloseTo(1, 12);
    expect(b!.T).toBe(0);
  });

  it("exits 2 with a message naming the problem on bad input", async () => {
    const cases: [string[], RegExp][] = [
      [["--stack", "air|Unobtainium:75|Si"], /unknown material "Unobtainium"/],
      [["--stack", "air|SiNx:-5|Si"], /negative/],
      [["--stack", "air|SiNx:5e6|Si"], /not a coherent film/],
      [["--stack", "air/SiNx:75/Si"], /expected "incidence\|material:thicknessNm/],
      [["--stack", "air|Si", "--wavelength", "5000"], /Si-Green2008.*5000 nm is outside/],
      [["--stack", "air|Si", "--angle", "-3"], /--angle: -3 deg is outside/],
    ];
    for (const [args, re] of cases) {
      const r = await run("film", ...args);
      expect(r.code, args.join(" ")).toBe(2);
      expect(r.err, args.join(" ")).toMatch(re);
      expect(r.out).toBe("");
    }
  });
});
