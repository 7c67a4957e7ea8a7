import { makeReport } from "../../report/makeReport.js";
import { join } from "node:path";
import type { Command } from "commander";
import { readResponseMatrix } from "../../response/matrixFile.js";
import { readSiteFile } from "../../site/siteFile.js";
import { formatUtcOffset } from "../../site/utcOffset.js";
import { SKY_MODELS, type SkyModel } from "../../sky/transposition.js";
import { writeFileAtomic } from "../../util/atomicWrite.js";
import { InputError } from "../../util/errors.js";
import { toolVersion } from "../../util/version.js";
import { parseAngleList } from "../../yield/angleList.js";
import { yearContext } from "../../yield/yearContext.js";
import { formatYieldTable, hourlyCsv, matrixInfo, yieldJson } from "../../yield/yieldJson.js";
import { bestPlane, planeList, prepareMatrix, yieldSweep } from "../../yield/yieldRun.js";
import { intOption, loadWeather } from "./weather.js";

export function skyModelOption(text: string): SkyModel {
  if ((SKY_MODELS as readonly string[]).includes(text)) return text as SkyModel;
  throw new InputError(`--sky: expected one of ${SKY_MODELS.join(", ")}, got "${text}"`, "e.g. --sky perez (the default) or --sky isotropic");
}

export function textureRotationOption(text: string): number {
  const v = Number(text);
  if (!Number.isFinite(v)) throw new InputError(`--texture-rotation: expected degrees, got "${text}"`, "e.g. --texture-rotation 45");
  return v;
}

/** File-name-safe form of a site name. */
export function slug(name: string): string {
  return name.normalize("NFKD").replace(/[^\w]+/g, "-").replace(/^-+|-+$/g, "").toLowerCase() || "site";
}

interface YieldOpts {
  matrix: string; site: string; weather: string; year: string; seed: string; tilt: string; azimuth: string;
  textureRotation: string; sky: string; channel: string; hourly?: string; json?: boolean; out?: string; runDir?: string; report?: boolean;
}

/** `lightfold yield --matrix m --site s --weather csv|synthetic --tilt 30 --azimuth 180` */
export function register(program: Command): void {
  program
    .command("yield")
    .description("yearly absorbed photon charge (optical current) of a response matrix at a site, tilt and azimuth")
    .requiredOption("--matrix <matrix.json>", "response matrix (θ grid from 0° to at least 80°)")
    .requiredOption("--site <site.json>", "site file")
    .option("--weather <file.csv|synthetic>", "hourly weather CSV, or a synthetic year", "synthetic")
    .option("--year <year>", "year of the synthetic weather", "2027")
    .option("--seed <n>", "seed of the synthetic weather", "7")
    .option("--tilt <deg|list|from:to:step>", "tilt(s), 0 = facing up, 90 = vertical (e.g. 30, 20,35 or 0:90:5)", "30")
    .option("--azimuth <deg|list|from:to:step>", "facing direction from north, clockwise (180 = south)", "180")
    .option("--texture-rotation <deg>", "rotation of the texture's φ = 0 axis from the up-slope direction", "0")
    .option("--sky <model>", `diffuse sky model: ${SKY_MODELS.join(", ")}`, "perez")
    .option("--channel <name>", "response channel that counts as current", "A_absorber")
    .option("--hourly <file.csv>", "write the hourly POA irradiance and current (single plane only)")
    .option("--out <file.json>", "write the result JSON to this file")
    .option("--no-report", "with --run-dir: do not refresh <dir>/report/index.html")
    .option("--run-dir <dir>", "write the result JSON to <dir>/yield/yield-<site>.json (for `lightfold report`)")
    .option("--json", "print the result JSON instead of the table")
    .addHelpText(
      "after",
      `
Examples:
  lightfold yield --matrix runs/demo/demo-random-pyramids/base/matrix.json --site configs/sites/brevenmark.site.json --tilt 30
  lightfold yield --matrix m.json --site configs/sites/nordvik-fjell.site.json \\
      --weather weather-samples/nordvik-fjell-2027.csv --tilt 0:90:5 --run-dir runs/demo
  lightfold yield --matrix m.json --site s.json --weather synthetic --year 2027 --seed 7 --tilt 35 --hourly hours.csv

Charge = Σ over hours of the absorbed photocurrent (A/m²) × 1 h. Beam and circumsolar light use the
response at the sun's direction in the module frame with the AM1.5D spectral shape; sky, horizon band
and ground light are integrated over the module's hemisphere with the diffuse shape. Optical estimate
only: not an electrical or bankable energy yield.`,
    )
    .action((opts: YieldOpts) => {
      const site = readSiteFile(opts.site);
      const sky = skyModelOption(opts.sky);
      const tilts = parseAngleList(opts.tilt, "--tilt", 0, 180, "0 = facing up, 90 = vertical, 180 = facing down");
      const azimuths = parseAngleList(opts.azimuth, "--azimuth", 0, 360, "degrees from north, clockwise");
      const planes = planeList(tilts, azimuths, textureRotationOption(opts.textureRotation));
      if (opts.hourly && planes.length > 1) throw new InputError("--hourly needs a single tilt and azimuth", "e.g. --tilt 30 --azimuth 180 --hourly hourly.csv");
      const matrix = readResponseMatrix(opts.matrix);
      const pm = prepareMatrix(matrix, opts.matrix, opts.channel);
      const weather = loadWeather(opts.weather, site, intOption(opts.year, "--year", 2027), intOption(opts.seed, "--seed", 7));
      const ctx = yearContext(site, weather);
      const results = yieldSweep(ctx, pm, planes, sky, Boolean(opts.hourly));
      const best = results.length > 1 ? bestPlane(results) : undefined;
      const doc = yieldJson({ toolVersion: toolVersion(), matrix: matrixInfo(matrix, opts.matrix, pm.channel), site, ctx, skyModel: sky, results, best });
      const text = JSON.stringify(doc, null, 2) + "\n";
      // all inputs checked; now write
      if (opts.hourly) writeFileAtomic(opts.hourly, hourlyCsv(ctx, results[0]!, formatUtcOffset(site.utcOffsetHours)));
      if (opts.out) writeFileAtomic(opts.out, text);
      if (opts.runDir) writeFileAtomic(join(opts.runDir, "yield", `yield-${slug(site.name)}.json`), text);
      const report = opts.runDir && opts.report !== false ? makeReport([opts.runDir]) : undefined;
      if (opts.json) process.stdout.write(text);
      else {
        for (const w of ctx.warnings) process.stderr.write(`warning: ${ctx.weatherSource}: ${w}\n`);
        process.stdout.write(formatYieldTable(site.name, sky, results, best));
        if (report) process.stdout.write(`report: ${report.indexPath}\n`);
      }
    });
}
