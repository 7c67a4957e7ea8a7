import seedrandom from "seedrandom";

/**
 * Deterministic uniform random stream, xoshiro128** (Blackman & Vigna 2018, public-domain reference
 * algorithm), seeded from a stream key. The state is four uint32 words in a typed array; `next()`
 * allocates nothing and is monomorphic, so it inlines in hot loops.
 */
export class RandomStream {
  private readonly s = new Uint32Array(4);
  /** The seed words of the key (substreams are derived from them). */
  private readonly base = new Uint32Array(4);

  constructor(key: string) {
    // seedrandom's xor4096 hashes the key string into well-mixed seed words (ARC4-style key mixing).
    const mix = seedrandom.xor4096(key);
    for (let i = 0; i < 4; i++) this.s[i] = this.base[i] = mix.int32() >>> 0;
    if ((this.s[0] | this.s[1] | this.s[2] | this.s[3]) === 0) this.s[0] = 0x9e3779b9;
  }

  /**
   * Restarts the stream as substream `index` (< 2^30) of its key, or as substream `branch` of that
   * (branch ≥ 1, src/trace/branches.ts): each seed word is hashed
   * with the index (MurmurHash3's 32-bit finaliser, Appleby 2011). The tracer starts one substream
   * per ray, so what a ray draws never depends on how many numbers the rays before it used: two
   * stacks traced with the same key keep their rays paired (common random numbers) until a ray's
   * own history differs.
   */
  startSubstream(index: number, branch = 0): void {
    const s = this.s;
    const b = this.base;
    // Int32 arithmetic throughout (no boxed numbers in the hot path); the state words take the bits.
    const i4 = index << 2;
    // A branch number (src/trace/branches.ts) gives a further substream of the same index.
    const k = branch === 0 ? 0 : fmix32(Math.imul(branch, 0x9e3779b9) ^ 0x5bd1e995);
    s[0] = fmix32(b[0] ^ fmix32((i4 + 1) | 0) ^ k);
    s[1] = fmix32(b[1] ^ fmix32((i4 + 2) | 0) ^ k);
    s[2] = fmix32(b[2] ^ fmix32((i4 + 3) | 0) ^ k);
    s[3] = fmix32(b[3] ^ fmix32((i4 + 4) | 0) ^ k);
    if ((s[0] | s[1] | s[2] | s[3]) === 0) s[0] = 0x9e3779b9;
  }

  /**
   * Next 32 random bits as an int32 (a uint32 above 2^30 would be a boxed number when returned from
   * code that is not inlined; next() takes the unsigned value).
   */
  nextInt32(): number {
    const s = this.s;
    const result = Math.imul(rotl(Math.imul(s[1], 5), 7), 9);
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
    return ((this.nextInt32() >>> 0) + 0.5) * 2.3283064365386963e-10;
  }

  /**
   * The next n numbers of next(), in order, into out[0…n−1], with the state in locals: four draws
   * one after another through next() cost about 30 ns at a ray's launch (each a chain of loads and
   * stores of the state words), through fill about a third of that. Its loop body is nextInt32's
   * step written on locals; tests/random/stream.test.ts holds the two to the same numbers.
   */
  fill(out: Float64Array, n: number): void {
    const s = this.s;
    let s0 = s[0] | 0, s1 = s[1] | 0, s2 = s[2] | 0, s3 = s[3] | 0;
    for (let i = 0; i < n; i++) {
      const result = Math.imul(rotl(Math.imul(s1, 5), 7), 9);
      const t = s1 << 9;
      s2 ^= s0;
      s3 ^= s1;
      s1 ^= s2;
      s0 ^= s3;
      s2 ^= t;
      s3 = rotl(s3, 11);
      out[i] = ((result >>> 0) + 0.5) * 2.3283064365386963e-10;
    }
    s[0] = s0;
    s[1] = s1;
    s[2] = s2;
    s[3] = s3;
  }
}

/** MurmurHash3 32-bit finaliser (Appleby 2011, public domain): a bijective avalanche mix (as int32 bits). */
function fmix32(h: number): number {
  h ^= h >>> 16;
  h = Math.imul(h, 0x85ebca6b);
  h ^= h >>> 13;
  h = Math.imul(h, 0xc2b2ae35);
  h ^= h >>> 16;
  return h | 0;
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

/**
 * Stream key of batch b of grid point (it, ip, il) in a sweep: the same for every combination, so
 * combinations are traced with common random numbers; light from the rear has streams of its own.
 */
export function lightStreamKey(seed: number, lightFrom: "front" | "rear" | undefined, it: number, ip: number, il: number, batch: number): string {
  return lightFrom === "rear" ? streamKey(seed, "rear", it, ip, il, batch) : streamKey(seed, it, ip, il, batch);
}

/**
 * Stream key of batch b of wavelength il in a generation-profile trace of combination `combo` at
 * (θ, φ) in degrees (φ null: random azimuth per ray): the streams of `lightfold generation`.
 */
export function generationStreamKey(seed: number, combo: number, thetaDeg: number, phiDeg: number | null, il: number, batch: number): string {
  return streamKey(seed, "generation", combo, thetaDeg, phiDeg ?? "averaged", il, batch);
}
