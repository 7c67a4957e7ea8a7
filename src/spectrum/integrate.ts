/** Trapezoid rule ∫y dx over the nodes x (any spacing). */
export function trapezoid(x: ArrayLike<number>, y: ArrayLike<number>): number {
  let s = 0;
  for (let i = 1; i < x.length; i++) s += 0.5 * (x[i]! - x[i - 1]!) * (y[i]! + y[i - 1]!);
  return s;
}

/** Irradiance ∫E dλ in W/m² by the trapezoid rule over the spectrum's own grid (optionally within [fromNm, toNm] on grid nodes). */
export function totalIrradianceWm2(
  wavelengthNm: ArrayLike<number>,
  irradianceWm2PerNm: ArrayLike<number>,
  fromNm = -Infinity,
  toNm = Infinity,
): number {
  let s = 0;
  for (let i = 1; i < wavelengthNm.length; i++) {
    const a = wavelengthNm[i - 1]!;
    const b = wavelengthNm[i]!;
    if (a >= fromNm && b <= toNm) s += 0.5 * (b - a) * (irradianceWm2PerNm[i]! + irradianceWm2PerNm[i - 1]!);
  }
  return s;
}

/**
 * ∫ y dx over [a, b] of the piecewise-linear interpolant through (x, y) (exact for that interpolant;
 * parts of [a, b] outside the nodes count as zero).
 */
export function bandIntegral(x: ArrayLike<number>, y: ArrayLike<number>, a: number, b: number): number {
  let s = 0;
  for (let i = 1; i < x.length; i++) {
    const x0 = x[i - 1]!, x1 = x[i]!;
    const lo = Math.max(a, x0), hi = Math.min(b, x1);
    if (hi <= lo) continue;
    const at = (v: number): number => y[i - 1]! + ((y[i]! - y[i - 1]!) * (v - x0)) / (x1 - x0);
    s += 0.5 * (hi - lo) * (at(lo) + at(hi));
  }
  return s;
}
