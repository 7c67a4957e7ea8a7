import { parseJsonInput, readInputText } from "../util/inputFile.js";
import { writeFileAtomic } from "../util/atomicWrite.js";
import type { ResponseMatrix } from "./responseMatrix.js";
import { TRAPPING_ARRAYS, validateMatrix } from "./validateMatrix.js";

const ARRAY_FIELDS = ["mean", "stderr", "nRays", "pathRatio"] as const;

/** Serialises a matrix to its JSON file form (typed arrays as plain arrays; doubles round-trip exactly). */
export function matrixToJson(m: ResponseMatrix): string {
  const plain: Record<string, unknown> = { ...m };
  for (const f of ARRAY_FIELDS) plain[f] = Array.from(m[f]);
  // Optional pairing groups (paired errors of differences, src/response/pairedDifference.ts).
  if (m.groupMean !== undefined) plain.groupMean = Array.from(m.groupMean);
  if (m.groupRays !== undefined) plain.groupRays = Array.from(m.groupRays);
  if (m.trapping !== undefined) {
    const t: Record<string, unknown> = { ...m.trapping };
    for (const f of TRAPPING_ARRAYS) t[f] = Array.from(m.trapping[f]);
    plain.trapping = t;
  }
  return JSON.stringify(plain);
}

/** Parses and checks a matrix file's text (validateMatrix); `source` names the file in errors. */
export function matrixFromJson(text: string, source: string): ResponseMatrix {
  return validateMatrix(parseJsonInput(text, source), source);
}

export function readResponseMatrix(path: string): ResponseMatrix {
  const text = readInputText(
    path,
    "response matrix file",
    "give a matrix.json written by `lightfold sweep` (in <out>/<combination>/matrix.json, e.g. runs/my-study/base/matrix.json)",
  );
  return matrixFromJson(text, path);
}

/** Atomic write (temporary file + rename). */
export function writeResponseMatrix(path: string, m: ResponseMatrix): void {
  writeFileAtomic(path, matrixToJson(m));
}
