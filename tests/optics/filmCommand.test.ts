import { mkdtempSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { describe, expect, it } from "vitest";
import { astmG173 } from "../../src/spectrum/index.js";
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

  it("takes constant indices in the stack: air|n=1.5 reflects ((n−1)/(n+1))² = 4 % at normal incidence", async () => {
    // Hecht, Optics, §4.6 (normal-incidence Fresnel reflectance); the same for any spectrum when R is constant
    const r = await run("film", "--stack", "air|n=1.5", "--weighted", "--json");
    expect(r.code).toBe(0);
    const out = JSON.parse(r.out) as { weighted: { perAngle: { reflectance: number; availableMaCm2: number }[] } };
    expect(out.weighted.perAngle[0]!.reflectance).toBeCloseTo(0.04, 12);
    const a = await run("film", "--stack", "air|2.05+0.01i:70|Si", "--json");
    expect((JSON.parse(a.out) as { points: Point[] }).points[0]!.films[0]!.A).toBeGreaterThan(0);
    const bad = await run("film", "--stack", "air|2.05-0.01i:70|Si");
    expect(bad.code).toBe(2);
    expect(bad.err).toMatch(/k must be ≥ 0/);
  });

  it("--polarization s shows the s column only: air|n=1.5 at 60° gives Rs of the Fresnel equations", async () => {
    // Born & Wolf §1.5.2: rs = (n1 cosθi − n2 cosθt)/(n1 cosθi + n2 cosθt)
    const cosI = Math.cos(Math.PI / 3);
    const cosT = Math.sqrt(1 - (Math.sin(Math.PI / 3) / 1.5) ** 2);
    const rs = ((cosI - 1.5 * cosT) / (cosI + 1.5 * cosT)) ** 2;
    const r = await run("film", "--stack", "air|n=1.5", "--angle", "60", "--polarization", "s");
    expect(r.code).toBe(0);
    expect(r.out).toMatch(/^\s+s$/m);
    expect(r.out).not.toMatch(/unpolarised/);
    const R = Number(/^R\s+([\d.]+)$/m.exec(r.out)![1]);
    expect(R).toBeCloseTo(rs, 6);
  });

  it("--weighted gives the photon-weighted reflectance of a single layer: Airy formula × ASTM G173 photon flux", async () => {
    // Single-film reflectance (Macleod, Thin-Film Optical Filters, ch. 2; Airy summation, from memory):
    // R = (r1² + r2² + 2 r1 r2 cos 2δ)/(1 + r1² r2² + 2 r1 r2 cos 2δ), δ = 2π n1 d/λ.
    // Photon flux Φ ∝ E·λ (ASTM G173 global tilt, read here from its own table); on a 1 nm grid both
    // integrals are trapezoid sums over the same nodes.
    const [n0, n1, n2, d] = [1, 1.9, 3.6, 80];
    const r1 = (n0 - n1) / (n0 + n1);
    const r2 = (n1 - n2) / (n1 + n2);
    const R = (l: number): number => {
      const c = Math.cos((4 * Math.PI * n1 * d) / l);
      return (r1 * r1 + r2 * r2 + 2 * r1 * r2 * c) / (1 + r1 * r1 * r2 * r2 + 2 * r1 * r2 * c);
    };
    const g = astmG173("global");
    let num = 0;
    let den = 0;
    for (let i = 1; i < g.wavelengthNm.length; i++) {
      const [a, b] = [g.wavelengthNm[i - 1]!, g.wavelengthNm[i]!];
      if (a < 400 || b > 800) continue;
      const [pa, pb] = [g.irradianceWm2PerNm[i - 1]! * a, g.irradianceWm2PerNm[i]! * b];
      num += 0.5 * (b - a) * (R(a) * pa + R(b) * pb);
      den += 0.5 * (b - a) * (pa + pb);
    }
    const r = await run("film", "--stack", `air|n=${n1}:${d}|n=${n2}`, "--wavelength", "400:800:1", "--weighted", "AM1.5G", "--json");
    expect(r.code).toBe(0);
    const w = (JSON.parse(r.out) as { weighted: { spectrum: string; perAngle: { reflectance: number }[] } }).weighted;
    expect(w.spectrum).toBe("AM1.5G");
    expect(w.perAngle[0]!.reflectance).toBeCloseTo(num / den, 10);
    const text = await run("film", "--stack", "EVA|SiNx:75|Si", "--weighted");
    expect(text.out).toMatch(/photon-weighted reflectance, 300–1200 nm under AM1.5G \(unpolarised; R linear between the 181 wavelengths\):\n  0°: \d+\.\d{3} % \(/);
    const one = await run("film", "--stack", "air|Si", "--wavelength", "600", "--weighted");
    expect(one.code).toBe(2);
    expect(one.err).toMatch(/--weighted needs at least two wavelengths/);
  });

  it("uses a user n,k table (--nk, quoted header) and a study's materials (--study)", async () => {
    const dir = mkdtempSync(join(tmpdir(), "lf-film-"));
    writeFileSync(join(dir, "coat.csv"), '"Wavelength, nm",n,k\n400,1.5,0\n800,1.5,0\n');
    const r = await run("film", "--stack", "air|coat", "--nk", `coat=${join(dir, "coat.csv")}`, "--json");
    expect(r.code).toBe(0);
    expect((JSON.parse(r.out) as { points: Point[] }).points[0]!.R).toBeCloseTo(0.04, 12);
    const study = {
      name: "s", materials: [{ name: "myCoat", constant: { n: 1.5 } }],
      stack: { front: {}, absorber: { thicknessUm: 100 }, rear: { ideal: { kind: "mirror" } } },
      grid: { thetaDeg: [0], wavelengthNm: [600] }, rays: { perPoint: 10, batch: 10 }, seed: 1,
    };
    writeFileSync(join(dir, "s.study.json"), JSON.stringify(study));
    const s = await run("film", "--stack", "air|myCoat", "--study", join(dir, "s.study.json"), "--json");
    expect(s.code).toBe(0);
    expect((JSON.parse(s.out) as { points: Point[] }).points[0]!.R).toBeCloseTo(0.04, 12);
  });
});
