import { join } from "node:path";
import { encodeNpyFloat64 } from "../export/npy.js";
import { writeFileAtomic } from "../util/atomicWrite.js";
import type { GenerationProfile } from "./profile.js";
import type { SpectralProfile } from "./traceProfile.js";

export const GENERATION_FORMAT = "lightfold.generation";
export const GENERATION_FORMAT_VERSION = 1;

/** What the sidecar records besides the arrays. */
export interface GenerationLabels {
  studyName: string;
  studyHash: string;
  combo: string;
  seed: number;
  toolVersion: string;
  spectrum: string;
  collection: string | null;
}

const num = (x: number): string => (x === 0 ? "0" : Math.abs(x) >= 1e-3 && Math.abs(x) < 1e7 ? String(Number(x.toPrecision(10))) : x.toExponential(9));

/**
 * Writes a generation profile into `dir` (atomic files):
 *   generation.csv           depth_um,generation_cm3_s (bin centres; the plain table 1D device simulators read)
 *   generation.npy           float64 [bins, 2]: column 0 depth_um, column 1 generation_cm3_s
 *   generation-spectral.npy  float64 [wavelengths, bins]: cm⁻¹ per incident photon
 *   eqe.csv                  wavelength_nm,optical_eqe,optical_eqe_stderr[,collected_eqe_estimate]
 *   generation.json          sidecar: provenance, axes, edges, errors, the q·∫G dz check, file names
 * Returns the paths written.
 */
export function writeGenerationFiles(
  dir: string,
  labels: GenerationLabels,
  spectral: SpectralProfile,
  g: GenerationProfile,
  perCm: Float64Array,
  eqe: { optical: Float64Array; collected: Float64Array | null },
): string[] {
  const nB = g.depthUm.length;
  const nL = spectral.wavelengthNm.length;
  const files: string[] = [];
  const put = (name: string, data: string | Uint8Array): void => {
    const p = join(dir, name);
    writeFileAtomic(p, data);
    files.push(p);
  };
  let csv = "depth_um,generation_cm3_s\n";
  for (let b = 0; b < nB; b++) csv += `${num(g.depthUm[b])},${num(g.generationCm3S[b])}\n`;
  put("generation.csv", csv);
  const two = new Float64Array(2 * nB);
  for (let b = 0; b < nB; b++) {
    two[2 * b] = g.depthUm[b];
    two[2 * b + 1] = g.generationCm3S[b];
  }
  put("generation.npy", encodeNpyFloat64([nB, 2], two));
  put("generation-spectral.npy", encodeNpyFloat64([nL, nB], perCm));
  let e = `wavelength_nm,optical_eqe,optical_eqe_stderr${eqe.collected ? ",collected_eqe_estimate" : ""}\n`;
  for (let il = 0; il < nL; il++) {
    e += `${spectral.wavelengthNm[il]},${num(eqe.optical[il])},${num(spectral.absorptanceStderr[il])}${eqe.collected ? `,${num(eqe.collected[il])}` : ""}\n`;
  }
  put("eqe.csv", e);
  const sidecar = {
    format: GENERATION_FORMAT,
    formatVersion: GENERATION_FORMAT_VERSION,
    ...labels,
    thetaDeg: spectral.thetaDeg,
    phiDeg: spectral.phiDeg ?? "averaged",
    raysPerWavelength: spectral.raysPerWavelength,
    depthReference: "depth 0 = plane through the highest points of the front texture (the surface itself when planar)",
    units: { depth: "µm", generation: "photons cm⁻³ s⁻¹", spectralGeneration: "cm⁻¹ per incident photon", current: "mA/cm²" },
    files: {
      profileCsv: "generation.csv",
      profileNpy: { file: "generation.npy", dtype: "<f8", shape: [nB, 2], columns: ["depth_um", "generation_cm3_s"] },
      spectralNpy: { file: "generation-spectral.npy", dtype: "<f8", shape: [nL, nB], dims: ["wavelength_nm", "depth_bin"] },
      eqeCsv: "eqe.csv",
    },
    wavelengthNm: spectral.wavelengthNm,
    edgesUm: Array.from(g.edgesUm),
    depthUm: Array.from(g.depthUm),
    generationCm3S: Array.from(g.generationCm3S),
    generationStderrCm3S: Array.from(g.generationStderrCm3S),
    check: {
      integratedMaCm2: g.integratedMaCm2,
      absorberMaCm2: g.absorberMaCm2,
      absorberStderrMaCm2: g.absorberStderrMaCm2,
      note: "q·∫G dz over the bins equals the absorber photocurrent under the same spectrum",
    },
    eqe: {
      optical: Array.from(eqe.optical),
      opticalStderr: Array.from(spectral.absorptanceStderr),
      collectedEstimate: eqe.collected ? Array.from(eqe.collected) : null,
      note: "optical EQE = absorber absorptance (every absorbed photon counted); collectedEstimate = optics × an assumed collection probability, not a measured EQE",
    },
  };
  put("generation.json", JSON.stringify(sidecar, null, 1));
  return files;
}
