import { describe, expect, it } from "vitest";
import { perezBrightness } from "../../src/sky/perez.js";
import { emptySkyParts, poaIrradianceWm2, skyParts, SKY_MODELS } from "../../src/sky/transposition.js";
import { kastenYoungAirMass, spencerEccentricity } from "../../src/sky/irradianceBasics.js";
import { cooperDeclinationDeg, cosIncidenceDB, cosZenithDB } from "../../src/sky/solarGeometry.js";
import { RandomStream, streamKey } from "../../src/random/stream.js";
import { DEG, RAD } from "../../src/util/math.js";

const parts = emptySkyParts();
/** Sky diffuse on the plane (POA minus beam and ground). */
function skyOnPlane(model: (typeof SKY_MODELS)[number], z: number, ghi: number, dni: number, dhi: number, cosT: number, tilt: number): number {
  skyParts(model, z, ghi, dni, dhi, 0, 1367, parts);
  return poaIrradianceWm2(parts, cosT, tilt) - dni * Math.max(0, cosT);
}

describe("skyParts / poaIrradianceWm2 (transposition)", () => {
  it("returns DHI on a horizontal plane for every sky model (Perez for z < 85°) — invariant", () => {
    const r = new RandomStream(streamKey(5, "horizontal"));
    for (let i = 0; i < 300; i++) {
      const z = 84.9 * r.next(), dhi = 5 + 400 * r.next(), dni = 1000 * r.next();
      const ghi = dni * Math.cos(z * DEG) + dhi;
      for (const m of SKY_MODELS) expect(skyOnPlane(m, z, ghi, dni, dhi, Math.cos(z * DEG), 0)).toBeCloseTo(dhi, 9);
    }
  });

  it("isotropic (Liu & Jordan): sky = DHI (1 + cos β)/2, ground = ρ GHI (1 − cos β)/2", () => {
    skyParts("isotropic", 40, 600, 500, 217, 0.3, 1367, parts);
    const beta = 50, cb = Math.cos(beta * DEG), c = 0.8;
    expect(poaIrradianceWm2(parts, c, beta)).toBeCloseTo(500 * c + 217 * (1 + cb) / 2 + 0.3 * 600 * (1 - cb) / 2, 10);
  });

  it("Hay & Davies (1980): sky = DHI [Ai Rb + (1 − Ai)(1 + cos β)/2], Ai = DNI/E0n, Rb = cos θ / cos z", () => {
    const z = 35, dni = 650, dhi = 120, beta = 30, cosT = 0.95;
    const ai = dni / 1367, rb = cosT / Math.cos(z * DEG);
    expect(skyOnPlane("hay-davies", z, 0, dni, dhi, cosT, beta)).toBeCloseTo(dhi * (ai * rb + (1 - ai) * (1 + Math.cos(beta * DEG)) / 2), 9);
  });

  it("Perez 1990: ε, Δ, bin and F1, F2 from the published all-sites table for one hand-worked hour", () => {
    // z = 30°, DHI = 100, DNI = 700, E0n = 1367 W/m²
    const z = 30, zr = z * DEG, dhi = 100, dni = 700;
    const eps = ((dhi + dni) / dhi + 1.041 * zr ** 3) / (1 + 1.041 * zr ** 3); // = 7.62 → bin 8 (ε ≥ 6.2)
    const delta = (dhi * kastenYoungAirMass(z)) / 1367;
    const p = perezBrightness(z, dhi, dni, 1367);
    expect(p.epsilon).toBeCloseTo(eps, 12);
    expect(p.bin).toBe(8);
    // bin 8 row (Perez et al., Solar Energy 44, 271 (1990)): 0.6777470 −0.3272588 −0.2504286 0.1561313 −1.3765031 0.2506212
    expect(p.f1).toBeCloseTo(Math.max(0, 0.677747 - 0.3272588 * delta - 0.2504286 * zr), 12);
    expect(p.f2).toBeCloseTo(0.1561313 - 1.3765031 * delta + 0.2506212 * zr, 12);
    // the sky irradiance on a 40° plane: DHI[(1 − F1)(1 + cos β)/2 + F1 a/b + F2 sin β]
    const cosT = 0.9, beta = 40;
    const expected = dhi * ((1 - p.f1) * (1 + Math.cos(beta * DEG)) / 2 + (p.f1 * cosT) / Math.cos(zr) + p.f2 * Math.sin(beta * DEG));
    expect(skyOnPlane("perez", z, 0, dni, dhi, cosT, beta)).toBeCloseTo(expected, 9);
  });

  it("Perez 1990: overcast sky (DNI = 0) falls in bin 1; bin edges are inclusive at the lower edge", () => {
    expect(perezBrightness(50, 200, 0, 1367).bin).toBe(1);
    // ε = 1.065 exactly at z = 0: (DHI + DNI)/DHI = 1.065
    expect(perezBrightness(0, 100, 6.5, 1367).bin).toBe(2);
  });

  it("puts no beam, circumsolar or horizon light on the plane with the sun below the horizon", () => {
    for (const m of SKY_MODELS) {
      skyParts(m, 95, 20, 300, 20, 0.2, 1367, parts);
      expect(parts.dniWm2 + parts.circumsolarWm2 + parts.horizonWm2).toBe(0);
      expect(parts.isoSkyWm2).toBe(20);
    }
  });

  it("Duffie & Beckman Example 2.15.1-style hour (isotropic sky): φ = 40°, 20 Feb, 9–10 h, β = 60° south, I = 1.04, Id = 0.79 MJ/m², ρ = 0.6", () => {
    // hand calculation with D&B's relations at mid-hour (ω = −37.5°): Rb = cos θ / cos z (Eq. 1.6.2, 1.6.5)
    const decl = cooperDeclinationDeg(51);
    const cz = cosZenithDB(40, decl, -37.5), ct = cosIncidenceDB(40, decl, 60, 0, -37.5);
    const toW = 1e6 / 3600; // MJ/m² per hour → W/m²
    const I = 1.04 * toW, Id = 0.79 * toW, Ib = I - Id;
    const z = Math.acos(cz) * RAD;
    skyParts("isotropic", z, I, Ib / cz, Id, 0.6, 1367, parts);
    const itMJ = poaIrradianceWm2(parts, ct, 60) / toW;
    const handMJ = Ib / toW * (ct / cz) + 0.79 * (1 + Math.cos(60 * DEG)) / 2 + 1.04 * 0.6 * (1 - Math.cos(60 * DEG)) / 2;
    expect(itMJ).toBeCloseTo(handMJ, 10);
    // the book's result, from memory: Rb ≈ 1.71 and I_T ≈ 1.18 MJ/m²
    expect(ct / cz).toBeCloseTo(1.71, 1);
    expect(Math.abs(itMJ - 1.18)).toBeLessThan(0.02);
  });
});

describe("irradianceBasics", () => {
  it("Spencer (1971) eccentricity: (1/r)² of the orbit at perihelion (r = 0.98329 AU, ~3 Jan) and aphelion (1.01671 AU, ~4 Jul)", () => {
    // orbit distances: astronomical almanac values (facts of the trade); Spencer's fit is within ~0.1 %
    expect(Math.abs(spencerEccentricity(3) - 1 / 0.98329 ** 2)).toBeLessThan(0.0015);
    expect(Math.abs(spencerEccentricity(185) - 1 / 1.01671 ** 2)).toBeLessThan(0.0015);
    // and the simple D&B form 1 + 0.033 cos(360 n/365) within 0.3 % all year (its amplitude is rounded)
    for (let n = 1; n <= 365; n += 7) expect(Math.abs(spencerEccentricity(n) - (1 + 0.033 * Math.cos((360 * n / 365) * DEG)))).toBeLessThan(0.003);
  });

  it("Kasten & Young (1989) air mass: 1 at zenith, ≈ 2 at 60°, ≈ 38 at the horizon", () => {
    expect(kastenYoungAirMass(0)).toBeCloseTo(0.99973, 4);
    expect(kastenYoungAirMass(60)).toBeCloseTo(1.9942, 3);
    expect(kastenYoungAirMass(90)).toBeCloseTo(37.92, 1);
  });
});
