import { describe, expect, it } from "vitest";
import { duskColour } from "../../src/report/svg/colourMap.js";
import { OKABE_ITO } from "../../src/report/svg/palette.js";

/** WCAG 2.1 relative luminance of an sRGB colour (W3C, "Web Content Accessibility Guidelines 2.1", §1.4.3 definition). */
function luminance(hex: string): number {
  const c = [1, 3, 5].map((i) => parseInt(hex.slice(i, i + 2), 16) / 255);
  const lin = c.map((v) => (v <= 0.04045 ? v / 12.92 : ((v + 0.055) / 1.055) ** 2.4));
  return 0.2126 * lin[0]! + 0.7152 * lin[1]! + 0.0722 * lin[2]!;
}

describe("duskColour(t)", () => {
  it("rises monotonically in luminance, so the map reads in greyscale and for colour-blind readers", () => {
    let prev = -1;
    for (let k = 0; k <= 200; k++) {
      const l = luminance(duskColour(k / 200));
      expect(l).toBeGreaterThan(prev);
      prev = l;
    }
  });
  it("spans a wide contrast range (WCAG contrast ratio of the ends above 10:1)", () => {
    const lo = luminance(duskColour(0));
    const hi = luminance(duskColour(1));
    expect((hi + 0.05) / (lo + 0.05)).toBeGreaterThan(10);
  });
  it("clamps outside [0, 1] and returns #rrggbb", () => {
    expect(duskColour(-3)).toBe(duskColour(0));
    expect(duskColour(7)).toBe(duskColour(1));
    expect(duskColour(0.37)).toMatch(/^#[0-9a-f]{6}$/);
  });
});

describe("Okabe–Ito palette", () => {
  it("holds the published hex values (Okabe & Ito 2008, Color Universal Design; from memory)", () => {
    expect(OKABE_ITO).toEqual({
      orange: "#E69F00",
      skyBlue: "#56B4E9",
      bluishGreen: "#009E73",
      yellow: "#F0E442",
      blue: "#0072B2",
      vermillion: "#D55E00",
      reddishPurple: "#CC79A7",
      black: "#000000",
    });
  });
});
