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
 * Ratio a/b of two independent estimates with first-order error propagation
 * (Taylor, An Introduction to Error Analysis, general formula §3.11): σ² = (σa/b)² + (a σb/b²)², which is the
 * quadrature sum of relative errors when a ≠ 0 and stays finite when a = 0 (e.g. no current at grazing
 * incidence).
 */
export function ratioIndependent(a: ValueWithError, b: ValueWithError): ValueWithError {
  const value = a.value / b.value;
  const stderr = Math.hypot(a.stderr, value * b.stderr) / Math.abs(b.value);
  return { value, stderr };
}
