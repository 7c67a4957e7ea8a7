export { compileStack, DEFAULT_MAX_EVENTS, type CompileOptions, type MaterialSource } from "./compile.js";
export { chooseEstimator, QMC_TAIL_ROULETTE_WEIGHT, DEEP_TAIL_DEPTH, DEEP_TAIL_ROULETTE_WEIGHT, DEFAULT_SPLIT_MIN_WEIGHT, GRAZING_ANALOG_DEG, OPAQUE_DEPTH, OPAQUE_ROULETTE_WEIGHT, TAIL_ROULETTE_WEIGHT, TAIL_SPLIT_DEPTH, TAIL_SPLIT_MIN_WEIGHT, tailSplitMinWeight, type EstimatorChoice } from "./estimatorChoice.js";
export type { CompiledStack, CompiledInterface, Estimator } from "./compiledStack.js";
export { channelNames, channelNamesOfStack } from "./channels.js";
export { estimatorAt, traceBatch, type Polarization } from "./kernel.js";
export { createTally, summarizeTally, TALLY_EXTRA_ENTRIES, type TallySummary } from "./tally.js";
export { summarizeTrapping, summarizeDepthBins, lambertianLimit, type TrappingSummary, type Estimate } from "./trappingSummary.js";
export { MAX_PASSES, ESCAPE_ANGLE_BINS, ESCAPE_ANGLE_BIN_DEG, baseTallyLength } from "./tallyLayout.js";
export { geometricDepthEdges } from "./depthTally.js";
