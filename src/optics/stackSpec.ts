import { parseConstantIndex } from "../materials/constantIndex.js";
import { InputError } from "../util/errors.js";

/** A film stack written as text: "air|SiNx:75|Si" (media and films separated by '|'). */
export interface StackSpec {
  /** Semi-infinite incidence medium (material name). */
  incidence: string;
  /** Coherent films, incidence side first. */
  films: { material: string; thicknessNm: number }[];
  /** Semi-infinite exit medium (material name). */
  exit: string;
}

/** Films thicker than this are not coherent thin films (use a thick layer of a study file). */
export const MAX_FILM_THICKNESS_NM = 1e6;

const NAME_RE = /^[A-Za-z][A-Za-z0-9_.+\-]*$/;
const EXPECTED = 'expected "incidence|material:thicknessNm|…|exit", e.g. "air|SiNx:75|Si"';

/**
 * Parses a stack string: first and last entries are semi-infinite media (names only), the entries
 * between are films "material:thicknessNm". `what` names the option for messages (e.g. "--stack").
 */
export function parseStackSpec(text: string, what = "--stack"): StackSpec {
  const parts = text.split("|").map((p) => p.trim());
  if (parts.length < 2) throw new InputError(`${what}: "${text}" has ${parts.length} entry; ${EXPECTED}`);
  const names: string[] = [];
  const films: StackSpec["films"] = [];
  parts.forEach((part, i) => {
    const where = `${what} entry ${i + 1} ("${part}")`;
    if (part === "") throw new InputError(`${where}: empty; ${EXPECTED}`);
    const colon = part.indexOf(":");
    const name = (colon < 0 ? part : part.slice(0, colon)).trim();
    if (!NAME_RE.test(name) && parseConstantIndex(name) === null) {
      throw new InputError(`${where}: "${name}" is neither a material name (letters, digits, _ . + -) nor a constant index (n=2.0, 2.05+0.01i); ${EXPECTED}`);
    }
    const edge = i === 0 || i === parts.length - 1;
    if (edge) {
      if (colon >= 0) {
        throw new InputError(
          `${where}: the ${i === 0 ? "first" : "last"} entry is a semi-infinite medium and takes no thickness; write "${name}"`,
        );
      }
      names.push(name);
      return;
    }
    if (colon < 0) throw new InputError(`${where}: a film needs a thickness in nm, e.g. "${name}:75"`);
    const tText = part.slice(colon + 1).trim();
    const t = Number(tText);
    if (tText === "" || !Number.isFinite(t)) throw new InputError(`${where}: thickness "${tText}" is not a number of nm`);
    if (t < 0) throw new InputError(`${where}: thickness ${t} nm is negative; expected 0 ≤ thickness ≤ ${MAX_FILM_THICKNESS_NM} nm`);
    if (t > MAX_FILM_THICKNESS_NM) {
      throw new InputError(
        `${where}: thickness ${t} nm is beyond ${MAX_FILM_THICKNESS_NM} nm (1 mm); a layer that thick is not a coherent film — use a thick layer in a study file`,
      );
    }
    films.push({ material: name, thicknessNm: t });
  });
  return { incidence: names[0]!, films, exit: names[1]! };
}

/**
 * Parses "600", "400,600,800" or a range "400:1100:50" (from:to:step, both ends included when the
 * step fits) into numbers; `what` names the option, [min, max] the allowed interval.
 */
export function parseNumberSweep(text: string, what: string, min: number, max: number, unit: string): number[] {
  const t = text.trim();
  const bad = (why: string): InputError =>
    new InputError(`${what}: "${text}" ${why}; expected a number, a list "a,b,c" or a range "from:to:step" (${unit})`);
  let values: number[];
  if (t.includes(":")) {
    const p = t.split(":").map((s) => s.trim());
    if (p.length !== 3 || p.some((s) => s === "")) throw bad("is not a range");
    const [from, to, step] = p.map(Number) as [number, number, number];
    if (![from, to, step].every(Number.isFinite)) throw bad("has a part that is not a number");
    if (!(step > 0)) throw bad("needs a positive step");
    if (to < from) throw bad("ends before it starts");
    const n = Math.floor((to - from) / step + 1e-9) + 1;
    if (n > 10000) throw bad(`has ${n} values (at most 10000)`);
    values = Array.from({ length: n }, (_, i) => from + i * step);
  } else {
    values = t.split(",").map((s) => {
      const v = Number(s.trim());
      if (s.trim() === "" || !Number.isFinite(v)) throw bad(`has "${s.trim()}", not a number`);
      return v;
    });
  }
  for (const v of values) {
    if (v < min || v > max) throw new InputError(`${what}: ${v} ${unit} is outside [${min}, ${max}] ${unit}`);
  }
  return values;
}
