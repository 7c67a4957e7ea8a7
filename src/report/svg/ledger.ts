/**
 * A photon ledger: one row per step from the incident photon current down to what the absorber
 * keeps. The first row is the whole incident current; each loss row is a bar over the share it takes
 * from what is left (so the bars walk leftwards, joined by thin connectors); the last row is the
 * absorber's current from zero. Each row is labelled in place: its name on the left, its current
 * and share on the right.
 */
import { el, text } from "./element.js";
import { footnote, svgFrame } from "./frame.js";
import { GRID, INK, INK_SOFT } from "./palette.js";
import { formatTick, linearScale, linearTicks, niceDomain } from "./scale.js";

export interface LedgerRow {
  label: string;
  value: number;
  stderr?: number;
  colour: string;
  dash?: string;
}

export interface LedgerSpec {
  id: string;
  title: string;
  subtitle?: string;
  width?: number;
  unit: string;
  /** The whole incident current (first row). */
  incident: { label: string; value: number };
  /** Losses in the order the light meets them. */
  losses: LedgerRow[];
  /** What is left: the absorber's current (last row). */
  kept: LedgerRow;
  /** A line under the axis (e.g. the channels with no current). */
  footnote?: string;
}

const ROW = 30;
const BAR = 18;
const LABEL_W = 300;
const VALUE_W = 250;

export function ledger(spec: LedgerSpec): string {
  const width = spec.width ?? 900;
  const top = spec.subtitle ? 62 : 46;
  const nRows = spec.losses.length + 2;
  const plotBottom = top + nRows * ROW;
  const foot = footnote(spec.footnote, width, plotBottom + 44);
  const height = plotBottom + 50 + foot.height;
  const left = LABEL_W;
  const right = width - VALUE_W;
  const total = spec.incident.value;
  const x = linearScale(niceDomain(0, total > 0 ? total : 1, 6), [left, right]);
  const pct = (v: number) => (total > 0 ? ((100 * v) / total < 0.05 ? "<0.1 %" : `${((100 * v) / total).toFixed(1)} %`) : "–");
  const fmt = (v: number) => (v > 0 && v < 0.005 ? "<0.01" : v.toFixed(2));
  const rowY = (i: number) => top + i * ROW + (ROW - BAR) / 2;
  let grid = "";
  let axis = el("line", { x1: left, y1: plotBottom, x2: right, y2: plotBottom, stroke: INK });
  for (const t of linearTicks([x.domain[0], x.domain[1]], 6)) {
    grid += el("line", { x1: x(t), y1: top, x2: x(t), y2: plotBottom, stroke: GRID });
    axis += el("line", { x1: x(t), y1: plotBottom, x2: x(t), y2: plotBottom + 5, stroke: INK }) + text(x(t), plotBottom + 19, formatTick(t), { "text-anchor": "middle", "font-size": 12, fill: INK });
  }
  axis += text((left + right) / 2, plotBottom + 38, `photon current (${spec.unit})`, { "text-anchor": "middle", "font-size": 13, fill: INK, class: "axis-label" });
  let marks = "";
  let labels = "";
  const row = (i: number, name: string, x0: number, x1: number, colour: string, value: string, opts: { dash?: string; bold?: boolean; step?: boolean }) => {
    const y = rowY(i);
    marks += el("rect", { x: Math.min(x0, x1), y, width: Math.max(1.5, Math.abs(x1 - x0)), height: BAR, fill: colour, stroke: opts.dash ? INK : undefined, "stroke-dasharray": opts.dash, "stroke-width": opts.dash ? 1 : undefined, "data-colour": colour, class: opts.step ? "step" : "total" });
    labels += text(left - 10, y + BAR / 2 + 4.5, name, { "text-anchor": "end", "font-size": 13, fill: INK, "font-weight": opts.bold ? "bold" : undefined, class: "row-label" });
    labels += text(right + 10, y + BAR / 2 + 4.5, value, { "font-size": 13, fill: opts.bold ? INK : INK_SOFT, "font-weight": opts.bold ? "bold" : undefined });
  };
  row(0, spec.incident.label, x(0), x(total), "#C9CED6", `${fmt(total)} ${spec.unit} · 100 %`, { bold: true });
  let remaining = total;
  spec.losses.forEach((l, k) => {
    const i = k + 1;
    // connector from the end of what was left to this step
    marks += el("line", { x1: x(remaining), y1: rowY(i - 1) + BAR, x2: x(remaining), y2: rowY(i), stroke: INK_SOFT, "stroke-width": 1, "stroke-dasharray": "2 2" });
    row(i, `− ${l.label}`, x(remaining - l.value), x(remaining), l.colour, `−${fmt(l.value)} (${pct(l.value)})`, { dash: l.dash, step: true });
    remaining -= l.value;
  });
  const last = nRows - 1;
  marks += el("line", { x1: x(remaining), y1: rowY(last - 1) + BAR, x2: x(remaining), y2: rowY(last), stroke: INK_SOFT, "stroke-width": 1, "stroke-dasharray": "2 2" });
  const kept = spec.kept;
  const se = kept.stderr !== undefined ? ` ± ${kept.stderr.toFixed(2)}` : "";
  row(last, `= ${kept.label}`, x(0), x(kept.value), kept.colour, `${fmt(kept.value)}${se} ${spec.unit} · ${pct(kept.value)}`, { bold: true, step: true });
  return svgFrame({ id: spec.id, title: spec.title, subtitle: spec.subtitle, width, height, left: 16 }, el("g", { class: "grid" }, grid) + el("g", { class: "marks" }, marks) + el("g", { class: "axes" }, axis) + el("g", { class: "labels" }, labels) + foot.svg);
}

