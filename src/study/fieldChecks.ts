import { nearestWord } from "../util/didYouMean.js";
import { InputError } from "../util/errors.js";

/** A parsed JSON object of a study file. */
export type RawObject = Record<string, unknown>;

/** Short description of a raw JSON value for error messages ("a list", "-5", "\"abc\""). */
export function describeValue(raw: unknown): string {
  if (raw === undefined) return "nothing";
  if (typeof raw === "string") return JSON.stringify(raw);
  if (Array.isArray(raw)) return "a list";
  if (raw === null) return "null";
  if (typeof raw === "object") return "an object";
  return String(raw);
}

export function expectObject(raw: unknown, path: string): RawObject {
  if (raw === null || typeof raw !== "object" || Array.isArray(raw)) {
    throw new InputError(`${path}: expected an object, got ${describeValue(raw)}`);
  }
  return raw as RawObject;
}

export function requireField(o: RawObject, key: string, path: string): unknown {
  if (o[key] === undefined) throw new InputError(`${join(path, key)}: required field is missing`);
  return o[key];
}

/** Rejects any key not in `allowed`, with a did-you-mean hint from edit distance. */
export function rejectUnknownFields(o: RawObject, path: string, allowed: readonly string[]): void {
  for (const key of Object.keys(o)) {
    if (!allowed.includes(key)) {
      const near = nearestWord(key, allowed);
      throw new InputError(
        `${join(path, key)}: unknown field`,
        near !== undefined ? `did you mean "${near}"?` : `allowed fields: ${allowed.join(", ") || "(none)"}`,
      );
    }
  }
}

export function expectNumber(raw: unknown, path: string): number {
  if (typeof raw !== "number" || !Number.isFinite(raw)) {
    throw new InputError(`${path}: expected a number, got ${describeValue(raw)}`);
  }
  return raw;
}

export function expectPositive(raw: unknown, path: string): number {
  if (typeof raw !== "number" || !Number.isFinite(raw) || raw <= 0) {
    throw new InputError(`${path}: expected a positive number, got ${describeValue(raw)}`);
  }
  return raw;
}

export function expectInteger(raw: unknown, path: string, min: number, max: number): number {
  if (typeof raw !== "number" || !Number.isInteger(raw) || raw < min || raw > max) {
    throw new InputError(`${path}: expected an integer in [${min}, ${max}], got ${describeValue(raw)}`);
  }
  return raw;
}

export function expectString(raw: unknown, path: string): string {
  if (typeof raw !== "string" || raw === "") {
    throw new InputError(`${path}: expected a non-empty string, got ${describeValue(raw)}`);
  }
  return raw;
}

export function expectOneOf<T extends string>(raw: unknown, path: string, allowed: readonly T[]): T {
  if (typeof raw !== "string" || !(allowed as readonly string[]).includes(raw)) {
    const near = typeof raw === "string" ? nearestWord(raw, allowed) : undefined;
    throw new InputError(
      `${path}: expected one of ${allowed.map((a) => JSON.stringify(a)).join(", ")}, got ${describeValue(raw)}`,
      near !== undefined ? `did you mean "${near}"?` : undefined,
    );
  }
  return raw as T;
}

function join(path: string, key: string): string {
  return path === "" ? key : `${path}.${key}`;
}
