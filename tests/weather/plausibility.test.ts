import { mkdtempSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { beforeAll, describe, expect, it } from "vitest";
import { writeResponseMatrix } from "../../src/response/matrixFile.js";
import { siteFromObject } from "../../src/site/site.js";
import { readSiteFile } from "../../src/site/siteFile.js";
import { extraterrestrialNormalWm2 } from "../../src/sky/irradianceBasics.js";
import { sunTrack } from "../../src/sky/sunPosition.js";
import {
  checkPlausibility,
  EXTREMELY_RARE,
  PHYSICALLY_POSSIBLE,
  recogniseUnitMistake,
  upperLimitWm2,
} from "../../src/weather/plausibility.js";
import { checkAgainstSun } from "../../src/weather/sunChecks.js";
import { syntheticWeather } from "../../src/weather/synthetic.js";
import { parseWeatherCsv, weatherToCsv } from "../../src/weather/weatherCsv.js";
import type { WeatherYear } from "../../src/weather/weatherYear.js";
import { runMain } from "../helpers/cli.js";
import { inputErrorOf } from "../helpers/inputError.js";
import { makeMatrix, range } from "../yield/matrixFixture.js";

const SITE = "configs/sites/brevenmark.site.json";
let dir = "";
let yearCsv = "";
beforeAll(() => {
  dir = mkdtempSync(join(tmpdir(), "lf-plaus-"));
  yearCsv = weatherToCsv(syntheticWeather(readSiteFile(SITE), 2027, 7), 1, "+01:00", ["synthetic"]);
  writeResponseMatrix(join(dir, "a.matrix.json"), makeMatrix({ thetaDeg: range(0, 85, 5), absorber: (t) => 0.9 * Math.cos((t * Math.PI) / 200), stderr: 0.002 }));
});

/** The synthetic year with its data rows mapped (line text → line text). */
function edited(edit: (row: string[], line: number) => string[] | undefined): string {
  return yearCsv.split("\n").map((l, i) => {
    if (!/^\d{4}-/.test(l)) return l;
    const out = edit(l.split(","), i + 1);
    return out === undefined ? l : out.join(",");
  }).join("\n");
}

describe("limits of Long & Shi (2008), BSRN recommended QC tests V2.0", () => {
  it("evaluate the published forms scale·Sa·μ0^exp + offset", () => {
    // By hand from the paper's table: GHI PPL at z = 0, Sa = 1367: 1.5·1367 + 100 = 2150.5;
    // DHI PPL at z = 60°: 0.95·1367·0.5^1.2 + 50; DNI PPL = Sa at any zenith; DNI ERL at z = 60°:
    // 0.95·1367·0.5^0.2 + 10; GHI ERL with the sun down: the offset alone, 50.
    expect(upperLimitWm2(PHYSICALLY_POSSIBLE.ghi, 0, 1367)).toBeCloseTo(2150.5, 9);
    expect(upperLimitWm2(PHYSICALLY_POSSIBLE.dhi, 60, 1367)).toBeCloseTo(0.95 * 1367 * Math.pow(0.5, 1.2) + 50, 9);
    expect(upperLimitWm2(PHYSICALLY_POSSIBLE.dni, 89, 1367)).toBe(1367);
    expect(upperLimitWm2(EXTREMELY_RARE.dni, 60, 1367)).toBeCloseTo(0.95 * 1367 * Math.pow(0.5, 0.2) + 10, 9);
    expect(upperLimitWm2(EXTREMELY_RARE.ghi, 100, 1367)).toBe(50);
  });

  it("pass the project's synthetic years of all three sites without an error or a unit mistake", () => {
    for (const s of ["brevenmark", "nordvik-fjell", "tessarit-reg"]) {
      const site = readSiteFile(`configs/sites/${s}.site.json`);
      const w = syntheticWeather(site, 2027, 3);
      const track = sunTrack(w.hourStartUtcMs, site.latitudeDeg, site.longitudeDeg);
      const e0n = Array.from(track.dayOfYear, (d) => extraterrestrialNormalWm2(d));
      const r = checkPlausibility(w, track.zenithDeg, e0n);
      expect(r.errorCount, s).toBe(0);
      expect(r.unitMistake, s).toBeUndefined();
      // Clear hours of a real-sky year: kt99 between 0.6 and 0.9 (common practice).
      expect(r.kt99).toBeGreaterThan(0.6);
      expect(r.kt99).toBeLessThan(0.9);
    }
  });
});

describe("implausible weather files are refused (exit 2) with the line", () => {
  it("one hour of GHI = DNI = 10⁶, DHI = 10⁵: `weather --check` and `yield` refuse it, naming the line", async () => {
    let target = 0;
    const text = edited((r, line) => (r[0]!.startsWith("2027-06-15T12") ? ((target = line), [r[0]!, "1000000", "1000000", "100000"]) : undefined));
    const file = join(dir, "huge.csv");
    writeFileSync(file, text);
    const check = await runMain("weather", "--site", SITE, "--check", file);
    expect(check.code).toBe(2);
    expect(check.err).toContain(file);
    expect(check.err).toMatch(new RegExp(`line ${target} \\(2027-06-15T11:00Z\\): ghi_wm2 1000000 is outside the physically possible range`));
    const y = await runMain("yield", "--matrix", join(dir, "a.matrix.json"), "--site", SITE, "--weather", file, "--tilt", "35");
    expect(y.code).toBe(2);
    expect(y.out).toBe("");
    expect(y.err).toMatch(/3 value\(s\) beyond the physically possible limits/);
  });

  it("a whole year in kJ/m² (×3.6), kW/m² (÷1000) or MJ/m² is recognised and named", async () => {
    const cases: [number, RegExp][] = [[3.6, /look like kJ\/m² per hour/], [1e-3, /look like kW\/m²/], [3.6e-3, /look like MJ\/m² per hour/]];
    for (const [factor, named] of cases) {
      const file = join(dir, `units-${factor}.csv`);
      writeFileSync(file, edited((r) => [r[0]!, ...r.slice(1, 4).map((v) => String(Number(v) * factor))]));
      const r = await runMain("weather", "--site", SITE, "--check", file);
      expect(r.code, String(factor)).toBe(2);
      expect(r.err).toMatch(named);
      expect(r.err).toContain(file);
    }
  });

  it("rare values and closure failures are warnings with counts and the first line", () => {
    const site = siteFromObject({ name: "Flats", latitudeDeg: 45, longitudeDeg: 7, utcOffsetHours: 1, albedo: 0.2 }, "f.site.json");
    // 21 June, 13:00 local at 45° N: z ≈ 22°, E0n ≈ 1322: DHI ERL = 0.75·1322·cos^1.2 z + 30 ≈ 936.
    const text = ["time,ghi_wm2,dni_wm2,dhi_wm2", "2027-06-21T13:00+01:00,1000,70,950", "2027-06-21T14:00+01:00,1000,70,950"].join("\n");
    const w = parseWeatherCsv(text, "rare.csv");
    checkAgainstSun(w, sunTrack(w.hourStartUtcMs, site.latitudeDeg, site.longitudeDeg));
    expect(w.warnings.join("\n")).toMatch(/2 hour\(s\) with dhi_wm2 beyond the extremely rare limit .*first: line 2 \(2027-06-21T12:00Z\)/);
  });

  it("an error lists at most 12 lines and counts the rest", () => {
    const w: WeatherYear = {
      source: "many.csv",
      hourStartUtcMs: Float64Array.from({ length: 20 }, (_, i) => Date.UTC(2027, 5, 21, 10) + i * 3_600_000),
      ghiWm2: new Float64Array(20).fill(5000), dniWm2: new Float64Array(20), dhiWm2: new Float64Array(20), warnings: [],
    };
    const msg = inputErrorOf(() => checkAgainstSun(w, sunTrack(w.hourStartUtcMs, 45, 7)));
    expect(msg).toMatch(/^many\.csv: 20 value\(s\) beyond the physically possible limits/);
    expect(msg.split("\n").filter((l) => l.includes("record "))).toHaveLength(12);
    expect(msg).toMatch(/… and 8 more$/);
  });

  it("kt99 inside the W/m² band names no unit; outside it, the unit whose factor brings it back", () => {
    expect(recogniseUnitMistake(0.8)).toBeUndefined();
    expect(recogniseUnitMistake(0.8 * 3.6)?.factor).toBe(3.6);
    expect(recogniseUnitMistake(0.8e-3)?.factor).toBe(1e-3);
    expect(recogniseUnitMistake(NaN)).toBeUndefined();
  });
});

describe("one bad weather line", () => {
  it("is reported once, without a false missing hour after it", () => {
    const lines = yearCsv.split("\n");
    const k = lines.findIndex((l) => l.startsWith("2027-03-01T12"));
    lines[k] = lines[k]!.replace(/,[^,]*$/, ",abc");
    const msg = inputErrorOf(() => parseWeatherCsv(lines.join("\n"), "one-bad.csv"));
    expect(msg).toMatch(new RegExp(`^one-bad\\.csv: 1 problem\\(s\\) in the weather file:\\n  line ${k + 1}: dhi_wm2 "abc" is not a number$`));
  });
});
