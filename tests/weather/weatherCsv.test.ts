import { describe, expect, it } from "vitest";
import { siteFromObject } from "../../src/site/site.js";
import { sunTrack } from "../../src/sky/sunPosition.js";
import { InputError } from "../../src/util/errors.js";
import { checkAgainstSun } from "../../src/weather/sunChecks.js";
import { syntheticWeather } from "../../src/weather/synthetic.js";
import { parseIsoWithOffset, parseWeatherCsv, requireFullYear, weatherToCsv } from "../../src/weather/weatherCsv.js";

const site = siteFromObject(
  { name: "Csv Flats", latitudeDeg: 45, longitudeDeg: 7, elevationM: 200, utcOffsetHours: "UTC+01:00", albedo: 0.2, monthlyClearness: new Array(12).fill(0.5) },
  "csv.site.json",
);

const csv = (rows: string[], header = "time,ghi_wm2,dni_wm2,dhi_wm2"): string => ["# comment", header, ...rows].join("\n");

describe("parseIsoWithOffset(text)", () => {
  it("needs an explicit offset and converts to UTC", () => {
    expect(parseIsoWithOffset("2027-06-01T12:00:00+01:00")).toBe(Date.UTC(2027, 5, 1, 11));
    expect(parseIsoWithOffset("2027-06-01T12:00Z")).toBe(Date.UTC(2027, 5, 1, 12));
    expect(parseIsoWithOffset("2027-06-01T12:00:00-0530")).toBe(Date.UTC(2027, 5, 1, 17, 30));
    expect(parseIsoWithOffset("2027-06-01T12:00:00")).toBeNaN();
    expect(parseIsoWithOffset("2027-02-30T12:00:00Z")).toBeNaN();
  });
});

describe("parseWeatherCsv(text, src)", () => {
  it("round-trips a synthetic year written by weatherToCsv (to the 0.1 W/m² of the file)", () => {
    const w = syntheticWeather(site, 2027, 3);
    const back = parseWeatherCsv(weatherToCsv(w, 1, "+01:00", ["test"]), "rt.csv");
    expect(back.hourStartUtcMs).toEqual(w.hourStartUtcMs);
    for (let i = 0; i < 8760; i += 37) {
      expect(Math.abs(back.ghiWm2[i]! - w.ghiWm2[i]!)).toBeLessThanOrEqual(0.05 + 1e-9);
      expect(Math.abs(back.dniWm2[i]! - w.dniWm2[i]!)).toBeLessThanOrEqual(0.05 + 1e-9);
    }
    expect(() => requireFullYear(back)).not.toThrow();
  });

  it("reads the optional albedo column", () => {
    const w = parseWeatherCsv(csv(["2027-01-01T00:00+01:00,0,0,0,0.5", "2027-01-01T01:00+01:00,0,0,0,0.6"], "time,ghi_wm2,dni_wm2,dhi_wm2,albedo"), "a.csv");
    expect(Array.from(w.albedo!)).toEqual([0.5, 0.6]);
  });

  it("reports duplicated and missing hours with line numbers", () => {
    const rows = ["2027-01-01T00:00+01:00,0,0,0", "2027-01-01T01:00+01:00,0,0,0", "2027-01-01T01:00+01:00,0,0,0", "2027-01-01T04:00+01:00,0,0,0"];
    try {
      parseWeatherCsv(csv(rows), "gaps.csv");
      expect.unreachable();
    } catch (e) {
      expect(e).toBeInstanceOf(InputError);
      const msg = (e as Error).message;
      expect(msg).toMatch(/gaps\.csv/);
      expect(msg).toMatch(/line 5 .*duplicated hour \(same time as line 4\)/);
      expect(msg).toMatch(/line 6 .*2 missing hour\(s\) after line 5/);
    }
  });

  it("rejects non-numeric and negative values, DHI > GHI, bad headers and timestamps without offset", () => {
    expect(() => parseWeatherCsv(csv(["2027-01-01T10:00+01:00,abc,0,0"]), "x.csv")).toThrow(/line 3: ghi_wm2 "abc" is not a number/);
    expect(() => parseWeatherCsv(csv(["2027-01-01T10:00+01:00,100,-5,20"]), "x.csv")).toThrow(/line 3: dni_wm2 -5 is negative/);
    expect(() => parseWeatherCsv(csv(["2027-01-01T10:00+01:00,100,0,150"]), "x.csv")).toThrow(/line 3: dhi_wm2 150 exceeds ghi_wm2 100/);
    expect(() => parseWeatherCsv(csv(["2027-01-01T10:00,100,0,50"]), "x.csv")).toThrow(/line 3: time .* offset/);
    expect(() => parseWeatherCsv(csv([], "date,ghi,dni,dhi"), "x.csv")).toThrow(/line 2: header must be/);
    expect(() => parseWeatherCsv(csv(["2027-01-01T10:00+01:00,100,0"]), "x.csv")).toThrow(/line 3: expected 4 fields/);
  });

  it("requireFullYear refuses a partial year", () => {
    const w = parseWeatherCsv(csv(["2027-01-01T00:00+01:00,0,0,0"]), "short.csv");
    expect(() => requireFullYear(w)).toThrow(/8760 or 8784 .* found 1/);
  });
});

describe("checkAgainstSun(weather, track)", () => {
  it("zeros DNI at night and counts closure failures (Long & Shi 2008 comparison test) as warnings", () => {
    // 45° N 7° E, 21 June: 00:00 local is night; 12:00 local the sun is high (z ≈ 22°)
    const rows = [
      "2027-06-21T00:00+01:00,0,50,0", // night beam → set to 0
      "2027-06-21T01:00+01:00,0,0,0",
    ];
    const w1 = parseWeatherCsv(csv(rows), "n.csv");
    checkAgainstSun(w1, sunTrack(w1.hourStartUtcMs, 45, 7));
    expect(w1.dniWm2[0]).toBe(0);
    expect(w1.warnings.join()).toMatch(/1 hour\(s\) with DNI > 0 while the sun is below the horizon/);
    const w2 = parseWeatherCsv(csv(["2027-06-21T12:00+01:00,900,100,100", "2027-06-21T13:00+01:00,800,750,120"]), "c.csv");
    checkAgainstSun(w2, sunTrack(w2.hourStartUtcMs, 45, 7));
    // first hour: DNI cos z + DHI ≈ 193 ≪ 900 → violation; second: ≈ 800 → consistent
    expect(w2.warnings.join()).toMatch(/^1 hour\(s\) fail closure GHI ≈ DNI·cos z \+ DHI .*first: line 3 \(2027-06-21T11:00Z\)/);
  });
});
