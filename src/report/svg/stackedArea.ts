import { layoutChart, renderChart, type ChartSpec, type LegendItem } from "./chart.js";
import { escapeText } from "../escape.js";
import { el, num } from "./element.js";

export interface AreaLayer {
  label: string;
  /** One value per x, ≥ 0 (negative Monte Carlo noise is clipped at zero). */
  values: ArrayLike<number>;
  colour: string;
}

export interface StackedAreaSpec extends Omit<ChartSpec, "legend"> {
  x: ChartSpec["x"];
  xValues: ArrayLike<number>;
  /** Bottom first. */
  layers: AreaLayer[];
}

/** Stacked area plot (layers drawn bottom-up); the legend lists the layers top-down as they appear. */
export function stackedArea(spec: StackedAreaSpec): string {
  const n = spec.xValues.length;
  const cum = new Float64Array(n);
  const bounds: Float64Array[] = [Float64Array.from(cum)];
  for (const layer of spec.layers) {
    for (let i = 0; i < n; i++) cum[i] = cum[i]! + Math.max(0, layer.values[i] ?? 0);
    bounds.push(Float64Array.from(cum));
  }
  let top = 0;
  for (let i = 0; i < n; i++) top = Math.max(top, cum[i]!);
  const legend: LegendItem[] = spec.layers.map((l) => ({ label: l.label, colour: l.colour, shape: "box" as const })).reverse();
  let xMin = Infinity;
  let xMax = -Infinity;
  for (let i = 0; i < n; i++) {
    xMin = Math.min(xMin, spec.xValues[i]!);
    xMax = Math.max(xMax, spec.xValues[i]!);
  }
  const chart = layoutChart({ ...spec, legend, x: { tight: true, ...spec.x } }, n ? [xMin, xMax] : [0, 1], [0, Math.max(top, 1e-12)]);
  let body = "";
  spec.layers.forEach((layer, k) => {
    const lo = bounds[k]!;
    const hi = bounds[k + 1]!;
    if (n === 0) return;
    let d = "";
    for (let i = 0; i < n; i++) d += `${i === 0 ? "M" : "L"}${num(chart.x(spec.xValues[i]!))},${num(chart.y(hi[i]!))}`;
    for (let i = n - 1; i >= 0; i--) d += `L${num(chart.x(spec.xValues[i]!))},${num(chart.y(lo[i]!))}`;
    body += el("path", { d: `${d}Z`, fill: layer.colour, stroke: "#FFFFFF", "stroke-width": 0.6, "data-layer": layer.label }, el("title", {}, escapeText(layer.label)));
  });
  return renderChart(chart, body);
}
