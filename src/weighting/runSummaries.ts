import { dirname, relative } from "node:path";
import type { ResponseMatrix } from "../response/responseMatrix.js";
import { photocurrentWeights, spectrumFromSpec, type Spectrum } from "../spectrum/index.js";
import { pairedWeightedDifference } from "../response/pairedDifference.js";
import { pairingProblem } from "../response/pairedMoments.js";
import { pointIndex } from "../response/responseMatrix.js";
import type { SweepPlan } from "../sweep/plan.js";
import { writeRunJson, type BestCombo, type RunCombo, type RunRecord } from "../sweep/runFiles.js";
import { matrixPath } from "../sweep/sweepPaths.js";
import { writePhotocurrentSummary } from "./writePhotocurrent.js";

/**
 * Spectral weighting of a finished run directory: per combination `photocurrent.json` and `iam.csv`
 * under the study's spectrum beside its matrix, then run.json rewritten with the summaries' names and
 * the first direction's Jsc. A photocurrent that cannot be computed (e.g. a grid outside the
 * spectrum) is reported through onNotice; the matrices stand. Partial matrices get no summary.
 * Returns every file of the run: per combination its matrix and summaries, then run.json.
 */
export function writeRunPhotocurrent(
  outDir: string,
  plan: SweepPlan,
  matrices: ResponseMatrix[],
  record: RunRecord,
  onNotice: (message: string) => void = () => {},
): string[] {
  let spectrum: Spectrum | undefined;
  try {
    spectrum = spectrumFromSpec(plan.spectrum, plan.baseDir);
  } catch (err) {
    onNotice(`no photocurrent summaries: ${(err as Error).message}`);
  }
  const files: string[] = [];
  const combos = record.combos.map((c) => ({ ...c }));
  matrices.forEach((m, i) => {
    const path = matrixPath(outDir, plan.combos[i].label);
    files.push(path);
    if (spectrum === undefined || m.partial === true) return;
    try {
      const w = writePhotocurrentSummary(dirname(path), m, spectrum);
      files.push(...w.files);
      const d = w.summary.directions[0];
      const { rays, ...head } = combos[i];
      combos[i] = {
        ...head,
        summaries: w.files.map((f) => relative(outDir, f)),
        ...(d !== undefined ? { jscFirstDirection: { thetaDeg: d.thetaDeg, phiDeg: d.phiDeg, jscMaCm2: d.jscMaCm2, jscStderrMaCm2: d.jscStderrMaCm2 } } : {}),
        rays,
      };
    } catch (err) {
      onNotice(`${plan.combos[i].label}: no photocurrent summary: ${(err as Error).message}`);
    }
  });
  const best = spectrum === undefined ? undefined : bestComboOf(combos, matrices, spectrum);
  files.push(writeRunJson(outDir, { ...record, combos, ...(best !== undefined ? { bestCombo: best } : {}) }));
  return files;
}

/**
 * The combination with the highest Jsc at the first direction and its paired difference to the
 * runner-up (undefined with fewer than two summarised combinations lit from the same side).
 */
export function bestComboOf(combos: RunCombo[], matrices: ResponseMatrix[], spectrum: Spectrum): BestCombo | undefined {
  // light from the front and from the rear are different questions: rank within one side (front
  // first), never a combination against its own rear-lit twin
  const side = (i: number): "front" | "rear" => (matrices[i]?.lightFrom === "rear" ? "rear" : "front");
  const summarised = combos.map((c, i) => ({ c, i })).filter((x) => x.c.jscFirstDirection !== undefined);
  const front = summarised.filter((x) => side(x.i) === "front");
  const ranked = (front.length >= 2 ? front : summarised.filter((x) => side(x.i) === "rear"))
    .sort((x, y) => (y.c.jscFirstDirection?.jscMaCm2 ?? 0) - (x.c.jscFirstDirection?.jscMaCm2 ?? 0));
  if (ranked.length < 2) return undefined;
  const [first, second] = ranked;
  const a = matrices[first.i];
  const b = matrices[second.i];
  const points = a.wavelengthNm.map((_, il) => pointIndex(a, 0, 0, il));
  const d = pairedWeightedDifference(a, b, "A_absorber", points, photocurrentWeights(a.wavelengthNm, spectrum));
  const dir = first.c.jscFirstDirection;
  const paired = Number.isFinite(d.pairedStderr);
  const reason = paired ? undefined : pairingProblem(a, b, "A_absorber", [first.c.label, second.c.label]);
  return {
    label: first.c.label,
    runnerUp: second.c.label,
    thetaDeg: dir?.thetaDeg ?? a.thetaDeg[0],
    phiDeg: dir?.phiDeg ?? a.phiDeg[0],
    deltaJscMaCm2: d.delta,
    deltaStderrMaCm2: d.pairedStderr,
    independentStderrMaCm2: d.independentStderr,
    errorKind: paired ? "paired" : "independent",
    ...(reason !== undefined ? { pairingReason: reason } : {}),
  };
}
