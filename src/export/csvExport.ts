import { stringify } from "csv-stringify/sync";
import { matrixIndex, type ResponseMatrix } from "../response/responseMatrix.js";

/** Column names of the tidy CSV export, one row per (theta, phi, wavelength, channel). */
export const CSV_COLUMNS = ["theta_deg", "phi_deg", "wavelength_nm", "channel", "value", "stderr"] as const;

/**
 * Shortest text that parses back to the same double (ECMAScript Number::toString), so a CSV
 * reader gets every value bit for bit.
 */
function numberCell(value: number): string {
  return Object.is(value, -0) ? "-0" : String(value);
}

/** The matrix as tidy CSV rows, in the matrix's index order [theta][phi][lambda][channel]. */
export function matrixToCsv(m: ResponseMatrix): string {
  const rows: (string | number)[][] = [];
  for (let it = 0; it < m.thetaDeg.length; it++) {
    for (let ip = 0; ip < m.phiDeg.length; ip++) {
      for (let il = 0; il < m.wavelengthNm.length; il++) {
        for (let ic = 0; ic < m.channels.length; ic++) {
          const k = matrixIndex(m, it, ip, il, ic);
          rows.push([m.thetaDeg[it], m.phiMode === "averaged" ? "averaged" : m.phiDeg[ip], m.wavelengthNm[il], m.channels[ic], m.mean[k], m.stderr[k]]);
        }
      }
    }
  }
  return stringify(rows, {
    header: true,
    columns: [...CSV_COLUMNS],
    cast: { number: numberCell },
  });
}
