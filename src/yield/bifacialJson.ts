import type { Site } from "../site/site.js";
import type { SkyModel } from "../sky/transposition.js";
import type { BifacialDifference, DifferenceEstimate } from "./bifacialDifference.js";
import type { BifacialResult, Mounting } from "./bifacialYield.js";
import type { YearContext } from "./yearContext.js";
import { siteInfo, weatherInfo } from "./yieldJson.js";

export const BIFACIAL_KIND = "lightfold.bifacial";
export const BIFACIAL_FORMAT_VERSION = 1;

const r = (x: number, digits: number): number => Number(x.toFixed(digits));

/** One plane × mounting row as plain JSON. */
export function bifacialRowJson(b: BifacialResult): Record<string, unknown> {
  const face = (f: BifacialResult["front"]) => ({
    model: f.model, chargeAhM2: r(f.chargeAhM2, 2), chargeStdErrAhM2: r(f.chargeStdErrAhM2, 3), insolationKWhM2: r(f.insolationKWhM2, 2),
    monthlyChargeAhM2: f.monthlyChargeAhM2.map((q) => r(q, 2)),
  });
  const parts = b.rearDetail.insolationByPartKWhM2;
  return {
    tiltDeg: b.plane.tiltDeg,
    azimuthDeg: b.plane.azimuthDeg,
    pitchM: b.geometry.pitchM,
    groundCoverageRatio: r(b.groundCoverageRatio, 4),
    front: face(b.front),
    rear: { ...face(b.rear), insolationByPartKWhM2: { beam: r(parts.beam, 2), sky: r(parts.sky, 2), ground: r(parts.ground, 2) } },
    totalChargeAhM2: r(b.totalChargeAhM2, 2),
    totalStdErrAhM2: r(b.totalStdErrAhM2, 3),
    bifacialGainPct: r(100 * b.bifacialGain, 4),
    bifacialGainStdErrPct: r(100 * b.bifacialGainStdErr, 4),
  };
}

/** `<out>/yield/bifacial-<site>.json`: front, rear and total yearly charge per plane and row pitch. */
export function bifacialJson(args: {
  toolVersion: string; front: Record<string, unknown>; rear: Record<string, unknown>; site: Site; ctx: YearContext; skyModel: SkyModel;
  mounting: Omit<Mounting, "pitchM">; opticalBifaciality: number; results: BifacialResult[];
}): Record<string, unknown> {
  return {
    kind: BIFACIAL_KIND,
    formatVersion: BIFACIAL_FORMAT_VERSION,
    toolVersion: args.toolVersion,
    matrices: { front: args.front, rear: args.rear },
    site: siteInfo(args.site),
    weather: weatherInfo(args.ctx),
    skyModel: args.skyModel,
    mounting: { slantLengthM: args.mounting.slantLengthM, centreHeightM: args.mounting.centreHeightM },
    opticalBifaciality: r(args.opticalBifaciality, 5),
    model: "2D view factors, infinitely long rows (or one isolated row), uniform albedo, opaque modules, dark neighbouring rows, no racking shade",
    units: { charge: "A·h/m²", insolation: "kWh/m²", gain: "%" },
    results: args.results.map(bifacialRowJson),
  };
}

const pad = (s: string, n: number): string => s.padStart(n);

/** Plain-text table: one row per plane and pitch. */
export function formatBifacialTable(siteName: string, skyModel: SkyModel, opticalBifaciality: number, results: BifacialResult[]): string {
  const lines = [`site ${siteName}, sky model ${skyModel}, optical bifaciality (0°, AM1.5G) ${opticalBifaciality.toFixed(3)}`, ""];
  lines.push(`${pad("tilt°", 6)} ${pad("pitch m", 8)} ${pad("GCR", 5)} ${pad("front A·h/m²", 13)} ${pad("rear A·h/m²", 12)} ${pad("total A·h/m²", 13)} ${pad("±", 5)} ${pad("gain %", 7)} ${pad("±", 5)} ${pad("rear kWh/m²", 12)}`);
  for (const b of results) {
    lines.push(
      `${pad(b.plane.tiltDeg.toFixed(1), 6)} ${pad(b.geometry.pitchM === null ? "isolated" : b.geometry.pitchM.toFixed(2), 8)} ${pad(b.groundCoverageRatio.toFixed(2), 5)} ${pad(b.front.chargeAhM2.toFixed(0), 13)} ${pad(b.rear.chargeAhM2.toFixed(0), 12)} ${pad(b.totalChargeAhM2.toFixed(0), 13)} ${pad(b.totalStdErrAhM2.toFixed(0), 5)} ${pad((100 * b.bifacialGain).toFixed(2), 7)} ${pad((100 * b.bifacialGainStdErr).toFixed(2), 5)} ${pad(b.rear.insolationKWhM2.toFixed(1), 12)}`,
    );
  }
  lines.push("", "gain = rear / front yearly charge; ± = Monte Carlo standard error (front and rear matrices independent)");
  lines.push("rows: 2D view factors (infinite rows, uniform albedo, opaque modules, no racking shade); front of an isolated row: the sky model as in `yield`");
  return lines.join("\n") + "\n";
}

/** One site, plane and mounting of a bifacial comparison, with the differences of A and B. */
export interface BifacialCompareRow {
  site: string;
  a: BifacialResult;
  b: BifacialResult;
  diff: BifacialDifference;
}

/** How the comparison's errors were made: "paired", or "independent" with the reason pairing failed. */
export interface PairingNote {
  errorKind: "paired" | "independent";
  reason?: string;
}

const diffJson = (d: DifferenceEstimate, unit: string, digits: number) => ({
  [`delta${unit}`]: r(d.delta, digits), [`stdErr${unit}`]: r(d.stdErr, digits + 1), [`independentStdErr${unit}`]: r(d.independentStdErr, digits + 1),
});

/**
 * `compare --rear-matrix …` as kind "lightfold.compare" (basis "front+rear"): the charge fields hold
 * each stack's front + rear total, so readers of comparisons show the bifacial benefit; the rear
 * charge and bifacial gain of each stack and the pitch come with every row, and "differences" holds
 * A − B of front, rear and total charge and of the gain, each with its error and the independent one.
 */
export function bifacialCompareJson(args: {
  toolVersion: string; matrices: Record<string, unknown>[]; skyModel: SkyModel; sites: Record<string, unknown>[]; weather: Record<string, unknown>[];
  mounting: Omit<Mounting, "pitchM">; pairing: PairingNote; rows: BifacialCompareRow[];
}): Record<string, unknown> {
  return {
    kind: "lightfold.compare",
    formatVersion: 1,
    toolVersion: args.toolVersion,
    basis: "front+rear",
    skyModel: args.skyModel,
    matrices: args.matrices,
    sites: args.sites,
    weather: args.weather,
    mounting: { slantLengthM: args.mounting.slantLengthM, centreHeightM: args.mounting.centreHeightM },
    pairing: args.pairing,
    units: { charge: "A·h/m²", benefit: "%", gain: "%", gainDifference: "percentage points" },
    rows: args.rows.map((row) => {
      const d = row.diff;
      return {
        site: row.site,
        tiltDeg: row.a.plane.tiltDeg,
        azimuthDeg: row.a.plane.azimuthDeg,
        pitchM: row.a.geometry.pitchM,
        chargeAAhM2: r(row.a.totalChargeAhM2, 2),
        chargeAStdErrAhM2: r(row.a.totalStdErrAhM2, 3),
        chargeBAhM2: r(row.b.totalChargeAhM2, 2),
        chargeBStdErrAhM2: r(row.b.totalStdErrAhM2, 3),
        rearAAhM2: r(row.a.rear.chargeAhM2, 2),
        rearBAhM2: r(row.b.rear.chargeAhM2, 2),
        bifacialGainAPct: r(100 * row.a.bifacialGain, 4),
        bifacialGainBPct: r(100 * row.b.bifacialGain, 4),
        benefitPct: r(d.benefitPct.delta, 4),
        benefitStdErrPct: r(d.benefitPct.stdErr, 4),
        benefitErrorKind: d.errorKind,
        benefitIndependentStdErrPct: r(d.benefitPct.independentStdErr, 4),
        differences: {
          front: diffJson(d.front, "AhM2", 2),
          rear: diffJson(d.rear, "AhM2", 2),
          total: diffJson(d.total, "AhM2", 2),
          bifacialGain: diffJson(d.gainPts, "Pts", 4),
        },
      };
    }),
  };
}

export function formatBifacialCompareTable(labelA: string, labelB: string, pairing: PairingNote, rows: BifacialCompareRow[]): string {
  const lines = [`benefit of A = ${labelA} over B = ${labelB} (yearly front + rear absorbed charge)`, ""];
  lines.push(`${"site".padEnd(16)} ${pad("tilt°", 6)} ${pad("pitch m", 8)} ${pad("A total", 9)} ${pad("B total", 9)} ${pad("A − B", 8)} ${pad("±", 5)} ${pad("A gain %", 9)} ${pad("B gain %", 9)} ${pad("Δgain pts", 10)} ${pad("±", 6)} ${pad("benefit %", 10)} ${pad("± %", 6)}`);
  for (const row of rows) {
    const d = row.diff;
    const p = row.a.geometry.pitchM;
    lines.push(
      `${row.site.slice(0, 16).padEnd(16)} ${pad(row.a.plane.tiltDeg.toFixed(1), 6)} ${pad(p === null ? "isolated" : p.toFixed(2), 8)} ${pad(row.a.totalChargeAhM2.toFixed(0), 9)} ${pad(row.b.totalChargeAhM2.toFixed(0), 9)} ${pad(d.total.delta.toFixed(0), 8)} ${pad(d.total.stdErr.toFixed(0), 5)} ${pad((100 * row.a.bifacialGain).toFixed(2), 9)} ${pad((100 * row.b.bifacialGain).toFixed(2), 9)} ${pad(d.gainPts.delta.toFixed(3), 10)} ${pad(d.gainPts.stdErr.toFixed(3), 6)} ${pad(d.benefitPct.delta.toFixed(3), 10)} ${pad(d.benefitPct.stdErr.toFixed(3), 6)}`,
    );
  }
  lines.push("", "totals and A − B in A·h/m²; gain = rear / front; Δgain = gain A − gain B in percentage points");
  if (pairing.errorKind === "paired") {
    const ind = (f: (d: BifacialDifference) => DifferenceEstimate, digits: number): string => rows.map((row) => f(row.diff).independentStdErr.toFixed(digits)).join(", ");
    lines.push(
      "± = paired Monte Carlo standard error: front A vs B and rear A vs B from their pairing groups (common random numbers);",
      "    front and rear light are traced on separate streams, so their errors add as independent",
      `    as if A and B were independent: A − B ± ${ind((d) => d.total, 0)}; Δgain ± ${ind((d) => d.gainPts, 3)}; benefit ± ${ind((d) => d.benefitPct, 3)}`,
    );
  } else {
    lines.push(
      "± = Monte Carlo standard error of each stack in quadrature (A and B as independent runs: an overestimate when both were traced on the same streams)",
      `    paired errors unavailable: ${pairing.reason ?? "no pairing groups"}`,
    );
  }
  return lines.join("\n") + "\n";
}
