import { InputError } from "../util/errors.js";

/** Most worker threads a run may ask for (a pool far beyond the cores only costs memory). */
export const MAX_WORKERS = 256;

/**
 * A whole-number flag written in plain decimal digits (so "1e3", "0x2", "2.0" and " 2" are refused
 * rather than read as numbers), within [min, max].
 */
export function countFlag(text: string, flag: string, min: number, max: number, hint?: string): number {
  const n = /^\d{1,16}$/.test(text) ? Number(text) : NaN;
  if (!(Number.isSafeInteger(n) && n >= min && n <= max)) {
    throw new InputError(`${flag}: expected a whole number from ${min} to ${max} in decimal digits, got ${JSON.stringify(text)}`, hint);
  }
  return n;
}
