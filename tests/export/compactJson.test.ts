import { describe, expect, it } from "vitest";
import { compactJson } from "../../src/export/compactJson.js";

describe("compactJson(value)", () => {
  it("puts flat arrays on one line and parses back to the same value", () => {
    const v = { axes: { t: [0, 0.1 + 0.2, 1e-300], ch: ["R", "A_layer:glass [3 mm]", "x,\ny", "{}"] }, nested: [[1, 2], [3]], o: [{ a: 1 }] };
    const text = compactJson(v);
    expect(JSON.parse(text)).toEqual(v);
    expect(text).toContain('"t": [0, 0.30000000000000004, 1e-300]');
    expect(text.endsWith("}\n")).toBe(true);
  });
});
