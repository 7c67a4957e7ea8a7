/**
 * The one-command demo (`npm run demo`): the whole job end to end on a built-in scenario.
 *   1. sweep two invented stacks (random upright pyramids + SiNx vs a planar reference) on all cores;
 *   2. AM1.5G photocurrent summaries (Jsc, loss breakdown, angular modifier);
 *   3. a small convergence run (error vs rays);
 *   4. a synthetic year for an invented northern site, yield at two tilts, a tilt sweep and the
 *      texture-benefit table;
 *   5. an invented glass–glass bifacial stack traced from both sides, and its front + rear year over
 *      tilts and row pitches at an invented bright-ground site;
 *   6. generation profiles G(z) of the two stacks at normal incidence (<stack>/generation/);
 *   7. the HTML report. Output under runs/demo/ (re-running starts afresh).
 */
import { existsSync, mkdirSync, rmSync } from "node:fs";
import { availableParallelism } from "node:os";
import { join, relative } from "node:path";
import { buildConvergenceReport } from "../src/convergence/index.js";
import { CONVERGENCE_FILE } from "../src/convergence/convergenceReport.js";
import { makeReport } from "../src/report/makeReport.js";
import type { ResponseMatrix } from "../src/response/responseMatrix.js";
import { spectrumFromSpec } from "../src/spectrum/index.js";
import { loadStudy, type LoadedStudy } from "../src/study/load.js";
import { createProgressReporter } from "../src/sweep/progressReporter.js";
import { runSweep, workerSetupOf } from "../src/sweep/runSweep.js";
import { writeFileAtomic } from "../src/util/atomicWrite.js";
import { TracePool } from "../src/workers/pool.js";
import { packageRoot } from "../src/util/packageRoot.js";
import { photocurrentForMatrix } from "../src/weighting/writePhotocurrent.js";
import { writeRunPhotocurrent } from "../src/weighting/runSummaries.js";
import type { PhotocurrentSummary } from "../src/weighting/index.js";
import { runDemoYield } from "./yieldStage.js";
import { runDemoBifacial } from "./bifacialStage.js";
import { runGeneration } from "../src/generation/runGeneration.js";
import { DEFAULT_DEPTH_GRID } from "../src/generation/traceProfile.js";

const ROOT = packageRoot();
const OUT = join(ROOT, "runs", "demo");
const STUDIES = ["configs/demo-random-pyramids.study.json", "configs/demo-planar.study.json"];
const SITE = "configs/sites/nordvik-fjell.site.json";
const TILTS_DEG = [20, 45];
const BIFACIAL_STUDY = "configs/glass-glass-bifacial.study.json";
const BIFACIAL_SITE = "configs/sites/saltmere-plain.site.json";

interface StackRun {
  loaded: LoadedStudy;
  dir: string;
  matrix: ResponseMatrix;
  matrices: ResponseMatrix[];
  photocurrent: PhotocurrentSummary;
  wallS: number;
  rays: number;
  /** The stack's worker pool (its threads warm after the sweep), reused by the generation step; closed at the end. */
  pool: TracePool;
}

const say = (line: string) => process.stdout.write(`${line}\n`);
const elapsed = (t0: number) => (performance.now() - t0) / 1000;

/** Worker pools still open: closed when done with, and all at the end (also on failure, so the process can exit). */
const openPools = new Set<TracePool>();

async function closePool(pool: TracePool): Promise<void> {
  if (openPools.delete(pool)) await pool.close();
}

async function sweepStack(studyPath: string, workers: number): Promise<StackRun> {
  const loaded = loadStudy(join(ROOT, studyPath));
  const dir = join(OUT, loaded.name);
  const reporter = createProgressReporter(process.env.LIGHTFOLD_QUIET ? "quiet" : "auto", process.stderr, 5);
  const pool = new TracePool(workerSetupOf(loaded), workers);
  openPools.add(pool);
  let result;
  try {
    result = await runSweep({ study: loaded, outDir: dir, pool, fresh: true, onProgress: (p) => reporter.update(p) });
  } finally {
    reporter.stop();
  }
  // the sweep wrote matrices and run.json; the weighting adds <combo>/photocurrent.json and iam.csv
  if (result.runRecord !== undefined) writeRunPhotocurrent(dir, result.plan, result.matrices, result.runRecord, (m) => say(`note: ${m}`));
  const matrix = result.matrices[0]!;
  const study = loaded.combos[0]!.study;
  const spectrum = spectrumFromSpec(study.spectrum, loaded.baseDir);
  // the same numbers as photocurrent.json, for the summary table
  const photocurrent = photocurrentForMatrix(matrix, spectrum);
  return { loaded, dir, matrix, matrices: result.matrices, photocurrent, wallS: result.wallS, rays: result.raysTraced, pool };
}

function table(header: string[], rows: string[][]): string {
  const w = header.map((h, c) => Math.max(h.length, ...rows.map((r) => r[c]!.length)));
  const line = (cells: string[]) => cells.map((s, c) => (c === 0 ? s.padEnd(w[c]!) : s.padStart(w[c]!))).join("  ");
  return [line(header), line(w.map((n) => "-".repeat(n))), ...rows.map(line)].join("\n");
}

async function main(): Promise<void> {
  const t0 = performance.now();
  const workers = availableParallelism();
  if (existsSync(OUT)) rmSync(OUT, { recursive: true, force: true });
  mkdirSync(OUT, { recursive: true });
  say(`lightfold demo: two invented stacks, ${workers} worker(s), output in ${relative(process.cwd(), OUT) || OUT}`);

  // 1–2. sweeps and photocurrent
  const stacks: StackRun[] = [];
  for (const s of STUDIES) {
    const run = await sweepStack(s, workers);
    const g = run.matrix;
    say(`  swept ${run.loaded.name}: ${g.thetaDeg.length} angles × ${g.wavelengthNm.length} wavelengths, ${run.rays.toExponential(2)} rays in ${run.wallS.toFixed(1)} s`);
    stacks.push(run);
  }

  // 3. convergence of the textured stack's absorber photocurrent at normal incidence
  const tc = performance.now();
  const conv = buildConvergenceReport(stacks[0]!.loaded, {
    thetaDeg: 0,
    channel: "A_absorber",
    wavelengthNm: 1000,
    startRays: 500,
    steps: 5,
    replicas: 4,
  });
  writeFileAtomic(join(stacks[0]!.dir, CONVERGENCE_FILE), JSON.stringify(conv, null, 2) + "\n");
  say(`  convergence: A_absorber at 1000 nm, ${conv.steps.map((s) => s.nRays).join("/")} rays, log–log slope of the standard error ${conv.slopes.stderr.toFixed(2)} (${elapsed(tc).toFixed(1)} s)`);

  // 4. yield at two tilts, tilt sweep, texture benefit
  const ty = performance.now();
  const yieldSummary = runDemoYield({
    sitePath: join(ROOT, SITE),
    year: 2027,
    seed: 7,
    tiltsDeg: TILTS_DEG,
    sweepTiltsDeg: Array.from({ length: 19 }, (_, k) => 5 * k),
    stacks: stacks.map((s) => ({ label: s.loaded.name, dir: s.dir, matrixPath: join(s.dir, "base", "matrix.json"), matrix: s.matrix })),
  });
  say(`  yield: ${yieldSummary.siteName}, synthetic year 2027 (seed 7), Perez sky, tilts ${TILTS_DEG.join("° and ")}° and 0–90° in 5° steps (${elapsed(ty).toFixed(1)} s)`);

  // 5. bifacial glass–glass stack: light from the front and from the rear, front + rear year
  const tb = performance.now();
  const bi = await sweepStack(BIFACIAL_STUDY, workers);
  await closePool(bi.pool);
  const rearMatrix = bi.matrices[1]!;
  const bif = runDemoBifacial({
    sitePath: join(ROOT, BIFACIAL_SITE), dir: bi.dir, front: bi.matrix, rear: rearMatrix,
    tiltsDeg: [10, 20, 30, 40], pitchesM: [4, 5.5, 7, 10, null], centreHeightM: 1.2, slantLengthM: 2.2,
  });
  say(`  bifacial: ${bi.loaded.name} traced from both sides (${bi.rays.toExponential(2)} rays), optical bifaciality ${bif.bifaciality.toFixed(3)}; year at 4 tilts × 5 mountings (${elapsed(tb).toFixed(1)} s)`);

  // 6. generation profiles G(z) at normal incidence (beside each run, read by the report)
  const tg = performance.now();
  const gen = [];
  for (const s of stacks) {
    const study = s.loaded.combos[0]!.study;
    gen.push(await runGeneration(s.loaded, {
      comboIndex: 0,
      thetaDeg: 0,
      phiDeg: null,
      raysPerWavelength: 4000,
      batch: 2000,
      grid: DEFAULT_DEPTH_GRID,
      seed: study.seed,
      spectrum: spectrumFromSpec(study.spectrum, s.loaded.baseDir),
      collection: null,
      collectionLabel: null,
      outDir: join(s.dir, "generation"),
      pool: s.pool,
    }));
    await closePool(s.pool);
  }
  say(`  generation profiles G(z) at 0°: ${gen.map((g, i) => `${stacks[i]!.loaded.name} q·∫G dz = ${g.profile.integratedMaCm2.toFixed(2)} mA/cm²`).join(", ")} (${elapsed(tg).toFixed(1)} s)`);

  // 7. report
  const report = makeReport(
    [...stacks.map((s) => s.dir), bi.dir],
    { angleDeg: 0, outDir: join(OUT, "report") },
  );

  // Summary
  say("");
  const rows = stacks.map((s) => {
    const d0 = s.photocurrent.directions.find((d) => d.thetaDeg === 0)!;
    const d60 = s.photocurrent.directions.find((d) => d.thetaDeg === 60);
    const loss = (channel: string): string => d0.losses.find((l) => l.channel === channel)?.currentMaCm2.toFixed(2) ?? "-";
    const row = [s.loaded.name, `${d0.jscMaCm2.toFixed(3)} ± ${d0.jscStderrMaCm2.toFixed(3)}`, loss("R_first"), loss("R_escape"), d60?.iam != null ? d60.iam.toFixed(3) : "-"];
    for (const t of TILTS_DEG) row.push(yieldSummary.annualAhM2.get(`${s.loaded.name}@${t}`)?.toFixed(0) ?? "-");
    row.push(`${yieldSummary.bestTiltDeg.get(s.loaded.name) ?? "-"}°`);
    return row;
  });
  const header = ["stack", "Jsc 0° (mA/cm²)", "reflected before entering", "escaped after entering", "IAM 60°"];
  for (const t of TILTS_DEG) header.push(`year @${t}° (A·h/m²)`);
  header.push("best tilt");
  say(table(header, rows));
  say("");
  say(yieldSummary.benefitText.trimEnd());
  say("");
  say(bif.text.trimEnd());
  say("");
  say(`report: ${relative(process.cwd(), report.indexPath)}  (${report.figures.length} plots, also as .svg beside it)`);
  say(`demo wall time ${elapsed(t0).toFixed(1)} s on ${workers} worker(s)`);
}

main()
  .catch((err: unknown) => {
    process.stderr.write(`lightfold demo: failed: ${err instanceof Error ? (err.stack ?? err.message) : String(err)}\n`);
    process.exitCode = 1;
  })
  .finally(() => Promise.all([...openPools].map(closePool)));
