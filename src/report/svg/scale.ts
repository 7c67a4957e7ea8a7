/**
 * Axis scales (data → pixel), tick choice and tick labels, from d3-scale and d3-format. Pure
 * functions, no SVG and no DOM.
 */
import { format } from "d3-format";
import { scaleLinear, scaleLog } from "d3-scale";

export interface Scale {
  readonly kind: "linear" | "log";
  readonly domain: readonly [number, number];
  readonly range: readonly [number, number];
  (value: number): number;
}

function wrap(kind: Scale["kind"], f: (v: number) => number, domain: readonly [number, number], range: readonly [number, number]): Scale {
  const s = ((v: number) => f(v)) as Scale;
  return Object.assign(s, { kind, domain, range });
}

export function linearScale(domain: readonly [number, number], range: readonly [number, number]): Scale {
  const d = domain[0] === domain[1] ? [domain[0], domain[0] + 1] : domain;
  const s = scaleLinear().domain(d as [number, number]).range(range as [number, number]);
  return wrap("linear", (v) => s(v), domain, range);
}

/** Base-10 logarithmic scale; the domain must be positive. */
export function logScale(domain: readonly [number, number], range: readonly [number, number]): Scale {
  const s = scaleLog().domain(domain as [number, number]).range(range as [number, number]);
  return wrap("log", (v) => s(v), domain, range);
}

/** Domain widened outward to whole tick steps (d3's nice); a constant series is padded around. */
export function niceDomain(min: number, max: number, count = 6): [number, number] {
  if (!Number.isFinite(min) || !Number.isFinite(max)) return [0, 1];
  if (min === max) {
    const pad = min === 0 ? 1 : Math.abs(min) * 0.1;
    return [min - pad, max + pad];
  }
  return scaleLinear().domain([min, max]).nice(count).domain() as [number, number];
}

/** About `count` ticks at 1, 2 or 5 × 10^k steps inside the domain (d3's ticks). */
export function linearTicks(domain: readonly [number, number], count = 6): number[] {
  return scaleLinear().domain(domain as [number, number]).ticks(count);
}

/** Decade ticks (and 2, 5 between them when the domain spans under three decades). */
export function logTicks(domain: readonly [number, number]): number[] {
  const lo = Math.min(domain[0], domain[1]);
  const hi = Math.max(domain[0], domain[1]);
  const decades = Math.log10(hi / lo);
  const keep = decades <= 2 + 1e-9 ? [1, 2, 5] : [1];
  return scaleLog()
    .domain([lo, hi])
    .ticks()
    .filter((v) => keep.some((m) => Math.abs(v / 10 ** Math.floor(Math.log10(v) + 1e-9) - m) < 1e-6));
}

/** Log domain widened to whole decades around [min, max] (d3's nice; both > 0). */
export function logDomain(min: number, max: number): [number, number] {
  const lo = min > 0 && Number.isFinite(min) ? min : 1e-6;
  const hi = max > lo && Number.isFinite(max) ? max : lo * 10;
  return scaleLog().domain([lo, hi]).nice().domain() as [number, number];
}

const SUPERSCRIPT_DIGITS: Record<string, string> = {
  "0": "⁰", "1": "¹", "2": "²", "3": "³", "4": "⁴", "5": "⁵", "6": "⁶", "7": "⁷", "8": "⁸", "9": "⁹", "-": "⁻",
};

/** Integer exponent in Unicode superscript digits (renders without markup in any SVG viewer). */
export function superscript(k: number): string {
  return String(k).replace(/[-0-9]/g, (c) => SUPERSCRIPT_DIGITS[c]!);
}

const plain = format("~g");
const grouped = format(",~g");
const scientific = format(".3~e");

/**
 * Short tick label: no float noise (d3-format "~g"), thousands grouped ("12,000"), powers of ten
 * (2×10⁻⁴, 10⁶) below 10⁻³ and from 10⁶ on.
 */
export function formatTick(v: number): string {
  if (v === 0) return "0";
  const a = Math.abs(v);
  if (a >= 1e6 || a < 1e-3) {
    const [m, k] = scientific(v).split("e") as [string, string];
    const exp = superscript(Number(k));
    return m === "1" ? `10${exp}` : m === "-1" ? `−10${exp}` : `${m}×10${exp}`;
  }
  return a >= 1e4 ? grouped(v) : plain(v);
}
