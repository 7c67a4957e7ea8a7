import type { RandomStream } from "../random/stream.js";
import { LOST, NO_HIT } from "../geometry/surfaceHit.js";
import { SURFACE_LAMBERTIAN, SURFACE_PLANAR } from "../geometry/surfaceTile.js";
import { REAR_IDEAL_LAMBERTIAN, REAR_IDEAL_MIRROR, type CompiledInterface, type CompiledStack } from "./compiledStack.js";
import { DIED, DZ, EVENTS, FACE, HIT, REFLECT, W, advance } from "./rayState.js";
import { frontSearch, planarRearSearch, pyramidSearch } from "./surfaceSearch.js";
import { absorbAnalog } from "./bulkTransport.js";
import { analogInterfaceEvent } from "./analogInterfaceEvent.js";
import { idealRear } from "./idealSurfaces.js";
import { FACE_FRONT, FACE_REAR, arriveAtFace, departFace, enterAbsorber, leaveFront, rearExitChannel } from "./history.js";

/**
 * The ray loop of an analog batch on a bare cell: the incidence medium straight on the front texture
 * (regular pyramids or planar, films allowed), the absorber, a planar rear (ideal reflector, or an
 * interface into the exit medium), light from the front. A ray is either above the
 * front or in the absorber, so one loop with a flag replaces the general loop's medium dispatch
 * (kernel.ts); the physics, the random draws and the tallies are the general loop's, call for call,
 * so both give bit-identical tallies (tests/trace/analogCell.test.ts). On the bench case the general
 * loop, given the same single call sites, still runs 13–16 % slower (2026-12-05; DEVELOPERS.md,
 * "Tracer efficiency").
 */

/** Whether analog batches of front light on this stack can take the bare-cell loop. */
export function analogCellEligible(cs: CompiledStack): boolean {
  return (
    cs.nLayers === 0 &&
    cs.outerTile === null &&
    cs.nRear === 0 &&
    cs.frontTile.kind !== SURFACE_LAMBERTIAN &&
    (cs.frontTile.kind === SURFACE_PLANAR || cs.frontTile.pyramidSign !== 0) &&
    cs.rearTile.kind === SURFACE_PLANAR
  );
}

export const RAY_LOST = -2;

/**
 * Follows one launched analog ray to its end (its channel, history and events in the state, as
 * traceRay leaves them); returns RAY_LOST when it could not be resolved (event budget, lost in the
 * walk), else 0.
 */
export function traceAnalogCellRay(cs: CompiledStack, st: Float64Array, rng: RandomStream): number {
  const maxEvents = cs.maxEvents;
  const ABS = 1;
  const mirrorRear = cs.rearKind === REAR_IDEAL_MIRROR || cs.rearKind === REAR_IDEAL_LAMBERTIAN;
  const absorbingAbove = cs.mediumAlphaPerUm[0] > 0;
  // Regular pyramids are searched directly (frontSearch's dispatch cost 2–4 % on the bench case).
  const tile = cs.frontTile;
  const pyramids = tile.kind !== SURFACE_PLANAR;
  let inAbsorber = false;
  st[EVENTS] = 0;
  for (;;) {
    if (st[EVENTS] >= maxEvents) return RAY_LOST;
    // Where the ray meets a surface next: the front from above or below, or the rear.
    let atRear = false;
    if (!inAbsorber) {
      const found = pyramids ? pyramidSearch(tile, st, false, 1, 0) : frontSearch(cs, st, false);
      if (found === LOST) return RAY_LOST;
      if (found === NO_HIT) return leaveAbove(cs, st);
    } else {
      if (st[DZ] > 0 && st[FACE] === FACE_REAR) departFace(cs, st);
      const found = pyramids ? pyramidSearch(tile, st, true, 1, 0) : frontSearch(cs, st, true);
      if (found === LOST) return RAY_LOST;
      if (found !== HIT) {
        if (st[FACE] === FACE_FRONT) departFace(cs, st);
        // No front hit and no rear ahead: the ray runs parallel to the faces (dz = 0 or NaN).
        if (planarRearSearch(cs, st) === NO_HIT) return RAY_LOST;
        atRear = true;
      }
    }
    // Beer–Lambert on the way there (one call site each, so the loop inlines them), then the event.
    if ((inAbsorber || absorbingAbove) && absorbAnalog(cs, st, inAbsorber ? ABS : 0)) return 0;
    advance(st);
    st[EVENTS]++;
    if (inAbsorber) arriveAtFace(st, atRear ? FACE_REAR : FACE_FRONT);
    if (atRear && mirrorRear) {
      if (idealRear(cs, st, rng)) return 0;
      continue;
    }
    const out = analogInterfaceEvent(cs, st, atRear ? (cs.rear as CompiledInterface) : cs.front, rng);
    if (out === DIED) return 0;
    if (out === REFLECT) continue;
    if (atRear) {
      // Transmitted into the exit medium without a sink there: it leaves through the rear.
      cs.contrib[rearExitChannel(cs, st)] += st[W];
      return 0;
    }
    if (!inAbsorber) enterAbsorber(st, FACE_FRONT);
    inAbsorber = !inAbsorber;
  }
}

/** No front hit from above: the ray leaves upward (0), or runs parallel to the front (RAY_LOST). */
function leaveAbove(cs: CompiledStack, st: Float64Array): number {
  if (!(st[DZ] > 0)) return RAY_LOST;
  leaveFront(cs, st);
  return 0;
}
