/**
 * The angular response matrix: where the light goes, per incidence direction and wavelength.
 * One flat row-major array per statistic, index order [theta][phi][lambda][channel].
 */
export const RESPONSE_FORMAT = "lightfold.response";
/**
 * Version 2: reflection and transmission split by history (R_first/R_escape, T_first/T_escape) and
 * the light-trapping diagnostics. Version 1 files still load: their "R" and "T" are totals.
 */
export const RESPONSE_FORMAT_VERSION = 2;

/** Fixed channel names every stack has; others are per layer/film (see DEVELOPERS.md). */
export { CH_R_FIRST, CH_R_ESCAPE, CH_T_FIRST, CH_T_ESCAPE } from "../trace/channels.js";
/** Format version 1 channels (reflection + escape, all rear transmission). */
export const CH_R_TOTAL_V1 = "R";
export const CH_T_TOTAL_V1 = "T";
export const CH_ABSORBER = "A_absorber";
export const CH_UNRESOLVED = "unresolved";

/**
 * How the phi axis is to be read: "list" = the listed azimuths as they are; "averaged" = one entry
 * (phiDeg = [0]) holding the azimuth average; "square" = texture with square (C4v) symmetry, listed
 * azimuths cover 0..45° and any azimuth folds into that range.
 */
export type PhiMode = "list" | "averaged" | "square";

export interface ResponseMatrix {
  format: typeof RESPONSE_FORMAT;
  formatVersion: number;
  toolVersion: string;
  studyName: string;
  /** sha256 (hex) of the canonical study (after parameter substitution of this combination). */
  studyHash: string;
  seed: number;
  /** Parameter-sweep values of this matrix (field path -> value); {} when the study has no sweep. */
  combo: Record<string, number>;
  thetaDeg: number[];
  phiDeg: number[];
  phiMode: PhiMode;
  wavelengthNm: number[];
  channels: string[];
  /** Mean fraction of incident power per channel, [theta][phi][lambda][channel]. */
  mean: Float64Array;
  /** Monte Carlo standard error of the mean, same layout. */
  stderr: Float64Array;
  /** Rays traced per point, [theta][phi][lambda]. */
  nRays: Float64Array;
  /**
   * Photon path in the absorber / thickness per incident photon, until absorbed or out (the mean
   * path of the light actually there, shortened by absorption), per point ([theta][phi][lambda]).
   */
  pathRatio: Float64Array;
  /** Light-trapping diagnostics (format version 2; absent in older files). */
  trapping?: TrappingArrays;
  /** True when written from an incomplete set of shards (explicitly requested). */
  partial?: boolean;
  /**
   * "rear": light arrived from the medium behind the rear, launched along (sinθ cosφ, sinθ sinφ, +cosθ)
   * in the texture frame; R is still light leaving through the front and T through the rear.
   */
  lightFrom?: "rear";
  /**
   * Pairing groups (src/sweep/tally.ts): batch b of a point went into group b mod pairGroups. Mean
   * per group [theta][phi][lambda][group][channel] and rays per group [theta][phi][lambda][group];
   * a group without rays has mean 0. They give paired standard errors of differences between
   * matrices traced with common random numbers (src/response/pairedDifference.ts).
   */
  pairGroups?: number;
  groupMean?: Float64Array;
  groupRays?: Float64Array;
}

/**
 * Light-trapping diagnostics per point ([theta][phi][lambda], then the inner axis), from the tallies
 * (src/trace/tallyLayout.ts). Fractions of entered power are ratios of the point's sums.
 */
export interface TrappingArrays {
  maxPasses: number;
  escapeAngleBinDeg: number;
  /** Power that entered the absorber per unit incident power. */
  entered: Float64Array;
  /** Path in the absorber / thickness with the absorber's absorption removed (α → 0), per unit entered power, and its error. */
  freePathRatio: Float64Array;
  freePathRatioStderr: Float64Array;
  /** Fraction of the entered power still inside after pass k = 1..maxPasses, then the Σ over later passes: [point][maxPasses + 1]. */
  passRemaining: Float64Array;
  /** R_escape power per incident power per polar-angle bin of escapeAngleBinDeg: [point][90 / escapeAngleBinDeg]. */
  escapeAngle: Float64Array;
}

/** Flat index of (theta, phi, lambda, channel). */
export function matrixIndex(m: ResponseMatrix, it: number, ip: number, il: number, ic: number): number {
  return ((it * m.phiDeg.length + ip) * m.wavelengthNm.length + il) * m.channels.length + ic;
}

/** Flat index of a point (theta, phi, lambda) into nRays / pathRatio. */
export function pointIndex(m: ResponseMatrix, it: number, ip: number, il: number): number {
  return (it * m.phiDeg.length + ip) * m.wavelengthNm.length + il;
}

/** Channel index by name; throws naming the channels present. */
export function channelIndex(m: ResponseMatrix, name: string): number {
  const i = m.channels.indexOf(name);
  if (i < 0) throw new Error(`response matrix has no channel "${name}" (has ${m.channels.join(", ")})`);
  return i;
}
