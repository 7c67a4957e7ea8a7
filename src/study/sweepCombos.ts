import { InputError } from "../util/errors.js";
import { nearestWord } from "../util/didYouMean.js";

/** Parameter sweep: field path relative to "stack" (e.g. "front.films[0].thicknessNm") -> values. */
export type SweepSpec = Record<string, number[]>;

type RawObject = Record<string, unknown>;

const MAX_COMBOS = 10_000;

/**
 * Resolves the "sweep" section (the schema has checked each list: non-empty, numbers, no repeats).
 * Paths may start with "stack."; the same field may not be swept twice; at most 10,000 combinations.
 */
export function parseSweep(o: Record<string, number[]>, path: string): SweepSpec {
  const spec: SweepSpec = {};
  let nCombos = 1;
  for (const [key, values] of Object.entries(o)) {
    const p = `${path}["${key}"]`;
    const field = key.startsWith("stack.") ? key.slice("stack.".length) : key;
    parseFieldPath(field, p);
    if (spec[field] !== undefined) throw new InputError(`${p}: the field is swept twice`);
    spec[field] = [...values];
    nCombos *= values.length;
  }
  if (nCombos > MAX_COMBOS) throw new InputError(`${path}: ${nCombos} combinations, more than ${MAX_COMBOS}`);
  return spec;
}

/** Segments of "a.b[2].c" -> ["a", "b", 2, "c"]. */
export function parseFieldPath(field: string, errPath: string): (string | number)[] {
  const segs: (string | number)[] = [];
  const re = /^([A-Za-z_][A-Za-z0-9_]*)((?:\[\d+\])*)$/;
  for (const part of field.split(".")) {
    const m = re.exec(part);
    if (m === null) {
      throw new InputError(`${errPath}: "${field}" is not a field path (expected names and [index], e.g. "front.films[0].thicknessNm")`);
    }
    segs.push(m[1]);
    for (const idx of m[2].matchAll(/\[(\d+)\]/g)) segs.push(Number(idx[1]));
  }
  return segs;
}

/** Every combination in order (first swept field varies slowest). */
export function sweepCombinations(spec: SweepSpec): Record<string, number>[] {
  let combos: Record<string, number>[] = [{}];
  for (const [field, values] of Object.entries(spec)) {
    const next: Record<string, number>[] = [];
    for (const c of combos) for (const v of values) next.push({ ...c, [field]: v });
    combos = next;
  }
  return combos;
}

/**
 * A deep copy of the raw stack with the combination's values written at their paths. Every segment
 * before the last must exist; a missing last field is added (the stack validator then rejects it
 * if it is not a field of that object).
 */
export function substituteCombo(rawStack: unknown, values: Record<string, number>, sweepPath: string): unknown {
  const copy = structuredClone(rawStack) as unknown;
  for (const [field, value] of Object.entries(values)) {
    const errPath = `${sweepPath}["${field}"]`;
    const segs = parseFieldPath(field, errPath);
    let node: unknown = copy;
    let where = "stack";
    for (let i = 0; i < segs.length; i++) {
      const seg = segs[i];
      const last = i === segs.length - 1;
      if (typeof seg === "number") {
        if (!Array.isArray(node) || seg >= node.length) {
          const len = Array.isArray(node) ? node.length : 0;
          throw new InputError(`${errPath}: ${where} has no entry [${seg}] (it has ${len})`);
        }
        if (last) node[seg] = value;
        else node = node[seg];
        where = `${where}[${seg}]`;
      } else {
        if (node === null || typeof node !== "object" || Array.isArray(node)) {
          throw new InputError(`${errPath}: ${where} is not an object, so it has no field "${seg}"`);
        }
        const o = node as RawObject;
        if (last) {
          o[seg] = value;
        } else {
          if (o[seg] === undefined) {
            const near = nearestWord(seg, Object.keys(o));
            throw new InputError(`${errPath}: ${where} has no field "${seg}"`, near !== undefined ? `did you mean "${near}"?` : undefined);
          }
          node = o[seg];
        }
        where = `${where}.${seg}`;
      }
    }
  }
  return copy;
}
