/**
 * Least-squares slope of ln y against ln x (ordinary linear regression; points with y ≤ 0 or
 * non-finite are left out). NaN when fewer than two usable points remain.
 */
export function logLogSlope(x: ArrayLike<number>, y: ArrayLike<number>): number {
  const lx: number[] = [];
  const ly: number[] = [];
  for (let i = 0; i < x.length; i++) {
    if (x[i] > 0 && y[i] > 0 && Number.isFinite(y[i])) {
      lx.push(Math.log(x[i]));
      ly.push(Math.log(y[i]));
    }
  }
  const n = lx.length;
  if (n < 2) return Number.NaN;
  const mx = lx.reduce((a, b) => a + b, 0) / n;
  const my = ly.reduce((a, b) => a + b, 0) / n;
  let sxy = 0;
  let sxx = 0;
  for (let i = 0; i < n; i++) {
    sxy += (lx[i] - mx) * (ly[i] - my);
    sxx += (lx[i] - mx) ** 2;
  }
  return sxx === 0 ? Number.NaN : sxy / sxx;
}
