/** Axis scales (data → pixel) and tick choice. Pure functions, no SVG. */

export interface Scale {
  readonly kind: "linear" | "log";
  readonly domain: readonly [number, number];
  readonly range: readonly [number, number];
  (value: number): number;
}

export function linearScale(domain: readonly [number, number], range: readonly [number, number]): Scale {
  const [d0, d1] = domain;
  const [r0, r1] = range;
  const span = d1 - d0 || 1;
  const f = ((v: number) => r0 + ((v - d0) / span) * (r1 - r0)) as Scale;
  return Object.assign(f, { kind: "linear" as const, domain, range });
}

/** Base-10 logarithmic scale; the domain must be positive. */
export function logScale(domain: readonly [number, number], range: readonly [number, number]): Scale {
  const l0 = Math.log10(domain[0]);
  const l1 = Math.log10(domain[1]);
  const span = l1 - l0 || 1;
  const [r0, r1] = range;
  const f = ((v: number) => r0 + ((Math.log10(v) - l0) / span) * (r1 - r0)) as Scale;
  return Object.assign(f, { kind: "log" as const, domain, range });
}

/**
 * "Nice" step of about span/target: 1, 2 or 5 × 10^k (Heckbert, "Nice numbers for graph labels",
 * Graphics Gems, 1990).
 */
export function niceStep(span: number, target: number): number {
  if (!(span > 0) || !Number.isFinite(span)) return 1;
  const raw = span / Math.max(1, target);
  const mag = 10 ** Math.floor(Math.log10(raw));
  const f = raw / mag;
  const nice = f < 1.5 ? 1 : f < 3 ? 2 : f < 7 ? 5 : 10;
  return nice * mag;
}

/** Domain widened outward to whole nice steps. */
export function niceDomain(min: number, max: number, target = 6): [number, number] {
  if (!Number.isFinite(min) || !Number.isFinite(max)) return [0, 1];
  if (min === max) {
    const pad = min === 0 ? 1 : Math.abs(min) * 0.1;
    return [min - pad, max + pad];
  }
  const step = niceStep(max - min, target);
  return [Math.floor(min / step + 1e-9) * step, Math.ceil(max / step - 1e-9) * step];
}

/** Ticks at multiples of a nice step within the domain. */
export function linearTicks(domain: readonly [number, number], target = 6): number[] {
  const [a, b] = domain[0] <= domain[1] ? domain : [domain[1], domain[0]];
  const step = niceStep(b - a, target);
  const ticks: number[] = [];
  const first = Math.ceil(a / step - 1e-9);
  const last = Math.floor(b / step + 1e-9);
  for (let k = first; k <= last; k++) ticks.push(Number((k * step).toPrecision(12)));
  return ticks;
}

/** Decade ticks (and 2, 5 between them when the domain spans under three decades). */
export function logTicks(domain: readonly [number, number]): number[] {
  const lo = Math.min(domain[0], domain[1]);
  const hi = Math.max(domain[0], domain[1]);
  const k0 = Math.floor(Math.log10(lo) + 1e-9);
  const k1 = Math.ceil(Math.log10(hi) - 1e-9);
  const mults = k1 - k0 <= 2 ? [1, 2, 5] : [1];
  const ticks: number[] = [];
  for (let k = k0; k <= k1; k++) {
    for (const m of mults) {
      const v = Number((m * 10 ** k).toPrecision(12));
      if (v >= lo * (1 - 1e-9) && v <= hi * (1 + 1e-9)) ticks.push(v);
    }
  }
  return ticks;
}

/** Log domain widened to the nearest 1, 2 or 5 × 10^k around [min, max] (both > 0). */
export function logDomain(min: number, max: number): [number, number] {
  const lo = min > 0 && Number.isFinite(min) ? min : 1e-6;
  const hi = max > lo && Number.isFinite(max) ? max : lo * 10;
  const down = (v: number) => {
    const k = Math.floor(Math.log10(v) + 1e-9);
    const m = v / 10 ** k;
    return (m >= 5 - 1e-9 ? 5 : m >= 2 - 1e-9 ? 2 : 1) * 10 ** k;
  };
  const up = (v: number) => {
    const k = Math.floor(Math.log10(v) - 1e-9);
    const m = v / 10 ** k;
    return (m <= 1 + 1e-9 ? 1 : m <= 2 + 1e-9 ? 2 : m <= 5 + 1e-9 ? 5 : 10) * 10 ** k;
  };
  return [Number(down(lo).toPrecision(12)), Number(up(hi).toPrecision(12))];
}

/** Short tick label: no float noise, powers of ten for very large or very small values. */
export function formatTick(v: number): string {
  if (v === 0) return "0";
  const a = Math.abs(v);
  if (a >= 1e5 || a < 1e-3) {
    const k = Math.floor(Math.log10(a) + 1e-9);
    const m = Number((v / 10 ** k).toPrecision(3));
    return m === 1 ? `10${superscript(k)}` : `${m}×10${superscript(k)}`;
  }
  return String(Number(v.toPrecision(6)));
}

const SUPERSCRIPT_DIGITS: Record<string, string> = {
  "0": "⁰", "1": "¹", "2": "²", "3": "³", "4": "⁴", "5": "⁵", "6": "⁶", "7": "⁷", "8": "⁸", "9": "⁹", "-": "⁻",
};

/** Integer exponent in Unicode superscript digits (renders without markup in any SVG viewer). */
export function superscript(k: number): string {
  return String(k).replace(/[-0-9]/g, (c) => SUPERSCRIPT_DIGITS[c]!);
}
