import { availableParallelism } from "node:os";
import { Piscina } from "piscina";
import { InputError } from "../util/errors.js";
import { workerFile } from "./workerPath.js";
import type { Study } from "../study/studyTypes.js";
import type { DepthTraceMessage } from "./depthTask.js";
import type { TraceMessage, TraceResult, WorkerSetup } from "./traceTask.js";

/** What the sweep runner needs of a pool: its size and a way to run a message. */
export interface TraceRunner {
  readonly nWorkers: number;
  run(msg: TraceMessage): Promise<TraceResult>;
}

/**
 * Threads to use by default: what Slurm grants the task (SLURM_CPUS_PER_TASK) when set, otherwise
 * the cores this process may use (os.availableParallelism()).
 */
export function defaultWorkerCount(env: NodeJS.ProcessEnv = process.env): number {
  const slurm = env.SLURM_CPUS_PER_TASK;
  if (slurm !== undefined && slurm !== "") {
    const n = Number(slurm);
    if (Number.isInteger(n) && n >= 1) return n;
    throw new InputError(`SLURM_CPUS_PER_TASK: expected a positive integer, got ${JSON.stringify(slurm)}`);
  }
  return Math.max(1, availableParallelism());
}

/** A fixed-size piscina pool of trace worker threads for one study. */
export class TracePool {
  readonly nWorkers: number;
  private readonly pool: Piscina<TraceMessage | DepthTraceMessage, TraceResult>;

  constructor(setup: WorkerSetup, nWorkers: number) {
    if (!Number.isInteger(nWorkers) || nWorkers < 1) throw new InputError(`workers: expected a positive integer, got ${nWorkers}`);
    this.nWorkers = nWorkers;
    this.pool = new Piscina<TraceMessage | DepthTraceMessage, TraceResult>({
      filename: workerFile(import.meta.url, "./traceWorker.js"),
      minThreads: nWorkers,
      maxThreads: nWorkers,
      idleTimeout: 60_000,
      workerData: setup,
      // A thread per core, one message at a time each: the queue stays in the main thread.
      concurrentTasksPerWorker: 1,
      execArgv: workerExecArgv(),
    });
  }

  run(msg: TraceMessage): Promise<TraceResult> {
    return this.pool.run(msg);
  }

  /** Traces a generation-profile message (depth tallies; src/workers/depthMessageRunner.ts). */
  runDepth(msg: DepthTraceMessage): Promise<TraceResult> {
    return this.pool.run(msg);
  }

  /**
   * The same threads tracing other studies of the same study file (same user materials and base
   * folder): every message carries the variant, whose key must name its content (a study hash).
   */
  forVariant(key: string, studies: Study[]): TraceRunner {
    return { nWorkers: this.nWorkers, run: (msg) => this.pool.run({ ...msg, variant: { key, studies } }) };
  }

  async close(): Promise<void> {
    await this.pool.destroy();
  }
}

/**
 * Node options of the worker threads. Piscina first tries require() on the task module and falls
 * back to import(); where Node can require ES modules, a module graph half-loaded by a failed
 * require() then fails again with an unhelpful internal assertion. Turning require(esm) off in the
 * threads sends piscina straight to import(), whose errors name the real problem.
 */
function workerExecArgv(): string[] {
  const flag = "--no-experimental-require-module";
  return process.allowedNodeEnvironmentFlags.has(flag) ? [...process.execArgv, flag] : [...process.execArgv];
}
