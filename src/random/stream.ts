import seedrandom from "seedrandom";

/**
 * Deterministic uniform random stream, xoshiro128** (Blackman & Vigna 2018, public-domain reference
 * algorithm), seeded from a stream key. The state is four uint32 words in a typed array; `next()`
 * allocates nothing and is monomorphic, so it inlines in hot loops.
 */
export class RandomStream {
  private readonly s = new Uint32Array(4);

  constructor(key: string) {
    // seedrandom's xor4096 hashes the key string into well-mixed seed words (ARC4-style key mixing).
    const mix = seedrandom.xor4096(key);
    for (let i = 0; i < 4; i++) this.s[i] = mix.int32() >>> 0;
    if ((this.s[0] | this.s[1] | this.s[2] | this.s[3]) === 0) this.s[0] = 0x9e3779b9;
  }

  /** Next uint32. */
  nextUint32(): number {
    const s = this.s;
    const result = Math.imul(rotl(Math.imul(s[1], 5), 7), 9) >>> 0;
    const t = s[1] << 9;
    s[2] ^= s[0];
    s[3] ^= s[1];
    s[1] ^= s[2];
    s[0] ^= s[3];
    s[2] ^= t;
    s[3] = rotl(s[3], 11);
    return result;
  }

  /** Uniform in the open interval (0, 1), resolution 2^-32. */
  next(): number {
    return (this.nextUint32() + 0.5) * 2.3283064365386963e-10;
  }
}

function rotl(x: number, k: number): number {
  return (x << k) | (x >>> (32 - k));
}

/**
 * Stream key of one task: a pure function of the study seed and the task's coordinates, so results
 * never depend on worker count, scheduling or sharding.
 */
export function streamKey(seed: number, ...coords: (number | string)[]): string {
  return `lightfold/${seed}/${coords.join("/")}`;
}
