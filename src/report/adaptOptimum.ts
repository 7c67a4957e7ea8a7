/** optimum.json (written by `lightfold optimize`) → the report's optimum entry, every field checked. */
import { InputError } from "../util/errors.js";
import { arrayAt, numberArrayAt, numberAt, objectAt, objectsAt, stringAt, type Json } from "./fields.js";
import type { OptimumEntry } from "./inputs.js";

function pairs(o: Json, key: string, source: string, path: string, n: number): [number, number][] {
  const a = arrayAt(o, key, source, path);
  if (a.length !== n) throw new InputError(`${source}: field "${path}" must list ${n} intervals`);
  return a.map((_, i) => numberArrayAt({ v: a[i] }, "v", source, `${path}[${i}]`, 2) as [number, number]);
}

export function adaptOptimum(raw: Json, source: string): OptimumEntry {
  if (raw.kind !== "lightfold.optimum") {
    throw new InputError(`${source}: not a lightfold optimum (kind is ${JSON.stringify(raw.kind)}, expected "lightfold.optimum")`);
  }
  const study = objectAt(raw, "study", source);
  const objective = objectAt(raw, "objective", source);
  const parameters = objectsAt(raw, "parameters", source).map(({ item, path }) => ({
    path: stringAt(item, "path", source, `${path}.path`),
    unit: stringAt(item, "unit", source, `${path}.unit`),
    lower: numberAt(item, "lower", source, `${path}.lower`),
    upper: numberAt(item, "upper", source, `${path}.upper`),
  }));
  const n = parameters.length;
  if (n !== 1 && n !== 2) throw new InputError(`${source}: field "parameters" must list one or two parameters`);
  const r = objectAt(raw, "result", source);
  const d = objectAt(r, "design", source, "result.design");
  const points = arrayAt(d, "points", source, "result.design.points").map((v, i) => numberArrayAt({ v }, "v", source, `result.design.points[${i}]`, n));
  const atBound = arrayAt(r, "atBound", source, "result.atBound").map((v, i) => {
    if (v === null || v === "lower" || v === "upper") return v;
    throw new InputError(`${source}: field "result.atBound[${i}]" must be "lower", "upper" or null`);
  });
  const search = objectsAt(r, "evaluations", source, "result.evaluations")
    .filter(({ item }) => item.stream === -1)
    .map(({ item, path }) => ({ x: numberArrayAt(item, "x", source, `${path}.x`, n), value: numberAt(item, "value", source, `${path}.value`), stderr: numberAt(item, "stderr", source, `${path}.stderr`) }));
  const cost = objectAt(raw, "cost", source);
  return {
    source,
    studyName: stringAt(study, "name", source, "study.name"),
    objectiveName: stringAt(objective, "name", source, "objective.name"),
    unit: stringAt(objective, "unit", source, "objective.unit"),
    description: stringAt(objective, "description", source, "objective.description"),
    level: numberAt(r, "level", source, "result.level"),
    replicas: numberAt(r, "replicas", source, "result.replicas"),
    parameters,
    location: numberArrayAt(r, "location", source, "result.location", n),
    locationStdErr: numberArrayAt(r, "locationStdErr", source, "result.locationStdErr", n),
    locationInterval: pairs(r, "locationInterval", source, "result.locationInterval", n),
    atBound,
    value: numberAt(r, "value", source, "result.value"),
    valueStdErr: numberAt(r, "valueStdErr", source, "result.valueStdErr"),
    valueInterval: numberArrayAt(r, "valueInterval", source, "result.valueInterval", 2) as [number, number],
    search,
    design: {
      centre: numberArrayAt(d, "centre", source, "result.design.centre", n),
      halfWidth: numberArrayAt(d, "halfWidth", source, "result.design.halfWidth", n),
      points,
      mean: numberArrayAt(d, "mean", source, "result.design.mean", points.length),
      stderr: numberArrayAt(d, "stderr", source, "result.design.stderr", points.length),
      pooledCoef: numberArrayAt(d, "pooledCoef", source, "result.design.pooledCoef"),
    },
    cost: { evaluations: numberAt(cost, "evaluations", source, "cost.evaluations"), raysTraced: numberAt(cost, "raysTraced", source, "cost.raysTraced"), wallS: numberAt(cost, "wallS", source, "cost.wallS") },
  };
}
