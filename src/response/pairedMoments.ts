import type { ResponseMatrix } from "./responseMatrix.js";

/**
 * Per-point variances and covariance of two matrices' means of one channel, estimated from their
 * pairing groups (src/sweep/tally.ts): varA[q], varB[q] and cov[q] at every matrix point q
 * ([θ][φ][λ]). With both traced on the same streams per batch (common random numbers) cov is large
 * and Var(cA·A − cB·B) = cA²·varA − 2·cA·cB·cov + cB²·varB is small for cA ≈ cB.
 */
export interface PairedMoments {
  varA: Float64Array;
  varB: Float64Array;
  cov: Float64Array;
}

const sameList = (x: readonly number[], y: readonly number[]): boolean => x.length === y.length && x.every((v, i) => v === y[i]);

/** "θ 30°, φ averaged, λ 900 nm" for point q of a matrix. */
function pointText(m: ResponseMatrix, q: number): string {
  const nL = m.wavelengthNm.length, nP = m.phiDeg.length;
  const il = q % nL, ip = Math.floor(q / nL) % nP, it = Math.floor(q / (nL * nP));
  const phi = m.phiMode === "averaged" ? "φ averaged" : `φ ${m.phiDeg[ip]}°`;
  return `θ ${m.thetaDeg[it]}°, ${phi}, λ ${m.wavelengthNm[il]} nm`;
}

/**
 * Why A and B cannot be paired point by point, in words, or undefined when they can: both need
 * pairing groups (matrices written before lightfold kept them have none), the same θ, φ and λ grid
 * (the azimuth mode may differ: groups are independent replicas either way), the channel, the same
 * number of groups and, at every point, the same rays per group (same batches) with at least two
 * groups holding rays.
 */
export function pairingProblem(a: ResponseMatrix, b: ResponseMatrix, channel: string, names: [string, string] = ["A", "B"]): string | undefined {
  for (const [m, name] of [[a, names[0]], [b, names[1]]] as const) {
    if (m.pairGroups === undefined || m.groupMean === undefined || m.groupRays === undefined) {
      return `${name} has no pairing groups (written by a lightfold without them; sweep it again to pair)`;
    }
    if (!m.channels.includes(channel)) return `${name} has no channel "${channel}"`;
  }
  if (!sameList(a.thetaDeg, b.thetaDeg) || !sameList(a.phiDeg, b.phiDeg) || !sameList(a.wavelengthNm, b.wavelengthNm)) {
    return `${names[0]} and ${names[1]} are on different θ, φ or λ grids`;
  }
  const G = a.pairGroups!;
  if (b.pairGroups !== G) return `${names[0]} has ${G} pairing groups, ${names[1]} ${b.pairGroups}`;
  const ra = a.groupRays!, rb = b.groupRays!;
  for (let q = 0; q < a.nRays.length; q++) {
    let k = 0;
    for (let g = 0; g < G; g++) {
      const n = ra[q * G + g]!;
      if (n !== rb[q * G + g]) return `${names[0]} and ${names[1]} differ in rays per pairing group at ${pointText(a, q)} (different batches or rays per point)`;
      if (n > 0) k++;
    }
    if (k < 2) return `fewer than two pairing groups hold rays at ${pointText(a, q)}`;
  }
  return undefined;
}

/**
 * Moments of point q from the groups: with group means a_g, b_g, weights f_g = n_g/N over the K
 * groups with rays and the ray-weighted means Ā, B̄, Var(Ā) = K/(K − 1)·Σ f_g²(a_g − Ā)² and
 * Cov(Ā, B̄) = K/(K − 1)·Σ f_g²(a_g − Ā)(b_g − B̄) (the variance estimate of a mean over clusters
 * of unequal size, cluster sampling, Cochran, Sampling Techniques, ch. 9; from memory; with equal
 * groups it is the textbook s²/K). The caller has checked the groups (pairingProblem).
 */
export function pointMoments(a: ResponseMatrix, ca: number, b: ResponseMatrix, cb: number, q: number, out: Float64Array): void {
  const G = a.pairGroups!, nA = a.channels.length, nB = b.channels.length;
  const rays = a.groupRays!, ma = a.groupMean!, mb = b.groupMean!;
  let N = 0, K = 0, sa = 0, sb = 0;
  for (let g = 0; g < G; g++) {
    const n = rays[q * G + g]!;
    if (n <= 0) continue;
    N += n;
    K++;
    sa += n * ma[(q * G + g) * nA + ca]!;
    sb += n * mb[(q * G + g) * nB + cb]!;
  }
  const meanA = sa / N, meanB = sb / N;
  let vaa = 0, vbb = 0, vab = 0;
  for (let g = 0; g < G; g++) {
    const n = rays[q * G + g]!;
    if (n <= 0) continue;
    const f2 = (n / N) * (n / N);
    const da = ma[(q * G + g) * nA + ca]! - meanA, db = mb[(q * G + g) * nB + cb]! - meanB;
    vaa += f2 * da * da;
    vbb += f2 * db * db;
    vab += f2 * da * db;
  }
  const c = K / (K - 1);
  out[0] = c * vaa;
  out[1] = c * vbb;
  out[2] = c * vab;
}

/**
 * The paired moments of `channel` at every point of A and B, or the reason they cannot be paired
 * (pairingProblem). Valid whatever the streams (groups are independent replicas either way); the
 * covariance is large only when both were traced with the same seed and batches.
 */
export function pairedMoments(a: ResponseMatrix, b: ResponseMatrix, channel: string, names: [string, string] = ["A", "B"]): PairedMoments | string {
  const problem = pairingProblem(a, b, channel, names);
  if (problem !== undefined) return problem;
  const ca = a.channels.indexOf(channel), cb = b.channels.indexOf(channel);
  const n = a.nRays.length;
  const out: PairedMoments = { varA: new Float64Array(n), varB: new Float64Array(n), cov: new Float64Array(n) };
  const m = new Float64Array(3);
  for (let q = 0; q < n; q++) {
    pointMoments(a, ca, b, cb, q, m);
    out.varA[q] = m[0]!;
    out.varB[q] = m[1]!;
    out.cov[q] = m[2]!;
  }
  return out;
}
