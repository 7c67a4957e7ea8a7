import { getPosition } from "suncalc";

/** Apparent sun position: zenith (with refraction) and azimuth from north, clockwise, in degrees. */
export interface SunPosition {
  zenithDeg: number;
  azimuthDeg: number;
}

/**
 * Sun position at an instant (UTC milliseconds) with suncalc 2 (Meeus ch. 25 solar coordinates,
 * Meeus 16.4 refraction at standard atmosphere; geocentric, no parallax: ≤ 0.0025°).
 */
export function sunPositionAt(utcMs: number, latitudeDeg: number, longitudeDeg: number): SunPosition {
  const p = getPosition(new Date(utcMs), latitudeDeg, longitudeDeg);
  let az = p.azimuth % 360;
  if (az < 0) az += 360;
  return { zenithDeg: 90 - p.altitude, azimuthDeg: az };
}

/** Hour stamps mark the start of an hour; the hour's sun is taken at its centre (start + 30 min). */
export const HOUR_CENTRE_OFFSET_MS = 30 * 60 * 1000;

/** Tilt-independent sun track of a series of hours (typed arrays, one entry per hour). */
export interface SunTrack {
  zenithDeg: Float64Array;
  azimuthDeg: Float64Array;
  /** Day of year (1..366) of the hour centre in UTC. */
  dayOfYear: Int16Array;
}

/** Sun at the centre of each hour starting at `hourStartUtcMs[i]`. */
export function sunTrack(hourStartUtcMs: ArrayLike<number>, latitudeDeg: number, longitudeDeg: number): SunTrack {
  const n = hourStartUtcMs.length;
  const zenithDeg = new Float64Array(n);
  const azimuthDeg = new Float64Array(n);
  const dayOfYear = new Int16Array(n);
  for (let i = 0; i < n; i++) {
    const t = hourStartUtcMs[i] + HOUR_CENTRE_OFFSET_MS;
    const p = sunPositionAt(t, latitudeDeg, longitudeDeg);
    zenithDeg[i] = p.zenithDeg;
    azimuthDeg[i] = p.azimuthDeg;
    dayOfYear[i] = dayOfYearUtc(t);
  }
  return { zenithDeg, azimuthDeg, dayOfYear };
}

/** Day of year (1 = 1 January) of a UTC instant. */
export function dayOfYearUtc(utcMs: number): number {
  const d = new Date(utcMs);
  const start = Date.UTC(d.getUTCFullYear(), 0, 1);
  return Math.floor((utcMs - start) / 86_400_000) + 1;
}
