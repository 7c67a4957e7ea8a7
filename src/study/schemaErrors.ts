import type { ErrorObject } from "ajv/dist/2020.js";
import { nearestWord } from "../util/didYouMean.js";
import { InputError } from "../util/errors.js";

type Schema = Record<string, unknown>;

/** Short description of a raw JSON value for error messages ("a list", "-5", "\"abc\""). */
export function describeValue(raw: unknown): string {
  if (raw === undefined) return "nothing";
  if (typeof raw === "string") return JSON.stringify(raw);
  if (Array.isArray(raw)) return "a list";
  if (raw === null) return "null";
  if (typeof raw === "object") return "an object";
  return String(raw);
}

/** JSON pointer "/stack/front/films/0/thicknessNm" of `doc` → field path "stack.front.films[0].thicknessNm". */
export function fieldPathOf(pointer: string, doc: unknown, prefix: string): string {
  let path = prefix;
  let node: unknown = doc;
  for (const raw of pointer.split("/").slice(1)) {
    const seg = raw.replace(/~1/g, "/").replace(/~0/g, "~");
    if (Array.isArray(node)) {
      path += `[${seg}]`;
      node = node[Number(seg)];
      continue;
    }
    path = joinKey(path, seg);
    node = node !== null && typeof node === "object" ? (node as Record<string, unknown>)[seg] : undefined;
  }
  return path;
}

/** path + key: "a.b" for plain names, a["x.y"] for keys that are not (sweep paths). */
function joinKey(path: string, key: string): string {
  if (!/^[A-Za-z_$][A-Za-z0-9_$]*$/.test(key)) return `${path}[${JSON.stringify(key)}]`;
  return path === "" ? key : `${path}.${key}`;
}

const fmt = (v: unknown): string => String(v);

/** What a number field expects, from its schema: "a positive number", "an integer in [1, 10000]"… */
export function expectation(s: Schema): string {
  const type = s.type;
  if (type === "string") {
    if (typeof s.pattern === "string") return `text matching ${s.pattern}${s.description ? ` (${String(s.description)})` : ""}`;
    return s.minLength === 1 ? "a non-empty string" : "a string";
  }
  if (type === "boolean") return "true or false";
  if (type === "object") return "an object";
  if (type === "array") return s.minItems === s.maxItems && s.minItems !== undefined ? `a list of ${fmt(s.minItems)} entries` : s.minItems === 1 ? "a non-empty list" : "a list";
  const base = type === "integer" ? "an integer" : "a number";
  const lo = s.minimum !== undefined ? `[${fmt(s.minimum)}` : s.exclusiveMinimum !== undefined ? `(${fmt(s.exclusiveMinimum)}` : null;
  const hi = s.maximum !== undefined ? `${fmt(s.maximum)}]` : s.exclusiveMaximum !== undefined ? `${fmt(s.exclusiveMaximum)})` : null;
  if (lo !== null && hi !== null) return `${base} in ${lo}, ${hi}`;
  if (s.exclusiveMinimum === 0) return type === "integer" ? "a positive integer" : "a positive number";
  if (lo !== null) return `${base} ${lo[0] === "[" ? "≥" : ">"} ${lo.slice(1)}`;
  if (hi !== null) return `${base} ${hi.endsWith("]") ? "≤" : "<"} ${hi.slice(0, -1)}`;
  return base;
}

const PRIORITY: Record<string, number> = { additionalProperties: 0, required: 1 };

/**
 * The one InputError a user sees for a failed schema check: unknown fields first (a typo is the
 * likeliest cause of a later "missing" field), then missing fields, then the first other problem,
 * in schema order. Messages read "<field path>: expected …, got …" with did-you-mean hints.
 */
export function schemaInputError(errors: readonly ErrorObject[], doc: unknown, prefix: string): InputError {
  const relevant = errors.filter((e) => e.keyword !== "if" && e.keyword !== "propertyNames");
  const sorted = [...relevant].sort((a, b) => (PRIORITY[a.keyword] ?? 2) - (PRIORITY[b.keyword] ?? 2));
  const e = sorted[0] ?? errors[0]!;
  const path = fieldPathOf(e.instancePath, doc, prefix);
  const where = path === "" ? "(study)" : path;
  const parent = (e.parentSchema ?? {}) as Schema;
  const p = e.params as Record<string, unknown>;
  const got = describeValue(e.data);
  if (e.propertyName !== undefined) {
    const key = e.propertyName;
    return new InputError(`${joinKey(where, key)}: "${key}" is not a field path (expected names and [index], e.g. "front.films[0].thicknessNm")`);
  }
  switch (e.keyword) {
    case "additionalProperties": {
      const key = String(p.additionalProperty);
      const allowed = Object.keys((parent.properties ?? {}) as Schema);
      const near = nearestWord(key, allowed);
      return new InputError(
        `${joinKey(path, key)}: unknown field`,
        near !== undefined ? `did you mean "${near}"?` : `allowed fields: ${allowed.join(", ") || "(none)"}`,
      );
    }
    case "required":
      return new InputError(`${joinKey(path, String(p.missingProperty))}: required field is missing`);
    case "enum":
    case "const": {
      const allowed = (e.keyword === "enum" ? p.allowedValues : [p.allowedValue]) as unknown[];
      const near = typeof e.data === "string" ? nearestWord(e.data, allowed.map(String)) : undefined;
      return new InputError(
        `${where}: expected ${allowed.length === 1 ? "" : "one of "}${allowed.map((a) => JSON.stringify(a)).join(", ")}, got ${got}`,
        near !== undefined ? `did you mean "${near}"?` : undefined,
      );
    }
    case "uniqueItems":
      return new InputError(`${where}: a value is listed twice (entries ${Math.min(Number(p.i), Number(p.j))} and ${Math.max(Number(p.i), Number(p.j))})`);
    case "minItems":
    case "maxItems":
      return new InputError(`${where}: expected ${expectation(parent)}, got ${Array.isArray(e.data) ? `${e.data.length} entries` : got}`);
    default:
      return new InputError(`${where}: expected ${expectation(parent)}, got ${got}`);
  }
}
