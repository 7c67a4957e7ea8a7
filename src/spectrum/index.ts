export type { Spectrum } from "./types.js";
export { astmG173, G173_NAMES, type G173Kind } from "./astmG173.js";
export { loadSpectrumCsv, parseSpectrumCsv } from "./spectrumCsv.js";
export { spectrumFromSpec } from "./spectrumSpec.js";
export { photonFluxPerNm } from "./photonFlux.js";
export { trapezoid, totalIrradianceWm2 } from "./integrate.js";
export { photocurrentWeights, photocurrentMaCm2, photocurrentStdErrMaCm2, weightedSum } from "./photocurrent.js";
