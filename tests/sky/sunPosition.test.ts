import * as Astronomy from "astronomy-engine";
import { describe, expect, it } from "vitest";
import { cosIncidence, moduleFrame } from "../../src/sky/moduleFrame.js";
import { HOUR_CENTRE_OFFSET_MS, sunPositionAt, sunTrack } from "../../src/sky/sunPosition.js";
import { DEG, RAD } from "../../src/util/math.js";

// Bennett-type refraction at standard conditions (Meeus, Astronomical Algorithms, Eq. 16.4), degrees.
const refractionDeg = (altitudeDeg: number): number => 1.02 / Math.tan((altitudeDeg + 10.3 / (altitudeDeg + 5.11)) * DEG) / 60;

describe("sunPositionAt(utcMs, latitudeDeg, longitudeDeg)", () => {
  it("reproduces the NREL SPA worked example (Reda & Andreas 2008, NREL/TP-560-34302) within suncalc's accuracy", () => {
    // 2003-10-17 12:30:30 local time at UTC−7 = 19:30:30 UTC; 39.742476° N, 105.1786° W, 1830.14 m, 820 mbar, 11 °C
    const t = Date.UTC(2003, 9, 17, 19, 30, 30);
    const p = sunPositionAt(t, 39.742476, -105.1786);
    // SPA's zenith is topocentric with refraction at 820 mbar / 11 °C; suncalc is geocentric with
    // refraction at standard conditions (1010 mbar, 10 °C). Put suncalc on SPA's footing:
    //   refraction scales with (P/1010)(283/(273+T)) (Meeus ch. 16); solar parallax 8.794″ sin z.
    const alt = 90 - p.zenithDeg;
    const refr = refractionDeg(alt);
    const zenithSpaFooting = p.zenithDeg + refr * (1 - (820 / 1010) * (283 / 284)) + (8.794 / 3600) * Math.sin(p.zenithDeg * DEG);
    // Tolerance 0.01°: the accuracy of the low-precision solar coordinates suncalc uses (Meeus ch. 25, "0.01°").
    expect(Math.abs(zenithSpaFooting - 50.11162)).toBeLessThan(0.01);
    expect(Math.abs(p.zenithDeg - 50.11162)).toBeLessThan(0.01); // also uncorrected (measured −0.0041°)
    expect(Math.abs(p.azimuthDeg - 194.34024)).toBeLessThan(0.01);
    // incidence on a surface of slope 30°, azimuth rotation −10° (10° east of south = 170° from north): 25.18700°
    const f = moduleFrame({ tiltDeg: 30, azimuthDeg: 170, textureRotationDeg: 0 });
    const incidence = Math.acos(cosIncidence(f, zenithSpaFooting, p.azimuthDeg)) * RAD;
    expect(Math.abs(incidence - 25.187)).toBeLessThan(0.01);
  });

  it("agrees with astronomy-engine (npm) over a whole year, hourly, at 48.7° N 9.6° E", () => {
    // Tolerances: above 5° altitude 0.02° = 0.01° (Meeus ch. 25 accuracy) + 0.0025° (parallax, not in
    // suncalc) + refraction-formula differences (≈ 0.005° there); measured max 0.0075°. Below 5°
    // altitude the refraction formulas of the two libraries part by up to ~0.1° (measured 0.09°): 0.15°.
    const obs = new Astronomy.Observer(48.7, 9.6, 0);
    const start = Date.UTC(2027, 0, 1);
    const times = Float64Array.from({ length: 8760 }, (_, h) => start + h * 3_600_000);
    const track = sunTrack(times, 48.7, 9.6);
    let maxHigh = 0, maxLow = 0, maxAz = 0, n = 0;
    for (let h = 0; h < 8760; h++) {
      const date = new Date(times[h]! + HOUR_CENTRE_OFFSET_MS);
      const eq = Astronomy.Equator(Astronomy.Body.Sun, date, obs, true, true);
      const hz = Astronomy.Horizon(date, obs, eq.ra, eq.dec, "normal");
      if (hz.altitude < 0) continue;
      n++;
      const dz = Math.abs(track.zenithDeg[h]! - (90 - hz.altitude));
      let da = Math.abs(track.azimuthDeg[h]! - hz.azimuth);
      if (da > 180) da = 360 - da;
      if (hz.altitude > 5) {
        maxHigh = Math.max(maxHigh, dz);
        maxAz = Math.max(maxAz, da * Math.cos(hz.altitude * DEG)); // angular separation along the horizon
      } else maxLow = Math.max(maxLow, dz);
    }
    expect(n).toBeGreaterThan(4000); // about half the hours of a year are daylight
    expect(maxHigh).toBeLessThan(0.02);
    expect(maxAz).toBeLessThan(0.02);
    expect(maxLow).toBeLessThan(0.15);
  });

  it("evaluates each hour at its centre: stamps mark the start of the hour", () => {
    const t = Date.UTC(2027, 5, 21, 10);
    const track = sunTrack([t], 48.7, 9.6);
    expect(track.zenithDeg[0]).toBeCloseTo(sunPositionAt(t + 30 * 60_000, 48.7, 9.6).zenithDeg, 12);
    expect(track.dayOfYear[0]).toBe(172);
  });
});
