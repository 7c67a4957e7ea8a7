import type { Plane } from "../site/site.js";
import { cosIncidence, directionEnu, matrixAzimuthDeg, moduleFrame, type ModuleFrame } from "../sky/moduleFrame.js";
import { emptySkyParts, poaIrradianceWm2, skyParts, type SkyModel } from "../sky/transposition.js";
import { RAD } from "../util/math.js";
import type { AngularGrid } from "./angularGrid.js";
import { DEFAULT_QUADRATURE, dotNodes, planeQuadrature, type PlaneQuadrature, type QuadratureOptions } from "./hemisphere.js";
import { HourSpectralResponse, type HourlySpectra } from "./hourlySpectra.js";
import type { SpectralTables } from "./spectralTables.js";
import type { YearContext } from "./yearContext.js";

/** Per-plane precomputation: frame and hemisphere quadrature weights on the matrix's angle nodes. */
export interface PlaneSetup {
  plane: Plane;
  frame: ModuleFrame;
  quad: PlaneQuadrature;
}

export function planeSetup(plane: Plane, grid: AngularGrid, opts: QuadratureOptions = DEFAULT_QUADRATURE): PlaneSetup {
  const frame = moduleFrame(plane);
  return { plane, frame, quad: planeQuadrature(grid, frame, opts) };
}

/** Year totals split by where the light arrives from. */
export interface PartTotals {
  beam: number;
  circumsolar: number;
  sky: number;
  horizon: number;
  ground: number;
}

export interface YieldResult {
  plane: Plane;
  skyModel: SkyModel;
  /** Absorbed photon charge per module area over the year, A·h/m², with its Monte Carlo standard error. */
  chargeAhM2: number;
  chargeStdErrAhM2: number;
  monthlyChargeAhM2: number[];
  /** Plane-of-array insolation, kWh/m² (transposition closed form). */
  poaKWhM2: number;
  monthlyPoaKWhM2: number[];
  /** Charge by part (A·h/m²) and POA insolation by part (kWh/m²). */
  chargeByPartAhM2: PartTotals;
  poaByPartKWhM2: PartTotals;
  /** Current per W/m² of AM1.5G light at normal incidence, A/W (the reference). */
  normalIncidenceAPerW: number;
  /** charge / (POA insolation × normal-incidence AM1.5G current per W/m²): angular + spectral factor. */
  relativeToNormal: number;
  /** Optional hourly rows: POA W/m², current A/m², incidence angle (deg; NaN at night). */
  hourly?: { poaWm2: Float64Array; currentAm2: Float64Array; incidenceDeg: Float64Array };
  /** Year-summed irradiance weight per angle node (Wh/m²): Q = Σ (beam·J_beam + diffuse·J_diffuse). */
  nodeWeights: { beam: Float64Array; diffuse: Float64Array };
}

export interface YieldOptions {
  skyModel: SkyModel;
  hourly?: boolean;
  /** Hourly spectral shapes (src/yield/hourlySpectra.ts); without them every hour has the fixed G173 shapes. */
  spectra?: HourlySpectra;
}

function zeroParts(): PartTotals {
  return { beam: 0, circumsolar: 0, sky: 0, horizon: 0, ground: 0 };
}

/**
 * The year's absorbed charge. Per hour: beam and circumsolar at the sun's direction in the module
 * frame (interpolated beam table), isotropic sky, horizon band and ground through the precomputed
 * quadrature sums K = Σ q·J_diffuse. The same hour loop accumulates each angle node's total weight,
 * so the charge is linear in the matrix, Q = Σ_node (G·J_beam + D·J_diffuse), and its Monte Carlo
 * error follows as sqrt(Σ_node,λ (G w_beam,λ + D w_diffuse,λ)² se²) (independent matrix points).
 */
export function annualYield(ctx: YearContext, setup: PlaneSetup, grid: AngularGrid, tables: SpectralTables, opts: YieldOptions): YieldResult {
  const { frame, quad, plane } = setup;
  const kSky = dotNodes(quad.sky, tables.diffuse);
  const kGround = dotNodes(quad.ground, tables.diffuse);
  const kHorizon = dotNodes(quad.horizon, tables.diffuse);
  const sp = opts.spectra ? new HourSpectralResponse(opts.spectra, tables, quad, grid.nNodes) : undefined;
  const cb = frame.cosTilt, sb = frame.sinTilt;
  const parts = emptySkyParts();
  const idx = new Int32Array(4), w = new Float64Array(4), d = new Float64Array(3);
  const beamNodeWeight = new Float64Array(grid.nNodes);
  let isoSum = 0, horSum = 0, gndSum = 0;
  const monthlyQ = new Array<number>(12).fill(0), monthlyPoa = new Array<number>(12).fill(0);
  const qParts = zeroParts(), pParts = zeroParts();
  const n = ctx.nHours;
  const hourly = opts.hourly
    ? { poaWm2: new Float64Array(n), currentAm2: new Float64Array(n), incidenceDeg: new Float64Array(n) }
    : undefined;
  for (let h = 0; h < n; h++) {
    const z = ctx.zenithDeg[h]!;
    skyParts(opts.skyModel, z, ctx.ghiWm2[h]!, ctx.dniWm2[h]!, ctx.dhiWm2[h]!, ctx.albedo[h]!, ctx.e0nWm2[h]!, parts);
    const c = z < 90 ? cosIncidence(frame, z, ctx.azimuthDeg[h]!) : -1;
    // Perez (F1 > 1, F2 < 0 in the clearest bins) can give a plane facing away from the sun a
    // negative sky diffuse: it is clipped at zero, as common open implementations do (from memory).
    if (parts.circumsolarWm2 * Math.max(0, c) + parts.isoSkyWm2 * 0.5 * (1 + cb) + parts.horizonWm2 * sb < 0) {
      parts.circumsolarWm2 = 0;
      parts.isoSkyWm2 = 0;
      parts.horizonWm2 = 0;
    }
    if (sp) sp.beginHour(h);
    // beam and circumsolar: at the sun's direction in the module frame
    let jSun = 0;
    const pointWm2 = parts.dniWm2 + parts.circumsolarWm2;
    if (c > 0 && pointWm2 > 0) {
      directionEnu(z, ctx.azimuthDeg[h]!, d);
      const k = grid.weights(Math.acos(Math.min(1, c)) * RAD, matrixAzimuthDeg(frame, d), idx, w);
      if (sp) jSun = sp.beam(idx, w, k, pointWm2 * c);
      for (let q = 0; q < k; q++) {
        if (!sp) jSun += w[q]! * tables.beam[idx[q]!]!;
        beamNodeWeight[idx[q]!] += pointWm2 * c * w[q]!;
      }
    }
    const cPos = Math.max(0, c);
    const qBeam = parts.dniWm2 * cPos * jSun, qCs = parts.circumsolarWm2 * cPos * jSun;
    const qSky = parts.isoSkyWm2 * (sp ? sp.kSky : kSky), qHor = parts.horizonWm2 * (sp ? sp.kHorizon : kHorizon), qGnd = parts.groundWm2 * (sp ? sp.kGround : kGround);
    if (sp) sp.addDiffuse(parts.isoSkyWm2, parts.horizonWm2, parts.groundWm2);
    isoSum += parts.isoSkyWm2;
    horSum += parts.horizonWm2;
    gndSum += parts.groundWm2;
    const current = qBeam + qCs + qSky + qHor + qGnd;
    const poa = poaIrradianceWm2(parts, c, plane.tiltDeg);
    qParts.beam += qBeam; qParts.circumsolar += qCs; qParts.sky += qSky; qParts.horizon += qHor; qParts.ground += qGnd;
    pParts.beam += parts.dniWm2 * cPos;
    pParts.circumsolar += parts.circumsolarWm2 * cPos;
    pParts.sky += parts.isoSkyWm2 * 0.5 * (1 + cb);
    pParts.horizon += parts.horizonWm2 * sb;
    pParts.ground += parts.groundWm2 * 0.5 * (1 - cb);
    const m = ctx.month[h]!;
    monthlyQ[m] += current;
    monthlyPoa[m] += poa;
    if (hourly) {
      hourly.poaWm2[h] = poa;
      hourly.currentAm2[h] = current;
      hourly.incidenceDeg[h] = z < 90 ? Math.acos(Math.max(-1, Math.min(1, c))) * RAD : NaN;
    }
  }
  // Monte Carlo error: linear propagation through each node's accumulated weight
  const nL = tables.nLambda, wb = tables.weights.beam, wd = tables.weights.diffuse;
  let variance = sp ? sp.variance() : 0;
  const diffuseNodeWeight = new Float64Array(grid.nNodes);
  for (let node = 0; node < grid.nNodes; node++) {
    const g = beamNodeWeight[node]!;
    const dn = isoSum * quad.sky[node]! + horSum * quad.horizon[node]! + gndSum * quad.ground[node]!;
    diffuseNodeWeight[node] = dn;
    if (sp || (g === 0 && dn === 0)) continue;
    for (let l = 0; l < nL; l++) {
      const s = (g * wb[l]! + dn * wd[l]!) * tables.stderr[node * nL + l]!;
      variance += s * s;
    }
  }
  // hours are 1 h long: Σ current (A/m²) = charge in A·h/m²; Σ POA (W/m²) = Wh/m²
  const charge = monthlyQ.reduce((a, b) => a + b, 0);
  const poaWh = monthlyPoa.reduce((a, b) => a + b, 0);
  const kWh = (x: number): number => x / 1000;
  return {
    plane,
    skyModel: opts.skyModel,
    chargeAhM2: charge,
    chargeStdErrAhM2: Math.sqrt(variance),
    monthlyChargeAhM2: monthlyQ,
    poaKWhM2: kWh(poaWh),
    monthlyPoaKWhM2: monthlyPoa.map(kWh),
    chargeByPartAhM2: qParts,
    poaByPartKWhM2: { beam: kWh(pParts.beam), circumsolar: kWh(pParts.circumsolar), sky: kWh(pParts.sky), horizon: kWh(pParts.horizon), ground: kWh(pParts.ground) },
    normalIncidenceAPerW: tables.normalGlobal,
    relativeToNormal: poaWh > 0 ? charge / (poaWh * tables.normalGlobal) : NaN,
    hourly,
    nodeWeights: { beam: beamNodeWeight, diffuse: diffuseNodeWeight },
  };
}
