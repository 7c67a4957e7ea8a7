import { isAbsolute, resolve } from "node:path";
import { InputError } from "../util/errors.js";
import { astmG173 } from "./astmG173.js";
import { loadSpectrumCsv } from "./spectrumCsv.js";
import type { Spectrum } from "./types.js";

const NAMED: Record<string, () => Spectrum> = {
  "AM1.5G": () => astmG173("global"),
  "AM1.5D": () => astmG173("direct"),
  "G173-ETR": () => astmG173("extraterrestrial"),
};

/** The study file's "spectrum": "AM1.5G" | "AM1.5D" | "G173-ETR" | { "csv": path relative to baseDir }. */
export function spectrumFromSpec(spec: unknown, baseDir: string, fieldPath = "spectrum"): Spectrum {
  if (spec === undefined) return astmG173("global");
  if (typeof spec === "string") {
    const make = NAMED[spec];
    if (make === undefined) throw new InputError(`${fieldPath}: unknown spectrum "${spec}"; expected one of ${Object.keys(NAMED).join(", ")} or { "csv": "file.csv" }`);
    return make();
  }
  if (typeof spec === "object" && spec !== null && !Array.isArray(spec)) {
    const keys = Object.keys(spec);
    const csv = (spec as Record<string, unknown>).csv;
    if (keys.length !== 1 || typeof csv !== "string" || csv === "") throw new InputError(`${fieldPath}: expected { "csv": "file.csv" }`);
    const s = loadSpectrumCsv(isAbsolute(csv) ? csv : resolve(baseDir, csv));
    return { ...s, name: csv };
  }
  throw new InputError(`${fieldPath}: expected a spectrum name (${Object.keys(NAMED).join(", ")}) or { "csv": "file.csv" }`);
}
