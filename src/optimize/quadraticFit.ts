/**
 * Quadratic response surfaces in one or two parameters: least-squares fit on scaled coordinates
 * u = (x − centre)/halfWidth, and the maximum of the fitted surface over the design box |u| ≤ 1.
 * (Response-surface methodology: Box & Wilson 1951; Myers & Montgomery, "Response Surface
 * Methodology", ch. 6.)
 */

/**
 * y ≈ Σ coef_k · basis_k(u): 1D basis [1, u, u²] (or [1, u, u², u³] with cubic, which absorbs the
 * peak's asymmetry so the maximum is not pulled toward the gentler side); 2D basis
 * [1, u, v, u², uv, v²].
 */
export interface Quadratic {
  dims: 1 | 2;
  coef: number[];
  centre: number[];
  halfWidth: number[];
}

function basis(u: number[], nb: number): number[] {
  if (u.length === 2) return [1, u[0], u[1], u[0] * u[0], u[0] * u[1], u[1] * u[1]];
  return nb === 4 ? [1, u[0], u[0] * u[0], u[0] ** 3] : [1, u[0], u[0] * u[0]];
}

/** Solves A x = b (small, dense) by Gaussian elimination with partial pivoting; null when singular. */
export function solveLinear(a: number[][], b: number[]): number[] | null {
  const n = b.length;
  const m = a.map((row, i) => [...row, b[i]]);
  for (let col = 0; col < n; col++) {
    let piv = col;
    for (let r = col + 1; r < n; r++) if (Math.abs(m[r][col]) > Math.abs(m[piv][col])) piv = r;
    if (!(Math.abs(m[piv][col]) > 1e-12)) return null;
    [m[col], m[piv]] = [m[piv], m[col]];
    for (let r = col + 1; r < n; r++) {
      const f = m[r][col] / m[col][col];
      for (let k = col; k <= n; k++) m[r][k] -= f * m[col][k];
    }
  }
  const x = new Array<number>(n).fill(0);
  for (let r = n - 1; r >= 0; r--) {
    let s = m[r][n];
    for (let k = r + 1; k < n; k++) s -= m[r][k] * x[k];
    x[r] = s / m[r][r];
  }
  return x;
}

/** Least-squares quadratic through the points (x, y); null when the design cannot determine it. */
export function fitQuadratic(xs: number[][], ys: number[], centre: number[], halfWidth: number[], cubic = false): Quadratic | null {
  const dims = centre.length as 1 | 2;
  const nb = dims === 1 ? (cubic ? 4 : 3) : 6;
  if (xs.length < nb) return null;
  const ata = Array.from({ length: nb }, () => new Array<number>(nb).fill(0));
  const aty = new Array<number>(nb).fill(0);
  xs.forEach((x, i) => {
    const f = basis(x.map((v, d) => (v - centre[d]) / halfWidth[d]), nb);
    for (let r = 0; r < nb; r++) {
      aty[r] += f[r] * ys[i];
      for (let c = 0; c < nb; c++) ata[r][c] += f[r] * f[c];
    }
  });
  const coef = solveLinear(ata, aty);
  return coef === null ? null : { dims, coef, centre, halfWidth };
}

/** The fitted value at scaled coordinates u. */
function atScaled(q: Quadratic, u: number[]): number {
  const f = basis(u, q.coef.length);
  let s = 0;
  for (let k = 0; k < f.length; k++) s += q.coef[k] * f[k];
  return s;
}

/** The fitted value at x (parameter units). */
export function quadraticAt(q: Quadratic, x: number[]): number {
  return atScaled(q, x.map((v, d) => (v - q.centre[d]) / q.halfWidth[d]));
}

/** Maximum of a + b·t + c·t² over t ∈ [lo, hi]: the better end, or the vertex when c < 0 and inside. */
function max1d(a: number, b: number, c: number, lo: number, hi: number): number {
  const f = (t: number): number => a + b * t + c * t * t;
  let best = f(lo) >= f(hi) ? lo : hi;
  if (c < 0) {
    const t = -b / (2 * c);
    if (t > lo && t < hi && f(t) > f(best)) best = t;
  }
  return best;
}

/**
 * Where the fitted surface is largest within the box lo ≤ x ≤ hi (parameter units): the interior
 * stationary point when the surface is concave there, otherwise the best point on the box's edges.
 */
export function quadraticArgmax(q: Quadratic, lo: number[], hi: number[]): number[] {
  const ulo = lo.map((v, d) => (v - q.centre[d]) / q.halfWidth[d]);
  const uhi = hi.map((v, d) => (v - q.centre[d]) / q.halfWidth[d]);
  const toX = (u: number[]): number[] => u.map((v, d) => q.centre[d] + v * q.halfWidth[d]);
  const [a0, b1, b2, c11, c12, c22] = q.coef;
  if (q.dims === 1 && q.coef.length === 4) {
    // Cubic: the ends, and the roots of f' = b1 + 2 b2 u + 3 c11 u² inside.
    const cands = [ulo[0], uhi[0]];
    const A = 3 * c11, B = 2 * b2, C = b1;
    if (Math.abs(A) < 1e-300) {
      if (B !== 0) cands.push(-C / B);
    } else {
      const disc = B * B - 4 * A * C;
      if (disc >= 0) {
        const r = Math.sqrt(disc);
        cands.push((-B - r) / (2 * A), (-B + r) / (2 * A));
      }
    }
    let best = ulo[0];
    for (const u of cands) if (u >= ulo[0] && u <= uhi[0] && atScaled(q, [u]) > atScaled(q, [best])) best = u;
    return toX([best]);
  }
  if (q.dims === 1) return toX([max1d(a0, b1, b2, ulo[0], uhi[0])]);
  const candidates: number[][] = [];
  // Interior: ∇ = 0 with a negative-definite Hessian [[2c11, c12], [c12, 2c22]].
  const det = 4 * c11 * c22 - c12 * c12;
  if (c11 < 0 && det > 0) {
    const u = (-2 * c22 * b1 + c12 * b2) / det;
    const v = (-2 * c11 * b2 + c12 * b1) / det;
    if (u >= ulo[0] && u <= uhi[0] && v >= ulo[1] && v <= uhi[1]) candidates.push([u, v]);
  }
  // Edges u = const (a quadratic in v) and v = const (a quadratic in u); corners are their ends.
  for (const u of [ulo[0], uhi[0]]) {
    candidates.push([u, max1d(a0 + b1 * u + c11 * u * u, b2 + c12 * u, c22, ulo[1], uhi[1])]);
  }
  for (const v of [ulo[1], uhi[1]]) {
    candidates.push([max1d(a0 + b2 * v + c22 * v * v, b1 + c12 * v, c11, ulo[0], uhi[0]), v]);
  }
  let best = candidates[0];
  for (const c of candidates) if (atScaled(q, c) > atScaled(q, best)) best = c;
  return toX(best);
}

/** Second derivative of the fitted surface along each axis (parameter units): 2c/halfWidth². */
export function axisCurvatures(q: Quadratic): number[] {
  return q.dims === 1
    ? [(2 * q.coef[2]) / (q.halfWidth[0] * q.halfWidth[0])]
    : [(2 * q.coef[3]) / (q.halfWidth[0] * q.halfWidth[0]), (2 * q.coef[5]) / (q.halfWidth[1] * q.halfWidth[1])];
}
