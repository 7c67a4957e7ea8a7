import type { LoadedStudy } from "../study/load.js";
import { photocurrentWeights, type Spectrum } from "../spectrum/index.js";
import { toolVersion } from "../util/version.js";
import { collectionAt, type CollectionCurve } from "./collection.js";
import { eqeFromProfile, generationUnderSpectrum, spectralGenerationPerCm, type GenerationProfile } from "./profile.js";
import { workerSetupOf } from "../sweep/runSweep.js";
import { defaultWorkerCount, TracePool } from "../workers/pool.js";
import type { ProfileRequest, SpectralProfile } from "./traceProfile.js";
import { traceGenerationProfileOnPool } from "./traceProfileOnPool.js";
import { writeGenerationFiles } from "./writeProfile.js";

/** The trace request of the combination (its study and registry come from the loaded study), plus weighting and output. */
export interface GenerationRunOptions extends Omit<ProfileRequest, "study" | "registry"> {
  spectrum: Spectrum;
  /** Uniform collection probability, a curve η(z), or none. */
  collection: number | CollectionCurve | null;
  /** Text recorded in the sidecar for the collection (flag value or file). */
  collectionLabel: string | null;
  outDir: string;
  /** Worker threads (default: Slurm's grant or all cores); the profile is the same for any count. Ignored when `pool` is given. */
  workers?: number;
  /** An open pool of this study (e.g. its sweep's, threads already warm), reused; the caller closes it. */
  pool?: TracePool;
}

export interface GenerationRun {
  spectral: SpectralProfile;
  profile: GenerationProfile;
  files: string[];
}

/** Traces (on a worker pool), weights and writes a generation profile of one combination (the `generation` verb and the demo). */
export async function runGeneration(loaded: LoadedStudy, o: GenerationRunOptions): Promise<GenerationRun> {
  const combo = loaded.combos[o.comboIndex];
  const tasks = combo.study.grid.wavelengthNm.length * Math.ceil(o.raysPerWavelength / o.batch);
  // No more threads than (wavelength, batch) tasks: a thread costs its start-up and memory.
  const pool = o.pool ?? new TracePool(workerSetupOf(loaded), Math.min(o.workers ?? defaultWorkerCount(), tasks));
  let spectral: SpectralProfile;
  try {
    spectral = await traceGenerationProfileOnPool(
      {
        study: combo.study,
        registry: loaded.registry,
        comboIndex: o.comboIndex,
        thetaDeg: o.thetaDeg,
        phiDeg: o.phiDeg,
        raysPerWavelength: o.raysPerWavelength,
        batch: o.batch,
        grid: o.grid,
        seed: o.seed,
        onWavelength: o.onWavelength,
      },
      pool,
    );
  } finally {
    if (o.pool === undefined) await pool.close();
  }
  const profile = generationUnderSpectrum(spectral, photocurrentWeights(combo.study.grid.wavelengthNm, o.spectrum));
  const c = o.collection;
  const eta = c === null ? null : typeof c === "number" ? new Float64Array(profile.depthUm.length).fill(c) : collectionAt(c, profile.depthUm);
  const files = writeGenerationFiles(
    o.outDir,
    { studyName: loaded.name, studyHash: combo.hash, combo: combo.label, seed: o.seed, toolVersion: toolVersion(), spectrum: o.spectrum.name, collection: o.collectionLabel },
    spectral,
    profile,
    spectralGenerationPerCm(spectral),
    eqeFromProfile(spectral, eta),
  );
  return { spectral, profile, files };
}
