/** Reads run directories into the report's typed input (the only file reading of the report). */
import { adaptBifacialFile } from "./adaptBifacial.js";
import { existsSync, readdirSync, statSync } from "node:fs";
import { basename, join } from "node:path";
import { readResponseMatrix } from "../response/matrixFile.js";
import { comboTitle } from "../study/comboLabel.js";
import { InputError } from "../util/errors.js";
import { readInputText } from "../util/inputFile.js";
import { toolVersion } from "../util/version.js";
import { adaptConvergence } from "./adaptConvergence.js";
import { adaptGeneration } from "./adaptGeneration.js";
import { adaptOptimum } from "./adaptOptimum.js";
import { adaptPhotocurrent } from "./adaptPhotocurrent.js";
import { adaptYieldFile } from "./adaptYield.js";
import { parseJson, type Json } from "./fields.js";
import type { ReportInput, StackEntry } from "./inputs.js";
import { thetaIndex } from "./spectralBreakdown.js";

function readJsonFile(path: string): Json {
  const text = readInputText(
    path,
    "run file",
    "give the --out folder of a `lightfold sweep` run (it holds run.json); an interrupted sweep finishes when rerun with the same --out",
  );
  return parseJson(text, path);
}

/** Combination folders in natural order: base, p0, p1, …, p10. */
function comboDirs(runDir: string): string[] {
  const names = readdirSync(runDir).filter((n) => n !== "report" && n !== "yield" && existsSync(join(runDir, n, "matrix.json")));
  const key = (n: string) => {
    const m = /^p(\d+)$/.exec(n);
    return m ? Number(m[1]) : -1;
  };
  return names.sort((a, b) => key(a) - key(b) || a.localeCompare(b));
}

/** Words for a combination of a run.json without titles (runs of older versions). */
function comboText(combo: Record<string, number>): string {
  return comboTitle(combo);
}

export interface LoadOptions {
  angleDeg: number;
}

/**
 * Reads every run directory: matrices and photocurrent summaries per combination, convergence.json,
 * yield/*.json. Missing optional parts become omitted sections; malformed files are InputErrors.
 */
export function loadReportInput(runDirs: string[], opts: LoadOptions): ReportInput {
  try {
    return loadAll(runDirs, opts);
  } catch (err) {
    // A malformed result file: say how to get a good one back.
    if (err instanceof InputError && err.hint === undefined) {
      throw new InputError(err.message, "re-run the command that wrote this file (sweep, converge, yield or compare) with this lightfold version");
    }
    throw err;
  }
}

function loadAll(runDirs: string[], opts: LoadOptions): ReportInput {
  const input: ReportInput = {
    title: "",
    runDirs,
    toolVersion: toolVersion(),
    angleDeg: opts.angleDeg,
    stacks: [],
    convergence: [],
    yields: [],
    tiltSweeps: [],
    benefit: [],
    optima: [],
    generations: [],
    notes: [],
  };
  const studyNames: string[] = [];
  for (const dir of runDirs) {
    if (!existsSync(dir) || !statSync(dir).isDirectory()) {
      throw new InputError(`run directory ${dir} does not exist or is not a directory`, "give the --out folder of a sweep, e.g. lightfold report runs/my-study");
    }
    let found = 0;
    const titles = new Map<string, string>();
    if (existsSync(join(dir, "run.json"))) {
      const run = readJsonFile(join(dir, "run.json"));
      if (typeof run.studyName === "string") studyNames.push(run.studyName);
      if (Array.isArray(run.combos)) {
        for (const c of run.combos as Json[]) if (typeof c?.label === "string" && typeof c.title === "string") titles.set(c.label, c.title);
      }
      found++;
    }
    const combos = comboDirs(dir);
    for (const c of combos) {
      const matrixPath = join(dir, c, "matrix.json");
      const matrix = readResponseMatrix(matrixPath);
      thetaIndex(matrix, opts.angleDeg, matrixPath);
      const pcPath = join(dir, c, "photocurrent.json");
      const photocurrent = existsSync(pcPath) ? adaptPhotocurrent(readJsonFile(pcPath), pcPath) : undefined;
      const swept = Object.keys(matrix.combo).length > 0;
      const title = swept ? (titles.get(c) ?? comboText(matrix.combo)) : undefined;
      const entry: StackEntry = {
        label: title !== undefined ? `${matrix.studyName} · ${title}` : matrix.studyName,
        studyName: matrix.studyName,
        comboKey: c,
        combo: matrix.combo,
        ...(title !== undefined ? { title } : {}),
        matrixPath,
        matrix,
        photocurrent,
      };
      input.stacks.push(entry);
      if (!studyNames.includes(matrix.studyName)) studyNames.push(matrix.studyName);
      found++;
    }
    const genPath = join(dir, "generation", "generation.json");
    if (existsSync(genPath)) {
      (input.generations ??= []).push(adaptGeneration(readJsonFile(genPath), genPath));
      found++;
    }
    const convPath = join(dir, "convergence.json");
    if (existsSync(convPath)) {
      input.convergence.push(...adaptConvergence(readJsonFile(convPath), convPath));
      found++;
    }
    const optPath = join(dir, "optimum.json");
    if (existsSync(optPath)) {
      const o = adaptOptimum(readJsonFile(optPath), optPath);
      input.optima.push(o);
      if (!studyNames.includes(o.studyName)) studyNames.push(o.studyName);
      found++;
    }
    const yieldDir = join(dir, "yield");
    if (existsSync(yieldDir) && statSync(yieldDir).isDirectory()) {
      for (const f of readdirSync(yieldDir).filter((n) => n.endsWith(".json")).sort()) {
        const p = join(yieldDir, f);
        const raw = readJsonFile(p);
        const bifacial = adaptBifacialFile(raw, p);
        if (bifacial) {
          (input.bifacial ??= []).push(...bifacial);
          found++;
          continue;
        }
        const parts = adaptYieldFile(raw, p);
        if (!parts) {
          input.notes.push(`Skipped ${p}: not a yield, tilt-sweep or comparison result this version reads.`);
          continue;
        }
        input.yields.push(...parts.yields);
        input.tiltSweeps.push(...parts.tiltSweeps);
        input.benefit.push(...parts.benefit);
        found++;
      }
    }
    if (found === 0) {
      throw new InputError(`${dir} holds no lightfold results (no run.json, <combo>/matrix.json, convergence.json, optimum.json or yield/*.json)`, "run `lightfold sweep <study> --out <dir>` first");
    }
  }
  input.title = studyNames.length ? studyNames.join(" vs ") : runDirs.map((d) => basename(d)).join(", ");
  return input;
}
