import { mkdtempSync, readFileSync, writeFileSync, existsSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { beforeAll, describe, expect, it } from "vitest";
import { runMain } from "../helpers/cli.js";
import { writeResponseMatrix } from "../../src/response/matrixFile.js";
import { makeMatrix, range } from "./matrixFixture.js";

let dir = "";
const SITE = "configs/sites/brevenmark.site.json";
let out = "";
/** `lightfold <args>` in this process: its exit code; stdout then stderr are kept in `out`. */
async function run(...args: string[]): Promise<number> {
  const r = await runMain(...args);
  out = r.out + r.err;
  return r.code;
}

beforeAll(() => {
  dir = mkdtempSync(join(tmpdir(), "lightfold-station-"));
  writeResponseMatrix(join(dir, "a.matrix.json"), makeMatrix({ thetaDeg: range(0, 85, 5), absorber: (t, _p, l) => 0.9 * Math.cos(t * Math.PI / 200) * (l < 1100 ? 1 : 0.3), stderr: 0.002 }));
});

describe("yield --weather with EPW and TMY3 files", () => {
  it("gives the same year as the lightfold CSV it was written from (hour-ending ↔ hour-starting stamps)", async () => {
    const csv = join(dir, "w.csv"), epw = join(dir, "w.epw"), tmy = join(dir, "w.tmy3.csv");
    expect(await run("weather", "--site", SITE, "--out", csv)).toBe(0);
    expect(await run("weather", "--site", SITE, "--format", "epw", "--out", epw)).toBe(0);
    expect(await run("weather", "--site", SITE, "--format", "tmy3", "--out", tmy)).toBe(0);
    const charge = async (weather: string, withSite: boolean): Promise<number> => {
      const res = join(dir, `r-${Math.random()}.json`);
      const args = ["yield", "--matrix", join(dir, "a.matrix.json"), "--weather", weather, "--tilt", "35", "--out", res];
      if (withSite) args.push("--site", SITE);
      expect(await run(...args)).toBe(0);
      return JSON.parse(readFileSync(res, "utf8")).results[0].chargeAhM2;
    };
    const qCsv = await charge(csv, true);
    // EPW/TMY3 store whole Wh/m² (the CSV 0.1 W/m²): the yearly charge agrees to rounding
    expect(Math.abs((await charge(epw, false)) / qCsv - 1)).toBeLessThan(2e-4);
    expect(Math.abs((await charge(tmy, true)) / qCsv - 1)).toBeLessThan(2e-4);
  });

  it("refuses a site file that names another place than the weather file's header, writing nothing", async () => {
    const epw = join(dir, "w.epw"), res = join(dir, "never.json");
    expect(await run("yield", "--matrix", join(dir, "a.matrix.json"), "--site", "configs/sites/tessarit-reg.site.json", "--weather", epw, "--out", res)).toBe(2);
    expect(out).toMatch(/describe different places or time zones/);
    expect(existsSync(res)).toBe(false);
  });

  it("refuses an unknown weather format with exit 2 naming the file", async () => {
    const bad = join(dir, "bad.txt");
    writeFileSync(bad, "station;lat;lon\nx;1;2\n");
    expect(await run("yield", "--matrix", join(dir, "a.matrix.json"), "--weather", bad)).toBe(2);
    expect(out).toMatch(/bad\.txt: unknown weather file format/);
  });

  it("--spectra clear-sky-model on an EPW file reports the spectral correction per month and year beside the G173-shape charge", async () => {
    const res = join(dir, "spectral.json");
    expect(await run("yield", "--matrix", join(dir, "a.matrix.json"), "--weather", join(dir, "w.epw"), "--tilt", "35", "--spectra", "clear-sky-model", "--out", res)).toBe(0);
    expect(out).toMatch(/spectral %/);
    const doc = JSON.parse(readFileSync(res, "utf8"));
    expect(doc.spectra.mode).toBe("clear-sky-model");
    expect(doc.spectra.hoursWithOwnSpectra).toBeGreaterThan(4000);
    // the EPW sample leaves precipitable water missing: it comes from temperature and humidity
    expect(doc.spectra.assumptions.join(" ")).toMatch(/0 h from the weather file, \d+ h from its temperature and humidity/);
    const c = doc.results[0].spectralCorrection;
    // the run folder's report plots it: one bar per month (barChart marks are <rect> in g.marks)
    const runDir = join(dir, "spec-run");
    expect(await run("yield", "--matrix", join(dir, "a.matrix.json"), "--weather", join(dir, "w.epw"), "--tilt", "35", "--spectra", "clear-sky-model", "--run-dir", runDir)).toBe(0);
    const svg = readFileSync(join(runDir, "report", "spectral-correction.svg"), "utf8");
    const marks = svg.slice(svg.indexOf('class="marks"'));
    expect((marks.match(/<rect/g) ?? []).length).toBeGreaterThanOrEqual(12);
    expect(readFileSync(join(runDir, "report", "index.html"), "utf8")).toMatch(/Spectral correction/);
    expect(c.monthlyPct).toHaveLength(12);
    expect(c.yearPct).toBeCloseTo(100 * (doc.results[0].chargeAhM2 / c.chargeG173ShapesAhM2 - 1), 1);
  });

  it("--spectra <file> reads a measured spectral time series; a bad one exits 2 naming file and line", async () => {
    const spec = join(dir, "measured.csv"), res = join(dir, "measured.json");
    const wl = range(300, 1200, 5);
    const rows = ["time," + wl.join(",")];
    for (let hr = 8; hr < 17; hr++) rows.push(`2027-06-21T${String(hr).padStart(2, "0")}:30:00+01:00,` + wl.map((l) => (1.5 * Math.exp(-(((l - 650) / 400) ** 2))).toFixed(4)).join(","));
    writeFileSync(spec, rows.join("\n") + "\n");
    expect(await run("yield", "--matrix", join(dir, "a.matrix.json"), "--site", SITE, "--weather", join(dir, "w.csv"), "--tilt", "35", "--spectra", spec, "--out", res)).toBe(0);
    const doc = JSON.parse(readFileSync(res, "utf8"));
    expect(doc.spectra.mode).toBe("file");
    expect(doc.spectra.hoursWithOwnSpectra).toBe(9);
    const bad = join(dir, "never2.json");
    const text = rows.join("\n") + "\n";
    writeFileSync(spec, text.replace(/\n(2027-06-21T10:30:00\+01:00,)([^,]+),/, "\n$1-0.5,"));
    expect(await run("yield", "--matrix", join(dir, "a.matrix.json"), "--site", SITE, "--weather", join(dir, "w.csv"), "--spectra", spec, "--out", bad)).toBe(2);
    expect(out).toMatch(/measured\.csv: .*line 4: irradiance "-0\.5" at 300 nm/s);
    expect(existsSync(bad)).toBe(false);
  });
});
