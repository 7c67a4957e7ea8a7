import { RandomStream, streamKey } from "../random/stream.js";
import type { MaterialSource } from "../trace/compile.js";
import { compileStack } from "../trace/compile.js";
import { traceBatch } from "../trace/kernel.js";
import { createTally } from "../trace/tally.js";
import { summarizeDepthBins } from "../trace/trappingSummary.js";
import { geometricDepthEdges } from "../trace/depthTally.js";
import type { Study } from "../study/studyTypes.js";

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
  onWavelength?(done: number, total: number): void;
}

/**
 * Traces the study's wavelength grid at one direction with depth tallies. Batch b of wavelength il
 * uses streamKey(seed, "generation", combo, θ, φ, il, b): the result depends only on the request.
 */
export function traceGenerationProfile(req: ProfileRequest): SpectralProfile {
  const wl = req.study.grid.wavelengthNm;
  let edges: Float64Array | null = null;
  const nL = wl.length;
  let fraction = new Float64Array(0);
  let fractionStderr = new Float64Array(0);
  const absorptance = new Float64Array(nL);
  const absorptanceStderr = new Float64Array(nL);
  for (let il = 0; il < nL; il++) {
    if (edges === null) {
      const probe = compileStack(req.study, req.registry, wl[il]);
      edges = geometricDepthEdges(probe.absorberDepthUm, req.grid.bins, req.grid.firstBinUm);
      fraction = new Float64Array(nL * req.grid.bins);
      fractionStderr = new Float64Array(nL * req.grid.bins);
    }
    // launched with random points whatever the study's rays.sampling: the estimator is chosen for that
    const cs = compileStack(req.study, req.registry, wl[il], { depthEdgesUm: edges, launchSampling: "random" });
    const tally = createTally(cs);
    let done = 0;
    for (let b = 0; done < req.raysPerWavelength; b++) {
      const n = Math.min(req.batch, req.raysPerWavelength - done);
      const rng = new RandomStream(streamKey(req.seed, "generation", req.comboIndex, req.thetaDeg, req.phiDeg ?? "averaged", il, b));
      traceBatch(cs, req.thetaDeg, req.phiDeg, n, rng, tally);
      done += n;
    }
    const nC = cs.channels.length;
    summarizeDepthBins(tally, nC, req.grid.bins).forEach((e, i) => {
      fraction[il * req.grid.bins + i] = e.mean;
      fractionStderr[il * req.grid.bins + i] = e.stderr;
    });
    const ia = cs.chAbsorber;
    const nRays = tally[2 * nC];
    absorptance[il] = tally[2 * ia] / nRays;
    absorptanceStderr[il] = nRays > 1 ? Math.sqrt(Math.max(0, (tally[2 * ia + 1] - nRays * absorptance[il] ** 2) / (nRays - 1)) / nRays) : 0;
    req.onWavelength?.(il + 1, nL);
  }
  return {
    thetaDeg: req.thetaDeg,
    phiDeg: req.phiDeg,
    wavelengthNm: [...wl],
    edgesUm: edges as Float64Array,
    fraction,
    fractionStderr,
    absorptance,
    absorptanceStderr,
    raysPerWavelength: req.raysPerWavelength,
  };
}
