import { withOverrides, type LoadedStudy } from "../study/load.js";
import type { StudyCombo } from "../study/studyTypes.js";
import { photocurrentWeights, spectrumFromSpec, type Spectrum } from "../spectrum/index.js";
import type { Estimator as TraceEstimatorKind } from "../trace/index.js";
import { InputError } from "../util/errors.js";
import { toolVersion } from "../util/version.js";
import { TracePool } from "../workers/pool.js";
import { workerSetupOf } from "../sweep/runSweep.js";
import { CONVERGENCE_FORMAT, CONVERGENCE_FORMAT_VERSION, type ConvergenceReport, type ConvergenceSubject } from "./convergenceReport.js";
import {
  runConvergence,
  runConvergenceAsync,
  type AsyncEstimator,
  type ConvergenceOptions,
  type ConvergenceResult,
  type Estimate,
  type Estimator,
} from "./runConvergence.js";
import { inThreadEstimator, poolEstimator, type TraceSubject } from "./traceEstimators.js";
import { REPLICA_GROUPS } from "../random/replicaGroups.js";
import type { LaunchSampling } from "../random/sobol.js";

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
  /** Absorption sampling of the tracer (default: the tracer's default, "expected"); in-thread only. */
  estimator?: TraceEstimatorKind;
  /** Launch sampling (default: the study's, as resolved: Sobol' with 16+ batches per point unless it names one). */
  sampling?: LaunchSampling;
}

interface Prepared {
  combo: StudyCombo;
  subject: TraceSubject;
  described: ConvergenceSubject;
  channel: string;
  weights: Float64Array | null;
  options: ConvergenceOptions;
  /** "default": the tracer's per-wavelength choice (src/trace/estimatorChoice.ts). */
  tracerEstimator: TraceEstimatorKind | "default";
  sampling: LaunchSampling;
}

/** Reduces the study to the one direction (and wavelengths) converged; collects the options. */
function prepare(loaded: LoadedStudy, req: ConvergeRequest): Prepared {
  const combo = req.comboLabel === undefined ? loaded.combos[0] : loaded.combos.find((c) => c.label === req.comboLabel);
  if (combo === undefined) {
    throw new InputError(`--combo: no combination "${req.comboLabel}" (has ${loaded.combos.map((c) => c.label).join(", ")})`);
  }
  const study = combo.study;
  const phiDeg = req.phiDeg ?? (study.grid.phiMode === "averaged" ? null : study.grid.phiDeg[0]);
  const wavelengths = req.wavelengthNm !== undefined ? [req.wavelengthNm] : study.grid.wavelengthNm;
  const sampling = req.sampling ?? study.rays.sampling ?? "random";
  if (sampling === "sobol" && req.startRays < REPLICA_GROUPS) {
    throw new InputError(
      `--start ${req.startRays}: Sobol' sampling splits every run into ${REPLICA_GROUPS} independent replicas and takes the standard error from their spread; it needs at least ${REPLICA_GROUPS} rays per run`,
      req.sampling === undefined ? `e.g. --start ${16 * REPLICA_GROUPS}, or --sampling random (the study gets Sobol' points by default: 16+ batches per point)` : `e.g. --start ${16 * REPLICA_GROUPS}`,
    );
  }
  const { sampling: _studySampling, ...rays } = study.rays;
  const reduced = withOverrides(loaded, {
    grid: { thetaDeg: [req.thetaDeg], phiDeg: [phiDeg ?? 0], phiMode: phiDeg === null ? "averaged" : "list", wavelengthNm: wavelengths },
    rays: sampling === "sobol" ? { ...rays, sampling } : rays,
  });
  const subject: TraceSubject = { study: reduced, combo: combo.index };
  const options: ConvergenceOptions = {
    startRays: req.startRays,
    steps: req.steps,
    replicas: req.replicas,
    referenceRays: req.referenceRays ?? 16 * req.startRays * 2 ** (req.steps - 1),
    targetError: req.targetError,
  };
  const tracerEstimator = req.estimator ?? "default";
  if (req.wavelengthNm !== undefined) {
    return {
      combo,
      subject,
      channel: req.channel,
      weights: null,
      options,
      tracerEstimator,
      sampling,
      described: {
        mode: "point",
        quantity: req.channel,
        unit: "fraction",
        thetaDeg: req.thetaDeg,
        phiDeg,
        wavelengthNm: req.wavelengthNm,
        spectrum: null,
        wavelengthRangeNm: null,
        raysPer: "point",
      },
    };
  }
  const spectrum = req.spectrum ?? spectrumFromSpec(study.spectrum, loaded.baseDir, "spectrum");
  return {
    combo,
    subject,
    channel: "A_absorber",
    weights: photocurrentWeights(wavelengths, spectrum),
    options,
    tracerEstimator,
    sampling,
    described: {
      mode: "spectral",
      quantity: "Jsc",
      unit: "mA/cm²",
      thetaDeg: req.thetaDeg,
      phiDeg,
      wavelengthNm: null,
      spectrum: spectrum.name,
      wavelengthRangeNm: [wavelengths[0], wavelengths[wavelengths.length - 1]],
      raysPer: "wavelength",
    },
  };
}

function report(loaded: LoadedStudy, p: Prepared, result: ConvergenceResult): ConvergenceReport {
  return {
    format: CONVERGENCE_FORMAT,
    formatVersion: CONVERGENCE_FORMAT_VERSION,
    toolVersion: toolVersion(),
    studyName: loaded.name,
    studyHash: p.combo.hash,
    combo: p.combo.label,
    seed: p.combo.study.seed,
    tracerEstimator: p.tracerEstimator,
    launchSampling: p.sampling,
    ...p.described,
    ...result,
  };
}

function progressLine(ns: string, nRays: number, raysPer: string, e: Estimate, t0: number): string {
  return `${ns}: ${nRays} rays per ${raysPer}, ${e.value.toPrecision(6)} ± ${e.stderr.toPrecision(3)} (${((Date.now() - t0) / 1000).toFixed(1)} s)`;
}

/** The in-thread estimator of a request (what buildConvergenceReport runs), for custom studies and tests. */
export function convergenceEstimator(loaded: LoadedStudy, req: ConvergeRequest): Estimator {
  const p = prepare(loaded, req);
  return inThreadEstimator(p.subject, p.channel, p.weights, { estimator: p.tracerEstimator === "default" ? undefined : p.tracerEstimator });
}

/** Runs a convergence study with the real tracer in this thread. */
export function buildConvergenceReport(loaded: LoadedStudy, req: ConvergeRequest, onStep?: (message: string) => void): ConvergenceReport {
  const p = prepare(loaded, req);
  const est = inThreadEstimator(p.subject, p.channel, p.weights, { estimator: p.tracerEstimator === "default" ? undefined : p.tracerEstimator });
  const reporting: Estimator = (nRays, ns) => {
    const t0 = Date.now();
    const e = est(nRays, ns);
    onStep?.(progressLine(ns, nRays, p.described.raysPer, e, t0));
    return e;
  };
  return report(loaded, p, runConvergence(reporting, p.options));
}

/**
 * The same study on a worker pool of `workers` threads (1: in this thread). The numbers are
 * identical to buildConvergenceReport's for any worker count.
 */
export async function buildConvergenceReportOnPool(
  loaded: LoadedStudy,
  req: ConvergeRequest,
  workers: number,
  onStep?: (message: string) => void,
): Promise<ConvergenceReport> {
  if (workers <= 1) return buildConvergenceReport(loaded, req, onStep);
  const p = prepare(loaded, req);
  if (p.tracerEstimator !== "default") {
    throw new InputError(`--estimator ${p.tracerEstimator}: runs in one thread only; add --workers 1`);
  }
  const pool = new TracePool(workerSetupOf(p.subject.study), workers);
  try {
    const est = poolEstimator(p.subject, p.channel, p.weights, pool);
    const reporting: AsyncEstimator = async (nRays, ns) => {
      const t0 = Date.now();
      const e = await est(nRays, ns);
      onStep?.(progressLine(ns, nRays, p.described.raysPer, e, t0));
      return e;
    };
    return report(loaded, p, await runConvergenceAsync(reporting, p.options));
  } finally {
    await pool.close();
  }
}
