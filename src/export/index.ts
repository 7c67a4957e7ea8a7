export { encodeNpyFloat64, npyHeader, pythonShape, NPY_MAGIC, NPY_ALIGN } from "./npy.js";
export { matrixToCsv, CSV_COLUMNS } from "./csvExport.js";
export { matrixToExportJson, matrixToExportObject, EXPORT_DIMS, JSON_EXPORT_FORMAT, type MatrixJsonExport } from "./jsonExport.js";
export { matrixToNpy, NPY_SIDECAR_FORMAT, type NpySidecar, type NpyExport, type NpyArrayEntry } from "./npyExport.js";
export { matrixProvenance, type MatrixProvenance } from "../response/provenance.js";
export { writeExport, defaultExportPath, parseExportFormat, EXPORT_FORMATS, type ExportFormat } from "./writeExport.js";
