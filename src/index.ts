/**
 * lightfold's public API, in the order of the data path:
 * study → materials/optics → trace kernel → sweep (worker pool) → response matrix → weighting/exports
 * → yield → optimise → report.
 */
export { loadStudy, loadStudyFromDocument, withOverrides, type LoadedStudy } from "./study/load.js";
export * from "./materials/index.js";
export * from "./spectrum/index.js";
export * from "./optics/index.js";
export { RandomStream, streamKey } from "./random/stream.js";
export * from "./trace/index.js";
export { runSweep, type SweepOptions, type SweepResult, type SweepProgress } from "./sweep/runSweep.js";
export { tracePoint, type TracePointOptions, type TracePointResult } from "./sweep/tracePoint.js";
export * from "./response/responseMatrix.js";
export { readResponseMatrix, writeResponseMatrix, matrixToJson, matrixFromJson } from "./response/matrixFile.js";
export { pairedMoments, pairingProblem, type PairedMoments } from "./response/pairedMoments.js";
export { pairedWeightedDifference, type PairedDifference } from "./response/pairedDifference.js";
export * from "./export/index.js";
export * from "./weighting/index.js";
export { logLogSlope, buildConvergenceReport, buildConvergenceReportOnPool, convergenceEstimator, replicaSeed, type ConvergeRequest } from "./convergence/index.js";
export { parseEpw } from "./weather/epw.js";
export { parseTmy3 } from "./weather/tmy3.js";
export type { StationWeather, StationMeta, MetSeries } from "./weather/stationFile.js";
export { parseSpectralSeries, type SpectralSeries } from "./weather/spectralSeries.js";
export { birdRiordanTable, birdRiordanInto, birdRiordanTiltedInto, type ClearSkyAtmosphere } from "./spectrum/birdRiordan.js";
export { yearContext, type YearContext } from "./yield/yearContext.js";
export { prepareMatrix, planeList, yieldSweep, bestPlane, type PreparedMatrix } from "./yield/yieldRun.js";
export { clearSkyHourlySpectra } from "./yield/clearSkyHours.js";
export { userHourlySpectra } from "./yield/userHours.js";
export type { HourlySpectra } from "./yield/hourlySpectra.js";
export { textureBenefit, pairedDeltaStdErr, type Benefit } from "./yield/compare.js";
export type { YieldResult } from "./yield/annualYield.js";
export { optimize } from "./optimize/optimize.js";
export type { Objective, OptimizeOptions, OptimumResult, Estimate as OptimizeEstimate } from "./optimize/types.js";
export { studyObjective, evaluationStudy, type StudyObjectiveOptions } from "./optimize/studyObjective.js";
export { objectiveValue, objectiveGrid, type ObjectiveSpec } from "./optimize/objectives.js";
export { runOptimization, type OptimizationRequest } from "./optimize/runOptimization.js";
export { makeReport, type MakeReportOptions, type MakeReportResult } from "./report/makeReport.js";
export { InputError } from "./util/errors.js";
