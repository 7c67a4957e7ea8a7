/**
 * Independent replica groups of a traced point. Batch b of a point belongs to group b mod
 * REPLICA_GROUPS (the sweep's pairing groups); groups never share random numbers, so their means
 * are independent estimates of the point, whatever the sampling inside a group.
 */
export const REPLICA_GROUPS = 16;

/**
 * Fewest independent replicas a standard error may come from where samples inside a replica are
 * not independent (Sobol' sampling): from K replicas the error estimate itself scatters by about
 * 1/√(2(K − 1)) (27 % at K = 8; chi-square with K − 1 degrees of freedom).
 */
export const MIN_REPLICAS = 8;

/**
 * Standard error of the overall mean Σ s_g / Σ n_g from K independent groups with sums s_g over n_g
 * samples (groups with n_g = 0 are skipped): with f_g = n_g / N and group means m_g,
 * Var = K/(K − 1) · Σ f_g² (m_g − m)² (variance of a mean over clusters of unequal size, Cochran,
 * Sampling Techniques, ch. 9; from memory; with equal groups it is the textbook s²/K of the group
 * means). NaN with fewer than two groups.
 */
export function groupStdErr(sums: ArrayLike<number>, counts: ArrayLike<number>): number {
  let N = 0;
  let S = 0;
  let K = 0;
  for (let g = 0; g < counts.length; g++) {
    const n = counts[g];
    if (n <= 0) continue;
    N += n;
    S += sums[g];
    K++;
  }
  if (K < 2) return NaN;
  const mean = S / N;
  let ss = 0;
  for (let g = 0; g < counts.length; g++) {
    const n = counts[g];
    if (n <= 0) continue;
    const d = sums[g] / n - mean;
    ss += (n / N) * (n / N) * d * d;
  }
  return Math.sqrt((K / (K - 1)) * ss);
}
