import { InputError } from "../util/errors.js";

/**
 * Parses the fixed offset of local standard time from UTC, in hours (east positive).
 * Accepted: a number of hours (-12..14, quarter hours), or a string "UTC+02:00", "UTC-7", "UTC+5:30",
 * "+01:00", "-03:30", "UTC" / "Z". Named zones (e.g. "Europe/Oslo") are refused: they carry
 * daylight saving rules, and hourly weather is kept in standard time.
 */
export function parseUtcOffsetHours(value: unknown, where: string): number {
  let hours: number;
  if (typeof value === "number") {
    hours = value;
  } else if (typeof value === "string") {
    const s = value.trim();
    if (s === "UTC" || s === "Z" || s === "GMT") return 0;
    const m = /^(?:UTC|GMT)?\s*([+-])(\d{1,2})(?::?(\d{2}))?$/.exec(s);
    if (!m) {
      throw new InputError(
        `${where}: unknown time zone form ${JSON.stringify(value)}; expected a fixed UTC offset of local standard time such as "UTC+02:00", "UTC-7" or a number of hours`,
      );
    }
    const minutes = m[3] === undefined ? 0 : Number(m[3]);
    if (minutes >= 60) throw new InputError(`${where}: minutes of ${JSON.stringify(value)} must be below 60`);
    hours = (m[1] === "-" ? -1 : 1) * (Number(m[2]) + minutes / 60);
  } else {
    throw new InputError(`${where}: expected a UTC offset (number of hours or "UTC+hh:mm"), got ${JSON.stringify(value)}`);
  }
  if (!Number.isFinite(hours) || hours < -12 || hours > 14) {
    throw new InputError(`${where}: UTC offset ${String(value)} is outside −12..+14 hours`);
  }
  if (Math.abs(hours * 4 - Math.round(hours * 4)) > 1e-9) {
    throw new InputError(`${where}: UTC offset ${String(value)} must be a whole number of quarter hours`);
  }
  return hours;
}

/** "+02:00" / "-07:00" / "+05:30" for an offset in hours (ISO-8601 suffix). */
export function formatUtcOffset(hours: number): string {
  const sign = hours < 0 ? "-" : "+";
  const total = Math.round(Math.abs(hours) * 60);
  const hh = String(Math.floor(total / 60)).padStart(2, "0");
  const mm = String(total % 60).padStart(2, "0");
  return `${sign}${hh}:${mm}`;
}
