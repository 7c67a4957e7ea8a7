import { describe, expect, it } from "vitest";
import { crossedStringsViewFactor, isolatedPlaneViewFactors } from "../../src/sky/crossedStrings.js";
import { checkRowGeometry, type RowGeometrySpec } from "../../src/sky/rowGeometry.js";
import { RowScene } from "../../src/sky/rowScene.js";
import { faceShadedFraction, groundShadedFractions } from "../../src/sky/shading.js";
import { faceViewFactors, groundCellSkyViews, groundSkyViewAt } from "../../src/sky/viewFactors.js";
import { inputErrorOf } from "../helpers/inputError.js";
const expectInputError = (fn: () => unknown, re: RegExp): void => { expect(inputErrorOf(fn)).toMatch(re); };

const rows = (tiltDeg: number, pitchM: number | undefined, centreHeightM = 1.5, slantLengthM = 2) =>
  new RowScene(checkRowGeometry({ tiltDeg, slantLengthM, centreHeightM, ...(pitchM === undefined ? {} : { pitchM }) }, "test"));

describe("crossedStringsViewFactor (Hottel)", () => {
  it("gives the textbook value for two facing parallel plates of width w at distance h: √(1 + (h/w)²) − h/w", () => {
    // Incropera & DeWitt, Table 13.1 (parallel plates with midlines connected by a perpendicular)
    for (const [w, h] of [[1, 1], [2, 0.5], [1, 3]] as const) {
      const f = crossedStringsViewFactor(0, 0, w, 0, 0, h, w, h);
      expect(f).toBeCloseTo(Math.sqrt(1 + (h / w) ** 2) - h / w, 12);
    }
  });

  it("obeys reciprocity L1·F12 = L2·F21", () => {
    // reciprocity rule (Incropera & DeWitt, eq. 13.3); unequal segments at an angle
    const f12 = crossedStringsViewFactor(0, 0, 2, 0, 0.5, 1, 1.2, 2.5);
    const f21 = crossedStringsViewFactor(0.5, 1, 1.2, 2.5, 0, 0, 2, 0);
    expect(2 * f12).toBeCloseTo(Math.hypot(0.7, 1.5) * f21, 12);
  });
});

describe("faceViewFactors(scene, face)", () => {
  it("of an isolated tilted row gives the closed forms (1 ± cos β)/2 for both faces", () => {
    // isolated plane over infinite ground: sky (1 + cos β)/2 and ground (1 − cos β)/2 from the front,
    // swapped for the rear (validation-sources.md, isolated tilted plane; Liu & Jordan)
    for (const tilt of [0, 20, 45, 75, 90]) {
      const s = rows(tilt, undefined, 3);
      const ref = isolatedPlaneViewFactors(tilt);
      const f = faceViewFactors(s, "front"), r = faceViewFactors(s, "rear");
      expect(f.sky).toBeCloseTo(ref.frontSky, 10);
      expect(f.groundTotal).toBeCloseTo(ref.frontGround, 10);
      expect(r.sky).toBeCloseTo(ref.rearSky, 10);
      expect(r.groundTotal).toBeCloseTo(ref.rearGround, 10);
      expect(f.rows + r.rows).toBe(0);
    }
  });

  it("sum to 1 over sky, rows and ground cells (summation rule)", () => {
    // summation rule Σ_j F_ij = 1 for an enclosure (Incropera & DeWitt, eq. 13.4)
    for (const [tilt, pitch] of [[25, 5], [40, 3], [10, 2.1], [90, 4]] as const) {
      for (const face of ["front", "rear"] as const) {
        const v = faceViewFactors(rows(tilt, pitch), face);
        expect(v.sky + v.rows + v.groundTotal).toBeCloseTo(1, 12);
      }
    }
  });

  it("rear face to the next row behind equals the crossed-strings value computed by hand", () => {
    // β = 30°, slant 2 m, centre 1.5 m, pitch 4 m. Row 0: A = (0.86603, 1.0), B = (−0.86603, 2.0);
    // row −1: A' = (−3.13397, 1.0), B' = (−4.86603, 2.0). Crossed strings |AB'| = √(5.73205² + 1²)
    // = 5.81863, |BA'| = √(2.26795² + 1²) = 2.47863; uncrossed |AA'| = |BB'| = 4.
    // F = (5.81863 + 2.47863 − 8)/(2·2) = 0.074315 (Hottel's rule; Modest ch. 4). Row 0 sees no other
    // row: the midpoint of any line from row 0 to row −2 lies on row −1.
    const v = faceViewFactors(rows(30, 4), "rear", 200);
    const cs = crossedStringsViewFactor(0.8660254, 1, -0.8660254, 2, -3.1339746, 1, -4.8660254, 2);
    expect(cs).toBeCloseTo(0.074315, 5);
    expect(v.rows).toBeCloseTo(cs, 6);
  });

  it("rear face to one ground cell under an isolated row equals the crossed-strings value", () => {
    // unobstructed pair: Hottel's rule applies directly (Incropera & DeWitt, ch. 13)
    const s = rows(30, undefined, 1.5);
    const v = faceViewFactors(s, "rear", 400);
    // cells wholly behind the module plane (it meets the ground at u = 0.866 + 1/tan 30° = 2.6 m)
    for (const k of [s.cellOf(0), s.cellOf(-1), s.cellOf(-3.5)]) {
      const [c0, c1] = s.cellBounds(k);
      const cs = crossedStringsViewFactor(s.uA, s.zA, s.uB, s.zB, c1, 0, c0, 0);
      expect(v.ground[k]!).toBeCloseTo(cs, 5);
    }
  });

  it("with the pitch → ∞ recovers the isolated row", () => {
    // limit of the row geometry (issue's validation list); isolated closed form (1 ± cos β)/2
    const ref = isolatedPlaneViewFactors(30);
    const far = faceViewFactors(rows(30, 4000), "rear");
    expect(far.sky).toBeCloseTo(ref.rearSky, 3);
    expect(far.groundTotal).toBeCloseTo(ref.rearGround, 3);
  });
});

describe("groundSkyViewAt / groundCellSkyViews", () => {
  it("below a horizontal isolated row equals 1 − sin(atan(L/2h)) (2D point view factor)", () => {
    // point view factor to an interval (sin θ2 − sin θ1)/2 (Modest, ch. 4)
    const s = rows(0, undefined, 2, 1);
    expect(groundSkyViewAt(s, 0)).toBeCloseTo(1 - Math.sin(Math.atan(0.5 / 2)), 12);
  });

  it("ground → rows per pitch equals rows → ground by reciprocity (Σ w_k F_k,rows = L (F_front,gnd + F_rear,gnd))", () => {
    // reciprocity A1F12 = A2F21 summed over a period (translation invariance of infinite rows);
    // the two sides are computed by different routines (interval union vs. sight tables)
    for (const [tilt, pitch, h] of [[25, 5, 1.5], [40, 3.2, 2], [10, 2.5, 1.2]] as const) {
      const s = rows(tilt, pitch, h);
      const sky = groundCellSkyViews(s, 8);
      let groundToRows = 0;
      for (let k = 0; k < s.nInner; k++) groundToRows += (1 - sky[k]!) * (pitch / s.nInner);
      const fr = faceViewFactors(s, "front", 100), re = faceViewFactors(s, "rear", 100);
      expect(groundToRows).toBeCloseTo(2 * (fr.groundTotal + re.groundTotal), 3);
    }
  });
});

describe("shading", () => {
  it("the ground shadow of rows covers slant·sin(β + α)/sin α per pitch for sun elevation α in the rows' plane", () => {
    // shadow length of a tilted slat of length L at solar elevation α (profile angle) facing the sun:
    // L·cos β + L·sin β / tan α = L·sin(α + β)/sin α (elementary geometry)
    const s = rows(30, 5, 1.5);
    const alpha = (35 * Math.PI) / 180;
    const out = groundShadedFractions(s, Math.cos(alpha), Math.sin(alpha), new Float64Array(s.nCells));
    const shaded = out.reduce((a, b) => a + b, 0) / s.nInner;
    expect(shaded * 5).toBeCloseTo((2 * Math.sin(alpha + (30 * Math.PI) / 180)) / Math.sin(alpha), 10);
  });

  it("of the front face by the row ahead: 1 − pitch·sin α / (L sin(α + β)) when the shadow reaches it", () => {
    // row-to-row shading of parallel slats (elementary geometry): shaded part of the slant
    // = 1 − p sin α / (L sin(α + β)) for low sun straight in front
    const s = rows(30, 3, 1.5);
    const alpha = (15 * Math.PI) / 180;
    const f = faceShadedFraction(s, Math.cos(alpha), Math.sin(alpha));
    expect(f).toBeCloseTo(1 - (3 * Math.sin(alpha)) / (2 * Math.sin(alpha + (30 * Math.PI) / 180)), 12);
    expect(faceShadedFraction(s, 0, 1)).toBe(0); // sun overhead: no row shades another
  });
});

describe("checkRowGeometry(spec, src)", () => {
  const ok: RowGeometrySpec = { tiltDeg: 30, slantLengthM: 2, centreHeightM: 1.5, pitchM: 5 };
  it("refuses negative pitch or height and a ground-coverage ratio outside (0, 1], naming the field", () => {
    expectInputError(() => checkRowGeometry({ ...ok, pitchM: -1 }, "site.json"), /pitchM/);
    expectInputError(() => checkRowGeometry({ ...ok, centreHeightM: -2 }, "site.json"), /centreHeightM/);
    expectInputError(() => checkRowGeometry({ ...ok, pitchM: undefined, groundCoverageRatio: 1.2 }, "site.json"), /groundCoverageRatio/);
    expectInputError(() => checkRowGeometry({ ...ok, pitchM: undefined, groundCoverageRatio: 0 }, "site.json"), /groundCoverageRatio/);
    expectInputError(() => checkRowGeometry({ ...ok, centreHeightM: 0.2 }, "site.json"), /centreHeightM.*below the ground/);
    expect(checkRowGeometry({ ...ok, pitchM: undefined, groundCoverageRatio: 0.4 }, "x").pitchM).toBeCloseTo(5, 12);
  });
});
