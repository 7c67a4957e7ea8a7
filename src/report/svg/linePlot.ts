import { extentOf, layoutChart, renderChart, type ChartSpec, type LegendItem } from "./chart.js";
import { el, num, pathThrough, text } from "./element.js";
import { INK, markerPath, seriesColour } from "./palette.js";

export interface LineSeries {
  label: string;
  x: ArrayLike<number>;
  y: ArrayLike<number>;
  /** Standard error of each y, drawn as ±1σ whiskers. */
  yErr?: ArrayLike<number>;
  colour?: string;
  dashed?: boolean;
  /** Dash pattern (overrides `dashed`). */
  dash?: string;
  markers?: boolean;
  /** Marker shape (palette.markerPath); default: the series index. */
  marker?: number;
  /** Leave out of the legend (default: listed). */
  hideInLegend?: boolean;
  /** A reference guide: drawn first, as a wide pale line beneath the data. */
  guide?: boolean;
}

/** A highlighted point (e.g. the best tilt) with a short label. */
export interface PointMark {
  x: number;
  y: number;
  label: string;
  colour?: string;
}

export interface LinePlotSpec extends Omit<ChartSpec, "legend"> {
  series: LineSeries[];
  marks?: PointMark[];
}

/** y values usable on the axis: non-positive values vanish on a log axis. */
function usable(values: ArrayLike<number>, log: boolean): Float64Array {
  const out = new Float64Array(values.length);
  for (let i = 0; i < values.length; i++) {
    const v = values[i]!;
    out[i] = log && !(v > 0) ? NaN : v;
  }
  return out;
}

/** Line plot of one or more series, linear or log axes, optional error whiskers and marked points. */
export function linePlot(spec: LinePlotSpec): string {
  const xLog = spec.x.kind === "log";
  const yLog = spec.y.kind === "log";
  const xs = spec.series.map((s) => usable(s.x, xLog));
  const ys = spec.series.map((s) => usable(s.y, yLog));
  const marksX = (spec.marks ?? []).map((m) => m.x);
  const marksY = (spec.marks ?? []).map((m) => m.y);
  const legend: LegendItem[] = spec.series
    .map((s, i) => ({ s, i }))
    .filter(({ s }) => !s.hideInLegend)
    .map(({ s, i }) => ({
      label: s.label,
      colour: s.colour ?? seriesColour(i),
      shape: s.guide ? "guide" : s.dashed ? "dashed" : s.markers ? "marker" : "line",
      dash: s.dash,
      marker: s.markers ? (s.marker ?? i) : undefined,
    }));
  const chart = layoutChart({ ...spec, legend }, extentOf(...xs, marksX), extentOf(...ys, marksY));
  let body = "";
  const order = spec.series.map((s, i) => ({ s, i })).sort((a, b) => Number(Boolean(b.s.guide)) - Number(Boolean(a.s.guide)));
  order.forEach(({ s, i }) => {
    const colour = s.colour ?? seriesColour(i);
    const px = Array.from(xs[i]!, (v) => chart.x(v));
    const py = Array.from(ys[i]!, (v) => chart.y(v));
    let g = "";
    if (s.yErr) {
      let whiskers = "";
      for (let k = 0; k < px.length; k++) {
        const y = ys[i]![k]!;
        const e = s.yErr[k] ?? 0;
        if (!Number.isFinite(px[k]!) || !Number.isFinite(y) || !(e > 0)) continue;
        const lo = yLog && y - e <= 0 ? y / 10 : y - e;
        whiskers += `M${px[k]!.toFixed(2)},${chart.y(lo).toFixed(2)}V${chart.y(y + e).toFixed(2)}`;
      }
      if (whiskers) g += el("path", { d: whiskers, stroke: colour, "stroke-width": 1.2, fill: "none" });
    }
    const d = pathThrough(px, py);
    if (d && s.guide) g += el("path", { d, stroke: colour, "stroke-width": 7, fill: "none", "stroke-linecap": "round", "stroke-opacity": 0.45 });
    else if (d) g += el("path", { d, stroke: colour, "stroke-width": s.dashed ? 1.6 : 2.2, fill: "none", "stroke-dasharray": s.dash ?? (s.dashed ? "6 4" : undefined), "stroke-linejoin": "round" });
    if (s.markers) {
      const shape = markerPath(s.marker ?? i);
      for (let k = 0; k < px.length; k++) {
        if (Number.isFinite(px[k]!) && Number.isFinite(py[k]!)) g += el("path", { d: shape, transform: `translate(${num(px[k]!)},${num(py[k]!)})`, fill: colour, stroke: "#fff", "stroke-width": 1 });
      }
    }
    body += el("g", { class: "series" }, g);
  });
  let overlay = "";
  for (const m of spec.marks ?? []) {
    const cx = chart.x(m.x);
    const cy = chart.y(m.y);
    if (!Number.isFinite(cx) || !Number.isFinite(cy)) continue;
    const colour = m.colour ?? INK;
    // label centred above the mark (a best point is a maximum: the curve is below it)
    const ty = cy - 13 < chart.top + 4 ? cy + 22 : cy - 13;
    const tx = Math.min(chart.right - 30, Math.max(chart.left + 30, cx));
    overlay += el(
      "g",
      { class: "mark" },
      el("circle", { cx, cy, r: 7, fill: "none", stroke: colour, "stroke-width": 2 }) +
        el("circle", { cx, cy, r: 2.5, fill: colour }) +
        text(tx, ty, m.label, { "font-size": 12, "font-weight": "bold", fill: colour, "text-anchor": "middle", stroke: "#FFFFFF", "stroke-width": 3, "paint-order": "stroke" }),
    );
  }
  return renderChart(chart, body, overlay);
}
