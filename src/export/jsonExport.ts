import { matrixIndex, pointIndex, type ResponseMatrix } from "../response/responseMatrix.js";
import { matrixProvenance, type MatrixProvenance } from "../response/provenance.js";

/** Format tag of the nested-array JSON export (distinct from the flat `*.matrix.json` file). */
export const JSON_EXPORT_FORMAT = "lightfold.response.export";
export const JSON_EXPORT_VERSION = 1;

/** Axis names, outermost first; `mean[it][ip][il][ic]` belongs to thetaDeg[it], phiDeg[ip], … */
export const EXPORT_DIMS = ["theta_deg", "phi_deg", "wavelength_nm", "channel"] as const;

export interface MatrixJsonExport extends MatrixProvenance {
  format: typeof JSON_EXPORT_FORMAT;
  formatVersion: number;
  dims: string[];
  axes: { theta_deg: number[]; phi_deg: number[]; wavelength_nm: number[]; channel: string[] };
  /** Fractions of incident power, nested [theta][phi][wavelength][channel]. */
  mean: number[][][][];
  /** Monte Carlo standard errors, same nesting. */
  stderr: number[][][][];
  /** Rays per point, nested [theta][phi][wavelength]. */
  nRays: number[][][];
  /** Photon path in the absorber per incident photon / thickness per point, nested [theta][phi][wavelength]. */
  pathRatio: number[][][];
  /** Light-trapping arrays (matrices of format version 2): per point, and per pass or polar bin innermost. */
  trapping?: {
    maxPasses: number;
    escapeAngleBinDeg: number;
    entered: number[][][];
    freePathRatio: number[][][];
    passRemaining: number[][][][];
    escapeAngle: number[][][][];
  };
}

function nest4(m: ResponseMatrix, flat: Float64Array): number[][][][] {
  return m.thetaDeg.map((_, it) =>
    m.phiDeg.map((_, ip) =>
      m.wavelengthNm.map((_, il) => m.channels.map((_, ic) => flat[matrixIndex(m, it, ip, il, ic)])),
    ),
  );
}

function nest3(m: ResponseMatrix, flat: Float64Array): number[][][] {
  return m.thetaDeg.map((_, it) => m.phiDeg.map((_, ip) => m.wavelengthNm.map((_, il) => flat[pointIndex(m, it, ip, il)])));
}

/** [theta][phi][wavelength][k] of a per-point array with `inner` values per point. */
function nestInner(m: ResponseMatrix, flat: Float64Array, inner: number): number[][][][] {
  return m.thetaDeg.map((_, it) =>
    m.phiDeg.map((_, ip) =>
      m.wavelengthNm.map((_, il) => {
        const q = pointIndex(m, it, ip, il);
        return Array.from(flat.subarray(q * inner, (q + 1) * inner));
      }),
    ),
  );
}

/** The matrix as nested arrays with named axes (for tools that do not want to compute flat indices). */
export function matrixToExportObject(m: ResponseMatrix): MatrixJsonExport {
  const out: MatrixJsonExport = {
    format: JSON_EXPORT_FORMAT,
    formatVersion: JSON_EXPORT_VERSION,
    ...matrixProvenance(m),
    dims: [...EXPORT_DIMS],
    axes: { theta_deg: m.thetaDeg, phi_deg: m.phiDeg, wavelength_nm: m.wavelengthNm, channel: m.channels },
    mean: nest4(m, m.mean),
    stderr: nest4(m, m.stderr),
    nRays: nest3(m, m.nRays),
    pathRatio: nest3(m, m.pathRatio),
  };
  const t = m.trapping;
  if (t !== undefined) {
    out.trapping = {
      maxPasses: t.maxPasses,
      escapeAngleBinDeg: t.escapeAngleBinDeg,
      entered: nest3(m, t.entered),
      freePathRatio: nest3(m, t.freePathRatio),
      passRemaining: nestInner(m, t.passRemaining, t.maxPasses + 1),
      escapeAngle: nestInner(m, t.escapeAngle, Math.round(90 / t.escapeAngleBinDeg)),
    };
  }
  return out;
}

/** JSON text of the export (JSON numbers round-trip doubles exactly). */
export function matrixToExportJson(m: ResponseMatrix): string {
  return JSON.stringify(matrixToExportObject(m));
}
