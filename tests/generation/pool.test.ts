import { afterAll, describe, expect, it } from "vitest";
import { tmpdir } from "node:os";
import { loadStudyFromDocument } from "../../src/study/load.js";
import { traceGenerationProfile, type ProfileRequest, type SpectralProfile } from "../../src/generation/traceProfile.js";
import { traceGenerationProfileOnPool } from "../../src/generation/traceProfileOnPool.js";
import { workerSetupOf } from "../../src/sweep/runSweep.js";
import { TracePool } from "../../src/workers/pool.js";

/** A small textured study (upright pyramids under SiNx, ideal mirror rear): ray weights vary, so sums depend on their order. */
const loaded = loadStudyFromDocument(
  {
    name: "generation-pool",
    stack: {
      front: { texture: { type: "upright-pyramids", baseUm: 10 }, films: [{ material: "SiNx", thicknessNm: 75 }] },
      absorber: { material: "Si", thicknessUm: 180 },
      rear: { ideal: { kind: "mirror", reflectance: 0.95 } },
    },
    grid: { thetaDeg: [0], phiDeg: [0], wavelengthNm: [500, 950, 1100] },
    rays: { perPoint: 100, batch: 50 },
    seed: 3,
  },
  { baseDir: tmpdir() },
);

const request: ProfileRequest = {
  study: loaded.combos[0].study,
  registry: loaded.registry,
  comboIndex: 0,
  thetaDeg: 30,
  phiDeg: null,
  // 5 batches per wavelength, the last one short: on 2 workers a wavelength is split over messages.
  raysPerWavelength: 1100,
  batch: 250,
  grid: { bins: 24, firstBinUm: 0.01 },
  seed: 17,
};

const pools: TracePool[] = [];
afterAll(async () => {
  await Promise.all(pools.map((p) => p.close()));
});

async function onPool(workers: number, seen?: number[]): Promise<SpectralProfile> {
  const pool = new TracePool(workerSetupOf(loaded), workers);
  pools.push(pool);
  return traceGenerationProfileOnPool({ ...request, onWavelength: (done) => seen?.push(done) }, pool);
}

const hex = (a: Float64Array): string => Buffer.from(a.buffer, a.byteOffset, a.byteLength).toString("hex");

describe("generation profile on the worker pool", () => {
  it("is byte-identical to the in-thread trace and for 1 and 2 workers (batch tallies summed in batch order)", async () => {
    const reference = traceGenerationProfile(request);
    const seen: number[] = [];
    const [one, two] = await Promise.all([onPool(1), onPool(2, seen)]);
    for (const p of [one, two]) {
      expect(hex(p.edgesUm)).toBe(hex(reference.edgesUm));
      expect(hex(p.fraction)).toBe(hex(reference.fraction));
      expect(hex(p.fractionStderr)).toBe(hex(reference.fractionStderr));
      expect(hex(p.absorptance)).toBe(hex(reference.absorptance));
      expect(hex(p.absorptanceStderr)).toBe(hex(reference.absorptanceStderr));
      expect(p.wavelengthNm).toEqual([500, 950, 1100]);
    }
    // Progress: one call per finished wavelength.
    expect(seen).toEqual([1, 2, 3]);
    // Not a degenerate case: the textured stack gives each ray its own weight (nonzero errors), and
    // the bins of each wavelength add up to its absorptance (every absorbed photon in one bin).
    const nB = request.grid.bins;
    reference.absorptance.forEach((a, il) => {
      expect(reference.absorptanceStderr[il]).toBeGreaterThan(0);
      let sum = 0;
      for (let i = 0; i < nB; i++) sum += reference.fraction[il * nB + i];
      expect(Math.abs(sum - a)).toBeLessThan(1e-12);
    });
  });

  it("stays byte-identical when messages come back in another order than sent (later batches wait for earlier ones)", async () => {
    const pool = new TracePool(workerSetupOf(loaded), 1);
    pools.push(pool);
    let sent = 0;
    const arrived: number[] = [];
    // Claims 4 workers (3 messages per wavelength, 8 in flight) and holds each result back the longer
    // the earlier it was sent, so batches of a wavelength arrive out of order.
    const shuffled = {
      nWorkers: 4,
      runDepth: async (msg: Parameters<TracePool["runDepth"]>[0]) => {
        const k = sent++;
        const out = await pool.runDepth(msg);
        await new Promise((r) => setTimeout(r, 40 * (8 - (k % 8))));
        arrived.push(k);
        return out;
      },
    };
    const p = await traceGenerationProfileOnPool(request, shuffled);
    const reference = traceGenerationProfile(request);
    expect(sent).toBe(9);
    expect(arrived).not.toEqual([...arrived].sort((a, b) => a - b));
    expect(hex(p.fraction)).toBe(hex(reference.fraction));
    expect(hex(p.fractionStderr)).toBe(hex(reference.fractionStderr));
    expect(hex(p.absorptance)).toBe(hex(reference.absorptance));
    expect(hex(p.absorptanceStderr)).toBe(hex(reference.absorptanceStderr));
  });

  it("a different seed gives a different profile (the batches' streams come from the request)", async () => {
    const pool = new TracePool(workerSetupOf(loaded), 2);
    pools.push(pool);
    const other = await traceGenerationProfileOnPool({ ...request, seed: 18 }, pool);
    expect(hex(other.fraction)).not.toBe(hex(traceGenerationProfile(request).fraction));
  });
});
