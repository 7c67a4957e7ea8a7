/**
 * Flags shared by the verbs that integrate a response matrix over a year (`yield`, `compare`):
 * weather year and seed, the module planes, the sky model, the counted channel, and where the result
 * JSON goes (file, run folder + report, stdout). One definition, so both verbs parse them alike.
 */
import { join } from "node:path";
import type { Command } from "commander";
import { makeReport } from "../report/makeReport.js";
import { SKY_MODELS, type SkyModel } from "../sky/transposition.js";
import { writeFileAtomic } from "../util/atomicWrite.js";
import { InputError } from "../util/errors.js";
import { parseAngleList } from "../yield/angleList.js";
import { planeList } from "../yield/yieldRun.js";
import type { Plane } from "../site/site.js";
import { intOption } from "./commands/weather.js";

export interface YearPlaneFlags {
  year: string;
  seed: string;
  tilt: string;
  azimuth: string;
  textureRotation: string;
  sky: string;
  channel: string;
}

export interface ResultFlags {
  out?: string;
  runDir?: string;
  report?: boolean;
  json?: boolean;
}

/** --year, --seed, --tilt, --azimuth, --texture-rotation, --sky, --channel. */
export function addYearPlaneOptions(cmd: Command, defaults: { tilt: string }): Command {
  return cmd
    .option("--year <year>", "year of the synthetic weather", "2027")
    .option("--seed <n>", "seed of the synthetic weather", "7")
    .option("--tilt <deg|list|from:to:step>", "tilt(s), 0 = facing up, 90 = vertical (e.g. 30, 20,35 or 0:90:5)", defaults.tilt)
    .option("--azimuth <deg|list|from:to:step>", "facing direction from north, clockwise (180 = south)", "180")
    .option("--texture-rotation <deg>", "rotation of the texture's φ = 0 axis from the up-slope direction", "0")
    .option("--sky <model>", `diffuse sky model: ${SKY_MODELS.join(", ")}`, "perez")
    .option("--channel <name>", "response channel that counts as current", "A_absorber");
}

/** --out, --no-report, --run-dir (writing <dir>/yield/<runDirFile>), --json. */
export function addResultOptions(cmd: Command, runDirFile: string, what: string): Command {
  return cmd
    .option("--out <file.json>", `write the ${what} JSON to this file`)
    .option("--no-report", "with --run-dir: do not refresh <dir>/report/index.html")
    .option("--run-dir <dir>", `write the ${what} JSON to <dir>/yield/${runDirFile} (for \`lightfold report\`)`)
    .option("--json", `print the ${what} JSON instead of the table`);
}

export function skyModelOption(text: string): SkyModel {
  if ((SKY_MODELS as readonly string[]).includes(text)) return text as SkyModel;
  throw new InputError(`--sky: expected one of ${SKY_MODELS.join(", ")}, got "${text}"`, "e.g. --sky perez (the default) or --sky isotropic");
}

export function textureRotationOption(text: string): number {
  const v = Number(text);
  if (!Number.isFinite(v)) throw new InputError(`--texture-rotation: expected degrees, got "${text}"`, "e.g. --texture-rotation 45");
  return v;
}

/** The parsed year/plane/sky flags (every value checked before any work starts). */
export function yearPlaneOf(flags: YearPlaneFlags): { year: number; seed: number; planes: Plane[]; sky: SkyModel } {
  return {
    year: intOption(flags.year, "--year", 2027),
    seed: intOption(flags.seed, "--seed", 7),
    planes: planeList(
      parseAngleList(flags.tilt, "--tilt", 0, 180, "0 = facing up, 90 = vertical, 180 = facing down"),
      parseAngleList(flags.azimuth, "--azimuth", 0, 360, "degrees from north, clockwise"),
      textureRotationOption(flags.textureRotation),
    ),
    sky: skyModelOption(flags.sky),
  };
}

/**
 * Writes the result JSON where the flags ask (atomically) and refreshes the run folder's report;
 * returns the report's path when one was written.
 */
export function writeResult(flags: ResultFlags, runDirFile: string, text: string): string | undefined {
  if (flags.out) writeFileAtomic(flags.out, text);
  if (!flags.runDir) return undefined;
  writeFileAtomic(join(flags.runDir, "yield", runDirFile), text);
  return flags.report !== false ? makeReport([flags.runDir]).indexPath : undefined;
}
