import type { LoadedStudy } from "../study/load.js";
import { spectrumFromSpec, type Spectrum } from "../spectrum/index.js";
import { InputError } from "../util/errors.js";
import { toolVersion } from "../util/version.js";
import { CONVERGENCE_FORMAT, CONVERGENCE_FORMAT_VERSION, type ConvergenceReport, type ConvergenceSubject } from "./convergenceReport.js";
import { runConvergence, type Estimate, type Estimator } from "./runConvergence.js";
import { pointEstimator, spectralEstimator } from "./traceEstimators.js";
import { DEFAULT_ESTIMATOR, type Estimator as TraceEstimatorKind } from "../trace/index.js";

export interface ConvergeRequest {
  comboLabel?: string;
  thetaDeg: number;
  /** undefined: the study's first azimuth, or random per ray when the study averages azimuths. */
  phiDeg?: number;
  /** Point mode when set; spectral mode (absorber photocurrent over the grid) when undefined. */
  wavelengthNm?: number;
  channel: string;
  /** Spectral mode: overrides the study's spectrum. */
  spectrum?: Spectrum;
  startRays: number;
  steps: number;
  replicas: number;
  /** Default: 16 × the largest step. */
  referenceRays?: number;
  targetError?: number;
  /** Absorption sampling of the tracer (default: the tracer's default, "expected"). */
  estimator?: TraceEstimatorKind;
}

/** Runs a convergence study of a loaded study with the real tracer (in this thread). */
export function buildConvergenceReport(loaded: LoadedStudy, req: ConvergeRequest, onStep?: (message: string) => void): ConvergenceReport {
  const combo = req.comboLabel === undefined ? loaded.combos[0] : loaded.combos.find((c) => c.label === req.comboLabel);
  if (combo === undefined) {
    throw new InputError(`--combo: no combination "${req.comboLabel}" (has ${loaded.combos.map((c) => c.label).join(", ")})`);
  }
  const study = combo.study;
  const phiDeg = req.phiDeg ?? (study.grid.phiMode === "averaged" ? null : study.grid.phiDeg[0]);
  const tracerEstimator = req.estimator ?? DEFAULT_ESTIMATOR;
  const compileOptions = { estimator: tracerEstimator };
  let estimator: Estimator;
  let subject: ConvergenceSubject;
  if (req.wavelengthNm !== undefined) {
    estimator = pointEstimator(study, loaded.registry, { thetaDeg: req.thetaDeg, phiDeg, wavelengthNm: req.wavelengthNm, channel: req.channel }, compileOptions);
    subject = {
      mode: "point",
      quantity: req.channel,
      unit: "fraction",
      thetaDeg: req.thetaDeg,
      phiDeg,
      wavelengthNm: req.wavelengthNm,
      spectrum: null,
      wavelengthRangeNm: null,
      raysPer: "point",
    };
  } else {
    const spectrum = req.spectrum ?? spectrumFromSpec(study.spectrum, loaded.baseDir, "spectrum");
    estimator = spectralEstimator(study, loaded.registry, { thetaDeg: req.thetaDeg, phiDeg, spectrum }, compileOptions);
    const grid = study.grid.wavelengthNm;
    subject = {
      mode: "spectral",
      quantity: "Jsc",
      unit: "mA/cm²",
      thetaDeg: req.thetaDeg,
      phiDeg,
      wavelengthNm: null,
      spectrum: spectrum.name,
      wavelengthRangeNm: [grid[0], grid[grid.length - 1]],
      raysPer: "wavelength",
    };
  }
  const referenceRays = req.referenceRays ?? 16 * req.startRays * 2 ** (req.steps - 1);
  const reporting: Estimator = (nRays, ns): Estimate => {
    const t0 = Date.now();
    const e = estimator(nRays, ns);
    onStep?.(`${ns}: ${nRays} rays per ${subject.raysPer}, ${e.value.toPrecision(6)} ± ${e.stderr.toPrecision(3)} (${((Date.now() - t0) / 1000).toFixed(1)} s)`);
    return e;
  };
  const result = runConvergence(reporting, {
    startRays: req.startRays,
    steps: req.steps,
    replicas: req.replicas,
    referenceRays,
    targetError: req.targetError,
  });
  return {
    format: CONVERGENCE_FORMAT,
    formatVersion: CONVERGENCE_FORMAT_VERSION,
    toolVersion: toolVersion(),
    studyName: loaded.name,
    studyHash: combo.hash,
    combo: combo.label,
    seed: study.seed,
    tracerEstimator,
    ...subject,
    ...result,
  };
}
