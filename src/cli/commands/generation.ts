import { readFileSync } from "node:fs";
import { join } from "node:path";
import type { Command } from "commander";
import { loadStudy } from "../../study/load.js";
import { spectrumFromSpec } from "../../spectrum/index.js";
import { InputError } from "../../util/errors.js";
import { DEFAULT_DEPTH_GRID } from "../../generation/traceProfile.js";
import { parseCollectionCsv, type CollectionCurve } from "../../generation/collection.js";
import { runGeneration } from "../../generation/runGeneration.js";
import { spectrumOption } from "./spectral.js";
import { countFlag, MAX_WORKERS } from "../countFlag.js";

interface GenerationOptions {
  angle: string;
  azimuth: string;
  rays: string;
  batch: string;
  seed?: string;
  combo: string;
  spectrum?: string;
  bins: string;
  firstBinUm: string;
  collection?: string;
  out?: string;
  workers?: string;
  json?: boolean;
}

const HINT = "run `lightfold generation --help` for each flag's form and examples";

function numberOption(name: string, text: string, check: (v: number) => boolean, expected: string): number {
  const v = Number(text);
  if (text.trim() === "" || !Number.isFinite(v) || !check(v)) throw new InputError(`--${name}: expected ${expected}, got "${text}"`, HINT);
  return v;
}

/** "--collection": a uniform probability in [0, 1] or a CSV depth_um,collection (read and checked before tracing). */
function collectionOption(text: string): number | CollectionCurve {
  const eta = Number(text);
  if (text.trim() !== "" && Number.isFinite(eta)) {
    if (!(eta >= 0 && eta <= 1)) throw new InputError(`--collection: expected a probability in [0, 1] or a CSV file, got "${text}"`);
    return eta;
  }
  let csv: string;
  try {
    csv = readFileSync(text, "utf8");
  } catch {
    throw new InputError(`--collection: cannot read "${text}"`, "give a number in [0, 1] or a CSV file with the header depth_um,collection");
  }
  return parseCollectionCsv(csv, text);
}

/** `lightfold generation <study> [--angle θ] [--out dir] …`: G(z) of the absorber and the optical EQE. */
export function register(program: Command): void {
  program
    .command("generation")
    .description("generation profile G(z) in the absorber (per wavelength and under a spectrum) and the optical EQE at one incidence angle")
    .argument("<study>", "study file (JSON); its stack and wavelength grid are traced")
    .option("--angle <deg>", "polar angle of incidence θ in degrees, [0, 90)", "0")
    .option("--azimuth <deg>", 'azimuth φ in degrees, or "averaged" (random per ray)', "0")
    .option("--rays <n>", "rays per wavelength", "20000")
    .option("--batch <n>", "rays per random-stream batch", "2000")
    .option("--seed <n>", "seed (default: the study's)")
    .option("--combo <i>", "sweep combination index (0 = first)", "0")
    .option("--spectrum <name|file.csv>", "AM1.5G, AM1.5D, G173-ETR or a CSV file (default: the study's spectrum)")
    .option("--bins <n>", "depth bins", String(DEFAULT_DEPTH_GRID.bins))
    .option("--first-bin-um <um>", "width of the first depth bin in µm; the others grow geometrically to the rear", String(DEFAULT_DEPTH_GRID.firstBinUm))
    .option("--collection <eta|file.csv>", "collection probability: a number in [0, 1] or a CSV depth_um,collection, for the collected-EQE estimate")
    .option("--out <dir>", "output folder (default runs/<study name>/generation)")
    .option("--workers <n>", "worker threads (default: SLURM_CPUS_PER_TASK when set, else all available cores; same numbers for any count)")
    .option("--json", "print the summary as JSON")
    .addHelpText(
      "after",
      `
Examples:
  lightfold generation configs/demo-planar.study.json --out runs/demo-planar-generation
  lightfold generation my.study.json --angle 30 --spectrum AM1.5D --bins 120 --first-bin-um 0.001
  lightfold generation my.study.json --collection collection.csv     (header depth_um,collection)
  lightfold generation my.study.json --rays 200000 --workers 8

Writes generation.csv (depth_um,generation_cm3_s: bin centres, photons cm⁻³ s⁻¹ under the
spectrum on the cell plane), generation.npy (the same as a [bins, 2] float64 array),
generation-spectral.npy ([wavelengths, bins], cm⁻¹ per incident photon), eqe.csv (optical EQE =
absorber absorptance, with its error; with --collection also optics × the assumed collection, an
estimate and never a measured EQE) and generation.json (axes, bin edges, errors, provenance).
Depth 0 is the plane through the highest points of the front texture. Expected-value transport
puts each straight stretch's absorption into the bins it crosses exactly (Beer–Lambert), so
q·∫G dz equals the absorber photocurrent; the summary prints both. The (wavelength, batch) tasks
run on worker threads, each batch on its own random stream, summed in batch order: the files are
the same, bit for bit, for any --workers. Ctrl-C stops without writing anything.`,
    )
    .action(async (studyPath: string, opts: GenerationOptions) => {
      const thetaDeg = numberOption("angle", opts.angle, (v) => v >= 0 && v < 90, "a polar angle in [0, 90) degrees");
      const phiDeg = opts.azimuth === "averaged" ? null : numberOption("azimuth", opts.azimuth, () => true, 'degrees or "averaged"');
      const rays = numberOption("rays", opts.rays, (v) => Number.isInteger(v) && v >= 2, "a whole number ≥ 2");
      const batch = numberOption("batch", opts.batch, (v) => Number.isInteger(v) && v >= 1, "a positive whole number");
      const bins = numberOption("bins", opts.bins, (v) => Number.isInteger(v) && v >= 2 && v <= 10000, "a whole number of bins in [2, 10000]");
      const firstBinUm = numberOption("first-bin-um", opts.firstBinUm, (v) => v > 0, "a positive width in µm");
      const loaded = loadStudy(studyPath);
      const comboIndex = numberOption("combo", opts.combo, (v) => Number.isInteger(v) && v >= 0 && v < loaded.combos.length, `an index below ${loaded.combos.length}`);
      const combo = loaded.combos[comboIndex];
      const seed = opts.seed === undefined ? combo.study.seed : numberOption("seed", opts.seed, Number.isInteger, "a whole number");
      const spectrum = opts.spectrum === undefined ? spectrumFromSpec(combo.study.spectrum, loaded.baseDir, "spectrum") : spectrumOption(opts.spectrum);
      const curve = opts.collection === undefined ? null : collectionOption(opts.collection);
      const workers = opts.workers === undefined ? undefined : countFlag(opts.workers, "--workers", 1, MAX_WORKERS, HINT);
      const outDir = opts.out ?? join("runs", loaded.name, "generation");
      const quiet = !process.stderr.isTTY;
      // Ctrl-C: say that nothing was written (the files are written at the end, each atomically),
      // then let the signal end the process as usual.
      const onInterrupt = (signal: NodeJS.Signals): void => {
        process.stderr.write(`\nlightfold generation: interrupted; nothing written to ${outDir}\n`);
        process.kill(process.pid, signal);
      };
      process.once("SIGINT", onInterrupt);
      process.once("SIGTERM", onInterrupt);
      let run;
      try {
        run = await runGeneration(loaded, {
          comboIndex,
          thetaDeg,
          phiDeg,
          raysPerWavelength: rays,
          batch,
          grid: { bins, firstBinUm },
          seed,
          spectrum,
          collection: curve,
          collectionLabel: opts.collection ?? null,
          outDir,
          workers,
          onWavelength: quiet ? undefined : (done, total) => process.stderr.write(`\rlightfold generation: wavelengths ${done}/${total}${done === total ? "\n" : ""}`),
        });
      } finally {
        process.off("SIGINT", onInterrupt);
        process.off("SIGTERM", onInterrupt);
      }
      const { spectral, profile: g, files } = run;
      const centres = g.depthUm;
      const summary = {
        study: loaded.name,
        combo: combo.label,
        thetaDeg,
        phiDeg: phiDeg ?? "averaged",
        spectrum: spectrum.name,
        bins,
        depthUm: spectral.edgesUm[spectral.edgesUm.length - 1],
        integratedMaCm2: g.integratedMaCm2,
        absorberMaCm2: g.absorberMaCm2,
        absorberStderrMaCm2: g.absorberStderrMaCm2,
        peakGenerationCm3S: Math.max(...g.generationCm3S),
        files,
      };
      if (opts.json) {
        process.stdout.write(JSON.stringify(summary, null, 2) + "\n");
        return;
      }
      process.stdout.write(
        [
          `${loaded.name}${combo.label === "base" ? "" : ` (combination ${combo.label})`}: generation profile at θ = ${thetaDeg}°, φ = ${phiDeg === null ? "averaged" : `${phiDeg}°`}, ${spectrum.name}`,
          `  ${bins} depth bins over ${summary.depthUm.toFixed(2)} µm (first ${Math.min(firstBinUm, summary.depthUm / bins).toPrecision(3)} µm), ${rays} rays at each of ${spectral.wavelengthNm.length} wavelengths`,
          `  q·∫G dz = ${g.integratedMaCm2.toFixed(4)} mA/cm²; absorber photocurrent ${g.absorberMaCm2.toFixed(4)} ± ${g.absorberStderrMaCm2.toFixed(4)} mA/cm²`,
          `  G at the front bin ${g.generationCm3S[0].toExponential(3)} cm⁻³ s⁻¹; at ${centres[centres.length - 1].toFixed(1)} µm ${g.generationCm3S[centres.length - 1].toExponential(3)} cm⁻³ s⁻¹`,
          ...files.map((f) => `  wrote ${f}`),
          "",
        ].join("\n"),
      );
    });
}
