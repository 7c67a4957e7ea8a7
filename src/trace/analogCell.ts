import type { RandomStream } from "../random/stream.js";
import { Hit } from "../geometry/surfaceHit.js";
import { SurfaceKind } from "../geometry/surfaceTile.js";
import { RearKind, type CompiledInterface, type CompiledStack } from "./compiledStack.js";
import { Ray, Outcome, advance } from "./rayState.js";
import { frontSearch, planarRearSearch, pyramidSearch } from "./surfaceSearch.js";
import { depositPoint } from "./depthTally.js";
import { MAX_PASSES } from "./tallyLayout.js";
import { analogInterfaceEvent } from "./analogInterfaceEvent.js";
import { idealRearAnalog } from "./idealSurfaces.js";
import { Face, leaveFront, rearExitChannel } from "./history.js";
import { launchRay } from "./launch.js";
import type { LaunchPoints } from "./launchPoints.js";
import { cosSinOfTurn } from "./turnTrig.js";
import { flushAnalogCellCounts, foldAnalogCellRay } from "./cellFold.js";
import { budgetFreePath } from "./bulkTransport.js";

/**
 * The ray loop of an analog batch on a bare cell: the incidence medium straight on the front texture
 * (regular pyramids or planar, films allowed), the absorber, a planar rear (ideal reflector, or an
 * interface into the exit medium), light from the front. A ray is either above the
 * front or in the absorber, so one loop with a flag replaces the general loop's medium dispatch
 * (kernel.ts). The physics, the random draws and the tallies are the general loop's: the same
 * search and event calls, and Beer–Lambert (absorbAnalog) and the pass history (history.ts) written
 * out with the ray's budget, paths and history in locals instead of its state slots, so both loops
 * give bit-identical tallies (tests/trace/analogCell.test.ts). On the bench case the general loop,
 * given the same single call sites, still ran 13–16 % slower before the locals (2026-12-05;
 * DEVELOPERS.md, "Tracer efficiency").
 */

/** Whether analog batches of front light on this stack can take the bare-cell loop. */
export function analogCellEligible(cs: CompiledStack): boolean {
  return (
    cs.nLayers === 0 &&
    cs.outerTile === null &&
    cs.nRear === 0 &&
    cs.frontTile.kind !== SurfaceKind.LAMBERTIAN &&
    (cs.frontTile.kind === SurfaceKind.PLANAR || cs.frontTile.pyramidSign !== 0) &&
    cs.rearTile.kind === SurfaceKind.PLANAR
  );
}

const RAY_LOST = -2;

/**
 * Traces nRays analog rays of front light through the bare cell and folds them into the tally as
 * traceBatch does (kernel.ts, the caller, has checked the arguments and set the batch's direction);
 * sums gets [events, Σp, Σp²] (and uses its slots 3 and 4, see traceCellChunk). The history the
 * general loop resets per ray (resetHistory) is the ray loop's locals; only the incidence face and
 * the survival factor are the batch's. The rays' whole counts go into the tally at the batch's end
 * (cellFold.ts).
 */
export function traceAnalogCellRays(cs: CompiledStack, nRays: number, rng: RandomStream, tally: Float64Array, polMode: number, launch: LaunchPoints | null, randomAzimuth: boolean, sums: Float64Array): void {
  const st = cs.state;
  st[Ray.INCIDENT] = Face.FRONT;
  st[Ray.BULK] = 1;
  sums[3] = 0;
  sums[4] = 0;
  for (let r0 = 0; r0 < nRays; r0 += CELL_CHUNK_RAYS) {
    traceCellChunk(cs, r0, Math.min(nRays, r0 + CELL_CHUNK_RAYS), rng, tally, polMode, launch, randomAzimuth, sums);
  }
  flushAnalogCellCounts(cs, tally, sums[3], sums[4]);
}

/**
 * Rays per call of the ray loop. The loop runs in a function called once per chunk, not once per
 * batch: V8 then optimises it as a whole function with the feedback of earlier calls. As one loop
 * per batch it ran in on-stack-replacement code compiled in the middle of the first batch: the call
 * after the loop had no feedback there, so that code fell back to the interpreter at every batch's
 * end, and the function's own optimised code, dropped early, was not rebuilt (`--trace-opt
 * --trace-deopt`, 2026-12-05). In chunks the bench case ran 8–10 % faster at 600 nm.
 */
const CELL_CHUNK_RAYS = 256;

/**
 * Rays r0 … r1 − 1 of the batch. sums[3] counts the rays that entered the absorber, sums[4] keeps
 * the highest pass any ray ended (whole numbers, so nothing is boxed on the way).
 */
function traceCellChunk(cs: CompiledStack, r0: number, r1: number, rng: RandomStream, tally: Float64Array, polMode: number, launch: LaunchPoints | null, randomAzimuth: boolean, sums: Float64Array): void {
  const st = cs.state;
  const u = launch === null ? null : launch.u;
  let entered = 0;
  let maxPass = sums[4] | 0;
  for (let r = r0; r < r1; r++) {
    // (No RAY_INDEX: it numbers a ray's branches, and this loop makes none.)
    rng.startSubstream(r);
    if (launch !== null) launch.load(r);
    if (randomAzimuth) cosSinOfTurn(st, u === null ? rng.next() : u[3], Ray.L_COS_P, Ray.L_SIN_P);
    launchRay(cs, polMode, rng, false, u);
    if (traceAnalogCellRay(cs, st, rng) === RAY_LOST) cs.contrib[cs.chUnresolved] += st[Ray.W];
    foldAnalogCellRay(cs, st, tally, sums);
    entered += st[Ray.ENTERED_W] | 0;
    const mp = st[Ray.MAX_PASS] | 0;
    if (mp > maxPass) maxPass = mp;
  }
  sums[3] += entered;
  sums[4] = maxPass;
}

/**
 * Follows one launched analog ray to its end (its channel in the scratch contributions, the sums
 * the fold reads in the state); returns RAY_LOST when it could not be resolved (event budget, lost
 * in the walk), else 0. The ray's budget, paths and history live in locals while it is traced and
 * its events, paths, tail, highest pass and entry go to the state once at its end (the pass counter
 * at once: the exit channels read it); the arithmetic and its order are those of absorbAnalog and
 * history.ts, so the tallies are theirs bit for bit.
 */
function traceAnalogCellRay(cs: CompiledStack, st: Float64Array, rng: RandomStream): number {
  const maxEvents = cs.maxEvents;
  const mirrorRear = cs.rearKind === RearKind.IDEAL_MIRROR || cs.rearKind === RearKind.IDEAL_LAMBERTIAN;
  const alphaAbove = cs.mediumAlphaPerUm[0];
  const alphaAbs = cs.mediumAlphaPerUm[1];
  // Regular pyramids are searched directly (frontSearch's dispatch cost 2–4 % on the bench case).
  const tile = cs.frontTile;
  const pyramids = tile.kind !== SurfaceKind.PLANAR;
  // An analog ray keeps its weight from launch to end.
  const w = st[Ray.W];
  let tau = st[Ray.TAU];
  let budgetU = st[Ray.BUDGET_U];
  let path = st[Ray.PATH];
  // A new ray's history (history.ts, resetHistory): no pass, no face, nothing entered.
  let analogPath = 0;
  let freePath = 0;
  let passes = 0;
  st[Ray.PASSES] = 0;
  let face = Face.NONE;
  let pending = false;
  let tail = 0;
  let maxPass = 0;
  let entered = 0;
  let events = 0;
  let inAbsorber = false;
  let absorbedWhole = false;
  let result = 0;
  for (;;) {
    if (events >= maxEvents) {
      result = RAY_LOST;
      break;
    }
    // Where the ray meets a surface next: the front from above or below, or the rear.
    let atRear = false;
    if (!inAbsorber) {
      const found = pyramids ? pyramidSearch(tile, st, false, 1, 0) : frontSearch(cs, st, false);
      if (found === Hit.LOST) {
        result = RAY_LOST;
        break;
      }
      if (found === Hit.NO_HIT) {
        result = leaveAbove(cs, st);
        break;
      }
    } else {
      const found = pyramids ? pyramidSearch(tile, st, true, 1, 0) : frontSearch(cs, st, true);
      // Leaving the face that ended a pass (history.ts, departFace): up from the rear, or down from
      // the front towards the rear.
      if (pending && (face === Face.REAR ? st[Ray.DZ] > 0 : found !== Hit.HIT && found !== Hit.LOST)) {
        pending = false;
        const k = passes - 1;
        if (k > MAX_PASSES) tail += w;
        else {
          cs.rayPasses[k - 1] += w;
          if (k > maxPass) maxPass = k;
        }
      }
      if (found === Hit.LOST) {
        result = RAY_LOST;
        break;
      }
      if (found !== Hit.HIT) {
        // No front hit and no rear ahead: the ray runs parallel to the faces (dz = 0 or NaN).
        if (planarRearSearch(cs, st) === Hit.NO_HIT) {
          result = RAY_LOST;
          break;
        }
        atRear = true;
      }
    }
    // Beer–Lambert on the way there (absorbAnalog's arithmetic), then the event.
    const lenUm = st[Ray.T];
    if (inAbsorber) {
      if (alphaAbs > 0) {
        const od = alphaAbs * lenUm;
        if (od >= tau) {
          const s = tau / alphaAbs;
          path += w * s;
          analogPath += s;
          if (cs.depthEdgesUm !== null) depositPoint(cs, w, st[Ray.Z], s, st[Ray.DZ]);
          cs.contrib[cs.mediumChan[1]] += w;
          absorbedWhole = budgetU > 0;
          break;
        }
        tau -= od;
        path += w * lenUm;
        analogPath += lenUm;
      } else {
        // α = 0 (bulkTransport.ts, clearStretch; w / BULK is w).
        freePath += w * lenUm;
        path += w * lenUm;
      }
    } else if (alphaAbove > 0) {
      const od = alphaAbove * lenUm;
      if (od >= tau) {
        cs.contrib[cs.mediumChan[0]] += w;
        break;
      }
      tau -= od;
      budgetU = 0;
    }
    advance(st);
    events++;
    if (inAbsorber) {
      const f = atRear ? Face.REAR : Face.FRONT;
      if (face !== f) {
        face = f;
        passes += 1;
        st[Ray.PASSES] = passes;
        pending = true;
      }
    }
    if (atRear && mirrorRear) {
      if (idealRearAnalog(cs, st, rng)) break;
      continue;
    }
    const out = analogInterfaceEvent(cs, st, atRear ? (cs.rear as CompiledInterface) : cs.front, rng);
    if (out === Outcome.DIED) break;
    if (out === Outcome.REFLECT) continue;
    if (atRear) {
      // Transmitted into the exit medium without a sink there: it leaves through the rear.
      cs.contrib[rearExitChannel(cs, st)] += w;
      break;
    }
    if (!inAbsorber) {
      // Into the absorber through the front (history.ts, enterAbsorber).
      if (passes === 0) {
        passes = 1;
        st[Ray.PASSES] = 1;
        entered += w;
      }
      face = Face.FRONT;
    }
    inAbsorber = !inAbsorber;
  }
  // The α → 0 path of the analog path (bulkTransport.ts, absorbedInStretch and endAnalogPath; no
  // expected-value stretch here, so the survival factor BULK is 1 and w / BULK is w).
  if (absorbedWhole) freePath += w * budgetFreePath(budgetU, alphaAbs);
  else if (analogPath !== 0) freePath += w * (Math.expm1(alphaAbs * analogPath) / alphaAbs);
  // What the fold reads (cellFold.ts, traceCellChunk); the budget and the face stay local.
  st[Ray.EVENTS] = events;
  st[Ray.PATH] = path;
  st[Ray.FREE_PATH] = freePath;
  st[Ray.TAIL] = tail;
  st[Ray.MAX_PASS] = maxPass;
  st[Ray.ENTERED_W] = entered;
  return result;
}

/** No front hit from above: the ray leaves upward (0), or runs parallel to the front (RAY_LOST). */
function leaveAbove(cs: CompiledStack, st: Float64Array): number {
  if (!(st[Ray.DZ] > 0)) return RAY_LOST;
  leaveFront(cs, st);
  return 0;
}
