import {
  DIAG_ENTERED,
  DIAG_ESCAPE_ANGLE,
  DIAG_FREE_PATH,
  DIAG_R_TOTAL,
  DIAG_T_TOTAL,
  ESCAPE_ANGLE_BINS,
  ESCAPE_ANGLE_BIN_DEG,
  MAX_PASSES,
  baseTallyLength,
  diagOffset,
  diagPassOffset,
} from "./tallyLayout.js";

/** A mean with its Monte Carlo standard error. */
export interface Estimate {
  mean: number;
  stderr: number;
}

/**
 * Light-trapping diagnostics of one point tally (src/trace/tallyLayout.ts). Ratios to the entered
 * power are ratio estimators Σx/Σe; their errors combine the relative errors of numerator and
 * denominator in quadrature (exact when every ray enters with the same power, as behind an ideal
 * randomiser, and a fair estimate otherwise).
 */
export interface TrappingSummary {
  /** Power that entered the absorber, per unit incident power. */
  entered: Estimate;
  /** Path in the absorber / thickness with the absorber's absorption removed (α → 0), per unit entered power. */
  freePathRatio: Estimate;
  /** Fraction of the entered power still in the absorber after pass k (index k − 1, k = 1..MAX_PASSES). */
  passRemaining: Estimate[];
  /** Σ over k > MAX_PASSES of the same fraction (so 1 + Σ_k remaining(k) is the mean number of passes started). */
  passTail: Estimate;
  /** R_escape power per incident power in polar-angle bins of ESCAPE_ANGLE_BIN_DEG (in the incidence medium). */
  escapeAngle: Estimate[];
  escapeAngleBinDeg: number;
  /** R_first + R_escape and T_first + T_escape per incident power, with errors from per-ray totals. */
  reflectionTotal: Estimate;
  transmissionTotal: Estimate;
}

function meanSe(t: Float64Array, o: number, n: number): Estimate {
  if (n <= 0) return { mean: 0, stderr: 0 };
  const mean = t[o] / n;
  if (n < 2) return { mean, stderr: 0 };
  const variance = Math.max(0, (t[o + 1] - n * mean * mean) / (n - 1));
  return { mean, stderr: Math.sqrt(variance / n) };
}

function ratio(x: Estimate, e: Estimate): Estimate {
  if (!(e.mean > 0)) return { mean: 0, stderr: 0 };
  const mean = x.mean / e.mean;
  const rx = x.mean !== 0 ? x.stderr / x.mean : 0;
  const re = e.stderr / e.mean;
  return { mean, stderr: Math.abs(mean) * Math.hypot(rx, re) };
}

/** Diagnostics of a point tally with nChannels channels. */
export function summarizeTrapping(tally: Float64Array, nChannels: number): TrappingSummary {
  const n = tally[2 * nChannels];
  const d = diagOffset(nChannels);
  const entered = meanSe(tally, d + DIAG_ENTERED, n);
  const passRemaining: Estimate[] = [];
  for (let k = 1; k <= MAX_PASSES; k++) passRemaining.push(ratio(meanSe(tally, d + diagPassOffset(k), n), entered));
  const escapeAngle: Estimate[] = [];
  for (let b = 0; b < ESCAPE_ANGLE_BINS; b++) escapeAngle.push(meanSe(tally, d + DIAG_ESCAPE_ANGLE + 2 * b, n));
  return {
    entered,
    freePathRatio: ratio(meanSe(tally, d + DIAG_FREE_PATH, n), entered),
    passRemaining,
    passTail: ratio(meanSe(tally, d + diagPassOffset(MAX_PASSES + 1), n), entered),
    escapeAngle,
    escapeAngleBinDeg: ESCAPE_ANGLE_BIN_DEG,
    reflectionTotal: meanSe(tally, d + DIAG_R_TOTAL, n),
    transmissionTotal: meanSe(tally, d + DIAG_T_TOTAL, n),
  };
}

/** 4n²: the path enhancement of an ideal randomising slab with a perfect rear in the weak-absorption limit (Yablonovitch 1982). */
export function lambertianLimit(nAbsorber: number): number {
  return 4 * nAbsorber * nAbsorber;
}

/**
 * Absorbed power per depth bin (per unit incident power) of a tally traced with a depth grid
 * (compile option depthEdgesUm), bin i at tally[baseTallyLength + 2i].
 */
export function summarizeDepthBins(tally: Float64Array, nChannels: number, nBins: number): Estimate[] {
  const n = tally[2 * nChannels];
  const o = baseTallyLength(nChannels);
  const out: Estimate[] = [];
  for (let i = 0; i < nBins; i++) out.push(meanSe(tally, o + 2 * i, n));
  return out;
}
