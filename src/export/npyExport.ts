import type { ResponseMatrix } from "../response/responseMatrix.js";
import { EXPORT_DIMS } from "./jsonExport.js";
import { encodeNpyFloat64 } from "./npy.js";
import { matrixProvenance, type MatrixProvenance } from "../response/provenance.js";

export const NPY_SIDECAR_FORMAT = "lightfold.response.npy";
export const NPY_SIDECAR_VERSION = 1;

export interface NpyArrayEntry {
  /** File name relative to the sidecar's folder. */
  file: string;
  dtype: "<f8";
  dims: string[];
  shape: number[];
  description: string;
}

export interface NpySidecar extends MatrixProvenance {
  format: typeof NPY_SIDECAR_FORMAT;
  formatVersion: number;
  axes: { theta_deg: number[]; phi_deg: number[]; wavelength_nm: number[]; channels: string[] };
  arrays: {
    mean: NpyArrayEntry;
    stderr: NpyArrayEntry;
    nRays: NpyArrayEntry;
    pathRatio: NpyArrayEntry;
    /** Light-trapping arrays, present when the matrix has them (format version 2). */
    entered?: NpyArrayEntry;
    freePathRatio?: NpyArrayEntry;
    passRemaining?: NpyArrayEntry;
    escapeAngle?: NpyArrayEntry;
  };
}

export interface NpyExport {
  sidecar: NpySidecar;
  /** File name → complete .npy bytes. */
  files: Map<string, Uint8Array>;
}

/**
 * The matrix as four .npy arrays plus a JSON sidecar naming axes, shapes and files. `prefix` is the
 * file-name stem (no folder): arrays become `<prefix>_mean.npy`, `<prefix>_stderr.npy`,
 * `<prefix>_nrays.npy`, `<prefix>_path_ratio.npy`.
 */
export function matrixToNpy(m: ResponseMatrix, prefix: string): NpyExport {
  const nT = m.thetaDeg.length;
  const nP = m.phiDeg.length;
  const nL = m.wavelengthNm.length;
  const nC = m.channels.length;
  const dims4 = [...EXPORT_DIMS];
  const dims3 = dims4.slice(0, 3);
  const entry = (suffix: string, dims: string[], shape: number[], description: string): NpyArrayEntry => ({
    file: `${prefix}_${suffix}.npy`,
    dtype: "<f8",
    dims,
    shape,
    description,
  });
  const arrays: NpySidecar["arrays"] = {
    mean: entry("mean", dims4, [nT, nP, nL, nC], "mean fraction of incident power per channel"),
    stderr: entry("stderr", dims4, [nT, nP, nL, nC], "Monte Carlo standard error of the mean"),
    nRays: entry("nrays", dims3, [nT, nP, nL], "rays traced per point"),
    pathRatio: entry("path_ratio", dims3, [nT, nP, nL], "photon path in the absorber per incident photon / absorber thickness (until absorbed or out)"),
  };
  const files = new Map<string, Uint8Array>();
  files.set(arrays.mean.file, encodeNpyFloat64(arrays.mean.shape, m.mean));
  files.set(arrays.stderr.file, encodeNpyFloat64(arrays.stderr.shape, m.stderr));
  files.set(arrays.nRays.file, encodeNpyFloat64(arrays.nRays.shape, m.nRays));
  files.set(arrays.pathRatio.file, encodeNpyFloat64(arrays.pathRatio.shape, m.pathRatio));
  const t = m.trapping;
  if (t !== undefined) {
    const nB = Math.round(90 / t.escapeAngleBinDeg);
    arrays.entered = entry("entered", dims3, [nT, nP, nL], "power that entered the absorber per unit incident power");
    arrays.freePathRatio = entry("free_path_ratio", dims3, [nT, nP, nL], "path in the absorber / thickness with its absorption removed (alpha -> 0), per unit entered power");
    arrays.passRemaining = entry("pass_remaining", [...dims3, "pass"], [nT, nP, nL, t.maxPasses + 1], `fraction of the entered power still inside after pass 1..${t.maxPasses}, then the sum over later passes`);
    arrays.escapeAngle = entry("escape_angle", [...dims3, "polar_bin"], [nT, nP, nL, nB], `R_escape power per incident power in ${t.escapeAngleBinDeg} degree polar bins`);
    files.set(arrays.entered.file, encodeNpyFloat64(arrays.entered.shape, t.entered));
    files.set(arrays.freePathRatio.file, encodeNpyFloat64(arrays.freePathRatio.shape, t.freePathRatio));
    files.set(arrays.passRemaining.file, encodeNpyFloat64(arrays.passRemaining.shape, t.passRemaining));
    files.set(arrays.escapeAngle.file, encodeNpyFloat64(arrays.escapeAngle.shape, t.escapeAngle));
  }
  const sidecar: NpySidecar = {
    format: NPY_SIDECAR_FORMAT,
    formatVersion: NPY_SIDECAR_VERSION,
    ...matrixProvenance(m),
    axes: { theta_deg: m.thetaDeg, phi_deg: m.phiDeg, wavelength_nm: m.wavelengthNm, channels: m.channels },
    arrays,
  };
  return { sidecar, files };
}
