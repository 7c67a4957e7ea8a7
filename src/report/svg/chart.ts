import { escapeText } from "../escape.js";
import { el, num, text } from "./element.js";
import { GRID, INK, markerPath } from "./palette.js";
import { svgFrame } from "./frame.js";
import { formatTick, linearScale, linearTicks, logDomain, logScale, logTicks, niceDomain, type Scale } from "./scale.js";

/** One axis of a chart: numeric (linear or log) or categorical ("band"). */
export interface AxisSpec {
  label: string;
  kind?: "linear" | "log" | "band";
  /** Fixed numeric domain; otherwise the data extent widened to nice values. */
  domain?: [number, number];
  /** Categories of a band axis, in order. */
  categories?: string[];
  /** Override the tick positions of a numeric axis. */
  ticks?: number[];
  /** Start a linear axis at zero even when all data are positive. */
  includeZero?: boolean;
  /** Use the data extent as it is (no widening to nice values). */
  tight?: boolean;
  /** Extra room above the data, as a fraction of the span (for labels over the highest point). */
  headroom?: number;
  /** Room on both sides of a tight axis, as a fraction of the span (keeps edge markers whole). */
  padding?: number;
}

export interface LegendItem {
  label: string;
  colour: string;
  shape: "line" | "dashed" | "box" | "marker" | "guide";
  /** Dash pattern of the line (drawn as in the plot). */
  dash?: string;
  /** Marker shape index (palette.markerPath), drawn on the line sample. */
  marker?: number;
}

export interface ChartSpec {
  /** Stable id of the plot (file name and `data-plot` attribute). */
  id: string;
  title: string;
  subtitle?: string;
  width?: number;
  height?: number;
  x: AxisSpec;
  y: AxisSpec;
  legend?: LegendItem[];
  /** Extra room right of the plot area (colour bar). */
  extraRight?: number;
}

/** Geometry and scales of a laid-out chart. */
export interface Chart {
  spec: ChartSpec;
  width: number;
  height: number;
  left: number;
  top: number;
  right: number;
  bottom: number;
  x: Scale;
  y: Scale;
  /** Band axes: width of one category slot in px (0 for numeric axes). */
  xBand: number;
  yBand: number;
}

const TICK_FONT = 12;
const LABEL_FONT = 13;
const MAX_LEGEND_CHARS = 52;

function legendLabel(label: string): string {
  return label.length > MAX_LEGEND_CHARS ? `${label.slice(0, MAX_LEGEND_CHARS - 1)}…` : label;
}

function legendWidth(items: LegendItem[] | undefined): number {
  if (!items || items.length === 0) return 0;
  const chars = Math.max(...items.map((i) => legendLabel(i.label).length));
  return 52 + chars * 7.7;
}

function numericScale(axis: AxisSpec, extent: [number, number], range: [number, number]): Scale {
  if (axis.kind === "log") {
    const d = axis.domain ?? logDomain(extent[0], extent[1]);
    return logScale(d, range);
  }
  let [lo, hi] = extent;
  if (axis.includeZero) {
    lo = Math.min(lo, 0);
    hi = Math.max(hi, 0);
  }
  if (axis.headroom) hi += axis.headroom * (hi - lo || Math.abs(hi) || 1);
  if (axis.padding) {
    const p = axis.padding * (hi - lo || Math.abs(hi) || 1);
    lo -= p;
    hi += p;
  }
  const d = axis.domain ?? (axis.tight && hi > lo ? ([lo, hi] as [number, number]) : niceDomain(lo, hi));
  return linearScale(d, range);
}

function bandScale(categories: string[], range: [number, number]): { scale: Scale; band: number } {
  const n = Math.max(1, categories.length);
  const band = (range[1] - range[0]) / n;
  const s = linearScale([-0.5, n - 0.5], range);
  return { scale: s, band: Math.abs(band) };
}

/**
 * Lays out a chart: margins for title, ticks, axis labels and legend, then scales over the data
 * extents (`xExtent`, `yExtent` = [min, max] of the data; ignored for band axes and fixed domains).
 */
export function layoutChart(spec: ChartSpec, xExtent: [number, number], yExtent: [number, number]): Chart {
  const width = spec.width ?? 780;
  const height = spec.height ?? 460;
  const top = spec.subtitle ? 58 : 42;
  const left = 86;
  const bottom = height - 52;
  const right = width - 18 - legendWidth(spec.legend) - (spec.extraRight ?? 0);
  let x: Scale;
  let xBand = 0;
  if (spec.x.kind === "band") {
    const b = bandScale(spec.x.categories ?? [], [left, right]);
    x = b.scale;
    xBand = b.band;
  } else x = numericScale(spec.x, xExtent, [left, right]);
  let y: Scale;
  let yBand = 0;
  if (spec.y.kind === "band") {
    const b = bandScale(spec.y.categories ?? [], [bottom, top]);
    y = b.scale;
    yBand = b.band;
  } else y = numericScale(spec.y, yExtent, [bottom, top]);
  return { spec, width, height, left, top, right, bottom, x, y, xBand, yBand };
}

function ticksOf(axis: AxisSpec, scale: Scale): { value: number; label: string }[] {
  if (axis.kind === "band") return (axis.categories ?? []).map((c, i) => ({ value: i, label: c }));
  const values = axis.ticks ?? (scale.kind === "log" ? logTicks(scale.domain) : linearTicks(scale.domain));
  const [a, b] = scale.domain[0] <= scale.domain[1] ? scale.domain : [scale.domain[1], scale.domain[0]];
  return values.filter((v) => v >= a - 1e-9 * Math.abs(b - a) && v <= b + 1e-9 * Math.abs(b - a)).map((v) => ({ value: v, label: formatTick(v) }));
}

/** Grid lines (numeric axes only), drawn beneath the data. */
function gridLines(c: Chart): string {
  let out = "";
  if (c.spec.x.kind !== "band") {
    for (const t of ticksOf(c.spec.x, c.x)) {
      const px = c.x(t.value);
      out += el("line", { x1: px, y1: c.top, x2: px, y2: c.bottom });
    }
  }
  if (c.spec.y.kind !== "band") {
    for (const t of ticksOf(c.spec.y, c.y)) {
      const py = c.y(t.value);
      out += el("line", { x1: c.left, y1: py, x2: c.right, y2: py });
    }
  }
  return el("g", { class: "grid", stroke: GRID, "stroke-width": 1 }, out);
}

function axes(c: Chart): string {
  let out = "";
  // x axis: line, ticks, tick labels, label
  out += el("line", { x1: c.left, y1: c.bottom, x2: c.right, y2: c.bottom, stroke: INK, "stroke-width": 1 });
  for (const t of ticksOf(c.spec.x, c.x)) {
    const px = c.x(t.value);
    out += el("line", { x1: px, y1: c.bottom, x2: px, y2: c.bottom + 5, stroke: INK });
    out += text(px, c.bottom + 19, t.label, { "text-anchor": "middle", "font-size": TICK_FONT, fill: INK });
  }
  out += text((c.left + c.right) / 2, c.height - 10, c.spec.x.label, { "text-anchor": "middle", "font-size": LABEL_FONT, fill: INK, class: "axis-label" });
  // y axis
  out += el("line", { x1: c.left, y1: c.top, x2: c.left, y2: c.bottom, stroke: INK, "stroke-width": 1 });
  for (const t of ticksOf(c.spec.y, c.y)) {
    const py = c.y(t.value);
    out += el("line", { x1: c.left - 5, y1: py, x2: c.left, y2: py, stroke: INK });
    out += text(c.left - 8, py + 4, t.label, { "text-anchor": "end", "font-size": TICK_FONT, fill: INK });
  }
  const cy = (c.top + c.bottom) / 2;
  out += text(16, cy, c.spec.y.label, { "text-anchor": "middle", "font-size": LABEL_FONT, fill: INK, transform: `rotate(-90 16 ${num(cy)})`, class: "axis-label" });
  return el("g", { class: "axes" }, out);
}

function legend(c: Chart): string {
  const items = c.spec.legend;
  if (!items || items.length === 0) return "";
  const x0 = c.width - 10 - legendWidth(items) + 12;
  let out = "";
  items.forEach((item, i) => {
    const y = c.top + 8 + i * 20;
    if (item.shape === "box") out += el("rect", { x: x0, y: y - 6, width: 18, height: 12, fill: item.colour, stroke: INK, "stroke-width": 0.5 });
    else if (item.shape === "guide") out += el("line", { x1: x0, y1: y, x2: x0 + 24, y2: y, stroke: item.colour, "stroke-width": 7, "stroke-opacity": 0.45 });
    else {
      // the same dash and marker as the series in the plot
      const dash = item.dash ?? (item.shape === "dashed" ? "6 4" : undefined);
      out += el("line", { x1: x0, y1: y, x2: x0 + 24, y2: y, stroke: item.colour, "stroke-width": item.shape === "dashed" ? 1.6 : 2.2, "stroke-dasharray": dash });
      if (item.shape === "marker" || item.marker !== undefined) {
        out += el("path", { d: markerPath(item.marker ?? 0), transform: `translate(${num(x0 + 12)},${num(y)})`, fill: item.colour, stroke: "#fff", "stroke-width": 1 });
      }
    }
    out += el("text", { x: x0 + 31, y: y + 4, "font-size": TICK_FONT, fill: INK }, `${el("title", {}, escapeText(item.label))}${escapeText(legendLabel(item.label))}`);
  });
  return el("g", { class: "legend" }, out);
}

/** Clip path id of a chart's plot area (data marks are clipped to it). */
export function clipId(c: Chart): string {
  return `clip-${c.spec.id.replace(/[^A-Za-z0-9_-]/g, "_")}`;
}

/**
 * Wraps the data marks (`body`, trusted markup in pixel coordinates) with background, grid, axes,
 * title and legend into one standalone SVG document. `overlay` is drawn unclipped above the axes.
 */
export function renderChart(c: Chart, body: string, overlay = ""): string {
  const { spec } = c;
  const defs = el("defs", {}, el("clipPath", { id: clipId(c) }, el("rect", { x: c.left, y: c.top, width: c.right - c.left, height: c.bottom - c.top })));
  const content = gridLines(c) + el("g", { class: "marks", "clip-path": `url(#${clipId(c)})` }, body) + axes(c) + overlay;
  return svgFrame({ id: spec.id, title: spec.title, subtitle: spec.subtitle, width: c.width, height: c.height, left: c.left }, content, { defs, over: legend(c) });
}

/** Min and max of the finite values of several arrays; [0, 1] when there are none. */
export function extentOf(...arrays: ArrayLike<number>[]): [number, number] {
  let lo = Infinity;
  let hi = -Infinity;
  for (const a of arrays) {
    for (let i = 0; i < a.length; i++) {
      const v = a[i]!;
      if (!Number.isFinite(v)) continue;
      if (v < lo) lo = v;
      if (v > hi) hi = v;
    }
  }
  return lo <= hi ? [lo, hi] : [0, 1];
}
