/**
 * Typed inputs of the report: what the page shows, already read from the run directory and checked.
 * The page and plots are pure functions of these; `loadRunDir.ts` builds them from files.
 */
import type { ResponseMatrix } from "../response/responseMatrix.js";

/** One entry of the loss breakdown in current units. */
export interface CurrentShare {
  /** Channel name in the matrix (`R`, `T`, `A_layer:…`, `A_film:…`, `A_rear`, `unresolved`, `A_absorber`). */
  channel: string;
  currentMaCm2: number;
  stderrMaCm2: number;
}

/** Spectrally weighted photocurrent of one stack at one incidence angle. */
export interface AnglePhotocurrent {
  thetaDeg: number;
  /** Absorber photocurrent (optical Jsc) in mA/cm². */
  absorberMaCm2: number;
  absorberStderrMaCm2: number;
  /** Every channel other than the absorber, as current lost there. */
  losses: CurrentShare[];
}

/** Photocurrent summary of one response matrix (from photocurrent.json). */
export interface PhotocurrentSummary {
  spectrumName: string;
  /** Current if every photon in the wavelength range were absorbed, in mA/cm² (when known). */
  incidentMaCm2?: number;
  perAngle: AnglePhotocurrent[];
  /** Angular modifier of the absorber current, J(θ)/J(0). */
  iam: { thetaDeg: number[]; modifier: number[]; stderr?: number[] };
}

/** One stack (one sweep combination of one study) in the report. */
export interface StackEntry {
  /** Display label, e.g. the study name, plus the combination when the study sweeps parameters. */
  label: string;
  studyName: string;
  /** Combination folder ("base", "p0", …). */
  comboKey: string;
  combo: Record<string, number>;
  /** The combination's values in words with units ("Si 100 µm · SiNx 65 nm"), parts in `combo`'s key order; sweeps only. */
  title?: string;
  /** Path of the matrix file as given (displayed, escaped). */
  matrixPath: string;
  matrix: ResponseMatrix;
  photocurrent?: PhotocurrentSummary;
}

/** One step of a convergence study. */
export interface ConvergenceStep {
  nRays: number;
  value: number;
  stderr: number;
  /** |value − reference| from an independent high-ray run, when one was made. */
  deviation?: number;
  /** RMS deviation of independent replicas from the reference, when replicas were run. */
  rmsError?: number;
}

export interface ConvergenceSeries {
  label: string;
  /** Quantity and unit, e.g. "absorber photocurrent" / "mA/cm²". */
  quantity: string;
  unit: string;
  steps: ConvergenceStep[];
  /** Fitted log–log slope of stderr vs N (≈ −0.5 for plain Monte Carlo). */
  slope?: number;
}

/** Yearly optical yield of one stack at one site, tilt and azimuth. */
export interface YieldEntry {
  stackLabel: string;
  siteName: string;
  tiltDeg: number;
  azimuthDeg: number;
  /** Absorbed photon charge per area per month (12 values), in A·h/m². */
  monthlyAhM2: number[];
  annualAhM2: number;
  /** Plane-of-array insolation in kWh/m² (when known). */
  poaKwhM2?: number;
  /** Year-average current relative to normal incidence at the same insolation (angular/spectral loss). */
  relativeToNormal?: number;
  /** With hourly spectra: charge ÷ charge with the fixed G173 shapes − 1, %, per month and for the year. */
  spectralCorrection?: { yearPct: number; monthlyPct: number[]; spectra: string };
}

/** Yearly charge over a tilt sweep, with its best tilt. */
export interface TiltSweep {
  stackLabel: string;
  siteName: string;
  azimuthDeg: number;
  tiltDeg: number[];
  annualAhM2: number[];
  bestTiltDeg: number;
  bestAnnualAhM2: number;
}

/** One row of the texture-benefit table: yearly charge of A relative to B. */
export interface BenefitRow {
  siteName: string;
  tiltDeg: number;
  azimuthDeg: number;
  stackA: string;
  stackB: string;
  annualAhM2A: number;
  annualAhM2B: number;
  /** (A − B)/B in %. */
  benefitPct: number;
  /** Monte Carlo standard error of benefitPct. */
  stderrPct: number;
  /** How stderrPct was made: "paired" (pairing groups) or "independent" (quadrature); absent in older files. */
  errorKind?: "paired" | "independent";
}

/** One design optimisation (optimum.json from `lightfold optimize`). */
export interface OptimumEntry {
  source: string;
  studyName: string;
  objectiveName: string;
  unit: string;
  description: string;
  level: number;
  replicas: number;
  parameters: { path: string; unit: string; lower: number; upper: number }[];
  location: number[];
  locationStdErr: number[];
  locationInterval: [number, number][];
  /** Per parameter: "lower", "upper" or null. */
  atBound: (string | null)[];
  value: number;
  valueStdErr: number;
  valueInterval: [number, number];
  /** Evaluations on the search stream (one seed for all). */
  search: { x: number[]; value: number; stderr: number }[];
  /** The local design: replica means ± standard error, and the polynomial fitted to them. */
  design: { centre: number[]; halfWidth: number[]; points: number[][]; mean: number[]; stderr: number[]; pooledCoef: number[] };
  cost: { evaluations: number; raysTraced: number; wallS: number };
}

/** One plane and mounting of a bifacial yield file (yield/bifacial-*.json). */
export interface BifacialRow {
  stackLabel: string;
  siteName: string;
  opticalBifaciality: number;
  tiltDeg: number;
  azimuthDeg: number;
  /** null: an isolated row. */
  pitchM: number | null;
  groundCoverageRatio: number;
  frontAhM2: number;
  rearAhM2: number;
  totalAhM2: number;
  totalStdErrAhM2: number;
  gainPct: number;
  gainStdErrPct: number;
}

/** A generation profile G(z) (from <run>/generation/generation.json, written by `lightfold generation`). */
export interface GenerationEntry {
  label: string;
  thetaDeg: number;
  spectrum: string;
  /** Bin centres, µm from the top of the front texture. */
  depthUm: number[];
  generationCm3S: number[];
  /** q·∫G dz, mA/cm². */
  integratedMaCm2: number;
}

export interface ReportInput {
  /** Page title (study names joined); escaped. */
  title: string;
  /** Run directories as given on the command line (escaped when shown). */
  runDirs: string[];
  toolVersion: string;
  /** Incidence angle of the spectral plot. */
  angleDeg: number;
  stacks: StackEntry[];
  convergence: ConvergenceSeries[];
  yields: YieldEntry[];
  tiltSweeps: TiltSweep[];
  benefit: BenefitRow[];
  optima: OptimumEntry[];
  /** Front + rear yields (bifacial files); absent or empty when none. */
  bifacial?: BifacialRow[];
  /** Generation profiles (generation/generation.json); absent or empty when none. */
  generations?: GenerationEntry[];
  /** Remarks about what was read or skipped (e.g. a malformed optional file); shown at the top. */
  notes: string[];
}
