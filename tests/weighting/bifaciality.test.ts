import { describe, expect, it } from "vitest";
import { astmG173 } from "../../src/spectrum/astmG173.js";
import { opticalBifaciality } from "../../src/weighting/bifaciality.js";
import { photocurrentForMatrix } from "../../src/weighting/writePhotocurrent.js";
import { makeMatrix, range } from "../yield/matrixFixture.js";

describe("opticalBifaciality(front, rear)", () => {
  it("is J_rear/J_front at 0° with the ratio's first-order error from both matrices", () => {
    // same spectral weights on both sides, so a constant absorptance ratio carries over exactly;
    // error of a ratio of independent estimates: (r/f)·√((s_r/r)² + (s_f/f)²) (first-order propagation)
    const g = astmG173("global");
    const front = photocurrentForMatrix(makeMatrix({ thetaDeg: range(0, 80, 20), absorber: () => 0.9, stderr: 0.002 }), g);
    const rear = photocurrentForMatrix(makeMatrix({ thetaDeg: range(0, 80, 20), absorber: () => 0.72, stderr: 0.003 }), g);
    const b = opticalBifaciality(front, rear);
    expect(b.thetaDeg).toBe(0);
    expect(b.bifaciality.value).toBeCloseTo(0.8, 12);
    const f = b.frontJscMaCm2, r = b.rearJscMaCm2;
    expect(b.bifaciality.stderr).toBeCloseTo(0.8 * Math.hypot(r.stderr / r.value, f.stderr / f.value), 12);
  });
});
