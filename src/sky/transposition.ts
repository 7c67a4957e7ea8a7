import { DEG } from "../util/math.js";
import { perezBrightness } from "./perez.js";

export type SkyModel = "isotropic" | "hay-davies" | "perez";
export const SKY_MODELS: readonly SkyModel[] = ["isotropic", "hay-davies", "perez"];

/** cos 85°: floor of cos z in the circumsolar ratio a/b (Perez 1990; also used here for Hay–Davies). */
export const COS_85 = Math.cos(85 * DEG);

/**
 * One hour's light split by where it arrives from, each as a source strength (W/m²) whose
 * plane-of-array irradiance is given in the comment. The yield integrates the response over the
 * same parts, so both use one decomposition.
 */
export interface SkyParts {
  /** Direct normal irradiance: POA = dni · max(0, cos θ). */
  dniWm2: number;
  /** Circumsolar point source at the sun: POA = circumsolar · max(0, cos θ). */
  circumsolarWm2: number;
  /** DHI share spread isotropically over the sky dome: POA = iso · (1 + cos β)/2. */
  isoSkyWm2: number;
  /** Horizon band strength DHI·F2: POA = horizon · sin β (line source along the horizon). */
  horizonWm2: number;
  /** Ground radiosity ρ·GHI, isotropic ground: POA = ground · (1 − cos β)/2. */
  groundWm2: number;
}

export function emptySkyParts(): SkyParts {
  return { dniWm2: 0, circumsolarWm2: 0, isoSkyWm2: 0, horizonWm2: 0, groundWm2: 0 };
}

/**
 * Splits one hour's GHI/DNI/DHI into sky parts with the chosen model (writes into `out`).
 * Isotropic (Liu & Jordan): sky = DHI (1 + cos β)/2.
 * Hay & Davies (1980): sky = DHI [Ai Rb + (1 − Ai)(1 + cos β)/2], Ai = DNI/E0n, Rb = cos θ / b.
 * Perez et al. (1990): sky = DHI [(1 − F1)(1 + cos β)/2 + F1 a/b + F2 sin β].
 * b = max(cos 85°, cos z). Ground: ρ GHI (1 − cos β)/2. Sun at or below the horizon: no beam, no
 * circumsolar or horizon part; the diffuse light is taken as isotropic.
 */
export function skyParts(
  model: SkyModel,
  zenithDeg: number,
  ghiWm2: number,
  dniWm2: number,
  dhiWm2: number,
  albedo: number,
  e0nWm2: number,
  out: SkyParts,
): SkyParts {
  out.groundWm2 = albedo * ghiWm2;
  out.horizonWm2 = 0;
  out.circumsolarWm2 = 0;
  if (zenithDeg >= 90) {
    out.dniWm2 = 0;
    out.isoSkyWm2 = dhiWm2;
    return out;
  }
  out.dniWm2 = dniWm2;
  const b = Math.max(COS_85, Math.cos(zenithDeg * DEG));
  if (model === "isotropic" || dhiWm2 <= 0) {
    out.isoSkyWm2 = dhiWm2;
  } else if (model === "hay-davies") {
    const ai = Math.min(1, Math.max(0, dniWm2 / e0nWm2));
    out.circumsolarWm2 = (dhiWm2 * ai) / b;
    out.isoSkyWm2 = dhiWm2 * (1 - ai);
  } else {
    const p = perezBrightness(zenithDeg, dhiWm2, dniWm2, e0nWm2);
    out.circumsolarWm2 = (dhiWm2 * p.f1) / b;
    out.isoSkyWm2 = dhiWm2 * (1 - p.f1);
    out.horizonWm2 = dhiWm2 * p.f2;
  }
  return out;
}

/** Closed-form plane-of-array irradiance of the parts (W/m²) for a plane of tilt β and cos θ of the sun. */
export function poaIrradianceWm2(parts: SkyParts, cosIncidence: number, tiltDeg: number): number {
  const cb = Math.cos(tiltDeg * DEG), sb = Math.sin(tiltDeg * DEG);
  const c = Math.max(0, cosIncidence);
  return (
    (parts.dniWm2 + parts.circumsolarWm2) * c +
    parts.isoSkyWm2 * 0.5 * (1 + cb) +
    parts.horizonWm2 * sb +
    parts.groundWm2 * 0.5 * (1 - cb)
  );
}
