import { matrixProvenance, type MatrixProvenance } from "../response/provenance.js";
import { CH_ABSORBER, matrixIndex, type ResponseMatrix } from "../response/responseMatrix.js";
import { ratioIndependent, stridedWeightedSum, type ValueWithError } from "./weightedSum.js";

export const PHOTOCURRENT_FORMAT = "lightfold.photocurrent";
export const PHOTOCURRENT_FORMAT_VERSION = 1;

/** Current (mA/cm²) of one channel at one incidence direction, with its Monte Carlo error. */
export interface ChannelCurrent {
  channel: string;
  currentMaCm2: number;
  stderrMaCm2: number;
}

export interface DirectionPhotocurrent {
  thetaDeg: number;
  /** Azimuth in degrees, or "averaged" for a matrix traced with one random azimuth per ray. */
  phiDeg: number | "averaged";
  /** Optical photocurrent of the absorber (every absorbed photon counted), mA/cm². */
  jscMaCm2: number;
  jscStderrMaCm2: number;
  /** Every other channel converted to mA/cm² (matrix channel order, absorber excluded). */
  losses: ChannelCurrent[];
  /** J(θ, φ) / J(θ_ref, φ): angular modifier; null when J(θ_ref) is 0. */
  iam: number | null;
  iamStderr: number | null;
}

/** Photocurrent file: the matrix's provenance, then the weighting under one spectrum. */
export interface PhotocurrentSummary extends MatrixProvenance {
  format: typeof PHOTOCURRENT_FORMAT;
  formatVersion: number;
  spectrum: string;
  wavelengthMinNm: number;
  wavelengthMaxNm: number;
  /** Photon current of the whole spectrum over the grid range (all channels together), mA/cm². */
  totalAvailableMaCm2: number;
  absorberChannel: string;
  lossChannels: string[];
  /** Incidence angle the IAM divides by (0° when the grid has it, else the smallest angle). */
  iamReferenceThetaDeg: number;
  /** One entry per (theta, phi), theta outermost. */
  directions: DirectionPhotocurrent[];
}

export interface SummaryLabels {
  spectrumName: string;
  toolVersion?: string;
}

/**
 * Spectral weighting of a response matrix: w[il] are photocurrent weights in mA/cm² per unit
 * absorptance on the matrix wavelength grid (J = Σ A_i w_i), from the spectrum module.
 */
export function photocurrentSummary(m: ResponseMatrix, w: ArrayLike<number>, labels: SummaryLabels): PhotocurrentSummary {
  const nL = m.wavelengthNm.length;
  if (w.length !== nL) throw new RangeError(`photocurrent weights: ${w.length} values for ${nL} wavelengths`);
  const nC = m.channels.length;
  const ia = m.channels.indexOf(CH_ABSORBER);
  if (ia < 0) throw new RangeError(`response matrix has no "${CH_ABSORBER}" channel (has ${m.channels.join(", ")})`);
  let total = 0;
  for (let i = 0; i < nL; i++) total += w[i];

  // Reference angle of the modifier: 0° if present, else the smallest angle of the grid.
  let itRef = 0;
  for (let it = 1; it < m.thetaDeg.length; it++) if (Math.abs(m.thetaDeg[it]) < Math.abs(m.thetaDeg[itRef])) itRef = it;

  const absorber = (it: number, ip: number): ValueWithError =>
    stridedWeightedSum(w, m.mean, m.stderr, matrixIndex(m, it, ip, 0, ia), nC);

  const directions: DirectionPhotocurrent[] = [];
  for (let it = 0; it < m.thetaDeg.length; it++) {
    for (let ip = 0; ip < m.phiDeg.length; ip++) {
      const j = absorber(it, ip);
      const losses: ChannelCurrent[] = [];
      for (let ic = 0; ic < nC; ic++) {
        if (ic === ia) continue;
        const l = stridedWeightedSum(w, m.mean, m.stderr, matrixIndex(m, it, ip, 0, ic), nC);
        losses.push({ channel: m.channels[ic], currentMaCm2: l.value, stderrMaCm2: l.stderr });
      }
      // The reference direction divided by itself is exactly 1 with no error.
      const j0 = absorber(itRef, ip);
      let iam: ValueWithError | null = null;
      if (it === itRef) iam = { value: 1, stderr: 0 };
      else if (j0.value !== 0) iam = ratioIndependent(j, j0);
      directions.push({
        thetaDeg: m.thetaDeg[it],
        phiDeg: m.phiMode === "averaged" ? "averaged" : m.phiDeg[ip],
        jscMaCm2: j.value,
        jscStderrMaCm2: j.stderr,
        losses,
        iam: iam === null ? null : iam.value,
        iamStderr: iam === null ? null : iam.stderr,
      });
    }
  }
  return {
    format: PHOTOCURRENT_FORMAT,
    formatVersion: PHOTOCURRENT_FORMAT_VERSION,
    ...matrixProvenance(m),
    toolVersion: labels.toolVersion ?? m.toolVersion,
    spectrum: labels.spectrumName,
    wavelengthMinNm: Math.min(...m.wavelengthNm),
    wavelengthMaxNm: Math.max(...m.wavelengthNm),
    totalAvailableMaCm2: total,
    absorberChannel: CH_ABSORBER,
    lossChannels: m.channels.filter((_, ic) => ic !== ia),
    iamReferenceThetaDeg: m.thetaDeg[itRef],
    directions,
  };
}
