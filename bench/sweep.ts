import { availableParallelism } from "node:os";
import { join } from "node:path";
import { loadStudy, withOverrides, type LoadedStudy } from "../src/study/load.js";
import { runSweep } from "../src/sweep/runSweep.js";
import { packageRoot } from "../src/util/packageRoot.js";

/**
 * Sweep runner figures: the reference sweep (bench stack, 18 angles × 91 wavelengths × 2000 rays)
 * with 1 worker and with all workers: wall time, rays/s, speed-up, parallel efficiency; then the
 * peak resident memory as the rays per point and the grid grow (it must stay flat: tallies, not rays).
 *
 *   LIGHTFOLD_BENCH_SWEEP_SCALE   fraction of the 91 wavelengths to use (default 1; e.g. 0.1 for a quick run)
 *   LIGHTFOLD_BENCH_WORKERS       the "all workers" count (default os.availableParallelism())
 */
export async function runSweepBench(): Promise<void> {
  const scale = Number(process.env.LIGHTFOLD_BENCH_SWEEP_SCALE ?? "1");
  if (!(scale > 0 && scale <= 1)) throw new Error(`LIGHTFOLD_BENCH_SWEEP_SCALE: expected a number in (0, 1], got ${process.env.LIGHTFOLD_BENCH_SWEEP_SCALE}`);
  const nAll = Number(process.env.LIGHTFOLD_BENCH_WORKERS ?? availableParallelism());
  const base = loadStudy(join(packageRoot(), "configs", "bench-pyramids.study.json"));
  const nWl = Math.max(2, Math.round(91 * scale));
  const study = reshaped(base, nWl, 2000);
  const g = study.combos[0].study.grid;
  const rays = g.thetaDeg.length * g.wavelengthNm.length * 2000;
  out(`reference sweep: bench-pyramids, ${g.thetaDeg.length} angles × ${g.wavelengthNm.length} wavelengths × 2000 rays = ${rays.toExponential(3)} rays`);
  out(`cores: ${availableParallelism()} available; "all workers" = ${nAll}`);

  // Warm-up (JIT, material tables) on a tiny slice, not timed.
  await runSweep({ study: reshaped(base, 2, 200), workers: nAll });

  const timed = async (workers: number): Promise<{ r: Awaited<ReturnType<typeof runSweep>>; cpuS: number }> => {
    const c0 = process.cpuUsage();
    const r = await runSweep({ study, workers });
    const c = process.cpuUsage(c0);
    return { r, cpuS: (c.user + c.system) / 1e6 };
  };
  const t1 = await timed(1);
  const tN = await timed(nAll);
  const one = t1.r;
  const all = tN.r;
  const same = one.matrices[0].mean.every((v, i) => Object.is(v, all.matrices[0].mean[i]));
  const speedup = one.wallS / all.wallS;
  out("");
  // cpu/wall shows whether the threads got their cores (below the worker count: the machine is shared).
  // rays per CPU-second compares the work done per core independent of contention; their ratio is
  // the work efficiency (pool, messaging and merge overhead), the bound the parallel efficiency
  // reaches on an otherwise idle machine.
  out("workers  wall_s   rays/s      speed-up  efficiency  cpu_s/wall_s  rays/cpu_s");
  out(`${row(1, one.wallS, rays / one.wallS, 1, 1)}  ${(t1.cpuS / one.wallS).toFixed(2).padStart(12)}  ${Math.round(rays / t1.cpuS).toString().padStart(10)}`);
  out(`${row(nAll, all.wallS, rays / all.wallS, speedup, speedup / nAll)}  ${(tN.cpuS / all.wallS).toFixed(2).padStart(12)}  ${Math.round(rays / tN.cpuS).toString().padStart(10)}`);
  out(`work efficiency (rays/cpu_s with ${nAll} ÷ with 1): ${(t1.cpuS / tN.cpuS).toFixed(3)}`);
  out(`1-worker and ${nAll}-worker matrices bit-identical: ${same}`);

  // Memory: peak RSS (process-wide, monotone) after runs of growing size.
  out("");
  out("peak RSS as the work grows (process-wide maximum so far, all threads):");
  out("wavelengths  rays/point  rays        peak_RSS_MiB");
  for (const [wl, perPoint] of [[Math.max(2, Math.round(nWl / 4)), 2000], [nWl, 2000], [nWl, 8000]] as const) {
    const s = reshaped(base, wl, perPoint);
    const r = await runSweep({ study: s, workers: nAll });
    const total = r.raysTraced;
    out(`${String(wl).padStart(11)}  ${String(perPoint).padStart(10)}  ${total.toExponential(3).padStart(10)}  ${(process.resourceUsage().maxRSS / 1024).toFixed(1).padStart(12)}`);
  }
}

/** The bench study with the first nWl of its 91 wavelengths spread over 300–1200 nm, perPoint rays. */
function reshaped(base: LoadedStudy, nWl: number, perPoint: number): LoadedStudy {
  const st = base.combos[0].study;
  const step = (1200 - 300) / (nWl - 1);
  const wavelengthNm = Array.from({ length: nWl }, (_, i) => Math.round((300 + i * step) * 1e6) / 1e6);
  return withOverrides(base, { grid: { ...st.grid, wavelengthNm }, rays: { mode: "fixed", perPoint, batch: 1000 } });
}

function row(workers: number, wallS: number, raysPerS: number, speedup: number, eff: number): string {
  return `${String(workers).padStart(7)}  ${wallS.toFixed(2).padStart(6)}  ${Math.round(raysPerS).toString().padStart(10)}  ${speedup.toFixed(2).padStart(8)}  ${eff.toFixed(3).padStart(10)}`;
}

function out(line: string): void {
  process.stdout.write(line + "\n");
}
