/**
 * Optimised parameters: a field of the stack (the sweep's path syntax, e.g.
 * "front.films[0].thicknessNm") with its bounds, written "path=lower:upper" on the command line.
 */
import { parseFieldPath } from "../study/sweepCombos.js";
import { InputError } from "../util/errors.js";

export interface ParameterSpec {
  /** Field path relative to "stack". */
  path: string;
  lower: number;
  upper: number;
  /** Unit read from the field name's suffix (Nm, Um, Deg), "" when none. */
  unit: string;
}

export function unitOfPath(path: string): string {
  if (/Nm$/.test(path)) return "nm";
  if (/Um$/.test(path)) return "µm";
  if (/Deg$/.test(path)) return "°";
  return "";
}

/** "front.films[0].thicknessNm=55:105" (a leading "stack." is accepted). */
export function parseParameter(text: string, flag: string): ParameterSpec {
  const hint = 'e.g. --param "front.films[0].thicknessNm=55:105" (a stack field path, then lower:upper)';
  const m = /^([^=]+)=([^:]+):([^:]+)$/.exec(text.trim());
  if (m === null) throw new InputError(`${flag}: expected path=lower:upper, got "${text}"`, hint);
  const path = m[1].trim().replace(/^stack\./, "");
  parseFieldPath(path, flag);
  const lower = Number(m[2]);
  const upper = Number(m[3]);
  if (!Number.isFinite(lower) || !Number.isFinite(upper) || !(upper > lower)) {
    throw new InputError(`${flag}: bounds of ${path} must be numbers with lower < upper, got "${m[2]}:${m[3]}"`, hint);
  }
  return { path, lower, upper, unit: unitOfPath(path) };
}

/** One or two parameters, each field at most once. */
export function checkParameters(params: ParameterSpec[], flag: string): ParameterSpec[] {
  if (params.length < 1 || params.length > 2) {
    throw new InputError(`${flag}: one or two parameters expected, got ${params.length}`, 'e.g. --param "absorber.thicknessUm=100:200"');
  }
  if (params.length === 2 && params[0].path === params[1].path) throw new InputError(`${flag}: ${params[0].path} is given twice`);
  return params;
}
