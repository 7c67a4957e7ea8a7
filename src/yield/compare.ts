import type { YieldResult } from "./annualYield.js";
import type { PairedMoments } from "../response/pairedMoments.js";
import { chargeMoments, combinationVariance } from "./pairedCharge.js";
import type { SpectralWeights } from "./spectralTables.js";

/**
 * Standard error of Q_A − Q_B at one plane from the matrices' pairing groups: their per-point moments
 * (pairedMoments) carried through both yields' node weights (chargeMoments; the yearly charge is
 * linear in the matrix). For yields under the fixed G173 shapes (compare, the demo), where the node
 * weights hold the whole error propagation.
 */
export function pairedDeltaStdErr(a: YieldResult, b: YieldResult, weights: SpectralWeights, moments: PairedMoments): number {
  return Math.sqrt(combinationVariance(chargeMoments(a.nodeWeights, b.nodeWeights, weights, moments), 1, 1));
}

/** Texture benefit of A over B at one site and plane, in %, with its Monte Carlo standard error. */
export interface Benefit {
  benefitPct: number;
  benefitStdErrPct: number;
  /** "paired": from the pairing groups (common random numbers); "independent": quadrature of both errors. */
  errorKind: "paired" | "independent";
  /** The quadrature figure (what independent runs would give), for comparison. */
  independentStdErrPct: number;
}

/**
 * 100 (Q_A/Q_B − 1). With the standard error of Q_A − Q_B from the matrices' pairing groups
 * (deltaStdErrAhM2: pairedDeltaStdErr), the error accounts for the correlation of two
 * studies traced on the same streams (common random numbers). Without it the relative errors add in
 * quadrature as for independent runs: se = 100 (Q_A/Q_B) sqrt((se_A/Q_A)² + (se_B/Q_B)²), which
 * overstates the error of correlated results.
 */
export function textureBenefit(a: YieldResult, b: YieldResult, deltaStdErrAhM2?: number): Benefit {
  const ratio = a.chargeAhM2 / b.chargeAhM2;
  const rel = Math.hypot(a.chargeStdErrAhM2 / a.chargeAhM2, b.chargeStdErrAhM2 / b.chargeAhM2);
  const independent = 100 * ratio * rel;
  if (deltaStdErrAhM2 === undefined || !Number.isFinite(deltaStdErrAhM2)) {
    return { benefitPct: 100 * (ratio - 1), benefitStdErrPct: independent, errorKind: "independent", independentStdErrPct: independent };
  }
  // Paired: Var(Q_A − Q_B) known, so Cov(Q_A, Q_B) = (V_A + V_B − V_Δ)/2, and the first-order
  // (delta-method) variance of r = Q_A/Q_B is (V_A − 2r·Cov + r²·V_B)/Q_B² (any statistics text).
  const vA = a.chargeStdErrAhM2 ** 2, vB = b.chargeStdErrAhM2 ** 2, vD = deltaStdErrAhM2 ** 2;
  const cov = (vA + vB - vD) / 2;
  const v = Math.max(0, vA - 2 * ratio * cov + ratio * ratio * vB) / (b.chargeAhM2 * b.chargeAhM2);
  return { benefitPct: 100 * (ratio - 1), benefitStdErrPct: 100 * Math.sqrt(v), errorKind: "paired", independentStdErrPct: independent };
}
