/** Light-trapping plots of the report: the passes curve per stack and the generation profiles G(z). */
import type { GenerationEntry, StackEntry } from "./inputs.js";
import { thetaIndex } from "./spectralBreakdown.js";
import { linePlot, type LineSeries } from "./svg/linePlot.js";
import { seriesColour } from "./svg/palette.js";
import { stackId, type Figure } from "./figureKit.js";

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
  return {
    id,
    title,
    svg: linePlot({
      id,
      title,
      subtitle: `${stack.label} · share of the power that entered`,
      width: 620,
      height: 400,
      x: { label: "passes completed", domain: [1, t.maxPasses], ticks: [1, 5, 10, 15, 20] },
      y: { label: "fraction still inside", kind: "log" },
      series,
    }),
  };
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
  return {
    id,
    title,
    svg: linePlot({
      id,
      title,
      subtitle: `${[...new Set(profiles.map((p) => `θ = ${p.thetaDeg}°, ${p.spectrum}`))].join("; ")} · depth from the texture tips`,
      width: 620,
      height: 400,
      x: { label: "depth z (µm)", kind: "log" },
      y: { label: "G (cm⁻³ s⁻¹)", kind: "log" },
      series,
    }),
  };
}
