import type { Face } from "../sky/faceSight.js";
import { cosIncidence, directionEnu, matrixAzimuthDeg, type ModuleFrame } from "../sky/moduleFrame.js";
import { rowHour, updateRowHour, type RowLight } from "../sky/rowIrradiance.js";
import { emptySkyParts, skyParts, type SkyModel } from "../sky/transposition.js";
import { RAD } from "../util/math.js";
import type { AngularGrid } from "./angularGrid.js";
import { faceResponse, type FaceQuadrature } from "./faceQuadrature.js";
import type { SpectralTables } from "./spectralTables.js";
import type { YearContext } from "./yearContext.js";

/** Year totals of one face by origin: point source at the sun (beam + circumsolar), sky, ground. */
export interface FaceParts {
  beam: number;
  sky: number;
  ground: number;
}

export interface FaceYieldResult {
  face: Face;
  /** Absorbed photon charge per module area over the year, A·h/m², and its Monte Carlo standard error. */
  chargeAhM2: number;
  chargeStdErrAhM2: number;
  monthlyChargeAhM2: number[];
  /** Irradiation on the face, kWh/m² (view-factor closed form). */
  insolationKWhM2: number;
  monthlyInsolationKWhM2: number[];
  chargeByPartAhM2: FaceParts;
  insolationByPartKWhM2: FaceParts;
  /** Year-summed irradiance weight per angle node (Wh/m²): Q = Σ (beam·J_beam + diffuse·J_diffuse). */
  nodeWeights: { beam: Float64Array; diffuse: Float64Array };
}

/**
 * The year's absorbed charge of one face of a row (front or rear) with the view-factor light model
 * (src/sky/rowIrradiance.ts). Per hour: the sky model's point part (DNI + circumsolar) at the sun's
 * direction in the face's frame, less the neighbours' shadow; its isotropic sky part over the sky the
 * face sees; each ground cell's radiosity over the directions that meet it. The horizon band of the
 * Perez model is not applied to row faces. The charge is linear in the matrix, so its Monte Carlo
 * error propagates through the node weights as in annualYield.
 */
export function faceYield(
  ctx: YearContext, light: RowLight, frame: ModuleFrame, quad: FaceQuadrature,
  grid: AngularGrid, tables: SpectralTables, skyModel: SkyModel,
): FaceYieldResult {
  const face = quad.face, sign = face === "front" ? 1 : -1;
  const vf = face === "front" ? light.front : light.rear;
  const k = faceResponse(quad, tables.diffuse);
  const parts = emptySkyParts(), hour = rowHour(light);
  const idx = new Int32Array(4), w = new Float64Array(4), d = new Float64Array(3);
  const beamNode = new Float64Array(grid.nNodes), yearB = new Float64Array(quad.nCells);
  const monthlyQ = new Array<number>(12).fill(0), monthlyE = new Array<number>(12).fill(0);
  const q: FaceParts = { beam: 0, sky: 0, ground: 0 }, e: FaceParts = { beam: 0, sky: 0, ground: 0 };
  let isoSum = 0;
  for (let h = 0; h < ctx.nHours; h++) {
    const z = ctx.zenithDeg[h]!, az = ctx.azimuthDeg[h]!;
    skyParts(skyModel, z, ctx.ghiWm2[h]!, ctx.dniWm2[h]!, ctx.dhiWm2[h]!, ctx.albedo[h]!, ctx.e0nWm2[h]!, parts);
    updateRowHour(light, z, az, ctx.dniWm2[h]!, ctx.dhiWm2[h]!, ctx.albedo[h]!, hour);
    const c = z < 90 ? sign * cosIncidence(frame, z, az) : -1;
    // point part at the sun, in the face's own frame (θ from the face normal)
    let qBeam = 0, eBeam = 0;
    const pointWm2 = (parts.dniWm2 + parts.circumsolarWm2) * (1 - hour.faceShaded);
    if (c > 0 && pointWm2 > 0) {
      directionEnu(z, az, d);
      const n = grid.weights(Math.acos(Math.min(1, c)) * RAD, matrixAzimuthDeg(frame, d), idx, w);
      let j = 0;
      for (let i = 0; i < n; i++) {
        j += w[i]! * tables.beam[idx[i]!]!;
        beamNode[idx[i]!] += pointWm2 * c * w[i]!;
      }
      eBeam = pointWm2 * c;
      qBeam = eBeam * j;
    }
    // diffuse sky (isotropic part) and ground cells
    const qSky = parts.isoSkyWm2 * k.sky;
    let qGnd = 0, eGnd = 0;
    const b = hour.radiosityWm2;
    for (let cell = 0; cell < quad.nCells; cell++) {
      qGnd += b[cell]! * k.ground[cell]!;
      eGnd += b[cell]! * vf.ground[cell]!;
      yearB[cell] += b[cell]!;
    }
    isoSum += parts.isoSkyWm2;
    const eSky = parts.isoSkyWm2 * vf.sky;
    q.beam += qBeam; q.sky += qSky; q.ground += qGnd;
    e.beam += eBeam; e.sky += eSky; e.ground += eGnd;
    const m = ctx.month[h]!;
    monthlyQ[m] += qBeam + qSky + qGnd;
    monthlyE[m] += eBeam + eSky + eGnd;
  }
  // Monte Carlo error through each node's year weight (independent matrix points)
  const diffuseNode = new Float64Array(grid.nNodes);
  for (let n = 0; n < grid.nNodes; n++) {
    let s = isoSum * quad.sky[n]!;
    for (let cell = 0; cell < quad.nCells; cell++) s += yearB[cell]! * quad.ground[cell * grid.nNodes + n]!;
    diffuseNode[n] = s;
  }
  const nL = tables.nLambda, wb = tables.weights.beam, wd = tables.weights.diffuse;
  let variance = 0;
  for (let n = 0; n < grid.nNodes; n++) {
    const g = beamNode[n]!, dn = diffuseNode[n]!;
    if (g === 0 && dn === 0) continue;
    for (let l = 0; l < nL; l++) {
      const s = (g * wb[l]! + dn * wd[l]!) * tables.stderr[n * nL + l]!;
      variance += s * s;
    }
  }
  const kWh = (x: number): number => x / 1000;
  const sum = (a: number[]): number => a.reduce((x, y) => x + y, 0);
  return {
    face,
    chargeAhM2: sum(monthlyQ),
    chargeStdErrAhM2: Math.sqrt(variance),
    monthlyChargeAhM2: monthlyQ,
    insolationKWhM2: kWh(sum(monthlyE)),
    monthlyInsolationKWhM2: monthlyE.map(kWh),
    chargeByPartAhM2: q,
    insolationByPartKWhM2: { beam: kWh(e.beam), sky: kWh(e.sky), ground: kWh(e.ground) },
    nodeWeights: { beam: beamNode, diffuse: diffuseNode },
  };
}

