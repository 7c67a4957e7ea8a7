import { mkdirSync, mkdtempSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { describe, expect, it } from "vitest";
import { comboTable } from "../../src/cli/commands/sweep.js";
import { matrixToCsv } from "../../src/export/csvExport.js";
import { channelKind, channelLabel, channelShortLabel } from "../../src/response/channelLabels.js";
import { astmG173, photocurrentWeights } from "../../src/spectrum/index.js";
import { comboTitle } from "../../src/study/comboLabel.js";
import { loadStudy } from "../../src/study/load.js";
import { photocurrentSummary } from "../../src/weighting/photocurrent.js";
import { formatPhotocurrentTable } from "../../src/weighting/table.js";
import { runMain } from "../helpers/cli.js";
import { emptyMatrix } from "../weighting/fixtures.js";

const ROOT = join(import.meta.dirname, "..", "..");

describe("CLI details", () => {
  it("a single-value flag given twice is refused (yield --matrix, --site), collecting flags are not", async () => {
    const r = await runMain("yield", "--matrix", "a.json", "--matrix", "b.json", "--site", "s.json");
    expect(r.code).toBe(2);
    expect(r.err).toContain("lightfold: --matrix is given more than once; `yield` takes one value");
    expect(r.err).toContain("`lightfold compare` takes two matrices and several sites");
    const s = await runMain("yield", "--matrix", "a.json", "--site", "s.json", "--site", "t.json");
    expect(s.err).toContain("--site is given more than once");
    // compare collects --site: the repeated flag reaches the verb, which then fails on the missing file
    const c = await runMain("compare", "--matrix", "nope-a.json", "--matrix", "nope-b.json", "--site", "x.json", "--site", "y.json");
    expect(c.err).not.toContain("given more than once");
  });

  it("check names the run hash and each combination's matrix hash with its values in words", async () => {
    const path = join(ROOT, "configs", "thickness-sweep.study.json");
    const study = loadStudy(path);
    const r = await runMain("check", path);
    expect(r.code).toBe(0);
    expect(r.out).toContain(`hash       run ${study.hash.slice(0, 16)} (journal, run.json)`);
    for (const c of study.combos) expect(r.out).toContain(`matrix ${c.hash.slice(0, 16)}`);
    expect(r.out).toMatch(/^\s+p1\s+Si 100 µm · SiNx 75 nm\s+matrix [0-9a-f]{16}$/m);
    const single = await runMain("check", join(ROOT, "configs", "demo-planar.study.json"), "--json");
    const j = JSON.parse(single.out) as { hash: string; combos: { hash: string; title: string }[] };
    expect(j.combos[0]!.hash).toMatch(/^[0-9a-f]{64}$/);
    expect(j.combos[0]!.hash).not.toBe(j.hash);
  });

  it("combination titles name the parameter with its unit (thickness, angle, other fields)", () => {
    const stack = loadStudy(join(ROOT, "configs", "module-stack.study.json")).combos[0]!.study.stack;
    expect(comboTitle({ "absorber.thicknessUm": 180, "front.films[0].thicknessNm": 65 }, stack)).toBe("Si 180 µm · SiNx 65 nm");
    expect(comboTitle({ "front.texture.facetAngleDeg": 50 }, stack)).toBe("front texture facet angle 50°");
    expect(comboTitle({ "layers[0].thicknessUm": 2000, "rear.films[1].thicknessNm": 90 }, stack)).toBe("cover glass 2000 µm · rear SiNx 90 nm");
    expect(comboTitle({ "layers[0].topFilms[0].thicknessNm": 100 }, stack)).toBe("SiO2 on cover glass 100 nm");
    const bifacial = loadStudy(join(ROOT, "configs", "glass-glass-bifacial.study.json")).combos[0]!.study.stack;
    expect(comboTitle({ "rearLayers[1].thicknessUm": 3200 }, bifacial)).toBe("rear glass 3200 µm");
    // without the stack (run.json of an older version): the path in words
    expect(comboTitle({ "absorber.thicknessUm": 180, "front.films[0].thicknessNm": 65 })).toBe("absorber 180 µm · front film 1 65 nm");
  });

  it("the sweep summary shows Jsc and the matrix hash for a study without a sweep too", () => {
    const dir = mkdtempSync(join(tmpdir(), "lf-combo-"));
    const run = {
      combos: [{ label: "base", values: {}, studyHash: "ab".repeat(32), jscFirstDirection: { thetaDeg: 0, phiDeg: "averaged", jscMaCm2: 39.4141, jscStderrMaCm2: 0.0491 } }],
    };
    writeFileSync(join(dir, "run.json"), JSON.stringify(run));
    expect(comboTable(dir)).toEqual([
      "  combo  Jsc (θ=0°, φ averaged) mA/cm²  matrix hash",
      "  base   39.414 ± 0.049                 abababababababab",
    ]);
  });

  it("the sweep summary splits the front loss into R_first and R_escape when photocurrent.json has them", () => {
    const dir = mkdtempSync(join(tmpdir(), "lf-combo-split-"));
    const run = {
      combos: [{ label: "base", values: {}, studyHash: "cd".repeat(32), jscFirstDirection: { thetaDeg: 0, phiDeg: 0, jscMaCm2: 36.9463, jscStderrMaCm2: 0.0061 } }],
    };
    writeFileSync(join(dir, "run.json"), JSON.stringify(run));
    mkdirSync(join(dir, "base"));
    const losses = [{ channel: "R_first", currentMaCm2: 4.6421 }, { channel: "R_escape", currentMaCm2: 4.6333 }];
    writeFileSync(join(dir, "base", "photocurrent.json"), JSON.stringify({ directions: [{ losses }] }));
    expect(comboTable(dir)).toEqual([
      "  combo  Jsc (θ=0°, φ 0°) mA/cm²  R first mA/cm²  R escape mA/cm²  matrix hash",
      "  base   36.946 ± 0.006           4.642           4.633            cdcdcdcdcdcdcdcd",
    ]);
  });

  it("spectral lists loss channels that carry current, says 'averaged', and names the empty ones", () => {
    const channels = ["R", "A_film:top:cover glass:0:SiO2", "A_layer:cover glass", "A_absorber", "A_rear", "T", "unresolved"];
    const m = emptyMatrix([0, 60], [0], [400, 800], channels);
    for (let p = 0; p < 4; p++) {
      m.mean[p * 7 + 0] = 0.1;
      m.mean[p * 7 + 2] = 0.02;
      m.mean[p * 7 + 3] = 0.85;
      m.mean[p * 7 + 4] = 0.03;
    }
    const w = photocurrentWeights(m.wavelengthNm, astmG173("global"));
    const s = photocurrentSummary(m, w, { spectrumName: "AM1.5G" });
    expect(s.directions[0]!.phiDeg).toBe("averaged");
    const text = formatPhotocurrentTable(s);
    expect(text).toMatch(/^theta_deg\s+phi_deg\s+Jsc\s+±SE\s+IAM\s+±SE\s+R\s+cover glass\s+rear refl\.$/m);
    expect(text).toMatch(/^0\s+averaged\s/m);
    expect(text).toContain("no current in: SiO2 film on cover glass (#1) [A_film:top:cover glass:0:SiO2], transmitted through the rear (not split: older matrix) [T], unresolved (event limit) [unresolved]");
    expect(matrixToCsv(m).split("\n")[1]).toMatch(/^0,averaged,400,R,/);
  });

  it("channel labels cover known channels and unknown ones of the same families", () => {
    expect(channelLabel("A_film:front:1:Al2O3")).toBe("Al2O3 film, front (#2)");
    expect(channelShortLabel("A_film:rear:0:SiNx")).toBe("SiNx rear");
    expect(channelLabel("R_first")).toBe("reflected before entering the absorber");
    expect(channelKind("R_escape")).toBe("reflection");
    expect(channelKind("T_escape")).toBe("transmission");
    expect(channelLabel("A_rearLayer:backsheet")).toBe("backsheet (rearLayer)");
    expect(channelKind("A_rearLayer:backsheet")).toBe("parasitic");
    expect(channelLabel("R_ground")).toBe("reflected (ground)");
    expect(channelLabel("A_film:bottom:rear glass:0:SiO2")).toBe("SiO2 film under rear glass (#1)");
    expect(channelShortLabel("A_film:bottom:rear glass:0:SiO2")).toBe("SiO2 under rear glass");
  });
});
