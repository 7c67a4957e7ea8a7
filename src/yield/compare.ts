import type { YieldResult } from "./annualYield.js";

/** Texture benefit of A over B at one site and plane, in %, with its Monte Carlo standard error. */
export interface Benefit {
  benefitPct: number;
  benefitStdErrPct: number;
}

/**
 * 100 (Q_A/Q_B − 1). The two matrices come from independent Monte Carlo runs, so the relative errors
 * add in quadrature (first-order propagation): se = 100 (Q_A/Q_B) sqrt((se_A/Q_A)² + (se_B/Q_B)²).
 * Two studies traced with the same seed draw the same random streams per point (streamKey of seed and
 * point): their errors are then positively correlated and this figure overstates the error of the
 * difference (conservative, never too small).
 */
export function textureBenefit(a: YieldResult, b: YieldResult): Benefit {
  const ratio = a.chargeAhM2 / b.chargeAhM2;
  const rel = Math.hypot(a.chargeStdErrAhM2 / a.chargeAhM2, b.chargeStdErrAhM2 / b.chargeAhM2);
  return { benefitPct: 100 * (ratio - 1), benefitStdErrPct: 100 * ratio * rel };
}
