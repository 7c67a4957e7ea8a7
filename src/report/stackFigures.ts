/** The figures of one stack: photon ledger, spectral strips, absorber map (pure: strings of SVG). */
import { CH_ABSORBER } from "../response/responseMatrix.js";
import { channelKind, channelLabel } from "../response/channelLabels.js";
import { channelStyles } from "./channelStyle.js";
import { figure, phiNote, stackId, type Figure } from "./figureKit.js";
import type { StackEntry } from "./inputs.js";
import { channelMap, channelSpectra, thetaIndex } from "./spectralBreakdown.js";
import { heatMap } from "./svg/heatMap.js";
import { ledger } from "./svg/ledger.js";
import { spectralStrips } from "./svg/strips.js";

/** "T, unresolved" → the line naming channels that carry nothing (nothing is dropped silently). */
function emptyNote(channels: string[], what: string): string | undefined {
  return channels.length === 0 ? undefined : `${what}: ${channels.map(channelLabel).join(", ")}`;
}

/**
 * Photon ledger at one angle: incident photon current (the spectrum over the matrix's range), minus
 * each loss in the order the light meets it, equals the absorber current. Null without photocurrent.json.
 */
export function ledgerFigure(stack: StackEntry, index: number, angleDeg: number): Figure | null {
  const pc = stack.photocurrent;
  const at = pc?.perAngle.find((a) => Math.abs(a.thetaDeg - angleDeg) < 1e-6);
  if (!pc || !at) return null;
  const styles = channelStyles(stack.matrix.channels);
  const losses = at.losses.filter((l) => l.currentMaCm2 > 0);
  const incident = pc.incidentMaCm2 ?? at.absorberMaCm2 + at.losses.reduce((s, l) => s + l.currentMaCm2, 0);
  const m = stack.matrix;
  return figure(`ledger-${stackId(stack, index)}`, `Photon ledger at θ = ${angleDeg}°`, ledger, {
    subtitle: `${stack.label} · ${pc.spectrumName}, ${m.wavelengthNm[0]}–${m.wavelengthNm[m.wavelengthNm.length - 1]} nm · ${phiNote(m)}`,
    unit: "mA/cm²",
    incident: { label: "incident photon current", value: incident },
    losses: losses.map((l) => ({ label: channelLabel(l.channel), value: l.currentMaCm2, colour: styles.get(l.channel)!.colour, dash: styles.get(l.channel)!.dash })),
    kept: { label: "absorber photocurrent", value: at.absorberMaCm2, stderr: at.absorberStderrMaCm2, colour: styles.get(CH_ABSORBER)!.colour },
    footnote: emptyNote(at.losses.filter((l) => !(l.currentMaCm2 > 0)).map((l) => l.channel), "no current lost in"),
  });
}

/** Each channel's fraction vs wavelength at one angle, one strip per channel (absorber first). */
export function spectralStripsFigure(stack: StackEntry, index: number, angleDeg: number): Figure {
  const m = stack.matrix;
  const spectra = channelSpectra(m, thetaIndex(m, angleDeg, stack.matrixPath));
  const styles = channelStyles(m.channels);
  const order = m.channels.map((c, ic) => ({ c, ic })).sort((a, b) => Number(channelKind(b.c) === "absorber") - Number(channelKind(a.c) === "absorber"));
  const carries = (ic: number) => spectra[ic]!.some((v) => v > 0);
  return figure(`spectral-${stackId(stack, index)}`, `Where each wavelength ends up at θ = ${angleDeg}°`, spectralStrips, {
    subtitle: `${stack.label} · ${phiNote(m)} · each strip has its own scale`,
    xValues: m.wavelengthNm,
    xLabel: "wavelength (nm)",
    yLabel: "fraction of incident power",
    strips: order.filter(({ ic }) => carries(ic)).map(({ c, ic }) => ({ label: channelLabel(c), values: spectra[ic]!, colour: styles.get(c)!.colour, dash: styles.get(c)!.dash })),
    footnote: emptyNote(order.filter(({ ic }) => !carries(ic)).map(({ c }) => c), "zero at every wavelength"),
  });
}

/** θ × λ map of absorber absorptance. */
export function responseMapFigure(stack: StackEntry, index: number): Figure {
  const m = stack.matrix;
  return figure(`response-map-${stackId(stack, index)}`, "Absorber absorptance over angle and wavelength", heatMap, {
    subtitle: `${stack.label} · ${phiNote(m)}`,
    width: 620,
    height: 420,
    x: { label: "wavelength (nm)" },
    y: { label: "incidence angle θ (°)" },
    xValues: m.wavelengthNm,
    yValues: m.thetaDeg,
    z: channelMap(m, CH_ABSORBER),
    zLabel: "absorber absorptance",
    zDomain: [0, 1],
    yLimits: [0, 90],
  });
}
