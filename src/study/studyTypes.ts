import type { PhiMode } from "../response/responseMatrix.js";
import type { StackSpec } from "./stackTypes.js";
import type { LaunchSampling } from "../random/sobol.js";

/** Resolved incidence/wavelength grid of a study (ranges expanded, azimuths folded). */
export interface StudyGrid {
  thetaDeg: number[];
  /** Azimuths traced; [0] as a placeholder when phiMode is "averaged" (random azimuth per ray). */
  phiDeg: number[];
  phiMode: PhiMode;
  wavelengthNm: number[];
}

/** Fixed rays per point, traced in batches of `batch` (the last batch may be smaller). */
export interface FixedRays {
  mode: "fixed";
  perPoint: number;
  batch: number;
  /** Launch sampling; unset = "random" (src/trace/launchPoints.ts). */
  sampling?: LaunchSampling;
}

/**
 * Target-error mode: per point, batches of `batch` rays are added until the standard error of every
 * listed channel is below `targetStdErr`, or `maxPerPoint` rays are reached.
 */
export interface TargetRays {
  mode: "target";
  targetStdErr: number;
  channels: string[];
  maxPerPoint: number;
  batch: number;
  /** Rays before the first decision (at least two batches, so a standard error exists). */
  minPerPoint: number;
  /** Launch sampling; unset = "random" (src/trace/launchPoints.ts). */
  sampling?: LaunchSampling;
}

export type RaysPlan = FixedRays | TargetRays;

/** A named ASTM G-173 spectrum ("AM1.5G", "AM1.5D", "G173-ETR") or a CSV file (relative to the study). */
export type SpectrumChoice = "AM1.5G" | "AM1.5D" | "G173-ETR" | { csv: string };

/** A study with every default applied; one per parameter-sweep combination. */
export interface Study {
  name: string;
  description: string;
  /** User material entries as written (see materialFromSpec); rebuilt into a registry per thread. */
  materials: unknown[];
  stack: StackSpec;
  grid: StudyGrid;
  rays: RaysPlan;
  seed: number;
  spectrum: SpectrumChoice;
  /**
   * "rear": this combination is traced with light arriving from the medium behind the rear (a study
   * with "illumination": "both" gets one such twin per combination, labelled "<label>-rear").
   * Unset = from the front.
   */
  lightFrom?: "rear";
}

/** One parameter-sweep combination: its label ("base" or "p0", "p1", ...) and substituted values. */
export interface StudyCombo {
  index: number;
  label: string;
  /** Field path (relative to "stack") -> value of this combination; {} without a sweep. */
  values: Record<string, number>;
  study: Study;
  /** sha256 (hex) of this combination's canonical study + referenced file contents. */
  hash: string;
}
