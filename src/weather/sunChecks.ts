import { extraterrestrialNormalWm2 } from "../sky/irradianceBasics.js";
import type { SunTrack } from "../sky/sunPosition.js";
import { InputError } from "../util/errors.js";
import { checkPlausibility } from "./plausibility.js";
import type { WeatherYear } from "./weatherYear.js";

/**
 * Checks the weather against the sun: the plausibility rules (src/weather/plausibility.ts) refuse
 * impossible values and recognised unit mistakes (InputError naming the file and lines) and add
 * warnings with counts for rare ones; then, with the sun below the horizon at the hour's centre,
 * DNI is set to zero (counted). Modifies `w.dniWm2` in place; appends warnings.
 */
export function checkAgainstSun(w: WeatherYear, track: SunTrack): void {
  const n = w.ghiWm2.length;
  const e0n = new Float64Array(n);
  for (let i = 0; i < n; i++) e0n[i] = extraterrestrialNormalWm2(track.dayOfYear[i]!);
  const p = checkPlausibility(w, track.zenithDeg, e0n);
  if (p.unitMistake !== undefined) {
    throw new InputError(
      `${w.source}: the irradiance values look like ${p.unitMistake.unit}, not W/m²: the clearest daytime hours have a clearness index GHI/(E0n·cos z) of ${p.kt99.toPrecision(3)} (99th percentile; W/m² data give about 0.3–1.2)` +
        (p.errorCount > 0 ? `; ${p.errorCount} value(s) beyond the physically possible limits, first ${p.errors[0]}` : ""),
      `${p.unitMistake.fix}; the weather CSV holds hourly mean irradiance in W/m²`,
    );
  }
  if (p.errorCount > 0) {
    const more = p.errorCount > p.errors.length ? `\n  … and ${p.errorCount - p.errors.length} more` : "";
    throw new InputError(
      `${w.source}: ${p.errorCount} value(s) beyond the physically possible limits (BSRN quality control, Long & Shi 2008):\n  ${p.errors.join("\n  ")}${more}`,
      "irradiance is the hour's mean in W/m²; check the file's units and its time stamps (start of the hour, with the offset)",
    );
  }
  w.warnings.push(...p.warnings);
  let nightBeam = 0, nightGlobal = 0;
  for (let i = 0; i < n; i++) {
    if (track.zenithDeg[i]! < 90) continue;
    if (w.dniWm2[i]! > 0) {
      nightBeam++;
      w.dniWm2[i] = 0;
    }
    if (w.ghiWm2[i]! > 5) nightGlobal++;
  }
  if (nightBeam > 0) w.warnings.push(`${nightBeam} hour(s) with DNI > 0 while the sun is below the horizon at mid-hour: DNI set to 0`);
  if (nightGlobal > 0) w.warnings.push(`${nightGlobal} hour(s) with GHI > 5 W/m² while the sun is below the horizon at mid-hour (kept as diffuse)`);
}
