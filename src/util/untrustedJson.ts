import { InputError } from "./errors.js";

/**
 * Checks for values read back from a file lightfold wrote (matrix, shard output, journal) but which
 * anyone could have edited: each names the file and the field path and what was expected.
 */
export type Where = { file: string; path: string };

export function at(w: Where, key: string | number): Where {
  return { file: w.file, path: typeof key === "number" ? `${w.path}[${key}]` : w.path === "" ? key : `${w.path}.${key}` };
}

function shown(raw: unknown): string {
  if (raw === undefined) return "nothing";
  if (typeof raw === "string") return JSON.stringify(raw.length > 40 ? `${raw.slice(0, 40)}…` : raw);
  if (Array.isArray(raw)) return "a list";
  if (raw === null) return "null";
  if (typeof raw === "object") return "an object";
  return String(raw);
}

export function refuse(w: Where, expected: string, raw?: unknown): never {
  const got = arguments.length >= 3 ? `, got ${shown(raw)}` : "";
  throw new InputError(`${w.file}: ${w.path === "" ? "" : `${w.path}: `}expected ${expected}${got}`);
}

export function obj(raw: unknown, w: Where): Record<string, unknown> {
  if (raw === null || typeof raw !== "object" || Array.isArray(raw)) refuse(w, "an object", raw);
  return raw as Record<string, unknown>;
}

export function str(raw: unknown, w: Where, maxLength = 10_000): string {
  if (typeof raw !== "string" || raw.length > maxLength) refuse(w, `a string of at most ${maxLength} characters`, raw);
  return raw;
}

export function num(raw: unknown, w: Where, min = -Number.MAX_VALUE, max = Number.MAX_VALUE): number {
  if (typeof raw !== "number" || !Number.isFinite(raw) || raw < min || raw > max) refuse(w, `a finite number in [${min}, ${max}]`, raw);
  return raw;
}

export function int(raw: unknown, w: Where, min: number, max: number): number {
  if (typeof raw !== "number" || !Number.isInteger(raw) || raw < min || raw > max) refuse(w, `an integer in [${min}, ${max}]`, raw);
  return raw;
}

export function oneOf<T extends string>(raw: unknown, w: Where, allowed: readonly T[]): T {
  if (typeof raw !== "string" || !(allowed as readonly string[]).includes(raw)) refuse(w, `one of ${allowed.map((a) => JSON.stringify(a)).join(", ")}`, raw);
  return raw as T;
}

export interface ArrayRule {
  length?: number;
  min?: number;
  max?: number;
  increasing?: boolean;
  integer?: boolean;
  nonEmpty?: boolean;
}

/** A list of finite numbers with the given length, range, order and integrality. */
export function numbers(raw: unknown, w: Where, rule: ArrayRule = {}): number[] {
  if (!Array.isArray(raw)) refuse(w, rule.length !== undefined ? `a list of ${rule.length} numbers` : "a list of numbers", raw);
  if (rule.length !== undefined && raw.length !== rule.length) refuse(w, `a list of ${rule.length} numbers, got ${raw.length}`);
  if (rule.nonEmpty === true && raw.length === 0) refuse(w, "a non-empty list of numbers", raw);
  const min = rule.min ?? -Number.MAX_VALUE, max = rule.max ?? Number.MAX_VALUE;
  for (let i = 0; i < raw.length; i++) {
    const v: unknown = raw[i];
    if (typeof v !== "number" || !Number.isFinite(v) || v < min || v > max || (rule.integer === true && !Number.isInteger(v))) {
      refuse(at(w, i), `${rule.integer === true ? "an integer" : "a finite number"} in [${min}, ${max}]`, v);
    }
    if (rule.increasing === true && i > 0 && !(v > (raw[i - 1] as number))) refuse(at(w, i), `values in increasing order, ${v} after ${String(raw[i - 1])}`);
  }
  return raw as number[];
}

/** A list of distinct non-empty strings. */
export function names(raw: unknown, w: Where, maxLength = 200): string[] {
  if (!Array.isArray(raw) || raw.length === 0) refuse(w, "a non-empty list of names", raw);
  const seen = new Set<string>();
  raw.forEach((v, i) => {
    if (typeof v !== "string" || v === "" || v.length > maxLength) refuse(at(w, i), `a non-empty name of at most ${maxLength} characters`, v);
    if (seen.has(v)) refuse(at(w, i), `distinct names, ${JSON.stringify(v)} appears twice`);
    seen.add(v);
  });
  return raw as string[];
}
