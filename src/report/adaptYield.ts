/**
 * yield/*.json (kinds "lightfold.yield" and "lightfold.compare", see docs/contracts.md) → the report's
 * yield entries, tilt sweeps and texture-benefit rows.
 */
import type { BenefitRow, TiltSweep, YieldEntry } from "./inputs.js";
import { numberArrayAt, numberAt, objectAt, objectsAt, optNumberAt, stringAt, type Json } from "./fields.js";
import { InputError } from "../util/errors.js";

export interface YieldParts {
  yields: YieldEntry[];
  tiltSweeps: TiltSweep[];
  benefit: BenefitRow[];
}

/** A yield file with more planes than this is shown as a tilt curve only (no monthly bars per plane). */
export const MAX_MONTHLY_PLANES = 4;

/** Label of a matrix as the report names its stack: study name, plus the combination when swept. */
export function matrixLabel(info: Json, source: string, path: string): string {
  const name = stringAt(info, "studyName", source, `${path}.studyName`);
  const combo = info.combo && typeof info.combo === "object" ? Object.entries(info.combo as Record<string, unknown>) : [];
  return combo.length ? `${name} [${combo.map(([k, v]) => `${k} = ${String(v)}`).join(", ")}]` : name;
}

interface Plane {
  tiltDeg: number;
  azimuthDeg: number;
  chargeAhM2: number;
  poaKWhM2?: number;
  relativeToNormal?: number;
  monthly: number[];
  spectralCorrection?: { yearPct: number; monthlyPct: number[]; spectra: string };
}

/** The optional spectral correction of a plane (files written with --spectra other than g173). */
function spectralCorrectionAt(raw: Json, item: Json, source: string, path: string): Plane["spectralCorrection"] {
  if (item.spectralCorrection === undefined) return undefined;
  const c = objectAt(item, "spectralCorrection", source, `${path}.spectralCorrection`);
  const spectra = objectAt(raw, "spectra", source);
  return {
    yearPct: numberAt(c, "yearPct", source, `${path}.spectralCorrection.yearPct`),
    monthlyPct: numberArrayAt(c, "monthlyPct", source, `${path}.spectralCorrection.monthlyPct`, 12),
    spectra: stringAt(spectra, "mode", source, "spectra.mode"),
  };
}

function readYield(raw: Json, source: string): YieldParts {
  const stackLabel = matrixLabel(objectAt(raw, "matrix", source), source, "matrix");
  const siteName = stringAt(objectAt(raw, "site", source), "name", source, "site.name");
  const planes: Plane[] = objectsAt(raw, "results", source).map(({ item, path }) => {
    const monthly = objectsAt(item, "monthly", source, `${path}.monthly`).map((m) => numberAt(m.item, "chargeAhM2", source, `${m.path}.chargeAhM2`));
    return {
      tiltDeg: numberAt(item, "tiltDeg", source, `${path}.tiltDeg`),
      azimuthDeg: numberAt(item, "azimuthDeg", source, `${path}.azimuthDeg`),
      chargeAhM2: numberAt(item, "chargeAhM2", source, `${path}.chargeAhM2`),
      poaKWhM2: optNumberAt(item, "poaKWhM2", source, `${path}.poaKWhM2`),
      relativeToNormal: optNumberAt(item, "relativeToNormal", source, `${path}.relativeToNormal`),
      monthly,
      spectralCorrection: spectralCorrectionAt(raw, item, source, path),
    };
  });
  const parts: YieldParts = { yields: [], tiltSweeps: [], benefit: [] };
  if (planes.length <= MAX_MONTHLY_PLANES) {
    for (const p of planes) {
      parts.yields.push({ stackLabel, siteName, tiltDeg: p.tiltDeg, azimuthDeg: p.azimuthDeg, monthlyAhM2: p.monthly, annualAhM2: p.chargeAhM2, poaKwhM2: p.poaKWhM2, relativeToNormal: p.relativeToNormal, spectralCorrection: p.spectralCorrection });
    }
  }
  // planes of one azimuth over three or more tilts make a tilt curve
  for (const az of [...new Set(planes.map((p) => p.azimuthDeg))]) {
    const row = planes.filter((p) => p.azimuthDeg === az).sort((a, b) => a.tiltDeg - b.tiltDeg);
    if (new Set(row.map((p) => p.tiltDeg)).size < 3) continue;
    let best = row[0]!;
    for (const p of row) if (p.chargeAhM2 > best.chargeAhM2) best = p;
    parts.tiltSweeps.push({
      stackLabel,
      siteName,
      azimuthDeg: az,
      tiltDeg: row.map((p) => p.tiltDeg),
      annualAhM2: row.map((p) => p.chargeAhM2),
      bestTiltDeg: best.tiltDeg,
      bestAnnualAhM2: best.chargeAhM2,
    });
  }
  return parts;
}

/** The optional benefitErrorKind of a compare row ("paired" | "independent"; older files have none). */
function errorKindAt(item: Json, source: string, path: string): { errorKind?: "paired" | "independent" } {
  const v = item.benefitErrorKind;
  if (v === undefined) return {};
  const kind = stringAt(item, "benefitErrorKind", source, path);
  if (kind !== "paired" && kind !== "independent") throw new InputError(`${source}: field "${path}" must be "paired" or "independent" (found "${kind.slice(0, 40)}")`);
  return { errorKind: kind };
}

function readCompare(raw: Json, source: string): YieldParts {
  const matrices = objectsAt(raw, "matrices", source);
  const label = (i: number) => (matrices[i] ? matrixLabel(matrices[i]!.item, source, matrices[i]!.path) : i === 0 ? "A" : "B");
  const stackA = label(0);
  const stackB = label(1);
  const benefit: BenefitRow[] = objectsAt(raw, "rows", source).map(({ item, path }) => ({
    siteName: stringAt(item, "site", source, `${path}.site`),
    tiltDeg: numberAt(item, "tiltDeg", source, `${path}.tiltDeg`),
    azimuthDeg: numberAt(item, "azimuthDeg", source, `${path}.azimuthDeg`),
    stackA,
    stackB,
    annualAhM2A: numberAt(item, "chargeAAhM2", source, `${path}.chargeAAhM2`),
    annualAhM2B: numberAt(item, "chargeBAhM2", source, `${path}.chargeBAhM2`),
    benefitPct: numberAt(item, "benefitPct", source, `${path}.benefitPct`),
    stderrPct: numberAt(item, "benefitStdErrPct", source, `${path}.benefitStdErrPct`),
    ...errorKindAt(item, source, `${path}.benefitErrorKind`),
  }));
  return { yields: [], tiltSweeps: [], benefit };
}

/** Dispatches on the file's `kind`; null for files of another kind. */
export function adaptYieldFile(raw: Json, source: string): YieldParts | null {
  switch (raw.kind) {
    case "lightfold.yield":
      return readYield(raw, source);
    case "lightfold.compare":
      return readCompare(raw, source);
    default:
      return null;
  }
}
