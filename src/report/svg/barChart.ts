import { layoutChart, renderChart, type ChartSpec, type LegendItem } from "./chart.js";
import { el, text } from "./element.js";
import { INK, seriesColour } from "./palette.js";
import { formatTick } from "./scale.js";

export interface BarGroup {
  label: string;
  values: ArrayLike<number>;
  colour?: string;
}

export interface BarChartSpec extends Omit<ChartSpec, "legend" | "x"> {
  xLabel: string;
  categories: string[];
  /** One entry per series; bars of a category are drawn side by side. */
  groups: BarGroup[];
  /** Print each value above its bar (only when few bars). */
  valueLabels?: boolean;
}

/** Grouped vertical bar chart over categories (e.g. months), y axis from zero. */
export function barChart(spec: BarChartSpec): string {
  const legend: LegendItem[] = spec.groups.length > 1 ? spec.groups.map((g, i) => ({ label: g.label, colour: g.colour ?? seriesColour(i), shape: "box" as const })) : [];
  let hi = 0;
  let lo = 0;
  for (const g of spec.groups) for (let i = 0; i < g.values.length; i++) if (Number.isFinite(g.values[i]!)) { hi = Math.max(hi, g.values[i]!); lo = Math.min(lo, g.values[i]!); }
  const chart = layoutChart(
    { ...spec, legend, x: { label: spec.xLabel, kind: "band", categories: spec.categories }, y: { ...spec.y, includeZero: true } },
    [0, 1],
    [lo, hi > lo ? hi : lo + 1],
  );
  const nG = Math.max(1, spec.groups.length);
  const inner = chart.xBand * 0.8;
  const barW = inner / nG;
  const zeroY = chart.y(0);
  let body = "";
  let overlay = "";
  spec.groups.forEach((g, gi) => {
    const colour = g.colour ?? seriesColour(gi);
    let bars = "";
    for (let ci = 0; ci < spec.categories.length; ci++) {
      const v = g.values[ci];
      if (v === undefined || !Number.isFinite(v)) continue;
      const x = chart.x(ci) - inner / 2 + gi * barW;
      const y = chart.y(v);
      bars += el("rect", { x: x + 0.5, y: Math.min(y, zeroY), width: Math.max(1, barW - 1), height: Math.max(0.5, Math.abs(zeroY - y)), fill: colour }, el("title", {}, `${formatTick(v)}`));
      if (spec.valueLabels && spec.categories.length * nG <= 16) overlay += text(x + barW / 2, Math.min(y, zeroY) - 4, formatTick(Number(v.toPrecision(3))), { "font-size": 11, fill: INK, "text-anchor": "middle" });
    }
    body += el("g", { class: "bars", "data-series": g.label }, bars);
  });
  return renderChart(chart, body, overlay);
}
