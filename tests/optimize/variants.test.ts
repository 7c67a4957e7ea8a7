import { describe, expect, it } from "vitest";
import { loadStudyFromDocument } from "../../src/study/load.js";
import * as ownTracer from "../../src/trace/index.js";
import { createMessageRunner } from "../../src/workers/messageRunner.js";
import type { TracerModule } from "../../src/workers/tracerModule.js";
import { workerSetupOf } from "../../src/sweep/runSweep.js";

function study(filmNm: number) {
  return loadStudyFromDocument(
    {
      name: "variants",
      stack: {
        front: { texture: { type: "upright-pyramids", baseUm: 5 }, films: [{ material: "SiNx", thicknessNm: filmNm }] },
        absorber: { material: "Si", thicknessUm: 180 },
        rear: { texture: { type: "planar" }, films: [], exit: "Ag" },
      },
      grid: { thetaDeg: [0], phiDeg: [0], wavelengthNm: [600] },
      rays: { perPoint: 2000, batch: 2000 },
      seed: 1,
    },
    { baseDir: process.cwd() },
  );
}

describe("variant messages (one pool, many studies)", () => {
  it("variants differing only in a film share the texture object, so the geometry is built once; their tallies differ", () => {
    const tiles: unknown[] = [];
    const tracer = {
      ...ownTracer,
      compileStack: (s: Parameters<typeof ownTracer.compileStack>[0], r: Parameters<typeof ownTracer.compileStack>[1], l: number) => {
        const cs = ownTracer.compileStack(s, r, l);
        tiles.push(cs.frontTile);
        return cs;
      },
    } as unknown as TracerModule;
    const a = study(60);
    const b = study(90);
    const run = createMessageRunner(workerSetupOf(a), tracer);
    const item = { combo: 0, it: 0, ip: 0, il: 0, thetaDeg: 0, phiDeg: 0, wavelengthNm: 600, firstBatch: 0, batchRays: [2000] };
    const ta = run({ items: [item], variant: { key: a.hash, studies: a.combos.map((c) => c.study) } });
    const tb = run({ items: [item], variant: { key: b.hash, studies: b.combos.map((c) => c.study) } });
    expect(tiles.length).toBe(2);
    expect(tiles[1]).toBe(tiles[0]);
    expect(Array.from(ta)).not.toEqual(Array.from(tb));
    // the same variant again: its compiled stack is reused (no third compile)
    run({ items: [item], variant: { key: a.hash, studies: a.combos.map((c) => c.study) } });
    expect(tiles.length).toBe(2);
  });
});
