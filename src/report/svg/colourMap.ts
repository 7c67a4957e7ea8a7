/**
 * Sequential colour map of our own for heat maps ("dusk"): navy → teal → pale yellow. It runs along
 * the blue–yellow axis, which the red–green colour-vision deficiencies preserve, and its relative
 * luminance rises monotonically (checked in tests), so it also reads correctly in greyscale.
 */
const ANCHORS: readonly [number, number, number][] = [
  [0x14, 0x17, 0x3d],
  [0x26, 0x3f, 0x7e],
  [0x2c, 0x6e, 0x9a],
  [0x3e, 0x9a, 0x9c],
  [0x86, 0xc0, 0x8a],
  [0xd2, 0xdf, 0x7c],
  [0xfc, 0xf5, 0xb8],
];

function hex2(v: number): string {
  return Math.round(Math.min(255, Math.max(0, v))).toString(16).padStart(2, "0");
}

/** Colour at t in [0, 1] (clamped) as #rrggbb; linear interpolation between anchors in sRGB. */
export function duskColour(t: number): string {
  const tc = Number.isFinite(t) ? Math.min(1, Math.max(0, t)) : 0;
  const pos = tc * (ANCHORS.length - 1);
  const i = Math.min(ANCHORS.length - 2, Math.floor(pos));
  const f = pos - i;
  const a = ANCHORS[i]!;
  const b = ANCHORS[i + 1]!;
  return `#${hex2(a[0] + (b[0] - a[0]) * f)}${hex2(a[1] + (b[1] - a[1]) * f)}${hex2(a[2] + (b[2] - a[2]) * f)}`;
}

/** Colour used for cells with no value (NaN). */
export const NO_DATA_COLOUR = "#D9D9D9";
