/** Plots of the front + rear yearly charge (bifacial yield files). Pure: strings of SVG. */
import type { Figure } from "./figures.js";
import type { BifacialRow } from "./inputs.js";
import { linePlot, type LineSeries } from "./svg/linePlot.js";
import { seriesColour } from "./svg/palette.js";

const pitchLabel = (p: number | null): string => (p === null ? "isolated row" : `pitch ${p} m`);

/** Front, rear and total yearly charge vs tilt at one mounting (the first pitch listed); null under two tilts. */
export function bifacialTiltFigure(rows: BifacialRow[]): Figure | null {
  if (rows.length === 0) return null;
  const first = rows[0]!;
  const at = rows.filter((r) => r.pitchM === first.pitchM && r.azimuthDeg === first.azimuthDeg && r.stackLabel === first.stackLabel).sort((a, b) => a.tiltDeg - b.tiltDeg);
  if (new Set(at.map((r) => r.tiltDeg)).size < 2) return null;
  const x = at.map((r) => r.tiltDeg);
  const series: LineSeries[] = [
    { label: "total", x, y: at.map((r) => r.totalAhM2), yErr: at.map((r) => r.totalStdErrAhM2), markers: true, colour: seriesColour(0) },
    { label: "front", x, y: at.map((r) => r.frontAhM2), markers: true, colour: seriesColour(1) },
    { label: "rear", x, y: at.map((r) => r.rearAhM2), markers: true, colour: seriesColour(2) },
  ];
  const id = "bifacial-tilt";
  const title = "Front, rear and total yearly charge vs tilt";
  return { id, title, svg: linePlot({ id, title, subtitle: `${first.stackLabel} · ${first.siteName} · ${pitchLabel(first.pitchM)}, azimuth ${first.azimuthDeg}°`, width: 660, x: { label: "tilt (°)", tight: true, padding: 0.03 }, y: { label: "yearly charge per area (A·h/m²)", headroom: 0.08 }, series }) };
}

/** Bifacial gain (rear / front) vs row pitch, one curve per tilt; null under two pitches. */
export function bifacialPitchFigure(rows: BifacialRow[]): Figure | null {
  const withPitch = rows.filter((r) => r.pitchM !== null);
  if (new Set(withPitch.map((r) => r.pitchM)).size < 2) return null;
  const first = withPitch[0]!;
  const tilts = [...new Set(withPitch.map((r) => r.tiltDeg))].sort((a, b) => a - b);
  const series: LineSeries[] = tilts.map((t, i) => {
    const at = withPitch.filter((r) => r.tiltDeg === t && r.stackLabel === first.stackLabel).sort((a, b) => a.pitchM! - b.pitchM!);
    return { label: `tilt ${t}°`, x: at.map((r) => r.pitchM!), y: at.map((r) => r.gainPct), yErr: at.map((r) => r.gainStdErrPct), markers: true, colour: seriesColour(i) };
  });
  const id = "bifacial-pitch";
  const title = "Bifacial gain vs row pitch";
  return { id, title, svg: linePlot({ id, title, subtitle: `${first.stackLabel} · ${first.siteName} · rear / front yearly charge`, width: 660, x: { label: "row pitch (m)", tight: true, padding: 0.03 }, y: { label: "bifacial gain (%)", headroom: 0.08 }, series }) };
}
