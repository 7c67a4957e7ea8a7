import { describe, expect, it } from "vitest";
import { formatTick, linearScale, linearTicks, logDomain, logScale, logTicks, niceDomain } from "../../src/report/svg/scale.js";

// The scales wrap d3-scale and d3-format; these checks pin what the report relies on.
describe("linearTicks / niceDomain (d3-scale)", () => {
  it("covers the data with whole 1, 2 or 5 × 10^k steps and no float noise", () => {
    expect(niceDomain(0.013, 0.987)).toEqual([0, 1]);
    expect(linearTicks([0, 1], 5)).toEqual([0, 0.2, 0.4, 0.6, 0.8, 1]);
    expect(linearTicks([300, 1200], 6)).toEqual([400, 600, 800, 1000, 1200]);
    // Heckbert, "Nice numbers for graph labels", Graphics Gems (1990): steps are 1, 2 or 5 × 10^k
    for (const [a, b] of [[0, 0.3], [2, 9], [0, 42], [100, 1334], [0, 9e5]] as [number, number][]) {
      const t = linearTicks([a, b], 6);
      const step = t[1]! - t[0]!;
      const mantissa = step / 10 ** Math.floor(Math.log10(step) + 1e-12);
      expect([1, 2, 5, 10].some((m) => Math.abs(mantissa - m) < 1e-9)).toBe(true);
    }
  });
  it("handles a constant series by padding around it", () => {
    const [a, b] = niceDomain(5, 5);
    expect(a).toBeLessThan(5);
    expect(b).toBeGreaterThan(5);
  });
});

describe("logTicks / logScale / logDomain", () => {
  it("puts decades, and 2 and 5 between them over short ranges", () => {
    expect(logTicks([100, 10000])).toEqual([100, 200, 500, 1000, 2000, 5000, 10000]);
    expect(logTicks([1e-4, 1])).toEqual([1e-4, 1e-3, 1e-2, 1e-1, 1]);
    expect(logDomain(230, 4100)).toEqual([100, 10000]);
  });
  it("maps equal ratios to equal distances", () => {
    const s = logScale([10, 1000], [0, 200]);
    expect(s(10)).toBeCloseTo(0, 12);
    expect(s(100)).toBeCloseTo(100, 12);
    expect(s(1000)).toBeCloseTo(200, 12);
    // 1/√N drops by half a decade per decade of N: slope −1/2 on log–log axes
    expect(s(1000) - s(100)).toBeCloseTo(2 * (s(100) - s(Math.sqrt(1000))), 9);
  });
});

describe("linearScale / formatTick (d3-format)", () => {
  it("maps domain ends to range ends (inverted y)", () => {
    const y = linearScale([0, 1], [400, 40]);
    expect(y(0)).toBe(400);
    expect(y(1)).toBe(40);
    expect(y(0.5)).toBe(220);
  });
  it("prints short labels, grouped thousands and powers of ten", () => {
    expect(formatTick(0.30000000000000004)).toBe("0.3");
    expect(formatTick(1e6)).toBe("10⁶");
    expect(formatTick(2e-4)).toBe("2×10⁻⁴");
    expect(formatTick(1200)).toBe("1200");
    expect(formatTick(350000)).toBe("350,000");
  });
});
