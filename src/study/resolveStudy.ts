import { InputError } from "../util/errors.js";
import { parseGrid, type RawGrid } from "./grid.js";
import { parseRays, type RawRays } from "./rays.js";
import { checkStudyDocument } from "./studySchema.js";
import { parseSweep, substituteCombo, sweepCombinations, type SweepSpec } from "./sweepCombos.js";
import type { SpectrumChoice, Study } from "./studyTypes.js";
import { isBacksheet, isIdealRear, type StackSpec } from "./stackTypes.js";
import { validateStack, type MaterialLookup, type ValidateStackOptions } from "./validateStack.js";
import { checkIncidenceMedium, checkStudySize } from "./studyLimits.js";

export const STUDY_FIELDS = ["$schema", "name", "description", "materials", "stack", "grid", "rays", "seed", "sweep", "spectrum", "illumination"] as const;

export interface ResolvedDocument {
  /** One study per combination (a single one without a sweep). */
  studies: Study[];
  /** Values of each combination, same order. */
  comboValues: Record<string, number>[];
  sweep: SweepSpec;
  /** The "rays" section as written (plans derived from the study resolve their launch sampling from it). */
  raysAsWritten: RawRays;
}

/** A study document as the schema admits it (the stack is checked per combination). */
interface RawStudy {
  name: string;
  description?: string;
  materials?: { name: string }[];
  stack: unknown;
  grid: RawGrid;
  rays: RawRays;
  seed: number;
  sweep?: Record<string, number[]>;
  spectrum?: SpectrumChoice;
  illumination?: "front" | "rear" | "both";
}

/**
 * Validates a parsed study document against schema/study.schema.json and resolves it into one
 * typed Study per sweep combination; the checks that relate several fields are made here and in
 * the section resolvers. The stack is checked after each combination's values are written in.
 * Pure except for what `stackOptions` reads (height maps). Errors are InputErrors naming the field.
 */
export function resolveStudyDocument(doc: unknown, registry: MaterialLookup | undefined, stackOptions: ValidateStackOptions): ResolvedDocument {
  checkStudyDocument(doc);
  const o = doc as RawStudy;
  const materials = uniqueMaterials(o.materials ?? []);
  const grid = parseGrid(o.grid, "grid");
  const rays = parseRays(o.rays, "rays");
  const sweep = o.sweep === undefined ? {} : parseSweep(o.sweep, "sweep");
  const base = { name: o.name, description: o.description ?? "", materials, grid, rays, seed: o.seed, spectrum: o.spectrum ?? "AM1.5G" };
  const illumination = o.illumination ?? "front";

  const comboValues = sweepCombinations(sweep);
  checkStudySize(grid, rays, comboValues.length * (illumination === "both" ? 2 : 1));
  const studies = comboValues.map((values) => {
    const stackDoc = Object.keys(values).length === 0 ? o.stack : substituteCombo(o.stack, values, "sweep");
    let stack;
    try {
      stack = validateStack(stackDoc, "stack", registry, stackOptions);
    } catch (err) {
      if (err instanceof InputError && Object.keys(values).length > 0) {
        const where = Object.entries(values).map(([k, v]) => `${k}=${v}`).join(", ");
        throw new InputError(`${err.message} (in sweep combination ${where})`, err.hint);
      }
      throw err;
    }
    if (illumination !== "front") checkRearIllumination(stack);
    checkIncidenceMedium(stack.incidence, registry, grid.wavelengthNm, "stack.incidence");
    return { ...base, stack } satisfies Study;
  });
  // light from the rear: a twin per combination (front-lit studies keep the field unset, so their hash is unchanged)
  const rear = studies.map((s) => ({ ...s, lightFrom: "rear" as const }));
  const raysAsWritten = o.rays;
  if (illumination === "rear") return { studies: rear, comboValues, sweep, raysAsWritten };
  if (illumination === "both") return { studies: [...studies, ...rear], comboValues: [...comboValues, ...comboValues], sweep, raysAsWritten };
  return { studies, comboValues, sweep, raysAsWritten };
}

/** Light from the rear needs a way in: refuse ideal rear reflectors and back-sheets (a metal exit is refused at compile). */
function checkRearIllumination(stack: StackSpec): void {
  if (isIdealRear(stack.rear)) {
    throw new InputError(`illumination: light from the rear needs a transparent rear, but stack.rear is an ideal reflector`, 'use "illumination": "front", or a real rear with a transparent exit');
  }
  if (stack.rearOuter && isBacksheet(stack.rearOuter)) {
    throw new InputError(`illumination: light from the rear needs a transparent rear, but stack.rearOuter is a back-sheet`, 'use "illumination": "front", or "rearOuter": "air" for a glass-glass module');
  }
}

/** Material entries with names used once (the catalogue checks each entry's fields). */
function uniqueMaterials(raw: { name: string }[]): unknown[] {
  const names = new Set<string>();
  raw.forEach((entry, i) => {
    if (names.has(entry.name)) throw new InputError(`materials[${i}].name: material ${JSON.stringify(entry.name)} is defined twice`);
    names.add(entry.name);
  });
  return raw;
}

/** Named spectra (ASTM G-173 columns) a study may ask for. */
export const SPECTRUM_NAMES = ["AM1.5G", "AM1.5D", "G173-ETR"] as const;
