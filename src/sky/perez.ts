import { DEG } from "../util/math.js";
import { kastenYoungAirMass } from "./irradianceBasics.js";

/**
 * Perez, Ineichen, Seals, Michalsky & Stewart, Solar Energy 44, 271 (1990): "all sites composite"
 * brightness coefficients per sky-clearness bin, rows (f11 f12 f13 f21 f22 f23).
 */
export const PEREZ_1990: readonly (readonly number[])[] = [
  [-0.0083117, 0.5877285, -0.0620636, -0.0596012, 0.0721249, -0.0220216],
  [0.1299457, 0.6825954, -0.1513752, -0.0189325, 0.065965, -0.0288748],
  [0.3296958, 0.4868735, -0.2210958, 0.055414, -0.0639588, -0.0260542],
  [0.5682053, 0.1874525, -0.295129, 0.1088631, -0.1519229, -0.0139754],
  [0.873028, -0.3920403, -0.3616149, 0.2255647, -0.4620442, 0.0012448],
  [1.1326077, -1.2367284, -0.4118494, 0.2877813, -0.8230357, 0.0558651],
  [1.0601591, -1.5999137, -0.3589221, 0.2642124, -1.127234, 0.1310694],
  [0.677747, -0.3272588, -0.2504286, 0.1561313, -1.3765031, 0.2506212],
];

/** Upper edges of sky-clearness bins 1..7 (bin 8: ε ≥ 6.2). */
export const PEREZ_EPSILON_EDGES = [1.065, 1.23, 1.5, 1.95, 2.8, 4.5, 6.2];

/** κ for the zenith in radians (Perez 1990). */
const KAPPA = 1.041;

export interface PerezBrightness {
  /** Circumsolar brightness coefficient F1 (≥ 0). */
  f1: number;
  /** Horizon brightness coefficient F2 (may be negative). */
  f2: number;
  /** Sky clearness ε and brightness Δ. */
  epsilon: number;
  delta: number;
  /** Clearness bin 1..8. */
  bin: number;
}

/** Perez 1990 F1, F2 for one hour (zenith < 90°, DHI > 0). */
export function perezBrightness(zenithDeg: number, dhiWm2: number, dniWm2: number, e0nWm2: number): PerezBrightness {
  const z = zenithDeg * DEG;
  const kz3 = KAPPA * z * z * z;
  const epsilon = ((dhiWm2 + dniWm2) / dhiWm2 + kz3) / (1 + kz3);
  const delta = (dhiWm2 * kastenYoungAirMass(zenithDeg)) / e0nWm2;
  let bin = 0;
  while (bin < PEREZ_EPSILON_EDGES.length && epsilon >= PEREZ_EPSILON_EDGES[bin]) bin++;
  const c = PEREZ_1990[bin];
  const f1 = Math.max(0, c[0] + c[1] * delta + z * c[2]);
  const f2 = c[3] + c[4] * delta + z * c[5];
  return { f1, f2, epsilon, delta, bin: bin + 1 };
}
