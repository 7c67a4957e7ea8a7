/**
 * Maximises a Monte Carlo objective of one or two parameters within bounds, with a confidence
 * interval on the optimum's location and value.
 *   1. Search (search.ts) on one random stream: with common random numbers the objective is smooth
 *      in x, so a derivative-free search converges like on a deterministic function.
 *   2. Local fit: a small design around the optimum, traced on R independent replica streams; each
 *      replica's fitted quadratic gives an optimum; their mean, standard deviation and Student's t
 *      give the interval (the replicas are independent, so the spread is the Monte Carlo error of
 *      the whole procedure, correlations and fit noise included).
 * The design's half-width w is chosen so the objective drops by about k standard errors at its
 * edges (½|f''|w² = kσ): wide enough that noise does not swamp the curvature, narrow enough that the
 * quadratic describes the peak.
 */
import { twoSidedT } from "./studentT.js";
import { fitQuadratic, quadraticArgmax, quadraticAt } from "./quadraticFit.js";
import { boxInside, search1d, search2d } from "./search.js";
import type { BoundFlag, Estimate, EvaluationRecord, LocalDesign, Objective, OptimizeOptions, OptimumResult, SearchStage } from "./types.js";

const MAX_RECENTRE = 2;

function meanSd(xs: number[]): { mean: number; sd: number } {
  const mean = xs.reduce((a, b) => a + b, 0) / xs.length;
  const ss = xs.reduce((a, b) => a + (b - mean) * (b - mean), 0);
  return { mean, sd: Math.sqrt(ss / (xs.length - 1)) };
}

function checkOptions(o: OptimizeOptions): void {
  const d = o.lower.length;
  if (d !== 1 && d !== 2) throw new RangeError(`optimize: one or two parameters expected, got ${d}`);
  if (o.upper.length !== d) throw new RangeError("optimize: lower and upper bounds differ in length");
  o.lower.forEach((lo, i) => {
    if (!(Number.isFinite(lo) && Number.isFinite(o.upper[i]) && o.upper[i] > lo)) throw new RangeError(`optimize: bounds of parameter ${i + 1} must be finite with lower < upper`);
  });
  if (o.replicas !== undefined && !(Number.isInteger(o.replicas) && o.replicas >= 3)) throw new RangeError("optimize: at least 3 replicas");
  if (o.level !== undefined && !(o.level > 0 && o.level < 1)) throw new RangeError("optimize: level must lie in (0, 1)");
}

/** Points of the local design in a box: 1D five points (−1, −½, 0, ½, 1)·w; 2D the 3 × 3 factorial. */
function designPoints(centre: number[], h: number[]): number[][] {
  if (centre.length === 1) return [-1, -0.5, 0, 0.5, 1].map((u) => [centre[0] + u * h[0]]);
  const pts: number[][] = [];
  for (const u of [-1, 0, 1]) for (const v of [-1, 0, 1]) pts.push([centre[0] + u * h[0], centre[1] + v * h[1]]);
  return pts;
}

export async function optimize(objective: Objective, options: OptimizeOptions): Promise<OptimumResult> {
  checkOptions(options);
  const { lower, upper } = options;
  const dims = lower.length as 1 | 2;
  const range = lower.map((lo, d) => upper[d] - lo);
  const tol = options.tolerance ?? range.map((r) => r / 100);
  const replicas = options.replicas ?? 5;
  const level = options.level ?? 0.95;
  const k = options.designDropSigmas ?? 8;
  const evaluations: EvaluationRecord[] = [];
  const memo = new Map<string, Estimate>();
  const evaluate = async (x: number[], stream: number, stage: SearchStage): Promise<Estimate> => {
    const key = `${stream}|${x.join(",")}`;
    let e = memo.get(key);
    if (e === undefined) {
      e = await objective(x, stream);
      memo.set(key, e);
      const rec = { stage, stream, x, value: e.value, stderr: e.stderr };
      evaluations.push(rec);
      options.onEvaluation?.(rec);
    }
    return e;
  };

  // 1. Search on stream −1.
  const searchEval = (x: number[], stage: SearchStage): Promise<Estimate> => evaluate(x, -1, stage);
  const s = dims === 1
    ? await search1d(searchEval, lower[0], upper[0], tol[0], options.scanPoints ?? 5)
    : await search2d(searchEval, lower, upper, tol, options.scanPoints ?? 3);

  // 2. Local design: ½|f''| w² = k σ, between the tolerance and one scan spacing.
  const sigma = s.bestEstimate.stderr;
  let halfWidth = s.curvature.map((c, d) => {
    const w = c < 0 && sigma > 0 ? Math.sqrt((2 * k * sigma) / -c) : s.spacing[d] / 2;
    return Math.min(s.spacing[d], Math.max(tol[d], w));
  });
  let centre = s.best;
  let recentred = 0;
  for (;;) {
    const box = boxInside(centre, halfWidth, lower, upper);
    const fit = await localFit(box.centre, box.halfWidth);
    const loc = fit.replicaOptima.map((r) => r.location);
    const meanLoc = loc[0].map((_, d) => meanSd(loc.map((l) => l[d])).mean);
    // An optimum on the design's edge that is not a bound: move the design there and fit again.
    const onInnerEdge = meanLoc.some((x, d) => {
      const lo = box.centre[d] - box.halfWidth[d], hi = box.centre[d] + box.halfWidth[d];
      const tiny = 1e-9 * range[d];
      return (x - lo < 0.05 * box.halfWidth[d] && lo > lower[d] + tiny) || (hi - x < 0.05 * box.halfWidth[d] && hi < upper[d] - tiny);
    });
    if (onInnerEdge && recentred < MAX_RECENTRE) {
      recentred++;
      centre = meanLoc;
      continue;
    }
    return summarize(fit.design, fit.replicaOptima, recentred);
  }

  async function localFit(c: number[], h: number[]): Promise<{ design: LocalDesign; replicaOptima: { location: number[]; value: number }[] }> {
    const pts = designPoints(c, h);
    const lo = c.map((x, d) => x - h[d]);
    const hi = c.map((x, d) => x + h[d]);
    const values: number[][] = [];
    const replicaOptima: { location: number[]; value: number }[] = [];
    for (let r = 0; r < replicas; r++) {
      const ys: number[] = [];
      for (const p of pts) ys.push((await evaluate(p, r, "local")).value);
      values.push(ys);
      const q = fitQuadratic(pts, ys, c, h, dims === 1);
      if (q === null) throw new Error("optimize: the local design does not determine a quadratic");
      const xm = quadraticArgmax(q, lo, hi);
      replicaOptima.push({ location: xm, value: quadraticAt(q, xm) });
    }
    const stats = pts.map((_, i) => meanSd(values.map((v) => v[i])));
    const pooled = fitQuadratic(pts, stats.map((m) => m.mean), c, h, dims === 1);
    const design: LocalDesign = {
      centre: c,
      halfWidth: h,
      points: pts,
      mean: stats.map((m) => m.mean),
      stderr: stats.map((m) => m.sd / Math.sqrt(replicas)),
      pooledCoef: pooled?.coef ?? [],
    };
    return { design, replicaOptima };
  }

  function summarize(design: LocalDesign, replicaOptima: { location: number[]; value: number }[], nRecentred: number): OptimumResult {
    const t = twoSidedT(level, replicas - 1);
    const root = Math.sqrt(replicas);
    const location: number[] = [];
    const locationStdErr: number[] = [];
    const locationInterval: [number, number][] = [];
    for (let d = 0; d < dims; d++) {
      const m = meanSd(replicaOptima.map((r) => r.location[d]));
      location.push(m.mean);
      locationStdErr.push(m.sd / root);
      locationInterval.push([Math.max(lower[d], m.mean - (t * m.sd) / root), Math.min(upper[d], m.mean + (t * m.sd) / root)]);
    }
    const v = meanSd(replicaOptima.map((r) => r.value));
    // Bound flags: the surface fitted to the replica means peaks on a bound of the search range.
    const lo = design.centre.map((x, d) => x - design.halfWidth[d]);
    const hi = design.centre.map((x, d) => x + design.halfWidth[d]);
    const pooled = design.pooledCoef.length > 0 ? { dims, coef: design.pooledCoef, centre: design.centre, halfWidth: design.halfWidth } : null;
    const peak = pooled !== null ? quadraticArgmax(pooled, lo, hi) : location;
    const atBound: BoundFlag[] = peak.map((x, d) => {
      const tiny = 1e-9 * range[d];
      if (x <= lower[d] + tiny) return "lower";
      if (x >= upper[d] - tiny) return "upper";
      return null;
    });
    return {
      dims,
      lower,
      upper,
      level,
      replicas,
      location,
      locationStdErr,
      locationInterval,
      value: v.mean,
      valueStdErr: v.sd / root,
      valueInterval: [v.mean - (t * v.sd) / root, v.mean + (t * v.sd) / root],
      atBound,
      recentred: nRecentred,
      design,
      replicaOptima,
      evaluations,
    };
  }
}
