/**
 * Flags of the rear-light model for `yield`: the rear-lit matrix, module height and width, and the
 * row pitch (or ground-coverage ratio) as a list or range; each value checked with the flag named.
 */
import type { Command } from "commander";
import { InputError } from "../util/errors.js";

export interface MountFlags {
  rearMatrix?: string;
  height: string;
  moduleWidth: string;
  pitch?: string;
  gcr?: string;
}

export function addMountOptions(cmd: Command, opts: { rearMatrixRepeatable?: (v: string, prev?: string[]) => string[] } = {}): Command {
  const rear = opts.rearMatrixRepeatable
    ? cmd.option("--rear-matrix <matrix.json>", "give twice: the rear-lit matrices of A then B (\"illumination\": \"both\"): compares front + rear charge", opts.rearMatrixRepeatable)
    : cmd.option("--rear-matrix <matrix.json>", "the same stack traced with light from the rear (\"illumination\": \"both\"): adds rear and total charge and the bifacial gain");
  return rear
    .option("--height <m>", "height of the module centre above the ground, m (with --rear-matrix)", "1.0")
    .option("--module-width <m>", "module width across the row (slant length), m (with --rear-matrix)", "2.0")
    .option("--pitch <m|list|from:to:step>", "row pitch(es), m (with --rear-matrix; omit both --pitch and --gcr for an isolated row)")
    .option("--gcr <ratio|list|from:to:step>", "ground-coverage ratio(s) = module width / pitch, in (0, 1]");
}

/** "2", "2,3.5" or "3:9:1.5"; every value must be finite (the caller checks ranges). */
function numberList(text: string, flag: string): number[] {
  const s = text.trim();
  const range = /^([-+\d.eE]+):([-+\d.eE]+):([-+\d.eE]+)$/.exec(s);
  if (range) {
    const [from, to, step] = [Number(range[1]), Number(range[2]), Number(range[3])];
    if (!(step > 0) || !(to >= from)) throw new InputError(`${flag} "${text}": a range is from:to:step with step > 0 and to ≥ from`);
    const n = Math.floor((to - from) / step + 1e-9) + 1;
    if (n > 200) throw new InputError(`${flag} "${text}": more than 200 values`);
    return Array.from({ length: n }, (_, i) => Math.round((from + i * step) * 1e9) / 1e9);
  }
  return s.split(",").map((p) => {
    const v = p.trim() === "" ? NaN : Number(p);
    if (!Number.isFinite(v)) throw new InputError(`${flag} "${text}": "${p}" is not a number (expected e.g. 5, 4,6,8 or 3:9:1)`);
    return v;
  });
}

function positive(text: string, flag: string, what: string): number {
  const v = Number(text);
  if (!Number.isFinite(v) || v <= 0) throw new InputError(`${flag}: expected a positive number (${what}), got "${text}"`, `e.g. ${flag} 1.5`);
  return v;
}

/** The mounting: module size and height, and the pitches to try (null = isolated row). */
export function mountOf(f: Omit<MountFlags, "rearMatrix">): { slantLengthM: number; centreHeightM: number; pitchesM: (number | null)[] } {
  const centreHeightM = positive(f.height, "--height", "module centre above the ground, m");
  const slantLengthM = positive(f.moduleWidth, "--module-width", "module width across the row, m");
  if (f.pitch !== undefined && f.gcr !== undefined) throw new InputError("give --pitch or --gcr, not both");
  let pitchesM: (number | null)[] = [null];
  if (f.pitch !== undefined) {
    pitchesM = numberList(f.pitch, "--pitch").map((p) => {
      if (!(p > 0)) throw new InputError(`--pitch: ${p} m must be positive (horizontal distance between rows)`);
      return p;
    });
  }
  if (f.gcr !== undefined) {
    pitchesM = numberList(f.gcr, "--gcr").map((g) => {
      if (!(g > 0 && g <= 1)) throw new InputError(`--gcr: ${g} is outside (0, 1] (module width / pitch)`);
      return slantLengthM / g;
    });
  }
  return { slantLengthM, centreHeightM, pitchesM };
}
