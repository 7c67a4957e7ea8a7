import type { RandomStream } from "../random/stream.js";
import { RearKind, type CompiledStack } from "./compiledStack.js";
import { rouletteCheck } from "./bulkTransport.js";
import { Ray } from "./rayState.js";
import { cosSinOfTurn } from "./turnTrig.js";

/**
 * Ideal rear reflector (planar, normal +z into the absorber): reflectance r, the rest → A_rear.
 * Mirror: specular; Lambertian: cosine-weighted, depolarising. Returns true when the ray ended.
 */
export function idealRear(cs: CompiledStack, st: Float64Array, rng: RandomStream): boolean {
  if (absorbAtReflector(cs, st, rng, false)) return true;
  leaveIdealRear(cs, st, rng);
  return false;
}

/** The reflected ray's way back from the ideal rear: specular (mirror) or Lambertian. */
function leaveIdealRear(cs: CompiledStack, st: Float64Array, rng: RandomStream): void {
  if (cs.rearKind === RearKind.IDEAL_MIRROR) {
    // Specular at a horizontal plane: z flips; the polarisation keeps its line (r_s = r_p).
    st[Ray.DZ] = -st[Ray.DZ];
    st[Ray.EZ] = -st[Ray.EZ];
  } else {
    lambertianDirection(st, 1, rng);
    randomPolarization(st, rng);
  }
}

/**
 * idealRear for a ray in analog mode (the bare-cell loop, analogCell.ts): the same draw and outcome
 * as absorbAtReflector's analog branch, without the expected-value branch. Once the expected-value
 * estimator has run in the process, idealRear's call tree carries its feedback and no longer fitted
 * the cell loop's inlining budget (bench: analog at 1150 nm 0.68 of native against 0.76 in a process
 * that traced analog only).
 */
export function idealRearAnalog(cs: CompiledStack, st: Float64Array, rng: RandomStream): boolean {
  if (rng.next() >= cs.rearReflectance) {
    cs.contrib[cs.chRear] += st[Ray.W];
    return true;
  }
  leaveIdealRear(cs, st, rng);
  return false;
}

/**
 * Back-sheet at the outer face of the last rear layer (planar, seen from above): reflectance r at
 * this wavelength, the rest → A_rear; of the reflected light the haze share leaves in a Lambertian
 * direction (depolarised), the rest specularly. Returns true when the ray ended.
 */
export function backsheetEvent(cs: CompiledStack, st: Float64Array, rng: RandomStream): boolean {
  if (absorbAtReflector(cs, st, rng, true)) return true;
  if (rng.next() < cs.backsheetHaze) {
    lambertianDirection(st, 1, rng);
    randomPolarization(st, rng);
  } else {
    st[Ray.DZ] = -st[Ray.DZ];
    st[Ray.EZ] = -st[Ray.EZ];
  }
  return false;
}

/**
 * The absorbing part of a reflector of reflectance r: the rest (1 − r) goes to A_rear, drawn
 * (analog) or as a weight (expected value, then roulette). One random number either way, so both
 * estimators keep the same draw order. Returns true when the ray ended there.
 */
function absorbAtReflector(cs: CompiledStack, st: Float64Array, rng: RandomStream, backsheet: boolean): boolean {
  // The reflectance is read here, not passed: a double passed to code that is not inlined is boxed.
  const r = backsheet ? cs.backsheetReflectance : cs.rearReflectance;
  const u = rng.next();
  if (st[Ray.ANALOG] !== 0) {
    if (u >= r) {
      cs.contrib[cs.chRear] += st[Ray.W];
      return true;
    }
    return false;
  }
  const dep = st[Ray.W] * (1 - r);
  cs.contrib[cs.chRear] += dep;
  st[Ray.W] -= dep;
  if (!(st[Ray.W] > 0)) return true;
  rouletteCheck(cs, st, rng);
  return false;
}

/**
 * Ideal randomiser front, ray arriving from the absorber: escapes with probability (n_out/n_in)²
 * (the escape-cone fraction of isotropic light) into a Lambertian direction of the medium above,
 * otherwise it is sent back into the absorber in a Lambertian direction. Returns true on escape.
 */
export function lambertianFrontFromBelow(cs: CompiledStack, st: Float64Array, rng: RandomStream): boolean {
  const ratio = cs.mediumN[cs.nLayers] / cs.mediumN[cs.nLayers + 1];
  const pEscape = ratio < 1 ? ratio * ratio : 1;
  const escape = rng.next() < pEscape;
  lambertianDirection(st, escape ? 1 : -1, rng);
  randomPolarization(st, rng);
  return escape;
}

/** Cosine-weighted direction about ±z (Lambertian): cosθ = √u. */
export function lambertianDirection(st: Float64Array, zSign: number, rng: RandomStream): void {
  const cosT = Math.sqrt(rng.next());
  const sinT = Math.sqrt(1 - cosT * cosT);
  cosSinOfTurn(st, rng.next(), Ray.DX, Ray.DY);
  st[Ray.DX] *= sinT;
  st[Ray.DY] *= sinT;
  st[Ray.DZ] = zSign * cosT;
}

/** Uniformly random line of polarisation ⊥ d. */
export function randomPolarization(st: Float64Array, rng: RandomStream): void {
  const dx = st[Ray.DX], dy = st[Ray.DY], dz = st[Ray.DZ];
  // e1 = normalise(a × d) with a the axis least aligned with d; e2 = d × e1.
  let e1x: number, e1y: number, e1z: number;
  if (Math.abs(dx) < 0.9) {
    e1x = 0;
    e1y = -dz;
    e1z = dy;
  } else {
    e1x = dz;
    e1y = 0;
    e1z = -dx;
  }
  const l = Math.sqrt(e1x * e1x + e1y * e1y + e1z * e1z);
  e1x /= l;
  e1y /= l;
  e1z /= l;
  const e2x = dy * e1z - dz * e1y, e2y = dz * e1x - dx * e1z, e2z = dx * e1y - dy * e1x;
  cosSinOfTurn(st, rng.next(), Ray.PA, Ray.PB);
  const c = st[Ray.PA], s = st[Ray.PB];
  st[Ray.EX] = c * e1x + s * e2x;
  st[Ray.EY] = c * e1y + s * e2y;
  st[Ray.EZ] = c * e1z + s * e2z;
}
