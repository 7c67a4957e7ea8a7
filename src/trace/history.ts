import type { CompiledStack } from "./compiledStack.js";
import { Ray } from "./rayState.js";
import { DIAG_ENTERED, DIAG_ESCAPE_ANGLE, DIAG_FREE_PATH, DIAG_R_TOTAL, DIAG_T_TOTAL, ESCAPE_ANGLE_BIN_DEG, ESCAPE_ANGLE_BINS, MAX_PASSES, diagPassOffset } from "./tallyLayout.js";

/**
 * A ray's history in the absorber, kept in its state slots (rayState.ts): how many passes it has
 * made, which face it touched last, the power it entered with, its path with the absorber's
 * absorption removed and the survival factor that removal divides by.
 *
 * A pass is one traversal of the absorber between its faces: it starts when the ray enters through
 * the front (pass 1) and ends at the first arrival at the other face; further hits on the same face
 * (a second facet of a texture) belong to the same arrival. The power still inside after pass k is
 * taken when the ray sets off on pass k + 1 (departFace). st[PASSES] is the number of the pass
 * under way (0 before entering), so it reads k + 1 once pass k has ended. "First" channels follow
 * (leavesFirst): light leaving through the face it came in by, never having entered, and light
 * leaving through the other face at the end of pass 1; everything else that leaves is escape.
 *
 * A ray may be split into branches (branches.ts): each branch resumes the history it had at the
 * split (entered flag, pass, face, survival), and the ray's sums — entered power, α → 0 path, power per pass and
 * per escape angle (cs.rayPasses, cs.rayEscape) — add over its branches, so the tally keeps one
 * sample per ray (its squares are those of the ray's totals).
 */

/** The absorber's faces: none yet, the front, the rear. */
export const enum Face {
  NONE = 0,
  FRONT = 1,
  REAR = 2,
}

/** cos of the escape-angle bin edges b·ESCAPE_ANGLE_BIN_DEG, b = 0..ESCAPE_ANGLE_BINS (falling). */
const EDGE_COS = Float64Array.from({ length: ESCAPE_ANGLE_BINS + 1 }, (_, b) => Math.cos(b * ESCAPE_ANGLE_BIN_DEG * (Math.PI / 180)));

/** A new ray arriving at `incidentFace` (Face.FRONT or Face.REAR): no pass, no face, nothing entered. */
export function resetHistory(st: Float64Array, incidentFace: number): void {
  st[Ray.INCIDENT] = incidentFace;
  st[Ray.ENTERED_W] = 0;
  st[Ray.FREE_PATH] = 0;
  st[Ray.TAIL] = 0;
  st[Ray.MAX_PASS] = 0;
  st[Ray.ESCAPED] = 0;
  st[Ray.PASSES] = 0;
  st[Ray.FACE] = Face.NONE;
  st[Ray.BULK] = 1;
  st[Ray.ANALOG_PATH] = 0;
  st[Ray.PENDING] = 0;
}

/** The ray crossed `face` (Face.FRONT / Face.REAR) into the absorber (with its weight st[W]). */
export function enterAbsorber(st: Float64Array, face: number): void {
  if (st[Ray.PASSES] === 0) {
    st[Ray.PASSES] = 1;
    st[Ray.ENTERED_W] += st[Ray.W];
  }
  st[Ray.FACE] = face;
}

/**
 * True when light leaving the stack through `face` now is "first": at its first arrival at that
 * face — the incidence face before it ever entered the absorber, the other face at the end of the
 * first pass (the pass counter reads 2 there).
 */
export function leavesFirst(st: Float64Array, face: number): boolean {
  return face === st[Ray.INCIDENT] ? st[Ray.PASSES] === 0 : st[Ray.PASSES] <= 2;
}

/** Channel of light leaving through the rear now: T_first or T_escape. */
export function rearExitChannel(cs: CompiledStack, st: Float64Array): number {
  return leavesFirst(st, Face.REAR) ? cs.chTFirst : cs.chTEscape;
}

/**
 * The ray in the absorber arrives at a face (Face.FRONT / Face.REAR). Returns 1 when this ends a
 * pass (the other face was touched last), else 0.
 */
export function arriveAtFace(st: Float64Array, face: number): number {
  if (st[Ray.FACE] === face) return 0;
  st[Ray.FACE] = face;
  st[Ray.PASSES] += 1;
  st[Ray.PENDING] = 1;
  return 1;
}

/**
 * The ray sets off from the face it touched last into the bulk (clear of that face's texture):
 * when that face ended a pass, its weight st[W] is the power still inside after that pass. Taken
 * at departure rather than right after the face event, so light that left through one facet and
 * came back in through the next (textures) or was returned by a cover layer counts as still inside,
 * and light that hits a second facet and leaves does not.
 */
export function departFace(cs: CompiledStack, st: Float64Array): void {
  if (st[Ray.PENDING] !== 0) endPass(cs, st);
}

/** departFace when the face ended a pass: the power still inside is that pass's. */
function endPass(cs: CompiledStack, st: Float64Array): void {
  st[Ray.PENDING] = 0;
  const w = st[Ray.W];
  const k = st[Ray.PASSES] - 1; // passes completed
  if (k > MAX_PASSES) {
    st[Ray.TAIL] += w;
    return;
  }
  cs.rayPasses[k - 1] += w;
  if (k > st[Ray.MAX_PASS]) st[Ray.MAX_PASS] = k;
}

/**
 * The ray leaves through the front (weight st[W], going up): R_first or R_escape (leavesFirst);
 * R_escape power is also binned by the polar angle of its direction (cosθ = st[DZ]).
 */
export function leaveFront(cs: CompiledStack, st: Float64Array): void {
  const w = st[Ray.W];
  const cosTheta = st[Ray.DZ];
  if (leavesFirst(st, Face.FRONT)) {
    cs.contrib[cs.chRFirst] += w;
    return;
  }
  cs.contrib[cs.chREscape] += w;
  // θ ≥ b·Δ exactly when cosθ ≤ cos(b·Δ): the bin from the edges' cosines, no arc cosine.
  let bin = 0;
  while (bin < ESCAPE_ANGLE_BINS - 1 && cosTheta <= EDGE_COS[bin + 1]) bin++;
  cs.rayEscape[bin] += w;
  st[Ray.ESCAPED] = st[Ray.ESCAPED] | (1 << bin);
}

/**
 * Adds the finished ray's sums (and their squares) to the diagnostics and clears its scratch. Called
 * before its channel contributions are folded (it reads the R and T totals from them).
 */
export function foldHistory(cs: CompiledStack, st: Float64Array): void {
  const d = cs.diag;
  const c = cs.contrib;
  const r = c[cs.chRFirst] + c[cs.chREscape];
  d[DIAG_R_TOTAL] += r;
  d[DIAG_R_TOTAL + 1] += r * r;
  const tr = c[cs.chTFirst] + c[cs.chTEscape];
  d[DIAG_T_TOTAL] += tr;
  d[DIAG_T_TOTAL + 1] += tr * tr;
  const e = st[Ray.ENTERED_W];
  if (e !== 0) {
    d[DIAG_ENTERED] += e;
    d[DIAG_ENTERED + 1] += e * e;
  }
  foldHistoryFractions(cs, st);
  const p = cs.rayPasses;
  for (let k = 1; k <= st[Ray.MAX_PASS]; k++) {
    const v = p[k - 1];
    const o = diagPassOffset(k);
    d[o] += v;
    d[o + 1] += v * v;
    p[k - 1] = 0;
  }
  // Only the escape-angle bins the ray touched (a bit each in st[ESCAPED]).
  let touched = st[Ray.ESCAPED] | 0;
  if (touched !== 0) {
    const a = cs.rayEscape;
    while (touched !== 0) {
      const b = 31 - Math.clz32(touched & -touched);
      touched &= touched - 1;
      const v = a[b];
      const o = DIAG_ESCAPE_ANGLE + 2 * b;
      d[o] += v;
      d[o + 1] += v * v;
      a[b] = 0;
    }
  }
}

/**
 * The finished ray's history sums that need not be whole numbers: its α → 0 path (over the
 * absorber's thickness) and its pass tail (a ray may pass the last bin several times). Part of
 * foldHistory; the bare-cell loop, which adds its whole counts once per batch, folds only these per
 * ray (cellFold.ts).
 */
export function foldHistoryFractions(cs: CompiledStack, st: Float64Array): void {
  const d = cs.diag;
  // The thickness's inverse from the stack, not as an argument: a double passed to code that is not inlined is boxed.
  const f = st[Ray.FREE_PATH] * cs.invThicknessUm;
  if (f !== 0) {
    d[DIAG_FREE_PATH] += f;
    d[DIAG_FREE_PATH + 1] += f * f;
  }
  const t = st[Ray.TAIL];
  if (t !== 0) {
    const o = diagPassOffset(MAX_PASSES + 1);
    d[o] += t;
    d[o + 1] += t * t;
  }
}
