/**
 * cos and sin of an angle given as a fraction of a turn (2π·turn), for the random angles of the ray
 * loop (polarisation line, azimuths): the turn reduces exactly to a quadrant and x ∈ [−π/4, π/4]
 * (4·turn and its nearest integer are exact), then the Taylor series of cos x to x¹⁶ and of sin x to
 * x¹⁵ (truncation below x¹⁷/17! < 5e-17 there). About a fifth of the cost of Math.cos plus Math.sin,
 * which the engine calls out to; agrees with them to a few units in the last place (tests/trace/turnTrig).
 */

const HALF_PI = Math.PI / 2;
// Taylor coefficients 1/n! with alternating signs.
const C2 = -1 / 2, C4 = 1 / 24, C6 = -1 / 720, C8 = 1 / 40320, C10 = -1 / 3628800, C12 = 1 / 479001600;
const C14 = -1 / 87178291200, C16 = 1 / 20922789888000;
const S3 = -1 / 6, S5 = 1 / 120, S7 = -1 / 5040, S9 = 1 / 362880, S11 = -1 / 39916800, S13 = 1 / 6227020800;
const S15 = -1 / 1307674368000;

/** st[iCos] = cos(2π·turn), st[iSin] = sin(2π·turn), for |turn| < 2^30. */
export function cosSinOfTurn(st: Float64Array, turn: number, iCos: number, iSin: number): void {
  const q4 = 4 * turn;
  const k = Math.round(q4);
  const x = (q4 - k) * HALF_PI;
  const z = x * x;
  const c = 1 + z * (C2 + z * (C4 + z * (C6 + z * (C8 + z * (C10 + z * (C12 + z * (C14 + z * C16)))))));
  const s = x + x * z * (S3 + z * (S5 + z * (S7 + z * (S9 + z * (S11 + z * (S13 + z * S15))))));
  // quadrant of the turn: angle = k·π/2 + x
  const quadrant = k & 3;
  if (quadrant === 0) {
    st[iCos] = c;
    st[iSin] = s;
  } else if (quadrant === 1) {
    st[iCos] = -s;
    st[iSin] = c;
  } else if (quadrant === 2) {
    st[iCos] = -c;
    st[iSin] = -s;
  } else {
    st[iCos] = s;
    st[iSin] = -c;
  }
}
