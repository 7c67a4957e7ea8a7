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
 * number of groups and, at every point, at least two groups holding rays in each. The groups may
 * hold different rays in A and B (target-error runs stopping at different batches, other rays per
 * point): the batches both traced share their streams, the rest are independent (pointMoments).
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
  for (const [m, name] of [[a, names[0]], [b, names[1]]] as const) {
    const rays = m.groupRays!;
    for (let q = 0; q < m.nRays.length; q++) {
      let k = 0;
      for (let g = 0; g < G; g++) if (rays[q * G + g]! > 0) k++;
      if (k < 2) return `fewer than two pairing groups of ${name} hold rays at ${pointText(m, q)} (trace at least two batches per point)`;
    }
  }
  return undefined;
}

/**
 * Moments of point q from the groups. With group means a_g, b_g over n^A_g, n^B_g rays, weights
 * f^A_g = n^A_g/N_A, f^B_g = n^B_g/N_B and the ray-weighted means Ā, B̄ (the matrices' means):
 *   Var(Ā) = Σ f^A_g²(a_g − Ā)² / κ_A,            κ_A = 1 − Σ f^A_g²
 *   Cov(Ā, B̄) = Σ f^A_g f^B_g(a_g − Ā)(b_g − B̄) / κ_AB,
 *   κ_AB = 1 − Σ (c_g/C)(f^A_g + f^B_g) + Σ f^A_g f^B_g,  c_g = min(n^A_g, n^B_g), C = Σ c_g
 * (the linearisation estimate of a ratio mean over independent clusters, cluster sampling, Cochran,
 * Sampling Techniques, ch. 6 and 9, from memory; the κ make it unbiased when rays are independent
 * samples and the c_g rays of group g that both traced share their streams — the same batches, a
 * shorter run a prefix of a longer one — so that E[(a_g − Ā)(b_g − B̄)] works out to the κ above).
 * With equal groups κ = 1 − 1/K over the K groups: the textbook s²/K of K replicas. The caller has
 * checked the groups (pairingProblem).
 */
export function pointMoments(a: ResponseMatrix, ca: number, b: ResponseMatrix, cb: number, q: number, out: Float64Array): void {
  const G = a.pairGroups!, nA = a.channels.length, nB = b.channels.length;
  const ra = a.groupRays!, rb = b.groupRays!, ma = a.groupMean!, mb = b.groupMean!;
  let NA = 0, NB = 0, C = 0, sa = 0, sb = 0;
  for (let g = 0; g < G; g++) {
    const na = ra[q * G + g]!, nb = rb[q * G + g]!;
    NA += na;
    NB += nb;
    C += Math.min(na, nb);
    if (na > 0) sa += na * ma[(q * G + g) * nA + ca]!;
    if (nb > 0) sb += nb * mb[(q * G + g) * nB + cb]!;
  }
  const meanA = sa / NA, meanB = sb / NB;
  let vaa = 0, vbb = 0, vab = 0, ffA = 0, ffB = 0, ffAB = 0, cf = 0;
  for (let g = 0; g < G; g++) {
    const fa = ra[q * G + g]! / NA, fb = rb[q * G + g]! / NB;
    const da = fa > 0 ? ma[(q * G + g) * nA + ca]! - meanA : 0;
    const db = fb > 0 ? mb[(q * G + g) * nB + cb]! - meanB : 0;
    vaa += fa * fa * da * da;
    vbb += fb * fb * db * db;
    vab += fa * fb * da * db;
    ffA += fa * fa;
    ffB += fb * fb;
    ffAB += fa * fb;
    if (C > 0) cf += (Math.min(ra[q * G + g]!, rb[q * G + g]!) / C) * (fa + fb);
  }
  out[0] = vaa / (1 - ffA);
  out[1] = vbb / (1 - ffB);
  out[2] = C > 0 ? vab / (1 - cf + ffAB) : 0;
}

/**
 * The paired moments of `channel` at every point of A and B, or the reason they cannot be paired
 * (pairingProblem). Valid whatever the streams (groups are independent replicas either way); the
 * covariance is large only when both were traced with the same seed (and batch size).
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
