import type { RandomStream } from "../random/stream.js";
import type { CompiledStack } from "./compiledStack.js";
import { Ray } from "./rayState.js";

/**
 * Pending branches of the ray in flight. In expected-value mode an interface event may split the
 * ray (interfaceEvent): the transmitted part goes on at once, the reflected part waits here with
 * its share of the weight and is traced after the current branch ends (splitting, the expected
 * value of the reflect/transmit choice), on the way in and, under the Sobol' tail rule, on the way out. Every branch belongs to the same ray: its contributions
 * add to the ray's, which still sum to 1. A fixed stack in cs.branches; nothing is allocated.
 */
export const MAX_BRANCHES = 64;
/**
 * Saved per branch: position, direction, polarisation, weight, τ budget, analog flag, medium, and its
 * history in the absorber (entered flag, pass, face, bulk survival, pass end pending).
 */
export const BRANCH_SLOTS = 18;
const B_MEDIUM = 12;
const B_HISTORY = 13;

/** Whether another branch fits. */
export function canBranch(st: Float64Array): boolean {
  return st[Ray.BRANCHES] < MAX_BRANCHES;
}

/** Saves the ray's current state as a pending branch (its medium is set by setBranchMedium). */
export function pushBranch(cs: CompiledStack, st: Float64Array): void {
  const b = cs.branches;
  const o = st[Ray.BRANCHES] * BRANCH_SLOTS;
  b[o] = st[Ray.X];
  b[o + 1] = st[Ray.Y];
  b[o + 2] = st[Ray.Z];
  b[o + 3] = st[Ray.DX];
  b[o + 4] = st[Ray.DY];
  b[o + 5] = st[Ray.DZ];
  b[o + 6] = st[Ray.EX];
  b[o + 7] = st[Ray.EY];
  b[o + 8] = st[Ray.EZ];
  b[o + 9] = st[Ray.W];
  b[o + 10] = st[Ray.TAU];
  b[o + 11] = st[Ray.ANALOG];
  b[o + B_MEDIUM] = -1;
  b[o + B_HISTORY] = st[Ray.ENTERED];
  b[o + B_HISTORY + 1] = st[Ray.PASSES];
  b[o + B_HISTORY + 2] = st[Ray.FACE];
  b[o + B_HISTORY + 3] = st[Ray.BULK];
  b[o + B_HISTORY + 4] = st[Ray.PENDING];
  st[Ray.BRANCHES]++;
}

/** The medium of the branch pushed last. */
export function setBranchMedium(cs: CompiledStack, st: Float64Array, m: number): void {
  cs.branches[(st[Ray.BRANCHES] - 1) * BRANCH_SLOTS + B_MEDIUM] = m;
}

/**
 * Restores the branch pushed last into the state and returns its medium, or −1 when none is left.
 * The branch draws from its own substream (ray index, branch serial number), so a branch's random numbers
 * do not depend on how many the branches before it used (common random numbers stay paired).
 */
export function popBranch(cs: CompiledStack, st: Float64Array, rng: RandomStream): number {
  const n = st[Ray.BRANCHES] | 0;
  if (n <= 0) return -1;
  const b = cs.branches;
  const o = (n - 1) * BRANCH_SLOTS;
  st[Ray.X] = b[o];
  st[Ray.Y] = b[o + 1];
  st[Ray.Z] = b[o + 2];
  st[Ray.DX] = b[o + 3];
  st[Ray.DY] = b[o + 4];
  st[Ray.DZ] = b[o + 5];
  st[Ray.EX] = b[o + 6];
  st[Ray.EY] = b[o + 7];
  st[Ray.EZ] = b[o + 8];
  st[Ray.W] = b[o + 9];
  st[Ray.TAU] = b[o + 10];
  st[Ray.ANALOG] = b[o + 11];
  // A resumed budget may have been spent in part before the split (bulkTransport.ts, budgetFreePath).
  st[Ray.BUDGET_U] = 0;
  st[Ray.BRANCHES] = n - 1;
  // the branch resumes the history it had at the split (history.ts)
  st[Ray.ENTERED] = b[o + B_HISTORY];
  st[Ray.PASSES] = b[o + B_HISTORY + 1];
  st[Ray.FACE] = b[o + B_HISTORY + 2];
  st[Ray.BULK] = b[o + B_HISTORY + 3];
  st[Ray.PENDING] = b[o + B_HISTORY + 4];
  st[Ray.BRANCH_SERIAL]++;
  rng.startSubstream(st[Ray.RAY_INDEX] | 0, st[Ray.BRANCH_SERIAL] | 0);
  return b[o + B_MEDIUM] | 0;
}

/**
 * Unpolarised light as the incoherent sum of two orthogonal linear polarisations (Born & Wolf,
 * Principles of Optics, §10.8): the ray just launched polarised p waits as a branch of weight ½ that
 * starts in medium m, and the ray goes on with the other half polarised s, s = (sin φ, −cos φ, 0) ⊥
 * the plane of incidence (launch.ts). On a planar front the first reflection is then (R_s + R_p)/2
 * for every ray, where a random line of polarisation ψ makes it R_s cos²ψ + R_p sin²ψ.
 */
export function splitPolarizationHalves(cs: CompiledStack, st: Float64Array, m: number): void {
  st[Ray.W] = 0.5;
  pushBranch(cs, st);
  setBranchMedium(cs, st, m);
  st[Ray.EX] = st[Ray.L_SIN_P];
  st[Ray.EY] = -st[Ray.L_COS_P];
  st[Ray.EZ] = 0;
}
