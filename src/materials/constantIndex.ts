import { InputError } from "../util/errors.js";
import { ComposedMaterial } from "./composedMaterial.js";
import { constantCurve } from "./curve.js";
import { DEFAULT_CONSTANT_RANGE_NM } from "./spec.js";
import type { CatalogMaterial } from "./types.js";

const NUM = "(\\d+(?:\\.\\d*)?|\\.\\d+)(?:[eE][+-]?\\d+)?";
/** "2.0", "n=2.0", "2.05+0.01i", "n=2.05+0.01i" (N = n + ik, k ≥ 0 absorbing). */
const INDEX = new RegExp(`^(?:n=)?(${NUM})(?:([+-])(${NUM})i)?$`);

/** n and k of a constant index written in a stack ("n=2.05+0.01i"), or null when the text is a name. */
export function parseConstantIndex(text: string): { n: number; k: number } | null {
  const m = INDEX.exec(text.trim());
  if (m === null) return null;
  const n = Number(m[1]);
  const k = m[4] === undefined ? 0 : Number(m[4]) * (m[3] === "-" ? -1 : 1);
  if (!(n > 0)) throw new InputError(`"${text}": a constant index needs n > 0`);
  if (k < 0) throw new InputError(`"${text}": k must be ≥ 0 (an absorbing medium is written n+ki, e.g. 2.05+0.01i)`);
  return { n, k };
}

/** A material of constant N = n + ik over 100 nm–100 µm, named as written. */
export function constantIndexMaterial(text: string, n: number, k: number): CatalogMaterial {
  const [lo, hi] = DEFAULT_CONSTANT_RANGE_NM;
  return new ComposedMaterial(
    { name: text, description: `constant index n = ${n}, k = ${k}`, source: "given on the command line", shortSource: "constant", kind: "constant" },
    () => ({ n: constantCurve(n, lo, hi), k: constantCurve(k, lo, hi) }),
  );
}
