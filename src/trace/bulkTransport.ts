import type { RandomStream } from "../random/stream.js";
import { Setting, type CompiledStack } from "./compiledStack.js";
import { Ray } from "./rayState.js";
import { depositPoint, depositSegment } from "./depthTally.js";

/**
 * Beer–Lambert along a straight path of length st[T] (µm) in medium m. Analog: the ray carries an
 * exponentially distributed optical depth budget (TAU) and dies where it runs out. Expected value:
 * the weight falls by exp(−αL) and the difference is tallied. Roulette: once the weight would fall
 * below the roulette weight the ray turns analog (its remaining weight survives or is absorbed
 * whole: unbiased, and each ray's channels still sum to 1, unlike classic Russian roulette that
 * discards weight). Returns true when the ray was absorbed. Only expected-value stretches need an
 * exponential.
 */
export function absorbAlong(cs: CompiledStack, st: Float64Array, m: number, rng: RandomStream): boolean {
  if (st[Ray.ANALOG] === 0 && cs.mediumAlphaPerUm[m] > 0 && expectedStretch(cs, st, m, rng)) return false;
  return absorbAnalog(cs, st, m);
}

/**
 * Expected value over the stretch, unless it would take the weight below the roulette weight: then
 * the ray turns analog before it (the same expectation, and no work spent on negligible weights) and
 * false is returned for absorbAnalog to take the stretch.
 */
function expectedStretch(cs: CompiledStack, st: Float64Array, m: number, rng: RandomStream): boolean {
  const lenUm = st[Ray.T];
  const alpha = cs.mediumAlphaPerUm[m];
  const w = st[Ray.W];
  const att = Math.exp(-alpha * lenUm);
  if (w * att < cs.estimatorSettings[Setting.ROULETTE_WEIGHT]) {
    drawBudget(st, rng);
    return false;
  }
  const dep = w - w * att;
  cs.contrib[cs.mediumChan[m]] += dep;
  st[Ray.W] = w - dep;
  if (m === cs.nLayers + 1) {
    // Path with the absorber's absorption removed (α → 0): every stretch at the weight the ray
    // would carry without it, w / BULK, BULK the product of the bulk survival factors so far.
    st[Ray.FREE_PATH] += (w / st[Ray.BULK]) * lenUm;
    st[Ray.BULK] *= att;
    if (cs.depthEdgesUm !== null) depositSegment(cs, w, st[Ray.Z], lenUm, st[Ray.DZ], alpha);
    // Expected path length of the analog ray over this stretch: w(1 − e^−αL)/α.
    st[Ray.PATH] += dep / alpha;
  }
  return true;
}

/**
 * The stretch for a ray in analog mode (or through a medium that does not absorb): no exponential;
 * the absorber path feeds the α → 0 path when the branch ends (endAnalogPath). Returns true when the
 * ray was absorbed. Its common case is kept small (the rest in two helpers), so callers inline it
 * within V8's inlining budget. The bare-cell loop (analogCell.ts) writes the same arithmetic out
 * with the ray's budget and paths in locals.
 */
export function absorbAnalog(cs: CompiledStack, st: Float64Array, m: number): boolean {
  const alpha = cs.mediumAlphaPerUm[m];
  if (!(alpha > 0)) {
    clearStretch(cs, st, m);
    return false;
  }
  const lenUm = st[Ray.T];
  const tau = alpha * lenUm;
  if (tau >= st[Ray.TAU]) {
    absorbedInStretch(cs, st, m);
    return true;
  }
  st[Ray.TAU] -= tau;
  if (m === cs.nLayers + 1) {
    st[Ray.PATH] += st[Ray.W] * lenUm;
    st[Ray.ANALOG_PATH] += lenUm;
  } else st[Ray.BUDGET_U] = 0;
  return false;
}

/** absorbAnalog through a medium that does not absorb: in the absorber (α = 0), its path. */
function clearStretch(cs: CompiledStack, st: Float64Array, m: number): void {
  if (m !== cs.nLayers + 1) return;
  const lenUm = st[Ray.T];
  const w = st[Ray.W];
  st[Ray.FREE_PATH] += (w / st[Ray.BULK]) * lenUm;
  st[Ray.PATH] += w * lenUm;
}

/** absorbAnalog: the budget ran out in this stretch; the ray is absorbed in medium m there. */
function absorbedInStretch(cs: CompiledStack, st: Float64Array, m: number): void {
  const w = st[Ray.W];
  if (m === cs.nLayers + 1) {
    const alpha = cs.mediumAlphaPerUm[m];
    const s = st[Ray.TAU] / alpha;
    st[Ray.PATH] += w * s;
    if (cs.depthEdgesUm !== null) depositPoint(cs, w, st[Ray.Z], s, st[Ray.DZ]);
    const u = st[Ray.BUDGET_U];
    if (u > 0) {
      // The whole budget went in the absorber: its α → 0 path without an exponential (endAnalogPath).
      st[Ray.FREE_PATH] += (w / st[Ray.BULK]) * budgetFreePath(u, alpha);
      st[Ray.ANALOG_PATH] = 0;
    } else st[Ray.ANALOG_PATH] += s;
  }
  cs.contrib[cs.mediumChan[m]] += w;
}

/**
 * The branch in flight ends: the absorber path L it travelled in analog mode enters the α → 0 path
 * as (w / BULK)·(e^{αL} − 1)/α (BULK: the survival factors of the expected-value stretches before
 * it, whose weights w carries). In an analog stretch the weight is constant and the ray dies after
 * an exponential path D (rate α in the absorber); the α → 0 ray would go on to the stretch's end S.
 * E[∫₀^{min(D,S)} e^{αs} ds] = ∫₀^S e^{−αs} e^{αs} ds = S, so the term is unbiased, one exponential
 * per branch instead of one per stretch. (Absorption in other media acts on both rays alike.)
 */
export function endAnalogPath(cs: CompiledStack, st: Float64Array): void {
  const lenUm = st[Ray.ANALOG_PATH];
  if (lenUm === 0) return;
  st[Ray.ANALOG_PATH] = 0;
  const alpha = cs.mediumAlphaPerUm[cs.nLayers + 1];
  st[Ray.FREE_PATH] += (st[Ray.W] / st[Ray.BULK]) * (Math.expm1(alpha * lenUm) / alpha);
}

/**
 * (e^{αL} − 1)/α for a ray absorbed in the absorber after an analog path L there that used up its
 * whole budget −ln u (αL = −ln u, so e^{αL} = 1/u): the term endAnalogPath would add, without the
 * exponential and without the rounding the budget's running difference and the summed path carry.
 */
export function budgetFreePath(u: number, alphaPerUm: number): number {
  return (1 - u) / (u * alphaPerUm);
}

/** The ray turns analog: a fresh optical-depth budget −ln u. */
function drawBudget(st: Float64Array, rng: RandomStream): void {
  const u = rng.next();
  st[Ray.ANALOG] = 1;
  st[Ray.TAU] = -Math.log(u);
  st[Ray.BUDGET_U] = u;
}

/** Expected-value mode: turn analog once the weight is small (see absorbAlong). */
export function rouletteCheck(cs: CompiledStack, st: Float64Array, rng: RandomStream): void {
  if (st[Ray.ANALOG] === 0 && st[Ray.W] < cs.estimatorSettings[Setting.ROULETTE_WEIGHT]) {
    drawBudget(st, rng);
  }
}
