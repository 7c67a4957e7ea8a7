import { basename, join } from "node:path";
import type { Command } from "commander";
import { countFlag, MAX_WORKERS } from "../countFlag.js";
import { objectiveInfo, parseAngleWeights, type ObjectiveSpec } from "../../optimize/objectives.js";
import { formatOptimum } from "../../optimize/optimumJson.js";
import { checkParameters, parseParameter, type ParameterSpec } from "../../optimize/parameters.js";
import { runOptimization } from "../../optimize/runOptimization.js";
import { makeReport } from "../../report/makeReport.js";
import { readSiteFile } from "../../site/siteFile.js";
import { spectrumFromSpec } from "../../spectrum/index.js";
import { loadStudy } from "../../study/load.js";
import { InputError } from "../../util/errors.js";
import { yearContext } from "../../yield/yearContext.js";
import { siteInfo, weatherInfo } from "../../yield/yieldJson.js";
import { addYearPlaneOptions, yearPlaneOf, type YearPlaneFlags } from "../yearPlaneOptions.js";
import { readWeatherInput, siteAndWeather } from "../weatherInput.js";
import { SPECTRA_HELP, hourlySpectraOption } from "../spectraInput.js";
import type { Mounting } from "../../yield/bifacialYield.js";
import { mountOf } from "../mountOptions.js";
import type { HourlySpectra } from "../../yield/hourlySpectra.js";
import type { PreparedMatrix } from "../../yield/yieldRun.js";

interface OptimizeFlags extends YearPlaneFlags {
  param: string[];
  objective: string;
  angle: string;
  angles?: string;
  spectrum?: string;
  site?: string;
  weather: string;
  spectra: string;
  bifacial?: boolean;
  height: string;
  moduleWidth: string;
  pitch?: string;
  gcr?: string;
  replicas: string;
  level: string;
  tolerance?: string;
  rays?: string;
  batch?: string;
  out?: string;
  workers?: string;
  fresh?: boolean;
  report?: boolean;
  quiet?: boolean;
  json?: boolean;
}

const OBJECTIVES = ["jsc", "angles", "yield"] as const;

function positiveInt(text: string, flag: string, min = 1, max = 1e9): number {
  return countFlag(text, flag, min, max, "run `lightfold optimize --help` for each flag's form and examples");
}

/** Default output folder: runs/optimize-<study file name>. */
function defaultOutDir(studyPath: string): string {
  return join("runs", `optimize-${basename(studyPath).replace(/\.study\.json$|\.json$/, "")}`);
}

/** The objective the flags ask for, and what it was built from (for the result file). */
function objectiveOf(flags: OptimizeFlags, studyPath: string): { spec: ObjectiveSpec; details: Record<string, unknown> } {
  const kind = flags.objective;
  if (!(OBJECTIVES as readonly string[]).includes(kind)) {
    throw new InputError(`--objective: expected one of ${OBJECTIVES.join(", ")}, got "${kind}"`, "e.g. --objective yield --site configs/sites/nordvik-fjell.site.json --tilt 45");
  }
  const loaded = loadStudy(studyPath);
  if (kind === "yield") {
    const { year, seed, planes, sky } = yearPlaneOf(flags);
    if (planes.length !== 1) throw new InputError("--tilt/--azimuth: the yield objective takes one plane", "e.g. --tilt 45 --azimuth 180");
    const input = readWeatherInput(flags.weather, year);
    const { site, weather, station } = siteAndWeather(input, flags.site ? readSiteFile(flags.site) : undefined, flags.site, year, seed);
    const ctx = yearContext(site, weather);
    for (const w of ctx.warnings) process.stderr.write(`warning: ${ctx.weatherSource}: ${w}\n`);
    const mounting = flags.bifacial === true ? mountingOf(flags) : undefined;
    if (mounting !== undefined && flags.spectra !== "g173") throw new InputError("--spectra: hourly spectra are not applied to the rear light yet; use the default g173 with --bifacial");
    // Hourly spectra depend only on the wavelength grid, the same for every evaluation: built once.
    let built: { grid: number[]; spectra: HourlySpectra | undefined } | undefined;
    const spectra = flags.spectra === "g173" ? undefined : {
      name: flags.spectra === "clear-sky-model" ? "clear-sky-model" : `measured (${flags.spectra})`,
      of: (pm: PreparedMatrix, gridNm: number[]): HourlySpectra => {
        if (built === undefined || built.grid.join() !== gridNm.join()) built = { grid: gridNm, spectra: hourlySpectraOption(flags.spectra, ctx, site, station?.met, pm, gridNm)?.spectra };
        return built.spectra as HourlySpectra;
      },
    };
    const spec: ObjectiveSpec = { kind: "yield", ctx, plane: planes[0], sky, channel: flags.channel, ...(spectra ? { spectra } : {}), ...(mounting ? { mounting } : {}) };
    return {
      spec,
      details: {
        site: siteInfo(site), weather: weatherInfo(ctx), plane: planes[0], skyModel: sky, channel: flags.channel,
        faces: mounting === undefined ? "front" : "front+rear", spectra: flags.spectra, ...(mounting ? { mounting } : {}),
      },
    };
  }
  const spectrum = flags.spectrum === undefined
    ? spectrumFromSpec(loaded.combos[0].study.spectrum, loaded.baseDir)
    : spectrumFromSpec(/\.csv$/i.test(flags.spectrum) ? { csv: flags.spectrum } : flags.spectrum, process.cwd(), "--spectrum");
  if (kind === "jsc") {
    const thetaDeg = Number(flags.angle);
    if (!(thetaDeg >= 0 && thetaDeg < 90)) throw new InputError(`--angle: expected an incidence angle in [0, 90) degrees, got "${flags.angle}"`, "e.g. --angle 0");
    return { spec: { kind: "jsc", thetaDeg, spectrum }, details: { thetaDeg, spectrum: spectrum.name } };
  }
  if (flags.angles === undefined) throw new InputError("--objective angles needs --angles", "e.g. --angles 0:2,30:1,60:1 (angle in degrees : weight)");
  const aw = parseAngleWeights(flags.angles, "--angles");
  return { spec: { kind: "angles", ...aw, spectrum }, details: { ...aw, spectrum: spectrum.name } };
}

/** The mounting of --bifacial, read like `yield --rear-matrix` reads it (one pitch, or an isolated row). */
function mountingOf(flags: OptimizeFlags): Mounting {
  const m = mountOf({ height: flags.height, moduleWidth: flags.moduleWidth, pitch: flags.pitch, gcr: flags.gcr });
  if (m.pitchesM.length !== 1) throw new InputError("--pitch/--gcr: the bifacial objective takes one row pitch", "e.g. --pitch 6 (or leave it out for an isolated row)");
  return { slantLengthM: m.slantLengthM, centreHeightM: m.centreHeightM, pitchM: m.pitchesM[0] };
}

function toleranceOf(text: string | undefined, params: ParameterSpec[]): number[] | undefined {
  if (text === undefined) return undefined;
  const parts = text.split(",").map(Number);
  if (parts.length !== params.length || parts.some((t, i) => !(t > 0 && t < params[i].upper - params[i].lower))) {
    throw new InputError(`--tolerance: expected ${params.length} positive number(s) smaller than the bound ranges, got "${text}"`, "e.g. --tolerance 0.5 (one per --param, in its unit)");
  }
  return parts;
}

export function register(program: Command): void {
  const cmd = program
    .command("optimize")
    .description("find the best value of one or two stack parameters within bounds, with a confidence interval (resumable)")
    .argument("<study>", "study file (JSON); its grid's wavelengths, azimuths and (for the yield) angles are traced")
    .requiredOption("--param <path=lower:upper>", "stack field and bounds, e.g. front.films[0].thicknessNm=55:105 (repeat for a second one)", (v: string, prev: string[] = []) => [...prev, v])
    .option("--objective <kind>", `what to maximise: ${OBJECTIVES.join(", ")}`, "jsc")
    .option("--angle <deg>", "jsc: incidence angle", "0")
    .option("--angles <deg:weight,...>", "angles: incidence angles and their weights, e.g. 0:2,30:1,60:1")
    .option("--spectrum <name|file.csv>", "jsc/angles: AM1.5G, AM1.5D, G173-ETR or a spectrum CSV (default: the study's)")
    .option("--site <site.json>", "yield: site file (optional with an EPW or TMY3 weather file)")
    .option("--weather <file|synthetic>", "yield: hourly weather file, or a synthetic year", "synthetic")
    .option("--spectra <g173|clear-sky-model|file.csv>", `yield: ${SPECTRA_HELP}`, "g173")
    .option("--bifacial", "yield: front + rear charge of a bifacial module (traces the study's light from the rear too)")
    .option("--height <m>", "with --bifacial: height of the module centre above the ground, m", "1.0")
    .option("--module-width <m>", "with --bifacial: module width across the row (slant length), m", "2.0")
    .option("--pitch <m>", "with --bifacial: row pitch, m (omit --pitch and --gcr for an isolated row)")
    .option("--gcr <ratio>", "with --bifacial: ground-coverage ratio = module width / pitch, in (0, 1]");
  addYearPlaneOptions(cmd, { tilt: "30" })
    .option("--replicas <n>", "independent replicas of the local fit (≥ 3)", "5")
    .option("--level <p>", "confidence level of the intervals", "0.95")
    .option("--tolerance <list>", "search resolution per parameter, in its unit (default: 1/100 of the bounds)")
    .option("--rays <n>", "rays per grid point of each evaluation (default: the study's)")
    .option("--batch <n>", `rays per batch (default: the study's, at most ${100})`)
    .option("--out <dir>", "output folder (default: runs/optimize-<study>)")
    .option("--workers <n>", "worker threads (default: SLURM_CPUS_PER_TASK when set, else all available cores)")
    .option("--fresh", "set existing evaluation journals aside and start again")
    .option("--no-report", "do not write <out>/report/ (the page and the plot of the objective vs each parameter)")
    .option("--quiet", "no progress lines")
    .option("--json", "print optimum.json instead of the table")
    .addHelpText(
      "after",
      `
Examples:
  lightfold optimize configs/demo-random-pyramids.study.json --param "front.films[0].thicknessNm=55:105"
  lightfold optimize configs/demo-random-pyramids.study.json --param "front.films[0].thicknessNm=55:105" \\
      --objective yield --site configs/sites/nordvik-fjell.site.json --tilt 45
  lightfold optimize configs/glass-glass-bifacial.study.json --param "rear.films[0].thicknessNm=40:140" --objective yield \\
      --site configs/sites/saltmere-plain.site.json --tilt 30 --bifacial --height 1.2 --module-width 2.2 --pitch 7
  lightfold optimize my.study.json --param "absorber.thicknessUm=100:250" --param "front.films[0].thicknessNm=60:100"
  lightfold optimize my.study.json --param "front.films[0].thicknessNm=55:105" --objective angles --angles 0:2,30:1,60:1

Search on one random stream (common random numbers: every evaluation traces the same rays, so the
objective is smooth in the parameter), then a local polynomial fit on independent replicas whose
spread gives the interval on the optimum's place and value. An optimum on a bound is flagged: the
best value may lie beyond it. Each evaluation is a journaled sweep under <out>/evaluations/; an
interrupted run resumes when started again. Optical estimate only.`,
    )
    .action(async (studyPath: string, flags: OptimizeFlags) => {
      const params = checkParameters(flags.param.map((p) => parseParameter(p, "--param")), "--param");
      const { spec, details } = objectiveOf(flags, studyPath);
      const level = Number(flags.level);
      if (!(level > 0 && level < 1)) throw new InputError(`--level: expected a number in (0, 1), got "${flags.level}"`, "e.g. --level 0.95");
      const outDir = flags.out ?? defaultOutDir(studyPath);
      const say = (line: string): void => {
        if (flags.quiet !== true && process.stderr.isTTY) process.stderr.write(`${line}\n`);
      };
      const onInterrupt = (signal: NodeJS.Signals): void => {
        process.stderr.write(`\nlightfold optimize: interrupted; finished evaluations are journaled under ${join(outDir, "evaluations")}; run the same command again to resume\n`);
        process.kill(process.pid, signal);
      };
      process.once("SIGINT", onInterrupt);
      process.once("SIGTERM", onInterrupt);
      let outcome;
      try {
        say(`lightfold optimize: ${objectiveInfo(spec).description}`);
        outcome = await runOptimization({
          studyPath,
          params,
          objective: spec,
          objectiveDetails: details,
          outDir,
          workers: flags.workers === undefined ? undefined : positiveInt(flags.workers, "--workers", 1, MAX_WORKERS),
          replicas: positiveInt(flags.replicas, "--replicas", 3),
          level,
          tolerance: toleranceOf(flags.tolerance, params),
          raysPerPoint: flags.rays === undefined ? undefined : positiveInt(flags.rays, "--rays"),
          batch: flags.batch === undefined ? undefined : positiveInt(flags.batch, "--batch"),
          fresh: flags.fresh === true,
          onEvaluation: say,
          onNotice: (m) => process.stderr.write(`lightfold optimize: ${m}\n`),
        });
      } catch (err) {
        if (err instanceof InputError && !err.message.startsWith(studyPath)) throw new InputError(`${studyPath}: ${err.message}`, err.hint);
        throw err;
      } finally {
        process.off("SIGINT", onInterrupt);
        process.off("SIGTERM", onInterrupt);
      }
      // The report holds the plot(s) of the objective vs each parameter (report/optimum-*.svg).
      const report = flags.report !== false ? makeReport([outDir]) : undefined;
      const written = report === undefined ? [] : [report.indexPath, ...report.figures.filter((f) => f.startsWith("optimum-")).map((f) => join(outDir, "report", `${f}.svg`))];
      if (flags.json === true) {
        process.stdout.write(JSON.stringify(outcome.doc, null, 2) + "\n");
        return;
      }
      process.stdout.write(formatOptimum(outcome.doc));
      for (const f of [...outcome.files, ...written]) process.stdout.write(`  wrote ${f}\n`);
    });
}
