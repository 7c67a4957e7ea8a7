import { move, workerData } from "piscina";
import { createDepthMessageRunner } from "./depthMessageRunner.js";
import { isDepthMessage, type DepthTraceMessage } from "./depthTask.js";
import { createMessageRunner } from "./messageRunner.js";
import { loadTracer } from "./tracerModule.js";
import type { TraceMessage, TraceResult, WorkerSetup } from "./traceTask.js";

/**
 * Piscina task module. Heavy setup runs once per thread (tracer, material registry, the
 * per-(combo, λ) stack cache; the generation-profile runner on its first message); each task
 * traces one message (a sweep's, or a generation profile's: kind "depth") and moves the
 * concatenated batch tallies back without copying.
 */
export default (async () => {
  const setup = workerData as WorkerSetup;
  const tracer = await loadTracer(setup.tracerModule);
  const run = createMessageRunner(setup, tracer);
  let runDepth: ((msg: DepthTraceMessage) => Float64Array) | undefined;
  return function traceWorker(msg: TraceMessage | DepthTraceMessage): TraceResult {
    if (isDepthMessage(msg)) {
      runDepth ??= createDepthMessageRunner(setup, tracer);
      return move(runDepth(msg)) as TraceResult;
    }
    return move(run(msg)) as TraceResult;
  };
})();
