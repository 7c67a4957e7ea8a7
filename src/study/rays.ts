import { InputError } from "../util/errors.js";
import {
  expectInteger,
  expectObject,
  expectPositive,
  expectString,
  rejectUnknownFields,
  requireField,
} from "./fieldChecks.js";
import type { RaysPlan } from "./studyTypes.js";

const MAX_RAYS_PER_POINT = 1e12;

/** Validates the "rays" section: {perPoint, batch} or {targetStdErr, channels, maxPerPoint, batch}. */
export function parseRays(raw: unknown, path: string): RaysPlan {
  const o = expectObject(raw, path);
  if (o.perPoint !== undefined || o.targetStdErr === undefined) {
    // Unknown fields first: a misspelt "batch" must be named as the typo, not as a missing field.
    rejectUnknownFields(o, path, ["perPoint", "batch"]);
    const batch = expectInteger(requireField(o, "batch", path), `${path}.batch`, 1, 1e9);
    const perPoint = expectInteger(requireField(o, "perPoint", path), `${path}.perPoint`, 1, MAX_RAYS_PER_POINT);
    return { mode: "fixed", perPoint, batch };
  }
  rejectUnknownFields(o, path, ["targetStdErr", "channels", "maxPerPoint", "minPerPoint", "batch"]);
  const batch = expectInteger(requireField(o, "batch", path), `${path}.batch`, 1, 1e9);
  const targetStdErr = expectPositive(o.targetStdErr, `${path}.targetStdErr`);
  if (targetStdErr >= 0.5) throw new InputError(`${path}.targetStdErr: expected a standard error below 0.5, got ${targetStdErr}`);
  const rawChannels = requireField(o, "channels", path);
  if (!Array.isArray(rawChannels) || rawChannels.length === 0) {
    throw new InputError(`${path}.channels: expected a non-empty list of channel names (e.g. ["A_absorber"])`);
  }
  const channels = rawChannels.map((c, i) => expectString(c, `${path}.channels[${i}]`));
  const maxPerPoint = expectInteger(requireField(o, "maxPerPoint", path), `${path}.maxPerPoint`, 1, MAX_RAYS_PER_POINT);
  const minPerPoint = o.minPerPoint === undefined
    ? Math.min(2 * batch, maxPerPoint)
    : expectInteger(o.minPerPoint, `${path}.minPerPoint`, 1, MAX_RAYS_PER_POINT);
  if (minPerPoint > maxPerPoint) {
    throw new InputError(`${path}.minPerPoint: expected at most maxPerPoint (${maxPerPoint}), got ${minPerPoint}`);
  }
  return { mode: "target", targetStdErr, channels, maxPerPoint, minPerPoint, batch };
}
