import { basename, dirname, join } from "node:path";
import type { ResponseMatrix } from "../response/responseMatrix.js";
import { writeFileAtomic } from "../util/atomicWrite.js";
import { InputError } from "../util/errors.js";
import { compactJson } from "./compactJson.js";
import { matrixToCsv } from "./csvExport.js";
import { matrixToExportJson } from "./jsonExport.js";
import { matrixToNpy } from "./npyExport.js";

export const EXPORT_FORMATS = ["csv", "json", "npy"] as const;
export type ExportFormat = (typeof EXPORT_FORMATS)[number];

export function parseExportFormat(text: string): ExportFormat {
  if ((EXPORT_FORMATS as readonly string[]).includes(text)) return text as ExportFormat;
  throw new InputError(`--format: expected one of ${EXPORT_FORMATS.join(", ")}, got "${text}"`);
}

/** `run/base/matrix.json` → `run/base/matrix` (the stem the default export names start from). */
function stemOf(matrixPath: string): string {
  return matrixPath.replace(/\.json$/i, "");
}

/**
 * Default output path: `<stem>.csv`, `<stem>.export.json`, and for npy the sidecar `<stem>.npy.json`
 * with the arrays `<stem>_mean.npy`, … beside it.
 */
export function defaultExportPath(matrixPath: string, format: ExportFormat): string {
  const stem = stemOf(matrixPath);
  if (format === "csv") return `${stem}.csv`;
  if (format === "json") return `${stem}.export.json`;
  return `${stem}.npy.json`;
}

/**
 * Writes an export; returns the paths written (for npy: the arrays first, the sidecar last). Every
 * byte is computed before the first write, and each file is written atomically, so a failure never
 * leaves a half-written file under a final name.
 */
export function writeExport(m: ResponseMatrix, format: ExportFormat, outPath: string): string[] {
  if (format === "csv") {
    writeFileAtomic(outPath, matrixToCsv(m));
    return [outPath];
  }
  if (format === "json") {
    writeFileAtomic(outPath, matrixToExportJson(m));
    return [outPath];
  }
  const dir = dirname(outPath);
  const sidecarName = basename(outPath);
  const prefix = sidecarName.replace(/\.npy\.json$/i, "").replace(/\.json$/i, "");
  if (prefix === "" || prefix === sidecarName) {
    throw new InputError(`--out: for --format npy give the sidecar path ending in ".json" (e.g. matrix.npy.json), got "${outPath}"`);
  }
  const { sidecar, files } = matrixToNpy(m, prefix);
  const sidecarText = compactJson(sidecar);
  const written: string[] = [];
  for (const [name, bytes] of files) {
    const p = join(dir, name);
    writeFileAtomic(p, bytes);
    written.push(p);
  }
  writeFileAtomic(outPath, sidecarText);
  written.push(outPath);
  return written;
}
