import { groupStdErr } from "../random/replicaGroups.js";
import type { TallySummary } from "./tally.js";
import type { Estimate, TrappingSummary } from "./trappingSummary.js";

/**
 * Replaces the standard errors of a pooled summary by the spread of independent replicas (each a
 * summary of its own tally of counts[g] rays): where the rays inside a replica are not independent
 * (Sobol' launch points), the per-ray errors of the pooled tally would overstate the error. Every
 * mean is treated as a mean over its replica's rays (random/replicaGroups.ts, groupStdErr).
 */
export function withReplicaErrors(pooled: TallySummary, replicas: readonly TallySummary[], counts: readonly number[]): TallySummary {
  const spread = (valueOf: (s: TallySummary) => number): number => groupStdErr(replicas.map((s, g) => valueOf(s) * counts[g]), counts);
  return {
    ...pooled,
    stderr: pooled.stderr.map((_, c) => spread((s) => s.mean[c])),
    pathRatioStderr: spread((s) => s.pathRatio),
  };
}

/** The same for the light-trapping diagnostics: every {mean, stderr} gets the replica spread of its mean. */
export function trappingWithReplicaErrors(pooled: TrappingSummary, replicas: readonly TrappingSummary[], counts: readonly number[]): TrappingSummary {
  const spread = (valueOf: (s: TrappingSummary) => Estimate): Estimate => ({
    mean: valueOf(pooled).mean,
    stderr: groupStdErr(replicas.map((s, g) => valueOf(s).mean * counts[g]), counts),
  });
  return {
    ...pooled,
    entered: spread((s) => s.entered),
    freePathRatio: spread((s) => s.freePathRatio),
    passRemaining: pooled.passRemaining.map((_, k) => spread((s) => s.passRemaining[k])),
    passTail: spread((s) => s.passTail),
    escapeAngle: pooled.escapeAngle.map((_, b) => spread((s) => s.escapeAngle[b])),
    reflectionTotal: spread((s) => s.reflectionTotal),
    transmissionTotal: spread((s) => s.transmissionTotal),
  };
}
