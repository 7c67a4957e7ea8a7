import { RandomStream } from "./stream.js";

/**
 * How a ray's launch is sampled: "random" draws x, y, the polarisation angle ψ and (when the azimuth
 * is averaged) φ from the ray's own random substream; "sobol" takes them from a randomly scrambled
 * Sobol' point set (randomized quasi-Monte Carlo).
 */
export type LaunchSampling = "random" | "sobol";

/** Dimensions of the point set (the launch uses x, y, polarisation angle ψ, azimuth φ). */
export const SOBOL_DIMENSIONS = 4;
const BITS = 32;

/**
 * Primitive polynomials and initial direction numbers (s = degree, a = inner coefficients as bits,
 * m = m_1 … m_s) of Sobol' dimensions 2–4 from the Joe–Kuo table new-joe-kuo-6.21201 (S. Joe and
 * F. Y. Kuo, "Constructing Sobol sequences with better two-dimensional projections", SIAM J. Sci.
 * Comput. 30 (2008) 2635–2654; table at web.maths.unsw.edu.au/~fkuo/sobol/, rows d = 2, 3, 4).
 * Dimension 1 is the van der Corput sequence (all m_k = 1).
 */
const JOE_KUO_ROWS: readonly { s: number; a: number; m: readonly number[] }[] = [
  { s: 1, a: 0, m: [1] },
  { s: 2, a: 1, m: [1, 3] },
  { s: 3, a: 1, m: [1, 3, 1] },
];

/**
 * Direction numbers V_k (k = 1…32) of the four dimensions as int32 bits, V_k = m_k·2^(32−k), with
 * the recurrence of Bratley & Fox (1988) as Joe & Kuo write it: m_k = 2a_1 m_{k−1} ⊕ 4a_2 m_{k−2} ⊕ …
 * ⊕ 2^s m_{k−s} ⊕ m_{k−s}, i.e. V_k = V_{k−s} ⊕ (V_{k−s} >> s) ⊕ Σ_j a_j V_{k−j}.
 */
function directionNumbers(): Int32Array {
  const v = new Int32Array(SOBOL_DIMENSIONS * BITS);
  for (let k = 0; k < BITS; k++) v[k] = 1 << (31 - k);
  JOE_KUO_ROWS.forEach(({ s, a, m }, j) => {
    const o = (j + 1) * BITS;
    for (let k = 0; k < BITS; k++) {
      if (k < s) {
        v[o + k] = m[k] << (31 - k);
        continue;
      }
      let x = v[o + k - s] ^ (v[o + k - s] >>> s);
      for (let i = 1; i < s; i++) if ((a >>> (s - 1 - i)) & 1) x ^= v[o + k - i];
      v[o + k] = x;
    }
  });
  return v;
}

const V = directionNumbers();

/** Bits of coordinate `dim` of the unscrambled Sobol' point `index` (< 2^32), as int32. */
export function sobolBits(index: number, dim: number): number {
  let x = 0;
  const o = dim * BITS;
  for (let j = 0, i = index >>> 0; i !== 0; j++, i >>>= 1) if (i & 1) x ^= V[o + j];
  return x;
}

function reverseBits(v: number): number {
  v = ((v >>> 1) & 0x55555555) | ((v & 0x55555555) << 1);
  v = ((v >>> 2) & 0x33333333) | ((v & 0x33333333) << 2);
  v = ((v >>> 4) & 0x0f0f0f0f) | ((v & 0x0f0f0f0f) << 4);
  v = ((v >>> 8) & 0x00ff00ff) | ((v & 0x00ff00ff) << 8);
  return (v >>> 16) | (v << 16);
}

/**
 * Nested uniform (Owen) scrambling of the bits of x by hashing (B. Burley, "Practical Hash-based
 * Owen Scrambling", JCGT 9(4), 2020, with the Laine–Karras permutation): on the reversed bits, each
 * output bit depends only on the input bits below it (those above it in x), so it is a nested
 * digit permutation and keeps the net structure of the point set; the addition of the seed makes
 * each scrambled point exactly uniform over the 2^32 values when the seed is.
 */
export function owenScramble(x: number, seed: number): number {
  let v = reverseBits(x);
  v = (v + seed) | 0;
  v ^= Math.imul(v, 0x6c50b47c);
  v ^= Math.imul(v, 0xb82f1e52 | 0);
  v ^= Math.imul(v, 0xc7afe638 | 0);
  v ^= Math.imul(v, 0x8d22f6e6 | 0);
  return reverseBits(v);
}

/**
 * A randomly scrambled Sobol' sequence in four dimensions: one independent scramble per dimension,
 * drawn from a stream key. Point i of two sequences with the same key is the same (common random
 * numbers); sequences with different keys are independent replicas, each point uniform on [0, 1)^4.
 */
export class ScrambledSobol {
  private readonly seeds = new Int32Array(SOBOL_DIMENSIONS);

  constructor(key: string) {
    const rng = new RandomStream(key);
    for (let d = 0; d < SOBOL_DIMENSIONS; d++) this.seeds[d] = rng.nextInt32();
  }

  /** Writes point `index` (< 2^32) into out[0…3], each coordinate in the open interval (0, 1). */
  point(index: number, out: Float64Array): void {
    // The four dimensions in one pass over the bits of the index (sobolBits, unrolled).
    let x0 = 0, x1 = 0, x2 = 0, x3 = 0;
    for (let j = 0, i = index >>> 0; i !== 0; j++, i >>>= 1) {
      if (i & 1) {
        x0 ^= V[j];
        x1 ^= V[BITS + j];
        x2 ^= V[2 * BITS + j];
        x3 ^= V[3 * BITS + j];
      }
    }
    const sd = this.seeds;
    out[0] = ((owenScramble(x0, sd[0]) >>> 0) + 0.5) * 2.3283064365386963e-10;
    out[1] = ((owenScramble(x1, sd[1]) >>> 0) + 0.5) * 2.3283064365386963e-10;
    out[2] = ((owenScramble(x2, sd[2]) >>> 0) + 0.5) * 2.3283064365386963e-10;
    out[3] = ((owenScramble(x3, sd[3]) >>> 0) + 0.5) * 2.3283064365386963e-10;
  }
}
