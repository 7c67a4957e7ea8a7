import { comboTitle } from "../study/comboLabel.js";
import type { LoadedStudy } from "../study/load.js";
import { InputError } from "../util/errors.js";
import { nearestWord } from "../util/didYouMean.js";
import { toolVersion } from "../util/version.js";
import type { TracerModule } from "../workers/tracerModule.js";
import { buildId } from "./buildId.js";
import { comboChannels } from "./channels.js";
import { initialBatches, inShard, pointCoords, totalPoints, type ShardSpec, type SweepPlan } from "./plan.js";
import type { PointState } from "./pointState.js";
import { tallyLength } from "./tally.js";

/** The plan stage's product: what a sweep is to do and the state of each of its points. */
export interface SweepRun {
  plan: SweepPlan;
  shard: ShardSpec | null;
  /** Global point number → its state (only the points of this run's shard). */
  states: Map<number, PointState>;
  /** Per combination: indices of the target-error channels (empty in fixed-rays mode). */
  targetIdx: number[][];
  raysResumed: number;
  tasksResumed: number;
  /** Rays in finished batches, including those taken from a journal. */
  raysDone: number;
  /** Rays planned so far (grows in target-error mode). */
  raysPlanned: number;
  pointsDone: number;
}

/** The plan of a loaded study: grid, rays, combos with their channel names. */
export function sweepPlanOf(study: LoadedStudy, tracer: TracerModule): SweepPlan {
  const first = study.combos[0].study;
  return {
    studyName: study.name,
    studyHash: study.hash,
    toolVersion: toolVersion(),
    buildId: buildId(),
    seed: first.seed,
    grid: first.grid,
    rays: first.rays,
    combos: study.combos.map((c) => ({
      label: c.label,
      values: c.values,
      hash: c.hash,
      channels: comboChannels(c.study, study.registry, tracer),
      absorberThicknessUm: c.study.stack.absorber.thicknessUm,
      ...(Object.keys(c.values).length > 0 ? { title: comboTitle(c.values, c.study.stack) } : {}),
      ...(c.study.lightFrom === "rear" ? { lightFrom: "rear" as const } : {}),
    })),
    spectrum: first.spectrum,
    baseDir: study.baseDir,
  };
}

/** Target-error channels of each combination as channel indices (an unknown name is an input error). */
function targetIndices(plan: SweepPlan): number[][] {
  const rays = plan.rays;
  return plan.combos.map((c) => {
    if (rays.mode !== "target") return [];
    return rays.channels.map((name, i) => {
      const k = c.channels.indexOf(name);
      if (k < 0) {
        const near = nearestWord(name, c.channels);
        throw new InputError(`rays.channels[${i}]: the stack has no channel "${name}" (it has ${c.channels.join(", ")})`, near !== undefined ? `did you mean "${near}"?` : undefined);
      }
      return k;
    });
  });
}

/** Plan stage: the plan and a fresh state for every point of the run (or of its shard). */
export function planSweep(study: LoadedStudy, tracer: TracerModule, shard: ShardSpec | null): SweepRun {
  const plan = sweepPlanOf(study, tracer);
  const targetIdx = targetIndices(plan);
  const states = new Map<number, PointState>();
  const nTotal = totalPoints(plan);
  for (let p = 0; p < nTotal; p++) {
    if (!inShard(p, shard)) continue;
    const len = tallyLength(plan.combos[pointCoords(plan.grid, p).combo].channels.length);
    states.set(p, { planned: initialBatches(plan.rays), requested: 0, acc: new Float64Array(len), k: 0, pending: new Map() });
  }
  return { plan, shard, states, targetIdx, raysResumed: 0, tasksResumed: 0, raysDone: 0, raysPlanned: 0, pointsDone: 0 };
}
