import { generationStreamKey, RandomStream } from "../random/stream.js";
import { sumTallies } from "../sweep/tally.js";
import type { MaterialSource } from "../trace/compile.js";
import { compileStack } from "../trace/compile.js";
import { traceBatch } from "../trace/kernel.js";
import { createTally } from "../trace/tally.js";
import type { Study } from "../study/studyTypes.js";
import { batchRaysOf, depthPlanOf } from "./depthPlan.js";
import { SpectralProfileBuilder } from "./spectralProfileBuilder.js";

/** The depth grid of a generation profile: a first bin, then bins growing geometrically. */
export interface DepthGridSpec {
  bins: number;
  firstBinUm: number;
}

export const DEFAULT_DEPTH_GRID: DepthGridSpec = { bins: 80, firstBinUm: 0.002 };

/** Absorbed fractions per wavelength and depth bin at one incidence direction (no I/O). */
export interface SpectralProfile {
  thetaDeg: number;
  phiDeg: number | null;
  wavelengthNm: number[];
  /** Depth bin edges in µm from the top of the front texture, ascending from 0. */
  edgesUm: Float64Array;
  /** Fraction of the incident photons absorbed in the absorber per bin, [λ][bin], and its error. */
  fraction: Float64Array;
  fractionStderr: Float64Array;
  /** Absorber absorptance per wavelength (the tally's A_absorber) and its error. */
  absorptance: Float64Array;
  absorptanceStderr: Float64Array;
  raysPerWavelength: number;
}

export interface ProfileRequest {
  study: Study;
  registry: MaterialSource;
  /** Index of the combination in the study (stream key). */
  comboIndex: number;
  thetaDeg: number;
  phiDeg: number | null;
  raysPerWavelength: number;
  batch: number;
  grid: DepthGridSpec;
  seed: number;
  /** Called as wavelengths are finished (done of total; on the pool not necessarily in grid order). */
  onWavelength?(done: number, total: number): void;
}

/**
 * Traces the study's wavelength grid at one direction with depth tallies, in this thread (the
 * reference the pool's trace, traceProfileOnPool.ts, must equal bit for bit; quick physics tests).
 * Batch b of wavelength il goes into its own tally on generationStreamKey(seed, combo, θ, φ, il, b),
 * launched with random points whatever the study's rays.sampling (the estimator is chosen for
 * that); the batch tallies are summed in batch order. The result depends only on the request.
 */
export function traceGenerationProfile(req: ProfileRequest): SpectralProfile {
  const plan = depthPlanOf(req);
  const builder = new SpectralProfileBuilder(req, plan);
  const wl = req.study.grid.wavelengthNm;
  for (let il = 0; il < wl.length; il++) {
    const cs = compileStack(req.study, req.registry, wl[il], { depthEdgesUm: plan.edgesUm, launchSampling: "random" });
    const batches = batchRaysOf(plan, 0, plan.nBatches).map((n, b) => {
      const tally = createTally(cs);
      traceBatch(cs, req.thetaDeg, req.phiDeg, n, new RandomStream(generationStreamKey(req.seed, req.comboIndex, req.thetaDeg, req.phiDeg, il, b)), tally);
      return tally;
    });
    builder.addWavelength(il, sumTallies(batches, plan.tallyLength));
    req.onWavelength?.(il + 1, wl.length);
  }
  return builder.profile();
}
