import { readFileSync } from "node:fs";
import { dirname, resolve } from "node:path";
import { InputError } from "../util/errors.js";
import { checkStudySize } from "./studyLimits.js";
import { dataFileProblem, parseJsonInput, readInputText } from "../util/inputFile.js";
import type { MaterialRegistry } from "../materials/registry.js";
import { canonicalJson, studyHash } from "./canonical.js";
import { resolveStudyDocument } from "./resolveStudy.js";
import { checkStudyDocument } from "./studySchema.js";
import type { RawRays } from "./rays.js";
import type { SweepSpec } from "./sweepCombos.js";
import type { RaysPlan, Study, StudyCombo, StudyGrid } from "./studyTypes.js";
import { buildMaterialRegistry } from "./userMaterials.js";

/** A study file read, validated and resolved; everything a sweep needs. */
export interface LoadedStudy {
  /** Absolute path of the study file ("(inline)" for documents built in code). */
  path: string;
  /** Directory relative file names in the study resolve against. */
  baseDir: string;
  name: string;
  /** sha256 (hex) of the whole resolved study (all combinations) + referenced file contents. */
  hash: string;
  sweep: SweepSpec;
  combos: StudyCombo[];
  registry: MaterialRegistry;
  /** Contents of the files the study refers to, by name as written. */
  files: Record<string, string>;
  /**
   * The study's "rays" section as written. Plans derived from it (sweep --sampling and
   * --target-error, optimize) are parsed from it again, so a launch sampling the study names is kept
   * and an unnamed one gets the default of the derived plan (rays.ts, defaultSampling).
   */
  raysAsWritten: RawRays;
}

/** Reads, validates and resolves a study file (JSON). Throws InputError naming the field path. */
export function loadStudy(path: string): LoadedStudy {
  const { doc, baseDir, path: abs } = readStudyDocument(path);
  try {
    return loadStudyFromDocument(doc, { baseDir, path: abs });
  } catch (err) {
    if (err instanceof InputError) throw new InputError(`${path}: ${err.message}`, err.hint);
    throw err;
  }
}

/** The parsed JSON of a study file, not yet validated (for verbs that derive studies from it). */
export function readStudyDocument(path: string): { doc: unknown; baseDir: string; path: string } {
  const abs = resolve(path);
  const text = readInputText(path, "study file", "check the path (relative to the current folder); example studies: configs/*.study.json");
  return { doc: parseJsonInput(text, path), baseDir: dirname(abs), path: abs };
}

/** Same as loadStudy for a document already parsed (relative files resolve against baseDir). */
export function loadStudyFromDocument(doc: unknown, options: { baseDir: string; path?: string }): LoadedStudy {
  checkStudyDocument(doc); // before any file named in it is read
  const baseDir = resolve(options.baseDir);
  const files = referencedFiles(doc, baseDir);
  const materials = doc !== null && typeof doc === "object" ? (doc as Record<string, unknown>).materials : undefined;
  const registry = buildMaterialRegistry(Array.isArray(materials) ? materials : [], baseDir);
  const readText = (p: string): string => readFileSync(p, "utf8");
  const resolved = resolveStudyDocument(doc, registry, { baseDir, readText });
  return assemble(resolved.studies, resolved.comboValues, resolved.sweep, {
    path: options.path ?? "(inline)",
    baseDir,
    registry,
    files,
    raysAsWritten: resolved.raysAsWritten,
  });
}

/**
 * The same study with another seed, ray plan or grid (convergence, reference and benchmark runs);
 * hashes are recomputed, so journals and matrices of the two never mix.
 */
export function withOverrides(loaded: LoadedStudy, overrides: { seed?: number; rays?: RaysPlan; grid?: StudyGrid }): LoadedStudy {
  const studies = loaded.combos.map((c) => ({
    ...c.study,
    ...(overrides.grid !== undefined ? { grid: overrides.grid } : {}),
    ...(overrides.seed !== undefined ? { seed: overrides.seed } : {}),
    ...(overrides.rays !== undefined ? { rays: overrides.rays } : {}),
  }));
  checkStudySize(studies[0].grid, studies[0].rays, studies.length);
  return assemble(studies, loaded.combos.map((c) => c.values), loaded.sweep, loaded);
}

function assemble(
  studies: Study[],
  comboValues: Record<string, number>[],
  sweep: SweepSpec,
  base: { path: string; baseDir: string; registry: MaterialRegistry; files: Record<string, string>; raysAsWritten: RawRays },
): LoadedStudy {
  const hasSweep = Object.keys(sweep).length > 0;
  // rear-lit twins (illumination "both") follow the front combinations and share their numbers
  const nDistinct = studies.filter((s) => s.lightFrom !== "rear").length || studies.length;
  const combos: StudyCombo[] = studies.map((study, index) => ({
    index,
    label: (hasSweep ? `p${index % nDistinct}` : "base") + (study.lightFrom === "rear" ? "-rear" : ""),
    values: comboValues[index],
    study,
    hash: studyHash(study, base.files),
  }));
  const hash = studyHash({ combos: combos.map((c) => ({ values: c.values, study: c.study })), sweep }, base.files);
  return { ...base, name: studies[0].name, hash, sweep, combos };
}

/** Contents of every file named by a "csv" field anywhere in the document (for the study hash). */
function referencedFiles(doc: unknown, baseDir: string): Record<string, string> {
  const files: Record<string, string> = {};
  const visit = (node: unknown, path: string): void => {
    if (Array.isArray(node)) node.forEach((v, i) => visit(v, `${path}[${i}]`));
    else if (node !== null && typeof node === "object") {
      for (const [k, v] of Object.entries(node as Record<string, unknown>)) {
        const p = path === "" ? k : `${path}.${k}`;
        if (k === "csv" && typeof v === "string" && v !== "") {
          if (files[v] === undefined) {
            const abs = resolve(baseDir, v);
            const problem = dataFileProblem(abs);
            if (problem !== undefined) throw new InputError(`${p}: cannot read ${abs}: ${problem}`, "csv paths are relative to the folder of the study file");
            try {
              files[v] = readFileSync(abs, "utf8");
            } catch (err) {
              throw new InputError(`${p}: cannot read ${abs} (${(err as NodeJS.ErrnoException).code ?? (err as Error).message})`, "csv paths are relative to the folder of the study file");
            }
          }
        } else visit(v, p);
      }
    }
  };
  visit(doc, "");
  return files;
}

/** Canonical text of a combination's study (what its hash covers, without file contents). */
export function canonicalStudyText(study: Study): string {
  return canonicalJson(study);
}
