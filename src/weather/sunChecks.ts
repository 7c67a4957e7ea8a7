import { DEG } from "../util/math.js";
import type { SunTrack } from "../sky/sunPosition.js";
import type { WeatherYear } from "./weatherYear.js";

/** Closure is checked only with the sun this high and this much light (common practice, BSRN-style). */
const CLOSURE_MAX_ZENITH_DEG = 85;
const CLOSURE_MIN_GHI_WM2 = 50;
/** A "gross" violation: off by more than 50 W/m² and 20 % of GHI. */
const CLOSURE_ABS_WM2 = 50;
const CLOSURE_REL = 0.2;

/**
 * Checks the weather against the sun and handles night: with the sun below the horizon at the hour's
 * centre, DNI is set to zero (counted). Gross violations of GHI ≈ DNI cos z + DHI are counted as
 * warnings, not errors (measured data often has them). Modifies `w.dniWm2` in place; appends warnings.
 */
export function checkAgainstSun(w: WeatherYear, track: SunTrack): void {
  let nightBeam = 0, nightGlobal = 0, closure = 0, firstClosure = -1;
  for (let i = 0; i < w.ghiWm2.length; i++) {
    const z = track.zenithDeg[i]!;
    if (z >= 90) {
      if (w.dniWm2[i]! > 0) {
        nightBeam++;
        w.dniWm2[i] = 0;
      }
      if (w.ghiWm2[i]! > 5) nightGlobal++;
      continue;
    }
    const ghi = w.ghiWm2[i]!;
    if (z <= CLOSURE_MAX_ZENITH_DEG && ghi >= CLOSURE_MIN_GHI_WM2) {
      const sum = w.dniWm2[i]! * Math.cos(z * DEG) + w.dhiWm2[i]!;
      const diff = Math.abs(ghi - sum);
      if (diff > CLOSURE_ABS_WM2 && diff > CLOSURE_REL * ghi) {
        closure++;
        if (firstClosure < 0) firstClosure = i;
      }
    }
  }
  if (nightBeam > 0) w.warnings.push(`${nightBeam} hour(s) with DNI > 0 while the sun is below the horizon at mid-hour: DNI set to 0`);
  if (nightGlobal > 0) w.warnings.push(`${nightGlobal} hour(s) with GHI > 5 W/m² while the sun is below the horizon at mid-hour (kept as diffuse)`);
  if (closure > 0) {
    w.warnings.push(
      `${closure} hour(s) violate closure |GHI − (DNI cos z + DHI)| > max(50 W/m², 20 % GHI) (first at ${new Date(w.hourStartUtcMs[firstClosure]!).toISOString()}); the components are used as given`,
    );
  }
}
