import { compileStack } from "../trace/compile.js";
import { geometricDepthEdges } from "../trace/depthTally.js";
import { baseTallyLength } from "../trace/tallyLayout.js";
import type { ProfileRequest } from "./traceProfile.js";

/** What a generation trace does at every wavelength: its depth grid, tally layout and batches. */
export interface DepthPlan {
  /** Depth bin edges in µm from the top of the front texture, ascending from 0. */
  edgesUm: Float64Array;
  nChannels: number;
  /** Channel index of the absorber (A_absorber). */
  chAbsorber: number;
  /** Length of a batch tally: the stack's tally and [Σg, Σg²] per bin (tallyLengthOf). */
  tallyLength: number;
  /** Rays of each batch of a wavelength, in batch order (full batches, the last one the rest). */
  batchRays: number[];
}

/**
 * The plan of a request: the depth grid down to the deepest point of the absorber (taken from the
 * stack compiled at the first wavelength; the geometry does not depend on it) and the batches.
 */
export function depthPlanOf(req: ProfileRequest): DepthPlan {
  const probe = compileStack(req.study, req.registry, req.study.grid.wavelengthNm[0]);
  const edgesUm = geometricDepthEdges(probe.absorberDepthUm, req.grid.bins, req.grid.firstBinUm);
  const nChannels = probe.channels.length;
  const batchRays: number[] = [];
  for (let done = 0; done < req.raysPerWavelength; done += batchRays[batchRays.length - 1]) {
    batchRays.push(Math.min(req.batch, req.raysPerWavelength - done));
  }
  return { edgesUm, nChannels, chAbsorber: probe.chAbsorber, tallyLength: baseTallyLength(nChannels) + 2 * req.grid.bins, batchRays };
}
