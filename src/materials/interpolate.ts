/**
 * Index i of the interval [x[i], x[i+1]] holding v (x strictly increasing, x[0] ≤ v ≤ x[last]);
 * v equal to the last node returns the last interval. Binary search.
 */
export function findInterval(x: ArrayLike<number>, v: number): number {
  let lo = 0;
  let hi = x.length - 1;
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (x[mid]! <= v) lo = mid;
    else hi = mid;
  }
  return lo;
}

/** Linear interpolation; exact at the nodes. The caller has checked x[0] ≤ v ≤ x[last]. */
export function interpolateLinear(x: ArrayLike<number>, y: ArrayLike<number>, v: number): number {
  if (x.length === 1) return y[0]!;
  const i = findInterval(x, v);
  const x0 = x[i]!;
  const x1 = x[i + 1]!;
  if (v === x0) return y[i]!;
  if (v === x1) return y[i + 1]!;
  const t = (v - x0) / (x1 - x0);
  return y[i]! + t * (y[i + 1]! - y[i]!);
}

/**
 * Interpolation in log space (k spans many decades, so ln k is close to linear in λ between
 * nodes): ln y linear between two positive neighbours, y linear where either neighbour is 0.
 * Exact at the nodes.
 */
export function interpolateLogPositive(x: ArrayLike<number>, y: ArrayLike<number>, v: number): number {
  if (x.length === 1) return y[0]!;
  const i = findInterval(x, v);
  const x0 = x[i]!;
  const x1 = x[i + 1]!;
  const y0 = y[i]!;
  const y1 = y[i + 1]!;
  if (v === x0) return y0;
  if (v === x1) return y1;
  const t = (v - x0) / (x1 - x0);
  if (y0 > 0 && y1 > 0) return Math.exp(Math.log(y0) + t * (Math.log(y1) - Math.log(y0)));
  return y0 + t * (y1 - y0);
}
