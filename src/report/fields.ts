/** Checked field access for the JSON files the report reads; errors name the file and field path. */
import { InputError } from "../util/errors.js";
import { parseJsonInput } from "../util/inputFile.js";

export type Json = Record<string, unknown>;

export function parseJson(text: string, source: string): Json {
  const v = parseJsonInput(text, source);
  if (v === null || typeof v !== "object" || Array.isArray(v)) throw new InputError(`${source}: expected a JSON object at the top level`);
  return v as Json;
}

function bad(source: string, path: string, expected: string, got: unknown): InputError {
  const shown = got === undefined ? "nothing" : JSON.stringify(got)?.slice(0, 40);
  return new InputError(`${source}: field "${path}" must be ${expected} (found ${shown})`);
}

export function numberAt(o: Json, key: string, source: string, path = key): number {
  const v = o[key];
  if (typeof v !== "number" || !Number.isFinite(v)) throw bad(source, path, "a finite number", v);
  return v;
}

export function optNumberAt(o: Json, key: string, source: string, path = key): number | undefined {
  return o[key] === undefined || o[key] === null ? undefined : numberAt(o, key, source, path);
}

export function stringAt(o: Json, key: string, source: string, path = key): string {
  const v = o[key];
  if (typeof v !== "string") throw bad(source, path, "a string", v);
  return v;
}

export function objectAt(o: Json, key: string, source: string, path = key): Json {
  const v = o[key];
  if (v === null || typeof v !== "object" || Array.isArray(v)) throw bad(source, path, "an object", v);
  return v as Json;
}

export function arrayAt(o: Json, key: string, source: string, path = key): unknown[] {
  const v = o[key];
  if (!Array.isArray(v)) throw bad(source, path, "an array", v);
  return v;
}

export function numberArrayAt(o: Json, key: string, source: string, path = key, length?: number): number[] {
  const a = arrayAt(o, key, source, path);
  a.forEach((x, i) => {
    if (typeof x !== "number" || !Number.isFinite(x)) throw bad(source, `${path}[${i}]`, "a finite number", x);
  });
  if (length !== undefined && a.length !== length) throw new InputError(`${source}: field "${path}" must hold ${length} numbers (has ${a.length})`);
  return a as number[];
}

/** Elements of an array field that are objects, with their field paths. */
export function objectsAt(o: Json, key: string, source: string, path = key): { item: Json; path: string }[] {
  return arrayAt(o, key, source, path).map((x, i) => {
    if (x === null || typeof x !== "object" || Array.isArray(x)) throw bad(source, `${path}[${i}]`, "an object", x);
    return { item: x as Json, path: `${path}[${i}]` };
  });
}
