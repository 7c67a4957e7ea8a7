import type { YieldResult } from "./annualYield.js";
import { pairedStderrMatrix } from "../response/pairedDifference.js";
import type { ResponseMatrix } from "../response/responseMatrix.js";
import type { Plane } from "../site/site.js";
import type { SkyModel } from "../sky/transposition.js";
import type { YearContext } from "./yearContext.js";
import { prepareMatrix, yieldSweep } from "./yieldRun.js";

/**
 * Standard error of Q_A − Q_B per plane from the matrices' pairing groups: the yield's linear error
 * propagation run on the paired errors (pairedStderrMatrix). Undefined when the matrices cannot be
 * paired (no pairing groups, different grids or batches); then textureBenefit falls back to the
 * quadrature of both errors.
 */
export function pairedDeltaStdErrs(ctx: YearContext, a: ResponseMatrix, b: ResponseMatrix, src: string, planes: Plane[], sky: SkyModel, channel = "A_absorber"): number[] | undefined {
  const paired = pairedStderrMatrix(a, b, channel);
  if (paired === undefined) return undefined;
  return yieldSweep(ctx, prepareMatrix(paired, src, channel), planes, sky).map((y) => y.chargeStdErrAhM2);
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
 * (deltaStdErrAhM2: the yield of pairedStderrMatrix), the error accounts for the correlation of two
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
