import { describe, expect, it } from "vitest";
import { siteFromObject } from "../../src/site/site.js";
import { moduleFrame } from "../../src/sky/moduleFrame.js";
import { checkRowGeometry } from "../../src/sky/rowGeometry.js";
import { faceIrradiance, rowHour, rowLight, updateRowHour } from "../../src/sky/rowIrradiance.js";
import { yieldGrid } from "../../src/yield/angularGrid.js";
import { bifacialYield, opticalBifaciality } from "../../src/yield/bifacialYield.js";
import { faceQuadrature } from "../../src/yield/faceQuadrature.js";
import { faceYield } from "../../src/yield/faceYield.js";
import { spectralTables, type SpectralWeights } from "../../src/yield/spectralTables.js";
import { yearContext } from "../../src/yield/yearContext.js";
import { prepareMatrix } from "../../src/yield/yieldRun.js";
import { syntheticWeather } from "../../src/weather/synthetic.js";
import { makeMatrix, range } from "./matrixFixture.js";

const site = siteFromObject(
  { name: "Lindqvarn Heath", latitudeDeg: 52.3, longitudeDeg: 13.1, elevationM: 60, utcOffsetHours: 1, albedo: 0.3,
    monthlyClearness: [0.3, 0.38, 0.43, 0.47, 0.5, 0.5, 0.51, 0.5, 0.46, 0.4, 0.32, 0.28] },
  "lindqvarn.site.json",
);
const ctx = yearContext(site, syntheticWeather(site, 2027, 11));
const plane = (tiltDeg: number) => ({ tiltDeg, azimuthDeg: 180, textureRotationDeg: 0 });
const ideal = makeMatrix({ thetaDeg: range(0, 90, 5), absorber: () => 1 });
const idealGrid = yieldGrid(ideal, "ideal");
function unitWeights(n: number): SpectralWeights {
  const one = new Float64Array(n);
  one[0] = 1;
  return { beam: one, diffuse: one, global: one };
}
const idealTables = spectralTables(ideal, "A_absorber", idealGrid, unitWeights(ideal.wavelengthNm.length));

describe("faceQuadrature(light, frame, face, grid)", () => {
  it("with J = 1 sums to the face's 2D view factors (sky, rows, each ground band)", () => {
    // a 3D direction's target depends only on its projection onto the cross-section of infinite
    // rows, so the hemisphere integral of cos θ/π over the directions meeting a target is the 2D view
    // factor (Modest, Radiative Heat Transfer, ch. 4, infinitely long surfaces). Tolerance: midpoint
    // rule across the steps at band edges, O(Δθ) with Δθ = 2° (measured ≤ 2e-3).
    for (const [tilt, pitch] of [[30, 5], [15, 3]] as const) {
      const g = checkRowGeometry({ tiltDeg: tilt, slantLengthM: 2, centreHeightM: 1.5, pitchM: pitch }, "t");
      const light = rowLight(g, 180, 20);
      const frame = moduleFrame(plane(tilt));
      for (const face of ["front", "rear"] as const) {
        const q = faceQuadrature(light, frame, face, idealGrid);
        const vf = face === "front" ? light.front : light.rear;
        const sum = (a: Float64Array, off = 0, n = a.length) => { let s = 0; for (let i = off; i < off + n; i++) s += a[i]!; return s; };
        expect(Math.abs(sum(q.sky) - vf.sky)).toBeLessThan(2e-3);
        expect(Math.abs(sum(q.rows) - vf.rows)).toBeLessThan(2e-3);
        for (let c = 0; c < q.nCells; c++) expect(Math.abs(sum(q.ground, c * q.nNodes, q.nNodes) - vf.ground[c]!)).toBeLessThan(2e-3);
      }
    }
  });
});

describe("rear irradiance", () => {
  it("of a horizontal isolated module high above a uniformly lit ground tends to albedo × GHI", () => {
    // the rear of a horizontal plane sees only ground (view factor 1); its own shadow and its
    // blocking of the ground's sky view shrink as slant/height (validation-sources.md, isolated plane)
    const ghi = 800, dni = 700, dhi = 800 - 700 * Math.cos((20 * Math.PI) / 180);
    for (const [h, tol] of [[50, 2e-2], [500, 2e-3], [5000, 2e-4]] as const) {
      const light = rowLight(checkRowGeometry({ tiltDeg: 0, slantLengthM: 2, centreHeightM: h }, "t"), 180);
      const hour = updateRowHour(light, 20, 180, dni, dhi, 0.3, rowHour(light));
      const e = faceIrradiance(light, "rear", hour, dni, dhi);
      expect(e.beam).toBe(0);
      expect(e.sky).toBeCloseTo(0, 12);
      expect(Math.abs(e.total / (0.3 * ghi) - 1)).toBeLessThan(tol);
    }
  });

  it("over a year: the rear charge of an ideal absorber equals the rear irradiation (quadrature vs view factors)", () => {
    // same light, two routes: response quadrature with A = 1 and the closed view-factor form
    const g = checkRowGeometry({ tiltDeg: 30, slantLengthM: 2, centreHeightM: 1.5, pitchM: 5 }, "t");
    const light = rowLight(g, 180, 50);
    const frame = moduleFrame(plane(30));
    for (const face of ["front", "rear"] as const) {
      const y = faceYield(ctx, light, frame, faceQuadrature(light, frame, face, idealGrid), idealGrid, idealTables, "isotropic");
      expect(y.chargeAhM2 / (y.insolationKWhM2 * 1000)).toBeCloseTo(1, 2);
    }
  });

  it("of rows tends to the isolated row's as the pitch grows", () => {
    // limit of the row geometry (pitch → ∞ recovers the isolated module)
    const frame = moduleFrame(plane(25));
    const yOf = (pitchM?: number) => {
      const light = rowLight(checkRowGeometry({ tiltDeg: 25, slantLengthM: 2, centreHeightM: 1.2, ...(pitchM ? { pitchM } : {}) }, "t"), 180, pitchM ? Math.round(pitchM / 0.1) : 100);
      return faceYield(ctx, light, frame, faceQuadrature(light, frame, "rear", idealGrid), idealGrid, idealTables, "isotropic");
    };
    const iso = yOf(), near = yOf(4), far = yOf(100);
    expect(near.insolationKWhM2).toBeLessThan(iso.insolationKWhM2);
    expect(Math.abs(far.insolationKWhM2 / iso.insolationKWhM2 - 1)).toBeLessThan(0.01);
  });
});

describe("bifacialYield(ctx, plane, mount, front, rear, sky)", () => {
  it("reports front, rear, total and gain; the gain grows with the pitch and with the albedo's share of the rear", () => {
    // facts of the trade (common practice, from memory): rear gains of a few % to ~15 % at albedo
    // 0.2–0.3 for fixed-tilt rows, larger for wider pitch — sanity only
    const front = prepareMatrix(makeMatrix({ thetaDeg: range(0, 90, 10), absorber: (t) => 0.9 * Math.cos((t * Math.PI) / 360) }), "front");
    const rear = prepareMatrix(makeMatrix({ thetaDeg: range(0, 90, 10), absorber: (t) => 0.8 * Math.cos((t * Math.PI) / 360) }), "rear");
    expect(opticalBifaciality(front, rear)).toBeCloseTo(0.8 / 0.9, 10);
    const base = { slantLengthM: 2, centreHeightM: 1.5 };
    const rows = [4, 6, 10].map((pitchM) => bifacialYield(ctx, plane(30), { ...base, pitchM }, front, rear, "perez"));
    for (const r of rows) {
      expect(r.totalChargeAhM2).toBeCloseTo(r.front.chargeAhM2 + r.rear.chargeAhM2, 9);
      expect(r.bifacialGain).toBeGreaterThan(0.02);
      expect(r.bifacialGain).toBeLessThan(0.25);
    }
    expect(rows[0]!.bifacialGain).toBeLessThan(rows[1]!.bifacialGain);
    expect(rows[1]!.bifacialGain).toBeLessThan(rows[2]!.bifacialGain);
  });
});
