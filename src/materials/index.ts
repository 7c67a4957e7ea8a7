export type { NK, Material, CatalogMaterial } from "./types.js";
export { MaterialRegistry } from "./registry.js";
export { materialFromSpec, registerStudyMaterials } from "./spec.js";
export { absorptionCoefficientPerCm, alphaPerCm } from "./absorption.js";
export { parseNkCsv, type NkColumns } from "./nkCsv.js";
export { sellmeierIndex, cauchyIndex, powerSeriesIndex } from "./formulas.js";
export { interpolateLinear, interpolateLogPositive, findInterval } from "./interpolate.js";
export { formatRangeNm } from "./composedMaterial.js";
export { BUILTIN_ALIASES } from "./builtins.js";
