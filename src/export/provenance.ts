import type { ResponseMatrix } from "../response/responseMatrix.js";

/** Where an exported matrix came from: the fields every export copies from its response matrix. */
export interface MatrixProvenance {
  toolVersion: string;
  studyName: string;
  studyHash: string;
  seed: number;
  combo: Record<string, number>;
  phiMode: ResponseMatrix["phiMode"];
  partial: boolean;
}

/** The provenance fields of `m`, in the order the export files list them. */
export function matrixProvenance(m: ResponseMatrix): MatrixProvenance {
  return {
    toolVersion: m.toolVersion,
    studyName: m.studyName,
    studyHash: m.studyHash,
    seed: m.seed,
    combo: m.combo,
    phiMode: m.phiMode,
    partial: m.partial === true,
  };
}
