import type { PairedMoments } from "../response/pairedMoments.js";
import type { SpectralWeights } from "./spectralTables.js";

/** Year-summed irradiance weight per angle node of one face (annualYield, faceYield). */
export interface NodeWeights {
  beam: ArrayLike<number>;
  diffuse: ArrayLike<number>;
}

/** Var(Q_A), Var(Q_B) and Cov(Q_A, Q_B) of one face's yearly charge, from the pairing groups. */
export interface ChargeMoments {
  varA: number;
  varB: number;
  cov: number;
}

/**
 * The yearly charge of a face is linear in the matrix, Q = Σ_q W_q m_q, with the weight of matrix
 * point q = (node, λ) W_q = G_node·w_beam,λ + D_node·w_diffuse,λ (the year-summed node weights of
 * annualYield / faceYield under the fixed G173 shapes; they depend on the plane, weather and grid,
 * not on the matrix values). Every point is traced on streams of its own, so point moments add:
 * Var(Q_A) = Σ W^A_q² varA_q, Cov(Q_A, Q_B) = Σ W^A_q W^B_q cov_q (linear error propagation). Pooling per point (15 degrees of freedom each, many points) gives a steadier
 * error than 16 per-group yearly charges would (15 in all), and is unbiased alike.
 */
export function chargeMoments(weightsA: NodeWeights, weightsB: NodeWeights, spectral: SpectralWeights, m: PairedMoments): ChargeMoments {
  const nL = spectral.beam.length, nNodes = weightsA.beam.length;
  if (weightsB.beam.length !== nNodes || m.varA.length !== nNodes * nL) {
    throw new RangeError(`paired charge: ${m.varA.length} matrix points, the yields have ${nNodes} and ${weightsB.beam.length} nodes × ${nL} wavelengths`);
  }
  let varA = 0, varB = 0, cov = 0;
  for (let node = 0; node < nNodes; node++) {
    const gA = weightsA.beam[node]!, dA = weightsA.diffuse[node]!, gB = weightsB.beam[node]!, dB = weightsB.diffuse[node]!;
    for (let l = 0; l < nL; l++) {
      const wA = gA * spectral.beam[l]! + dA * spectral.diffuse[l]!;
      const wB = gB * spectral.beam[l]! + dB * spectral.diffuse[l]!;
      const q = node * nL + l;
      varA += wA * wA * m.varA[q]!;
      varB += wB * wB * m.varB[q]!;
      cov += wA * wB * m.cov[q]!;
    }
  }
  return { varA, varB, cov };
}

/** Var(cA·Q_A − cB·Q_B) = cA²·Var(Q_A) − 2·cA·cB·Cov + cB²·Var(Q_B) (clipped at 0 against rounding). */
export function combinationVariance(c: ChargeMoments, cA: number, cB: number): number {
  return Math.max(0, cA * cA * c.varA - 2 * cA * cB * c.cov + cB * cB * c.varB);
}
