/** convergence.json (written by the convergence command) → the report's convergence series. */
import { InputError } from "../util/errors.js";
import type { ConvergenceSeries } from "./inputs.js";
import { numberAt, objectsAt, optNumberAt, type Json } from "./fields.js";

function optString(o: Json, key: string): string | undefined {
  return typeof o[key] === "string" ? (o[key] as string) : undefined;
}

/** "Jsc at θ = 0°" / "A_absorber at θ = 30°, λ = 1000 nm" from the file's subject fields. */
function describe(item: Json): string | undefined {
  const q = optString(item, "quantity");
  if (q === undefined) return undefined;
  const name = q === "Jsc" ? "absorber photocurrent Jsc" : q;
  const theta = typeof item.thetaDeg === "number" ? ` at θ = ${item.thetaDeg}°` : "";
  const wl = typeof item.wavelengthNm === "number" ? `, λ = ${item.wavelengthNm} nm` : "";
  const per = item.raysPer === "wavelength" ? " (rays per wavelength)" : "";
  return `${name}${theta}${wl}${per}`;
}

/**
 * Accepts one result object (format "lightfold.convergence"), or { series: [...] } / { results: [...] }
 * holding several.
 */
export function adaptConvergence(raw: Json, source: string): ConvergenceSeries[] {
  if (raw.format !== undefined && raw.format !== "lightfold.convergence") {
    throw new InputError(`${source}: not a lightfold convergence result (format is ${JSON.stringify(raw.format)}, expected "lightfold.convergence")`);
  }
  const list = Array.isArray(raw.series) ? objectsAt(raw, "series", source) : Array.isArray(raw.results) ? objectsAt(raw, "results", source) : [{ item: raw, path: "" }];
  return list.map(({ item, path }) => {
    const p = (k: string) => (path ? `${path}.${k}` : k);
    const replicas = optNumberAt(item, "replicas", source, p("replicas")) ?? 1;
    const steps = objectsAt(item, "steps", source, p("steps")).map(({ item: s, path: sp }) => ({
      nRays: numberAt(s, "nRays", source, `${sp}.nRays`),
      value: numberAt(s, "value", source, `${sp}.value`),
      stderr: numberAt(s, "stderr", source, `${sp}.stderr`),
      deviation: optNumberAt(s, "deviation", source, `${sp}.deviation`),
      rmsError: replicas > 1 ? optNumberAt(s, "rmsError", source, `${sp}.rmsError`) : undefined,
    }));
    const slopes = item.slopes && typeof item.slopes === "object" ? (item.slopes as Json) : {};
    const slope = typeof slopes.stderr === "number" ? slopes.stderr : undefined;
    return {
      label: optString(item, "label") ?? optString(item, "studyName") ?? optString(raw, "studyName") ?? "estimate",
      quantity: describe(item) ?? describe(raw) ?? "estimate",
      unit: optString(item, "unit") ?? optString(raw, "unit") ?? "",
      steps,
      slope,
    };
  });
}
