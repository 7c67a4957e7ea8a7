import { parseJsonInput, readInputText } from "../util/inputFile.js";
import { writeFileAtomic } from "../util/atomicWrite.js";
import { InputError } from "../util/errors.js";
import { RESPONSE_FORMAT, RESPONSE_FORMAT_VERSION, type ResponseMatrix } from "./responseMatrix.js";

const ARRAY_FIELDS = ["mean", "stderr", "nRays", "pathRatio"] as const;

/** Serialises a matrix to its JSON file form (typed arrays as plain arrays; doubles round-trip exactly). */
export function matrixToJson(m: ResponseMatrix): string {
  const plain: Record<string, unknown> = { ...m };
  for (const f of ARRAY_FIELDS) plain[f] = Array.from(m[f]);
  return JSON.stringify(plain);
}

/** Parses and checks a matrix file's text; `source` names the file in errors. */
export function matrixFromJson(text: string, source: string): ResponseMatrix {
  const raw = parseJsonInput(text, source) as Record<string, unknown>;
  if (raw.format !== RESPONSE_FORMAT) {
    throw new InputError(`${source}: not a lightfold response matrix (format is ${JSON.stringify(raw.format)}, expected "${RESPONSE_FORMAT}")`);
  }
  if (typeof raw.formatVersion !== "number" || raw.formatVersion > RESPONSE_FORMAT_VERSION) {
    throw new InputError(`${source}: matrix format version ${String(raw.formatVersion)} is newer than this lightfold reads (${RESPONSE_FORMAT_VERSION})`);
  }
  const m = raw as unknown as ResponseMatrix;
  const nPoints = m.thetaDeg.length * m.phiDeg.length * m.wavelengthNm.length;
  const sizes: Record<(typeof ARRAY_FIELDS)[number], number> = {
    mean: nPoints * m.channels.length,
    stderr: nPoints * m.channels.length,
    nRays: nPoints,
    pathRatio: nPoints,
  };
  for (const f of ARRAY_FIELDS) {
    const arr = raw[f];
    if (!Array.isArray(arr) || arr.length !== sizes[f]) {
      throw new InputError(`${source}: field "${f}" must be an array of ${sizes[f]} numbers`);
    }
    (m as unknown as Record<string, Float64Array>)[f] = Float64Array.from(arr as number[]);
  }
  return m;
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
