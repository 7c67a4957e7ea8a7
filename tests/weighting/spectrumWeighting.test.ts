import { mkdtempSync, readFileSync, readdirSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { afterAll, describe, expect, it } from "vitest";
import { dataPath } from "../../src/util/packageRoot.js";
import { astmG173 } from "../../src/spectrum/index.js";
import { matrixIndex } from "../../src/response/responseMatrix.js";
import { photocurrentForMatrix, writePhotocurrentSummary } from "../../src/weighting/writePhotocurrent.js";
import type { PhotocurrentSummary } from "../../src/weighting/photocurrent.js";
import { emptyMatrix } from "./fixtures.js";

/**
 * Independent AM1.5G photon current over [fromNm, toNm]: read the ASTM G173-03 table directly,
 * photon flux E·λ/(hc) (CODATA 2018 exact h, c, q), trapezoid rule on the table's own nodes.
 */
function am15gCurrentMaCm2(fromNm: number, toNm: number): number {
  const h = 6.62607015e-34;
  const c = 299792458;
  const q = 1.602176634e-19;
  const rows = readFileSync(dataPath("spectra", "astm-g173.csv"), "utf8")
    .split("\n")
    .filter((l) => /^\d/.test(l))
    .map((l) => l.split(",").map(Number));
  let s = 0;
  for (let i = 1; i < rows.length; i++) {
    const [a, , ea] = rows[i - 1];
    const [b, , eb] = rows[i];
    if (a >= fromNm && b <= toNm) s += 0.5 * (b - a) * ((ea * a * 1e-9) / (h * c) + (eb * b * 1e-9) / (h * c));
  }
  return q * s * 0.1; // A/m² → mA/cm²
}

const dir = mkdtempSync(join(tmpdir(), "lightfold-weighting-"));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

describe("photocurrentForMatrix(m, AM1.5G)", () => {
  it("an absorber channel of 1 everywhere gives the whole AM1.5G photon current of the grid range", () => {
    const grid = Array.from({ length: 91 }, (_, i) => 300 + 10 * i); // 300–1200 nm, table nodes
    const m = emptyMatrix([0, 40], [0], grid, ["R", "A_absorber"]);
    for (let it = 0; it < 2; it++) for (let il = 0; il < grid.length; il++) m.mean[matrixIndex(m, it, 0, il, 1)] = 1;
    const s = photocurrentForMatrix(m, astmG173("global"));
    const expected = am15gCurrentMaCm2(300, 1200);
    // Same integrand and quadrature nodes, so agreement to rounding.
    expect(Math.abs(s.directions[0].jscMaCm2 / expected - 1)).toBeLessThan(1e-12);
    expect(Math.abs(s.totalAvailableMaCm2 / expected - 1)).toBeLessThan(1e-12);
    // Fact of the trade (from memory): AM1.5G carries roughly 46 mA/cm² of photons in 300–1200 nm
    // (about 43.8 mA/cm² up to 1107 nm); a loose sanity band, the exact check is above.
    expect(expected).toBeGreaterThan(44);
    expect(expected).toBeLessThan(48);
    expect(s.directions[1].iam).toBe(1);
    expect(s.directions[0].losses[0].currentMaCm2).toBe(0);
  });

  it("writePhotocurrentSummary writes photocurrent.json and iam.csv, nothing else", () => {
    const grid = [400, 500, 600, 700, 800, 900, 1000, 1100];
    const m = emptyMatrix([0, 30, 60], [0], grid, ["R", "A_absorber", "A_rear"]);
    for (let it = 0; it < 3; it++)
      for (let il = 0; il < grid.length; il++) {
        const r = 0.05 + 0.05 * it;
        m.mean[matrixIndex(m, it, 0, il, 0)] = r;
        m.mean[matrixIndex(m, it, 0, il, 1)] = (1 - r) * 0.9;
        m.mean[matrixIndex(m, it, 0, il, 2)] = (1 - r) * 0.1;
        m.stderr[matrixIndex(m, it, 0, il, 1)] = 0.004;
      }
    const { summary, files } = writePhotocurrentSummary(dir, m, astmG173("global"));
    expect(readdirSync(dir).sort()).toEqual(["iam.csv", "photocurrent.json"]);
    expect(files).toEqual([join(dir, "photocurrent.json"), join(dir, "iam.csv")]);
    const back = JSON.parse(readFileSync(files[0], "utf8")) as PhotocurrentSummary;
    expect(back).toEqual(summary);
    expect(back.spectrum).toBe("AM1.5G");
    // Opaque A split 90/10 with R = 5, 10, 15 %: IAM(θ) = (1 - R(θ))/(1 - R(0)) exactly.
    expect(back.directions[2].iam).toBeCloseTo(0.85 / 0.95, 12);
    const csv = readFileSync(files[1], "utf8").trim().split("\n");
    expect(csv.length).toBe(4);
  });
});
