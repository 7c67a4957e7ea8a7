import { describe, expect, it } from "vitest";
import { parseEpw } from "../../src/weather/epw.js";
import { parseTmy3 } from "../../src/weather/tmy3.js";
import { epwText, tmy3Text } from "../../src/weather/stationWrite.js";
import { detectWeatherFormat } from "../../src/weather/weatherFormat.js";
import { precipitableWaterCm, saturationVapourPressureHpa } from "../../src/weather/precipitableWater.js";
import { InputError } from "../../src/util/errors.js";
import { sunTrack } from "../../src/sky/sunPosition.js";
import { checkAgainstSun } from "../../src/weather/sunChecks.js";

const HOUR = 3_600_000;

/** Eight EPW header records as the EnergyPlus EPW data dictionary orders them. */
function epwHeader(location = "LOCATION,Test Town,XX,Nowhere,own,999999,47.25,-8.5,-7.0,1200"): string[] {
  return [
    location,
    "DESIGN CONDITIONS,0",
    "TYPICAL/EXTREME PERIODS,0",
    "GROUND TEMPERATURES,0",
    "HOLIDAYS/DAYLIGHT SAVINGS,No,0,0,0",
    "COMMENTS 1,hand-written test file",
    "COMMENTS 2,",
    "DATA PERIODS,1,1,Data,Sunday, 6/21,6/21",
  ];
}

/** One EPW data record (35 fields); unused fields carry the dictionary's missing codes. */
function epwRow(y: number, m: number, d: number, h: number, v: { ghi: number; dni: number; dhi: number; t?: number; rh?: number; pPa?: number; pwMm?: number; alb?: number }): string {
  const f = [y, m, d, h, 60, "?9?9?9?9E0?9?9?9?9?9?9?9?9?9?9?9?9?9?9?9*9*9?9?9?9", v.t ?? 20.5, 10.0, v.rh ?? 55, v.pPa ?? 88000,
    9999, 9999, 9999, v.ghi, v.dni, v.dhi, 999999, 999999, 999999, 9999, 180, 2.5, 5, 5, 9999, 99999, 9, 999999999,
    v.pwMm ?? 999, 0.999, 999, 99, v.alb ?? 999, 999, 99];
  return f.join(",");
}

function epwDay(year: number, rows?: (h: number) => string): string {
  const lines = epwHeader();
  for (let h = 1; h <= 24; h++) {
    lines.push(rows ? rows(h) : epwRow(year, 6, 21, h, { ghi: h >= 6 && h <= 20 ? 40 * h : 0, dni: h === 13 ? 800 : 0, dhi: h >= 6 && h <= 20 ? 50 : 0, pwMm: h === 13 ? 21 : 999 }));
  }
  return lines.join("\n") + "\n";
}

describe("parseEpw (EnergyPlus Auxiliary Programs, EPW data dictionary)", () => {
  it("reads LOCATION metadata: latitude N+, longitude E+ (W negative), time zone, elevation", () => {
    const s = parseEpw(epwDay(2027), "t.epw", 2027);
    // LOCATION,city,state,country,source,WMO,latitude,longitude,timezone,elevation (data dictionary)
    expect(s.meta).toMatchObject({ format: "epw", latitudeDeg: 47.25, longitudeDeg: -8.5, utcOffsetHours: -7, elevationM: 1200 });
    expect(s.meta.name).toContain("Test Town");
  });

  it("maps hour h (the hour ending at h:00 local standard time) to an internal hour starting at (h−1):00", () => {
    const s = parseEpw(epwDay(2027), "t.epw", 2027);
    expect(s.weather.hourStartUtcMs.length).toBe(24);
    // "Hour 1 is 00:01 to 01:00" (data dictionary); local = UTC − 7 h, so local 00:00 = 07:00 UTC
    expect(s.weather.hourStartUtcMs[0]).toBe(Date.UTC(2027, 5, 21, 0) + 7 * HOUR);
    // row hour 13 (12:00–13:00 local) holds GHI 520 Wh/m², the hour's mean 520 W/m²
    const i13 = 12;
    expect(s.weather.hourStartUtcMs[i13]).toBe(Date.UTC(2027, 5, 21, 12) + 7 * HOUR);
    expect(s.weather.ghiWm2[i13]).toBe(520);
    expect(s.weather.dniWm2[i13]).toBe(800);
    expect(s.weather.dhiWm2[i13]).toBe(50);
    expect(s.lineOf[i13]).toBe(8 + 13);
  });

  it("converts units (Pa → hPa, precipitable water mm → cm) and turns missing codes into NaN", () => {
    const s = parseEpw(epwDay(2027), "t.epw", 2027);
    expect(s.met.pressureHpa[0]).toBeCloseTo(880, 12);
    expect(s.met.precipitableWaterCm[12]).toBeCloseTo(2.1, 12);
    expect(s.met.precipitableWaterCm[0]).toBeNaN(); // 999 = missing (data dictionary)
    expect(s.weather.albedo).toBeUndefined(); // albedo 999 = missing in every row
  });

  it("sets missing irradiance (≥ 9999) to 0 and says so with the first line", () => {
    const text = epwDay(2027, (h) => epwRow(2027, 6, 21, h, { ghi: h === 10 ? 9999 : 0, dni: 0, dhi: 0 }));
    const s = parseEpw(text, "t.epw", 2027);
    expect(s.weather.ghiWm2[9]).toBe(0);
    expect(s.weather.warnings.join(" ")).toMatch(/1 hour\(s\) with missing irradiance set to 0 \(first at line 18\)/);
  });

  it("places a typical year (rows from several years) on the requested year", () => {
    const lines = epwHeader();
    for (let h = 1; h <= 24; h++) lines.push(epwRow(1998, 1, 31, h, { ghi: 0, dni: 0, dhi: 0 }));
    for (let h = 1; h <= 24; h++) lines.push(epwRow(2004, 2, 1, h, { ghi: 0, dni: 0, dhi: 0 }));
    const s = parseEpw(lines.join("\n"), "t.epw", 2027);
    expect(s.weather.hourStartUtcMs[0]).toBe(Date.UTC(2027, 0, 31, 0) + 7 * HOUR);
    expect(s.weather.hourStartUtcMs[24]).toBe(Date.UTC(2027, 1, 1, 0) + 7 * HOUR);
    expect(s.weather.warnings[0]).toMatch(/typical-year file .* placed on 2027/);
  });

  it("round-trips through the EPW writer", () => {
    const s = parseEpw(epwDay(2027), "t.epw", 2027);
    const again = parseEpw(epwText(s.meta, s.weather, s.met, "round trip"), "rt.epw", 2027);
    expect(Array.from(again.weather.hourStartUtcMs)).toEqual(Array.from(s.weather.hourStartUtcMs));
    expect(Array.from(again.weather.ghiWm2)).toEqual(Array.from(s.weather.ghiWm2));
    expect(Array.from(again.met.precipitableWaterCm)).toEqual(Array.from(s.met.precipitableWaterCm));
    expect(again.meta.latitudeDeg).toBe(47.25);
  });

  const bad: [string, () => string, RegExp][] = [
    ["an unknown header record", () => epwDay(2027).replace("GROUND TEMPERATURES,0", "GROUND STUFF,0"), /line 4: expected the EPW header record "GROUND TEMPERATURES"/],
    ["a LOCATION without coordinates", () => epwDay(2027).replace("47.25,-8.5", ",-8.5"), /line 1: latitude is missing/],
    ["sub-hourly data", () => epwDay(2027).replace("DATA PERIODS,1,1,", "DATA PERIODS,1,4,"), /line 8: DATA PERIODS gives 4 records per hour/],
    ["hour 25", () => epwDay(2027, (h) => epwRow(2027, 6, 21, h === 5 ? 25 : h, { ghi: 0, dni: 0, dhi: 0 })), /line 13: hour 25 is not 1…24/],
    ["a missing hour", () => epwDay(2027, (h) => epwRow(2027, 6, 21, h === 7 ? 8 : h, { ghi: 0, dni: 0, dhi: 0 })), /line 16: repeats the hour of line 15/],
    ["a short record", () => epwDay(2027) + "2027,6,22,1,60\n", /line 33: expected 35 comma-separated fields, got 5/],
    ["relative humidity 150 %", () => epwDay(2027, (h) => epwRow(2027, 6, 21, h, { ghi: 0, dni: 0, dhi: 0, rh: h === 3 ? 150 : 50 })), /line 11: relative humidity 150 % is outside 0…110/],
  ];
  for (const [what, make, msg] of bad) {
    it(`refuses ${what}, naming file and line`, () => {
      expect(() => parseEpw(make(), "bad.epw", 2027)).toThrow(InputError);
      expect(() => parseEpw(make(), "bad.epw", 2027)).toThrow(/bad\.epw/);
      expect(() => parseEpw(make(), "bad.epw", 2027)).toThrow(msg);
    });
  }
});

/** TMY3 first two lines (NREL/TP-581-43156: station line, then column names), hand-written. */
function tmy3Head(): string[] {
  return [
    '999001,"INVENTED FIELD",ZZ,-5.0,35.5,-97.25,380',
    "Date (MM/DD/YYYY),Time (HH:MM),ETR (W/m^2),ETRN (W/m^2),GHI (W/m^2),GHI source,GHI uncert (%),DNI (W/m^2),DNI source,DNI uncert (%),DHI (W/m^2),DHI source,DHI uncert (%),Dry-bulb (C),Dry-bulb source,Dry-bulb uncert (code),RHum (%),RHum source,RHum uncert (code),Pressure (mbar),Pressure source,Pressure uncert (code),Pwat (cm),Pwat source,Pwat uncert (code),Alb (unitless),Alb source,Alb uncert (code)",
  ];
}

function tmy3Row(date: string, time: string, ghi: number, dni: number, dhi: number, t = 15.2, rh = 60, p = 970, pw = 1.8, alb = 0.18): string {
  return [date, time, 0, 0, ghi, 1, 8, dni, 1, 15, dhi, 1, 8, t, "A", 7, rh, "A", 7, p, "A", 7, pw, "E", 8, alb, "F", 8].join(",");
}

function tmy3Day(row?: (h: number) => string): string {
  const lines = tmy3Head();
  for (let h = 1; h <= 24; h++) lines.push(row ? row(h) : tmy3Row("03/15/1993", `${String(h).padStart(2, "0")}:00`, h === 12 ? 640 : 0, h === 12 ? 720 : 0, h === 12 ? 120 : 0));
  return lines.join("\n") + "\n";
}

describe("parseTmy3 (Users Manual for TMY3 Data Sets, NREL/TP-581-43156)", () => {
  it("reads the station line: time zone, latitude, longitude, elevation", () => {
    const s = parseTmy3(tmy3Day(), "t.csv", 2027);
    expect(s.meta).toMatchObject({ format: "tmy3", utcOffsetHours: -5, latitudeDeg: 35.5, longitudeDeg: -97.25, elevationM: 380 });
    expect(s.meta.name).toContain("INVENTED FIELD");
  });

  it("maps 12:00 (energy of 11:00–12:00 local standard time) to an hour starting at 11:00 local", () => {
    const s = parseTmy3(tmy3Day(), "t.csv", 2027);
    // one year in the file: it is kept (1993); local = UTC − 5 h
    expect(s.weather.hourStartUtcMs[11]).toBe(Date.UTC(1993, 2, 15, 11) + 5 * HOUR);
    expect(s.weather.ghiWm2[11]).toBe(640);
    expect(s.weather.dniWm2[11]).toBe(720);
    expect(s.weather.dhiWm2[11]).toBe(120);
    // 24:00 closes the day: hour 23:00–24:00 of 15 March
    expect(s.weather.hourStartUtcMs[23]).toBe(Date.UTC(1993, 2, 15, 23) + 5 * HOUR);
    expect(s.met.pressureHpa[0]).toBe(970);
    expect(s.met.precipitableWaterCm[0]).toBe(1.8);
    expect(s.weather.albedo![0]).toBe(0.18);
  });

  it("treats the missing code −9900 and empty cells as missing", () => {
    const s = parseTmy3(tmy3Day((h) => tmy3Row("03/15/1993", `${String(h).padStart(2, "0")}:00`, 0, 0, 0, 15, 60, 970, h === 2 ? -9900 : 1.5)), "t.csv", 2027);
    expect(s.met.precipitableWaterCm[1]).toBeNaN();
    expect(s.met.precipitableWaterCm[2]).toBe(1.5);
  });

  it("round-trips through the TMY3 writer", () => {
    const s = parseTmy3(tmy3Day(), "t.csv", 2027);
    const again = parseTmy3(tmy3Text(s.meta, "999001", s.weather, s.met), "rt.csv", 2027);
    expect(Array.from(again.weather.hourStartUtcMs)).toEqual(Array.from(s.weather.hourStartUtcMs));
    expect(Array.from(again.weather.dniWm2)).toEqual(Array.from(s.weather.dniWm2));
    expect(Array.from(again.met.airTempC)).toEqual(Array.from(s.met.airTempC));
  });

  const bad: [string, () => string, RegExp][] = [
    ["a header without DNI", () => tmy3Day().replace("DNI (W/m^2)", "DirNorm"), /line 2: TMY3 column header lacks "dni"/],
    ["a station line of 3 fields", () => tmy3Day().replace('999001,"INVENTED FIELD",ZZ,-5.0,35.5,-97.25,380', "1,2,3"), /line 1: a TMY3 station header has 7 fields/],
    ["a time 12:30", () => tmy3Day((h) => tmy3Row("03/15/1993", h === 4 ? "04:30" : `${String(h).padStart(2, "0")}:00`, 0, 0, 0)), /line 6: time "04:30" is not an hour stamp/],
    ["a date 13/01/1993", () => tmy3Day((h) => tmy3Row(h === 1 ? "13/01/1993" : "03/15/1993", `${String(h).padStart(2, "0")}:00`, 0, 0, 0)), /line 3: date "13\/01\/1993" is not a calendar date/],
  ];
  for (const [what, make, msg] of bad) {
    it(`refuses ${what}, naming file and line`, () => {
      expect(() => parseTmy3(make(), "bad.csv", 2027)).toThrow(InputError);
      expect(() => parseTmy3(make(), "bad.csv", 2027)).toThrow(msg);
    });
  }
});

describe("station files go through the shared plausibility rules (BSRN QC, Long & Shi 2008)", () => {
  it("refuses an EPW GHI beyond the physically possible limit, naming the file's line", () => {
    const s = parseEpw(epwDay(2027, (h) => epwRow(2027, 6, 21, h, { ghi: h === 12 ? 4500 : 0, dni: 0, dhi: 0 })), "hot.epw", 2027);
    const track = sunTrack(s.weather.hourStartUtcMs, s.meta.latitudeDeg, s.meta.longitudeDeg);
    // PPL for GHI: 1.5 · E0n · μ0^1.2 + 100 W/m² < 2200 W/m² at any sun height
    expect(() => checkAgainstSun(s.weather, track)).toThrow(/hot\.epw: .*line 20/s);
  });

  it("refuses a TMY3 DNI below the −4 W/m² lower limit, naming the line", () => {
    const s = parseTmy3(tmy3Day((h) => tmy3Row("03/15/1993", `${String(h).padStart(2, "0")}:00`, 0, h === 9 ? -50 : 0, 0)), "neg.csv", 2027);
    expect(() => checkAgainstSun(s.weather, sunTrack(s.weather.hourStartUtcMs, s.meta.latitudeDeg, s.meta.longitudeDeg))).toThrow(/neg\.csv: .*line 11/s);
  });
});

describe("detectWeatherFormat", () => {
  it("tells EPW, TMY3 and lightfold CSV apart by content and refuses anything else", () => {
    expect(detectWeatherFormat(epwDay(2027), "a")).toBe("epw");
    expect(detectWeatherFormat(tmy3Day(), "b")).toBe("tmy3");
    expect(detectWeatherFormat("# c\ntime,ghi_wm2,dni_wm2,dhi_wm2\n", "c")).toBe("lightfold-csv");
    expect(() => detectWeatherFormat("year,month,ghi\n2027,1,0\n", "d.csv")).toThrow(/d\.csv: unknown weather file format/);
  });
});

describe("precipitable water from temperature and humidity (Gueymard 1994)", () => {
  it("saturation vapour pressure matches handbook values over water", () => {
    // CRC Handbook of Chemistry and Physics, vapour pressure of water (from memory): 0 °C 6.112 hPa,
    // 25 °C 31.69 hPa, 40 °C 73.85 hPa. Gueymard (1993) states an accuracy of a few tenths of a percent.
    expect(saturationVapourPressureHpa(273.15) / 6.112 - 1).toBeLessThan(0.005);
    expect(Math.abs(saturationVapourPressureHpa(298.15) / 31.69 - 1)).toBeLessThan(0.005);
    expect(Math.abs(saturationVapourPressureHpa(313.15) / 73.85 - 1)).toBeLessThan(0.005);
  });

  it("gives the surface vapour density of the ideal-gas law times the scale height", () => {
    // ρ_v = e/(R_v T), R_v = 461.5 J/(kg K) (any thermodynamics text): 216.7 = 100 Pa/hPa × 1000 g/kg / 461.5
    const T = 298.15, rh = 0.7;
    const rhoV = (rh * saturationVapourPressureHpa(T) * 100 * 1000) / (461.5 * T);
    const theta = T / 273.15;
    const hV = 0.4976 + 1.5265 * theta + Math.exp(13.6897 * theta - 14.9188 * theta ** 3);
    expect(precipitableWaterCm(25, 70)).toBeCloseTo(0.1 * hV * rhoV, 3);
    // a humid summer afternoon holds a few centimetres of water (common practice: 1–5 cm at mid-latitudes)
    expect(precipitableWaterCm(25, 70)).toBeGreaterThan(2.5);
    expect(precipitableWaterCm(25, 70)).toBeLessThan(4.5);
    expect(precipitableWaterCm(-10, 70)).toBeLessThan(precipitableWaterCm(10, 70));
  });
});
