import { describe, expect, it } from "vitest";
import { matrixFromJson, matrixToJson } from "../../src/response/matrixFile.js";
import { emptyTrapping } from "../../src/response/fromTallies.js";
import { channelLabel } from "../../src/response/channelLabels.js";
import { photocurrentForMatrix } from "../../src/weighting/writePhotocurrent.js";
import { astmG173 } from "../../src/spectrum/index.js";
import { smallMatrix } from "./matrixFixture.js";
import { matrixToNpy } from "../../src/export/npyExport.js";
import { matrixToExportObject } from "../../src/export/jsonExport.js";

// Format history (src/response/responseMatrix.ts): version 2 splits R and T by history and adds
// the light-trapping arrays; version 1 files keep loading with their R and T read as totals.
describe("response matrix format versions", () => {
  it("version 2 round-trips the trapping arrays bit for bit", () => {
    const m = smallMatrix();
    const n = m.nRays.length;
    m.trapping = emptyTrapping(n);
    m.trapping.freePathRatio[3] = 0.1 + 0.2;
    m.trapping.passRemaining[m.trapping.maxPasses] = 1e-300;
    m.trapping.escapeAngle[17] = 1 / 3;
    const back = matrixFromJson(matrixToJson(m), "m.json");
    expect(back.trapping!.maxPasses).toBe(m.trapping.maxPasses);
    for (const f of ["entered", "freePathRatio", "freePathRatioStderr", "passRemaining", "escapeAngle"] as const) {
      expect(Array.from(back.trapping![f])).toEqual(Array.from(m.trapping[f]));
    }
  });

  it("a version-1 matrix loads: R and T stay totals, labelled as not split, and weight as before", () => {
    const m = smallMatrix();
    const v1 = JSON.parse(matrixToJson(m)) as Record<string, unknown>;
    v1.formatVersion = 1;
    v1.channels = ["R", "A_film:front:0:SiNx", "A_absorber", "T", "x1", "x2"];
    const back = matrixFromJson(JSON.stringify(v1), "old.json");
    expect(back.formatVersion).toBe(1);
    expect(back.trapping).toBeUndefined();
    expect(channelLabel("R")).toMatch(/not split/);
    const s = photocurrentForMatrix(back, astmG173("global"));
    expect(s.lossChannels[0]).toBe("R");
  });

  it("refuses a trapping block whose arrays do not match the grid, naming the field", () => {
    const m = smallMatrix();
    m.trapping = emptyTrapping(m.nRays.length);
    const raw = JSON.parse(matrixToJson(m)) as { trapping: { escapeAngle: number[] } };
    raw.trapping.escapeAngle.pop();
    expect(() => matrixFromJson(JSON.stringify(raw), "bad.json")).toThrow(/bad.json.*trapping.*escapeAngle/);
  });

  it("exports the trapping arrays: NPY files with their shapes (NumPy format, NEP 1) and nested JSON", () => {
    const m = smallMatrix();
    const n = m.nRays.length;
    m.trapping = emptyTrapping(n);
    const stride = m.trapping.maxPasses + 1;
    m.trapping.passRemaining[5 * stride + 2] = 0.25; // point 5, pass 3
    const npy = matrixToNpy(m, "mx");
    expect(npy.sidecar.arrays.passRemaining!.shape).toEqual([3, 2, 4, stride]);
    expect(npy.sidecar.arrays.escapeAngle!.shape).toEqual([3, 2, 4, 18]);
    expect([...npy.files.keys()]).toContain("mx_pass_remaining.npy");
    const j = matrixToExportObject(m);
    // point 5 = θ index 0, φ index 1, λ index 1 ([θ][φ][λ] row-major over 2 × 4)
    expect(j.trapping!.passRemaining[0]![1]![1]![2]).toBe(0.25);
    expect(j.trapping!.passRemaining[0]![1]![1]!.length).toBe(stride);
    // a version-1 matrix exports without them
    delete m.trapping;
    expect(matrixToNpy(m, "mx").sidecar.arrays.passRemaining).toBeUndefined();
    expect(matrixToExportObject(m).trapping).toBeUndefined();
  });
});
