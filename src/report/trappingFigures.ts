/** Light-trapping plots of the report: the passes curve per stack and the generation profiles G(z). */
import type { GenerationEntry, StackEntry } from "./inputs.js";
import { thetaIndex } from "./spectralBreakdown.js";
import { linePlot, type LineSeries } from "./svg/linePlot.js";
import { seriesColour } from "./svg/palette.js";
import { figure, stackId, type Figure } from "./figureKit.js";

/** Up to four wavelengths of the grid at or above 900 nm (where trapping matters), evenly spread. */
function trappingWavelengths(wavelengthNm: number[]): number[] {
  const long = wavelengthNm.map((l, i) => ({ l, i })).filter((x) => x.l >= 900);
  const pool = long.length > 0 ? long : wavelengthNm.map((l, i) => ({ l, i })).slice(-1);
  if (pool.length <= 4) return pool.map((x) => x.i);
  return [0, 1, 2, 3].map((k) => pool[Math.round((k * (pool.length - 1)) / 3)]!.i);
}

/**
 * Fraction of the power that entered the absorber still inside after 1, 2, 3 … passes at the
 * report angle (mean over the listed azimuths), log scale; null for matrices without trapping
 * arrays (format version 1).
 */
export function passesFigure(stack: StackEntry, index: number, angleDeg: number): Figure | null {
  const m = stack.matrix;
  const t = m.trapping;
  if (!t) return null;
  const it = thetaIndex(m, angleDeg, stack.matrixPath);
  const nP = m.phiDeg.length;
  const nL = m.wavelengthNm.length;
  const stride = t.maxPasses + 1;
  const passes = Array.from({ length: t.maxPasses }, (_, k) => k + 1);
  const series: LineSeries[] = trappingWavelengths(m.wavelengthNm).map((il, s) => {
    const y = passes.map((k) => {
      let sum = 0;
      for (let ip = 0; ip < nP; ip++) sum += t.passRemaining[((it * nP + ip) * nL + il) * stride + (k - 1)]!;
      return sum / nP;
    });
    let free = 0;
    for (let ip = 0; ip < nP; ip++) free += t.freePathRatio[(it * nP + ip) * nL + il]!;
    return { label: `${m.wavelengthNm[il]} nm (α→0 path ${(free / nP).toFixed(1)} W)`, x: passes, y, markers: true, colour: seriesColour(s) };
  });
  const id = `passes-${stackId(stack, index)}`;
  const title = `Light still in the absorber after each pass at θ = ${angleDeg}°`;
  return figure(id, title, linePlot, {
    subtitle: `${stack.label} · share of the power that entered`,
    width: 620,
    height: 400,
    x: { label: "passes completed", domain: [1, t.maxPasses], ticks: [1, 5, 10, 15, 20] },
    y: { label: "fraction still inside", kind: "log" },
    series,
  });
}

/** Generation profiles G(z) under their spectra, log depth axis; null when no run has one. */
export function generationFigure(profiles: GenerationEntry[]): Figure | null {
  if (profiles.length === 0) return null;
  const series: LineSeries[] = profiles.map((p, i) => ({
    label: `${p.label} · q∫G dz ${p.integratedMaCm2.toFixed(2)} mA/cm²`,
    x: p.depthUm,
    y: p.generationCm3S,
    colour: seriesColour(i),
  }));
  const id = "generation-profile";
  const title = "Generation profile G(z) in the absorber";
  return figure(id, title, linePlot, {
    subtitle: `${[...new Set(profiles.map((p) => `θ = ${p.thetaDeg}°, ${p.spectrum}`))].join("; ")} · depth from the texture tips`,
    width: 620,
    height: 400,
    x: { label: "depth z (µm)", kind: "log" },
    y: { label: "G (cm⁻³ s⁻¹)", kind: "log" },
    series,
  });
}

/**
 * How the light that escapes through the front after entering leaves: its share per polar-angle bin
 * outside, at the report angle and the longest wavelength of each stack (mean over the listed
 * azimuths), against Lambertian emission (power ∝ cos θ, so the share of a bin is
 * sin²θ₂ − sin²θ₁). Null when no matrix carries the trapping arrays.
 */
export function escapeAngleFigure(stacks: StackEntry[], angleDeg: number): Figure | null {
  const series: LineSeries[] = [];
  let binDeg = 0;
  stacks.forEach((stack, i) => {
    const m = stack.matrix;
    const t = m.trapping;
    if (!t) return;
    binDeg = t.escapeAngleBinDeg;
    const nB = Math.round(90 / binDeg);
    const it = thetaIndex(m, angleDeg, stack.matrixPath);
    const nP = m.phiDeg.length;
    const nL = m.wavelengthNm.length;
    const il = nL - 1;
    const share = new Array<number>(nB).fill(0);
    for (let ip = 0; ip < nP; ip++) for (let b = 0; b < nB; b++) share[b]! += t.escapeAngle[((it * nP + ip) * nL + il) * nB + b]!;
    const total = share.reduce((a, v) => a + v, 0);
    if (!(total > 0)) return;
    series.push({ label: `${stack.label}${m.lightFrom === "rear" ? " (light from the rear)" : ""}, ${m.wavelengthNm[il]} nm`, x: share.map((_, b) => (b + 0.5) * binDeg), y: share.map((v) => v / total), markers: true, colour: seriesColour(i) });
  });
  if (series.length === 0) return null;
  const nB = Math.round(90 / binDeg);
  const rad = Math.PI / 180;
  const lambert = Array.from({ length: nB }, (_, b) => Math.sin((b + 1) * binDeg * rad) ** 2 - Math.sin(b * binDeg * rad) ** 2);
  series.push({ label: "Lambertian emission (cos θ)", x: lambert.map((_, b) => (b + 0.5) * binDeg), y: lambert, colour: "#8C93A0", guide: true });
  const id = "escape-angles";
  const title = "Where the escaping light goes";
  return figure(id, title, linePlot, {
    subtitle: `entered, then left through the front · per ${binDeg}° bin · θ = ${angleDeg}°`,
    width: 620,
    height: 400,
    x: { label: "polar angle outside (°)", domain: [0, 90], ticks: [0, 15, 30, 45, 60, 75, 90] },
    y: { label: "share of the escaping power" },
    series,
  });
}
