import type { PairedMoments } from "../response/pairedMoments.js";
import type { BifacialResult } from "./bifacialYield.js";
import { chargeMoments, combinationVariance } from "./pairedCharge.js";
import type { SpectralWeights } from "./spectralTables.js";

/** A − B with its standard error and the error an independence assumption gives. */
export interface DifferenceEstimate {
  delta: number;
  stdErr: number;
  independentStdErr: number;
}

/** Stack A against stack B at one plane and mounting, with light on both faces. */
export interface BifacialDifference {
  /** Yearly charge differences, A·h/m². */
  front: DifferenceEstimate;
  rear: DifferenceEstimate;
  total: DifferenceEstimate;
  /** Bifacial gain (rear / front) of A minus that of B, in percentage points. */
  gainPts: DifferenceEstimate;
  /** 100 (T_A/T_B − 1), %, T = front + rear. */
  benefitPct: DifferenceEstimate;
  /** "paired": stdErr from the pairing groups; "independent": stdErr = independentStdErr. */
  errorKind: "paired" | "independent";
}

/**
 * The pairing groups of both faces: front A against front B, rear A against rear B (each pair on
 * one grid, pairedMoments), with each face's spectral weights.
 */
export interface BifacialPairing {
  front: PairedMoments;
  rear: PairedMoments;
  frontWeights: SpectralWeights;
  rearWeights: SpectralWeights;
}

/**
 * Differences of front, rear and total yearly charge, bifacial gain and total benefit of A over B.
 * Independent errors: each stack's own errors in quadrature. Paired errors: every quantity is a
 * smooth function of the four charges F_A, R_A, F_B, R_B, linearised (delta method, any statistics
 * text) into cA·Q_A − cB·Q_B per face, whose variance comes from the pairing groups
 * (combinationVariance). Front and rear light are traced on separate streams (lightStreamKey), so a
 * front charge and a rear charge are independent, of the same stack or not: face variances add.
 *   ΔT: Var = V_F(1, 1) + V_R(1, 1)
 *   Δg, g = R/F: δg = δR/F − g·δF/F, so Var = V_R(1/F_A, 1/F_B) + V_F(g_A/F_A, g_B/F_B)
 *   benefit, r = T_A/T_B: δr = (δT_A − r·δT_B)/T_B, so Var = (V_F(1, r) + V_R(1, r))/T_B²
 */
export function bifacialDifference(a: BifacialResult, b: BifacialResult, pairing?: BifacialPairing): BifacialDifference {
  const fA = a.front.chargeAhM2, fB = b.front.chargeAhM2, rA = a.rear.chargeAhM2, rB = b.rear.chargeAhM2;
  const tA = a.totalChargeAhM2, tB = b.totalChargeAhM2;
  const ratio = tA / tB;
  const independent = {
    front: Math.hypot(a.front.chargeStdErrAhM2, b.front.chargeStdErrAhM2),
    rear: Math.hypot(a.rear.chargeStdErrAhM2, b.rear.chargeStdErrAhM2),
    total: Math.hypot(a.totalStdErrAhM2, b.totalStdErrAhM2),
    gainPts: 100 * Math.hypot(a.bifacialGainStdErr, b.bifacialGainStdErr),
    benefitPct: 100 * ratio * Math.hypot(a.totalStdErrAhM2 / tA, b.totalStdErrAhM2 / tB),
  };
  let se = independent;
  if (pairing !== undefined) {
    const vF = chargeMoments(a.front.nodeWeights, b.front.nodeWeights, pairing.frontWeights, pairing.front);
    const vR = chargeMoments(a.rear.nodeWeights, b.rear.nodeWeights, pairing.rearWeights, pairing.rear);
    const gA = a.bifacialGain, gB = b.bifacialGain;
    se = {
      front: Math.sqrt(combinationVariance(vF, 1, 1)),
      rear: Math.sqrt(combinationVariance(vR, 1, 1)),
      total: Math.sqrt(combinationVariance(vF, 1, 1) + combinationVariance(vR, 1, 1)),
      gainPts: 100 * Math.sqrt(combinationVariance(vR, 1 / fA, 1 / fB) + combinationVariance(vF, gA / fA, gB / fB)),
      benefitPct: (100 * Math.sqrt(combinationVariance(vF, 1, ratio) + combinationVariance(vR, 1, ratio))) / tB,
    };
  }
  const est = (delta: number, k: keyof typeof independent): DifferenceEstimate => ({ delta, stdErr: se[k], independentStdErr: independent[k] });
  return {
    front: est(fA - fB, "front"),
    rear: est(rA - rB, "rear"),
    total: est(tA - tB, "total"),
    gainPts: est(100 * (a.bifacialGain - b.bifacialGain), "gainPts"),
    benefitPct: est(100 * (ratio - 1), "benefitPct"),
    errorKind: pairing === undefined ? "independent" : "paired",
  };
}
