/**
 * cos and sin of an angle given as a fraction of a turn (2π·turn), for the random angles of the ray
 * loop (polarisation line, azimuths): the turn reduces exactly to a quadrant and x ∈ [−π/4, π/4]
 * (4·turn and its nearest integer are exact), then the Taylor series of cos x to x¹⁶ and of sin x to
 * x¹⁵ (truncation below x¹⁷/17! < 5e-17 there). About half the cost of Math.cos plus Math.sin,
 * which the engine calls out to; agrees with them to a few units in the last place (tests/trace/turnTrig).
 * The nearest integer is ⌊4·turn + ½⌋ (Math.round took 7 ns of the 20 here, 2026-12-05): the same
 * integer as Math.round (ties up, negative turns too) wherever 4·turn + ½ is exact, as for every turn
 * the tracer draws (multiples of 2^-33 in (0, 1): random streams and launch points); elsewhere at
 * worst the neighbour, |x| a rounding past π/4.
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
  const k = Math.floor(q4 + 0.5);
  const x = (q4 - k) * HALF_PI;
  const z = x * x;
  const c = 1 + z * (C2 + z * (C4 + z * (C6 + z * (C8 + z * (C10 + z * (C12 + z * (C14 + z * C16)))))));
  const s = x + x * z * (S3 + z * (S5 + z * (S7 + z * (S9 + z * (S11 + z * (S13 + z * S15))))));
  // Quadrant q of the turn: angle = q·π/2 + x, so (cos, sin) = (c, s), (−s, c), (−c, −s), (s, −c).
  // Picked by arithmetic, not by branches: the quadrant of a random angle is unpredictable and its
  // branches cost more than the series (0·y adds ±0, so the values are exactly those of the branches).
  const q = k & 3;
  const swap = q & 1;
  const keep = 1 - swap;
  st[iCos] = (1 - 2 * (((q + 1) >> 1) & 1)) * (keep * c + swap * s);
  st[iSin] = (1 - 2 * (q >> 1)) * (keep * s + swap * c);
}
