/**
 * N·cosθ in a medium of complex index N = n + ik for a tangential wave-vector component s
 * (s² = (n0 sinθ0)², Snell's invariant): the root of N² − s² with Im ≥ 0, i.e. the wave
 * exp(i(k0 N cosθ z − ωt)) decays into the medium (evanescent beyond the critical angle).
 * Writes [re, im] to out[off], out[off+1]; no allocation.
 */
export function normalCosineInto(n: number, k: number, s2Re: number, s2Im: number, out: Float64Array, off: number): void {
  const a = n * n - k * k - s2Re;
  const b = 2 * n * k - s2Im;
  complexSqrtDecaying(a, b, out, off);
}

/** √(a + ib) with Im ≥ 0 (Re ≥ 0 when Im = 0), computed without cancellation. */
export function complexSqrtDecaying(a: number, b: number, out: Float64Array, off: number): void {
  const r = Math.hypot(a, b);
  let x: number;
  let y: number;
  if (r === 0) {
    x = 0;
    y = 0;
  } else if (a >= 0) {
    x = Math.sqrt(0.5 * (r + a));
    y = (0.5 * b) / x;
  } else {
    y = Math.sqrt(0.5 * (r - a));
    x = (0.5 * b) / y;
  }
  // principal root has Re ≥ 0; flip to the Im ≥ 0 branch when needed
  if (y < 0) {
    x = -x;
    y = -y;
  }
  out[off] = x;
  out[off + 1] = y;
}
