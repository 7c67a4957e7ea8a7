/**
 * Spectral strips: one thin panel per channel over a shared wavelength axis, each with its own
 * vertical scale (small losses stay readable beside the absorber) and its name written in the panel.
 */
import { area } from "d3-shape";
import { el, pathThrough, text } from "./element.js";
import { footnote, svgFrame } from "./frame.js";
import { GRID, INK, INK_SOFT } from "./palette.js";
import { formatTick, linearScale, linearTicks, niceDomain } from "./scale.js";

export interface Strip {
  label: string;
  values: ArrayLike<number>;
  colour: string;
  dash?: string;
}

export interface StripsSpec {
  id: string;
  title: string;
  subtitle?: string;
  width?: number;
  xValues: ArrayLike<number>;
  xLabel: string;
  /** What the panels show, e.g. "fraction of incident power". */
  yLabel: string;
  strips: Strip[];
  footnote?: string;
}

const PANEL = 54;
const GAP = 10;

export function spectralStrips(spec: StripsSpec): string {
  const width = spec.width ?? 900;
  const top = spec.subtitle ? 62 : 46;
  const left = 70;
  const right = width - 24;
  const n = spec.strips.length;
  const plotBottom = top + n * (PANEL + GAP) - GAP;
  const foot = footnote(spec.footnote, width, plotBottom + 44);
  const height = plotBottom + 50 + foot.height;
  const xs = Array.from(spec.xValues);
  const x = linearScale([xs[0]!, xs[xs.length - 1]!], [left, right]);
  const xTicks = linearTicks([xs[0]!, xs[xs.length - 1]!], 8);
  let grid = "";
  for (const t of xTicks) grid += el("line", { x1: x(t), y1: top, x2: x(t), y2: plotBottom, stroke: GRID });
  let marks = "";
  let axes = "";
  spec.strips.forEach((s, k) => {
    const y0 = top + k * (PANEL + GAP);
    const vals = Array.from(s.values, (v) => Math.max(0, v));
    const max = Math.max(...vals.filter(Number.isFinite), 0);
    const yTop = max > 0 ? niceDomain(0, max, 2)[1] : 1;
    const y = linearScale([0, yTop], [y0 + PANEL, y0]);
    const px = xs.map((v) => x(v));
    const py = vals.map((v) => y(v));
    const fill = area<number>().x((i) => px[i]!).y0(y0 + PANEL).y1((i) => py[i]!).defined((i) => Number.isFinite(py[i]!))(vals.map((_, i) => i)) ?? "";
    marks += el("g", { class: "strip", "data-colour": s.colour },
      el("path", { d: fill, fill: s.colour, "fill-opacity": 0.28, stroke: "none" }) +
      el("path", { d: pathThrough(px, py), fill: "none", stroke: s.colour, "stroke-width": 2, "stroke-dasharray": s.dash, "stroke-linejoin": "round" }));
    axes += el("rect", { x: left, y: y0, width: right - left, height: PANEL, fill: "none", stroke: GRID });
    axes += el("line", { x1: left - 4, y1: y0, x2: left, y2: y0, stroke: INK }) + text(left - 7, y0 + 4, formatTick(yTop), { "text-anchor": "end", "font-size": 11, fill: INK_SOFT });
    axes += text(left - 7, y0 + PANEL, "0", { "text-anchor": "end", "font-size": 11, fill: INK_SOFT });
    axes += text(left + 8, y0 + 15, s.label, { "font-size": 13, "font-weight": "bold", fill: INK, stroke: "#FFFFFF", "stroke-width": 3, "paint-order": "stroke", class: "strip-label" });
  });
  axes += el("line", { x1: left, y1: plotBottom, x2: right, y2: plotBottom, stroke: INK });
  for (const t of xTicks) {
    axes += el("line", { x1: x(t), y1: plotBottom, x2: x(t), y2: plotBottom + 5, stroke: INK }) + text(x(t), plotBottom + 19, formatTick(t), { "text-anchor": "middle", "font-size": 12, fill: INK });
  }
  axes += text((left + right) / 2, plotBottom + 38, spec.xLabel, { "text-anchor": "middle", "font-size": 13, fill: INK, class: "axis-label" });
  const cy = (top + plotBottom) / 2;
  axes += text(16, cy, spec.yLabel, { "text-anchor": "middle", "font-size": 13, fill: INK, transform: `rotate(-90 16 ${cy.toFixed(1)})`, class: "axis-label" });
  return svgFrame({ id: spec.id, title: spec.title, subtitle: spec.subtitle, width, height, left }, el("g", { class: "grid" }, grid) + el("g", { class: "marks" }, marks) + el("g", { class: "axes" }, axes) + foot.svg);
}
