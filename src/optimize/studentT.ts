/**
 * Quantiles of Student's t distribution for confidence intervals from a few replicas.
 * The CDF uses the regularized incomplete beta function, P(|T| > t) = I_x(ν/2, 1/2) with
 * x = ν/(ν + t²) (Abramowitz & Stegun 26.7.1 / 26.5.27), evaluated by its continued fraction
 * (Lentz's method, as in Press et al., Numerical Recipes, §6.4); the quantile by bisection.
 */

/** ln Γ(x) for x > 0 (Lanczos approximation, g = 7, n = 9; Numerical Recipes §6.1 coefficients). */
function lnGamma(x: number): number {
  const c = [
    0.99999999999980993, 676.5203681218851, -1259.1392167224028, 771.32342877765313, -176.61502916214059,
    12.507343278686905, -0.13857109526572012, 9.9843695780195716e-6, 1.5056327351493116e-7,
  ];
  const xm = x - 1;
  let a = c[0];
  const t = xm + 7.5;
  for (let i = 1; i < 9; i++) a += c[i] / (xm + i);
  return 0.5 * Math.log(2 * Math.PI) + (xm + 0.5) * Math.log(t) - t + Math.log(a);
}

/** Continued fraction of I_x(a, b) (modified Lentz). */
function betaContinuedFraction(a: number, b: number, x: number): number {
  const tiny = 1e-300;
  let c = 1;
  let d = 1 - ((a + b) * x) / (a + 1);
  if (Math.abs(d) < tiny) d = tiny;
  d = 1 / d;
  let h = d;
  for (let m = 1; m <= 300; m++) {
    const m2 = 2 * m;
    let aa = (m * (b - m) * x) / ((a + m2 - 1) * (a + m2));
    d = 1 + aa * d;
    if (Math.abs(d) < tiny) d = tiny;
    c = 1 + aa / c;
    if (Math.abs(c) < tiny) c = tiny;
    d = 1 / d;
    h *= d * c;
    aa = (-(a + m) * (a + b + m) * x) / ((a + m2) * (a + m2 + 1));
    d = 1 + aa * d;
    if (Math.abs(d) < tiny) d = tiny;
    c = 1 + aa / c;
    if (Math.abs(c) < tiny) c = tiny;
    d = 1 / d;
    const del = d * c;
    h *= del;
    if (Math.abs(del - 1) < 1e-15) break;
  }
  return h;
}

/** Regularized incomplete beta function I_x(a, b), 0 ≤ x ≤ 1. */
export function incompleteBeta(a: number, b: number, x: number): number {
  if (x <= 0) return 0;
  if (x >= 1) return 1;
  const front = Math.exp(lnGamma(a + b) - lnGamma(a) - lnGamma(b) + a * Math.log(x) + b * Math.log(1 - x));
  // The fraction converges fast for x < (a + 1)/(a + b + 2); use the symmetry I_x(a,b) = 1 − I_{1−x}(b,a) beyond.
  if (x < (a + 1) / (a + b + 2)) return (front * betaContinuedFraction(a, b, x)) / a;
  return 1 - (front * betaContinuedFraction(b, a, 1 - x)) / b;
}

/** P(T ≤ t) for Student's t with ν degrees of freedom. */
export function studentTCdf(t: number, dof: number): number {
  const tail = 0.5 * incompleteBeta(dof / 2, 0.5, dof / (dof + t * t));
  return t >= 0 ? 1 - tail : tail;
}

/** The t with P(T ≤ t) = p (0 < p < 1) for ν degrees of freedom. */
export function studentTQuantile(p: number, dof: number): number {
  if (!(p > 0 && p < 1) || !(dof > 0)) throw new RangeError(`studentTQuantile: p in (0, 1) and dof > 0 expected, got p=${p}, dof=${dof}`);
  if (p === 0.5) return 0;
  if (p < 0.5) return -studentTQuantile(1 - p, dof);
  let lo = 0;
  let hi = 1;
  while (studentTCdf(hi, dof) < p) hi *= 2;
  for (let i = 0; i < 200 && hi - lo > 1e-12 * hi; i++) {
    const mid = 0.5 * (lo + hi);
    if (studentTCdf(mid, dof) < p) lo = mid;
    else hi = mid;
  }
  return 0.5 * (lo + hi);
}

/** Half-width factor of a two-sided interval at `level` (e.g. 0.95) with ν degrees of freedom. */
export function twoSidedT(level: number, dof: number): number {
  return studentTQuantile(0.5 + level / 2, dof);
}
