import type { ComboPlan, SweepPlan } from "../sweep/plan.js";
import { pointsPerCombo } from "../sweep/plan.js";
import { channelMean, groupOffset, PAIR_GROUPS, pointStdErr, replicaFreePathStdErr, tallyLength } from "../sweep/tally.js";
import { RESPONSE_FORMAT, RESPONSE_FORMAT_VERSION, type ResponseMatrix, type TrappingArrays } from "./responseMatrix.js";
import { ESCAPE_ANGLE_BINS, ESCAPE_ANGLE_BIN_DEG, MAX_PASSES } from "../trace/tallyLayout.js";
import { summarizeTrapping, type TrappingSummary } from "../trace/trappingSummary.js";

export function emptyTrapping(nPoints: number): TrappingArrays {
  return {
    maxPasses: MAX_PASSES,
    escapeAngleBinDeg: ESCAPE_ANGLE_BIN_DEG,
    entered: new Float64Array(nPoints),
    freePathRatio: new Float64Array(nPoints),
    freePathRatioStderr: new Float64Array(nPoints),
    passRemaining: new Float64Array(nPoints * (MAX_PASSES + 1)),
    escapeAngle: new Float64Array(nPoints * ESCAPE_ANGLE_BINS),
  };
}

function fillTrapping(a: TrappingArrays, q: number, s: TrappingSummary): void {
  a.entered[q] = s.entered.mean;
  a.freePathRatio[q] = s.freePathRatio.mean;
  a.freePathRatioStderr[q] = s.freePathRatio.stderr;
  s.passRemaining.forEach((e, k) => (a.passRemaining[q * (MAX_PASSES + 1) + k] = e.mean));
  a.passRemaining[q * (MAX_PASSES + 1) + MAX_PASSES] = s.passTail.mean;
  s.escapeAngle.forEach((e, b) => (a.escapeAngle[q * ESCAPE_ANGLE_BINS + b] = e.mean));
}

/**
 * The response matrix of one combination from its merged point tallies (global point order, see
 * sweep/plan.ts). A missing point (partial result) has nRays 0 and zeros elsewhere. Under Sobol'
 * launch sampling the standard errors come from the spread of the pairing groups (independent
 * replicas); NaN for a point of a partial result with fewer than MIN_REPLICAS groups traced.
 */
export function matrixFromTallies(
  plan: SweepPlan,
  comboIndex: number,
  tallyOf: (p: number) => Float64Array | undefined,
  partial: boolean,
): ResponseMatrix {
  const combo: ComboPlan = plan.combos[comboIndex];
  const nCh = combo.channels.length;
  const nPts = pointsPerCombo(plan.grid);
  const mean = new Float64Array(nPts * nCh);
  const stderr = new Float64Array(nPts * nCh);
  const nRays = new Float64Array(nPts);
  const pathRatio = new Float64Array(nPts);
  const G = PAIR_GROUPS;
  const groupMean = new Float64Array(nPts * G * nCh);
  const groupRays = new Float64Array(nPts * G);
  const trapping = emptyTrapping(nPts);
  for (let q = 0; q < nPts; q++) {
    const t = tallyOf(comboIndex * nPts + q);
    if (t === undefined) continue;
    if (t.length >= tallyLength(nCh)) {
      for (let g = 0; g < G; g++) {
        const o = groupOffset(nCh, g);
        const ng = t[o + nCh];
        groupRays[q * G + g] = ng;
        if (ng > 0) for (let c = 0; c < nCh; c++) groupMean[(q * G + g) * nCh + c] = t[o + c] / ng;
      }
    }
    for (let c = 0; c < nCh; c++) {
      mean[q * nCh + c] = channelMean(t, nCh, c);
      stderr[q * nCh + c] = pointStdErr(t, nCh, c, plan.rays.sampling);
    }
    const n = t[2 * nCh];
    nRays[q] = n;
    // The tracer tallies each ray's path in the absorber already divided by its thickness.
    pathRatio[q] = n > 0 ? t[2 * nCh + 1] / n : 0;
    if (n > 0) {
      fillTrapping(trapping, q, summarizeTrapping(t, nCh));
      // Under Sobol' sampling the α → 0 path's error, like the channels', comes from the replica
      // groups; where light entered too few of them to give a spread, the per-ray error stays.
      const replica = plan.rays.sampling === "sobol" && t.length >= tallyLength(nCh) ? replicaFreePathStdErr(t, nCh) : NaN;
      if (Number.isFinite(replica)) trapping.freePathRatioStderr[q] = replica;
    }
  }
  const m: ResponseMatrix = {
    format: RESPONSE_FORMAT,
    formatVersion: RESPONSE_FORMAT_VERSION,
    toolVersion: plan.toolVersion,
    studyName: plan.studyName,
    studyHash: combo.hash,
    seed: plan.seed,
    combo: { ...combo.values },
    thetaDeg: [...plan.grid.thetaDeg],
    phiDeg: [...plan.grid.phiDeg],
    phiMode: plan.grid.phiMode,
    wavelengthNm: [...plan.grid.wavelengthNm],
    channels: [...combo.channels],
    mean,
    stderr,
    nRays,
    pathRatio,
    pairGroups: G,
    groupMean,
    groupRays,
    trapping,
  };
  if (partial) m.partial = true;
  if (combo.lightFrom === "rear") m.lightFrom = "rear";
  return m;
}
