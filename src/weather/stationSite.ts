import type { Site } from "../site/site.js";
import { InputError } from "../util/errors.js";
import type { StationMeta } from "./stationFile.js";

/** Largest disagreement between a site file and a weather file's header that is accepted, degrees. */
export const LOCATION_TOLERANCE_DEG = 0.5;
/** Ground albedo when neither a site file nor the weather file gives one (common practice: grass, 0.2). */
export const DEFAULT_ALBEDO = 0.2;

/**
 * The site of a station weather file. The file's header fixes where and in which time zone its hours
 * were recorded, so latitude, longitude, time zone and elevation come from it. A site file, when
 * given, adds albedo, turbidity and atmosphere values, and must describe the same place: latitude and
 * longitude within 0.5° and the same time zone, else the pairing is refused.
 */
export function siteForStation(meta: StationMeta, src: string, site?: Site, siteSrc = "site file"): Site {
  const fromFile = { latitudeDeg: meta.latitudeDeg, longitudeDeg: meta.longitudeDeg, utcOffsetHours: meta.utcOffsetHours, elevationM: meta.elevationM };
  if (!site) {
    return { name: meta.name, ...fromFile, albedoMonthly: new Array<number>(12).fill(DEFAULT_ALBEDO), linkeTurbidityMonthly: new Array<number>(12).fill(3) };
  }
  const dLat = Math.abs(site.latitudeDeg - meta.latitudeDeg);
  let dLon = Math.abs(site.longitudeDeg - meta.longitudeDeg) % 360;
  if (dLon > 180) dLon = 360 - dLon;
  if (dLat > LOCATION_TOLERANCE_DEG || dLon > LOCATION_TOLERANCE_DEG || site.utcOffsetHours !== meta.utcOffsetHours) {
    throw new InputError(
      `${siteSrc} (${site.latitudeDeg}°, ${site.longitudeDeg}°, UTC${site.utcOffsetHours >= 0 ? "+" : ""}${site.utcOffsetHours}) and ${src} (${meta.latitudeDeg}°, ${meta.longitudeDeg}°, UTC${meta.utcOffsetHours >= 0 ? "+" : ""}${meta.utcOffsetHours}) describe different places or time zones`,
      "drop --site to use the weather file's own location, or give the site file of that station",
    );
  }
  return { ...site, ...fromFile };
}
