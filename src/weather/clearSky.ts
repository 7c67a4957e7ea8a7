import { DEG } from "../util/math.js";
import { kastenYoungAirMass } from "../sky/irradianceBasics.js";

/** Standard-atmosphere pressure ratio p/p0 at an elevation (ISA barometric formula, troposphere). */
export function pressureRatio(elevationM: number): number {
  return Math.pow(1 - 2.25577e-5 * elevationM, 5.25588);
}

/**
 * Clear-sky global horizontal irradiance, Ineichen & Perez, Solar Energy 73(3), 151–157 (2002), the
 * global model on p. 156: GHI = cg1 · E0n · cos z · exp(−cg2 · AM · (fh1 + fh2 (TL − 1))),
 * cg1 = 5.09e-5 h + 0.868, cg2 = 3.92e-5 h + 0.0387, fh1 = exp(−h/8000), fh2 = exp(−h/1250), h in m.
 * The exp(0.01 AM^1.8) factor belongs to the satellite model of Perez et al., Solar Energy 73, 307
 * (2002), p. 311, and is left out. AM: Kasten–Young relative air mass × p/p0 (the pressure-corrected
 * air mass; open implementations differ here, see DEVELOPERS.md — the difference is under 1 % below
 * about 100 m). Coefficients agree with two independent open implementations (tests/weather).
 */
export function ineichenPerezGhiWm2(zenithDeg: number, e0nWm2: number, linkeTurbidity: number, elevationM: number): number {
  if (zenithDeg >= 90) return 0;
  const h = elevationM;
  const cg1 = 5.09e-5 * h + 0.868;
  const cg2 = 3.92e-5 * h + 0.0387;
  const fh1 = Math.exp(-h / 8000);
  const fh2 = Math.exp(-h / 1250);
  const am = kastenYoungAirMass(zenithDeg) * pressureRatio(h);
  return Math.max(0, cg1 * e0nWm2 * Math.cos(zenithDeg * DEG) * Math.exp(-cg2 * am * (fh1 + fh2 * (linkeTurbidity - 1))));
}
