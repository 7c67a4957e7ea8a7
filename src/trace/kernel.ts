import { InputError } from "../util/errors.js";
import type { RandomStream } from "../random/stream.js";
import { Hit } from "../geometry/surfaceHit.js";
import { SurfaceKind } from "../geometry/surfaceTile.js";
import { Setting, RearKind, type CompiledInterface, type CompiledStack, type Estimator } from "./compiledStack.js";
import { Ray, Outcome, advance, setNormal } from "./rayState.js";
import { popBranch, setBranchMedium, splitPolarizationHalves } from "./branches.js";
import { cosSinOfTurn } from "./turnTrig.js";
import { launchRay, polarizationMode, setLaunchAngles, setLaunchAzimuth, type Polarization } from "./launch.js";
import type { LaunchPoints } from "./launchPoints.js";
import { frontSearch, outerSearch, planarRearSearch, rearSearch, rearSearchFromBehind } from "./surfaceSearch.js";
import { absorbAlong, endAnalogPath } from "./bulkTransport.js";
import { interfaceEvent } from "./interfaceEvent.js";
import { backsheetEvent, idealRear, lambertianDirection, lambertianFrontFromBelow, randomPolarization } from "./idealSurfaces.js";
import { foldBatchTotals, tallyLengthOf } from "./tally.js";
import { DIAG_LENGTH, diagOffset } from "./tallyLayout.js";
import { Face, arriveAtFace, departFace, enterAbsorber, leaveFront, rearExitChannel, resetHistory } from "./history.js";
import { traceAnalogCellRays } from "./analogCell.js";
import { foldRay } from "./rayFold.js";

export type { Polarization } from "./launch.js";

/** The estimator a batch at polar angle θ is traced with (the stack's, analog from its Setting.ANALOG_FROM_THETA_DEG on). */
export function estimatorAt(cs: CompiledStack, thetaDeg: number): Estimator {
  return thetaDeg >= cs.estimatorSettings[Setting.ANALOG_FROM_THETA_DEG] ? "analog" : cs.estimator;
}

/** Where the light comes from: the incidence medium (front) or the medium behind the rear. */
export type LightSide = "front" | "rear";

const DEG = Math.PI / 180;

// What a step of the ray loop returns besides the next medium (≥ 0).
/** The ray ended and its weight is tallied. */
const RAY_ENDED = -1;
/** The ray ran parallel to the layers or slipped through a mesh edge: its weight goes to "unresolved". */
const RAY_LOST = -2;
/** Medium above the texture, no texture hit: the ray moves on as in a planar layer. */
const NOT_AT_TEXTURE = -3;

/**
 * Traces nRays rays arriving from the incidence medium at polar angle θ and azimuth φ (null = a
 * random azimuth per ray) and adds them to the tally (docs/contracts.md, Tracer): per channel
 * [Σc, Σc²] of each ray's contribution c, then [nRays, Σp, Σp², events] with p the ray's optical
 * path in the absorber divided by its thickness. Each ray's contributions sum to 1. Ray r draws
 * from substream r of rng (RandomStream.startSubstream); with launch points (randomized
 * quasi-Monte Carlo, launchPoints.ts) its launch x, y, ψ and φ are point r of the batch instead.
 */
export function traceBatch(
  cs: CompiledStack,
  thetaDeg: number,
  phiDeg: number | null,
  nRays: number,
  rng: RandomStream,
  tally: Float64Array,
  polarization: Polarization = "unpolarized",
  side: LightSide = "front",
  launch: LaunchPoints | null = null,
): void {
  if (!Number.isInteger(nRays) || nRays < 1) throw new InputError(`rays: expected a positive whole number of rays, got ${nRays}`);
  if (!(thetaDeg >= 0 && thetaDeg < 90)) throw new InputError(`angle: expected a polar angle in [0, 90) degrees, got ${thetaDeg}`);
  if (phiDeg !== null && !Number.isFinite(phiDeg)) throw new InputError(`azimuth: expected a number of degrees, got ${phiDeg}`);
  const nC = cs.nChannels;
  const need = tallyLengthOf(cs);
  if (tally.length < need) throw new RangeError(`tally has ${tally.length} entries, needs ${need}`);
  const diagAt = diagOffset(nC);
  cs.diag = tally.subarray(diagAt, diagAt + DIAG_LENGTH);
  const fromRear = side === "rear";
  if (fromRear && cs.rearOpaque) {
    throw new InputError(`illumination: light from the rear needs a transparent rear; this stack ends in a reflector, a metal or a back-sheet`, 'trace from the front, or give the stack a transparent rear ("rearOuter": "air")');
  }
  const startMedium = fromRear ? cs.outerMedium : 0;
  const polMode = polarizationMode(polarization);
  const st = cs.state;
  // Batch sums [events, Σp, Σp²] (rayFold.ts), and two slots of the bare-cell loop's (analogCell.ts).
  const sums = new Float64Array(5);
  st[Ray.BATCH_ANALOG] = estimatorAt(cs, thetaDeg) === "analog" ? 1 : 0;
  setLaunchAngles(st, Math.sin(thetaDeg * DEG), Math.cos(thetaDeg * DEG));
  if (phiDeg !== null) setLaunchAzimuth(st, phiDeg * DEG);
  if (st[Ray.BATCH_ANALOG] !== 0 && !fromRear && cs.analogCellLoop) {
    traceAnalogCellRays(cs, nRays, rng, tally, polMode, launch, phiDeg === null, sums);
  } else {
    const u = launch === null ? null : launch.u;
    // Unpolarised expected-value light where the stack says so (estimatorChoice.ts): each ray as its
    // p half (launched, then waiting as a branch) and its s half (traceRay).
    const halves = polMode === 0 && !fromRear && st[Ray.BATCH_ANALOG] === 0 && thetaDeg >= cs.estimatorSettings[Setting.POLARIZATION_SPLIT_FROM_THETA_DEG];
    const launchPol = halves ? 2 : polMode;
    for (let r = 0; r < nRays; r++) {
      // One substream per ray: rays stay paired across stacks traced with the same stream (CRN).
      rng.startSubstream(r);
      st[Ray.RAY_INDEX] = r;
      if (launch !== null) launch.load(r);
      if (phiDeg === null) cosSinOfTurn(st, u === null ? rng.next() : u[3], Ray.L_COS_P, Ray.L_SIN_P);
      launchRay(cs, launchPol, rng, fromRear, u);
      resetHistory(st, fromRear ? Face.REAR : Face.FRONT);
      traceRay(cs, rng, startMedium, halves);
      foldRay(cs, tally, sums);
    }
  }
  foldBatchTotals(tally, nC, nRays, sums[1], sums[2], sums[0]);
}

/**
 * Follows the launched ray from medium to medium until it ends, then each of its pending branches
 * (split interface events; with `halves`, first its p half, splitPolarizationHalves); its interface
 * events → st[EVENTS].
 */
function traceRay(cs: CompiledStack, rng: RandomStream, startMedium: number, halves: boolean): void {
  const st = cs.state;
  const nL = cs.nLayers;
  const ABS = nL + 1;
  const maxEvents = cs.maxEvents;
  st[Ray.EVENTS] = 0;
  st[Ray.BRANCHES] = 0;
  st[Ray.BRANCH_SERIAL] = 0;
  st[Ray.ENTERED] = 0;
  if (halves) splitPolarizationHalves(cs, st, startMedium);
  let m = startMedium;
  for (;;) {
    let next: number;
    if (st[Ray.EVENTS] >= maxEvents) {
      next = RAY_LOST;
    } else if (m === ABS) {
      // Inside the absorber the ray usually stays for several events (reflections at both faces):
      // stay in this loop while it does (as the outer loop would: entered, event budget checked there).
      for (;;) {
        next = stepInAbsorber(cs, st, rng);
        if (next !== ABS || st[Ray.EVENTS] >= maxEvents) break;
        st[Ray.ENTERED] = 1;
      }
    } else if (m > ABS) {
      next = m === ABS + 1 ? stepOntoRear(cs, st, m, rng) : NOT_AT_TEXTURE;
      if (next === NOT_AT_TEXTURE) next = stepBehindAbsorber(cs, st, m, rng);
    } else {
      next = NOT_AT_TEXTURE;
      // the outer glass texture: from above, from the glass going up, or inside its slab
      if (cs.outerTile !== null && m <= 1 && (m === 0 || st[Ray.DZ] > 0 || st[Ray.Z] > cs.layerTopZUm[1] + cs.outerTile.zMinUm)) {
        next = stepAtOuterTexture(cs, st, m, rng);
      }
      if (next === NOT_AT_TEXTURE && m === nL) next = stepOntoFront(cs, st, rng);
      if (next === NOT_AT_TEXTURE) next = stepInPlanarLayer(cs, st, m, rng);
    }
    if (next >= 0) {
      if (next === ABS) st[Ray.ENTERED] = 1;
      m = next;
      continue;
    }
    // This branch ended: a lost one reports its weight; then the next pending branch, if any.
    if (next === RAY_LOST) cs.contrib[cs.chUnresolved] += st[Ray.W];
    endAnalogPath(cs, st);
    if (st[Ray.BRANCHES] === 0) return;
    m = popBranch(cs, st, rng);
  }
}

/**
 * In the absorber: rays going up inside the rear texture's slab may meet another rear facet first;
 * then the front texture (rays going up, or still inside its slab), else down to the rear;
 * Beer–Lambert on the way, then the surface event there. One call site each for Beer–Lambert, the
 * step and the face arrival, so V8 inlines them within its budget (as in analogCell.ts).
 */
function stepInAbsorber(cs: CompiledStack, st: Float64Array, rng: RandomStream): number {
  const ABS = cs.nLayers + 1;
  const rearMesh = cs.rearTile.kind === SurfaceKind.MESH;
  // Going up after the rear: the next pass has begun (history.ts).
  if (st[Ray.DZ] > 0 && st[Ray.FACE] === Face.REAR) departFace(cs, st);
  let atRear = false;
  if (st[Ray.DZ] > 0 && rearMesh && st[Ray.Z] < -cs.thicknessUm - cs.rearTile.zMinUm) {
    const inRear = rearSearch(cs, st);
    if (inRear === Hit.LOST) return RAY_LOST;
    atRear = inRear === Hit.HIT;
  }
  if (!atRear) {
    const found = frontSearch(cs, st, true);
    if (found === Hit.LOST) return RAY_LOST;
    if (found !== Hit.HIT) {
      // Heading for the rear, clear of the front texture: the next pass has begun.
      if (st[Ray.FACE] === Face.FRONT) departFace(cs, st);
      const toRear = rearMesh ? rearSearch(cs, st) : planarRearSearch(cs, st);
      if (toRear === Hit.LOST) return RAY_LOST;
      // Left the rear texture's slab upward; with a planar rear, a ray parallel to the faces.
      if (toRear === Hit.NO_HIT) return rearMesh ? ABS : RAY_LOST;
      atRear = true;
    }
  }
  if (absorbAlong(cs, st, ABS, rng)) return RAY_ENDED;
  advance(st);
  st[Ray.EVENTS]++;
  arriveAtFace(st, atRear ? Face.REAR : Face.FRONT);
  if (atRear) return rearEvent(cs, st, rng);
  if (cs.frontTile.kind === SurfaceKind.LAMBERTIAN) return lambertianFrontFromBelow(cs, st, rng) ? cs.nLayers : ABS;
  return afterInterface(cs, st, interfaceEvent(cs, st, cs.front, rng), ABS, cs.nLayers);
}

/** The event at the rear reached from the absorber: an ideal reflector, or the rear interface. */
function rearEvent(cs: CompiledStack, st: Float64Array, rng: RandomStream): number {
  const ABS = cs.nLayers + 1;
  if (cs.rearKind === RearKind.IDEAL_MIRROR || cs.rearKind === RearKind.IDEAL_LAMBERTIAN) return idealRear(cs, st, rng) ? RAY_ENDED : ABS;
  // into the first rear layer, or (without rear layers) absorbed/escaped in the exit medium's sink
  return afterInterface(cs, st, interfaceEvent(cs, st, cs.rear as CompiledInterface, rng), ABS, ABS + 1);
}

/**
 * In the medium touching the rear texture from behind (first rear layer, or the exit medium): rays
 * going up meet it; rays going down may still meet another facet inside its slab.
 */
function stepOntoRear(cs: CompiledStack, st: Float64Array, m: number, rng: RandomStream): number {
  const found = rearSearchFromBehind(cs, st);
  if (found === Hit.LOST) return RAY_LOST;
  if (found !== Hit.HIT) return NOT_AT_TEXTURE;
  if (absorbAlong(cs, st, m, rng)) return RAY_ENDED;
  advance(st);
  st[Ray.EVENTS]++;
  const next = afterInterface(cs, st, interfaceEvent(cs, st, cs.rear as CompiledInterface, rng), m, m - 1);
  if (next === m - 1) enterAbsorber(st, Face.REAR);
  return next;
}

/**
 * Behind the absorber: rear layer m (planar; straight to its bottom plane, or up to the plane of the
 * layer above) or the medium behind the rear (down: escape into T; up: onto the last rear layer).
 */
function stepBehindAbsorber(cs: CompiledStack, st: Float64Array, m: number, rng: RandomStream): number {
  const vz = st[Ray.DZ];
  const j = m - cs.nLayers - 2; // rear layer index; cs.nRear for the outer medium
  if (vz < 0) {
    if (m === cs.outerMedium) {
      cs.contrib[rearExitChannel(cs, st)] += st[Ray.W];
      return RAY_ENDED;
    }
    if (reachPlane(cs, st, m, cs.rearBottomZUm[j], rng)) return RAY_ENDED;
    const iface = cs.rearBottomInterfaces[j];
    if (iface === null) return backsheetEvent(cs, st, rng) ? RAY_ENDED : m;
    return afterInterface(cs, st, interfaceEvent(cs, st, iface, rng), m, m + 1);
  }
  if (vz > 0) {
    // j ≥ 1 here (the first rear layer meets the rear texture in stepOntoRear)
    if (reachPlane(cs, st, m, cs.rearBottomZUm[j - 1], rng)) return RAY_ENDED;
    return afterInterface(cs, st, interfaceEvent(cs, st, cs.rearBottomInterfaces[j - 1] as CompiledInterface, rng), m, m - 1);
  }
  return RAY_LOST;
}

/** At the outer layer's top texture: m = 0 (above it) or 1 (in the layer); the top films' interface there. */
function stepAtOuterTexture(cs: CompiledStack, st: Float64Array, m: number, rng: RandomStream): number {
  const found = outerSearch(cs, st, m === 1);
  if (found === Hit.LOST) return RAY_LOST;
  if (found !== Hit.HIT) return NOT_AT_TEXTURE;
  if (absorbAlong(cs, st, m, rng)) return RAY_ENDED;
  advance(st);
  st[Ray.EVENTS]++;
  return afterInterface(cs, st, interfaceEvent(cs, st, cs.topInterfaces[0], rng), m, 1 - m);
}

/** In the medium touching the front texture (the incidence medium or the lowest thick layer). */
function stepOntoFront(cs: CompiledStack, st: Float64Array, rng: RandomStream): number {
  const m = cs.nLayers;
  const ABS = m + 1;
  const found = frontSearch(cs, st, false);
  if (found === Hit.LOST) return RAY_LOST;
  if (found !== Hit.HIT) return NOT_AT_TEXTURE;
  if (absorbAlong(cs, st, m, rng)) return RAY_ENDED;
  advance(st);
  st[Ray.EVENTS]++;
  if (cs.frontTile.kind === SurfaceKind.LAMBERTIAN) {
    // Ideal randomiser: everything enters the absorber, in a Lambertian direction.
    lambertianDirection(st, -1, rng);
    randomPolarization(st, rng);
    enterAbsorber(st, Face.FRONT);
    return ABS;
  }
  const next = afterInterface(cs, st, interfaceEvent(cs, st, cs.front, rng), m, ABS);
  if (next === ABS) enterAbsorber(st, Face.FRONT);
  return next;
}

/**
 * Straight through thick medium m to the horizontal plane z = zUm (Beer–Lambert on the way), landing
 * on it with the plane's normal +z. Returns true when the ray was absorbed on the way.
 */
function reachPlane(cs: CompiledStack, st: Float64Array, m: number, zUm: number, rng: RandomStream): boolean {
  st[Ray.T] = (zUm - st[Ray.Z]) / st[Ray.DZ];
  if (absorbAlong(cs, st, m, rng)) return true;
  advance(st);
  st[Ray.Z] = zUm;
  st[Ray.EVENTS]++;
  setNormal(st, 0, 0, 1);
  return false;
}

/** Planar thick layer m (or the incidence medium, m = 0): straight to its top or bottom plane. */
function stepInPlanarLayer(cs: CompiledStack, st: Float64Array, m: number, rng: RandomStream): number {
  const vz = st[Ray.DZ];
  if (vz > 0) {
    if (m === 0) {
      leaveFront(cs, st);
      return RAY_ENDED;
    }
    if (reachPlane(cs, st, m, cs.layerTopZUm[m], rng)) return RAY_ENDED;
    return afterInterface(cs, st, interfaceEvent(cs, st, cs.topInterfaces[m - 1], rng), m, m - 1);
  }
  if (vz < 0) {
    if (reachPlane(cs, st, m, cs.layerTopZUm[m + 1], rng)) return RAY_ENDED;
    return afterInterface(cs, st, interfaceEvent(cs, st, cs.topInterfaces[m], rng), m, m + 1);
  }
  return RAY_LOST;
}

/** The medium after an interface event: stays on reflection, crosses on transmission (a split's reflected branch stays). */
function afterInterface(cs: CompiledStack, st: Float64Array, outcome: number, here: number, across: number): number {
  if (outcome === Outcome.DIED) return RAY_ENDED;
  if (outcome === Outcome.SPLIT) {
    setBranchMedium(cs, st, here);
    return across;
  }
  return outcome === Outcome.TRANSMIT ? across : here;
}
