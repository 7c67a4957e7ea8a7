/**
 * Weighted sum over wavelengths with its Monte Carlo error. Each wavelength is traced with its own
 * independent random stream, so errors add in quadrature: SE = sqrt(Σ w_i² SE_i²) (standard result
 * for weighted sums of independent estimates).
 */
export interface ValueWithError {
  value: number;
  stderr: number;
}

/** Σ w[i]·mean[offset + i·stride] and its standard error, i = 0..w.length-1. */
export function stridedWeightedSum(
  w: ArrayLike<number>,
  mean: ArrayLike<number>,
  stderr: ArrayLike<number>,
  offset: number,
  stride: number,
): ValueWithError {
  let sum = 0;
  let var2 = 0;
  for (let i = 0; i < w.length; i++) {
    const k = offset + i * stride;
    sum += w[i] * mean[k];
    const e = w[i] * stderr[k];
    var2 += e * e;
  }
  return { value: sum, stderr: Math.sqrt(var2) };
}

/**
 * Ratio a/b of two independent estimates; relative errors add in quadrature
 * (first-order error propagation, e.g. Taylor, An Introduction to Error Analysis, §3.8).
 */
export function ratioIndependent(a: ValueWithError, b: ValueWithError): ValueWithError {
  const value = a.value / b.value;
  const rel = Math.hypot(a.stderr / a.value, b.stderr / b.value);
  return { value, stderr: Math.abs(value) * rel };
}
