import { escapeText } from "../escape.js";
import { el, text } from "./element.js";
import { FONT_FAMILY, INK, INK_SOFT } from "./palette.js";

/**
 * Title lines and outer element of a standalone SVG plot: `content` is drawn on the white
 * background under the titles, `defs` before the background and `over` above the titles.
 */
export function svgFrame(
  o: { id: string; title: string; subtitle?: string; width: number; height: number; left: number },
  content: string,
  layers: { defs?: string; over?: string } = {},
): string {
  // approximate glyph widths of the title (15 px bold) and subtitle (12 px) fonts
  const fit = (t: string, pxPerChar: number) => {
    const max = Math.floor((o.width - o.left - 8) / pxPerChar);
    return t.length > max ? `${t.slice(0, Math.max(1, max - 1))}…` : t;
  };
  const titles =
    text(o.left, 24, fit(o.title, 9), { "font-size": 15, "font-weight": "bold", fill: INK, class: "plot-title" }) +
    (o.subtitle ? text(o.left, 43, fit(o.subtitle, 6.9), { "font-size": 12, fill: INK_SOFT }) : "");
  return el(
    "svg",
    {
      xmlns: "http://www.w3.org/2000/svg",
      width: o.width,
      height: o.height,
      viewBox: `0 0 ${o.width} ${o.height}`,
      role: "img",
      "aria-label": o.title,
      "data-plot": o.id,
      "font-family": FONT_FAMILY,
    },
    el("title", {}, escapeText(o.title)) +
      (layers.defs ?? "") +
      el("rect", { x: 0, y: 0, width: o.width, height: o.height, fill: "#FFFFFF" }) +
      content +
      titles +
      (layers.over ?? ""),
  );
}

/** Words of `text` in lines of at most `maxChars` characters (a long word keeps its own line). */
export function wrapWords(text: string, maxChars: number): string[] {
  const lines: string[] = [];
  let line = "";
  for (const word of text.split(" ")) {
    if (line !== "" && line.length + 1 + word.length > maxChars) {
      lines.push(line);
      line = word;
    } else line = line === "" ? word : `${line} ${word}`;
  }
  if (line !== "") lines.push(line);
  return lines;
}

/** A footnote under a plot, wrapped to the width: its height in px and its text elements. */
export function footnote(note: string | undefined, width: number, bottom: number): { height: number; svg: string } {
  if (!note) return { height: 0, svg: "" };
  const lines = wrapWords(note, Math.floor((width - 32) / 6.8));
  const svg = lines.map((l, i) => text(16, bottom + 18 + i * 17, l, { "font-size": 12, fill: INK_SOFT, class: "footnote" })).join("");
  return { height: 10 + lines.length * 17, svg };
}
