import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { MaterialRegistry } from "../../src/materials/registry.js";
import { filmStack } from "../../src/optics/thinFilm.js";
import { optimize } from "../../src/optimize/optimize.js";
import { evaluationStudy, studyObjective, type StudyDocument } from "../../src/optimize/studyObjective.js";
import type { ObjectiveSpec } from "../../src/optimize/objectives.js";
import { astmG173, photocurrentWeights } from "../../src/spectrum/index.js";
import { workerSetupOf } from "../../src/sweep/runSweep.js";
import { TracePool } from "../../src/workers/pool.js";

const WAVELENGTHS_NM = [300, 350, 400, 450, 500, 550, 600, 650, 700, 750, 800, 850, 900, 950, 1000];
/** A coarser grid for the replica study (many optimisations). */
const FEW_NM = [400, 500, 600, 700, 800];
const THICKNESS_UM = 180;

/** Planar single-layer ARC of constant n = 2.0 on bare Si; the rear absorbs everything (ideal mirror, R = 0). */
function arcDocument(perPoint: number, seed = 11, wavelengthNm = WAVELENGTHS_NM, thetaDeg = 0): StudyDocument {
  return {
    doc: {
      name: "arc-n2",
      materials: [{ name: "arc2", constant: { n: 2.0, k: 0 } }],
      stack: {
        incidence: "air",
        front: { texture: { type: "planar" }, films: [{ material: "arc2", thicknessNm: 75 }] },
        absorber: { material: "Si", thicknessUm: THICKNESS_UM },
        rear: { ideal: { kind: "mirror", reflectance: 0 } },
      },
      grid: { thetaDeg: [thetaDeg], phiDeg: [0], wavelengthNm },
      rays: { perPoint, batch: 50 },
      seed,
    },
    baseDir: process.cwd(),
    path: "(test)",
  };
}

/**
 * Deterministic reference: the same discretised objective from the transfer-matrix method (Macleod,
 * Thin-Film Optical Filters, ch. 2; src/optics), J(d) = Σ w_λ T(d, λ) (1 − e^{−α W / cos θt}) with
 * the same photocurrent bin weights, T unpolarised (mean of s and p); light entering the wafer is
 * absorbed by Beer–Lambert on one pass along the refracted direction (Snell, real index).
 */
function referenceJsc(thicknessNm: number, grid = WAVELENGTHS_NM, thetaDeg = 0): number {
  const si = MaterialRegistry.withBuiltins().get("Si");
  const w = photocurrentWeights(grid, astmG173("global"));
  const sinT = Math.sin((thetaDeg * Math.PI) / 180);
  let j = 0;
  grid.forEach((l, i) => {
    const nk = si.nk(l);
    const r = filmStack(1, [{ n: 2, k: 0, thicknessNm }], nk, l, Math.cos((thetaDeg * Math.PI) / 180));
    const t = 0.5 * (r.Ts + r.Tp);
    const alphaPerUm = (4 * Math.PI * nk.k) / (l * 1e-3);
    const cosT = Math.sqrt(1 - (sinT / nk.n) ** 2);
    j += w[i] * t * (1 - Math.exp((-alphaPerUm * THICKNESS_UM) / cosT));
  });
  return j;
}

/** Golden-section maximum of the smooth deterministic reference on [a, b]. */
function referenceOptimum(a: number, b: number, grid = WAVELENGTHS_NM, thetaDeg = 0): number {
  const g = (Math.sqrt(5) - 1) / 2;
  while (b - a > 1e-6) {
    const c = b - g * (b - a), d = a + g * (b - a);
    if (referenceJsc(c, grid, thetaDeg) >= referenceJsc(d, grid, thetaDeg)) b = d;
    else a = c;
  }
  return (a + b) / 2;
}

const JSC: ObjectiveSpec = { kind: "jsc", thetaDeg: 0, spectrum: astmG173("global") };
const ARC = { path: "front.films[0].thicknessNm", lower: 40, upper: 120, unit: "nm" };
let pool: TracePool;
beforeAll(() => {
  pool = new TracePool(workerSetupOf(evaluationStudy({ base: arcDocument(100), params: [ARC], objective: JSC }, [75], -1)), 2);
});
afterAll(async () => {
  await pool.close();
});

describe("optimize over a study (planar ARC, n = 2.0, on Si; AM1.5G; normal incidence)", () => {
  const dStar = referenceOptimum(40, 120);

  it("the reference optimum obeys the quarter-wave rule near 600 nm", () => {
    // quarter-wave thickness λ/(4n) at 600 nm: 75 nm (common practice: single-layer ARC design near 600 nm)
    expect(Math.abs(dStar - 600 / (4 * 2.0))).toBeLessThan(10);
  });

  it("the Monte Carlo optimum's interval contains the transfer-matrix optimum", async () => {
    const { objective, stats } = studyObjective({ base: arcDocument(4000), params: [ARC], objective: JSC, pool });
    const r = await optimize(objective, { lower: [40], upper: [120], replicas: 5 });
    expect(r.atBound).toEqual([null]);
    expect(r.locationInterval[0][0]).toBeLessThanOrEqual(dStar);
    expect(r.locationInterval[0][1]).toBeGreaterThanOrEqual(dStar);
    // the value: |z| < 4 against the reference at its optimum
    expect(Math.abs(r.value - referenceJsc(dStar)) / r.valueStdErr).toBeLessThan(4);
    expect(stats.evaluations).toBe(r.evaluations.length);
  });

  it("common random numbers: evaluations at one x repeat bit for bit; differences between x are far less noisy", async () => {
    const { objective } = studyObjective({ base: arcDocument(2000), params: [ARC], objective: JSC, pool });
    const a = await objective([70], -1);
    expect((await objective([70], -1)).value).toBe(a.value);
    // Common random numbers shrink the variance of differences (Law & Kelton, Simulation Modeling and
    // Analysis, §11.2): RMS error of 10 one-stream differences well below that of independent ones, √2·SE.
    let ss = 0;
    for (const d of [56, 60, 64, 68, 72, 76, 80, 84, 88, 92]) {
      const e0 = await objective([d], -1);
      const e1 = await objective([d + 2], -1);
      ss += (e1.value - e0.value - (referenceJsc(d + 2) - referenceJsc(d))) ** 2;
    }
    expect(Math.sqrt(ss / 10)).toBeLessThan(0.6 * Math.SQRT2 * a.stderr);
  });
});

describe("replica study (planar ARC, few rays, 45°)", () => {
  it("the 90 % interval of independent optimisations covers the transfer-matrix optimum at its nominal rate (binomial error)", async () => {
    // At 45° s and p differ, so each ray's random line of polarisation makes the (split, expected-value)
    // objective noisy; at normal incidence it would be exact up to the interface table.
    const dStar = referenceOptimum(40, 120, FEW_NM, 45);
    const jsc45: ObjectiveSpec = { ...JSC, thetaDeg: 45 };
    const K = 20;
    const level = 0.9;
    let covered = 0;
    for (let k = 0; k < K; k++) {
      const { objective } = studyObjective({ base: arcDocument(300, 1000 + k, FEW_NM, 45), params: [ARC], objective: jsc45, pool });
      const r = await optimize(objective, { lower: [40], upper: [120], replicas: 4, level });
      if (r.locationInterval[0][0] <= dStar && dStar <= r.locationInterval[0][1]) covered++;
    }
    // binomial standard error of a coverage fraction: √(p(1 − p)/K); |z| < 4
    expect(Math.abs(covered / K - level) / Math.sqrt((level * (1 - level)) / K)).toBeLessThan(4);
  });
});

describe("optimize over a study: wafer thickness", () => {
  it("Jsc rises monotonically with the wafer thickness, so the optimum stops at the upper bound, flagged", async () => {
    // Beer–Lambert: a thicker wafer absorbs more of the weakly absorbed near-band-edge light (any
    // photovoltaics text, e.g. Green, Solar Cells, ch. 1); nothing else in the stack changes.
    const base: StudyDocument = {
      doc: {
        name: "wafer",
        stack: {
          front: { texture: { type: "planar" }, films: [{ material: "SiNx", thicknessNm: 75 }] },
          absorber: { material: "Si", thicknessUm: 180 },
          rear: { texture: { type: "planar" }, films: [], exit: "Ag" },
        },
        grid: { thetaDeg: [0], phiDeg: [0], wavelengthNm: [900, 950, 1000, 1050, 1100] },
        rays: { perPoint: 1000, batch: 50 },
        seed: 5,
      },
      baseDir: process.cwd(),
      path: "(test)",
    };
    const W = { path: "absorber.thicknessUm", lower: 60, upper: 300, unit: "µm" };
    const { objective } = studyObjective({ base, params: [W], objective: JSC, pool });
    const r = await optimize(objective, { lower: [60], upper: [300], replicas: 3 });
    expect(r.atBound).toEqual(["upper"]);
    expect(r.location[0]).toBeGreaterThan(295);
    expect(r.locationInterval[0][1]).toBe(300);
  });

  it("an evaluation on the shared pool equals a sweep of the same study on its own pool, bit for bit", async () => {
    const { runSweep } = await import("../../src/sweep/runSweep.js");
    const o = { base: arcDocument(500), params: [ARC], objective: JSC };
    const study = evaluationStudy(o, [81.5], 2);
    const own = await runSweep({ study, workers: 1 });
    const shared = await runSweep({ study, pool: pool.forVariant(study.combos[0].hash, [study.combos[0].study]) });
    expect(Array.from(shared.matrices[0].mean)).toEqual(Array.from(own.matrices[0].mean));
    expect(Array.from(shared.matrices[0].stderr)).toEqual(Array.from(own.matrices[0].stderr));
  });
});
