import { InputError } from "../util/errors.js";
import { parseUtcOffsetHours } from "./utcOffset.js";

/** A place on the ground (file form: `configs/sites/*.site.json`). */
export interface Site {
  name: string;
  latitudeDeg: number;
  /** East positive. */
  longitudeDeg: number;
  elevationM: number;
  /** Fixed offset of local standard time from UTC, hours (east positive). */
  utcOffsetHours: number;
  /** Ground reflectance per calendar month (12 values; a constant is expanded). */
  albedoMonthly: number[];
  /** Monthly mean clearness index K̄T = H̄/H̄0 (12 values), for synthetic weather; optional. */
  monthlyClearness?: number[];
  /** Linke turbidity per month for the clear-sky model (12 values; default 3 everywhere). */
  linkeTurbidityMonthly: number[];
  /**
   * Atmosphere of the clear-sky spectral model (12 monthly values each, when the file gives them):
   * aerosol optical depth at 500 nm, Ångström exponent, ozone column (atm-cm), precipitable water (cm).
   */
  aod500Monthly?: number[];
  angstromExponentMonthly?: number[];
  ozoneAtmCmMonthly?: number[];
  precipitableWaterCmMonthly?: number[];
}

/**
 * A module plane. Azimuth: degrees from north, clockwise, of the direction the front faces
 * (180 = facing south = equator-facing in the northern hemisphere; 0 = north). Tilt 0 = facing up,
 * 90 = vertical, 180 = facing down. textureRotationDeg: rotation of the texture's φ = 0 axis from
 * the module's up-slope direction, counter-clockwise seen from the front.
 */
export interface Plane {
  tiltDeg: number;
  azimuthDeg: number;
  textureRotationDeg: number;
}

const DEFAULT_LINKE = 3;

function isObject(v: unknown): v is Record<string, unknown> {
  return typeof v === "object" && v !== null && !Array.isArray(v);
}

function num(raw: Record<string, unknown>, key: string, src: string, lo: number, hi: number, what: string): number {
  const v = raw[key];
  if (typeof v !== "number" || !Number.isFinite(v)) {
    throw new InputError(`${src}: field "${key}" must be a number (${what}), got ${JSON.stringify(v)}`);
  }
  if (v < lo || v > hi) throw new InputError(`${src}: field "${key}" = ${v} is outside ${lo}..${hi} (${what})`);
  return v;
}

function monthly(raw: unknown, key: string, src: string, lo: number, hi: number, what: string): number[] {
  if (typeof raw === "number") {
    if (!Number.isFinite(raw) || raw < lo || raw > hi) {
      throw new InputError(`${src}: field "${key}" = ${raw} is outside ${lo}..${hi} (${what})`);
    }
    return new Array<number>(12).fill(raw);
  }
  if (!Array.isArray(raw) || raw.length !== 12) {
    throw new InputError(`${src}: field "${key}" must be a number or an array of 12 monthly values (${what})`);
  }
  return raw.map((v, i) => {
    if (typeof v !== "number" || !Number.isFinite(v) || v < lo || v > hi) {
      throw new InputError(`${src}: field "${key}[${i}]" = ${JSON.stringify(v)} must be a number in ${lo}..${hi} (${what})`);
    }
    return v;
  });
}

const SITE_KEYS = new Set([
  "name", "description", "latitudeDeg", "longitudeDeg", "elevationM", "utcOffsetHours", "albedo",
  "monthlyClearness", "linkeTurbidity", "aod500", "angstromExponent", "ozoneAtmCm", "precipitableWaterCm",
]);

/** Checks a parsed site object; `src` names the file in errors. */
export function siteFromObject(raw: unknown, src: string): Site {
  if (!isObject(raw)) throw new InputError(`${src}: a site file must hold a JSON object`);
  for (const k of Object.keys(raw)) {
    if (!SITE_KEYS.has(k)) {
      throw new InputError(`${src}: unknown field "${k}" (known: ${[...SITE_KEYS].join(", ")})`);
    }
  }
  if (typeof raw.name !== "string" || raw.name.trim() === "" || raw.name.length > 200 || /[\u0000-\u001f\u007f-\u009f]/.test(raw.name)) {
    throw new InputError(`${src}: name: expected a non-empty string of at most 200 characters without control characters, got ${JSON.stringify(typeof raw.name === "string" ? raw.name.slice(0, 60) : raw.name)}`);
  }
  const site: Site = {
    name: raw.name,
    latitudeDeg: num(raw, "latitudeDeg", src, -90, 90, "degrees, north positive"),
    longitudeDeg: num(raw, "longitudeDeg", src, -180, 180, "degrees, east positive"),
    elevationM: raw.elevationM === undefined ? 0 : num(raw, "elevationM", src, -500, 9000, "metres above sea level"),
    utcOffsetHours: parseUtcOffsetHours(raw.utcOffsetHours, `${src}: field "utcOffsetHours"`),
    albedoMonthly: monthly(raw.albedo ?? 0.2, "albedo", src, 0, 1, "ground reflectance"),
    linkeTurbidityMonthly: monthly(raw.linkeTurbidity ?? DEFAULT_LINKE, "linkeTurbidity", src, 1, 10, "Linke turbidity"),
  };
  const optionalMonthly: [keyof Site & string, string, number, number, string][] = [
    ["aod500Monthly", "aod500", 0, 3, "aerosol optical depth at 500 nm"],
    ["angstromExponentMonthly", "angstromExponent", 0, 3, "Ångström exponent"],
    ["ozoneAtmCmMonthly", "ozoneAtmCm", 0.1, 0.6, "ozone column, atm-cm"],
    ["precipitableWaterCmMonthly", "precipitableWaterCm", 0, 10, "precipitable water, cm"],
  ];
  for (const [field, key, lo, hi, what] of optionalMonthly) {
    if (raw[key] !== undefined) (site as unknown as Record<string, number[]>)[field] = monthly(raw[key], key, src, lo, hi, what);
  }
  if (raw.monthlyClearness !== undefined) {
    site.monthlyClearness = monthly(raw.monthlyClearness, "monthlyClearness", src, 0.05, 0.8, "monthly mean clearness index");
  }
  return site;
}

/** Checks a plane; `where` names the flag or field in errors. */
export function checkPlane(plane: Plane, where = "plane"): Plane {
  const { tiltDeg, azimuthDeg, textureRotationDeg } = plane;
  if (!Number.isFinite(tiltDeg) || tiltDeg < 0 || tiltDeg > 180) {
    throw new InputError(`${where}: tilt ${tiltDeg}° is outside 0–180° (0 = facing up, 90 = vertical, 180 = facing down)`);
  }
  if (!Number.isFinite(azimuthDeg) || azimuthDeg < 0 || azimuthDeg > 360) {
    throw new InputError(`${where}: azimuth ${azimuthDeg}° is outside 0–360° (degrees from north, clockwise; 180 = facing south)`);
  }
  if (!Number.isFinite(textureRotationDeg)) throw new InputError(`${where}: texture rotation must be a number of degrees`);
  return plane;
}
