import { readdirSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { checkPlane, siteFromObject } from "../../src/site/site.js";
import { readSiteFile } from "../../src/site/siteFile.js";
import { formatUtcOffset, parseUtcOffsetHours } from "../../src/site/utcOffset.js";
import { InputError } from "../../src/util/errors.js";

const base = { name: "Test Flats", latitudeDeg: 45, longitudeDeg: 7, elevationM: 200, utcOffsetHours: 1, albedo: 0.2 };

describe("parseUtcOffsetHours(value, where)", () => {
  it("accepts numbers and UTC±hh:mm forms", () => {
    expect(parseUtcOffsetHours(2, "x")).toBe(2);
    expect(parseUtcOffsetHours("UTC+02:00", "x")).toBe(2);
    expect(parseUtcOffsetHours("UTC-7", "x")).toBe(-7);
    expect(parseUtcOffsetHours("UTC+5:30", "x")).toBe(5.5);
    expect(parseUtcOffsetHours("-03:30", "x")).toBe(-3.5);
    expect(parseUtcOffsetHours("UTC", "x")).toBe(0);
    expect(formatUtcOffset(-3.5)).toBe("-03:30");
    expect(formatUtcOffset(1)).toBe("+01:00");
  });

  it("rejects named zones, nonsense and out-of-range offsets with InputError", () => {
    for (const bad of ["Europe/Oslo", "CET", "UTC+2h", "+25:00", 15, "UTC+01:75", 0.1]) {
      expect(() => parseUtcOffsetHours(bad, "site.json: field \"utcOffsetHours\"")).toThrow(InputError);
    }
    expect(() => parseUtcOffsetHours("Europe/Oslo", "s.json")).toThrow(/unknown time zone form/);
  });
});

describe("siteFromObject(raw, src)", () => {
  it("expands a constant albedo to 12 months and defaults the Linke turbidity to 3", () => {
    const s = siteFromObject(base, "t.json");
    expect(s.albedoMonthly).toHaveLength(12);
    expect(s.linkeTurbidityMonthly[6]).toBe(3);
    expect(s.monthlyClearness).toBeUndefined();
  });

  it("names the field path in errors: latitude outside ±90, bad monthly arrays, unknown fields", () => {
    expect(() => siteFromObject({ ...base, latitudeDeg: 95 }, "t.json")).toThrow(/t\.json: field "latitudeDeg" = 95 is outside -90\.\.90/);
    expect(() => siteFromObject({ ...base, albedo: [0.2, 0.2] }, "t.json")).toThrow(/"albedo" must be a number or an array of 12/);
    const clear = new Array(12).fill(0.5);
    clear[4] = "x";
    expect(() => siteFromObject({ ...base, monthlyClearness: clear }, "t.json")).toThrow(/monthlyClearness\[4\]/);
    expect(() => siteFromObject({ ...base, lat: 4 }, "t.json")).toThrow(/unknown field "lat"/);
    expect(() => siteFromObject({ ...base, utcOffsetHours: "Europe/Oslo" }, "t.json")).toThrow(InputError);
  });

  it("reads the shipped example sites", () => {
    const files = readdirSync("configs/sites").filter((f) => f.endsWith(".site.json"));
    expect(files.length).toBeGreaterThanOrEqual(3);
    for (const f of files) expect(readSiteFile(`configs/sites/${f}`).monthlyClearness).toHaveLength(12);
  });
});

describe("checkPlane(plane)", () => {
  it("accepts 0–180° tilt and rejects outside", () => {
    expect(checkPlane({ tiltDeg: 180, azimuthDeg: 0, textureRotationDeg: 0 }).tiltDeg).toBe(180);
    expect(() => checkPlane({ tiltDeg: -1, azimuthDeg: 180, textureRotationDeg: 0 })).toThrow(/outside 0–180/);
    expect(() => checkPlane({ tiltDeg: 181, azimuthDeg: 180, textureRotationDeg: 0 })).toThrow(InputError);
    expect(() => checkPlane({ tiltDeg: 30, azimuthDeg: 400, textureRotationDeg: 0 })).toThrow(/azimuth/);
  });
});
