import { existsSync, mkdtempSync, readFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { beforeAll, describe, expect, it } from "vitest";
import { writeResponseMatrix } from "../../src/response/matrixFile.js";
import { runMain } from "../helpers/cli.js";
import { makeMatrix, range } from "./matrixFixture.js";

let dir = "";
const SITE = "configs/sites/saltmere-plain.site.json";
const f = () => join(dir, "front.matrix.json");
const r = () => join(dir, "rear.matrix.json");

beforeAll(() => {
  dir = mkdtempSync(join(tmpdir(), "lightfold-bifacial-"));
  writeResponseMatrix(f(), makeMatrix({ thetaDeg: range(0, 85, 5), absorber: (t) => 0.9 * Math.cos((t * Math.PI) / 200), stderr: 0.002, name: "glass-glass" }));
  writeResponseMatrix(r(), { ...makeMatrix({ thetaDeg: range(0, 85, 5), absorber: (t) => 0.8 * Math.cos((t * Math.PI) / 200), stderr: 0.002, name: "glass-glass" }), lightFrom: "rear" });
});

describe("lightfold yield --rear-matrix", () => {
  it("writes yield/bifacial-<site>.json with front, rear, total and gain per tilt and pitch, and the report shows them", async () => {
    const runDir = join(dir, "run");
    const res = await runMain("yield", "--matrix", f(), "--rear-matrix", r(), "--site", SITE, "--tilt", "20,30", "--pitch", "5,8", "--height", "1.3", "--run-dir", runDir);
    expect(res.code).toBe(0);
    expect(res.out).toMatch(/optical bifaciality \(0°, AM1\.5G\) 0\.889/);
    const doc = JSON.parse(readFileSync(join(runDir, "yield", "bifacial-saltmere-plain.json"), "utf8"));
    expect(doc.kind).toBe("lightfold.bifacial");
    expect(doc.results).toHaveLength(4);
    for (const row of doc.results) {
      expect(row.totalChargeAhM2).toBeCloseTo(row.front.chargeAhM2 + row.rear.chargeAhM2, 1);
      expect(row.bifacialGainPct).toBeCloseTo((100 * row.rear.chargeAhM2) / row.front.chargeAhM2, 2);
    }
    const html = readFileSync(join(runDir, "report", "index.html"), "utf8");
    expect(html).toContain('id="bifacial"');
    expect(existsSync(join(runDir, "report", "bifacial-tilt.svg"))).toBe(true);
    expect(existsSync(join(runDir, "report", "bifacial-pitch.svg"))).toBe(true);
  });

  it("compare --rear-matrix ×2 gives the benefit in front + rear charge with both stacks' gains", async () => {
    // A = the fixture pair, B = the same front with no rear response: B's total is its front alone
    const zeroRear = join(dir, "dark-rear.matrix.json");
    writeResponseMatrix(zeroRear, { ...makeMatrix({ thetaDeg: range(0, 85, 5), absorber: () => 0, stderr: 0, name: "monofacial" }), lightFrom: "rear" });
    const res = await runMain("compare", "--matrix", f(), "--matrix", f(), "--rear-matrix", r(), "--rear-matrix", zeroRear, "--site", SITE, "--tilt", "25", "--gcr", "0.4", "--json");
    expect(res.code).toBe(0);
    const doc = JSON.parse(res.out);
    expect(doc.basis).toBe("front+rear");
    const row = doc.rows[0];
    expect(row.bifacialGainBPct).toBe(0);
    // same front matrix: the total benefit equals A's bifacial gain (Q_A/Q_B − 1 = rear_A/front)
    expect(row.benefitPct).toBeCloseTo(row.bifacialGainAPct, 3);
    expect(row.pitchM).toBeCloseTo(5, 12);
    // the fixture matrices carry no pairing groups: independent errors, and the file says why
    expect(doc.pairing.errorKind).toBe("independent");
    expect(doc.pairing.reason).toMatch(/^front: .*front\.matrix\.json has no pairing groups/);
    expect(row.benefitErrorKind).toBe("independent");
    expect(row.differences.total.deltaAhM2).toBeCloseTo(row.chargeAAhM2 - row.chargeBAhM2, 1);
    expect(row.differences.bifacialGain.deltaPts).toBeCloseTo(row.bifacialGainAPct - row.bifacialGainBPct, 3);
    const text = await runMain("compare", "--matrix", f(), "--matrix", f(), "--rear-matrix", r(), "--rear-matrix", zeroRear, "--site", SITE, "--tilt", "25", "--gcr", "0.4");
    expect(text.out).toMatch(/paired errors unavailable: front: .* has no pairing groups/);
  });

  it("refuses negative pitch or height, a ground-coverage ratio outside (0, 1] and a front-lit rear matrix (exit 2, nothing written)", async () => {
    const out = join(dir, "bad.json");
    const bad = async (args: string[], re: RegExp) => {
      const res = await runMain("yield", "--matrix", f(), "--site", SITE, "--out", out, ...args);
      expect(res.code).toBe(2);
      expect(res.err).toMatch(re);
      expect(existsSync(out)).toBe(false);
    };
    await bad(["--rear-matrix", r(), "--pitch", "-3"], /--pitch: -3 m must be positive/);
    await bad(["--rear-matrix", r(), "--height", "-1"], /--height: expected a positive number/);
    await bad(["--rear-matrix", r(), "--gcr", "1.4"], /--gcr: 1\.4 is outside \(0, 1\]/);
    await bad(["--rear-matrix", r(), "--gcr", "0"], /--gcr: 0 is outside/);
    await bad(["--rear-matrix", f()], /--rear-matrix .*traced with light from the front/);
    await bad(["--rear-matrix", r(), "--tilt", "60", "--height", "0.5"], /centreHeightM = 0\.5 puts the lower module edge/);
  });
});
