import { describe, expect, it } from "vitest";
import { directionEnu, matrixAzimuthDeg, moduleAzimuthDeg, moduleFrame } from "../../src/sky/moduleFrame.js";
import { DEG } from "../../src/util/math.js";

describe("matrixAzimuthDeg(frame, d): where the yield reads the response matrix", () => {
  it("gives the (θ, φ) whose tracer launch direction is the light's travel direction −d", () => {
    // The tracer launches a ray at (θ, φ) travelling along (sinθ cosφ, sinθ sinφ, −cosθ) in the
    // texture frame (x, y, n) (docs/contracts.md Tracer; src/trace/kernel.ts, launch). Light from a
    // source in direction d travels along −d, so that launch vector, mapped to east–north–up, must be −d.
    for (const [tilt, az, rot] of [[0, 180, 0], [35, 180, 0], [60, 90, 20], [90, 250, 45], [150, 10, 0]] as const) {
      const f = moduleFrame({ tiltDeg: tilt, azimuthDeg: az, textureRotationDeg: rot });
      for (const [zen, sunAz] of [[10, 170], [40, 200], [70, 120], [85, 300], [30, 0]] as const) {
        const d = directionEnu(zen, sunAz, new Float64Array(3));
        const c = f.n[0]! * d[0]! + f.n[1]! * d[1]! + f.n[2]! * d[2]!;
        if (c <= 0.05) continue; // behind the module or grazing: no beam
        const th = Math.acos(c), ph = matrixAzimuthDeg(f, d) * DEG;
        const v = [Math.sin(th) * Math.cos(ph), Math.sin(th) * Math.sin(ph), -Math.cos(th)];
        for (let i = 0; i < 3; i++) expect(v[0] * f.x[i]! + v[1] * f.y[i]! + v[2] * f.n[i]!).toBeCloseTo(-d[i]!, 12);
      }
    }
  });

  it("is the source's module azimuth turned by 180° (noon sun south of a flat module travels north, φ = 0 along up-slope)", () => {
    const f = moduleFrame({ tiltDeg: 0, azimuthDeg: 180, textureRotationDeg: 0 }); // x = up-slope = north
    const d = directionEnu(30, 180, new Float64Array(3)); // sun due south
    expect(moduleAzimuthDeg(f, d)).toBeCloseTo(180, 9);
    const phi = matrixAzimuthDeg(f, d);
    expect(Math.min(phi, 360 - phi)).toBeCloseTo(0, 9);
  });
});
