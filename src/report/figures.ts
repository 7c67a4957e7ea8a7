/** Builds every plot of the report from its typed inputs (pure: strings of SVG). */
import { quadraticAt } from "../optimize/quadraticFit.js";
import type { ConvergenceSeries, OptimumEntry, StackEntry, TiltSweep, YieldEntry } from "./inputs.js";
import { figure, slug, type Figure } from "./figureKit.js";
import { barChart } from "./svg/barChart.js";
import { linePlot, type LineSeries, type PointMark } from "./svg/linePlot.js";
import { seriesColour, seriesStyle } from "./svg/palette.js";

const GUIDE_GREY = "#8C93A0";

export type { Figure };

/** Lower end of the modifier axis: the smallest value less a margin, down to a tenth (at most 0). */
function iamFloor(series: LineSeries[]): number {
  const lo = Math.min(...series.flatMap((s) => Array.from(s.y).filter(Number.isFinite)), 1);
  return Math.max(0, Math.floor((lo - 0.02) * 10) / 10);
}

/** Angular modifier J(θ)/J(0) of every stack that has a photocurrent summary; null when none has. */
export function iamFigure(stacks: StackEntry[]): Figure | null {
  const series: LineSeries[] = [];
  stacks.forEach((s) => {
    const iam = s.photocurrent?.iam;
    if (!iam || iam.thetaDeg.length === 0) return;
    const st = seriesStyle(series.length);
    series.push({ label: s.title ?? s.label, x: iam.thetaDeg, y: iam.modifier, yErr: iam.stderr, markers: true, colour: st.colour, dash: st.dash, marker: st.marker });
  });
  if (series.length === 0) return null;
  const id = "angular-modifier";
  const title = "Angular modifier of the absorber photocurrent";
  return figure(id, title, linePlot, {
    subtitle: `${[...new Set(stacks.map((s) => s.studyName))].join(", ")} · J(θ) / J(0); whiskers ±1 standard error`,
    x: { label: "incidence angle θ (°)", domain: [0, 90], ticks: [0, 15, 30, 45, 60, 75, 90] },
    // zoomed to the data (nice lower bound), so close curves stay apart
    y: { label: "J(θ) / J(0)", domain: [iamFloor(series), 1.02] },
    series,
  });
}

/** Standard error (and deviation from a reference, when present) vs rays, log–log, with 1/√N. */
export function convergenceFigure(all: ConvergenceSeries[]): Figure | null {
  const usable = all.filter((c) => c.steps.length > 0);
  if (usable.length === 0) return null;
  const sameUnit = usable.every((c) => c.unit === usable[0]!.unit);
  const scale = (c: ConvergenceSeries, v: number) => (sameUnit ? v : v / Math.abs(c.steps[c.steps.length - 1]!.value || 1));
  const series: LineSeries[] = [];
  let guideAnchor: { n: number; e: number } | null = null;
  let nMin = Infinity;
  let nMax = 0;
  const prefix = (c: ConvergenceSeries) => (usable.length > 1 ? `${c.label}: ` : "");
  usable.forEach((c, i) => {
    const n = c.steps.map((s) => s.nRays);
    nMin = Math.min(nMin, ...n);
    nMax = Math.max(nMax, ...n);
    const colour = seriesColour(i);
    const slope = c.slope !== undefined ? `, slope ${c.slope.toFixed(2)}` : "";
    series.push({ label: `${prefix(c)}standard error${slope}`, x: n, y: c.steps.map((s) => scale(c, s.stderr)), markers: true, colour });
    if (c.steps.some((s) => s.rmsError !== undefined)) {
      series.push({ label: `${prefix(c)}RMS error vs reference`, x: n, y: c.steps.map((s) => (s.rmsError === undefined ? NaN : scale(c, s.rmsError))), colour, dashed: true, markers: true });
    } else if (c.steps.some((s) => s.deviation !== undefined)) {
      series.push({ label: `${prefix(c)}|deviation from reference|`, x: n, y: c.steps.map((s) => (s.deviation === undefined ? NaN : scale(c, Math.abs(s.deviation)))), colour, dashed: true, markers: true });
    }
    if (!guideAnchor) guideAnchor = { n: n[0]!, e: scale(c, c.steps[0]!.stderr) };
  });
  const anchor = guideAnchor as { n: number; e: number } | null;
  if (anchor && anchor.e > 0) {
    // plain Monte Carlo: standard error ∝ 1/√N (central limit theorem)
    const xs = [nMin, nMax];
    series.push({ label: "1/√N guide (through the first point)", x: xs, y: xs.map((n) => anchor.e * Math.sqrt(anchor.n / n)), colour: GUIDE_GREY, guide: true });
  }
  const id = "convergence";
  const title = "Monte Carlo convergence";
  const unit = sameUnit ? usable[0]!.unit : "relative";
  return figure(id, title, linePlot, {
    subtitle: usable.length === 1 ? `${usable[0]!.quantity} — ${usable[0]!.label}` : usable.map((c) => c.quantity).filter((q, i, a) => a.indexOf(q) === i).join("; "),
    x: { label: "rays per point N", kind: "log" },
    y: { label: sameUnit ? `error (${unit})` : "relative error", kind: "log" },
    series,
  });
}

/** Charge unit of plots and tables alike: A·h/m² (large values get grouped digits, "350,000"). */
const CHARGE = { factor: 1, unit: "A·h/m²" } as const;

const MONTHS = ["Jan", "Feb", "Mar", "Apr", "May", "Jun", "Jul", "Aug", "Sep", "Oct", "Nov", "Dec"];

/** Long names are shortened so the tilt and site stay visible in legends. */
export function shortName(name: string, max = 22): string {
  return name.length > max ? `${name.slice(0, max - 1)}…` : name;
}

export function yieldLabel(y: YieldEntry, all: YieldEntry[], short = false): string {
  const sites = new Set(all.map((e) => e.siteName));
  const site = sites.size > 1 ? `, ${short ? shortName(y.siteName, 14) : y.siteName}` : "";
  return `${short ? shortName(y.stackLabel) : y.stackLabel}, tilt ${y.tiltDeg}°${site}`;
}

/** Monthly absorbed charge, one bar group per stack × tilt. */
export function monthlyFigure(yields: YieldEntry[]): Figure | null {
  const shown = yields.filter((y) => y.monthlyAhM2.length === 12);
  if (shown.length === 0) return null;
  const id = "monthly-yield";
  const title = "Monthly absorbed photon charge";
  const sites = [...new Set(shown.map((y) => y.siteName))];
  const u = CHARGE;
  return figure(id, title, barChart, {
    subtitle: `site: ${sites.join(", ")}`,
    xLabel: "month",
    y: { label: `charge per area (${u.unit})` },
    categories: MONTHS,
    groups: shown.map((y) => ({ label: yieldLabel(y, shown), values: y.monthlyAhM2.map((v) => v * u.factor) })),
    width: 820,
  });
}

/** Spectral correction per month (hourly spectra against the fixed G173 shapes), one bar group per stack × tilt. */
export function spectralCorrectionFigure(yields: YieldEntry[]): Figure | null {
  const shown = yields.filter((y) => y.spectralCorrection);
  if (shown.length === 0) return null;
  const modes = [...new Set(shown.map((y) => y.spectralCorrection!.spectra))];
  return figure("spectral-correction", "Spectral correction: hourly spectra against the fixed AM1.5 shapes", barChart, {
    subtitle: `spectra: ${modes.join(", ")}; year: ${shown.map((y) => `${shortName(y.stackLabel)} tilt ${y.tiltDeg}° ${(y.spectralCorrection!.yearPct >= 0 ? "+" : "") + y.spectralCorrection!.yearPct.toFixed(2)} %`).join("; ")}`,
    xLabel: "month",
    y: { label: "charge with hourly spectra ÷ with G173 shapes − 1 (%)" },
    categories: MONTHS,
    groups: shown.map((y) => ({ label: yieldLabel(y, shown), values: y.spectralCorrection!.monthlyPct })),
    width: 820,
  });
}

/** Yearly charge vs tilt, best tilt marked on each curve. */
export function tiltFigure(sweeps: TiltSweep[]): Figure | null {
  const shown = sweeps.filter((s) => s.tiltDeg.length > 1);
  if (shown.length === 0) return null;
  const sites = new Set(shown.map((s) => s.siteName));
  const u = CHARGE;
  const series: LineSeries[] = shown.map((s, i) => ({
    label: sites.size > 1 ? `${s.stackLabel}, ${s.siteName}` : s.stackLabel,
    x: s.tiltDeg,
    y: s.annualAhM2.map((v) => v * u.factor),
    markers: true,
    colour: seriesColour(i),
  }));
  const marks: PointMark[] = shown.map((s, i) => ({ x: s.bestTiltDeg, y: s.bestAnnualAhM2 * u.factor, label: `best ${s.bestTiltDeg}°`, colour: seriesColour(i) }));
  const id = "tilt-sweep";
  const title = "Yearly absorbed charge vs module tilt";
  return figure(id, title, linePlot, {
    subtitle: `azimuth ${[...new Set(shown.map((s) => s.azimuthDeg))].join(", ")}° (180° = facing south); site: ${[...sites].join(", ")}`,
    width: 660,
    x: { label: "tilt (°)", tight: true, padding: 0.03 },
    y: { label: `yearly charge per area (${u.unit})`, headroom: 0.08 },
    series,
    marks,
  });
}

/** The words of one swept field in a combination title ("SiNx 65 nm"), by the field's position. */
function titlePart(s: StackEntry, key: string): string {
  const k = Object.keys(s.combo).indexOf(key);
  const parts = s.title?.split(" · ") ?? [];
  return parts.length === Object.keys(s.combo).length && k >= 0 ? parts[k]! : `${key} = ${s.combo[key]}`;
}

/** Axis name of a swept field from its words: "SiNx 65 nm" → "SiNx thickness (nm)", "… facet angle 50°" → "… facet angle (°)". */
function parameterAxis(s: StackEntry, key: string): string {
  const words = titlePart(s, key);
  const v = String(s.combo[key]);
  const m = new RegExp(`^(.*?)\\s*${v.replace(/[.+-]/g, "\\$&")}\\s*(.*)$`).exec(words);
  if (m === null || m[1] === "") return key;
  const unit = m[2] ? ` (${m[2]})` : "";
  return /thickness/i.test(key) ? `${m[1]} thickness${unit}` : `${m[1]}${unit}`;
}

/**
 * Photocurrent at the report angle vs a swept study parameter (the way engineers pick a thickness):
 * x = the parameter with the most values, one curve per combination of the others (colour, marker
 * and, past ten, dash differ); best point marked. Null unless some study has three or more
 * combinations with photocurrent summaries.
 */
export function parameterSweepFigure(stacks: StackEntry[], angleDeg: number): Figure | null {
  const byStudy = new Map<string, StackEntry[]>();
  for (const s of stacks) {
    if (!s.photocurrent || Object.keys(s.combo).length === 0) continue;
    byStudy.set(s.studyName, [...(byStudy.get(s.studyName) ?? []), s]);
  }
  const study = [...byStudy.entries()].find(([, list]) => list.length >= 3);
  if (!study) return null;
  const [studyName, list] = study;
  const keys = Object.keys(list[0]!.combo);
  const distinct = (k: string) => new Set(list.map((s) => s.combo[k])).size;
  const xKey = keys.reduce((a, b) => (distinct(b) > distinct(a) ? b : a));
  const others = keys.filter((k) => k !== xKey);
  const groupKey = (s: StackEntry) => others.map((k) => titlePart(s, k)).join(" · ");
  const groups = new Map<string, StackEntry[]>();
  for (const s of list) groups.set(groupKey(s), [...(groups.get(groupKey(s)) ?? []), s]);
  const jAt = (s: StackEntry) => s.photocurrent!.perAngle.find((a) => Math.abs(a.thetaDeg - angleDeg) < 1e-6);
  const series: LineSeries[] = [];
  let best: { x: number; y: number; i: number } | null = null;
  [...groups.entries()].forEach(([label, members], i) => {
    const sorted = [...members].sort((a, b) => a.combo[xKey]! - b.combo[xKey]!);
    const y = sorted.map((s) => jAt(s)?.absorberMaCm2 ?? NaN);
    sorted.forEach((s, k) => {
      if (Number.isFinite(y[k]!) && (!best || y[k]! > best.y)) best = { x: s.combo[xKey]!, y: y[k]!, i };
    });
    const st = seriesStyle(i);
    series.push({
      label: label || studyName,
      x: sorted.map((s) => s.combo[xKey]!),
      y,
      yErr: sorted.map((s) => jAt(s)?.absorberStderrMaCm2 ?? NaN),
      markers: true,
      colour: st.colour,
      dash: st.dash,
      marker: st.marker,
    });
  });
  const b = best as { x: number; y: number; i: number } | null;
  const axis = parameterAxis(list[0]!, xKey);
  return figure("parameter-sweep", `Absorber photocurrent vs ${axis}`, linePlot, {
    subtitle: `${studyName} · θ = ${angleDeg}° · whiskers ±1 standard error`,
    x: { label: axis, tight: true, padding: 0.04 },
    y: { label: "absorber photocurrent (mA/cm²)", headroom: 0.1 },
    series,
    marks: b ? [{ x: b.x, y: b.y, label: `best ${b.x}`, colour: seriesStyle(b.i).colour }] : [],
  });
}

/** Fitted local polynomial of an optimisation along parameter d through the design centre. */
function optimumCurve(o: OptimumEntry, d: number): { x: number[]; y: number[] } {
  const q = { dims: o.parameters.length as 1 | 2, coef: o.design.pooledCoef, centre: o.design.centre, halfWidth: o.design.halfWidth };
  const x: number[] = [];
  const y: number[] = [];
  if (q.coef.length === 0) return { x, y };
  for (let k = 0; k <= 60; k++) {
    const at = o.design.centre.slice();
    at[d] = o.design.centre[d]! + o.design.halfWidth[d]! * (2 * k / 60 - 1);
    x.push(at[d]!);
    y.push(quadraticAt(q, at));
  }
  return { x, y };
}

/**
 * The objective vs each optimised parameter: the search evaluations (one random stream), the local
 * design's replica means ± standard error, the fitted polynomial, and the optimum with its interval
 * (a pale bar at the optimum's value). Two parameters: one plot per parameter, through the design centre.
 */
export function optimumFigures(o: OptimumEntry, index: number): Figure[] {
  const pct = `${Math.round(o.level * 100)} %`;
  return o.parameters.map((p, d) => {
    const other = o.parameters.length === 2 ? 1 - d : -1;
    const onSlice = (x: number[]) => other < 0 || Math.abs(x[other]! - o.design.centre[other]!) <= 1e-9 * (o.parameters[other]!.upper - o.parameters[other]!.lower);
    const series: LineSeries[] = [];
    const search = o.search.filter((e) => onSlice(e.x)).sort((a, b) => a.x[d]! - b.x[d]!);
    if (search.length > 0) {
      series.push({ label: "search (one random stream)", x: search.map((e) => e.x[d]!), y: search.map((e) => e.value), yErr: search.map((e) => e.stderr), markers: true, colour: GUIDE_GREY, dashed: true });
    }
    const idx = o.design.points.map((x, i) => ({ x, i })).filter(({ x }) => onSlice(x)).sort((a, b) => a.x[d]! - b.x[d]!);
    series.push({
      label: `local design, mean of ${o.replicas} replicas ± s.e.`,
      x: idx.map(({ x }) => x[d]!),
      y: idx.map(({ i }) => o.design.mean[i]!),
      yErr: idx.map(({ i }) => o.design.stderr[i]!),
      markers: true,
      colour: seriesColour(0),
    });
    const curve = optimumCurve(o, d);
    if (curve.x.length > 0) series.push({ label: "fitted polynomial", ...curve, colour: seriesColour(1) });
    const [lo, hi] = o.locationInterval[d]!;
    series.push({ label: `${pct} interval of the optimum`, x: [lo, hi], y: [o.value, o.value], guide: true, colour: seriesColour(2) });
    const unit = p.unit ? ` (${p.unit})` : "";
    const flag = o.atBound[d] ? ` — at the ${o.atBound[d]} bound` : "";
    const id = `optimum-${index + 1}-${slug(p.path)}`;
    const title = `${o.objectiveName} vs ${p.path}`;
    return figure(id, title, linePlot, {
      subtitle: `${o.studyName} · optimum ${o.location[d]!.toPrecision(5)}${p.unit ? " " + p.unit : ""}, ${pct} interval [${lo.toPrecision(5)}, ${hi.toPrecision(5)}]${flag}`,
      width: 660,
      x: { label: `${p.path}${unit}`, tight: true, padding: 0.04 },
      y: { label: `${o.objectiveName} (${o.unit})`, headroom: 0.1 },
      series,
      marks: [{ x: o.location[d]!, y: o.value, label: "optimum", colour: seriesColour(2) }],
    });
  });
}
