import { readFileSync } from "node:fs";
import { parseNumericTable } from "../materials/numericTable.js";
import { dataPath } from "../util/packageRoot.js";
import type { Spectrum } from "./types.js";

export type G173Kind = "global" | "direct" | "extraterrestrial";

const COLUMN: Record<G173Kind, string> = {
  extraterrestrial: "extraterrestrial",
  global: "global_tilt",
  direct: "direct_circumsolar",
};

/** Names used in reports and study files. */
export const G173_NAMES: Record<G173Kind, string> = {
  global: "AM1.5G",
  direct: "AM1.5D",
  extraterrestrial: "G173-ETR",
};

let cache: ReturnType<typeof parseNumericTable> | null = null;

/**
 * ASTM G173-03 reference spectra (280–4000 nm, W m⁻² nm⁻¹): "global" = hemispherical on a 37°
 * tilted surface (AM1.5G), "direct" = direct normal + circumsolar (AM1.5D), "extraterrestrial".
 * The table is read once per process; each call returns fresh arrays.
 */
export function astmG173(kind: G173Kind): Spectrum {
  if (cache === null) cache = parseNumericTable(readFileSync(dataPath("spectra", "astm-g173.csv"), "utf8"), "data/spectra/astm-g173.csv");
  const c = cache.header.indexOf(COLUMN[kind]);
  if (c < 0) throw new Error(`data/spectra/astm-g173.csv lacks column ${COLUMN[kind]}`);
  return {
    name: G173_NAMES[kind],
    wavelengthNm: cache.columns[0]!.slice(),
    irradianceWm2PerNm: cache.columns[c]!.slice(),
  };
}
