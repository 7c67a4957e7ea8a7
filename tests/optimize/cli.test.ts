import { existsSync, mkdtempSync, readFileSync, readdirSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { afterAll, describe, expect, it } from "vitest";
import { runMain as run, ROOT } from "../helpers/cli.js";
import type { OptimumDocument } from "../../src/optimize/optimumJson.js";

const dir = mkdtempSync(join(tmpdir(), "lightfold-optimize-cli-"));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

const studyPath = join(dir, "arc.study.json");
writeFileSync(
  studyPath,
  JSON.stringify({
    name: "planar-arc",
    stack: {
      front: { texture: { type: "planar" }, films: [{ material: "SiNx", thicknessNm: 75 }] },
      absorber: { material: "Si", thicknessUm: 180 },
      rear: { texture: { type: "planar" }, films: [], exit: "Ag" },
    },
    grid: { thetaDeg: [0, 20, 40, 60, 80], phiDeg: [0], wavelengthNm: [450, 600, 750, 900] },
    rays: { perPoint: 400, batch: 100 },
    seed: 9,
  }),
);
const PARAM = "front.films[0].thicknessNm=50:110";

describe("lightfold optimize", () => {
  const out = join(dir, "jsc");

  it("prints the optimum with its interval, writes optimum.json and the plot", async () => {
    const r = await run("optimize", studyPath, "--param", PARAM, "--replicas", "3", "--out", out, "--workers", "2", "--quiet");
    expect(r.code).toBe(0);
    expect(r.out).toMatch(/parameter\s+bounds\s+optimum\s+95 % interval/);
    expect(r.out).toMatch(/front\.films\[0\]\.thicknessNm\s+50–110 nm\s+\d+\.\d+ nm\s+\[/);
    expect(r.out).toMatch(/Jsc at 0°\s+\d+\.\d+ mA\/cm²/);
    // the output says which error the intervals use
    expect(r.out).toMatch(/± and intervals: spread of the 3 replicas' fits \(Student t, 2 degrees of freedom\)/);
    const doc = JSON.parse(readFileSync(join(out, "optimum.json"), "utf8")) as OptimumDocument;
    expect(doc.kind).toBe("lightfold.optimum");
    expect(doc.settings.errorMethod).toBe("replicas");
    // 4 batches of 100 per point: random launch points (Sobol' is the default from 16), recorded
    expect(doc.study).toMatchObject({ raysPerPoint: 400, batch: 100, sampling: "random" });
    expect(doc.result.locationInterval[0][0]).toBeLessThanOrEqual(doc.result.location[0]);
    expect(doc.cost.raysTraced).toBe(doc.cost.evaluations * 4 * 400);
    expect(readdirSync(join(out, "report")).some((f) => /^optimum-1-.*\.svg$/.test(f))).toBe(true);
    expect(readFileSync(join(out, "report", "index.html"), "utf8")).toContain('id="optimum"');
  });

  it("a second run resumes every evaluation from its journal and gives the same optimum (--json)", async () => {
    const first = JSON.parse(readFileSync(join(out, "optimum.json"), "utf8")) as OptimumDocument;
    const r = await run("optimize", studyPath, "--param", PARAM, "--replicas", "3", "--out", out, "--workers", "1", "--quiet", "--json");
    expect(r.code).toBe(0);
    const again = JSON.parse(r.out) as OptimumDocument;
    expect(again.cost.raysTraced).toBe(0);
    expect(again.cost.raysResumed).toBe(first.cost.raysTraced);
    expect(again.result.location).toEqual(first.result.location);
    expect(again.result.locationInterval).toEqual(first.result.locationInterval);
  });

  it("--objective yield: the yearly charge at a sample site and tilt", async () => {
    const o = join(dir, "yield");
    const site = join(ROOT, "configs", "sites", "nordvik-fjell.site.json");
    const r = await run("optimize", studyPath, "--param", PARAM, "--objective", "yield", "--site", site, "--tilt", "45", "--replicas", "3", "--tolerance", "6", "--out", o, "--quiet", "--no-report", "--json");
    expect(r.code).toBe(0);
    const doc = JSON.parse(r.out) as OptimumDocument;
    expect(doc.objective.kind).toBe("yield");
    expect(doc.objective.unit).toBe("A·h/m²");
    expect(doc.objective.details.plane).toEqual({ tiltDeg: 45, azimuthDeg: 180, textureRotationDeg: 0 });
    expect(doc.result.value).toBeGreaterThan(0);
    expect(existsSync(join(o, "report"))).toBe(false);
  });

  it("--objective yield --spectra clear-sky-model: hourly spectra built once for every evaluation", async () => {
    const site = join(ROOT, "configs", "sites", "nordvik-fjell.site.json");
    const r = await run("optimize", studyPath, "--param", PARAM, "--objective", "yield", "--site", site, "--tilt", "45", "--spectra", "clear-sky-model", "--replicas", "3", "--tolerance", "6", "--out", join(dir, "spectra"), "--quiet", "--no-report", "--json");
    expect(r.code).toBe(0);
    const doc = JSON.parse(r.out) as OptimumDocument;
    expect(doc.objective.description).toContain("clear-sky-model spectra");
    expect(doc.objective.details.spectra).toBe("clear-sky-model");
  });

  it("--bifacial: front + rear yearly charge; light from the rear is traced too", async () => {
    const bifacial = join(dir, "bifacial.study.json");
    writeFileSync(
      bifacial,
      JSON.stringify({
        name: "planar-bifacial",
        stack: {
          front: { texture: { type: "planar" }, films: [{ material: "SiNx", thicknessNm: 75 }] },
          absorber: { material: "Si", thicknessUm: 180 },
          rear: { texture: { type: "planar" }, films: [{ material: "SiNx", thicknessNm: 80 }], exit: "air" },
        },
        grid: { thetaDeg: [0, 20, 40, 60, 80], phiDeg: [0], wavelengthNm: [450, 600, 750, 900] },
        rays: { perPoint: 300, batch: 100 },
        seed: 4,
      }),
    );
    const site = join(ROOT, "configs", "sites", "nordvik-fjell.site.json");
    const o = join(dir, "bifacial");
    const r = await run("optimize", bifacial, "--param", "rear.films[0].thicknessNm=40:140", "--objective", "yield", "--site", site, "--tilt", "30", "--bifacial", "--height", "1.5", "--module-width", "2", "--pitch", "6", "--replicas", "3", "--tolerance", "25", "--out", o, "--quiet", "--no-report", "--json");
    expect(r.code).toBe(0);
    const doc = JSON.parse(r.out) as OptimumDocument;
    expect(doc.objective.name).toBe("yearly charge, front + rear");
    expect(doc.objective.details).toMatchObject({ faces: "front+rear", mounting: { slantLengthM: 2, centreHeightM: 1.5, pitchM: 6 } });
    // each evaluation traced the front and the rear-lit twin
    const ev = readdirSync(join(o, "evaluations"))[0]!;
    expect(readdirSync(join(o, "evaluations", ev)).sort()).toEqual(expect.arrayContaining(["base", "base-rear"]));
    const bad = await run("optimize", studyPath, "--param", PARAM, "--objective", "yield", "--site", site, "--bifacial", "--out", join(dir, "never2"), "--quiet");
    expect(bad.code).toBe(2);
    expect(bad.err).toMatch(/transparent rear/);
  });

  it("--objective angles: a weighted mean over the listed angles", async () => {
    const r = await run("optimize", studyPath, "--param", PARAM, "--objective", "angles", "--angles", "0:2,60:1", "--replicas", "3", "--tolerance", "6", "--out", join(dir, "angles"), "--quiet", "--no-report", "--json");
    expect(r.code).toBe(0);
    const doc = JSON.parse(r.out) as OptimumDocument;
    expect(doc.objective.details).toMatchObject({ thetaDeg: [0, 60], weights: [2, 1] });
    expect(doc.study.grid.nTheta).toBe(2);
  });

  it("two parameters: film thickness inside its bounds, wafer thickness at its upper bound (flagged)", async () => {
    // near the band edge, where the wafer thickness matters
    const edge = join(dir, "edge.study.json");
    const doc0 = JSON.parse(readFileSync(studyPath, "utf8")) as { grid: { wavelengthNm: number[] } };
    doc0.grid.wavelengthNm = [500, 800, 1000, 1100];
    writeFileSync(edge, JSON.stringify(doc0));
    const r = await run("optimize", edge, "--param", PARAM, "--param", "absorber.thicknessUm=100:300", "--replicas", "3", "--tolerance", "6,20", "--out", join(dir, "two"), "--quiet", "--json");
    expect(r.code).toBe(0);
    const doc = JSON.parse(r.out) as OptimumDocument;
    expect(doc.result.dims).toBe(2);
    expect(doc.result.design.points.length).toBe(9);
    // Beer–Lambert: Jsc keeps rising with the wafer thickness, so that optimum sits on the upper bound
    expect(doc.result.atBound).toEqual([null, "upper"]);
    expect(doc.result.location[0]).toBeGreaterThan(55);
    expect(doc.result.location[0]).toBeLessThan(105);
    const report = readFileSync(join(dir, "two", "report", "index.html"), "utf8");
    expect(report).toContain("at the upper bound");
    expect(readdirSync(join(dir, "two", "report")).filter((f) => f.startsWith("optimum-")).length).toBe(2);
  });

  it("bad input: one line + hint, exit 2, nothing written", async () => {
    for (const args of [
      ["--param", "front.films[0].thicknessNm=110:50"],
      ["--param", "front.films[3].thicknessNm=50:110"],
      ["--param", PARAM, "--objective", "best"],
      ["--param", PARAM, "--objective", "angles"],
      ["--param", PARAM, "--replicas", "2"],
    ]) {
      const o = join(dir, "never");
      const r = await run("optimize", studyPath, ...args, "--out", o, "--quiet");
      expect(r.code, args.join(" ")).toBe(2);
      expect(r.err).toMatch(/^lightfold: /);
      expect(existsSync(o)).toBe(false);
    }
  });
});
