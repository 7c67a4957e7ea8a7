export { logLogSlope } from "./logLogSlope.js";
export {
  runConvergence,
  runConvergenceAsync,
  type AsyncEstimator,
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
export { buildConvergenceReport, buildConvergenceReportOnPool, convergenceEstimator, type ConvergeRequest } from "./convergeStudy.js";
export { replicaSeed } from "./replicaSeed.js";
export { inThreadEstimator, poolEstimator, type TraceSubject } from "./traceEstimators.js";
