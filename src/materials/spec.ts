import { isAbsolute, resolve } from "node:path";
import { InputError } from "../util/errors.js";
import { readNkCsvFile } from "./catalogFiles.js";
import { ComposedMaterial } from "./composedMaterial.js";
import { constantCurve, formulaCurve, tableCurve } from "./curve.js";
import { cauchyIndex, sellmeierIndex } from "./formulas.js";
import type { MaterialRegistry } from "./registry.js";
import type { CatalogMaterial } from "./types.js";

const NAME = /^[A-Za-z0-9][A-Za-z0-9_.+\-]*$/;
const KINDS = ["csv", "constant", "cauchy", "sellmeier"] as const;
const ALLOWED = new Set(["name", "description", "source", "override", "validNm", "k", ...KINDS]);
/** Range given to a constant material when the study sets no validNm. */
export const DEFAULT_CONSTANT_RANGE_NM: readonly [number, number] = [100, 100000];

function isRecord(v: unknown): v is Record<string, unknown> {
  return typeof v === "object" && v !== null && !Array.isArray(v);
}

function finite(v: unknown, path: string, what: string): number {
  if (typeof v !== "number" || !Number.isFinite(v)) throw new InputError(`${path}: expected ${what}, got ${JSON.stringify(v)}`);
  return v;
}

function numberArray(v: unknown, path: string): number[] {
  if (!Array.isArray(v) || v.length === 0) throw new InputError(`${path}: expected a non-empty array of numbers`);
  return v.map((x, i) => finite(x, `${path}[${i}]`, "a number"));
}

function validRange(v: unknown, path: string): [number, number] {
  if (!Array.isArray(v) || v.length !== 2) throw new InputError(`${path}: expected [minNm, maxNm]`);
  const a = finite(v[0], `${path}[0]`, "a wavelength in nm");
  const b = finite(v[1], `${path}[1]`, "a wavelength in nm");
  if (!(a > 0 && b > a)) throw new InputError(`${path}: expected 0 < minNm < maxNm, got [${a}, ${b}]`);
  return [a, b];
}

/**
 * A user material from a study-file entry (see docs: { name, csv } | { name, constant: {n, k} } |
 * { name, cauchy: {A, B, C}, validNm } | { name, sellmeier: {B, CUm2}, validNm }). CSV paths are
 * relative to baseDir; the file is read and checked now. Errors name fieldPath (e.g. "materials[2]").
 */
export function materialFromSpec(spec: unknown, baseDir: string, fieldPath: string): CatalogMaterial {
  if (!isRecord(spec)) throw new InputError(`${fieldPath}: expected an object with "name" and one of ${KINDS.join(", ")}`);
  for (const key of Object.keys(spec)) {
    if (!ALLOWED.has(key)) throw new InputError(`${fieldPath}.${key}: unknown field (allowed: ${[...ALLOWED].join(", ")})`);
  }
  const name = spec.name;
  if (typeof name !== "string" || !NAME.test(name)) {
    throw new InputError(`${fieldPath}.name: expected a name of letters, digits and _ . + - (got ${JSON.stringify(name)})`);
  }
  const kinds = KINDS.filter((k) => spec[k] !== undefined);
  if (kinds.length !== 1) {
    throw new InputError(`${fieldPath}: material "${name}" needs exactly one of ${KINDS.join(", ")} (got ${kinds.length === 0 ? "none" : kinds.join(", ")})`);
  }
  if (spec.override !== undefined && typeof spec.override !== "boolean") throw new InputError(`${fieldPath}.override: expected true or false`);
  for (const f of ["description", "source"] as const) {
    if (spec[f] !== undefined && typeof spec[f] !== "string") throw new InputError(`${fieldPath}.${f}: expected a string`);
  }
  const kind = kinds[0]!;
  const description = (spec.description as string | undefined) ?? `user material (${kind})`;
  const kConst = spec.k === undefined ? 0 : finite(spec.k, `${fieldPath}.k`, "k ≥ 0");
  if (kConst < 0) throw new InputError(`${fieldPath}.k: expected k ≥ 0, got ${kConst}`);
  if (spec.k !== undefined && (kind === "csv" || kind === "constant")) {
    throw new InputError(`${fieldPath}.k: a constant k goes with cauchy or sellmeier only`);
  }

  if (kind === "csv") {
    const file = spec.csv;
    if (typeof file !== "string" || file === "") throw new InputError(`${fieldPath}.csv: expected a file path`);
    if (spec.validNm !== undefined) throw new InputError(`${fieldPath}.validNm: a CSV material's range is its table's range`);
    const path = isAbsolute(file) ? file : resolve(baseDir, file);
    const t = readNkCsvFile(path, file);
    if (t.n === null) throw new InputError(`${file}: header has no n column (expected "wavelength_nm,n,k" or "wavelength_nm,n")`);
    const n = tableCurve(t.wavelengthNm, t.n, "linear");
    const k = t.k ? tableCurve(t.wavelengthNm, t.k, "logPositive") : constantCurve(0, n.minNm, n.maxNm);
    const source = (spec.source as string | undefined) ?? `user file ${file}`;
    return new ComposedMaterial({ name, description, source, shortSource: file, kind: "table" }, () => ({ n, k }));
  }

  if (kind === "constant") {
    const c = spec.constant;
    if (!isRecord(c)) throw new InputError(`${fieldPath}.constant: expected { "n": number, "k": number }`);
    const n = finite(c.n, `${fieldPath}.constant.n`, "n > 0");
    const k = c.k === undefined ? 0 : finite(c.k, `${fieldPath}.constant.k`, "k ≥ 0");
    if (!(n > 0)) throw new InputError(`${fieldPath}.constant.n: expected n > 0, got ${n}`);
    if (k < 0) throw new InputError(`${fieldPath}.constant.k: expected k ≥ 0, got ${k}`);
    const [lo, hi] = spec.validNm === undefined ? DEFAULT_CONSTANT_RANGE_NM : validRange(spec.validNm, `${fieldPath}.validNm`);
    const source = (spec.source as string | undefined) ?? "study file (constant)";
    return new ComposedMaterial({ name, description, source, shortSource: "constant", kind: "constant" }, () => ({
      n: constantCurve(n, lo, hi),
      k: constantCurve(k, lo, hi),
    }));
  }

  if (spec.validNm === undefined) throw new InputError(`${fieldPath}.validNm: required for a ${kind} material ([minNm, maxNm])`);
  const [lo, hi] = validRange(spec.validNm, `${fieldPath}.validNm`);
  let fn: (w: number) => number;
  if (kind === "cauchy") {
    const c = spec.cauchy;
    if (!isRecord(c)) throw new InputError(`${fieldPath}.cauchy: expected { "A": number, "B": nm², "C": nm⁴ }`);
    for (const key of Object.keys(c)) if (!["A", "B", "C"].includes(key)) throw new InputError(`${fieldPath}.cauchy.${key}: unknown field (allowed: A, B, C)`);
    const A = finite(c.A, `${fieldPath}.cauchy.A`, "a number");
    const B = c.B === undefined ? 0 : finite(c.B, `${fieldPath}.cauchy.B`, "a number (nm²)");
    const C = c.C === undefined ? 0 : finite(c.C, `${fieldPath}.cauchy.C`, "a number (nm⁴)");
    fn = (w) => cauchyIndex(w, A, B, C);
  } else {
    const s = spec.sellmeier;
    if (!isRecord(s)) throw new InputError(`${fieldPath}.sellmeier: expected { "B": [..], "CUm2": [..] }`);
    for (const key of Object.keys(s)) if (!["B", "CUm2", "A"].includes(key)) throw new InputError(`${fieldPath}.sellmeier.${key}: unknown field (allowed: B, CUm2, A)`);
    const B = numberArray(s.B, `${fieldPath}.sellmeier.B`);
    const C = numberArray(s.CUm2, `${fieldPath}.sellmeier.CUm2`);
    if (B.length !== C.length) throw new InputError(`${fieldPath}.sellmeier: B has ${B.length} terms, CUm2 has ${C.length}`);
    const A = s.A === undefined ? 0 : finite(s.A, `${fieldPath}.sellmeier.A`, "a number");
    fn = (w) => sellmeierIndex(w, B, C, A);
  }
  // The formula must give a real n > 0 over its whole stated range (catches a resonance inside it).
  for (let i = 0; i <= 200; i++) {
    const w = lo + ((hi - lo) * i) / 200;
    const n = fn(w);
    if (!(Number.isFinite(n) && n > 0)) {
      throw new InputError(`${fieldPath}: ${kind} formula of "${name}" gives n = ${n} at ${w} nm inside validNm [${lo}, ${hi}]`);
    }
  }
  const source = (spec.source as string | undefined) ?? `study file (${kind} formula)`;
  return new ComposedMaterial({ name, description, source, shortSource: kind, kind: "formula" }, () => ({
    n: formulaCurve(fn, lo, hi),
    k: constantCurve(kConst, lo, hi),
  }));
}

/** Adds every entry of a study's "materials" array to the registry (override only where the entry asks). */
export function registerStudyMaterials(registry: MaterialRegistry, specs: unknown, baseDir: string, fieldPath = "materials"): void {
  if (specs === undefined) return;
  if (!Array.isArray(specs)) throw new InputError(`${fieldPath}: expected an array of material entries`);
  specs.forEach((spec, i) => {
    const path = `${fieldPath}[${i}]`;
    const m = materialFromSpec(spec, baseDir, path);
    const override = isRecord(spec) && spec.override === true;
    try {
      registry.add(m, { override });
    } catch (err) {
      if (err instanceof InputError) throw new InputError(`${path}: ${err.message}`, err.hint);
      throw err;
    }
  });
}
