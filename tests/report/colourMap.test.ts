import { describe, expect, it } from "vitest";
import { sequentialColour } from "../../src/report/svg/colourMap.js";
import { PARASITIC_COLOURS, seriesStyle } from "../../src/report/svg/palette.js";
import { channelStyles } from "../../src/report/channelStyle.js";

/** WCAG 2.1 relative luminance of an sRGB colour (W3C, "Web Content Accessibility Guidelines 2.1", §1.4.3 definition). */
function luminance(hex: string): number {
  const c = [1, 3, 5].map((i) => parseInt(hex.slice(i, i + 2), 16) / 255);
  const lin = c.map((v) => (v <= 0.04045 ? v / 12.92 : ((v + 0.055) / 1.055) ** 2.4));
  return 0.2126 * lin[0]! + 0.7152 * lin[1]! + 0.0722 * lin[2]!;
}

describe("sequentialColour(t) (cividis, d3-scale-chromatic)", () => {
  it("rises monotonically in luminance, so the map reads in greyscale and for colour-blind readers", () => {
    let prev = -1;
    for (let k = 0; k <= 200; k++) {
      const l = luminance(sequentialColour(k / 200));
      expect(l).toBeGreaterThan(prev);
      prev = l;
    }
  });
  it("spans a wide contrast range (WCAG contrast ratio of the ends above 10:1)", () => {
    const lo = luminance(sequentialColour(0));
    const hi = luminance(sequentialColour(1));
    expect((hi + 0.05) / (lo + 0.05)).toBeGreaterThan(10);
  });
  it("clamps outside [0, 1] and returns #rrggbb", () => {
    expect(sequentialColour(-3)).toBe(sequentialColour(0));
    expect(sequentialColour(7)).toBe(sequentialColour(1));
    expect(sequentialColour(0.37)).toMatch(/^#[0-9a-f]{6}$/);
  });
});

describe("styles of channels and series", () => {
  it("gives every channel of a 12-channel module stack its own colour", () => {
    const channels = ["R", "A_film:top:cover glass:0:SiO2", "A_layer:cover glass", "A_layer:encapsulant", "A_film:front:0:SiNx", "A_film:front:1:Al2O3",
      "A_absorber", "A_film:rear:0:Al2O3", "A_film:rear:1:SiNx", "A_rear", "T", "unresolved"];
    const styles = channelStyles(channels);
    expect(new Set(channels.map((c) => styles.get(c)!.colour)).size).toBe(12);
    expect(PARASITIC_COLOURS.length).toBeGreaterThanOrEqual(11);
  });
  it("keeps 20 channels or series apart by colour plus dash or marker", () => {
    const many = Array.from({ length: 20 }, (_, i) => `A_layer:l${i}`);
    const styles = channelStyles(many);
    expect(new Set(many.map((c) => JSON.stringify(styles.get(c))).values()).size).toBe(20);
    expect(new Set(Array.from({ length: 20 }, (_, i) => JSON.stringify(seriesStyle(i)))).size).toBe(20);
    expect(new Set(Array.from({ length: 10 }, (_, i) => seriesStyle(i).colour)).size).toBe(10);
  });
});
