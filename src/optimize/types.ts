/** Types of the design optimiser (src/optimize/). */

/** An objective value with its Monte Carlo standard error. */
export interface Estimate {
  value: number;
  stderr: number;
}

/**
 * The objective at parameter values x (one per optimised parameter). stream −1 is the search
 * stream (the study's own seed: every x shares it, so differences between x are common-random-number
 * differences); stream r ≥ 0 is independent replica r (its own derived seed, shared by every x).
 */
export type Objective = (x: number[], stream: number) => Promise<Estimate>;

export type SearchStage = "scan" | "search" | "local";

export interface EvaluationRecord {
  stage: SearchStage;
  stream: number;
  x: number[];
  value: number;
  stderr: number;
}

export interface OptimizeOptions {
  lower: number[];
  upper: number[];
  /** Search resolution per parameter (default (upper − lower)/100). */
  tolerance?: number[];
  /** Independent replicas of the local fit (default 5, at least 3). */
  replicas?: number;
  /** Confidence level of the intervals (default 0.95). */
  level?: number;
  /** Scan points per parameter (default 5 in 1D, 3 in 2D). */
  scanPoints?: number;
  /** Drop of the objective at the edge of the local design, in standard errors (default 8). */
  designDropSigmas?: number;
  onEvaluation?: (e: EvaluationRecord) => void;
}

/** The local design of the final fit and the replica-mean objective at its points. */
export interface LocalDesign {
  centre: number[];
  halfWidth: number[];
  points: number[][];
  /** Mean over replicas at each point, and its standard error (replica standard deviation / √R). */
  mean: number[];
  stderr: number[];
  /** Quadratic fitted to the replica means (coefficients on scaled coordinates, see quadraticFit.ts). */
  pooledCoef: number[];
}

export type BoundFlag = "lower" | "upper" | null;

export interface OptimumResult {
  dims: 1 | 2;
  lower: number[];
  upper: number[];
  level: number;
  replicas: number;
  /** Mean of the replicas' optima, its standard error and the two-sided t interval (clipped to the bounds). */
  location: number[];
  locationStdErr: number[];
  locationInterval: [number, number][];
  /** Mean of the replicas' fitted maxima, its standard error and interval. */
  value: number;
  valueStdErr: number;
  valueInterval: [number, number];
  /** Per parameter: the fitted optimum sits on this bound (the true optimum may lie beyond it). */
  atBound: BoundFlag[];
  /** Times the local design was moved because the optimum fell on its edge. */
  recentred: number;
  design: LocalDesign;
  replicaOptima: { location: number[]; value: number }[];
  evaluations: EvaluationRecord[];
}
