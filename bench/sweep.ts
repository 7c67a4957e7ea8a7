import { availableParallelism } from "node:os";
import { join } from "node:path";
import { loadStudy, withOverrides, type LoadedStudy } from "../src/study/load.js";
import { runSweep, workerSetupOf } from "../src/sweep/runSweep.js";
import { TracePool } from "../src/workers/pool.js";
import { packageRoot } from "../src/util/packageRoot.js";

/**
 * Sweep runner figures: the reference sweep (bench stack, 18 angles × 91 wavelengths × 2000 rays)
 * with 1 worker and with all workers: wall time, rays/s, speed-up, parallel efficiency; then the
 * peak resident memory as the rays per point and the grid grow (it must stay flat: tallies, not rays).
 *
 *   LIGHTFOLD_BENCH_SWEEP_SCALE   fraction of the 91 wavelengths to use (default 1; e.g. 0.1 for a quick run)
 *   LIGHTFOLD_BENCH_WORKERS       the "all workers" count (default os.availableParallelism())
 *   LIGHTFOLD_BENCH_REPS          warm-pool repetitions, best one reported (default 3)
 */
export async function runSweepBench(): Promise<void> {
  const scale = Number(process.env.LIGHTFOLD_BENCH_SWEEP_SCALE ?? "1");
  if (!(scale > 0 && scale <= 1)) throw new Error(`LIGHTFOLD_BENCH_SWEEP_SCALE: expected a number in (0, 1], got ${process.env.LIGHTFOLD_BENCH_SWEEP_SCALE}`);
  const nAll = Number(process.env.LIGHTFOLD_BENCH_WORKERS ?? availableParallelism());
  const reps = Number(process.env.LIGHTFOLD_BENCH_REPS ?? "3");
  const base = loadStudy(join(packageRoot(), "configs", "bench-pyramids.study.json"));
  const nWl = Math.max(2, Math.round(91 * scale));
  const study = reshaped(base, nWl, 2000);
  const g = study.combos[0].study.grid;
  const rays = g.thetaDeg.length * g.wavelengthNm.length * 2000;
  out(`reference sweep: bench-pyramids, ${g.thetaDeg.length} angles × ${g.wavelengthNm.length} wavelengths × 2000 rays = ${rays.toExponential(3)} rays`);
  out(`cores: ${availableParallelism()} available; "all workers" = ${nAll}`);

  // Each figure twice: "cold" = a fresh pool (thread start, module load and JIT in every thread
  // counted, as in a short run), "warm" = the same pool after a small untimed warm-up sweep (what
  // a long overnight run sees; best of LIGHTFOLD_BENCH_REPS).
  const warmup = reshaped(base, 2, 200);
  const timed = async (workers: number, warm: boolean): Promise<{ r: Awaited<ReturnType<typeof runSweep>>; wallS: number; cpuS: number }> => {
    const pool = warm ? new TracePool(workerSetupOf(study), workers) : undefined;
    try {
      if (pool !== undefined) await runSweep({ study: warmup, pool });
      // Warm: the best of `reps` runs (the least disturbed by other load on the machine).
      let best: { r: Awaited<ReturnType<typeof runSweep>>; wallS: number; cpuS: number } | undefined;
      for (let k = 0; k < (warm ? reps : 1); k++) {
        const c0 = process.cpuUsage();
        const t0 = performance.now();
        const r = await runSweep(pool !== undefined ? { study, pool } : { study, workers });
        const wallS = (performance.now() - t0) / 1000;
        const c = process.cpuUsage(c0);
        if (best === undefined || wallS < best.wallS) best = { r, wallS, cpuS: (c.user + c.system) / 1e6 };
      }
      return best as { r: Awaited<ReturnType<typeof runSweep>>; wallS: number; cpuS: number };
    } finally {
      await pool?.close();
    }
  };
  // A first untimed run loads the material tables and code into this process.
  await runSweep({ study: warmup, workers: 1 });
  out("");
  // cpu_s/wall_s shows whether the threads got their cores (below the worker count: the machine is
  // shared); rays/cpu_s compares the work per core independent of that.
  out("pool  workers  wall_s   rays/s      speed-up  efficiency  cpu_s/wall_s  rays/cpu_s");
  let allSame = true;
  for (const warm of [false, true]) {
    const t1 = await timed(1, warm);
    const tN = await timed(nAll, warm);
    allSame &&= t1.r.matrices[0].mean.every((v, i) => Object.is(v, tN.r.matrices[0].mean[i]));
    const speedup = t1.wallS / tN.wallS;
    const label = warm ? "warm" : "cold";
    out(`${label}  ${row(1, t1.wallS, rays / t1.wallS, 1, 1)}  ${(t1.cpuS / t1.wallS).toFixed(2).padStart(12)}  ${Math.round(rays / t1.cpuS).toString().padStart(10)}`);
    out(`${label}  ${row(nAll, tN.wallS, rays / tN.wallS, speedup, speedup / nAll)}  ${(tN.cpuS / tN.wallS).toFixed(2).padStart(12)}  ${Math.round(rays / tN.cpuS).toString().padStart(10)}`);
  }
  out(`1-worker and ${nAll}-worker matrices bit-identical: ${allSame}`);
  const unmeasured = [4, 8, 16].filter((n) => n > nAll);
  if (unmeasured.length > 0) out(`${unmeasured.join(", ")} workers: not measured (${availableParallelism()} cores here; set LIGHTFOLD_BENCH_WORKERS on a larger machine)`);

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
