export * from "./types.js";
export * from "./fresnel.js";
export * from "./normalCosine.js";
export * from "./thinFilm.js";
export * from "./interfaceTable.js";
export * from "./tableError.js";
export * from "./stackSpec.js";
export * from "./stackEval.js";
