/**
 * The one place that names response-matrix channels for people: a label for figures and tables, a
 * short one for narrow table columns, and the kind of channel (what the light did). Works for any
 * channel list: known names get their words, channels of the same families (`A_<kind>:<name>`,
 * `R_<part>`, `T_<part>`) are named from their parts, anything else is shown as written.
 */

/** What happened to the light counted in a channel. */
export type ChannelKind = "absorber" | "reflection" | "transmission" | "parasitic" | "unresolved";

export function channelKind(channel: string): ChannelKind {
  if (channel === "A_absorber") return "absorber";
  if (channel === "unresolved") return "unresolved";
  if (channel === "R" || channel.startsWith("R_")) return "reflection";
  if (channel === "T" || channel.startsWith("T_")) return "transmission";
  return "parasitic";
}

interface Words {
  long: string;
  short: string;
}

const FIXED: Record<string, Words> = {
  A_absorber: { long: "absorber", short: "absorber" },
  // Matrices of format version 1: reflection and escape through the front together.
  R: { long: "front reflection + escape (not split: older matrix)", short: "R" },
  R_first: { long: "reflected before entering the absorber", short: "R first" },
  R_escape: { long: "entered, then left through the front", short: "R escape" },
  T: { long: "transmitted through the rear (not split: older matrix)", short: "T" },
  T_first: { long: "left through the rear on the first pass", short: "T first" },
  T_escape: { long: "left through the rear on a later pass", short: "T escape" },
  A_rear: { long: "rear reflector", short: "rear refl." },
  unresolved: { long: "unresolved (event limit)", short: "unresolved" },
};

/** "A_film:front:0:SiNx" → SiNx at the front; where may be "top:<layer>" or "rear". */
function filmWords(rest: string): Words | null {
  const m = /^(.*):(\d+):([^:]*)$/.exec(rest);
  if (m === null) return null;
  const where = m[1]!;
  const material = m[3]!;
  const n = Number(m[2]) + 1;
  if (where.startsWith("top:")) {
    const layer = where.slice("top:".length);
    return { long: `${material} film on ${layer} (#${n})`, short: `${material} on ${layer}` };
  }
  if (where.startsWith("bottom:")) {
    const layer = where.slice("bottom:".length);
    return { long: `${material} film under ${layer} (#${n})`, short: `${material} under ${layer}` };
  }
  return { long: `${material} film, ${where} (#${n})`, short: `${material} ${where}` };
}

function words(channel: string): Words {
  const fixed = FIXED[channel];
  if (fixed !== undefined) return fixed;
  if (channel.startsWith("A_film:")) {
    const w = filmWords(channel.slice("A_film:".length));
    if (w !== null) return w;
  }
  if (channel.startsWith("A_layer:")) {
    const name = channel.slice("A_layer:".length);
    return { long: `${name} (layer)`, short: name };
  }
  // Other families: A_<kind>:<name> → "<name> (<kind>)"; R_<part>/T_<part> → "R <part>".
  const family = /^A_([A-Za-z]+):(.+)$/.exec(channel);
  if (family !== null) return { long: `${family[2]} (${family[1]})`, short: family[2]! };
  const split = /^([RT])_(.+)$/.exec(channel);
  if (split !== null) {
    const part = split[2]!.replace(/_/g, " ");
    return { long: `${split[1] === "R" ? "reflected" : "transmitted"} (${part})`, short: `${split[1]} ${part}` };
  }
  return { long: channel, short: channel };
}

/** Label for figures and tables: "reflected to the front", "SiNx film, front (#1)", "cover glass (layer)". */
export function channelLabel(channel: string): string {
  return words(channel).long;
}

/** A short label for narrow table columns: "R", "SiNx front", "cover glass", "rear refl.". */
export function channelShortLabel(channel: string): string {
  return words(channel).short;
}
