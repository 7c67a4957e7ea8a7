import type { ResponseMatrix } from "./responseMatrix.js";

/** Where a matrix came from: the fields every file derived from it (exports, photocurrent summary) copies. */
export interface MatrixProvenance {
  toolVersion: string;
  studyName: string;
  studyHash: string;
  seed: number;
  combo: Record<string, number>;
  phiMode: ResponseMatrix["phiMode"];
  /** True when the matrix came from an incomplete set of shards (missing points count as zero). */
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
