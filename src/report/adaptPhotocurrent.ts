/** photocurrent.json (format "lightfold.photocurrent") → the report's per-angle summary. */
import { InputError } from "../util/errors.js";
import type { AnglePhotocurrent, CurrentShare, PhotocurrentSummary } from "./inputs.js";
import { numberAt, objectsAt, optNumberAt, stringAt, type Json } from "./fields.js";

interface Direction {
  thetaDeg: number;
  jsc: number;
  jscSe: number;
  losses: CurrentShare[];
}

/**
 * Reads the summary and averages the listed azimuths of each θ with equal weight (the same weighting as
 * the spectral plot). Errors of independent azimuths add in quadrature. The modifier is J̄(θ)/J̄(θ_ref)
 * with first-order ratio propagation (Taylor, An Introduction to Error Analysis, §3.8).
 */
export function adaptPhotocurrent(raw: Json, source: string): PhotocurrentSummary {
  if (raw.format !== "lightfold.photocurrent") {
    throw new InputError(`${source}: not a lightfold photocurrent summary (format is ${JSON.stringify(raw.format)}, expected "lightfold.photocurrent")`);
  }
  const dirs: Direction[] = objectsAt(raw, "directions", source).map(({ item, path }) => ({
    thetaDeg: numberAt(item, "thetaDeg", source, `${path}.thetaDeg`),
    jsc: numberAt(item, "jscMaCm2", source, `${path}.jscMaCm2`),
    jscSe: numberAt(item, "jscStderrMaCm2", source, `${path}.jscStderrMaCm2`),
    losses: objectsAt(item, "losses", source, `${path}.losses`).map((l) => ({
      channel: stringAt(l.item, "channel", source, `${l.path}.channel`),
      currentMaCm2: numberAt(l.item, "currentMaCm2", source, `${l.path}.currentMaCm2`),
      stderrMaCm2: numberAt(l.item, "stderrMaCm2", source, `${l.path}.stderrMaCm2`),
    })),
  }));
  const thetas = [...new Set(dirs.map((d) => d.thetaDeg))].sort((a, b) => a - b);
  const perAngle: AnglePhotocurrent[] = thetas.map((t) => {
    const at = dirs.filter((d) => d.thetaDeg === t);
    const n = at.length;
    const mean = (f: (d: Direction) => number) => at.reduce((s, d) => s + f(d), 0) / n;
    const quad = (f: (d: Direction) => number) => Math.sqrt(at.reduce((s, d) => s + f(d) ** 2, 0)) / n;
    const losses = at[0]!.losses.map((l, k) => ({
      channel: l.channel,
      currentMaCm2: mean((d) => d.losses[k]?.currentMaCm2 ?? NaN),
      stderrMaCm2: quad((d) => d.losses[k]?.stderrMaCm2 ?? NaN),
    }));
    return { thetaDeg: t, absorberMaCm2: mean((d) => d.jsc), absorberStderrMaCm2: quad((d) => d.jscSe), losses };
  });
  const refTheta = optNumberAt(raw, "iamReferenceThetaDeg", source) ?? thetas[0] ?? 0;
  const ref = perAngle.find((a) => a.thetaDeg === refTheta) ?? perAngle[0];
  const modifier: number[] = [];
  const stderr: number[] = [];
  for (const a of perAngle) {
    if (!ref || ref.absorberMaCm2 === 0) {
      modifier.push(NaN);
      stderr.push(NaN);
    } else if (a === ref) {
      modifier.push(1);
      stderr.push(0);
    } else {
      const r = a.absorberMaCm2 / ref.absorberMaCm2;
      modifier.push(r);
      stderr.push(Math.abs(r) * Math.hypot(a.absorberStderrMaCm2 / a.absorberMaCm2, ref.absorberStderrMaCm2 / ref.absorberMaCm2));
    }
  }
  return {
    spectrumName: stringAt(raw, "spectrum", source),
    incidentMaCm2: optNumberAt(raw, "totalAvailableMaCm2", source),
    perAngle,
    iam: { thetaDeg: thetas, modifier, stderr },
  };
}
