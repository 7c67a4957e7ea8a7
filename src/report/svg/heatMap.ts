import { layoutChart, renderChart, type ChartSpec } from "./chart.js";
import { el, num, text } from "./element.js";
import { NO_DATA_COLOUR, sequentialColour } from "./colourMap.js";
import { INK } from "./palette.js";
import { formatTick, linearTicks, niceDomain } from "./scale.js";

export interface HeatMapSpec extends Omit<ChartSpec, "legend" | "extraRight"> {
  xValues: ArrayLike<number>;
  yValues: ArrayLike<number>;
  /** Row-major values, z[iy * nx + ix]; NaN = no data. */
  z: ArrayLike<number>;
  zLabel: string;
  /** Colour-bar range; default: data extent widened to nice values. */
  zDomain?: [number, number];
  /** Clamp the outer cell edges of y (e.g. [0, 90] for incidence angles). */
  yLimits?: [number, number];
}

/** Cell edges: midpoints between grid values, half a step beyond the ends. */
export function cellEdges(v: ArrayLike<number>): Float64Array {
  const n = v.length;
  const e = new Float64Array(n + 1);
  if (n === 0) return e;
  if (n === 1) {
    e[0] = v[0]! - 0.5;
    e[1] = v[0]! + 0.5;
    return e;
  }
  for (let i = 1; i < n; i++) e[i] = 0.5 * (v[i - 1]! + v[i]!);
  e[0] = v[0]! - (e[1]! - v[0]!);
  e[n] = v[n - 1]! + (v[n - 1]! - e[n - 1]!);
  return e;
}

const BAR_WIDTH = 16;
const BAR_ROOM = 92;

/** Heat map of z over (x, y) grid cells with a colour bar on the right. */
export function heatMap(spec: HeatMapSpec): string {
  const nx = spec.xValues.length;
  const ny = spec.yValues.length;
  const ex = cellEdges(spec.xValues);
  const ey = cellEdges(spec.yValues);
  if (spec.yLimits && ny > 0) {
    ey[0] = Math.max(spec.yLimits[0], ey[0]!);
    ey[ny] = Math.min(spec.yLimits[1], ey[ny]!);
  }
  let zMin = Infinity;
  let zMax = -Infinity;
  for (let i = 0; i < nx * ny; i++) {
    const v = spec.z[i]!;
    if (Number.isFinite(v)) {
      zMin = Math.min(zMin, v);
      zMax = Math.max(zMax, v);
    }
  }
  const zDomain = spec.zDomain ?? (zMin <= zMax ? niceDomain(zMin, zMax, 5) : [0, 1]);
  const zSpan = zDomain[1] - zDomain[0] || 1;
  const chart = layoutChart(
    { ...spec, x: { ...spec.x, domain: spec.x.domain ?? [ex[0]!, ex[nx]!] }, y: { ...spec.y, domain: spec.y.domain ?? [ey[0]!, ey[ny]!] }, extraRight: BAR_ROOM },
    [0, 1],
    [0, 1],
  );
  // cells: one rect each; a hair of overlap hides anti-aliasing seams
  let body = "";
  for (let iy = 0; iy < ny; iy++) {
    const y0 = chart.y(ey[iy + 1]!);
    const y1 = chart.y(ey[iy]!);
    for (let ix = 0; ix < nx; ix++) {
      const x0 = chart.x(ex[ix]!);
      const x1 = chart.x(ex[ix + 1]!);
      const v = spec.z[iy * nx + ix]!;
      const fill = Number.isFinite(v) ? sequentialColour((v - zDomain[0]) / zSpan) : NO_DATA_COLOUR;
      body += `<rect x="${num(Math.min(x0, x1))}" y="${num(Math.min(y0, y1))}" width="${num(Math.abs(x1 - x0) + 0.4)}" height="${num(Math.abs(y1 - y0) + 0.4)}" fill="${fill}"/>`;
    }
  }
  // colour bar
  const barX = chart.right + 18;
  const stops = Array.from({ length: 11 }, (_, k) => el("stop", { offset: `${k * 10}%`, "stop-color": sequentialColour(1 - k / 10) })).join("");
  const gradId = `grad-${spec.id.replace(/[^A-Za-z0-9_-]/g, "_")}`;
  let bar = el("defs", {}, el("linearGradient", { id: gradId, x1: 0, y1: 0, x2: 0, y2: 1 }, stops));
  bar += el("rect", { x: barX, y: chart.top, width: BAR_WIDTH, height: chart.bottom - chart.top, fill: `url(#${gradId})`, stroke: INK, "stroke-width": 0.5, class: "colour-bar" });
  const barY = (v: number) => chart.bottom - ((v - zDomain[0]) / zSpan) * (chart.bottom - chart.top);
  for (const t of linearTicks(zDomain, 5)) {
    const py = barY(t);
    bar += el("line", { x1: barX + BAR_WIDTH, y1: py, x2: barX + BAR_WIDTH + 4, y2: py, stroke: INK });
    bar += text(barX + BAR_WIDTH + 7, py + 4, formatTick(t), { "font-size": 12, fill: INK });
  }
  const cy = (chart.top + chart.bottom) / 2;
  const lx = barX + BAR_WIDTH + 62;
  bar += text(lx, cy, spec.zLabel, { "font-size": 13, fill: INK, "text-anchor": "middle", transform: `rotate(-90 ${num(lx)} ${num(cy)})` });
  return renderChart(chart, body, el("g", { class: "colour-scale" }, bar));
}
