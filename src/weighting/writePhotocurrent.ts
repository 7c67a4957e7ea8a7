import { join } from "node:path";
import type { ResponseMatrix } from "../response/responseMatrix.js";
import { photocurrentWeights, type Spectrum } from "../spectrum/index.js";
import { writeFileAtomic } from "../util/atomicWrite.js";
import { iamCsv } from "./iamCsv.js";
import { photocurrentSummary, type PhotocurrentSummary } from "./photocurrent.js";

export const PHOTOCURRENT_FILE = "photocurrent.json";
export const IAM_FILE = "iam.csv";

/** Spectral weighting of a matrix under a spectrum (weights on the matrix's own wavelength grid). */
export function photocurrentForMatrix(m: ResponseMatrix, spectrum: Spectrum): PhotocurrentSummary {
  return photocurrentSummary(m, photocurrentWeights(m.wavelengthNm, spectrum), { spectrumName: spectrum.name });
}

/**
 * Writes `<dir>/photocurrent.json` (Jsc per direction with its error, loss breakdown, IAM) and
 * `<dir>/iam.csv` (the angular-modifier table), both atomically; everything is computed first.
 */
export function writePhotocurrentSummary(
  dir: string,
  m: ResponseMatrix,
  spectrum: Spectrum,
): { summary: PhotocurrentSummary; files: string[] } {
  const summary = photocurrentForMatrix(m, spectrum);
  const jsonText = JSON.stringify(summary, null, 2) + "\n";
  const csvText = iamCsv(summary);
  const jsonPath = join(dir, PHOTOCURRENT_FILE);
  const csvPath = join(dir, IAM_FILE);
  writeFileAtomic(csvPath, csvText);
  writeFileAtomic(jsonPath, jsonText);
  return { summary, files: [jsonPath, csvPath] };
}
