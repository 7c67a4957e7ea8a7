import type { PhotocurrentSummary } from "./photocurrent.js";
import { ratioIndependent, type ValueWithError } from "./weightedSum.js";

/**
 * Optical bifaciality of a stack: absorber photocurrent with light from the rear over that with
 * light from the front, both at the reference angle (normal incidence when the grid has 0°) under
 * the same spectrum, azimuths averaged. The two matrices are independent Monte Carlo runs, so the
 * ratio's error is first-order propagation of both (ratioIndependent).
 */
export interface Bifaciality {
  thetaDeg: number;
  spectrum: string;
  frontJscMaCm2: ValueWithError;
  rearJscMaCm2: ValueWithError;
  bifaciality: ValueWithError;
}

function atReference(s: PhotocurrentSummary): ValueWithError {
  const ds = s.directions.filter((d) => d.thetaDeg === s.iamReferenceThetaDeg);
  let v = 0, var2 = 0;
  for (const d of ds) { v += d.jscMaCm2; var2 += d.jscStderrMaCm2 ** 2; }
  return { value: v / ds.length, stderr: Math.sqrt(var2) / ds.length };
}

export function opticalBifaciality(front: PhotocurrentSummary, rear: PhotocurrentSummary): Bifaciality {
  const f = atReference(front), r = atReference(rear);
  return { thetaDeg: front.iamReferenceThetaDeg, spectrum: front.spectrum, frontJscMaCm2: f, rearJscMaCm2: r, bifaciality: ratioIndependent(r, f) };
}

/** One line for the `spectral` table. */
export function formatBifaciality(b: Bifaciality): string {
  const x = (v: ValueWithError, d: number) => `${v.value.toFixed(d)} ± ${v.stderr.toFixed(d)}`;
  return `optical bifaciality at θ = ${b.thetaDeg}° (${b.spectrum}): rear ${x(b.rearJscMaCm2, 3)} / front ${x(b.frontJscMaCm2, 3)} mA/cm² = ${x(b.bifaciality, 4)}\n`;
}
