import { join } from "node:path";
import { loadStudy } from "../src/study/load.js";
import type { Study } from "../src/study/studyTypes.js";
import { RandomStream, streamKey } from "../src/random/stream.js";
import { compileStack, type CompileOptions } from "../src/trace/compile.js";
import type { CompiledStack } from "../src/trace/compiledStack.js";
import { estimatorAt, traceBatch } from "../src/trace/kernel.js";
import { createTally, summarizeTally } from "../src/trace/tally.js";
import { summarizeTrapping } from "../src/trace/trappingSummary.js";
import { packageRoot } from "../src/util/packageRoot.js";
import { loadavg } from "node:os";
import { photocurrentWeights, spectrumFromSpec } from "../src/spectrum/index.js";

/** The studies the demo traces (demo/main.ts), each combination and light side. */
export const DEMO_STUDY_FILES = ["configs/demo-random-pyramids.study.json", "configs/demo-planar.study.json", "configs/glass-glass-bifacial.study.json"];

/** Per-ray mean and variance of the exit channel (R from the front, the rear exit from the rear) and of A_absorber, and CPU µs per ray. */
interface PointRun {
  usPerRay: number;
  exit: number;
  varExit: number;
  a: number;
  varA: number;
}

/** Merit of the default estimator over the analog one at one grid point: FOM_default / FOM_analog per channel. */
export interface PointMerit {
  thetaDeg: number;
  wavelengthNm: number;
  exit: number;
  absorber: number;
  /** Measured again with RECHECK_FACTOR × the rays after a first look below 1. */
  rechecked: boolean;
  /** Per-ray variance of A_absorber and CPU µs per ray, analog and default (for the photocurrent's merit). */
  varAAnalog: number;
  varADefault: number;
  usAnalog: number;
  usDefault: number;
}

export const RECHECK_FACTOR = 4;
/** Interleaved timing rounds per point (the same seeded rays each round). */
const MERIT_ROUNDS = 3;

const ANALOG: CompileOptions = { estimator: "analog" };
const DEFAULT: CompileOptions = {};

/** One seeded run at a point (the same rays every time it is called): means, per-ray variances, CPU µs per ray. */
function runPoint(cs: CompiledStack, study: Study, thetaDeg: number, wavelengthNm: number, nRays: number): PointRun {
  const side = study.lightFrom ?? "front";
  const phi = study.grid.phiMode === "averaged" ? null : study.grid.phiDeg[0];
  const t = createTally(cs);
  const c0 = process.cpuUsage();
  traceBatch(cs, thetaDeg, phi, nRays, new RandomStream(streamKey(study.seed, "merit", thetaDeg, wavelengthNm)), t, "unpolarized", side);
  const c = process.cpuUsage(c0);
  const s = summarizeTally(cs.channels, t);
  const tr = summarizeTrapping(t, cs.channels.length);
  const exit = side === "rear" ? tr.transmissionTotal : tr.reflectionTotal;
  const ia = cs.channels.indexOf("A_absorber");
  return { usPerRay: (c.user + c.system) / nRays, exit: exit.mean, varExit: exit.stderr ** 2 * nRays, a: s.mean[ia], varA: s.stderr[ia] ** 2 * nRays };
}

function bernoulli(p: number): number {
  return p > 0 && p < 1 ? p * (1 - p) : 0;
}

/** FOM ratio default/analog = (var_a·t_a)/(var_d·t_d); equal variances of zero count as 1. */
function meritRatio(analogVar: number, analogUs: number, defaultVar: number, defaultUs: number): number {
  if (analogVar === 0 && defaultVar === 0) return 1;
  if (defaultVar === 0) return Infinity;
  return (analogVar * analogUs) / (defaultVar * defaultUs);
}

/** Default-over-analog merit at one point: interleaved runs, so a change of machine load hits both alike. */
function pointMerit(analog: CompiledStack, dflt: CompiledStack, study: Study, thetaDeg: number, wavelengthNm: number, nRays: number): PointMerit {
  if (estimatorAt(dflt, thetaDeg) === "analog") {
    // the default is the analog estimator here: the same rays, the same merit
    const a = runPoint(analog, study, thetaDeg, wavelengthNm, nRays);
    const v = bernoulli(a.a);
    return { thetaDeg, wavelengthNm, exit: 1, absorber: 1, rechecked: false, varAAnalog: v, varADefault: v, usAnalog: a.usPerRay, usDefault: a.usPerRay };
  }
  // interleaved rounds (a change of machine load hits both alike); the least CPU time counts
  let a = runPoint(analog, study, thetaDeg, wavelengthNm, nRays);
  let d = runPoint(dflt, study, thetaDeg, wavelengthNm, nRays);
  for (let k = 1; k < MERIT_ROUNDS; k++) {
    const a2 = runPoint(analog, study, thetaDeg, wavelengthNm, nRays);
    const d2 = runPoint(dflt, study, thetaDeg, wavelengthNm, nRays);
    if (a2.usPerRay < a.usPerRay) a = a2;
    if (d2.usPerRay < d.usPerRay) d = d2;
  }
  const aUs = a.usPerRay;
  const dUs = d.usPerRay;
  // An analog ray puts its whole power in one channel, so a channel's per-ray variance is p(1 − p);
  // p from the default run's sharper mean (a rare channel may show no analog ray at all).
  return {
    thetaDeg,
    wavelengthNm,
    exit: meritRatio(bernoulli(d.exit), aUs, d.varExit, dUs),
    absorber: meritRatio(bernoulli(d.a), aUs, d.varA, dUs),
    rechecked: false,
    varAAnalog: bernoulli(d.a),
    varADefault: d.varA,
    usAnalog: aUs,
    usDefault: dUs,
  };
}

/**
 * Default-over-analog merit at every (θ, λ) of one study combination (the first azimuth, or random
 * azimuths). A point below 1 is measured again with RECHECK_FACTOR times the rays (a short run times
 * two estimators that are within 10–20 % of each other to about ±10 %); the recheck replaces it.
 */
export function studyMerits(study: Study, registry: Parameters<typeof compileStack>[1], nRays: number): PointMerit[] {
  const out: PointMerit[] = [];
  const only = (process.env.LIGHTFOLD_BENCH_MERIT_WAVELENGTHS ?? "").split(",").filter((x) => x.trim() !== "").map(Number);
  for (const wavelengthNm of study.grid.wavelengthNm) {
    if (only.length > 0 && !only.includes(wavelengthNm)) continue;
    const analog = compileStack(study.stack, registry, wavelengthNm, ANALOG);
    const dflt = compileStack(study.stack, registry, wavelengthNm, DEFAULT);
    for (const thetaDeg of study.grid.thetaDeg) {
      let m = pointMerit(analog, dflt, study, thetaDeg, wavelengthNm, nRays);
      if (m.exit < 1 || m.absorber < 1) m = { ...pointMerit(analog, dflt, study, thetaDeg, wavelengthNm, RECHECK_FACTOR * nRays), rechecked: true };
      out.push(m);
    }
  }
  return out;
}

/**
 * Merit for the photocurrent at each angle: AM1.5G-weighted A_absorber summed over the study's
 * wavelengths with the same rays at every wavelength, so its variance is Σ w²·var and its time Σ t;
 * FOM(default)/FOM(analog) = (Σ w² var_a · Σ t_a) / (Σ w² var_d · Σ t_d). A point's share of the
 * summed variance counts against its share of the summed time, unlike in the per-point ratios.
 */
export function photocurrentMerits(m: PointMerit[], wavelengthsNm: number[]): { thetaDeg: number; ratio: number }[] {
  const w = photocurrentWeights(wavelengthsNm, spectrumFromSpec("AM1.5G", packageRoot()));
  const byTheta = new Map<number, PointMerit[]>();
  for (const p of m) byTheta.set(p.thetaDeg, [...(byTheta.get(p.thetaDeg) ?? []), p]);
  return [...byTheta].map(([thetaDeg, pts]) => {
    let va = 0, vd = 0, ta = 0, td = 0;
    for (const p of pts) {
      const wi = w[wavelengthsNm.indexOf(p.wavelengthNm)];
      va += wi * wi * p.varAAnalog;
      vd += wi * wi * p.varADefault;
      ta += p.usAnalog;
      td += p.usDefault;
    }
    return { thetaDeg, ratio: vd > 0 ? (va * ta) / (vd * td) : Infinity };
  });
}

function worst(m: PointMerit[], key: "exit" | "absorber"): PointMerit {
  return m.reduce((a, b) => (b[key] < a[key] ? b : a));
}

function median(xs: number[]): number {
  const s = [...xs].sort((a, b) => a - b);
  return s[Math.floor(s.length / 2)];
}

/**
 * Default estimator against lightfold's analog one at every grid point of the demo studies (front,
 * and rear for the bifacial study): FOM ratio per point for the exit channel (R, or the rear exit
 * when lit from the rear) and A_absorber. LIGHTFOLD_BENCH_MERIT_RAYS rays per run (default 4000),
 * CPU time the least of interleaved runs; LIGHTFOLD_BENCH_MERIT_WAVELENGTHS=1050,1100 keeps only those
 * grid wavelengths.
 */
export async function runEstimatorMapBench(): Promise<void> {
  const nRays = Number(process.env.LIGHTFOLD_BENCH_MERIT_RAYS ?? "4000");
  process.stdout.write(
    `estimators at every point of the demo studies: FOM(default)/FOM(analog), ${nRays} rays per run; load average ${loadavg()[0].toFixed(1)}\n`,
  );
  process.stdout.write(`  study / light                  points   exit: min (θ, λ)        median   A_absorber: min (θ, λ)  median   rechecked (${RECHECK_FACTOR}× rays)   still < 1\n`);
  for (const file of DEMO_STUDY_FILES) {
    const loaded = loadStudy(join(packageRoot(), file));
    for (const combo of loaded.combos) {
      const study = combo.study;
      const m = studyMerits(study, loaded.registry, nRays);
      const we = worst(m, "exit");
      const wa = worst(m, "absorber");
      const below = m.filter((p) => p.exit < 1 || p.absorber < 1);
      const where = (p: PointMerit): string => `(${p.thetaDeg}°, ${p.wavelengthNm} nm)`.padEnd(16);
      process.stdout.write(
        `  ${`${loaded.name} / ${study.lightFrom ?? "front"}`.padEnd(30)} ${String(m.length).padStart(6)}   ${we.exit.toFixed(2).padStart(5)} ${where(we)} ${median(m.map((p) => p.exit)).toFixed(2).padStart(6)}` +
          `   ${wa.absorber.toFixed(2).padStart(5)} ${where(wa)} ${median(m.map((p) => p.absorber)).toFixed(2).padStart(6)}   ${String(m.filter((p) => p.rechecked).length).padStart(8)}              ${below.length}\n`,
      );
      const pc = photocurrentMerits(m, [...new Set(m.map((p) => p.wavelengthNm))]);
      process.stdout.write(`      photocurrent (AM1.5G-weighted A_absorber, same rays at every λ), FOM(default)/FOM(analog) per θ: ${pc.map((x) => `${x.thetaDeg}° ${x.ratio.toFixed(2)}`).join(", ")}\n`);
      for (const p of below.slice(0, 8)) {
        process.stdout.write(`      below 1 at θ ${p.thetaDeg}°, λ ${p.wavelengthNm} nm: exit ${p.exit.toFixed(2)}, A_absorber ${p.absorber.toFixed(2)}\n`);
      }
    }
  }
}
