export { logLogSlope } from "./logLogSlope.js";
export {
  runConvergence,
  predictRays,
  stepNamespace,
  REFERENCE_NAMESPACE,
  type Estimate,
  type Estimator,
  type ConvergenceOptions,
  type ConvergenceResult,
  type ConvergenceStep,
} from "./runConvergence.js";
export {
  convergenceCsv,
  formatConvergenceTable,
  CONVERGENCE_FILE,
  CONVERGENCE_FORMAT,
  type ConvergenceReport,
  type ConvergenceSubject,
} from "./convergenceReport.js";
export { buildConvergenceReport, type ConvergeRequest } from "./convergeStudy.js";
export { pointEstimator, spectralEstimator, type PointTarget, type SpectralTarget } from "./traceEstimators.js";
