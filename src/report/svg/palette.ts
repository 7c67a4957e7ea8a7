/**
 * lightfold's colours, line dashes and marker shapes. Categorical colours come from d3-scale-chromatic
 * (its "Observable 10" scheme, then "Dark 2"); a series or channel past the colours keeps its colour
 * family but gets a dash pattern and another marker, so twelve and more stay apart.
 */
import { schemeDark2, schemeObservable10 } from "d3-scale-chromatic";
import { symbol, symbolsFill } from "d3-shape";

/** Series colours in order of use for line plots and grouped bars (10 distinct). */
export const SERIES_COLOURS: readonly string[] = schemeObservable10;

/** Dash patterns in order of use: solid, then dashed, dotted, dash-dot. */
export const DASHES: readonly (string | undefined)[] = [undefined, "7 4", "2 3", "8 3 2 3"];

/** How series i is drawn: colour, dash (from the 11th series on), marker shape (7 shapes, by i). */
export interface SeriesStyle {
  colour: string;
  dash: string | undefined;
  marker: number;
}

export function seriesStyle(i: number): SeriesStyle {
  const n = SERIES_COLOURS.length;
  return { colour: SERIES_COLOURS[i % n]!, dash: DASHES[Math.floor(i / n) % DASHES.length], marker: i % symbolsFill.length };
}

export function seriesColour(i: number): string {
  return seriesStyle(i).colour;
}

/** SVG path data of marker shape k (d3-shape's fill symbols: circle, cross, diamond, square, star, triangle, wye), centred on 0,0. */
export function markerPath(k: number, areaPx2 = 48): string {
  return symbol(symbolsFill[k % symbolsFill.length]!, areaPx2)() ?? "";
}

/** Colours of channel kinds that keep one meaning throughout the report. */
export const KIND_COLOURS = {
  absorber: "#3ca951",
  reflection: ["#4269d0", "#97bbf5", "#1f3f8f"],
  transmission: ["#9498a0", "#c5c8ce"],
  unresolved: "#3a3a3a",
} as const;

/** Parasitic absorbers (films, layers, rear reflector) take these in channel order (11 distinct). */
export const PARASITIC_COLOURS: readonly string[] = [
  ...schemeObservable10.filter((c) => !["#4269d0", "#3ca951", "#97bbf5", "#9498a0"].includes(c)),
  ...schemeDark2.filter((c) => !["#1b9e77", "#66a61e", "#666666"].includes(c)),
];

/** Ink for axes, text and grid lines. */
export const INK = "#1E2430";
export const INK_SOFT = "#5B6472";
export const GRID = "#E3E6EB";
export const FONT_FAMILY = "'DejaVu Sans', 'Liberation Sans', Arial, Helvetica, sans-serif";
