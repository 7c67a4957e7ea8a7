/**
 * Sequential colour map of the heat maps: cividis from d3-scale-chromatic (Nuñez, Anderton &
 * Renslow 2018, designed for readers with colour-vision deficiencies), whose luminance rises
 * monotonically (checked in tests), so it also reads in greyscale.
 */
import { interpolateCividis } from "d3-scale-chromatic";

const hex2 = (v: string): string => Number(v).toString(16).padStart(2, "0");

/** Colour at t in [0, 1] (clamped; NaN → 0) as #rrggbb. */
export function sequentialColour(t: number): string {
  const tc = Number.isFinite(t) ? Math.min(1, Math.max(0, t)) : 0;
  const c = interpolateCividis(tc);
  const rgb = /^rgb\((\d+), (\d+), (\d+)\)$/.exec(c);
  return rgb === null ? c : `#${hex2(rgb[1]!)}${hex2(rgb[2]!)}${hex2(rgb[3]!)}`;
}

/** Colour used for cells with no value (NaN). */
export const NO_DATA_COLOUR = "#D9D9D9";
