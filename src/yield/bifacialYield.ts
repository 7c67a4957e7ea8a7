import type { Plane } from "../site/site.js";
import { moduleFrame } from "../sky/moduleFrame.js";
import { checkRowGeometry, groundCoverageRatio, type RowGeometry } from "../sky/rowGeometry.js";
import { rowLight } from "../sky/rowIrradiance.js";
import type { SkyModel } from "../sky/transposition.js";
import { annualYield, planeSetup } from "./annualYield.js";
import { faceQuadrature } from "./faceQuadrature.js";
import { faceYield, type FaceYieldResult } from "./faceYield.js";
import type { PreparedMatrix } from "./yieldRun.js";
import type { YearContext } from "./yearContext.js";

/** How the modules stand: size and height, and the row pitch (null: an isolated row). */
export interface Mounting {
  slantLengthM: number;
  centreHeightM: number;
  pitchM: number | null;
}

/** One face's year in the form the bifacial result reports. */
export interface FaceSummary {
  chargeAhM2: number;
  chargeStdErrAhM2: number;
  insolationKWhM2: number;
  monthlyChargeAhM2: number[];
  /** "transposition" (isolated front: the sky model as in `yield`) or "view-factors" (row faces, every rear). */
  model: "transposition" | "view-factors";
  /** The face's year-summed weight per angle node (the charge is linear in the matrix; src/yield/pairedCharge.ts). */
  nodeWeights: { beam: Float64Array; diffuse: Float64Array };
}

export interface BifacialResult {
  plane: Plane;
  geometry: RowGeometry;
  groundCoverageRatio: number;
  front: FaceSummary;
  rear: FaceSummary;
  rearDetail: FaceYieldResult;
  totalChargeAhM2: number;
  totalStdErrAhM2: number;
  /** Rear / front yearly charge (the gain of the rear face over a front-only module of the same stack), with its error. */
  bifacialGain: number;
  bifacialGainStdErr: number;
}

function summaryOf(y: FaceYieldResult): FaceSummary {
  return { chargeAhM2: y.chargeAhM2, chargeStdErrAhM2: y.chargeStdErrAhM2, insolationKWhM2: y.insolationKWhM2, monthlyChargeAhM2: y.monthlyChargeAhM2, model: "view-factors", nodeWeights: y.nodeWeights };
}

/**
 * Front + rear yearly charge of one plane and mounting. The front of an isolated row uses the sky
 * model as `yield` does (transposition quadrature, `annualYield`); in rows the front uses the same
 * view-factor model as the rear, so the row ahead's shadow and the sky it hides count. The two
 * matrices are independent Monte Carlo runs (a sweep traces light from the rear on streams of its
 * own, lightStreamKey): their errors add in quadrature.
 */
export function bifacialYield(ctx: YearContext, plane: Plane, mount: Mounting, front: PreparedMatrix, rear: PreparedMatrix, skyModel: SkyModel, src = "mounting"): BifacialResult {
  const geometry = checkRowGeometry({ tiltDeg: plane.tiltDeg, slantLengthM: mount.slantLengthM, centreHeightM: mount.centreHeightM, ...(mount.pitchM === null ? {} : { pitchM: mount.pitchM }) }, src);
  const light = rowLight(geometry, plane.azimuthDeg);
  const frame = moduleFrame(plane);
  const rearY = faceYield(ctx, light, frame, faceQuadrature(light, frame, "rear", rear.grid), rear.grid, rear.tables, skyModel);
  let frontS: FaceSummary;
  if (geometry.pitchM === null) {
    const y = annualYield(ctx, planeSetup(plane, front.grid), front.grid, front.tables, { skyModel });
    frontS = { chargeAhM2: y.chargeAhM2, chargeStdErrAhM2: y.chargeStdErrAhM2, insolationKWhM2: y.poaKWhM2, monthlyChargeAhM2: y.monthlyChargeAhM2, model: "transposition", nodeWeights: y.nodeWeights };
  } else {
    frontS = summaryOf(faceYield(ctx, light, frame, faceQuadrature(light, frame, "front", front.grid), front.grid, front.tables, skyModel));
  }
  const rearS = summaryOf(rearY);
  const g = rearS.chargeAhM2 / frontS.chargeAhM2;
  const rel = Math.hypot(rearS.chargeStdErrAhM2 / rearS.chargeAhM2 || 0, frontS.chargeStdErrAhM2 / frontS.chargeAhM2);
  return {
    plane, geometry, groundCoverageRatio: groundCoverageRatio(geometry),
    front: frontS, rear: rearS, rearDetail: rearY,
    totalChargeAhM2: frontS.chargeAhM2 + rearS.chargeAhM2,
    totalStdErrAhM2: Math.hypot(frontS.chargeStdErrAhM2, rearS.chargeStdErrAhM2),
    bifacialGain: g,
    bifacialGainStdErr: g * rel,
  };
}

/** Optical bifaciality of a stack: rear / front current at normal incidence under AM1.5G. */
export function opticalBifaciality(front: PreparedMatrix, rear: PreparedMatrix): number {
  return rear.tables.normalGlobal / front.tables.normalGlobal;
}

/** Every plane × pitch (pitch varies fastest). */
export function bifacialSweep(ctx: YearContext, planes: Plane[], pitchesM: (number | null)[], base: Omit<Mounting, "pitchM">, front: PreparedMatrix, rear: PreparedMatrix, skyModel: SkyModel): BifacialResult[] {
  const out: BifacialResult[] = [];
  for (const p of planes) for (const pitchM of pitchesM) out.push(bifacialYield(ctx, p, { ...base, pitchM }, front, rear, skyModel));
  return out;
}
