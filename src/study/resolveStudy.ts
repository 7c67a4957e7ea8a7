import { InputError } from "../util/errors.js";
import {
  describeValue,
  expectInteger,
  expectObject,
  expectOneOf,
  expectString,
  rejectUnknownFields,
  requireField,
  type RawObject,
} from "./fieldChecks.js";
import { parseGrid } from "./grid.js";
import { parseRays } from "./rays.js";
import { parseSweep, substituteCombo, sweepCombinations, type SweepSpec } from "./sweepCombos.js";
import type { SpectrumChoice, Study } from "./studyTypes.js";
import { validateStack, type MaterialLookup, type ValidateStackOptions } from "./validateStack.js";

export const STUDY_FIELDS = ["$schema", "name", "description", "materials", "stack", "grid", "rays", "seed", "sweep", "spectrum"] as const;

export interface ResolvedDocument {
  /** One study per combination (a single one without a sweep). */
  studies: Study[];
  /** Values of each combination, same order. */
  comboValues: Record<string, number>[];
  sweep: SweepSpec;
}

/**
 * Validates a parsed study document and resolves it into one typed Study per sweep combination.
 * Pure except for what `stackOptions` reads (height maps). Errors are InputErrors naming the field.
 */
export function resolveStudyDocument(doc: unknown, registry: MaterialLookup | undefined, stackOptions: ValidateStackOptions): ResolvedDocument {
  const o = expectObject(doc, "(study)");
  rejectUnknownFields(o, "", STUDY_FIELDS);
  const name = expectString(requireField(o, "name", ""), "name");
  const description = o.description === undefined ? "" : expectStringAllowEmpty(o.description, "description");
  const materials = parseMaterialEntries(o.materials);
  const grid = parseGrid(requireField(o, "grid", ""), "grid");
  const rays = parseRays(requireField(o, "rays", ""), "rays");
  const seed = expectInteger(requireField(o, "seed", ""), "seed", 0, Number.MAX_SAFE_INTEGER);
  const spectrum = parseSpectrum(o.spectrum);
  const sweep = o.sweep === undefined ? {} : parseSweep(o.sweep, "sweep");
  const rawStack = requireField(o, "stack", "");

  const comboValues = sweepCombinations(sweep);
  const studies = comboValues.map((values) => {
    const stackDoc = Object.keys(values).length === 0 ? rawStack : substituteCombo(rawStack, values, "sweep");
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
    return { name, description, materials, stack, grid, rays, seed, spectrum } satisfies Study;
  });
  return { studies, comboValues, sweep };
}

function expectStringAllowEmpty(raw: unknown, path: string): string {
  if (typeof raw !== "string") throw new InputError(`${path}: expected a string, got ${describeValue(raw)}`);
  return raw;
}

function parseMaterialEntries(raw: unknown): unknown[] {
  if (raw === undefined) return [];
  if (!Array.isArray(raw)) throw new InputError(`materials: expected a list of material entries, got ${describeValue(raw)}`);
  const names = new Set<string>();
  raw.forEach((entry, i) => {
    const e = expectObject(entry, `materials[${i}]`);
    const name = expectString(requireField(e, "name", `materials[${i}]`), `materials[${i}].name`);
    if (names.has(name)) throw new InputError(`materials[${i}].name: material ${JSON.stringify(name)} is defined twice`);
    names.add(name);
  });
  return raw;
}

/** Named spectra (ASTM G-173 columns) a study may ask for. */
export const SPECTRUM_NAMES = ["AM1.5G", "AM1.5D", "G173-ETR"] as const;

function parseSpectrum(raw: unknown): SpectrumChoice {
  if (raw === undefined) return "AM1.5G";
  if (typeof raw === "string") {
    return expectOneOf(raw, "spectrum", SPECTRUM_NAMES);
  }
  if (Array.isArray(raw) || raw === null || typeof raw !== "object") {
    throw new InputError(`spectrum: expected one of ${SPECTRUM_NAMES.join(", ")} or {"csv": "file.csv"}, got ${describeValue(raw)}`);
  }
  const o: RawObject = expectObject(raw, "spectrum");
  rejectUnknownFields(o, "spectrum", ["csv"]);
  return { csv: expectString(requireField(o, "csv", "spectrum"), "spectrum.csv") };
}
