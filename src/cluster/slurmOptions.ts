import { InputError } from "../util/errors.js";

/** Resource requests and pass-through options for one generated batch job set. */
export interface SlurmJobOptions {
  /** Number of shards = array tasks (indices 0..shards-1). */
  shards: number;
  cpusPerTask: number;
  /** Wall-clock limit per array task, in a form sbatch --time accepts. */
  time: string;
  /** Memory per array task (sbatch --mem), e.g. "4G". */
  mem: string;
  /** Wall-clock limit and memory of the merge job. */
  mergeTime: string;
  mergeMem: string;
  jobName: string;
  partition?: string;
  account?: string;
  /** At most this many array tasks at once (the "%M" suffix of --array). */
  maxRunning?: number;
  /** Further sbatch options, one per #SBATCH line, for both jobs. */
  extraSbatch: string[];
}

// sbatch --time forms: "minutes", "minutes:seconds", "hours:minutes:seconds", "days-hours",
// "days-hours:minutes", "days-hours:minutes:seconds" (sbatch(1) manual page, option --time).
const TIME_FORMS = [/^\d+$/, /^\d+:\d{1,2}$/, /^\d+:\d{1,2}:\d{1,2}$/, /^\d+-\d{1,2}$/, /^\d+-\d{1,2}:\d{1,2}$/, /^\d+-\d{1,2}:\d{1,2}:\d{1,2}$/];

/** Checks an sbatch time limit; throws InputError naming the option. */
export function checkSlurmTime(value: string, option: string): string {
  if (!TIME_FORMS.some((re) => re.test(value))) {
    throw new InputError(
      `${option}: expected a Slurm time limit such as 90, 02:00:00 or 1-12:00:00, got "${value}"`,
    );
  }
  return value;
}

/** Checks an sbatch memory size: an integer with an optional K/M/G/T suffix (sbatch(1), --mem). */
export function checkSlurmMemory(value: string, option: string): string {
  if (!/^[1-9]\d*[KMGT]?$/.test(value)) {
    throw new InputError(`${option}: expected a memory size such as 4G or 500M, got "${value}"`);
  }
  return value;
}

/** Parses a whole number in [min, max]; throws InputError naming the option. */
export function parseWholeNumber(value: string, option: string, min: number, max: number): number {
  if (!/^\d+$/.test(value.trim())) throw new InputError(`${option}: expected a whole number, got "${value}"`);
  const n = Number(value.trim());
  if (n < min || n > max) throw new InputError(`${option}: expected a whole number from ${min} to ${max}, got ${n}`);
  return n;
}

/** Checks a job name, partition or account: one word without shell or #SBATCH-breaking characters. */
export function checkSlurmWord(value: string, option: string): string {
  if (!/^[A-Za-z0-9_.+:@-]+$/.test(value)) {
    throw new InputError(`${option}: expected one word of letters, digits and _ . + : @ -, got "${value}"`);
  }
  return value;
}

/** Options the generated scripts set themselves: long names and their one-letter forms. */
const RESERVED_LONG = ["array", "dependency", "output", "error"];
const RESERVED_SHORT = "adoe";
/** sbatch's one-letter options that take no value (so letters after them are further options). */
const SHORT_FLAGS = "hHkOQsvVW";

/**
 * Whether a word sets a reserved option the way sbatch's getopt_long reads it: a long option by
 * any prefix ("--arr=1-4", "--dep"), or a one-letter option, alone, with its value attached
 * ("-a1-100", "-o/tmp/x") or after value-less letters ("-Qo/tmp/x").
 */
export function setsReservedOption(word: string): boolean {
  if (word.startsWith("--")) {
    const name = word.slice(2).split("=")[0]!;
    return name !== "" && RESERVED_LONG.some((r) => r.startsWith(name));
  }
  for (const c of word.slice(1)) {
    if (RESERVED_SHORT.includes(c)) return true;
    if (!SHORT_FLAGS.includes(c)) return false; // the rest is this option's value
  }
  return false;
}

/**
 * Splits pass-through sbatch options ("--qos=low --constraint=skylake") into single options, one per
 * #SBATCH line. Each must start with "-" and may not hold quotes, since sbatch reads #SBATCH lines
 * without a shell.
 */
export function splitExtraSbatch(values: readonly string[], option: string): string[] {
  const out: string[] = [];
  for (const value of values) {
    for (const word of value.trim().split(/\s+/)) {
      if (word === "") continue;
      if (!word.startsWith("-")) throw new InputError(`${option}: expected sbatch options starting with "-", got "${word}"`);
      if (/["'`$\\]/.test(word)) throw new InputError(`${option}: "${word}" holds a quote, $ or backslash, which #SBATCH lines cannot carry`);
      if (setsReservedOption(word)) {
        throw new InputError(`${option}: "${word}" is set by the generated scripts themselves; use the matching lightfold option`);
      }
      out.push(word);
    }
  }
  return out;
}
