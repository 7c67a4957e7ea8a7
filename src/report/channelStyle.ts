/**
 * How each channel is drawn, the same in every figure of the report: a colour by kind (absorber
 * green, reflection blues, transmission greys, parasitic absorbers from a categorical list in channel
 * order) and, once a kind runs out of colours, a dash pattern and another marker. Labels come from
 * src/response/channelLabels.ts; any channel list works (new channels slot in by kind).
 */
import { channelKind, type ChannelKind } from "../response/channelLabels.js";
import { DASHES, KIND_COLOURS, PARASITIC_COLOURS } from "./svg/palette.js";

export interface ChannelStyle {
  colour: string;
  dash: string | undefined;
  marker: number;
}

function coloursOf(kind: ChannelKind): readonly string[] {
  if (kind === "absorber") return [KIND_COLOURS.absorber];
  if (kind === "unresolved") return [KIND_COLOURS.unresolved];
  if (kind === "reflection") return KIND_COLOURS.reflection;
  if (kind === "transmission") return KIND_COLOURS.transmission;
  return PARASITIC_COLOURS;
}

/** Style of every channel of the list (by kind, then order within the kind). */
export function channelStyles(channels: readonly string[]): Map<string, ChannelStyle> {
  const seen = new Map<ChannelKind, number>();
  const out = new Map<string, ChannelStyle>();
  channels.forEach((c, i) => {
    const kind = channelKind(c);
    const k = seen.get(kind) ?? 0;
    seen.set(kind, k + 1);
    const colours = coloursOf(kind);
    out.set(c, { colour: colours[k % colours.length]!, dash: DASHES[Math.floor(k / colours.length) % DASHES.length], marker: i });
  });
  return out;
}
