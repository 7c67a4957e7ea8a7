import { readFileSync, writeFileSync } from "node:fs";
import { join } from "node:path";
import { runMain } from "../helpers/cli.js";
import { describe, expect, it } from "vitest";
import { readResponseMatrix } from "../../src/response/matrixFile.js";
import { mergeShards } from "../../src/sweep/mergeShards.js";
import { runSweep } from "../../src/sweep/runSweep.js";
import { inputErrorOf } from "../helpers/inputError.js";
import { expectSameMatrices, tempDir, tinyDoc, tinyStudy } from "./helpers.js";

/** A tiny glass–glass stack: light can come from either side. */
const bifacial = {
  front: { texture: { type: "upright-pyramids", baseUm: 10 }, films: [{ material: "SiNx", thicknessNm: 75 }] },
  absorber: { material: "Si", thicknessUm: 150 },
  rear: { texture: { type: "planar" }, films: [{ material: "SiNx", thicknessNm: 75 }], exit: "EVA" },
  rearLayers: [{ name: "rear EVA", material: "EVA", thicknessUm: 400 }, { name: "rear glass", material: "glass", thicknessUm: 2000 }],
};

describe("runSweep with light from the rear", () => {
  it("traces a rear twin per combination (label -rear, lightFrom rear), deterministic over workers, shards and merge", async () => {
    const study = tinyStudy({ stack: bifacial, illumination: "both", sweep: { "absorber.thicknessUm": [120, 150] } });
    expect(study.combos.map((c) => c.label)).toEqual(["p0", "p1", "p0-rear", "p1-rear"]);
    expect(study.combos[2]!.values).toEqual(study.combos[0]!.values);
    const one = await runSweep({ study, workers: 1 });
    const two = await runSweep({ study, workers: 2, raysPerMessage: 40, shuffleSeed: 7 });
    expectSameMatrices(one.matrices, two.matrices);
    expect(one.matrices.map((m) => m.lightFrom)).toEqual([undefined, undefined, "rear", "rear"]);
    expect(one.matrices[2]!.channels).toEqual(one.matrices[0]!.channels);
    const out = tempDir("rear-shards");
    for (let k = 1; k <= 3; k++) await runSweep({ study, outDir: out, workers: 1, shard: { index: k, count: 3 } });
    const merged = mergeShards({ inputs: [out], outDir: join(out, "merged") });
    expectSameMatrices(one.matrices, merged.matrices);
    const rear = readResponseMatrix(join(out, "merged", "p1-rear", "matrix.json"));
    expect(rear.lightFrom).toBe("rear");
    // rear light enters through the rear glass: it absorbs there first, and at 1100 nm some leaves
    // through the front (R) — facts of this geometry, not of the front-lit matrix
    const ic = rear.channels.indexOf("A_layer:rear glass");
    expect(rear.mean[ic]!).toBeGreaterThan(0);
  });

  it("the sweep summary ranks combinations lit from the same side only (never one against its rear-lit twin)", async () => {
    const dir = tempDir("rear-best");
    const studyPath = join(dir, "s.study.json");
    writeFileSync(studyPath, JSON.stringify(tinyDoc({ stack: bifacial, illumination: "both", sweep: { "absorber.thicknessUm": [20, 150] } })));
    const res = await runMain("sweep", studyPath, "--out", join(dir, "run"), "--workers", "1", "--quiet");
    expect(res.code).toBe(0);
    const run = JSON.parse(readFileSync(join(dir, "run", "run.json"), "utf8"));
    // a 20 µm wafer lit from the front collects less than the 150 µm one lit from the rear, so the
    // rear twin p1-rear would be the runner-up if the sides were ranked together
    const jsc = (l: string) => run.combos.find((c: { label: string }) => c.label === l).jscFirstDirection.jscMaCm2;
    expect(jsc("p1-rear")).toBeGreaterThan(jsc("p0"));
    expect(run.bestCombo.label).toBe("p1");
    expect(run.bestCombo.runnerUp).toBe("p0");
  });

  it("refuses light from the rear on an opaque rear, naming the field", () => {
    expect(inputErrorOf(() => tinyStudy({ illumination: "rear" }))).toMatch(/illumination.*ideal reflector/);
    const withBacksheet = { ...bifacial, rearOuter: { backsheet: { reflectance: 0.8 } } };
    expect(inputErrorOf(() => tinyStudy({ stack: withBacksheet, illumination: "both" }))).toMatch(/illumination.*back-sheet/);
    expect(tinyDoc().illumination).toBeUndefined();
  });
});
