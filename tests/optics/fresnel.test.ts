import { describe, expect, it } from "vitest";
import {
  FRESNEL_COS_T_IM,
  FRESNEL_COS_T_RE,
  FRESNEL_RP,
  FRESNEL_RP_IM,
  FRESNEL_RP_RE,
  FRESNEL_RS,
  FRESNEL_RS_IM,
  FRESNEL_RS_RE,
  FRESNEL_TP,
  FRESNEL_TP_RE,
  FRESNEL_TS,
  FRESNEL_TS_RE,
  brewsterAngleRad,
  criticalAngleRad,
  fresnel,
} from "../../src/optics/fresnel.js";
import { DEG } from "../../src/util/math.js";

describe("fresnel(n1, k1, n2, k2, cosTheta1)", () => {
  it("gives ((n1 − n2)/(n1 + n2))² at normal incidence", () => {
    // Hecht, Optics §4.6.2: R = ((nt − ni)/(nt + ni))²; air → glass 1.5 gives 4 %
    const f = fresnel(1, 0, 1.5, 0, 1);
    expect(f[FRESNEL_RS]).toBeCloseTo(0.04, 15);
    expect(f[FRESNEL_RP]).toBeCloseTo(0.04, 15);
    expect(f[FRESNEL_TS]! + f[FRESNEL_RS]!).toBeCloseTo(1, 15);
    // air → Si (n = 3.94): ((3.94 − 1)/(4.94))²
    const g = fresnel(1, 0, 3.94, 0, 1);
    expect(g[FRESNEL_RS]).toBeCloseTo((2.94 / 4.94) ** 2, 14);
  });

  it("matches Fresnel's sine and tangent forms at oblique incidence (Hecht eqs. 4.42–4.45)", () => {
    // rs = −sin(θi − θt)/sin(θi + θt), rp = tan(θi − θt)/tan(θi + θt),
    // ts = 2 sinθt cosθi / sin(θi + θt), tp = 2 sinθt cosθi /(sin(θi + θt) cos(θi − θt))
    for (const [n1, n2] of [[1, 1.5], [1, 3.94], [1.5, 1.0], [1.49, 2.09]] as const) {
      for (const thetaDeg of [5, 20, 35, 50, 65, 80, 89]) {
        const ti = thetaDeg * DEG;
        const sinT = (n1 / n2) * Math.sin(ti);
        if (sinT >= 1) continue;
        const tt = Math.asin(sinT);
        const f = fresnel(n1, 0, n2, 0, Math.cos(ti));
        const rs = -Math.sin(ti - tt) / Math.sin(ti + tt);
        const rp = Math.tan(ti - tt) / Math.tan(ti + tt);
        const ts = (2 * Math.sin(tt) * Math.cos(ti)) / Math.sin(ti + tt);
        const tp = (2 * Math.sin(tt) * Math.cos(ti)) / (Math.sin(ti + tt) * Math.cos(ti - tt));
        expect(f[FRESNEL_RS_RE]).toBeCloseTo(rs, 12);
        expect(f[FRESNEL_RP_RE]).toBeCloseTo(rp, 12);
        expect(f[FRESNEL_TS_RE]).toBeCloseTo(ts, 12);
        expect(f[FRESNEL_TP_RE]).toBeCloseTo(tp, 12);
        // Snell: cosθt real and equal to cos(asin(n1 sinθi / n2))
        expect(f[FRESNEL_COS_T_RE]).toBeCloseTo(Math.cos(tt), 12);
        // power: Ts = (n2 cosθt / n1 cosθi)|ts|² (Hecht eq. 4.62), and R + T = 1
        expect(f[FRESNEL_TS]).toBeCloseTo(((n2 * Math.cos(tt)) / (n1 * Math.cos(ti))) * ts * ts, 12);
        expect(f[FRESNEL_TP]).toBeCloseTo(((n2 * Math.cos(tt)) / (n1 * Math.cos(ti))) * tp * tp, 12);
        expect(f[FRESNEL_RS]! + f[FRESNEL_TS]!).toBeCloseTo(1, 14);
        expect(f[FRESNEL_RP]! + f[FRESNEL_TP]!).toBeCloseTo(1, 14);
      }
    }
  });

  it("has Rp = 0 at the Brewster angle tanθB = n2/n1, from either side", () => {
    // Hecht §8.6.1: tanθp = nt/ni; air → glass 1.5 gives 56.31°, glass → air 33.69°
    expect(brewsterAngleRad(1, 1.5) / DEG).toBeCloseTo(56.3099, 4);
    for (const [n1, n2] of [[1, 1.5], [1.5, 1], [1, 3.94], [3.94, 1.49]] as const) {
      const f = fresnel(n1, 0, n2, 0, Math.cos(brewsterAngleRad(n1, n2)));
      expect(f[FRESNEL_RP]).toBeLessThan(1e-28);
      expect(f[FRESNEL_RS]).toBeGreaterThan(0.01);
    }
  });

  it("reflects totally beyond the critical angle sinθc = n2/n1, with a decaying transmitted wave", () => {
    // Hecht §4.7: glass (1.5) → air: θc = 41.81°
    const thetaC = criticalAngleRad(1.5, 1);
    expect(thetaC / DEG).toBeCloseTo(41.8103, 4);
    expect(Number.isNaN(criticalAngleRad(1, 1.5))).toBe(true);
    for (const thetaDeg of [41.9, 45, 60, 80, 89.9]) {
      const f = fresnel(1.5, 0, 1, 0, Math.cos(thetaDeg * DEG));
      expect(f[FRESNEL_RS]).toBeCloseTo(1, 14);
      expect(f[FRESNEL_RP]).toBeCloseTo(1, 14);
      expect(f[FRESNEL_TS]).toBe(0);
      expect(f[FRESNEL_TP]).toBe(0);
      // cosθt = i·√(sin²θ·n1²/n2² − 1): purely imaginary with positive imaginary part (decaying)
      const s = 1.5 * Math.sin(thetaDeg * DEG);
      expect(f[FRESNEL_COS_T_RE]).toBeCloseTo(0, 14);
      expect(f[FRESNEL_COS_T_IM]).toBeCloseTo(Math.sqrt(s * s - 1), 12);
      // relative phase Δ = δp − δs of total reflection: tan(Δ/2) = cosθ√(sin²θ − n²)/sin²θ,
      // n = n2/n1 (Born & Wolf, Principles of Optics §1.5.4, eq. 60); compared in magnitude
      const ti = thetaDeg * DEG;
      const n = 1 / 1.5;
      const sin2 = Math.sin(ti) ** 2;
      const expected = (Math.cos(ti) * Math.sqrt(sin2 - n * n)) / sin2;
      const ds = Math.atan2(f[FRESNEL_RS_IM]!, f[FRESNEL_RS_RE]!);
      const dp = Math.atan2(f[FRESNEL_RP_IM]!, f[FRESNEL_RP_RE]!);
      // the sign of Δ depends on the phase conventions; its magnitude does not
      expect(Math.abs(Math.tan((dp - ds) / 2))).toBeCloseTo(expected, 12);
    }
    // just inside the critical angle light still gets through
    const g = fresnel(1.5, 0, 1, 0, Math.cos(thetaC - 0.01 * DEG));
    expect(g[FRESNEL_TS]).toBeGreaterThan(0);
  });

  it("gives |(N − 1)/(N + 1)|² for an absorbing medium at normal incidence and conserves energy obliquely", () => {
    // Born & Wolf §14.2 (metals): R = ((n − 1)² + k²)/((n + 1)² + k²) at normal incidence
    const n = 0.05;
    const k = 4.152; // Ag, Johnson & Christy 1972 at 616.8 nm (data/materials/ag_johnson_christy1972.csv)
    const f = fresnel(1, 0, n, k, 1);
    expect(f[FRESNEL_RS]).toBeCloseTo(((n - 1) ** 2 + k * k) / ((n + 1) ** 2 + k * k), 14);
    for (const c of [0.9, 0.5, 0.2, 0.01]) {
      const g = fresnel(1.5, 0, 3.94, 0.0199, c);
      expect(g[FRESNEL_RS]! + g[FRESNEL_TS]!).toBeCloseTo(1, 14);
      expect(g[FRESNEL_RP]! + g[FRESNEL_TP]!).toBeCloseTo(1, 14);
      // the transmitted wave decays: Im(N2 cosθt) > 0
      const nc2Im = 3.94 * g[FRESNEL_COS_T_IM]! + 0.0199 * g[FRESNEL_COS_T_RE]!;
      expect(nc2Im).toBeGreaterThan(0);
    }
  });

  it("reflects fully at grazing incidence", () => {
    // limit θ → 90°: rs → −1, rp → −1 for any second medium (Hecht fig. 4.49)
    const f = fresnel(1, 0, 1.5, 0, 0);
    expect(f[FRESNEL_RS]).toBeCloseTo(1, 15);
    expect(f[FRESNEL_RP]).toBeCloseTo(1, 15);
    expect(f[FRESNEL_TS]).toBe(0);
    expect(f[FRESNEL_TP]).toBe(0);
    expect(f[FRESNEL_RP_IM]).toBe(0);
  });
});
