/** yield/bifacial-*.json (kind "lightfold.bifacial") → the report's bifacial rows. */
import { matrixLabel } from "./adaptYield.js";
import { numberAt, objectAt, objectsAt, stringAt, type Json } from "./fields.js";
import type { BifacialRow } from "./inputs.js";
import { InputError } from "../util/errors.js";

/** Null for files of another kind. */
export function adaptBifacialFile(raw: Json, source: string): BifacialRow[] | null {
  if (raw.kind !== "lightfold.bifacial") return null;
  const matrices = objectAt(raw, "matrices", source);
  const stackLabel = matrixLabel(objectAt(matrices, "front", source, "matrices.front"), source, "matrices.front");
  const siteName = stringAt(objectAt(raw, "site", source), "name", source, "site.name");
  const bifaciality = numberAt(raw, "opticalBifaciality", source);
  return objectsAt(raw, "results", source).map(({ item, path }) => {
    const pitch = item.pitchM;
    if (pitch !== null && (typeof pitch !== "number" || !(pitch > 0))) throw new InputError(`${source}: field "${path}.pitchM" must be a positive number or null (isolated row)`);
    const face = (k: string) => numberAt(objectAt(item, k, source, `${path}.${k}`), "chargeAhM2", source, `${path}.${k}.chargeAhM2`);
    return {
      stackLabel,
      siteName,
      opticalBifaciality: bifaciality,
      tiltDeg: numberAt(item, "tiltDeg", source, `${path}.tiltDeg`),
      azimuthDeg: numberAt(item, "azimuthDeg", source, `${path}.azimuthDeg`),
      pitchM: pitch as number | null,
      groundCoverageRatio: numberAt(item, "groundCoverageRatio", source, `${path}.groundCoverageRatio`),
      frontAhM2: face("front"),
      rearAhM2: face("rear"),
      totalAhM2: numberAt(item, "totalChargeAhM2", source, `${path}.totalChargeAhM2`),
      totalStdErrAhM2: numberAt(item, "totalStdErrAhM2", source, `${path}.totalStdErrAhM2`),
      gainPct: numberAt(item, "bifacialGainPct", source, `${path}.bifacialGainPct`),
      gainStdErrPct: numberAt(item, "bifacialGainStdErrPct", source, `${path}.bifacialGainStdErrPct`),
    };
  });
}
