import { InputError } from "../util/errors.js";
import { at, int, names, num, numbers, obj, oneOf, refuse, str, type Where } from "../util/untrustedJson.js";
import { RESPONSE_FORMAT, RESPONSE_FORMAT_VERSION, type PhiMode, type ResponseMatrix, type TrappingArrays } from "./responseMatrix.js";

/** The per-point arrays of a version-2 matrix's "trapping" object. */
export const TRAPPING_ARRAYS = ["entered", "freePathRatio", "freePathRatioStderr", "passRemaining", "escapeAngle"] as const;

/** A point's channels must sum to 1 within this (a matrix written by lightfold: within 1e-12). */
export const MATRIX_SUM_TOLERANCE = 1e-6;
const PHI_MODES: readonly PhiMode[] = ["list", "averaged", "square"];

/**
 * The one check of a response matrix read from a file, used by every verb that reads one: types,
 * shapes, sorted axes (θ in [0°, 90°), φ in [0°, 360°], λ > 0, each strictly increasing), distinct
 * channel names, fractions in [0, 1], non-negative errors and path ratios, whole non-negative ray
 * counts, and per traced point channels summing to 1. Returns the typed matrix.
 */
export function validateMatrix(raw: unknown, file: string): ResponseMatrix {
  const root: Where = { file, path: "" };
  const o = obj(raw, root);
  if (o.format !== RESPONSE_FORMAT) {
    throw new InputError(`${file}: not a lightfold response matrix (format is ${JSON.stringify(o.format)}, expected "${RESPONSE_FORMAT}")`);
  }
  if (typeof o.formatVersion !== "number" || o.formatVersion > RESPONSE_FORMAT_VERSION) {
    throw new InputError(`${file}: matrix format version ${String(o.formatVersion)} is newer than this lightfold reads (${RESPONSE_FORMAT_VERSION})`);
  }
  int(o.formatVersion, at(root, "formatVersion"), 1, RESPONSE_FORMAT_VERSION);
  str(o.toolVersion, at(root, "toolVersion"), 100);
  str(o.studyName, at(root, "studyName"), 1000);
  str(o.studyHash, at(root, "studyHash"), 200);
  num(o.seed, at(root, "seed"));
  const combo = obj(o.combo, at(root, "combo"));
  for (const [k, v] of Object.entries(combo)) num(v, at(at(root, "combo"), k));
  const thetaDeg = numbers(o.thetaDeg, at(root, "thetaDeg"), { nonEmpty: true, min: 0, max: 90, increasing: true });
  if (thetaDeg[thetaDeg.length - 1]! >= 90) refuse(at(root, `thetaDeg[${thetaDeg.length - 1}]`), "an angle below 90°", thetaDeg[thetaDeg.length - 1]);
  const phiDeg = numbers(o.phiDeg, at(root, "phiDeg"), { nonEmpty: true, min: 0, max: 360, increasing: true });
  const phiMode = oneOf(o.phiMode, at(root, "phiMode"), PHI_MODES);
  const wavelengthNm = numbers(o.wavelengthNm, at(root, "wavelengthNm"), { nonEmpty: true, min: Number.MIN_VALUE, max: 1e6, increasing: true });
  const channels = names(o.channels, at(root, "channels"));
  const nPts = thetaDeg.length * phiDeg.length * wavelengthNm.length;
  const nCh = channels.length;
  const mean = numbers(o.mean, at(root, "mean"), { length: nPts * nCh, min: 0, max: 1 + MATRIX_SUM_TOLERANCE });
  const stderr = numbers(o.stderr, at(root, "stderr"), { length: nPts * nCh, min: 0, max: 1 });
  const nRays = numbers(o.nRays, at(root, "nRays"), { length: nPts, min: 0, max: Number.MAX_SAFE_INTEGER, integer: true });
  const pathRatio = numbers(o.pathRatio, at(root, "pathRatio"), { length: nPts, min: 0, max: 1e9 });
  if (o.partial !== undefined && typeof o.partial !== "boolean") refuse(at(root, "partial"), "true or false", o.partial);
  if (o.lightFrom !== undefined) oneOf(o.lightFrom, at(root, "lightFrom"), ["rear"] as const);
  for (let q = 0; q < nPts; q++) {
    if (nRays[q] === 0) {
      if (o.partial !== true) refuse(at(root, `nRays[${q}]`), "a traced point (rays > 0) in a matrix not marked partial", 0);
      continue;
    }
    let sum = 0;
    for (let c = 0; c < nCh; c++) sum += mean[q * nCh + c]!;
    if (Math.abs(sum - 1) > MATRIX_SUM_TOLERANCE) {
      const il = q % wavelengthNm.length, ip = Math.floor(q / wavelengthNm.length) % phiDeg.length, it = Math.floor(q / (wavelengthNm.length * phiDeg.length));
      refuse(at(root, `mean`), `the channels of each point to sum to 1 ± ${MATRIX_SUM_TOLERANCE}; at θ = ${thetaDeg[it]}°, φ = ${phiDeg[ip]}°, λ = ${wavelengthNm[il]} nm they sum to ${sum}`);
    }
  }
  const m: ResponseMatrix = {
    ...(o as unknown as ResponseMatrix),
    phiMode,
    mean: Float64Array.from(mean),
    stderr: Float64Array.from(stderr),
    nRays: Float64Array.from(nRays),
    pathRatio: Float64Array.from(pathRatio),
  };
  delete m.pairGroups;
  delete m.groupMean;
  delete m.groupRays;
  if (o.pairGroups !== undefined) {
    // Pairing groups: group means are fractions like the point means, group rays add up to the point's.
    const G = int(o.pairGroups, at(root, "pairGroups"), 1, 1024);
    const groupMean = numbers(o.groupMean, at(root, "groupMean"), { length: nPts * G * nCh, min: 0, max: 1 + MATRIX_SUM_TOLERANCE });
    const groupRays = numbers(o.groupRays, at(root, "groupRays"), { length: nPts * G, min: 0, max: Number.MAX_SAFE_INTEGER, integer: true });
    for (let q = 0; q < nPts; q++) {
      let n = 0;
      for (let g = 0; g < G; g++) n += groupRays[q * G + g]!;
      if (n !== nRays[q]) refuse(at(root, "groupRays"), `the groups of each point to hold its rays; point ${q} has ${nRays[q]} rays, its groups ${n}`);
    }
    m.pairGroups = G;
    m.groupMean = Float64Array.from(groupMean);
    m.groupRays = Float64Array.from(groupRays);
  }
  // Version 1 has no diagnostics and keeps its "R" / "T" totals (labelled as such everywhere).
  if (o.trapping === undefined || o.formatVersion < 2) delete m.trapping;
  else m.trapping = validateTrapping(o.trapping, at(root, "trapping"), nPts);
  return m;
}

/** The "trapping" object: whole maxPasses ≥ 1, a bin width dividing 90°, arrays sized to the grid. */
function validateTrapping(raw: unknown, where: Where, nPts: number): TrappingArrays {
  const t = obj(raw, where);
  const maxPasses = int(t.maxPasses, at(where, "maxPasses"), 1, 10000);
  const binDeg = num(t.escapeAngleBinDeg, at(where, "escapeAngleBinDeg"));
  if (!(binDeg > 0) || !Number.isInteger(90 / binDeg)) refuse(at(where, "escapeAngleBinDeg"), "a bin width in degrees that divides 90", binDeg);
  const sizes: Record<(typeof TRAPPING_ARRAYS)[number], number> = {
    entered: nPts,
    freePathRatio: nPts,
    freePathRatioStderr: nPts,
    passRemaining: nPts * (maxPasses + 1),
    escapeAngle: nPts * (90 / binDeg),
  };
  const out = { maxPasses, escapeAngleBinDeg: binDeg } as TrappingArrays;
  for (const f of TRAPPING_ARRAYS) out[f] = Float64Array.from(numbers(t[f], at(where, f), { length: sizes[f], min: 0, max: 1e9 }));
  return out;
}
