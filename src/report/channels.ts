/** Readable labels and grouping of response-matrix channel names for the report. */

export type ChannelGroup = "absorber" | "frontReflection" | "rearEscape" | "parasitic" | "unresolved";

export function channelGroup(channel: string): ChannelGroup {
  if (channel === "A_absorber") return "absorber";
  if (channel === "R") return "frontReflection";
  if (channel === "T") return "rearEscape";
  if (channel === "unresolved") return "unresolved";
  return "parasitic";
}

/** Label for a channel: "front reflection", "SiNx film (front, #1)", "cover glass (layer)", … */
export function channelLabel(channel: string): string {
  switch (channel) {
    case "A_absorber":
      return "absorber";
    case "R":
      return "front reflection";
    case "T":
      return "rear escape";
    case "A_rear":
      return "rear reflector";
    case "unresolved":
      return "unresolved (event limit)";
  }
  if (channel.startsWith("A_layer:")) return `${channel.slice("A_layer:".length)} (layer)`;
  if (channel.startsWith("A_film:")) {
    // A_film:<where>:<i>:<material>, where may itself be "top:<layer name>"
    const rest = channel.slice("A_film:".length);
    const m = /^(.*):(\d+):([^:]*)$/.exec(rest);
    if (m) return `${m[3]} film (${m[1]!.replace(/^top:/, "top of ")}, #${Number(m[2]) + 1})`;
    return `${rest} (film)`;
  }
  return channel;
}
