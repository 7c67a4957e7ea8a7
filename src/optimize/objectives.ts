/**
 * What the optimiser maximises, computed from an evaluation's response matrix:
 *   jsc     absorber photocurrent at one incidence angle under a spectrum (mA/cm²),
 *   angles  a weighted mean of that photocurrent over several incidence angles (mA/cm²),
 *   yield   the yearly absorbed charge at a site, plane, weather and sky model (A·h/m²).
 * Each also says which grid an evaluation needs, so nothing else is traced.
 */
import type { ResponseMatrix } from "../response/responseMatrix.js";
import { channelIndex, matrixIndex } from "../response/responseMatrix.js";
import type { Plane } from "../site/site.js";
import type { SkyModel } from "../sky/transposition.js";
import { photocurrentWeights, type Spectrum } from "../spectrum/index.js";
import type { StudyGrid } from "../study/studyTypes.js";
import { InputError } from "../util/errors.js";
import type { YearContext } from "../yield/yearContext.js";
import { bifacialYield, type Mounting } from "../yield/bifacialYield.js";
import type { HourlySpectra } from "../yield/hourlySpectra.js";
import { prepareMatrix, yieldSweep, type PreparedMatrix } from "../yield/yieldRun.js";
import type { Estimate } from "./types.js";

/**
 * The yearly charge: the front face under the fixed G173 shapes or hourly spectra (`spectra`, built
 * once for the evaluations' common wavelength grid), or front + rear of a bifacial module when a
 * mounting is given (the evaluation then also traces light from the rear; G173 shapes).
 */
export interface YieldObjective {
  kind: "yield";
  ctx: YearContext;
  plane: Plane;
  sky: SkyModel;
  channel: string;
  spectra?: { name: string; of: (pm: PreparedMatrix, gridNm: number[]) => HourlySpectra };
  mounting?: Mounting;
}

export type ObjectiveSpec =
  | { kind: "jsc"; thetaDeg: number; spectrum: Spectrum }
  | { kind: "angles"; thetaDeg: number[]; weights: number[]; spectrum: Spectrum }
  | YieldObjective;

export interface ObjectiveInfo {
  kind: ObjectiveSpec["kind"];
  /** Short name for tables and plots, e.g. "Jsc at 0°". */
  name: string;
  unit: string;
  /** One line on what is maximised. */
  description: string;
}

export function objectiveInfo(o: ObjectiveSpec): ObjectiveInfo {
  switch (o.kind) {
    case "jsc":
      return { kind: o.kind, name: `Jsc at ${o.thetaDeg}°`, unit: "mA/cm²", description: `absorber photocurrent at θ = ${o.thetaDeg}° under ${o.spectrum.name}` };
    case "angles": {
      const parts = o.thetaDeg.map((t, i) => `${t}°×${o.weights[i]}`).join(", ");
      return { kind: o.kind, name: "angle-weighted Jsc", unit: "mA/cm²", description: `weighted mean of the absorber photocurrent over θ (${parts}) under ${o.spectrum.name}` };
    }
    case "yield": {
      const faces = o.mounting === undefined ? "" : `, front + rear (${o.mounting.pitchM === null ? "isolated row" : `rows ${o.mounting.pitchM} m apart`}, ${o.mounting.slantLengthM} m modules at ${o.mounting.centreHeightM} m),`;
      const spectra = o.spectra === undefined ? "" : `, ${o.spectra.name} spectra`;
      return {
        kind: o.kind,
        name: o.mounting === undefined ? "yearly charge" : "yearly charge, front + rear",
        unit: "A·h/m²",
        description: `yearly absorbed charge (${o.channel})${faces} at ${o.ctx.siteName}, tilt ${o.plane.tiltDeg}°, azimuth ${o.plane.azimuthDeg}°, ${o.ctx.weatherSource}, ${o.sky} sky${spectra}`,
      };
    }
  }
}

/** The grid an evaluation traces: only the angles the objective reads, the study's azimuths and wavelengths. */
export function objectiveGrid(o: ObjectiveSpec, studyGrid: StudyGrid): StudyGrid {
  if (o.kind === "yield") return studyGrid;
  const thetaDeg = o.kind === "jsc" ? [o.thetaDeg] : o.thetaDeg;
  return { ...studyGrid, thetaDeg };
}

/** Absorber photocurrent at angle index it, mean over the matrix's azimuth entries (mA/cm²). */
function photocurrentAt(m: ResponseMatrix, w: Float64Array, it: number): Estimate {
  const ia = channelIndex(m, "A_absorber");
  const nPhi = m.phiDeg.length;
  let value = 0;
  let var2 = 0;
  for (let ip = 0; ip < nPhi; ip++) {
    for (let il = 0; il < m.wavelengthNm.length; il++) {
      const k = matrixIndex(m, it, ip, il, ia);
      value += (w[il] * m.mean[k]) / nPhi;
      const e = (w[il] * m.stderr[k]) / nPhi;
      var2 += e * e; // independent streams per point (weighting/weightedSum.ts)
    }
  }
  return { value, stderr: Math.sqrt(var2) };
}

/** Does an evaluation need the light-from-the-rear twin of its study? */
export function needsRearLight(o: ObjectiveSpec): boolean {
  return o.kind === "yield" && o.mounting !== undefined;
}

function yieldValue(o: YieldObjective, matrices: ResponseMatrix[], label: string): Estimate {
  const front = matrices.find((m) => m.lightFrom !== "rear");
  if (front === undefined) throw new InputError(`${label}: no front-lit matrix`);
  const pm = prepareMatrix(front, label, o.channel);
  if (o.mounting !== undefined) {
    const rear = matrices.find((m) => m.lightFrom === "rear");
    if (rear === undefined) throw new InputError(`${label}: the bifacial objective needs the rear-lit matrix`);
    const b = bifacialYield(o.ctx, o.plane, o.mounting, pm, prepareMatrix(rear, `${label} (rear)`, o.channel), o.sky);
    return { value: b.totalChargeAhM2, stderr: b.totalStdErrAhM2 };
  }
  const y = yieldSweep(o.ctx, pm, [o.plane], o.sky, false, o.spectra?.of(pm, front.wavelengthNm))[0];
  return { value: y.chargeAhM2, stderr: y.chargeStdErrAhM2 };
}

/** The objective's value and standard error from one evaluation's matrices (front-lit, and rear-lit when traced). */
export function objectiveValue(o: ObjectiveSpec, matrices: ResponseMatrix[], label: string): Estimate {
  if (o.kind === "yield") return yieldValue(o, matrices, label);
  const m = matrices.find((x) => x.lightFrom !== "rear");
  if (m === undefined) throw new InputError(`${label}: no front-lit matrix`);
  const w = photocurrentWeights(m.wavelengthNm, o.spectrum);
  if (o.kind === "jsc") return photocurrentAt(m, w, 0);
  const total = o.weights.reduce((a, b) => a + b, 0);
  let value = 0;
  let var2 = 0;
  o.thetaDeg.forEach((_, it) => {
    const j = photocurrentAt(m, w, it);
    value += (o.weights[it] * j.value) / total;
    var2 += ((o.weights[it] * j.stderr) / total) ** 2;
  });
  return { value, stderr: Math.sqrt(var2) };
}

/** "0:2,30:1,60:1" → angles and weights (weights ≥ 0, not all 0). */
export function parseAngleWeights(text: string, flag: string): { thetaDeg: number[]; weights: number[] } {
  const hint = "e.g. --angles 0:2,30:1,60:1 (angle in degrees : weight)";
  const thetaDeg: number[] = [];
  const weights: number[] = [];
  for (const part of text.split(",")) {
    const m = /^\s*([^:]+):([^:]+)\s*$/.exec(part);
    const t = m === null ? NaN : Number(m[1]);
    const w = m === null ? NaN : Number(m[2]);
    if (!(t >= 0 && t < 90) || !(w >= 0) || !Number.isFinite(w)) throw new InputError(`${flag}: expected angle:weight pairs with 0 ≤ angle < 90 and weight ≥ 0, got "${part}"`, hint);
    if (thetaDeg.includes(t)) throw new InputError(`${flag}: angle ${t}° is listed twice`, hint);
    thetaDeg.push(t);
    weights.push(w);
  }
  if (!weights.some((w) => w > 0)) throw new InputError(`${flag}: every weight is 0`, hint);
  const order = thetaDeg.map((_, i) => i).sort((a, b) => thetaDeg[a] - thetaDeg[b]);
  return { thetaDeg: order.map((i) => thetaDeg[i]), weights: order.map((i) => weights[i]) };
}
