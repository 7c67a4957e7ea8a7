/**
 * lightfold's colours. Categorical colours are the Okabe–Ito set (Okabe & Ito 2008, "Color Universal
 * Design"), published as distinguishable under the common colour-vision deficiencies; the channel
 * assignment and the greys are our own.
 */
export const OKABE_ITO = {
  orange: "#E69F00",
  skyBlue: "#56B4E9",
  bluishGreen: "#009E73",
  yellow: "#F0E442",
  blue: "#0072B2",
  vermillion: "#D55E00",
  reddishPurple: "#CC79A7",
  black: "#000000",
} as const;

/** Series colours in order of use for line plots and grouped bars. */
export const SERIES_COLOURS: readonly string[] = [
  OKABE_ITO.blue,
  OKABE_ITO.vermillion,
  OKABE_ITO.bluishGreen,
  OKABE_ITO.reddishPurple,
  OKABE_ITO.orange,
  OKABE_ITO.skyBlue,
  OKABE_ITO.black,
];

/** Fixed colours of the optical loss channels in the stacked spectral plot. */
export const CHANNEL_COLOURS = {
  absorber: OKABE_ITO.bluishGreen,
  frontReflection: OKABE_ITO.skyBlue,
  rearEscape: "#8C8C8C",
  unresolved: "#3A3A3A",
} as const;

/** Parasitic absorbers (films, thick layers, rear reflector) cycle through these. */
export const PARASITIC_COLOURS: readonly string[] = [
  OKABE_ITO.orange,
  OKABE_ITO.vermillion,
  OKABE_ITO.reddishPurple,
  OKABE_ITO.yellow,
  OKABE_ITO.blue,
  "#7A4E2D",
];

export function seriesColour(i: number): string {
  return SERIES_COLOURS[i % SERIES_COLOURS.length]!;
}

export function parasiticColour(i: number): string {
  return PARASITIC_COLOURS[i % PARASITIC_COLOURS.length]!;
}

/** Ink for axes, text and grid lines. */
export const INK = "#1E2430";
export const INK_SOFT = "#5B6472";
export const GRID = "#E3E6EB";
export const FONT_FAMILY = "'DejaVu Sans', 'Liberation Sans', Arial, Helvetica, sans-serif";
