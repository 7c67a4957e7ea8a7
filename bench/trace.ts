import { MaterialRegistry } from "../src/materials/registry.js";
import { RandomStream, streamKey } from "../src/random/stream.js";
import type { StackSpec } from "../src/study/stackTypes.js";
import { compileStack } from "../src/trace/compile.js";
import type { Estimator } from "../src/trace/compiledStack.js";
import { traceBatch } from "../src/trace/kernel.js";
import { createTally, summarizeTally } from "../src/trace/tally.js";

/**
 * Reference case: bare regular upright 54.74° pyramids of 10 µm base on the front of 180 µm Si
 * (from the pyramid base plane to the rear), planar rear with an ideal mirror of reflectance 0.95,
 * Si from Green 2008, normal incidence, 10^5 rays, fixed seed.
 */
export const BENCH_STACK: StackSpec = {
  incidence: "air",
  layers: [],
  front: { texture: { type: "upright-pyramids", baseUm: 10, facetAngleDeg: 54.74 }, films: [] },
  absorber: { material: "Si-Green2008", thicknessUm: 180 },
  rear: { ideal: { kind: "mirror", reflectance: 0.95 } },
  boundary: "periodic",
};

export const BENCH_WAVELENGTHS_NM = [1000, 600, 1150];
export const BENCH_RAYS = 100_000;
export const BENCH_SEED = 20240601;
/** Timed repetitions per wavelength (the fastest counts). */
export const BENCH_REPEATS = 5;

export interface TraceBenchRow {
  wavelengthNm: number;
  estimator: Estimator;
  nRays: number;
  /** CPU seconds of the timed run (one thread). */
  seconds: number;
  wallSeconds: number;
  raysPerSecond: number;
  eventsPerRay: number;
  eventsPerSecond: number;
  R: number;
  A: number;
  T: number;
  A_rear: number;
}

/** Runs the reference case once per wavelength on this thread; returns the figures. */
export function traceBenchRows(estimator: Estimator = "expected", nRays = BENCH_RAYS): TraceBenchRow[] {
  const registry = MaterialRegistry.withBuiltins();
  const rows: TraceBenchRow[] = [];
  for (const wavelengthNm of BENCH_WAVELENGTHS_NM) {
    const cs = compileStack(BENCH_STACK, registry, wavelengthNm, { estimator });
    // Warm-up so the timed run measures optimised code.
    traceBatch(cs, 0, 0, 20000, new RandomStream(streamKey(BENCH_SEED, "warmup", wavelengthNm)), createTally(cs));
    // The same seeded run BENCH_REPEATS times (identical tallies); the fastest is reported, which
    // on a shared machine is the closest to the speed of an unloaded core.
    let tally = createTally(cs);
    let seconds = Infinity;
    let wallSeconds = Infinity;
    for (let rep = 0; rep < BENCH_REPEATS; rep++) {
      tally = createTally(cs);
      const rng = new RandomStream(streamKey(BENCH_SEED, "bench", wavelengthNm));
      const t0 = process.hrtime.bigint();
      const c0 = process.cpuUsage();
      traceBatch(cs, 0, 0, nRays, rng, tally);
      const cpu = process.cpuUsage(c0);
      wallSeconds = Math.min(wallSeconds, Number(process.hrtime.bigint() - t0) * 1e-9);
      // CPU time of this (single-threaded) process: the figure for one core even on a busy machine.
      seconds = Math.min(seconds, (cpu.user + cpu.system) * 1e-6);
    }
    const s = summarizeTally(cs.channels, tally);
    const at = (name: string): number => s.mean[cs.channels.indexOf(name)];
    rows.push({
      wavelengthNm,
      estimator,
      nRays,
      seconds,
      wallSeconds,
      raysPerSecond: nRays / seconds,
      eventsPerRay: s.eventsPerRay,
      eventsPerSecond: (s.eventsPerRay * nRays) / seconds,
      R: at("R"),
      A: at("A_absorber"),
      T: at("T"),
      A_rear: at("A_rear"),
    });
  }
  return rows;
}

/** Prints the tracer benchmark (called by bench/main.ts). */
export async function runTraceBench(): Promise<void> {
  const rows = traceBenchRows();
  process.stdout.write(
    "trace: upright 54.74° pyramids 10 µm, 180 µm Si (Green 2008), ideal rear mirror 0.95, normal incidence, " +
      `${BENCH_RAYS} rays, one thread, ${rows[0].estimator}-value estimator (per CPU second of this process, fastest of ${BENCH_REPEATS})\n`,
  );
  process.stdout.write("  λ (nm)   rays/s    events/ray  facet events/s      R        A_Si     A_rear     T      wall s\n");
  for (const r of rows) {
    process.stdout.write(
      `  ${String(r.wavelengthNm).padStart(6)} ${fmt(r.raysPerSecond, 9, 0)} ${fmt(r.eventsPerRay, 11, 2)} ${fmt(r.eventsPerSecond, 15, 0)}` +
        ` ${fmt(r.R, 9, 4)} ${fmt(r.A, 8, 4)} ${fmt(r.A_rear, 9, 4)} ${fmt(r.T, 7, 4)} ${fmt(r.wallSeconds, 8, 2)}\n`,
    );
  }
  if (process.env.LIGHTFOLD_BENCH_ESTIMATORS !== "0") printEstimatorComparison();
}

function fmt(x: number, width: number, digits: number): string {
  return x.toFixed(digits).padStart(width);
}

export interface EstimatorFigure {
  wavelengthNm: number;
  estimator: Estimator;
  rouletteWeight: number;
  /** Per-ray variance of the A_absorber and R contributions (SE² · N). */
  varA: number;
  varR: number;
  eventsPerRay: number;
  /** CPU seconds per ray. */
  secondsPerRay: number;
}

/**
 * Variance per unit cost of the estimators on the reference case. Cost is taken as (interface
 * events + 1) per ray, which tracks CPU time and, unlike a timer, does not depend on machine load.
 */
export function compareEstimators(nRays = 40_000, rouletteWeights = [0.01, 0.2]): EstimatorFigure[] {
  const registry = MaterialRegistry.withBuiltins();
  const out: EstimatorFigure[] = [];
  const configs: [Estimator, number][] = [["analog", 0], ...rouletteWeights.map((w): [Estimator, number] => ["expected", w])];
  for (const wavelengthNm of BENCH_WAVELENGTHS_NM) {
    for (const [estimator, rouletteWeight] of configs) {
      const cs = compileStack(BENCH_STACK, registry, wavelengthNm, { estimator, rouletteWeight });
      const tally = createTally(cs);
      const c0 = process.cpuUsage();
      traceBatch(cs, 0, 0, nRays, new RandomStream(streamKey(BENCH_SEED, "estimators", wavelengthNm)), tally);
      const cpu = process.cpuUsage(c0);
      const s = summarizeTally(cs.channels, tally);
      const v = (name: string): number => s.stderr[cs.channels.indexOf(name)] ** 2 * nRays;
      out.push({
        wavelengthNm,
        estimator,
        rouletteWeight,
        varA: v("A_absorber"),
        varR: v("R"),
        eventsPerRay: s.eventsPerRay,
        secondsPerRay: ((cpu.user + cpu.system) * 1e-6) / nRays,
      });
    }
  }
  return out;
}

function printEstimatorComparison(): void {
  const rows = compareEstimators();
  process.stdout.write("\nestimators (same case, 40000 rays; merit = 1/(variance per ray × (events per ray + 1)), relative to analog)\n");
  process.stdout.write("  λ (nm)  estimator        var A    var R   events/ray  merit A  merit R\n");
  let base = rows[0];
  for (const r of rows) {
    if (r.estimator === "analog") base = r;
    const merit = (v: number, x: EstimatorFigure): number => 1 / (v * (x.eventsPerRay + 1));
    const name = r.estimator === "analog" ? "analog" : `expected ${r.rouletteWeight}`;
    process.stdout.write(
      `  ${String(r.wavelengthNm).padStart(6)}  ${name.padEnd(14)} ${fmt(r.varA, 8, 4)} ${fmt(r.varR, 8, 4)} ${fmt(r.eventsPerRay, 11, 2)}` +
        ` ${fmt(merit(r.varA, r) / merit(base.varA, base), 8, 2)} ${fmt(merit(r.varR, r) / merit(base.varR, base), 8, 2)}\n`,
    );
  }
}
