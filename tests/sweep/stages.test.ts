import { existsSync, readFileSync, readdirSync, writeFileSync } from "node:fs";
import { join } from "node:path";
import { describe, expect, it } from "vitest";
import { runSweep } from "../../src/sweep/runSweep.js";
import { raysInBatches, batchRays } from "../../src/sweep/plan.js";
import { runMain } from "../helpers/cli.js";
import { tempDir, tinyDoc, tinyStudy } from "./helpers.js";

describe("sweep stages: the runner writes matrices and run.json, the CLI adds the weighting", () => {
  it("runSweep with an outDir writes the matrices, run.json and the journal, and no photocurrent summary", async () => {
    const out = tempDir("stages");
    const r = await runSweep({ study: tinyStudy(), outDir: out, workers: 1 });
    expect(readdirSync(out).sort()).toEqual(["base", "journal.jsonl", "run.json"]);
    expect(readdirSync(join(out, "base"))).toEqual(["matrix.json"]);
    expect(r.files).toEqual([join(out, "base", "matrix.json"), join(out, "run.json")]);
    const run = JSON.parse(readFileSync(join(out, "run.json"), "utf8")) as { combos: { summaries?: string[] }[] };
    expect(run.combos[0].summaries).toBeUndefined();
  });

  it("`lightfold sweep` composes the sweep and the spectral weighting: photocurrent.json, iam.csv and their names in run.json", async () => {
    const dir = tempDir("stages-cli");
    const studyPath = join(dir, "tiny.study.json");
    writeFileSync(studyPath, JSON.stringify(tinyDoc()));
    const out = join(dir, "run");
    const r = await runMain("sweep", studyPath, "--out", out, "--workers", "1", "--quiet", "--no-report", "--json");
    expect(r.code).toBe(0);
    const files = (JSON.parse(r.out) as { files: string[] }).files;
    // Per combination its matrix and summaries, then run.json (the order the sweep always printed).
    expect(files).toEqual(["matrix.json", "photocurrent.json", "iam.csv"].map((f) => join(out, "base", f)).concat(join(out, "run.json")));
    const run = JSON.parse(readFileSync(join(out, "run.json"), "utf8")) as { combos: { summaries?: string[]; jscFirstDirection?: { thetaDeg: number } }[] };
    expect(run.combos[0].summaries).toEqual(["base/photocurrent.json", "base/iam.csv"]);
    expect(run.combos[0].jscFirstDirection?.thetaDeg).toBe(0);
    expect(existsSync(join(out, "base", "iam.csv"))).toBe(true);
  });
});

describe("raysInBatches(rays, b0, b1)", () => {
  it("equals the batch-by-batch sum (and stays instant for 10¹² rays per point)", () => {
    const rays = { mode: "fixed" as const, perPoint: 130, batch: 40 };
    for (let b0 = 0; b0 <= 5; b0++) {
      for (let b1 = b0; b1 <= 6; b1++) {
        let n = 0;
        for (let b = b0; b < b1; b++) n += batchRays(rays, b);
        expect(raysInBatches(rays, b0, b1)).toBe(n);
      }
    }
    // 10¹² rays in batches of 1000: 10⁹ batches, summed in closed form.
    expect(raysInBatches({ mode: "fixed", perPoint: 1e12, batch: 1000 }, 0, 1e9)).toBe(1e12);
  });
});
