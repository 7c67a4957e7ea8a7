import { describe, expect, it } from "vitest";
import { cooperDeclinationDeg, cosIncidenceDB, cosZenithDB, sunsetHourAngleDeg } from "../../src/sky/solarGeometry.js";
import { cosIncidence, moduleAzimuthDeg, moduleFrame, directionEnu } from "../../src/sky/moduleFrame.js";
import { RandomStream, streamKey } from "../../src/random/stream.js";
import { DEG, RAD } from "../../src/util/math.js";

describe("solarGeometry (Duffie & Beckman, Solar Engineering of Thermal Processes, ch. 1)", () => {
  it("Example 1.6.1: Madison φ = 43°, 13 February, 10:30 solar time, β = 45°, γ = 15° → θ ≈ 35°", () => {
    const n = 44; // 13 February
    const decl = cooperDeclinationDeg(n);
    expect(decl).toBeCloseTo(-14, 0); // D&B: δ = −14°
    const omega = -22.5; // 1.5 h before solar noon, 15°/h
    const theta = Math.acos(cosIncidenceDB(43, decl, 45, 15, omega)) * RAD;
    expect(Math.abs(theta - 35)).toBeLessThan(0.5); // D&B: cos θ = 0.817, θ = 35°
  });

  it("sunset hour angle cos ωs = −tan φ tan δ (D&B Eq. 1.6.10): 90° at the equinox, cos z = 0 there", () => {
    expect(sunsetHourAngleDeg(43, 0)).toBeCloseTo(90, 10);
    const ws = sunsetHourAngleDeg(43, 23.45);
    expect(cosZenithDB(43, 23.45, ws)).toBeCloseTo(0, 12);
    expect(sunsetHourAngleDeg(80, 23.45)).toBe(180); // polar day
  });

  it("moduleFrame's cos θ equals D&B Eq. 1.6.2 for random sun and surface (azimuth from north = 180° + γ)", () => {
    const r = new RandomStream(streamKey(3, "incidence"));
    for (let i = 0; i < 200; i++) {
      const lat = -80 + 160 * r.next(), decl = -23.45 + 46.9 * r.next(), omega = -180 + 360 * r.next();
      const beta = 180 * r.next(), gamma = -180 + 360 * r.next();
      // sun zenith/azimuth from the same relations (D&B Eq. 1.6.5, 1.6.6 via vectors)
      const cz = cosZenithDB(lat, decl, omega);
      const z = Math.acos(cz) * RAD;
      // solar azimuth from south, west positive (D&B Eq. 1.6.6): sign(ω)|acos((cos z sin φ − sin δ)/(sin z cos φ))|
      const cosGs = (cz * Math.sin(lat * DEG) - Math.sin(decl * DEG)) / (Math.sin(z * DEG) * Math.cos(lat * DEG));
      const gs = Math.sign(omega) * Math.abs(Math.acos(Math.max(-1, Math.min(1, cosGs))) * RAD);
      const f = moduleFrame({ tiltDeg: beta, azimuthDeg: (180 + gamma + 360) % 360, textureRotationDeg: 0 });
      expect(cosIncidence(f, z, (180 + gs + 360) % 360)).toBeCloseTo(cosIncidenceDB(lat, decl, beta, gamma, omega), 9);
    }
  });
});

describe("moduleFrame(plane)", () => {
  it("is orthonormal and right-handed (x × y = n) for any tilt, azimuth and texture rotation", () => {
    for (const [t, a, rot] of [[0, 180, 0], [35, 180, 0], [90, 90, 20], [150, 10, 45]] as const) {
      const f = moduleFrame({ tiltDeg: t, azimuthDeg: a, textureRotationDeg: rot });
      const dot = (u: Float64Array, v: Float64Array): number => u[0]! * v[0]! + u[1]! * v[1]! + u[2]! * v[2]!;
      expect(dot(f.n, f.n)).toBeCloseTo(1, 12);
      expect(dot(f.x, f.y)).toBeCloseTo(0, 12);
      expect(dot(f.x, f.n)).toBeCloseTo(0, 12);
      const cross = [f.x[1]! * f.y[2]! - f.x[2]! * f.y[1]!, f.x[2]! * f.y[0]! - f.x[0]! * f.y[2]!, f.x[0]! * f.y[1]! - f.x[1]! * f.y[0]!];
      cross.forEach((c, i) => expect(c).toBeCloseTo(f.n[i]!, 12));
    }
  });

  it("gives φ = 0 for light from up-slope and rotates φ by −textureRotationDeg", () => {
    const f = moduleFrame({ tiltDeg: 30, azimuthDeg: 180, textureRotationDeg: 0 });
    // sun due north-ish above a south-facing module comes from the up-slope side
    const d = directionEnu(20, 0, new Float64Array(3));
    const wrapped = (phi: number): number => ((phi + 180) % 360) - 180; // to (−180, 180]
    expect(wrapped(moduleAzimuthDeg(f, d))).toBeCloseTo(0, 9);
    const g = moduleFrame({ tiltDeg: 30, azimuthDeg: 180, textureRotationDeg: 30 });
    expect(wrapped(moduleAzimuthDeg(g, d))).toBeCloseTo(-30, 9);
  });
});
