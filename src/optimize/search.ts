/**
 * The search stage: locate the optimum on the search stream (one seed for every x, so the
 * objective is a smooth function of x up to a common offset). 1D: a scan over the bounds, then
 * golden-section search in the best scan point's bracket (Kiefer 1953; Press et al., Numerical
 * Recipes §10.2). 2D: a scan, then successive 3 × 3 quadratic response surfaces, recentred on the
 * fitted maximum and halved in size until finer than the tolerance (Box & Wilson 1951).
 */
import { fitQuadratic, quadraticArgmax, quadraticAt, axisCurvatures } from "./quadraticFit.js";
import type { Estimate, SearchStage } from "./types.js";

/** Evaluates x on the search stream (memoized by the caller). */
export type SearchEval = (x: number[], stage: SearchStage) => Promise<Estimate>;

export interface SearchResult {
  best: number[];
  bestEstimate: Estimate;
  /** Second derivative of the objective along each axis near the optimum (NaN when unknown). */
  curvature: number[];
  /** Scan spacing per axis. */
  spacing: number[];
}

const GOLDEN = (Math.sqrt(5) - 1) / 2;

function linspace(lo: number, hi: number, n: number): number[] {
  return Array.from({ length: n }, (_, k) => (k === n - 1 ? hi : lo + ((hi - lo) * k) / (n - 1)));
}

/** Moves a box of the given half-widths around `centre` so that it lies within the bounds. */
export function boxInside(centre: number[], halfWidth: number[], lower: number[], upper: number[]): { centre: number[]; halfWidth: number[] } {
  const h = halfWidth.map((w, d) => Math.min(w, (upper[d] - lower[d]) / 2));
  const c = centre.map((x, d) => Math.min(upper[d] - h[d], Math.max(lower[d] + h[d], x)));
  return { centre: c, halfWidth: h };
}

export async function search1d(f: SearchEval, lo: number, hi: number, tol: number, nScan: number): Promise<SearchResult> {
  const xs = linspace(lo, hi, nScan);
  const seen: { x: number; e: Estimate }[] = [];
  const at = async (x: number, stage: SearchStage): Promise<number> => {
    const e = await f([x], stage);
    seen.push({ x, e });
    return e.value;
  };
  for (const x of xs) await at(x, "scan");
  let i = 0;
  for (let k = 1; k < seen.length; k++) if (seen[k].e.value > seen[i].e.value) i = k;
  // Golden-section search on the bracket around the best scan point.
  let a = xs[Math.max(0, i - 1)];
  let b = xs[Math.min(nScan - 1, i + 1)];
  let c = b - GOLDEN * (b - a);
  let d = a + GOLDEN * (b - a);
  let fc = await at(c, "search");
  let fd = await at(d, "search");
  while (b - a > tol) {
    if (fc >= fd) {
      b = d; d = c; fd = fc;
      c = b - GOLDEN * (b - a);
      fc = await at(c, "search");
    } else {
      a = c; c = d; fc = fd;
      d = a + GOLDEN * (b - a);
      fd = await at(d, "search");
    }
  }
  let best = seen[0];
  for (const s of seen) if (s.e.value > best.e.value) best = s;
  // Curvature from every search-stream point within one scan spacing of the best.
  const spacing = (hi - lo) / (nScan - 1);
  const near = seen.filter((s) => Math.abs(s.x - best.x) <= spacing * (1 + 1e-9));
  const q = fitQuadratic(near.map((s) => [s.x]), near.map((s) => s.e.value), [best.x], [spacing]);
  return { best: [best.x], bestEstimate: best.e, curvature: [q === null ? NaN : axisCurvatures(q)[0]], spacing: [spacing] };
}

export async function search2d(f: SearchEval, lower: number[], upper: number[], tol: number[], nScan: number): Promise<SearchResult> {
  const seen: { x: number[]; e: Estimate }[] = [];
  const at = async (x: number[], stage: SearchStage): Promise<Estimate> => {
    const e = await f(x, stage);
    seen.push({ x, e });
    return e;
  };
  const g0 = linspace(lower[0], upper[0], nScan);
  const g1 = linspace(lower[1], upper[1], nScan);
  for (const x0 of g0) for (const x1 of g1) await at([x0, x1], "scan");
  const bestSeen = (): { x: number[]; e: Estimate } => seen.reduce((b, s) => (s.e.value > b.e.value ? s : b));
  const spacing = [0, 1].map((d) => (upper[d] - lower[d]) / (nScan - 1));
  let centre = bestSeen().x;
  let h = spacing.slice();
  let curvature = [NaN, NaN];
  // Successive response surfaces: 3 × 3 design, fit, move to the fitted maximum, halve.
  for (let iter = 0; iter < 30 && h.some((w, d) => w > tol[d]); iter++) {
    const box = boxInside(centre, h, lower, upper);
    const pts: number[][] = [];
    for (const u of [-1, 0, 1]) for (const v of [-1, 0, 1]) pts.push([box.centre[0] + u * box.halfWidth[0], box.centre[1] + v * box.halfWidth[1]]);
    const vals: number[] = [];
    for (const p of pts) vals.push((await at(p, "search")).value);
    const q = fitQuadratic(pts, vals, box.centre, box.halfWidth);
    const bLo = box.centre.map((c, d) => c - box.halfWidth[d]);
    const bHi = box.centre.map((c, d) => c + box.halfWidth[d]);
    const b = bestSeen();
    if (q !== null) {
      curvature = axisCurvatures(q);
      const xm = quadraticArgmax(q, bLo, bHi);
      // Trust the surface where it predicts at least the best evaluated value; else the best point.
      centre = quadraticAt(q, xm) >= b.e.value ? xm : b.x;
    } else centre = b.x;
    h = h.map((w) => w / 2);
  }
  const b = bestSeen();
  return { best: centre, bestEstimate: b.e, curvature, spacing };
}
