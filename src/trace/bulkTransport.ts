import type { RandomStream } from "../random/stream.js";
import type { CompiledStack } from "./compiledStack.js";
import { ANALOG, PATH, T, TAU, W } from "./rayState.js";

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
  if (!(alpha > 0)) {
    if (inAbsorber) st[PATH] += w * lenUm;
    return false;
  }
  // Expected value, unless this stretch would take the weight below the roulette weight: then the
  // ray turns analog before it (the same expectation, and no work spent on negligible weights).
  // Analog rays need no exponential.
  const att = st[ANALOG] === 0 ? Math.exp(-alpha * lenUm) : 0;
  if (st[ANALOG] === 0 && w * att < cs.rouletteWeight) {
    st[ANALOG] = 1;
    st[TAU] = -Math.log(rng.next());
  }
  if (st[ANALOG] !== 0) {
    const tau = alpha * lenUm;
    if (tau >= st[TAU]) {
      if (inAbsorber) st[PATH] += (w * st[TAU]) / alpha;
      cs.contrib[cs.mediumChan[m]] += w;
      return true;
    }
    st[TAU] -= tau;
    if (inAbsorber) st[PATH] += w * lenUm;
    return false;
  }
  const dep = w - w * att;
  cs.contrib[cs.mediumChan[m]] += dep;
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
