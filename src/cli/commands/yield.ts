import type { Command } from "commander";
import { addResultOptions, addYearPlaneOptions, writeResult, yearPlaneOf, type ResultFlags, type YearPlaneFlags } from "../yearPlaneOptions.js";
import { readResponseMatrix } from "../../response/matrixFile.js";
import { readSiteFile } from "../../site/siteFile.js";
import { formatUtcOffset } from "../../site/utcOffset.js";
import { writeFileAtomic } from "../../util/atomicWrite.js";
import { InputError } from "../../util/errors.js";
import { toolVersion } from "../../util/version.js";
import { yearContext } from "../../yield/yearContext.js";
import { formatYieldTable, hourlyCsv, matrixInfo, yieldJson } from "../../yield/yieldJson.js";
import { bestPlane, prepareMatrix, yieldSweep } from "../../yield/yieldRun.js";
import { readWeatherInput, siteAndWeather } from "../weatherInput.js";
import { slugOf } from "../../util/safePath.js";
import { SPECTRA_HELP, hourlySpectraOption } from "../spectraInput.js";
import { addMountOptions, mountOf, type MountFlags } from "../mountOptions.js";
import type { ResponseMatrix } from "../../response/responseMatrix.js";
import type { Plane } from "../../site/site.js";
import { checkRowGeometry } from "../../sky/rowGeometry.js";
import type { SkyModel } from "../../sky/transposition.js";
import { bifacialSweep, opticalBifaciality } from "../../yield/bifacialYield.js";
import { bifacialJson, formatBifacialTable } from "../../yield/bifacialJson.js";
import type { PreparedMatrix } from "../../yield/yieldRun.js";

/** File-name-safe form of a site name (at most 60 characters: a long name must not overflow a file name). */
export function slug(name: string): string {
  return slugOf(name, 60, "site");
}

interface YieldOpts extends YearPlaneFlags, ResultFlags, MountFlags {
  matrix: string; site?: string; weather: string; hourly?: string; spectra: string; albedoSpectrum?: string;
}

/** `lightfold yield --matrix m --site s --weather csv|synthetic --tilt 30 --azimuth 180` */
export function register(program: Command): void {
  const cmd = program
    .command("yield")
    .description("yearly absorbed photon charge (optical current) of a response matrix at a site, tilt and azimuth")
    .requiredOption("--matrix <matrix.json>", "response matrix (θ grid from 0° to at least 80°)")
    .option("--site <site.json>", "site file (optional with an EPW or TMY3 weather file: its header gives the location)")
    .option("--weather <file|synthetic>", "hourly weather: EPW, TMY3 CSV or lightfold CSV (told apart by content), or a synthetic year", "synthetic");
  addYearPlaneOptions(cmd, { tilt: "30" })
    .option("--hourly <file.csv>", "write the hourly POA irradiance and current (single plane only)")
    .option("--spectra <g173|clear-sky-model|file.csv>", SPECTRA_HELP, "g173")
    .option("--albedo-spectrum <file.csv>", "spectral shape of the ground reflectance (wavelength_nm,reflectance) for ground light under hourly spectra; default constant");
  addMountOptions(cmd);
  addResultOptions(cmd, "yield-<site>.json", "result")
    .addHelpText(
      "after",
      `
Examples:
  lightfold yield --matrix runs/demo/demo-random-pyramids/base/matrix.json --site configs/sites/brevenmark.site.json --tilt 30
  lightfold yield --matrix m.json --site configs/sites/nordvik-fjell.site.json \\
      --weather weather-samples/nordvik-fjell-2027.csv --tilt 0:90:5 --run-dir runs/demo
  lightfold yield --matrix m.json --site s.json --weather synthetic --year 2027 --seed 7 --tilt 35 --hourly hours.csv
  lightfold yield --matrix m.json --weather weather-samples/brevenmark-2027.epw --tilt 35 --spectra clear-sky-model
  lightfold yield --matrix m.json --site s.json --weather w.csv --spectra measured-spectra.csv
  lightfold yield --matrix runs/demo/demo-glass-glass/base/matrix.json --rear-matrix runs/demo/demo-glass-glass/base-rear/matrix.json \
      --site configs/sites/saltmere-plain.site.json --tilt 10:40:10 --height 1.2 --module-width 2.2 --pitch 5,7,10

Weather files: EPW and TMY3 (hour-ending Wh/m², local standard time; the header gives latitude,
longitude, time zone and elevation, so --site is optional; a site file given with them must name the
same place) or lightfold's CSV (hour-starting W/m²); typical-year files are placed on --year.
--spectra other than g173 also computes the fixed-G173-shape year and reports the spectral correction
(hourly spectra ÷ fixed shapes − 1) per month and year.

Charge = Σ over hours of the absorbed photocurrent (A/m²) × 1 h. Beam and circumsolar light use the
response at the sun's direction in the module frame with the AM1.5D spectral shape; sky, horizon band
and ground light are integrated over the module's hemisphere with the diffuse shape. Optical estimate
only: not an electrical or bankable energy yield.

With --rear-matrix (bifacial): rear light from 2D view factors of one isolated row or infinitely long
rows (--pitch or --gcr): the sky, the shaded and unshaded ground (site albedo, uniform) and the
neighbouring rows (dark); the rear matrix is integrated over where that light comes from. Rows also
take the front through the same view factors (row ahead's shadow and hidden sky). Front, rear, total
and gain (rear/front) per tilt and pitch; the result file is yield/bifacial-<site>.json.`,
    )
    .action((opts: YieldOpts) => {
      const { year, seed, planes, sky } = yearPlaneOf(opts);
      if (opts.hourly && planes.length > 1) throw new InputError("--hourly needs a single tilt and azimuth", "e.g. --tilt 30 --azimuth 180 --hourly hourly.csv");
      const matrix = readResponseMatrix(opts.matrix);
      const pm = prepareMatrix(matrix, opts.matrix, opts.channel);
      if (opts.rearMatrix !== undefined) return bifacialAction(opts, matrix, pm, year, seed, planes, sky);
      const input = readWeatherInput(opts.weather, year);
      const { site, weather, station } = siteAndWeather(input, opts.site ? readSiteFile(opts.site) : undefined, opts.site, year, seed);
      const ctx = yearContext(site, weather);
      const hourlySpectra = hourlySpectraOption(opts.spectra, ctx, site, station?.met, pm, matrix.wavelengthNm, opts.albedoSpectrum);
      const results = yieldSweep(ctx, pm, planes, sky, Boolean(opts.hourly), hourlySpectra?.spectra);
      const spectral = hourlySpectra ? { ...hourlySpectra, fixed: yieldSweep(ctx, pm, planes, sky) } : undefined;
      const best = results.length > 1 ? bestPlane(results) : undefined;
      const doc = yieldJson({ toolVersion: toolVersion(), matrix: matrixInfo(matrix, opts.matrix, pm.channel), site, ctx, skyModel: sky, results, best, spectral });
      const text = JSON.stringify(doc, null, 2) + "\n";
      // all inputs checked; now write
      if (opts.hourly) writeFileAtomic(opts.hourly, hourlyCsv(ctx, results[0]!, formatUtcOffset(site.utcOffsetHours)));
      const report = writeResult(opts, `yield-${slug(site.name)}.json`, text);
      if (opts.json) process.stdout.write(text);
      else {
        for (const w of ctx.warnings) process.stderr.write(`warning: ${ctx.weatherSource}: ${w}\n`);
        process.stdout.write(formatYieldTable(site.name, sky, results, best, spectral));
        if (report) process.stdout.write(`report: ${report}\n`);
      }
    });
}

/** `yield --rear-matrix`: front + rear yearly charge per plane and pitch, and the bifacial gain. */
function bifacialAction(opts: YieldOpts, matrix: ResponseMatrix, pm: PreparedMatrix, year: number, seed: number, planes: Plane[], sky: SkyModel): void {
  const mount = mountOf(opts);
  if (opts.spectra !== "g173") throw new InputError("--spectra: hourly spectra are not applied to the rear light yet; use the default g173 with --rear-matrix");
  if (opts.hourly) throw new InputError("--hourly: not written with --rear-matrix");
  if (opts.albedoSpectrum) throw new InputError("--albedo-spectrum: applies to hourly spectra, which are not applied to the rear light yet");
  if (matrix.lightFrom === "rear") throw new InputError(`--matrix ${opts.matrix}: this matrix was traced with light from the rear; give the front one`);
  const rearMatrix = readResponseMatrix(opts.rearMatrix!);
  if (rearMatrix.lightFrom !== "rear") {
    throw new InputError(`--rear-matrix ${opts.rearMatrix}: this matrix was traced with light from the front`, 'sweep the study with "illumination": "both" and pass <label>-rear/matrix.json');
  }
  const rear = prepareMatrix(rearMatrix, opts.rearMatrix!, opts.channel);
  for (const p of planes) {
    for (const pitchM of mount.pitchesM) checkRowGeometry({ tiltDeg: p.tiltDeg, slantLengthM: mount.slantLengthM, centreHeightM: mount.centreHeightM, ...(pitchM === null ? {} : { pitchM }) }, "--tilt/--height/--module-width/--pitch");
  }
  const input = readWeatherInput(opts.weather, year);
  const { site, weather } = siteAndWeather(input, opts.site ? readSiteFile(opts.site) : undefined, opts.site, year, seed);
  const ctx = yearContext(site, weather);
  const results = bifacialSweep(ctx, planes, mount.pitchesM, mount, pm, rear, sky);
  const b = opticalBifaciality(pm, rear);
  const doc = bifacialJson({
    toolVersion: toolVersion(), front: matrixInfo(matrix, opts.matrix, pm.channel), rear: matrixInfo(rearMatrix, opts.rearMatrix!, rear.channel),
    site, ctx, skyModel: sky, mounting: mount, opticalBifaciality: b, results,
  });
  const text = JSON.stringify(doc, null, 2) + "\n";
  const report = writeResult(opts, `bifacial-${slug(site.name)}.json`, text);
  if (opts.json) process.stdout.write(text);
  else {
    for (const w of ctx.warnings) process.stderr.write(`warning: ${ctx.weatherSource}: ${w}\n`);
    process.stdout.write(formatBifacialTable(site.name, sky, b, results));
    if (report) process.stdout.write(`report: ${report}\n`);
  }
}
