/**
 * The state of the one ray in flight, kept in a Float64Array (cs.state): nothing is allocated per
 * ray or event, and doubles travel through these slots, never as arguments or return values of
 * non-inlined functions, so the hot path boxes no numbers.
 */

/**
 * The slots of the state. A const enum, so the compiler writes each slot's number into the code that
 * uses it: an imported `const` is read through its module binding at every use in V8's optimised
 * code (load, check that it is initialised, untag), and with the slots as imported constants the
 * analog bench case ran 4–10 % and the expected-value estimator 13–24 % slower (2026-12-05,
 * DEVELOPERS.md "Tracer efficiency").
 */
export const enum Ray {
  // Position, direction, line of polarisation (unit vector ⊥ direction).
  X = 0, Y = 1, Z = 2, DX = 3, DY = 4, DZ = 5, EX = 6, EY = 7, EZ = 8,
  /** Weight; remaining optical-depth budget (analog); weighted path in the absorber; surface normal; analog flag; step length. */
  W = 9, TAU = 10, PATH = 11, NX = 12, NY = 13, NZ = 14, ANALOG = 15, T = 16,
  /** Polarisation update inputs: s vector and the two amplitudes (see setPolarization). */
  SX = 17, SY = 18, SZ = 19, PA = 20, PB = 21,
  /** Launch direction of the batch: sin θ, cos θ, cos φ, sin φ (φ per ray when the azimuth is random). */
  L_SIN_T = 22, L_COS_T = 23, L_COS_P = 24, L_SIN_P = 25,
  /** Interface events of the ray so far. */
  EVENTS = 26,
  /** Pending branches of the ray (split interface events, src/trace/branches.ts), the ray's index in its batch, branches started. */
  BRANCHES = 27, RAY_INDEX = 28, BRANCH_SERIAL = 29,
  /** 1 once the branch in flight has entered the absorber (splitting is for the first pass only). */
  ENTERED = 30,
  /** The s and p amplitudes of the polarisation at the current interface event (interfaceEvent). */
  ES = 31, EP = 32,
  /**
   * History in the absorber (see history.ts): passes, last face, entered power, α → 0 path, its
   * survival divisor, pass tail, pass end not yet recorded, face the light came in through, highest
   * pass bin touched by the ray, the escape-angle bins it touched through the front (one bit each).
   */
  PASSES = 33, FACE = 34, ENTERED_W = 35, FREE_PATH = 36, BULK = 37, TAIL = 38, PENDING = 39, INCIDENT = 40, MAX_PASS = 41, ESCAPED = 42,
  /** 1 when the batch in flight is traced with the analog estimator (estimatorAt). */
  BATCH_ANALOG = 43,
  /** Absorber path travelled in analog mode whose α → 0 share is not yet in FREE_PATH (bulkTransport.ts, endAnalogPath). */
  ANALOG_PATH = 44,
  /**
   * The uniform u of the ray's optical-depth budget −ln u while none of it has been spent outside the
   * absorber since it was drawn (bulkTransport.ts, budgetFreePath); 0 when it has, or for a budget a
   * branch resumed.
   */
  BUDGET_U = 45,
}
/** Number of state slots. */
export const STATE_LENGTH = Ray.BUDGET_U + 1;

/** Interface outcomes (a const enum, as Ray). SPLIT: the state continues transmitted, the reflected part waits as a branch. */
export const enum Outcome {
  REFLECT = 0,
  TRANSMIT = 1,
  DIED = 2,
  SPLIT = 3,
}

export const TWO_PI = 2 * Math.PI;

/** Moves the ray by st[T]. */
export function advance(st: Float64Array): void {
  const t = st[Ray.T];
  st[Ray.X] += t * st[Ray.DX];
  st[Ray.Y] += t * st[Ray.DY];
  st[Ray.Z] += t * st[Ray.DZ];
}

export function setNormal(st: Float64Array, nx: number, ny: number, nz: number): void {
  st[Ray.NX] = nx;
  st[Ray.NY] = ny;
  st[Ray.NZ] = nz;
}
