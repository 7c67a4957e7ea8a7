import { DEG } from "../util/math.js";

/**
 * Solar constant, W/m². 1367 W/m² (World Radiation Centre value used by Duffie & Beckman) — the
 * empirical sky models here (Perez 1990, Erbs 1982, Ineichen–Perez) were fitted with it.
 */
export const SOLAR_CONSTANT_WM2 = 1367;

/**
 * Earth–sun distance factor (R_av/R)², Spencer (1971) Fourier form:
 * 1.00011 + 0.034221 cos b + 0.00128 sin b + 0.000719 cos 2b + 0.000077 sin 2b, b = 2π(n − 1)/365.
 */
export function spencerEccentricity(dayOfYear: number): number {
  const b = (2 * Math.PI * (dayOfYear - 1)) / 365;
  return 1.00011 + 0.034221 * Math.cos(b) + 0.00128 * Math.sin(b) + 0.000719 * Math.cos(2 * b) + 0.000077 * Math.sin(2 * b);
}

/** Extraterrestrial irradiance on a plane normal to the sun, W/m². */
export function extraterrestrialNormalWm2(dayOfYear: number): number {
  return SOLAR_CONSTANT_WM2 * spencerEccentricity(dayOfYear);
}

/** Relative optical air mass, Kasten & Young, Appl. Opt. 28, 4735 (1989); z in degrees (≤ 90). */
export function kastenYoungAirMass(zenithDeg: number): number {
  const z = Math.min(zenithDeg, 90);
  return 1 / (Math.cos(z * DEG) + 0.50572 * Math.pow(96.07995 - z, -1.6364));
}
