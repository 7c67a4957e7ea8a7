import { summarizeDepthBins } from "../trace/trappingSummary.js";
import type { DepthPlan } from "./depthPlan.js";
import type { ProfileRequest, SpectralProfile } from "./traceProfile.js";

/**
 * Collects the merged tally of each wavelength (its batch tallies summed in batch order) into a
 * SpectralProfile: absorbed fraction per depth bin and the absorber absorptance, with their errors
 * (sample variance of per-ray contributions / n).
 */
export class SpectralProfileBuilder {
  private readonly nL: number;
  private readonly nBins: number;
  private readonly fraction: Float64Array;
  private readonly fractionStderr: Float64Array;
  private readonly absorptance: Float64Array;
  private readonly absorptanceStderr: Float64Array;

  constructor(private readonly req: ProfileRequest, private readonly plan: DepthPlan) {
    this.nL = req.study.grid.wavelengthNm.length;
    this.nBins = req.grid.bins;
    this.fraction = new Float64Array(this.nL * this.nBins);
    this.fractionStderr = new Float64Array(this.nL * this.nBins);
    this.absorptance = new Float64Array(this.nL);
    this.absorptanceStderr = new Float64Array(this.nL);
  }

  /** Sets wavelength il from its merged tally. */
  addWavelength(il: number, tally: Float64Array): void {
    const { nChannels: nC, chAbsorber: ia } = this.plan;
    summarizeDepthBins(tally, nC, this.nBins).forEach((e, i) => {
      this.fraction[il * this.nBins + i] = e.mean;
      this.fractionStderr[il * this.nBins + i] = e.stderr;
    });
    const nRays = tally[2 * nC];
    const a = tally[2 * ia] / nRays;
    this.absorptance[il] = a;
    this.absorptanceStderr[il] = nRays > 1 ? Math.sqrt(Math.max(0, (tally[2 * ia + 1] - nRays * a ** 2) / (nRays - 1)) / nRays) : 0;
  }

  profile(): SpectralProfile {
    const r = this.req;
    return {
      thetaDeg: r.thetaDeg,
      phiDeg: r.phiDeg,
      wavelengthNm: [...r.study.grid.wavelengthNm],
      edgesUm: this.plan.edgesUm,
      fraction: this.fraction,
      fractionStderr: this.fractionStderr,
      absorptance: this.absorptance,
      absorptanceStderr: this.absorptanceStderr,
      raysPerWavelength: r.raysPerWavelength,
    };
  }
}
