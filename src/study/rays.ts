import { InputError } from "../util/errors.js";
import { MIN_REPLICAS, REPLICA_GROUPS } from "../random/replicaGroups.js";
import type { LaunchSampling } from "../random/sobol.js";
import type { RaysPlan } from "./studyTypes.js";

/** The "rays" section as the schema admits it (one of its two forms). */
export type RawRays =
  | { perPoint: number; batch: number; sampling?: LaunchSampling }
  | { targetStdErr: number; channels: string[]; maxPerPoint: number; minPerPoint?: number; batch: number; sampling?: LaunchSampling };

/**
 * Resolves the "rays" section: {perPoint, batch} or {targetStdErr, channels, maxPerPoint, batch},
 * with an optional launch sampling. Sobol' sampling takes its standard errors from the replica
 * groups, so a point needs at least MIN_REPLICAS batches (by default a target-error run starts with
 * one batch per group).
 */
export function parseRays(o: RawRays, path: string): RaysPlan {
  const sobol = o.sampling === "sobol";
  const sampling = sobol ? { sampling: "sobol" as const } : {};
  const tooFew = (field: string, rays: number, batch: number): InputError =>
    new InputError(
      `${path}.${field}: Sobol' sampling takes its standard errors from independent replicas and needs at least ${MIN_REPLICAS} batches per point, got ${rays} rays in batches of ${batch} (${Math.ceil(rays / batch)} batch(es))`,
      `raise ${path}.${field} to at least ${MIN_REPLICAS * batch} (${REPLICA_GROUPS} batches, one per replica group, is best), lower ${path}.batch, or use "sampling": "random"`,
    );
  if (!("targetStdErr" in o)) {
    if (sobol && Math.ceil(o.perPoint / o.batch) < MIN_REPLICAS) throw tooFew("perPoint", o.perPoint, o.batch);
    return { mode: "fixed", perPoint: o.perPoint, batch: o.batch, ...sampling };
  }
  const { targetStdErr, channels, maxPerPoint, batch } = o;
  const minPerPoint = o.minPerPoint ?? Math.min((sobol ? REPLICA_GROUPS : 2) * batch, maxPerPoint);
  if (minPerPoint > maxPerPoint) {
    throw new InputError(`${path}.minPerPoint: expected at most maxPerPoint (${maxPerPoint}), got ${minPerPoint}`);
  }
  if (sobol && Math.ceil(minPerPoint / batch) < MIN_REPLICAS) throw tooFew(o.minPerPoint === undefined ? "maxPerPoint" : "minPerPoint", minPerPoint, batch);
  return { mode: "target", targetStdErr, channels: [...channels], maxPerPoint, minPerPoint, batch, ...sampling };
}

/**
 * The rays plan with another launch sampling, checked as the study file would be (at least
 * MIN_REPLICAS batches for Sobol'); a target-error plan whose minPerPoint was the default of its
 * sampling gets the default of the new one.
 */
export function withSampling(rays: RaysPlan, sampling: LaunchSampling, path: string): RaysPlan {
  const s = sampling === "sobol" ? { sampling } : {};
  if (rays.mode === "fixed") return parseRays({ perPoint: rays.perPoint, batch: rays.batch, ...s }, path);
  const defaultMin = Math.min((rays.sampling === "sobol" ? REPLICA_GROUPS : 2) * rays.batch, rays.maxPerPoint);
  const minPerPoint = rays.minPerPoint === defaultMin ? {} : { minPerPoint: rays.minPerPoint };
  return parseRays({ targetStdErr: rays.targetStdErr, channels: rays.channels, maxPerPoint: rays.maxPerPoint, batch: rays.batch, ...minPerPoint, ...s }, path);
}
