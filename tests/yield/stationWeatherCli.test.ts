import { mkdtempSync, readFileSync, writeFileSync, existsSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { afterEach, beforeAll, describe, expect, it, vi } from "vitest";
import { main } from "../../src/cli/main.js";
import { writeResponseMatrix } from "../../src/response/matrixFile.js";
import { makeMatrix, range } from "./matrixFixture.js";

let dir = "";
const SITE = "configs/sites/brevenmark.site.json";
const out: string[] = [];
function run(...args: string[]): Promise<number> {
  out.length = 0;
  vi.spyOn(process.stdout, "write").mockImplementation((s) => (out.push(String(s)), true));
  vi.spyOn(process.stderr, "write").mockImplementation((s) => (out.push(String(s)), true));
  return main(["node", "lightfold", ...args]);
}
afterEach(() => vi.restoreAllMocks());

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
    expect(out.join("")).toMatch(/describe different places or time zones/);
    expect(existsSync(res)).toBe(false);
  });

  it("refuses an unknown weather format with exit 2 naming the file", async () => {
    const bad = join(dir, "bad.txt");
    writeFileSync(bad, "station;lat;lon\nx;1;2\n");
    expect(await run("yield", "--matrix", join(dir, "a.matrix.json"), "--weather", bad)).toBe(2);
    expect(out.join("")).toMatch(/bad\.txt: unknown weather file format/);
  });
});
