import { InputError } from "../util/errors.js";
import type { RaysPlan, StudyGrid } from "./studyTypes.js";
import type { MaterialLookup } from "./validateStack.js";

/** Most grid points a study may have over all combinations (the runner keeps a tally per point). */
export const MAX_STUDY_POINTS = 2_000_000;
/** Most rays a study may plan (10¹³ ≈ 4 core-months at 10⁶ rays/s: a cluster-sized run). */
export const MAX_STUDY_RAYS = 1e13;
/** Highest extinction coefficient of an incidence medium (the light must reach the stack). */
export const MAX_INCIDENCE_K = 0.01;

/**
 * Cross-field limits of a study that no single field can state: points = combinations × θ × φ × λ,
 * rays = points × rays per point (the cap in target-error mode). Refused with what was found.
 */
export function checkStudySize(grid: StudyGrid, rays: RaysPlan, nCombos: number): void {
  const points = nCombos * grid.thetaDeg.length * grid.phiDeg.length * grid.wavelengthNm.length;
  const where = `${nCombos} combination(s) × ${grid.thetaDeg.length} θ × ${grid.phiDeg.length} φ × ${grid.wavelengthNm.length} λ`;
  if (points > MAX_STUDY_POINTS) {
    throw new InputError(`grid: ${where} = ${points} points, more than the ${MAX_STUDY_POINTS} a study may have`, "coarser steps, fewer sweep values, or split the study");
  }
  const perPoint = rays.mode === "fixed" ? rays.perPoint : rays.maxPerPoint;
  const total = points * perPoint;
  if (total > MAX_STUDY_RAYS) {
    const field = rays.mode === "fixed" ? "rays.perPoint" : "rays.maxPerPoint";
    throw new InputError(
      `${field}: ${perPoint} rays at each of ${points} points (${where}) = ${total.toExponential(2)} rays, more than the ${MAX_STUDY_RAYS.toExponential(0)} a study may plan`,
      "fewer rays per point (a target error stops points early), or fewer points",
    );
  }
}

/** The incidence medium must be transparent over the study's wavelengths (not a metal). */
export function checkIncidenceMedium(name: string, registry: MaterialLookup | undefined, wavelengthsNm: readonly number[], path: string): void {
  const m = registry?.get(name) as { nk?(l: number): { k: number }; minWavelengthNm?: number; maxWavelengthNm?: number } | undefined;
  if (m?.nk === undefined) return;
  for (const l of wavelengthsNm) {
    if (m.minWavelengthNm !== undefined && (l < m.minWavelengthNm || l > (m.maxWavelengthNm ?? Infinity))) continue;
    const k = m.nk(l).k;
    if (k > MAX_INCIDENCE_K) {
      throw new InputError(
        `${path}: "${name}" absorbs (k = ${k.toPrecision(3)} at ${l} nm); the incidence medium must be transparent (k ≤ ${MAX_INCIDENCE_K}) over the grid`,
        'light arrives through it: e.g. "air" or a glass; a metal belongs at the rear',
      );
    }
  }
}
