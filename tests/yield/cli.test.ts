import { existsSync, mkdtempSync, readFileSync, readdirSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { beforeAll, describe, expect, it } from "vitest";
import { runMain } from "../helpers/cli.js";
import { writeResponseMatrix } from "../../src/response/matrixFile.js";
import { makeMatrix, range } from "./matrixFixture.js";

let dir = "";
const SITE = "configs/sites/brevenmark.site.json";

beforeAll(() => {
  dir = mkdtempSync(join(tmpdir(), "lightfold-yield-"));
  writeResponseMatrix(join(dir, "a.matrix.json"), makeMatrix({ thetaDeg: range(0, 85, 5), absorber: (t) => 0.92 * Math.cos(t * Math.PI / 200), stderr: 0.002, name: "textured" }));
  writeResponseMatrix(join(dir, "b.matrix.json"), makeMatrix({ thetaDeg: range(0, 85, 5), absorber: (t) => 0.85 * Math.cos(t * Math.PI / 190), stderr: 0.002, name: "planar" }));
  writeResponseMatrix(join(dir, "short.matrix.json"), makeMatrix({ thetaDeg: range(0, 60, 10), absorber: () => 0.9 }));
});

let out = "";
/** `lightfold <args>` in this process: its exit code; stdout then stderr are kept in `out`. */
async function run(...args: string[]): Promise<number> {
  const r = await runMain(...args);
  out = r.out + r.err;
  return r.code;
}

describe("lightfold weather / yield / compare", () => {
  it("weather writes a synthetic year that yield reads back; yield writes <run>/yield/yield-<site>.json", async () => {
    const csv = join(dir, "w.csv");
    expect(await run("weather", "--site", SITE, "--year", "2027", "--seed", "7", "--out", csv)).toBe(0);
    expect(readFileSync(csv, "utf8").split("\n").filter((l) => /^\d{4}-/.test(l))).toHaveLength(8760);
    const runDir = join(dir, "run");
    expect(await run("yield", "--matrix", join(dir, "a.matrix.json"), "--site", SITE, "--weather", csv, "--tilt", "0:90:45", "--run-dir", runDir)).toBe(0);
    const doc = JSON.parse(readFileSync(join(runDir, "yield", "yield-brevenmark.json"), "utf8"));
    expect(doc.kind).toBe("lightfold.yield");
    expect(doc.results).toHaveLength(3);
    expect(doc.results[0].monthly).toHaveLength(12);
    expect(doc.best.tiltDeg).toBe(45);
  });

  it("yield --hourly writes one row per hour whose currents sum to the yearly charge", async () => {
    const hourly = join(dir, "hours.csv"), res = join(dir, "one.json");
    expect(await run("yield", "--matrix", join(dir, "a.matrix.json"), "--site", SITE, "--weather", join(dir, "w.csv"), "--tilt", "35", "--hourly", hourly, "--out", res)).toBe(0);
    const rows = readFileSync(hourly, "utf8").trim().split("\n");
    expect(rows[0]).toBe("time,zenith_deg,azimuth_deg,incidence_deg,ghi_wm2,dni_wm2,dhi_wm2,poa_wm2,current_am2");
    expect(rows).toHaveLength(8761);
    const total = rows.slice(1).reduce((a, r) => a + Number(r.split(",")[8]), 0);
    const doc = JSON.parse(readFileSync(res, "utf8"));
    expect(Math.abs(total / doc.results[0].chargeAhM2 - 1)).toBeLessThan(1e-4); // rows rounded to 1 mA/m²
    expect(await run("weather", "--site", SITE, "--check", join(dir, "w.csv"))).toBe(0);
    expect(out).toMatch(/8760 hourly records, a full year/);
  });

  it("compare writes <run>/yield/compare.json with a benefit row per site and tilt", async () => {
    const runDir = join(dir, "cmp");
    const code = await run("compare", "--matrix", join(dir, "a.matrix.json"), "--matrix", join(dir, "b.matrix.json"), "--site", SITE, "--site", "configs/sites/tessarit-reg.site.json", "--tilt", "20,35", "--run-dir", runDir);
    expect(code).toBe(0);
    const doc = JSON.parse(readFileSync(join(runDir, "yield", "compare.json"), "utf8"));
    expect(doc.kind).toBe("lightfold.compare");
    expect(doc.rows).toHaveLength(4);
    for (const r of doc.rows) {
      expect(r.benefitPct).toBeGreaterThan(0);
      expect(r.benefitStdErrPct).toBeGreaterThan(0);
      expect(r.benefitErrorKind).toBe("independent");
    }
    // matrices without pairing groups: the independent error, and the file says why
    expect(doc.pairing.errorKind).toBe("independent");
    expect(doc.pairing.reason).toMatch(/a\.matrix\.json has no pairing groups/);
  });

  it("exits 2 and writes nothing on bad input: short θ grid, tilt > 180, latitude > 90, unknown time zone, weather gaps", async () => {
    const target = join(dir, "bad.json");
    const a = join(dir, "a.matrix.json");
    const badSite = (patch: Record<string, unknown>): string => {
      const p = join(dir, `s${Object.keys(patch)[0]}.site.json`);
      writeFileSync(p, JSON.stringify({ ...JSON.parse(readFileSync(SITE, "utf8")), ...patch }));
      return p;
    };
    const lines = readFileSync(join(dir, "w.csv"), "utf8").split("\n");
    lines.splice(1000, 1);
    const gapped = join(dir, "gap.csv");
    writeFileSync(gapped, lines.join("\n"));
    const cases: [string[], RegExp][] = [
      [["--matrix", join(dir, "short.matrix.json"), "--site", SITE], /missing 60–80°/],
      [["--matrix", a, "--site", SITE, "--tilt", "200"], /outside 0–180/],
      [["--matrix", a, "--site", badSite({ latitudeDeg: 95 })], /latitudeDeg/],
      [["--matrix", a, "--site", badSite({ utcOffsetHours: "Europe/Oslo" })], /unknown time zone form/],
      [["--matrix", a, "--site", SITE, "--weather", gapped], /missing hour/],
    ];
    for (const [args, msg] of cases) {
      expect(await run("yield", ...args, "--out", target)).toBe(2);
      expect(out).toMatch(msg);
      expect(existsSync(target)).toBe(false);
    }
    expect(readdirSync(dir).some((f) => f.endsWith(".tmp"))).toBe(false);
  });
});
