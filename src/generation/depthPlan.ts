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
  /** Batches per wavelength: full batches of `batch` rays, the last one the rest. */
  nBatches: number;
  batch: number;
  raysPerWavelength: number;
}

/** Rays of batches b0 … b1−1 of a wavelength, in batch order. */
export function batchRaysOf(plan: DepthPlan, b0: number, b1: number): number[] {
  const out: number[] = [];
  for (let b = b0; b < b1; b++) out.push(Math.min(plan.batch, plan.raysPerWavelength - b * plan.batch));
  return out;
}

/**
 * The plan of a request: the depth grid down to the deepest point of the absorber (taken from the
 * stack compiled at the first wavelength; the geometry does not depend on it) and the batches.
 */
export function depthPlanOf(req: ProfileRequest): DepthPlan {
  const probe = compileStack(req.study, req.registry, req.study.grid.wavelengthNm[0]);
  const edgesUm = geometricDepthEdges(probe.absorberDepthUm, req.grid.bins, req.grid.firstBinUm);
  const nChannels = probe.channels.length;
  return {
    edgesUm, nChannels, chAbsorber: probe.chAbsorber, tallyLength: baseTallyLength(nChannels) + 2 * req.grid.bins,
    nBatches: Math.ceil(req.raysPerWavelength / req.batch), batch: req.batch, raysPerWavelength: req.raysPerWavelength,
  };
}
