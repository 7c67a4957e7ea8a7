/**
 * `npm run bench`: the project's speed and memory figures (never asserted in unit tests).
 * Parts: optics (exact vs tabulated interface optics), trace (the tracer reference case: speed and
 * estimator efficiency against a native C reference), paired (common-random-number gain), sweep
 * (pool efficiency), yield, bifacial (rear-light view factors, quadrature and year), merit (default
 * against analog estimator at every point of the demo studies). `LIGHTFOLD_BENCH=optics,trace`
 * picks parts.
 */
import { runOpticsBench } from "./optics.js";
import { runTraceBench } from "./trace.js";
import { runSweepBench } from "./sweep.js";
import { runYieldBench } from "./yield.js";
import { runPairedBench } from "./paired.js";
import { runBifacialBench } from "./bifacial.js";
import { runEstimatorMapBench } from "./estimatorMap.js";

const parts: Record<string, () => Promise<void>> = {
  optics: runOpticsBench,
  trace: runTraceBench,
  paired: runPairedBench,
  sweep: runSweepBench,
  yield: runYieldBench,
  bifacial: runBifacialBench,
  merit: runEstimatorMapBench,
};

const chosen = (process.env.LIGHTFOLD_BENCH ?? Object.keys(parts).join(",")).split(",").map((s) => s.trim());
for (const name of chosen) {
  const run = parts[name];
  if (!run) {
    process.stderr.write(`bench: unknown part "${name}" (have ${Object.keys(parts).join(", ")})\n`);
    process.exit(2);
  }
  process.stdout.write(`\n=== ${name} ===\n`);
  await run();
}
