import { logLogSlope } from "./logLogSlope.js";

/** One Monte Carlo estimate: a value, its reported standard error, and the rays it took. */
export interface Estimate {
  value: number;
  stderr: number;
  nRays: number;
}

/**
 * Computes one estimate from `nRays` rays per point, drawing every random number from streams whose
 * keys start with `namespace` (distinct namespaces → independent estimates).
 */
export type Estimator = (nRays: number, namespace: string) => Estimate;

export interface ConvergenceOptions {
  /** Rays of the first step; step k uses startRays·2^k. */
  startRays: number;
  steps: number;
  /** Independent replicas per step (≥ 1); replica 0 is the step's reported run. */
  replicas: number;
  /** Rays of the independent reference run (ignored when `reference` is given). */
  referenceRays: number;
  /** A known reference (e.g. an analytic value, stderr 0) instead of a reference run. */
  reference?: Estimate;
  /** Requested standard error; each step then predicts the rays needed to reach it. */
  targetError?: number;
}

export interface ConvergenceStep {
  nRays: number;
  /** Replica 0: value, its reported standard error and its deviation from the reference. */
  value: number;
  stderr: number;
  deviation: number;
  /** All replicas (independent streams). */
  replicaValues: number[];
  replicaStderrs: number[];
  /** Root mean square of (replica value − reference) over the replicas. */
  rmsError: number;
  /** Mean of the replicas' reported standard errors. */
  meanStderr: number;
  /** N·(stderr/target)², rounded up; null without a target. */
  predictedRays: number | null;
}

export interface ConvergenceResult {
  reference: Estimate & { kind: "run" | "given" };
  replicas: number;
  steps: ConvergenceStep[];
  slopes: {
    /** d ln|deviation| / d ln N of replica 0 (one run per step: noisy). */
    deviation: number;
    /** d ln RMS error / d ln N over the replicas (expected −1/2 for plain Monte Carlo). */
    rmsError: number;
    /** d ln reported stderr / d ln N (expected −1/2). */
    stderr: number;
    /** d ln (mean reported stderr over the replicas) / d ln N: the steadier reading of the same. */
    meanStderr: number;
    /**
     * Expected sampling sd of the RMS-error slope for plain Monte Carlo: the RMS of R Gaussian errors
     * has relative sd ≈ 1/√(2R), so sd(slope) ≈ (1/√(2R)) / √Σ(ln N − mean ln N)² (least squares).
     */
    rmsErrorSd: number;
  };
  targetError: number | null;
  /** Rays predicted for the target from the largest step (most reliable stderr); null without a target. */
  predictedRays: number | null;
}

/** Rays needed for a target error, from an estimate's stderr at N rays: N·(SE/target)² (SE ∝ N^−1/2). */
export function predictRays(nRays: number, stderr: number, targetError: number): number {
  return Math.ceil(nRays * (stderr / targetError) ** 2);
}

/** Sampling sd of a log-log slope fitted to RMS errors of `replicas` runs at the ray counts n. */
export function slopeSd(n: readonly number[], replicas: number): number {
  const ln = n.map(Math.log);
  const mean = ln.reduce((a, b) => a + b, 0) / ln.length;
  const sxx = ln.reduce((a, b) => a + (b - mean) ** 2, 0);
  return 1 / Math.sqrt(2 * replicas) / Math.sqrt(sxx);
}

/** Stream namespace of one convergence step and replica, and of the reference run. */
export function stepNamespace(step: number, replica: number): string {
  return `converge/step${step}/replica${replica}`;
}
export const REFERENCE_NAMESPACE = "converge/reference";

function checkOptions(o: ConvergenceOptions): void {
  const posInt = (v: number, name: string, min: number) => {
    if (!Number.isInteger(v) || v < min) throw new RangeError(`convergence: ${name} must be an integer ≥ ${min}, got ${v}`);
  };
  posInt(o.startRays, "startRays", 1);
  posInt(o.steps, "steps", 2);
  posInt(o.replicas, "replicas", 1);
  if (o.reference === undefined) posInt(o.referenceRays, "referenceRays", 1);
  if (o.targetError !== undefined && !(o.targetError > 0)) throw new RangeError(`convergence: targetError must be > 0, got ${o.targetError}`);
}

/** Async estimator (e.g. tracing on a worker pool); same contract as Estimator. */
export type AsyncEstimator = (nRays: number, namespace: string) => Promise<Estimate>;

/** The runs a convergence study needs: the reference (unless given), then steps × replicas. */
function plannedRuns(o: ConvergenceOptions): { nRays: number; namespace: string }[] {
  const runs: { nRays: number; namespace: string }[] = [];
  if (o.reference === undefined) runs.push({ nRays: o.referenceRays, namespace: REFERENCE_NAMESPACE });
  for (let k = 0; k < o.steps; k++) {
    for (let r = 0; r < o.replicas; r++) runs.push({ nRays: o.startRays * 2 ** k, namespace: stepNamespace(k, r) });
  }
  return runs;
}

/**
 * Runs the estimator at N, 2N, 4N, … rays (each replica of each step on its own streams) and an
 * independent reference, and measures how the error falls with N.
 */
export function runConvergence(estimate: Estimator, o: ConvergenceOptions): ConvergenceResult {
  checkOptions(o);
  return assemble(plannedRuns(o).map((r) => estimate(r.nRays, r.namespace)), o);
}

/** runConvergence with an async estimator; runs one after another, so the result is the same. */
export async function runConvergenceAsync(estimate: AsyncEstimator, o: ConvergenceOptions): Promise<ConvergenceResult> {
  checkOptions(o);
  const results: Estimate[] = [];
  for (const r of plannedRuns(o)) results.push(await estimate(r.nRays, r.namespace));
  return assemble(results, o);
}

/** Builds the result from the estimates of plannedRuns(o), in that order. */
function assemble(results: Estimate[], o: ConvergenceOptions): ConvergenceResult {
  let next = 0;
  const reference = o.reference ? { ...o.reference, kind: "given" as const } : { ...results[next++], kind: "run" as const };
  const steps: ConvergenceStep[] = [];
  for (let k = 0; k < o.steps; k++) {
    const nRays = o.startRays * 2 ** k;
    const runs = results.slice(next, next + o.replicas);
    next += o.replicas;
    const sq = runs.reduce((a, e) => a + (e.value - reference.value) ** 2, 0);
    const first = runs[0];
    steps.push({
      nRays,
      value: first.value,
      stderr: first.stderr,
      deviation: first.value - reference.value,
      replicaValues: runs.map((e) => e.value),
      replicaStderrs: runs.map((e) => e.stderr),
      rmsError: Math.sqrt(sq / runs.length),
      meanStderr: runs.reduce((a, e) => a + e.stderr, 0) / runs.length,
      predictedRays: o.targetError === undefined ? null : predictRays(nRays, first.stderr, o.targetError),
    });
  }
  const n = steps.map((s) => s.nRays);
  const last = steps[steps.length - 1];
  return {
    reference,
    replicas: o.replicas,
    steps,
    slopes: {
      deviation: logLogSlope(n, steps.map((s) => Math.abs(s.deviation))),
      rmsError: logLogSlope(n, steps.map((s) => s.rmsError)),
      stderr: logLogSlope(n, steps.map((s) => s.stderr)),
      meanStderr: logLogSlope(n, steps.map((s) => s.meanStderr)),
      rmsErrorSd: slopeSd(n, o.replicas),
    },
    targetError: o.targetError ?? null,
    predictedRays: o.targetError === undefined ? null : predictRays(last.nRays, last.stderr, o.targetError),
  };
}
