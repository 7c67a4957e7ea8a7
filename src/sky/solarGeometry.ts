import { DEG, RAD } from "../util/math.js";

// Handbook relations of Duffie & Beckman, Solar Engineering of Thermal Processes (ch. 1), kept in
// their own conventions: surface azimuth γ from south, west positive; hour angle ω negative mornings.

/** Declination by Cooper (1969), D&B Eq. 1.6.1a: δ = 23.45 sin(360 (284 + n)/365), degrees. */
export function cooperDeclinationDeg(dayOfYear: number): number {
  return 23.45 * Math.sin(((360 * (284 + dayOfYear)) / 365) * DEG);
}

/** cos θ of beam incidence on a surface, D&B Eq. 1.6.2 (all angles in degrees). */
export function cosIncidenceDB(
  latitudeDeg: number,
  declinationDeg: number,
  slopeDeg: number,
  surfaceAzimuthFromSouthDeg: number,
  hourAngleDeg: number,
): number {
  const sd = Math.sin(declinationDeg * DEG), cd = Math.cos(declinationDeg * DEG);
  const sp = Math.sin(latitudeDeg * DEG), cp = Math.cos(latitudeDeg * DEG);
  const sb = Math.sin(slopeDeg * DEG), cb = Math.cos(slopeDeg * DEG);
  const sg = Math.sin(surfaceAzimuthFromSouthDeg * DEG), cg = Math.cos(surfaceAzimuthFromSouthDeg * DEG);
  const so = Math.sin(hourAngleDeg * DEG), co = Math.cos(hourAngleDeg * DEG);
  return sd * sp * cb - sd * cp * sb * cg + cd * cp * cb * co + cd * sp * sb * cg * co + cd * sb * sg * so;
}

/** cos of the zenith angle, D&B Eq. 1.6.5 (the horizontal case of Eq. 1.6.2). */
export function cosZenithDB(latitudeDeg: number, declinationDeg: number, hourAngleDeg: number): number {
  return cosIncidenceDB(latitudeDeg, declinationDeg, 0, 0, hourAngleDeg);
}

/** Sunset hour angle, D&B Eq. 1.6.10: cos ωs = −tan φ tan δ (degrees; 0 or 180 in polar night/day). */
export function sunsetHourAngleDeg(latitudeDeg: number, declinationDeg: number): number {
  const c = -Math.tan(latitudeDeg * DEG) * Math.tan(declinationDeg * DEG);
  return Math.acos(Math.max(-1, Math.min(1, c))) * RAD;
}
