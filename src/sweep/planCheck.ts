import { isSafeSegment } from "../util/safePath.js";
import { at, int, names, num, numbers, obj, oneOf, refuse, str, type Where } from "../util/untrustedJson.js";
import type { RaysPlan, SpectrumChoice, StudyGrid } from "../study/studyTypes.js";
import type { ComboPlan, SweepPlan } from "./plan.js";

/** Most points a plan read from disk may have (the merge walks them all). */
export const MAX_PLAN_POINTS = 20_000_000;
const BUILTIN_SPECTRA = ["AM1.5G", "AM1.5D", "G173-ETR"] as const;

function grid(raw: unknown, w: Where): StudyGrid {
  const o = obj(raw, w);
  const thetaDeg = numbers(o.thetaDeg, at(w, "thetaDeg"), { nonEmpty: true, min: 0, max: 90, increasing: true });
  if (thetaDeg[thetaDeg.length - 1]! >= 90) refuse(at(w, "thetaDeg"), "angles below 90°");
  return {
    thetaDeg,
    phiDeg: numbers(o.phiDeg, at(w, "phiDeg"), { nonEmpty: true, min: 0, max: 360, increasing: true }),
    phiMode: oneOf(o.phiMode, at(w, "phiMode"), ["list", "averaged", "square"] as const),
    wavelengthNm: numbers(o.wavelengthNm, at(w, "wavelengthNm"), { nonEmpty: true, min: Number.MIN_VALUE, max: 1e6, increasing: true }),
  };
}

function rays(raw: unknown, w: Where): RaysPlan {
  const o = obj(raw, w);
  const mode = oneOf(o.mode, at(w, "mode"), ["fixed", "target"] as const);
  const batch = int(o.batch, at(w, "batch"), 1, 1e9);
  // The launch sampling the study resolved to (absent or "random": random; rays.ts, parseRays); it
  // decides how the merged matrices take their errors.
  const sampling = o.sampling === undefined || oneOf(o.sampling, at(w, "sampling"), ["random", "sobol"] as const) === "random" ? {} : { sampling: "sobol" as const };
  if (mode === "fixed") return { mode, perPoint: int(o.perPoint, at(w, "perPoint"), 1, 1e12), batch, ...sampling };
  const maxPerPoint = int(o.maxPerPoint, at(w, "maxPerPoint"), 1, 1e12);
  return {
    mode,
    targetStdErr: num(o.targetStdErr, at(w, "targetStdErr"), Number.MIN_VALUE, 0.5),
    channels: names(o.channels, at(w, "channels")),
    maxPerPoint,
    minPerPoint: int(o.minPerPoint, at(w, "minPerPoint"), 1, maxPerPoint),
    batch,
    ...sampling,
  };
}

function combo(raw: unknown, w: Where): ComboPlan {
  const o = obj(raw, w);
  const label = str(o.label, at(w, "label"), 100);
  if (!isSafeSegment(label)) refuse(at(w, "label"), "a plain folder name (letters, digits, . _ -)", label);
  const values = obj(o.values, at(w, "values"));
  for (const [k, v] of Object.entries(values)) num(v, at(at(w, "values"), k));
  return {
    label,
    values: values as Record<string, number>,
    hash: str(o.hash, at(w, "hash"), 200),
    channels: names(o.channels, at(w, "channels")),
    absorberThicknessUm: num(o.absorberThicknessUm, at(w, "absorberThicknessUm"), Number.MIN_VALUE, 1e9),
    ...(o.title !== undefined ? { title: str(o.title, at(w, "title"), 1000) } : {}),
    ...(o.lightFrom !== undefined ? { lightFrom: oneOf(o.lightFrom, at(w, "lightFrom"), ["rear"] as const) } : {}),
  };
}

function spectrum(raw: unknown, w: Where): SpectrumChoice {
  if (typeof raw === "string") return oneOf(raw, w, BUILTIN_SPECTRA);
  return { csv: str(obj(raw, w).csv, at(w, "csv"), 4096) };
}

/** A sweep plan read from a shard output, checked field by field (names confined to safe folder names). */
export function validatePlan(raw: unknown, w: Where): SweepPlan {
  const o = obj(raw, w);
  const rawCombos = o.combos;
  if (!Array.isArray(rawCombos) || rawCombos.length === 0 || rawCombos.length > 100_000) refuse(at(w, "combos"), "a list of 1 to 100000 combinations", rawCombos);
  const combos = rawCombos.map((c, i) => combo(c, at(at(w, "combos"), i)));
  const labels = new Set<string>();
  combos.forEach((c, i) => {
    if (labels.has(c.label)) refuse(at(at(at(w, "combos"), i), "label"), `distinct labels, ${JSON.stringify(c.label)} appears twice`);
    labels.add(c.label);
  });
  const plan: SweepPlan = {
    studyName: str(o.studyName, at(w, "studyName"), 1000),
    studyHash: str(o.studyHash, at(w, "studyHash"), 200),
    toolVersion: str(o.toolVersion, at(w, "toolVersion"), 100),
    buildId: str(o.buildId, at(w, "buildId"), 200),
    seed: num(o.seed, at(w, "seed")),
    grid: grid(o.grid, at(w, "grid")),
    rays: rays(o.rays, at(w, "rays")),
    combos,
    spectrum: spectrum(o.spectrum, at(w, "spectrum")),
    baseDir: str(o.baseDir, at(w, "baseDir"), 4096),
  };
  const g = plan.grid;
  const nPoints = combos.length * g.thetaDeg.length * g.phiDeg.length * g.wavelengthNm.length;
  if (nPoints > MAX_PLAN_POINTS) refuse(w, `at most ${MAX_PLAN_POINTS} points, got ${nPoints}`);
  return plan;
}
