/** yield/*.json (from the yield and compare commands) → the report's yield, tilt-sweep and benefit parts. */
import type { BenefitRow, TiltSweep, YieldEntry } from "./inputs.js";
import { numberArrayAt, numberAt, objectsAt, optNumberAt, stringAt, type Json } from "./fields.js";

export interface YieldParts {
  yields: YieldEntry[];
  tiltSweeps: TiltSweep[];
  benefit: BenefitRow[];
}

function yieldEntry(o: Json, source: string, path: string): YieldEntry {
  const p = (k: string) => (path ? `${path}.${k}` : k);
  return {
    stackLabel: stringAt(o, "stackLabel", source, p("stackLabel")),
    siteName: stringAt(o, "siteName", source, p("siteName")),
    tiltDeg: numberAt(o, "tiltDeg", source, p("tiltDeg")),
    azimuthDeg: numberAt(o, "azimuthDeg", source, p("azimuthDeg")),
    monthlyAhM2: numberArrayAt(o, "monthlyAhM2", source, p("monthlyAhM2"), 12),
    annualAhM2: numberAt(o, "annualAhM2", source, p("annualAhM2")),
    poaKwhM2: optNumberAt(o, "poaKwhM2", source, p("poaKwhM2")),
    relativeToNormal: optNumberAt(o, "relativeToNormal", source, p("relativeToNormal")),
  };
}

/** Dispatches on the file's `format`; null for files of another kind. */
export function adaptYieldFile(raw: Json, source: string): YieldParts | null {
  const parts: YieldParts = { yields: [], tiltSweeps: [], benefit: [] };
  switch (raw.format) {
    case "lightfold.yield":
      parts.yields.push(yieldEntry(raw, source, ""));
      return parts;
    case "lightfold.compare":
      parts.benefit.push(
        ...objectsAt(raw, "rows", source).map(({ item, path }) => ({
          siteName: stringAt(item, "siteName", source, `${path}.siteName`),
          tiltDeg: numberAt(item, "tiltDeg", source, `${path}.tiltDeg`),
          azimuthDeg: numberAt(item, "azimuthDeg", source, `${path}.azimuthDeg`),
          stackA: stringAt(item, "stackA", source, `${path}.stackA`),
          stackB: stringAt(item, "stackB", source, `${path}.stackB`),
          annualAhM2A: numberAt(item, "annualAhM2A", source, `${path}.annualAhM2A`),
          annualAhM2B: numberAt(item, "annualAhM2B", source, `${path}.annualAhM2B`),
          benefitPct: numberAt(item, "benefitPct", source, `${path}.benefitPct`),
          stderrPct: numberAt(item, "stderrPct", source, `${path}.stderrPct`),
        })),
      );
      return parts;
    case "lightfold.tiltSweep": {
      const tiltDeg = numberArrayAt(raw, "tiltDeg", source);
      const annual = numberArrayAt(raw, "annualAhM2", source, "annualAhM2", tiltDeg.length);
      parts.tiltSweeps.push({
        stackLabel: stringAt(raw, "stackLabel", source),
        siteName: stringAt(raw, "siteName", source),
        azimuthDeg: numberAt(raw, "azimuthDeg", source),
        tiltDeg,
        annualAhM2: annual,
        bestTiltDeg: numberAt(raw, "bestTiltDeg", source),
        bestAnnualAhM2: numberAt(raw, "bestAnnualAhM2", source),
      });
      return parts;
    }
    default:
      return null;
  }
}
