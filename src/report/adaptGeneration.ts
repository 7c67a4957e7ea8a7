/** generation/generation.json (written by `lightfold generation`) → the report's generation profile. */
import { InputError } from "../util/errors.js";
import type { GenerationEntry } from "./inputs.js";
import { numberArrayAt, numberAt, objectAt, stringAt, type Json } from "./fields.js";

export function adaptGeneration(raw: Json, source: string): GenerationEntry {
  if (raw.format !== "lightfold.generation") {
    throw new InputError(`${source}: not a lightfold generation profile (format is ${JSON.stringify(raw.format)}, expected "lightfold.generation")`);
  }
  const depthUm = numberArrayAt(raw, "depthUm", source);
  const generationCm3S = numberArrayAt(raw, "generationCm3S", source, "generationCm3S", depthUm.length);
  const check = objectAt(raw, "check", source);
  return {
    label: stringAt(raw, "studyName", source),
    thetaDeg: numberAt(raw, "thetaDeg", source),
    spectrum: stringAt(raw, "spectrum", source),
    depthUm,
    generationCm3S,
    integratedMaCm2: numberAt(check, "integratedMaCm2", source, "check.integratedMaCm2"),
  };
}
