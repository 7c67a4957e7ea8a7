import { appendFileSync } from "node:fs";
import { expect } from "vitest";
import type { Material } from "../../src/materials/types.js";
import { MaterialRegistry } from "../../src/materials/registry.js";
import { RandomStream, streamKey } from "../../src/random/stream.js";
import type { StackSpec, TextureSpec } from "../../src/study/stackTypes.js";
import { compileStack, type CompileOptions, type MaterialSource } from "../../src/trace/compile.js";
import { traceBatch, type Polarization } from "../../src/trace/kernel.js";
import { createTally, summarizeTally, type TallySummary } from "../../src/trace/tally.js";
import { summarizeTrapping } from "../../src/trace/trappingSummary.js";

/** A dispersionless test material (n, k constant over 1–100000 nm). */
export function constantMaterial(name: string, n: number, k: number): Material {
  return { name, description: `test medium n=${n}, k=${k}`, source: "test", minWavelengthNm: 1, maxWavelengthNm: 1e5, nk: () => ({ n, k }) };
}

/** Built-in registry plus the given test materials. */
export function registryWith(...materials: Material[]): MaterialSource {
  const builtins = MaterialRegistry.withBuiltins();
  const extra = new Map(materials.map((m) => [m.name, m]));
  return { get: (name: string) => extra.get(name) ?? builtins.get(name) };
}

export function stackOf(parts: Partial<StackSpec> & { absorber: StackSpec["absorber"]; rear: StackSpec["rear"] }, front?: TextureSpec): StackSpec {
  return {
    incidence: parts.incidence ?? "air",
    layers: parts.layers ?? [],
    front: parts.front ?? { texture: front ?? { type: "planar" }, films: [] },
    absorber: parts.absorber,
    rear: parts.rear,
    boundary: parts.boundary ?? "periodic",
  };
}

export interface TraceRun extends TallySummary {
  tally: Float64Array;
  get(channel: string): { mean: number; se: number };
  /** R = R_first + R_escape or T = T_first + T_escape, the error from the per-ray totals (tallyLayout.ts). */
  total(kind: "R" | "T"): { mean: number; se: number };
}

export function runTrace(
  stack: StackSpec,
  registry: MaterialSource,
  opts: {
    wavelengthNm?: number;
    thetaDeg?: number;
    phiDeg?: number | null;
    nRays?: number;
    seed?: number;
    polarization?: Polarization;
    compile?: CompileOptions;
  } = {},
): TraceRun {
  const cs = compileStack(stack, registry, opts.wavelengthNm ?? 1000, opts.compile);
  const tally = createTally(cs);
  const rng = new RandomStream(streamKey(opts.seed ?? 1, "test"));
  traceBatch(cs, opts.thetaDeg ?? 0, opts.phiDeg === undefined ? 0 : opts.phiDeg, opts.nRays ?? 10000, rng, tally, opts.polarization);
  const s = summarizeTally(cs.channels, tally);
  return {
    ...s,
    tally,
    get(channel: string) {
      const i = cs.channels.indexOf(channel);
      if (i < 0) throw new Error(`no channel ${channel} in ${cs.channels.join(", ")}`);
      return { mean: s.mean[i], se: s.stderr[i] };
    },
    total(kind: "R" | "T") {
      const t = summarizeTrapping(tally, cs.channels.length);
      const e = kind === "R" ? t.reflectionTotal : t.transmissionTotal;
      return { mean: e.mean, se: e.stderr };
    },
  };
}

/** z-score of a Monte Carlo estimate against a reference; a zero error only matches exactly. */
export function zScore(est: { mean: number; se: number }, reference: number): number {
  const d = est.mean - reference;
  if (est.se === 0) return Math.abs(d) < 1e-12 ? 0 : Infinity;
  return d / est.se;
}

/** Fresnel power reflectances of a real-index interface (Hecht, Optics, eqs. 4.42–4.43). */
export function fresnelRsRp(n1: number, n2: number, cosI: number): { Rs: number; Rp: number; cosT: number } {
  const sinI = Math.sqrt(1 - cosI * cosI);
  const sinT = (n1 / n2) * sinI;
  if (sinT >= 1) return { Rs: 1, Rp: 1, cosT: 0 };
  const cosT = Math.sqrt(1 - sinT * sinT);
  const rs = (n1 * cosI - n2 * cosT) / (n1 * cosI + n2 * cosT);
  const rp = (n2 * cosI - n1 * cosT) / (n2 * cosI + n1 * cosT);
  return { Rs: rs * rs, Rp: rp * rp, cosT };
}

/**
 * Asserts |z| < 4 and, when LIGHTFOLD_Z_REPORT names a file, appends "label: estimate ± se vs
 * reference (z = …)" to it (used to record validation figures in the developer notes).
 */
export function expectWithin4Sigma(label: string, est: { mean: number; se: number }, reference: number): void {
  const z = zScore(est, reference);
  const file = process.env.LIGHTFOLD_Z_REPORT;
  if (file) {
    appendFileSync(file, `${label}: ${est.mean.toFixed(6)} ± ${est.se.toFixed(6)} vs ${reference.toFixed(6)} (z = ${z.toFixed(2)})\n`);
  }
  expect(Math.abs(z), `${label}: ${est.mean} ± ${est.se} vs ${reference}`).toBeLessThan(4);
}

/**
 * Exponential integral E3(x) = ∫₀¹ μ e^(−x/μ) dμ (Abramowitz & Stegun 5.1.4 with t = 1/μ), by
 * composite Simpson's rule; the integrand is smooth on [0, 1] for x ≥ 0.
 */
export function expIntegral3(x: number): number {
  const n = 20000;
  const h = 1 / n;
  const f = (mu: number): number => (mu === 0 ? 0 : mu * Math.exp(-x / mu));
  let s = f(0) + f(1);
  for (let i = 1; i < n; i++) s += (i % 2 === 1 ? 4 : 2) * f(i * h);
  return (s * h) / 3;
}

/**
 * Interface-table interpolation error bound: the tracer reads R, T and film absorptances from tables
 * over cos θ, worst measured 6.7e-5 at 1024 rows (README, Interface tables). Estimates that the
 * splitting estimator makes exact (zero spread) are compared with it instead of a z-score.
 */
export const TABLE_ERROR = 1e-4;

/** |estimate − reference| < 4σ + the table error (an estimate the splitting estimator makes exact has σ = 0). */
export function expectWithin4SigmaOrTable(label: string, est: { mean: number; se: number }, reference: number): void {
  const file = process.env.LIGHTFOLD_Z_REPORT;
  if (file) appendFileSync(file, `${label}: ${est.mean.toFixed(6)} ± ${est.se.toFixed(6)} vs ${reference.toFixed(6)} (difference ${(est.mean - reference).toExponential(2)}, z = ${zScore(est, reference).toFixed(2)})\n`);
  expect(Math.abs(est.mean - reference), `${label}: ${est.mean} ± ${est.se} vs ${reference}`).toBeLessThan(4 * est.se + TABLE_ERROR);
}
