import { describe, expect, it } from "vitest";
import { siteFromObject } from "../../src/site/site.js";
import { astmG173 } from "../../src/spectrum/astmG173.js";
import { binProjector, projectPerWm2 } from "../../src/spectrum/binProjector.js";
import { birdRiordanInto, birdRiordanTable } from "../../src/spectrum/birdRiordan.js";
import { trapezoid } from "../../src/spectrum/integrate.js";
import { albedoShapeOn, parseSpectralAlbedo } from "../../src/spectrum/spectralAlbedo.js";
import { photocurrentWeights } from "../../src/spectrum/photocurrent.js";
import { InputError } from "../../src/util/errors.js";
import { parseSpectralSeries } from "../../src/weather/spectralSeries.js";
import { syntheticWeather } from "../../src/weather/synthetic.js";
import { yieldGrid } from "../../src/yield/angularGrid.js";
import { annualYield, planeSetup } from "../../src/yield/annualYield.js";
import { clearSkyHourlySpectra } from "../../src/yield/clearSkyHours.js";
import { fixedShapeSpectra } from "../../src/yield/hourlySpectra.js";
import { g173SpectralWeights, spectralTables } from "../../src/yield/spectralTables.js";
import { userHourlySpectra } from "../../src/yield/userHours.js";
import { yearContext } from "../../src/yield/yearContext.js";
import { spectralCorrection } from "../../src/yield/yieldJson.js";
import { makeMatrix, range } from "./matrixFixture.js";

const site = siteFromObject(
  {
    name: "Spectra Flats", latitudeDeg: 48.7, longitudeDeg: 9.6, elevationM: 400, utcOffsetHours: 1, albedo: 0.2,
    monthlyClearness: [0.34, 0.4, 0.45, 0.49, 0.5, 0.52, 0.53, 0.52, 0.5, 0.43, 0.35, 0.31],
  },
  "spectra.site.json",
);
const ctx = yearContext(site, syntheticWeather(site, 2027, 7));
const PLANE = { tiltDeg: 35, azimuthDeg: 180, textureRotationDeg: 0 };

function setup(absorber: (t: number, p: number, l: number) => number, stderr = 0.002) {
  const m = makeMatrix({ thetaDeg: range(0, 85, 5), absorber, stderr });
  const grid = yieldGrid(m, "m");
  const weights = g173SpectralWeights(m.wavelengthNm);
  return { m, grid, weights, tables: spectralTables(m, "A_absorber", grid, weights) };
}

describe("hourly spectra in the yield (annualYield with opts.spectra)", () => {
  it("with the fixed G173 shapes in every hour it equals the fixed-shape yield: charge, months and Monte Carlo error", () => {
    const { grid, weights, tables } = setup((t, _p, l) => 0.9 * Math.cos(t * Math.PI / 200) * (l < 1000 ? 1 : 0.4));
    const s = planeSetup(PLANE, grid);
    const a = annualYield(ctx, s, grid, tables, { skyModel: "perez" });
    const b = annualYield(ctx, s, grid, tables, { skyModel: "perez", spectra: fixedShapeSpectra(ctx.nHours, weights, "G173") });
    expect(Math.abs(b.chargeAhM2 / a.chargeAhM2 - 1)).toBeLessThan(1e-12);
    b.monthlyChargeAhM2.forEach((q, i) => expect(Math.abs(q - a.monthlyChargeAhM2[i]!)).toBeLessThan(1e-9 * a.chargeAhM2));
    expect(Math.abs(b.chargeStdErrAhM2 / a.chargeStdErrAhM2 - 1)).toBeLessThan(1e-9);
  });

  it("propagates the Monte Carlo error exactly: se(Q) = |∂Q/∂A(node, λ)|·se for a matrix with one uncertain point", () => {
    // Q is linear in the matrix (the charge is a linear form), so the derivative is a finite difference
    // and the propagated error of one point must equal |c|·se (independent-error propagation, any
    // statistics text).
    const base = setup((t) => 0.8 * Math.cos(t * Math.PI / 200), 0);
    const spectra = clearSkyHourlySpectra(ctx, site, undefined, base.m.wavelengthNm, base.weights);
    const node = 3, lambdaIdx = 20, nL = base.m.wavelengthNm.length;
    const tables = { ...base.tables, stderr: new Float64Array(base.tables.stderr.length) };
    tables.stderr[node * nL + lambdaIdx] = 0.01;
    const s = planeSetup(PLANE, base.grid);
    const q0 = annualYield(ctx, s, base.grid, tables, { skyModel: "perez", spectra });
    const bumped = { ...tables, absorptance: tables.absorptance.slice() };
    bumped.absorptance[node * nL + lambdaIdx] += 1;
    const q1 = annualYield(ctx, s, base.grid, bumped, { skyModel: "perez", spectra });
    const c = q1.chargeAhM2 - q0.chargeAhM2;
    expect(c).toBeGreaterThan(0);
    expect(q0.chargeStdErrAhM2).toBeCloseTo(Math.abs(c) * 0.01, 9);
  });

  it("clear-sky spectra: each hour's weights are the photocurrent weights of the model's spectrum per W/m² of it", () => {
    const { m, weights } = setup(() => 1);
    const spectra = clearSkyHourlySpectra(ctx, site, undefined, m.wavelengthNm, weights);
    expect(spectra.nOwnHours).toBeGreaterThan(4000);
    const t = birdRiordanTable();
    const h = ctx.zenithDeg.findIndex((z, i) => z < 40 && ctx.dniWm2[i]! > 300);
    const dir = new Float64Array(t.wavelengthNm.length), dif = new Float64Array(t.wavelengthNm.length);
    const atm = { pressureHpa: 1013.25 * Math.pow(1 - 2.25577e-5 * 400, 5.25588), precipitableWaterCm: 1.42, ozoneAtmCm: 0.3, aod500: 0.1, angstromExponent: 1.14, groundAlbedo: ctx.albedo[h]! };
    birdRiordanInto(t, ctx.zenithDeg[h]!, ctx.e0nWm2[h]! / 1367, atm, dir, dif);
    // photocurrentWeights (hat bins, mA/cm²) × 10 (A/m²) ÷ broadband W/m² (trapezoid on the model grid)
    const ref = photocurrentWeights(m.wavelengthNm, { name: "d", wavelengthNm: t.wavelengthNm, irradianceWm2PerNm: dir });
    const total = trapezoid(t.wavelengthNm, dir);
    const nL = m.wavelengthNm.length;
    for (const l of [0, 30, 60, 90]) expect(spectra.beam[h * nL + l]!).toBeCloseTo((ref[l]! * 10) / total, 12);
  });

  it("the projector is linear and scales any shape to 1 W/m² of broadband light", () => {
    const g = astmG173("global");
    const grid = range(300, 1200, 10);
    const p = binProjector(grid, g.wavelengthNm);
    const out = new Float64Array(grid.length), out2 = new Float64Array(grid.length);
    projectPerWm2(p, g.irradianceWm2PerNm, 1, out);
    projectPerWm2(p, g.irradianceWm2PerNm.map((x) => 7 * x), 1, out2);
    const ref = photocurrentWeights(grid, g);
    const total = trapezoid(g.wavelengthNm, g.irradianceWm2PerNm);
    for (let i = 0; i < grid.length; i++) {
      expect(out[i]!).toBeCloseTo((ref[i]! * 10) / total, 12);
      expect(out2[i]!).toBeCloseTo(out[i]!, 12);
    }
  });

  it("winter sun is redder: a red-absorbing cell gains against the G173 shapes in December relative to June, a blue-absorbing one loses", () => {
    // Low sun → longer path → more Rayleigh extinction of the blue in the beam (Bird & Riordan Eq. 2-4).
    const corr = (absorber: (l: number) => number): { dec: number; jun: number } => {
      const { m, grid, weights, tables } = setup((_t, _p, l) => absorber(l), 0);
      const spectra = clearSkyHourlySpectra(ctx, site, undefined, m.wavelengthNm, weights);
      const s = planeSetup(PLANE, grid);
      const c = spectralCorrection(annualYield(ctx, s, grid, tables, { skyModel: "perez", spectra }), annualYield(ctx, s, grid, tables, { skyModel: "perez" }));
      return { dec: c.monthlyPct[11]!, jun: c.monthlyPct[5]! };
    };
    const red = corr((l) => (l >= 800 ? 0.9 : 0));
    const blue = corr((l) => (l <= 500 ? 0.9 : 0));
    expect(red.dec).toBeGreaterThan(red.jun);
    expect(blue.dec).toBeLessThan(blue.jun);
  });
});

describe("spectral albedo (ground-reflected light)", () => {
  it("shapes the ground light: a reflectance stepping from 0 to 1 at 700 nm removes the blue from the ground weights and adds red", () => {
    const { m, weights } = setup(() => 1);
    const table = birdRiordanTable();
    const step = parseSpectralAlbedo("wavelength_nm,reflectance\n300,0\n690,0\n710,1\n4000,1\n", "step.csv");
    const plain = clearSkyHourlySpectra(ctx, site, undefined, m.wavelengthNm, weights);
    const shaped = clearSkyHourlySpectra(ctx, site, undefined, m.wavelengthNm, weights, albedoShapeOn(step, table.wavelengthNm));
    const nL = m.wavelengthNm.length;
    const h = ctx.zenithDeg.findIndex((z, i) => z < 40 && ctx.dniWm2[i]! > 300);
    const at = (nm: number): number => m.wavelengthNm.indexOf(nm);
    // per W/m² of ground light: no current below the edge (hat bins end at 690 nm), more above it
    expect(shaped.ground[h * nL + at(600)]).toBe(0);
    expect(shaped.ground[h * nL + at(900)]!).toBeGreaterThan(plain.ground[h * nL + at(900)]!);
    // beam and sky are untouched
    expect(shaped.beam[h * nL + at(600)]).toBe(plain.beam[h * nL + at(600)]);
  });

  it("refuses a reflectance above 1 or a bad header, naming file and line", () => {
    expect(() => parseSpectralAlbedo("wavelength_nm,reflectance\n400,0.2\n500,1.3\n", "alb.csv")).toThrow(/alb\.csv.*(line 3|:3)/);
    expect(() => parseSpectralAlbedo("wavelength_nm,rho\n400,0.2\n500,0.3\n", "alb.csv")).toThrow(/alb\.csv: header is "wavelength_nm,rho"; expected "wavelength_nm,reflectance"/);
  });
});

describe("measured spectra (spectral time series)", () => {
  const g = astmG173("global");
  /** A day of hourly measurements, written in the series format: the AM1.5G shape on G173's own wavelengths, or a band of it. */
  function seriesText(from = 280, to = 4000): string {
    const keep = Array.from(g.wavelengthNm.keys()).filter((j) => g.wavelengthNm[j]! >= from && g.wavelengthNm[j]! <= to);
    const lines = ["# measured test spectra", ["time", ...keep.map((j) => g.wavelengthNm[j])].join(",")];
    for (let hr = 6; hr < 20; hr++) {
      lines.push([`2027-06-21T${String(hr).padStart(2, "0")}:20:00+01:00`, ...keep.map((j) => String(g.irradianceWm2PerNm[j]! * (0.5 + hr / 40)))].join(","));
    }
    return lines.join("\n") + "\n";
  }

  it("a measured AM1.5G shape gives each measured hour the G173 global weights (share of broadband from G173 itself)", () => {
    const { m, weights } = setup(() => 1);
    const series = parseSpectralSeries(seriesText(), "meas.csv");
    const spectra = userHourlySpectra(ctx, series, m.wavelengthNm, weights);
    expect(spectra.nOwnHours).toBe(14);
    const h = Math.floor((Date.UTC(2027, 5, 21, 12, 20) - 3_600_000 - ctx.hourStartUtcMs[0]!) / 3_600_000);
    const nL = m.wavelengthNm.length;
    // the whole G173 range is measured (share 1), so the hour's weights are G173's global weights
    for (const l of [0, 10, 40, 80, 90]) expect(spectra.beam[h * nL + l]!).toBeCloseTo(weights.global[l]!, 12);
    expect(spectra.sky[h * nL + 40]).toBe(spectra.beam[h * nL + 40]);
  });

  const bad: [string, string, RegExp][] = [
    ["non-increasing wavelengths", "time,400,500,450\n2027-06-21T12:00:00+01:00,1,1,1\n", /line 1: wavelengths must increase strictly \(column 4: 450 nm after 500 nm\)/],
    ["a negative irradiance", "time,400,500\n2027-06-21T12:00:00+01:00,1,1\n2027-06-21T13:00:00+01:00,1,-0.2\n", /line 3: irradiance "-0.2" at 500 nm is not a number ≥ 0/],
    ["a time without offset", "time,400,500\n2027-06-21T12:00:00,1,1\n", /line 2: time "2027-06-21T12:00:00" is not ISO-8601 with an offset/],
    ["a first column not named time", "when,400,500\nx,1,1\n", /line 1: the first column must be "time"/],
  ];
  for (const [what, text, msg] of bad) {
    it(`refuses ${what}, naming file and line`, () => {
      expect(() => parseSpectralSeries(text, "spec.csv")).toThrow(InputError);
      expect(() => parseSpectralSeries(text, "spec.csv")).toThrow(/spec\.csv/);
      expect(() => parseSpectralSeries(text, "spec.csv")).toThrow(msg);
    });
  }

  it("refuses spectra that do not cover the matrix's wavelengths", () => {
    const { m, weights } = setup(() => 1);
    expect(() => userHourlySpectra(ctx, parseSpectralSeries(seriesText(350, 1050), "narrow.csv"), m.wavelengthNm, weights)).toThrow(/narrow\.csv: the measured spectra cover 350–1050 nm but the matrix's wavelengths span 300–1200 nm/);
  });
});
