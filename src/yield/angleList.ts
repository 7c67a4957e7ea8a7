import { InputError } from "../util/errors.js";

/**
 * Parses an angle list flag: "30", "20,35,50" or a range "from:to:step" ("0:90:5" = 19 values).
 * Values are checked against [lo, hi]; `flag` names the option in errors.
 */
export function parseAngleList(text: string, flag: string, lo: number, hi: number, what: string): number[] {
  const s = text.trim();
  let values: number[];
  const parts = s.split(":");
  if (parts.length === 3) {
    const [from, to, step] = parts.map((p) => (p.trim() === "" ? NaN : Number(p)));
    if (![from, to, step].every((v) => Number.isFinite(v))) {
      throw new InputError(`${flag} "${text}": a range is from:to:step of three numbers (e.g. 0:90:5)`);
    }
    if (!(step! > 0) || !(to! >= from!)) throw new InputError(`${flag} "${text}": a range is from:to:step with step > 0 and to ≥ from, got step ${step} and to ${to} after from ${from}`);
    const n = Math.floor((to! - from!) / step! + 1e-9) + 1;
    if (n > 1000) throw new InputError(`${flag} "${text}": more than 1000 values`);
    values = Array.from({ length: n }, (_, i) => Math.round((from! + i * step!) * 1e9) / 1e9);
  } else {
    values = s.split(",").map((p) => {
      const v = p.trim() === "" ? NaN : Number(p);
      if (!Number.isFinite(v)) throw new InputError(`${flag} "${text}": "${p}" is not a number (expected e.g. 30, 20,35 or 0:90:5)`);
      return v;
    });
  }
  for (const v of values) {
    if (v < lo || v > hi) throw new InputError(`${flag}: ${v}° is outside ${lo}–${hi}° (${what})`);
  }
  return values;
}
