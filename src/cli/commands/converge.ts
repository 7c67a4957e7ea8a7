import { join } from "node:path";
import type { Command } from "commander";
import { CONVERGENCE_FILE, convergenceCsv, formatConvergenceTable } from "../../convergence/convergenceReport.js";
import { buildConvergenceReportOnPool, type ConvergeRequest } from "../../convergence/convergeStudy.js";
import { defaultWorkerCount } from "../../workers/pool.js";
import { loadStudy } from "../../study/load.js";
import { writeFileAtomic } from "../../util/atomicWrite.js";
import { InputError } from "../../util/errors.js";
import { countFlag, MAX_WORKERS } from "../countFlag.js";
import { samplingFlag } from "../samplingFlag.js";
import { spectrumOption } from "./spectral.js";

interface ConvergeFlags {
  angle: string;
  phi?: string;
  wavelength?: string;
  spectral?: boolean;
  channel: string;
  start: string;
  steps: string;
  replicas: string;
  referenceRays?: string;
  targetError?: string;
  combo?: string;
  spectrum?: string;
  out?: string;
  csv?: string;
  json?: boolean;
  quiet?: boolean;
  estimator?: string;
  sampling?: string;
  workers?: string;
}

function num(text: string | undefined, flag: string, check: (v: number) => boolean, expected: string): number | undefined {
  if (text === undefined) return undefined;
  const v = Number(text);
  if (text.trim() === "" || !Number.isFinite(v) || !check(v)) throw new InputError(`${flag}: expected ${expected}, got "${text}"`, "run `lightfold converge --help` for each flag's form and examples");
  return v;
}
const HINT = "run `lightfold converge --help` for each flag's form and examples";
/** Doubling steps: 20 steps already span a factor of 524,288 in rays. */
const MAX_STEPS = 20;
const MAX_REPLICAS = 64;
/** Most rays one convergence run may trace (replicas × all steps + the reference). */
export const MAX_CONVERGE_RAYS = 1e11;

/** Refuses a run whose rays (replicas × Σ steps + reference) exceed MAX_CONVERGE_RAYS. */
function requireConvergeSize(req: ConvergeRequest): void {
  const steps = req.replicas * req.startRays * (2 ** req.steps - 1);
  const reference = req.referenceRays ?? 16 * req.startRays * 2 ** (req.steps - 1);
  if (steps + reference > MAX_CONVERGE_RAYS) {
    throw new InputError(
      `--start ${req.startRays} --steps ${req.steps} --replicas ${req.replicas}: the run would trace ${(steps + reference).toExponential(2)} rays (steps and reference), more than the limit ${MAX_CONVERGE_RAYS.toExponential(0)}`,
      "fewer --steps or a smaller --start; each step doubles the rays",
    );
  }
}

function estimatorFlag(text: string | undefined): "analog" | "expected" | undefined {
  if (text === undefined || text === "analog" || text === "expected") return text;
  throw new InputError(`--estimator: expected "expected" or "analog", got "${text}"`, "expected (expected-value weights, the default) or analog, e.g. --estimator analog");
}

/** `lightfold converge <study> (--wavelength λ | --spectral) [...]` */
export function register(program: Command): void {
  program
    .command("converge")
    .description("Monte Carlo convergence study: error vs rays at doubling ray counts, against an independent reference")
    .argument("<study>", "study file (.study.json)")
    .option("--angle <deg>", "incidence angle θ in degrees", "0")
    .option("--phi <deg>", "azimuth φ in degrees (default: the study's first azimuth, or random when averaged)")
    .option("--wavelength <nm>", "converge one channel at this wavelength")
    .option("--spectral", "converge the absorber photocurrent over the study's wavelength grid")
    .option("--channel <name>", "channel for --wavelength", "A_absorber")
    .option("--start <N>", "rays of the first step (per wavelength with --spectral)", "500")
    .option("--steps <K>", "number of steps N, 2N, 4N, ...", "5")
    .option("--replicas <R>", "independent replicas per step for the RMS error", "4")
    .option("--reference-rays <M>", "rays of the independent reference run (default 16 × the largest step)")
    .option("--target-error <e>", "standard error to reach: predicts the rays needed")
    .option("--combo <label>", "parameter-sweep combination (base, p0, p1, ...; default the first)")
    .option("--spectrum <name|file.csv>", "spectrum for --spectral (default: the study's)")
    .option("--out <dir>", `write ${CONVERGENCE_FILE} into this run folder`)
    .option("--csv <file>", "write the step table as CSV")
    .option("--json", "print the result as JSON instead of the table")
    .option("--workers <n>", "worker threads (default: all cores; 1 = trace in this thread; same numbers either way)")
    .option("--estimator <kind>", "absorption sampling of the tracer: expected (default) or analog (one thread)")
    .option("--sampling <kind>", "launch sampling: random or sobol (randomized quasi-Monte Carlo; default: the study's, Sobol' where its points have 16+ batches)")
    .option("--quiet", "no progress lines on stderr")
    .addHelpText(
      "after",
      `
Examples:
  lightfold converge configs/demo-random-pyramids.study.json --angle 0 --wavelength 1000 --target-error 0.001
  lightfold converge configs/demo-random-pyramids.study.json --spectral --angle 40 --start 200 --steps 4 --out runs/demo-random-pyramids
  lightfold converge configs/demo-random-pyramids.study.json --wavelength 600 --channel R --json --csv conv.csv
  lightfold converge configs/demo-random-pyramids.study.json --wavelength 1000 --estimator analog   (compare at equal rays)
  lightfold converge configs/bench-pyramids.study.json --wavelength 600 --sampling sobol --start 4096   (quasi-Monte Carlo slope)

Every replica of every step, and the reference, draws from its own random streams (derived from the
study seed), so the steps are independent and the output is the same for a fixed seed. Plain Monte
Carlo errors fall as N^-1/2: the fitted log-log slopes should be near -0.5. With --sampling sobol each
run is 16 independently scrambled Sobol' replicas of N/16 rays (standard error from their spread);
where the result is a piecewise-smooth function of the launch, the slopes are steeper than -0.5.`,
    )
    .action(async (studyPath: string, flags: ConvergeFlags) => {
      if ((flags.wavelength === undefined) === (flags.spectral !== true)) {
        throw new InputError(
          "converge: give exactly one of --wavelength <nm> or --spectral",
          "--wavelength 600 converges one channel at 600 nm; --spectral converges the absorber photocurrent over the study's wavelength grid",
        );
      }
      const loaded = loadStudy(studyPath);
      const req: ConvergeRequest = {
        comboLabel: flags.combo,
        thetaDeg: num(flags.angle, "--angle", (v) => v >= 0 && v < 90, "an angle in [0, 90) degrees")!,
        phiDeg: num(flags.phi, "--phi", (v) => v >= 0 && v <= 360, "an azimuth in [0, 360] degrees"),
        wavelengthNm: num(flags.wavelength, "--wavelength", (v) => v > 0, "a wavelength in nm"),
        channel: flags.channel,
        spectrum: flags.spectrum === undefined ? undefined : spectrumOption(flags.spectrum),
        startRays: countFlag(flags.start, "--start", 1, 1e9, HINT),
        steps: countFlag(flags.steps, "--steps", 2, MAX_STEPS, HINT),
        replicas: countFlag(flags.replicas, "--replicas", 1, MAX_REPLICAS, HINT),
        referenceRays: flags.referenceRays === undefined ? undefined : countFlag(flags.referenceRays, "--reference-rays", 1, MAX_CONVERGE_RAYS, HINT),
        targetError: num(flags.targetError, "--target-error", (v) => v > 0, "a positive number"),
        estimator: estimatorFlag(flags.estimator),
        sampling: samplingFlag(flags.sampling),
      };
      requireConvergeSize(req);
      const onStep = flags.quiet ? undefined : (msg: string) => process.stderr.write(`${msg}\n`);
      // A non-default estimator traces in this thread unless workers are asked for explicitly.
      const workers =
        (flags.workers === undefined ? undefined : countFlag(flags.workers, "--workers", 1, MAX_WORKERS, HINT)) ?? (req.estimator === undefined || req.estimator === "expected" ? defaultWorkerCount() : 1);
      const report = await buildConvergenceReportOnPool(loaded, req, workers, onStep);
      // Everything is computed; now the files (each written atomically).
      if (flags.csv !== undefined) writeFileAtomic(flags.csv, convergenceCsv(report));
      if (flags.out !== undefined) writeFileAtomic(join(flags.out, CONVERGENCE_FILE), JSON.stringify(report, null, 2) + "\n");
      if (flags.json) process.stdout.write(JSON.stringify(report, null, 2) + "\n");
      else {
        process.stdout.write(formatConvergenceTable(report));
        if (flags.csv !== undefined) process.stdout.write(`wrote ${flags.csv}\n`);
        if (flags.out !== undefined) process.stdout.write(`wrote ${join(flags.out, CONVERGENCE_FILE)}\n`);
      }
    });
}
