import { join } from "node:path";
import { matrixFromTallies } from "../src/response/fromTallies.js";
import { pairedWeightedDifference, type PairedDifference } from "../src/response/pairedDifference.js";
import { photocurrentWeights, spectrumFromSpec } from "../src/spectrum/index.js";
import { loadStudyFromDocument } from "../src/study/load.js";
import { sweepPlanOf, workerSetupOf } from "../src/sweep/runSweep.js";
import { PAIR_GROUPS, tallyLength } from "../src/sweep/tally.js";
import { packageRoot } from "../src/util/packageRoot.js";
import { createMessageRunner } from "../src/workers/messageRunner.js";
import { loadTracer } from "../src/workers/tracerModule.js";

/**
 * Paired-difference gain: the demo textured stack (configs/demo-random-pyramids.study.json: random
 * pyramids, SiNx, 180 µm Si, Ag rear) with SiNx 75 nm vs 80 nm as a two-combination sweep, θ = 0,
 * 300–1200 nm in 100 nm steps, 4000 rays per point in 16 batches. ΔJsc (AM1.5G) with its paired
 * standard error (common random numbers, pairing groups) and with the error an independence
 * assumption gives; the gain is their ratio. In this thread (no pool), a few seconds.
 */
export async function runPairedBench(): Promise<void> {
  const perPoint = Number(process.env.LIGHTFOLD_BENCH_PAIRED_RAYS ?? "4000");
  const random = await pairedRun(perPoint, "random");
  const sobol = await pairedRun(perPoint, "sobol");
  const d = random.d;
  process.stdout.write(
    `paired differences: demo random pyramids, SiNx 75 vs 80 nm, θ = 0, ${random.nWavelengths} wavelengths × ${perPoint} rays (${random.nBatches} batches), ${random.wallS.toFixed(1)} s in one thread\n` +
      `  random launch points ("sampling": "random"; the default below 16 batches per point): ΔJsc = ${d.delta.toFixed(4)} mA/cm²; SE paired (common random numbers) ${d.pairedStderr.toFixed(4)}, ` +
      `as if independent ${d.independentStderr.toFixed(4)}; gain ${(d.independentStderr / d.pairedStderr).toFixed(2)}×\n` +
      `  Sobol' launch points (the default from 16 batches per point, errors from the 16 replica groups, ${sobol.wallS.toFixed(1)} s): ΔJsc = ${sobol.d.delta.toFixed(4)} mA/cm²; ` +
      `SE paired ${sobol.d.pairedStderr.toFixed(4)}, as if independent ${sobol.d.independentStderr.toFixed(4)}; ` +
      `gain against independent random sampling ${(d.independentStderr / sobol.d.pairedStderr).toFixed(2)}×\n`,
  );
}

/** One two-combination sweep of the paired bench in this thread, with the given launch sampling. */
async function pairedRun(perPoint: number, sampling: "random" | "sobol"): Promise<{ d: PairedDifference; wallS: number; nBatches: number; nWavelengths: number }> {
  const study = loadStudyFromDocument(
    {
      name: "sinx-75-vs-80",
      stack: {
        front: { texture: { type: "random-pyramids", meanBaseUm: 5, sizeSpread: 0.3, count: 16, tileUm: 10, seed: 7 }, films: [{ material: "SiNx", thicknessNm: 75 }] },
        absorber: { material: "Si", thicknessUm: 180 },
        rear: { texture: { type: "planar" }, exit: "Ag" },
      },
      grid: { thetaDeg: [0], phiDeg: "averaged", wavelengthNm: { from: 300, to: 1200, step: 100 } },
      rays: { perPoint, batch: Math.ceil(perPoint / PAIR_GROUPS), sampling },
      seed: 42,
      sweep: { "front.films[0].thicknessNm": [75, 80] },
    },
    { baseDir: join(packageRoot(), "configs") },
  );
  const tracer = await loadTracer();
  const plan = sweepPlanOf(study, tracer);
  const run = createMessageRunner(workerSetupOf(study), tracer);
  const g = plan.grid;
  const batch = plan.rays.batch;
  const nBatches = Math.ceil(perPoint / batch);
  const tallies = new Map<number, Float64Array>();
  const t0 = performance.now();
  for (let combo = 0; combo < 2; combo++) {
    const len = tallyLength(plan.combos[combo].channels.length);
    g.wavelengthNm.forEach((wavelengthNm, il) => {
      const sizes = Array.from({ length: nBatches }, (_, b) => Math.min(batch, perPoint - b * batch));
      const out = run({ items: [{ combo, it: 0, ip: 0, il, thetaDeg: 0, phiDeg: null, wavelengthNm, firstBatch: 0, batchRays: sizes }] });
      const acc = new Float64Array(len);
      for (let b = 0; b < nBatches; b++) for (let i = 0; i < len; i++) acc[i] += out[b * len + i];
      tallies.set(combo * g.wavelengthNm.length + il, acc);
    });
  }
  const wallS = (performance.now() - t0) / 1000;
  const [a, b] = [0, 1].map((c) => matrixFromTallies(plan, c, (p) => tallies.get(p), false));
  const w = photocurrentWeights(g.wavelengthNm, spectrumFromSpec("AM1.5G", packageRoot()));
  const d = pairedWeightedDifference(a, b, "A_absorber", g.wavelengthNm.map((_, il) => il), w);
  return { d, wallS, nBatches, nWavelengths: g.wavelengthNm.length };
}
