import { move, workerData } from "piscina";
import { createMessageRunner } from "./messageRunner.js";
import { loadTracer } from "./tracerModule.js";
import type { TraceMessage, TraceResult, WorkerSetup } from "./traceTask.js";

/**
 * Piscina task module. Heavy setup runs once per thread (tracer, material registry, the
 * per-(combo, λ) stack cache); each task traces one message and moves the concatenated batch
 * tallies back without copying.
 */
export default (async () => {
  const setup = workerData as WorkerSetup;
  const run = createMessageRunner(setup, await loadTracer(setup.tracerModule));
  return function traceWorker(msg: TraceMessage): TraceResult {
    return move(run(msg)) as TraceResult;
  };
})();
