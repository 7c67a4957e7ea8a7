import type { RandomStream } from "../random/stream.js";
import type { CompiledStack } from "./compiledStack.js";
import { ANALOG, BULK, DZ, FREE_PATH, PATH, T, TAU, W, Z } from "./rayState.js";
import { depositPoint, depositSegment } from "./depthTally.js";

/**
 * Beer–Lambert along a straight path of length st[T] (µm) in medium m. Analog: the ray carries an
 * exponentially distributed optical depth budget (TAU) and dies where it runs out. Expected value:
 * the weight falls by exp(−αL) and the difference is tallied. Roulette: once the weight would fall
 * below the roulette weight the ray turns analog (its remaining weight survives or is absorbed
 * whole: unbiased, and each ray's channels still sum to 1, unlike classic Russian roulette that
 * discards weight). Returns true when the ray was absorbed.
 */
export function absorbAlong(cs: CompiledStack, st: Float64Array, m: number, rng: RandomStream): boolean {
  const lenUm = st[T];
  const alpha = cs.mediumAlphaPerUm[m];
  const inAbsorber = m === cs.nLayers + 1;
  const w = st[W];
  if (inAbsorber) {
    // Path with the absorber's absorption removed (α → 0): every stretch at the weight the ray would
    // carry without it, w / BULK, where BULK is the product of the bulk survival factors so far
    // (expected value: the factors w already carries; analog: the survival probability, which the
    // division undoes: an importance weight, unbiased, whose spread grows with αW).
    st[FREE_PATH] += (w / st[BULK]) * lenUm;
  }
  if (!(alpha > 0)) {
    if (inAbsorber) st[PATH] += w * lenUm;
    return false;
  }
  // Expected value, unless this stretch would take the weight below the roulette weight: then the
  // ray turns analog before it (the same expectation, and no work spent on negligible weights).
  // Analog rays need no exponential outside the absorber; inside it the survival factor feeds the
  // α → 0 path (BULK).
  const att = st[ANALOG] === 0 || inAbsorber ? Math.exp(-alpha * lenUm) : 0;
  if (inAbsorber) st[BULK] *= att;
  if (st[ANALOG] === 0 && w * att < cs.rouletteWeight) {
    st[ANALOG] = 1;
    st[TAU] = -Math.log(rng.next());
  }
  const depth = inAbsorber && cs.depthEdgesUm !== null;
  if (st[ANALOG] !== 0) {
    const tau = alpha * lenUm;
    if (tau >= st[TAU]) {
      if (inAbsorber) st[PATH] += (w * st[TAU]) / alpha;
      if (depth) depositPoint(cs, w, st[Z], st[TAU] / alpha, st[DZ]);
      cs.contrib[cs.mediumChan[m]] += w;
      return true;
    }
    st[TAU] -= tau;
    if (inAbsorber) st[PATH] += w * lenUm;
    return false;
  }
  const dep = w - w * att;
  cs.contrib[cs.mediumChan[m]] += dep;
  if (depth) depositSegment(cs, w, st[Z], lenUm, st[DZ], alpha);
  // Expected path length of the analog ray over this stretch: w(1 − e^−αL)/α.
  if (inAbsorber) st[PATH] += dep / alpha;
  st[W] = w - dep;
  return false;
}

/** Expected-value mode: turn analog once the weight is small (see absorbAlong). */
export function rouletteCheck(cs: CompiledStack, st: Float64Array, rng: RandomStream): void {
  if (st[ANALOG] === 0 && st[W] < cs.rouletteWeight) {
    st[ANALOG] = 1;
    st[TAU] = -Math.log(rng.next());
  }
}
