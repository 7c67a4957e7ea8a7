import { InputError } from "../util/errors.js";
import type { RaysPlan } from "./studyTypes.js";

/** The "rays" section as the schema admits it (one of its two forms). */
export type RawRays =
  | { perPoint: number; batch: number }
  | { targetStdErr: number; channels: string[]; maxPerPoint: number; minPerPoint?: number; batch: number };

/** Resolves the "rays" section: {perPoint, batch} or {targetStdErr, channels, maxPerPoint, batch}. */
export function parseRays(o: RawRays, path: string): RaysPlan {
  if (!("targetStdErr" in o)) return { mode: "fixed", perPoint: o.perPoint, batch: o.batch };
  const { targetStdErr, channels, maxPerPoint, batch } = o;
  const minPerPoint = o.minPerPoint ?? Math.min(2 * batch, maxPerPoint);
  if (minPerPoint > maxPerPoint) {
    throw new InputError(`${path}.minPerPoint: expected at most maxPerPoint (${maxPerPoint}), got ${minPerPoint}`);
  }
  return { mode: "target", targetStdErr, channels: [...channels], maxPerPoint, minPerPoint, batch };
}
