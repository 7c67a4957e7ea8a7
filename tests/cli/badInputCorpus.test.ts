import { cpSync, mkdirSync, mkdtempSync, readdirSync, readFileSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join, relative } from "node:path";
import { beforeAll, describe, expect, it } from "vitest";
import { writeResponseMatrix, matrixToJson } from "../../src/response/matrixFile.js";
import { siteFromObject } from "../../src/site/site.js";
import { runSweep } from "../../src/sweep/runSweep.js";
import { syntheticWeather } from "../../src/weather/synthetic.js";
import { weatherToCsv } from "../../src/weather/weatherCsv.js";
import { runMain } from "../helpers/cli.js";
import { tinyDoc, tinyStudy } from "../sweep/helpers.js";
import { makeMatrix, range } from "../yield/matrixFixture.js";

/**
 * A table of bad inputs across every kind of file lightfold reads and its flags. Each case: exit 2,
 * a message naming the file (or flag) and the field or line and what was expected, nothing on
 * standard output, and no file written or left behind in the case's folder. Messages are matched
 * by the field path (or line) and the expectation, not word for word.
 */

type Json = Record<string, any>; // eslint-disable-line @typescript-eslint/no-explicit-any
interface Case {
  kind: "study" | "site" | "weather" | "n,k" | "height map" | "matrix" | "shard" | "flag";
  name: string;
  /** Writes the case's files into dir and returns the command line. */
  setup: (dir: string) => string[];
  /** What the message must say (after the file name, which is checked separately when given). */
  says: RegExp;
  /** File (relative to the case folder) the message must name. */
  file?: string;
}

const SITE = { name: "Corpus Flats", latitudeDeg: 45, longitudeDeg: 7, elevationM: 200, utcOffsetHours: "UTC+01:00", albedo: 0.2, monthlyClearness: new Array(12).fill(0.5) };
const NK = "wavelength_nm,n,k\n400,1.50,0\n800,1.45,0\n1200,1.44,0\n";
const HEIGHTS = "0,1,0\n1,2,1\n0,1,0\n";
const WEATHER_HEAD = "time,ghi_wm2,dni_wm2,dhi_wm2";
let weatherYear = "";
let shardRun = "";
let matrixText = "";

const write = (dir: string, name: string, text: string): string => {
  writeFileSync(join(dir, name), text);
  return join(dir, name);
};
const json = (dir: string, name: string, doc: unknown): string => write(dir, name, JSON.stringify(doc, null, 2));

// ---- study files (`lightfold check`) --------------------------------------------------------
function study(name: string, edit: (d: Json) => void, says: RegExp, extra?: (dir: string) => void): Case {
  return {
    kind: "study", name, says, file: "s.study.json",
    setup: (dir) => {
      const d = structuredClone(tinyDoc()) as Json;
      edit(d);
      extra?.(dir);
      return ["check", json(dir, "s.study.json", d)];
    },
  };
}
const studyText = (name: string, text: (valid: string) => string, says: RegExp): Case => ({
  kind: "study", name, says, file: "s.study.json",
  setup: (dir) => ["check", write(dir, "s.study.json", text(JSON.stringify(tinyDoc(), null, 2)))],
});

const STUDY_CASES: Case[] = [
  study("name missing", (d) => delete d.name, /name.*(required|missing)/),
  study("name empty", (d) => (d.name = ""), /name: expected/),
  study("name with an ESC sequence", (d) => (d.name = "x\u001b[31mred"), /name: expected.*\\u001b/),
  study("name of 300 characters", (d) => (d.name = "n".repeat(300)), /name: expected/),
  study("unknown top-level field", (d) => (d.seeed = 1), /seeed.*unknown/),
  study("seed negative", (d) => (d.seed = -1), /seed: expected/),
  study("seed not whole", (d) => (d.seed = 1.5), /seed: expected/),
  study("seed as text", (d) => (d.seed = "7"), /seed: expected/),
  study("seed above 2^53", (d) => (d.seed = 2 ** 60), /seed: expected/),
  study("stack missing", (d) => delete d.stack, /stack.*(required|missing)/),
  study("absorber 1e12 µm", (d) => (d.stack.absorber.thicknessUm = 1e12), /stack\.absorber\.thicknessUm: expected .*10000/),
  study("absorber 1e-9 µm", (d) => (d.stack.absorber.thicknessUm = 1e-9), /stack\.absorber\.thicknessUm: expected .*\[1, /),
  study("absorber thickness negative", (d) => (d.stack.absorber.thicknessUm = -180), /stack\.absorber\.thicknessUm: expected/),
  study("absorber thickness as text", (d) => (d.stack.absorber.thicknessUm = "180"), /stack\.absorber\.thicknessUm: expected/),
  study("absorber material unknown", (d) => (d.stack.absorber.material = "Sx"), /stack\.absorber\.material/),
  study("coherent film of 10 mm", (d) => (d.stack.front.films[0].thicknessNm = 1e7), /stack\.front\.films\[0\]\.thicknessNm: expected .*5000/),
  study("film thickness zero", (d) => (d.stack.front.films[0].thicknessNm = 0), /stack\.front\.films\[0\]\.thicknessNm: expected/),
  study("film material unknown", (d) => (d.stack.front.films[0].material = "SiNz"), /stack\.front\.films\[0\]\.material/),
  study("film without thickness", (d) => delete d.stack.front.films[0].thicknessNm, /stack\.front\.films\[0\].*thicknessNm/),
  study("a metal as the incidence medium", (d) => (d.stack.incidence = "Ag"), /stack\.incidence: .*transparent/),
  study("incidence medium unknown", (d) => (d.stack.incidence = "vacuum2"), /stack\.incidence/),
  study("thick layer of 1e-3 µm", (d) => (d.stack.layers = [{ material: "glass", thicknessUm: 1e-3 }]), /stack\.layers\[0\]\.thicknessUm: expected/),
  study("texture type unknown", (d) => (d.stack.front.texture = { type: "pyramid" }), /stack\.front\.texture\.type/),
  study("pyramid base zero", (d) => (d.stack.front.texture.baseUm = 0), /stack\.front\.texture\.baseUm: expected/),
  study("pyramid facet angle 95°", (d) => (d.stack.front.texture.facetAngleDeg = 95), /stack\.front\.texture\.facetAngleDeg: expected/),
  study("rear reflectance 1.5", (d) => (d.stack.rear.ideal.reflectance = 1.5), /stack\.rear\.ideal\.reflectance: expected/),
  study("rear kind unknown", (d) => (d.stack.rear.ideal.kind = "mirorr"), /stack\.rear\.ideal\.kind: expected/),
  study("grid θ = 90°", (d) => (d.grid.thetaDeg = [0, 90]), /grid\.thetaDeg\[1\]: expected/),
  study("grid θ negative", (d) => (d.grid.thetaDeg = [-10, 0]), /grid\.thetaDeg\[0\]: expected/),
  study("grid θ unsorted", (d) => (d.grid.thetaDeg = [60, 0]), /grid\.thetaDeg\[1\]: expected .*increasing/),
  study("grid θ empty", (d) => (d.grid.thetaDeg = []), /grid\.thetaDeg: expected/),
  study("grid λ range step 0", (d) => (d.grid.wavelengthNm = { from: 400, to: 800, step: 0 }), /grid\.wavelengthNm\.step: expected/),
  study("grid λ range of 10⁶ points", (d) => (d.grid.wavelengthNm = { from: 400, to: 1000, step: 0.0001 }), /grid\.wavelengthNm: .*more than/),
  study("grid λ negative", (d) => (d.grid.wavelengthNm = [-400, 500]), /grid\.wavelengthNm\[0\]: expected/),
  study("grid λ outside the material tables", (d) => (d.grid.wavelengthNm = [100, 200]), /100 nm|wavelength/),
  study("grid φ as text", (d) => (d.grid.phiDeg = "all"), /grid\.phiDeg: expected/),
  study("rays.perPoint 1e12", (d) => (d.rays.perPoint = 1e12), /rays\.perPoint: expected .*1000000000/),
  study("rays.perPoint zero", (d) => (d.rays.perPoint = 0), /rays\.perPoint: expected/),
  study("rays.sampling unknown", (d) => (d.rays.sampling = "lattice"), /rays\.sampling/),
  study("rays.sampling sobol with 2 batches", (d) => (d.rays.sampling = "sobol"), /rays\.perPoint: Sobol' sampling .* at least 8 batches per point/),
  study("rays.batch 1e9", (d) => (d.rays.batch = 1e9), /rays\.batch: expected .*10000000/),
  study("rays.batch fractional", (d) => (d.rays.batch = 40.5), /rays\.batch: expected/),
  study("study of 10¹⁴ rays", (d) => { d.rays.perPoint = 1e9; d.grid.wavelengthNm = { from: 300, to: 1200, step: 0.1 }; d.grid.thetaDeg = { from: 0, to: 85, step: 5 }; }, /rays\.perPoint: .*rays, more than/),
  study("target error 0.7", (d) => (d.rays = { targetStdErr: 0.7, channels: ["A_absorber"], maxPerPoint: 1000, batch: 100 }), /rays\.targetStdErr: expected/),
  study("target channel unknown", (d) => (d.rays = { targetStdErr: 0.01, channels: ["A_absorbr"], maxPerPoint: 1000, batch: 100 }), /rays\.channels\[0\].*A_absorbr/),
  study("minPerPoint above maxPerPoint", (d) => (d.rays = { targetStdErr: 0.01, channels: ["A_absorber"], maxPerPoint: 1000, minPerPoint: 5000, batch: 100 }), /rays\.minPerPoint: expected at most maxPerPoint/),
  study("sweep path unknown", (d) => (d.sweep = { "absorber.thicknesUm": [100, 200] }), /sweep.*absorber\.thicknesUm/),
  study("sweep value absurd", (d) => (d.sweep = { "absorber.thicknessUm": [180, 1e12] }), /stack\.absorber\.thicknessUm: expected .*sweep combination/),
  study("sweep list empty", (d) => (d.sweep = { "absorber.thicknessUm": [] }), /sweep.*absorber\.thicknessUm.*expected/),
  study("spectrum unknown", (d) => (d.spectrum = "AM1.0"), /spectrum: expected/),
  study("spectrum CSV missing", (d) => (d.spectrum = { csv: "nope.csv" }), /spectrum\.csv: cannot read .*nope\.csv: no such file/),
  study("spectrum CSV is /etc/passwd", (d) => (d.spectrum = { csv: "/etc/passwd" }), /spectrum\.csv: cannot read \/etc\/passwd: expected a data table ending in \.csv/),
  study("material entry duplicated", (d) => (d.materials = [{ name: "M1", constant: { n: 1.5, k: 0 } }, { name: "M1", constant: { n: 1.6, k: 0 } }]), /materials\[1\]: material "M1" is defined twice/),
  study("material with two kinds", (d) => (d.materials = [{ name: "M1", constant: { n: 1.5, k: 0 }, cauchy: { A: 1.5 } }]), /materials\[0\]/),
  study("material name with a slash", (d) => (d.materials = [{ name: "../M", constant: { n: 1.5, k: 0 } }]), /materials\[0\]\.name: expected/),
  studyText("a duplicate JSON key", (t) => t.replace('"seed": 11', '"seed": 11,\n  "seed": 12'), /line \d+, column \d+: key "seed" appears twice in \(top level\)/),
  studyText("a duplicate key inside the stack", (t) => t.replace('"thicknessUm": 180', '"thicknessUm": 180, "thicknessUm": 160'), /line \d+, column \d+: key "thicknessUm" appears twice in stack\.absorber/),
  studyText("a missing value", (t) => t.replace('"seed": 11', '"seed": '), /not valid JSON: line \d+, column \d+ \(unexpected/),
  studyText("a trailing comma", (t) => t.replace('"seed": 11', '"seed": 11,'), /not valid JSON: line \d+, column \d+/),
  studyText("cut in half", (t) => t.slice(0, Math.floor(t.length / 2)), /not valid JSON: line \d+, column \d+ \(unexpected end/),
  studyText("single quotes", (t) => t.replace('"tiny"', "'tiny'"), /not valid JSON: line \d+, column \d+ \(unexpected character "'"/),
  studyText("empty file", () => "", /not valid JSON: line 1, column 1/),
  studyText("a JSON list instead of an object", () => "[1, 2]", /expected/),
];

// ---- user n,k tables and height maps (named by a study) -------------------------------------
function nk(name: string, text: string, says: RegExp, fileName = "my.csv"): Case {
  return {
    kind: "n,k", name, says, file: fileName,
    setup: (dir) => {
      write(dir, fileName, text);
      const d = structuredClone(tinyDoc()) as Json;
      d.materials = [{ name: "MyGlass", csv: fileName }];
      return ["check", json(dir, "s.study.json", d)];
    },
  };
}
const N_K_CASES: Case[] = [
  nk("k = 1e300", NK.replace("800,1.45,0", "800,1.45,1e300"), /:3: k = 1e\+300; expected 0 ≤ k ≤ 1000/),
  nk("n negative", NK.replace("800,1.45", "800,-1.45"), /:3: n = -1\.45; expected 0 < n/),
  nk("n zero", NK.replace("800,1.45", "800,0"), /:3: n = 0; expected 0 < n/),
  nk("k negative", NK.replace("800,1.45,0", "800,1.45,-0.1"), /:3: k = -0\.1; expected 0 ≤ k/),
  nk("wavelengths decreasing", NK.replace("800,", "300,"), /:3: wavelength_nm 300 is not greater than 400/),
  nk("a word in a cell", NK.replace("800,1.45,0", "800,abc,0"), /:3: column "n": "abc" is not a number/),
  nk("a missing cell", NK.replace("800,1.45,0", "800,1.45"), /:3: row has 2 fields/),
  nk("unknown header", NK.replace("wavelength_nm", "lambda"), /first header column is "lambda"; expected wavelength_nm/),
  nk("one data row", "wavelength_nm,n,k\n400,1.5,0\n", /needs at least 2 data rows/),
  nk("header only", "wavelength_nm,n,k\n", /needs at least 2 data rows/),
  nk("a binary file with another ending", "\u0000\u0001\u0002", /cannot read .*my\.bin: expected a data table ending in/, "my.bin"),
  nk("an unclosed quote", 'wavelength_nm,n,k\n400,"1.5,0\n', /my\.csv:\d+: not readable as CSV/),
];
function heightMap(name: string, text: string, says: RegExp, pitchUm: unknown = 1): Case {
  return {
    kind: "height map", name, says, file: pitchUm === 1 ? "h.csv" : "s.study.json",
    setup: (dir) => {
      write(dir, "h.csv", text);
      const d = structuredClone(tinyDoc()) as Json;
      d.stack.front.texture = { type: "height-map", csv: "h.csv", pitchUm };
      return ["check", json(dir, "s.study.json", d)];
    },
  };
}
const HEIGHT_MAP_CASES: Case[] = [
  heightMap("a word in a cell", HEIGHTS.replace("1,2,1", "1,x,1"), /h\.csv: line 2, column 2: expected a number/),
  heightMap("ragged rows", HEIGHTS.replace("1,2,1", "1,2"), /h\.csv: line 2: expected 3 cells/),
  heightMap("one row", "0,1,0\n", /h\.csv.*(rows|at least)/),
  heightMap("empty", "", /h\.csv/),
  heightMap("NaN height", HEIGHTS.replace("1,2,1", "1,NaN,1"), /h\.csv: line 2, column 2: expected a number/),
  heightMap("height 1e300", HEIGHTS.replace("1,2,1", "1,1e300,1"), /h\.csv: line 2, column 2: expected a height within/),
  heightMap("pitch zero", HEIGHTS, /stack\.front\.texture\.pitchUm: expected/, 0),
  heightMap("pitch as text", HEIGHTS, /stack\.front\.texture\.pitchUm: expected/, "1"),
];

// ---- site files (`lightfold weather --site … --out`) -----------------------------------------
function site(name: string, edit: (s: Json) => void, says: RegExp): Case {
  return {
    kind: "site", name, says, file: "x.site.json",
    setup: (dir) => {
      const s = structuredClone(SITE) as Json;
      edit(s);
      return ["weather", "--site", json(dir, "x.site.json", s), "--out", join(dir, "w.csv")];
    },
  };
}
const SITE_CASES: Case[] = [
  site("latitude 95°", (s) => (s.latitudeDeg = 95), /latitudeDeg/),
  site("latitude missing", (s) => delete s.latitudeDeg, /latitudeDeg/),
  site("longitude 200°", (s) => (s.longitudeDeg = 200), /longitudeDeg/),
  site("longitude as text", (s) => (s.longitudeDeg = "7E"), /longitudeDeg/),
  site("elevation 100 km", (s) => (s.elevationM = 1e5), /elevationM/),
  site("UTC offset +15 h", (s) => (s.utcOffsetHours = 15), /utcOffsetHours/),
  site("UTC offset unreadable", (s) => (s.utcOffsetHours = "CET"), /utcOffsetHours/),
  site("albedo 1.5", (s) => (s.albedo = 1.5), /albedo/),
  site("albedo with 11 months", (s) => (s.albedo = new Array(11).fill(0.2)), /albedo/),
  site("clearness above 1", (s) => (s.monthlyClearness = new Array(12).fill(1.2)), /monthlyClearness/),
  site("name with an ESC sequence", (s) => (s.name = "x\u001b]0;owned\u0007"), /name: expected .*without control characters/),
  site("name empty", (s) => (s.name = " "), /name: expected/),
  site("unknown field", (s) => (s.latitude = 45), /latitude/),
];

// ---- weather files (`lightfold weather --site s --check w.csv`) -----------------------------
function weather(name: string, text: () => string, says: RegExp): Case {
  return {
    kind: "weather", name, says, file: "w.csv",
    setup: (dir) => ["weather", "--site", json(dir, "x.site.json", SITE), "--check", write(dir, "w.csv", text())],
  };
}
const rows = (...r: string[]): string => [WEATHER_HEAD, ...r].join("\n") + "\n";
const yearEdited = (edit: (cells: string[]) => string[] | undefined): string =>
  weatherYear.split("\n").map((l) => (/^\d{4}-/.test(l) ? (edit(l.split(",")) ?? l.split(",")).join(",") : l)).join("\n");
const WEATHER_CASES: Case[] = [
  weather("header misspelt", () => "time,ghi,dni,dhi\n2027-01-01T00:00+01:00,0,0,0\n", /line 1: header must be/),
  weather("a word for GHI", () => rows("2027-01-01T00:00+01:00,abc,0,0"), /line 2: ghi_wm2 "abc" is not a number/),
  weather("negative DNI", () => rows("2027-01-01T00:00+01:00,0,-5,0"), /line 2: dni_wm2 -5 is negative/),
  weather("DHI above GHI", () => rows("2027-01-01T12:00+01:00,100,0,150"), /line 2: dhi_wm2 150 exceeds ghi_wm2 100/),
  weather("time without offset", () => rows("2027-01-01T00:00,0,0,0"), /line 2: time .*offset/),
  weather("February 30", () => rows("2027-02-30T00:00+01:00,0,0,0"), /line 2: time/),
  weather("a duplicated hour", () => rows("2027-01-01T00:00+01:00,0,0,0", "2027-01-01T00:00+01:00,0,0,0"), /line 3 .*duplicated hour/),
  weather("a missing hour", () => rows("2027-01-01T00:00+01:00,0,0,0", "2027-01-01T02:00+01:00,0,0,0"), /line 3 .*1 missing hour/),
  weather("time going backwards", () => rows("2027-01-01T01:00+01:00,0,0,0", "2027-01-01T00:00+01:00,0,0,0"), /line 3 .*backwards/),
  weather("half-hour records", () => rows("2027-01-01T00:00+01:00,0,0,0", "2027-01-01T00:30+01:00,0,0,0"), /line 3 .*not a whole number of hours/),
  weather("too few fields", () => rows("2027-01-01T00:00+01:00,0,0"), /line 2: expected 4 fields, got 3/),
  weather("albedo 2", () => "time,ghi_wm2,dni_wm2,dhi_wm2,albedo\n2027-01-01T00:00+01:00,0,0,0,2\n", /line 2: albedo 2 is above 1/),
  weather("no data rows", () => `${WEATHER_HEAD}\n`, /no data rows/),
  weather("GHI = 10⁶ in one hour", () => yearEdited((c) => (c[0]!.startsWith("2027-06-15T12") ? [c[0]!, "1000000", "1000000", "100000"] : undefined)), /line \d+ \(2027-06-15T11:00Z\): ghi_wm2 1000000 is outside the physically possible range/),
  weather("DNI above the extraterrestrial", () => yearEdited((c) => (c[0]!.startsWith("2027-03-01T12") ? [c[0]!, c[1]!, "1500", c[3]!] : undefined)), /line \d+ \(2027-03-01T11:00Z\): dni_wm2 1500 is outside the physically possible range/),
  weather("a whole year in kJ/m²", () => yearEdited((c) => [c[0]!, ...c.slice(1, 4).map((v) => String(Number(v) * 3.6))]), /look like kJ\/m² per hour/),
  weather("a whole year in kW/m²", () => yearEdited((c) => [c[0]!, ...c.slice(1, 4).map((v) => String(Number(v) / 1000))]), /look like kW\/m²/),
  weather("one bad line in a year (no false missing hour)", () => yearEdited((c) => (c[0]!.startsWith("2027-05-05T10") ? [c[0]!, "x", c[2]!, c[3]!] : undefined)), /1 problem\(s\) in the weather file:\n {2}line \d+: ghi_wm2 "x" is not a number\nhint: /),
  weather("an unclosed quote", () => rows('"2027-01-01T00:00+01:00,0,0,0'), /w\.csv:\d+: not readable as CSV/),
];

// ---- response matrices (`lightfold export m.json --format csv --out …`) ----------------------
function matrix(name: string, edit: (m: Json) => void, says: RegExp): Case {
  return {
    kind: "matrix", name, says, file: "m.json",
    setup: (dir) => {
      const m = JSON.parse(matrixText) as Json;
      edit(m);
      return ["export", json(dir, "m.json", m), "--format", "csv", "--out", join(dir, "m.csv")];
    },
  };
}
const MATRIX_CASES: Case[] = [
  matrix("format of another file", (m) => (m.format = "lightfold.shard"), /not a lightfold response matrix/),
  matrix("newer format version", (m) => (m.formatVersion = 99), /format version 99 is newer/),
  matrix("a string in mean", (m) => (m.mean[3] = "0.5"), /mean\[3\]: expected a finite number/),
  matrix("a null in stderr", (m) => (m.stderr[0] = null), /stderr\[0\]: expected a finite number/),
  matrix("a negative mean", (m) => { m.mean[1] += m.mean[0] + 0.1; m.mean[0] = -0.1; }, /mean\[0\]: expected a finite number in \[0, /),
  matrix("1e308 in mean", (m) => (m.mean[1] = 1e308), /mean\[1\]: expected a finite number in \[0, /),
  matrix("a negative stderr", (m) => (m.stderr[2] = -1e-3), /stderr\[2\]: expected a finite number in \[0, 1\]/),
  matrix("channels not summing to 1", (m) => (m.mean[0] = Math.min(1, m.mean[0] + 0.05)), /mean: expected the channels of each point to sum to 1/),
  matrix("duplicate channel names", (m) => (m.channels = ["R", "R"]), /channels\[1\]: expected distinct names/),
  matrix("empty channel name", (m) => (m.channels = ["R", ""]), /channels\[1\]: expected a non-empty name/),
  matrix("unsorted θ", (m) => { const t = m.thetaDeg; [t[0], t[1]] = [t[1], t[0]]; }, /thetaDeg\[1\]: expected values in increasing order/),
  matrix("θ = 95°", (m) => (m.thetaDeg[m.thetaDeg.length - 1] = 95), /thetaDeg\[\d+\]: expected a finite number in \[0, 90\]/),
  matrix("unsorted λ", (m) => { const l = m.wavelengthNm; [l[0], l[1]] = [l[1], l[0]]; }, /wavelengthNm\[1\]: expected values in increasing order/),
  matrix("φ mode unknown", (m) => (m.phiMode = "sideways"), /phiMode: expected one of/),
  matrix("nRays fractional", (m) => (m.nRays[0] = 10.5), /nRays\[0\]: expected an integer/),
  matrix("nRays zero in a complete matrix", (m) => (m.nRays[0] = 0), /nRays\[0\]: expected a traced point/),
  matrix("mean too short", (m) => m.mean.pop(), /mean: expected a list of \d+ numbers, got \d+/),
  matrix("pathRatio negative", (m) => (m.pathRatio[0] = -1), /pathRatio\[0\]: expected a finite number in \[0, /),
  matrix("combo value as text", (m) => (m.combo = { "absorber.thicknessUm": "180" }), /combo\.absorber\.thicknessUm: expected a finite number/),
  matrix("channels not a list", (m) => (m.channels = "R,A_absorber"), /channels: expected a non-empty list of names/),
  matrix("not an object", (m) => { for (const k of Object.keys(m)) delete m[k]; m.format = []; }, /not a lightfold response matrix/),
];

// ---- shard outputs (`lightfold merge run --out run/merged`) ----------------------------------
function shard(name: string, edit: (s: Json) => void, says: RegExp): Case {
  const file = join("run", "shards", "shard-1-of-2", "partial.json");
  return {
    kind: "shard", name, says, file,
    setup: (dir) => {
      cpSync(shardRun, join(dir, "run"), { recursive: true });
      const s = JSON.parse(readFileSync(join(dir, file), "utf8")) as Json;
      edit(s);
      json(dir, file, s);
      return ["merge", join(dir, "run"), "--out", join(dir, "run", "merged")];
    },
  };
}
const SHARD_CASES: Case[] = [
  shard("label climbing out of --out", (s) => (s.plan.combos[0].label = "../../X"), /plan\.combos\[0\]\.label: expected a plain folder name/),
  shard("absolute label", (s) => (s.plan.combos[0].label = "/tmp/X"), /plan\.combos\[0\]\.label: expected a plain folder name/),
  shard("label of a hidden folder", (s) => (s.plan.combos[0].label = ".x"), /plan\.combos\[0\]\.label: expected a plain folder name/),
  shard("a mean raised by 100 rays", (s) => (s.tallies[0][4] += 100), /tallies\[0\]: expected a sound tally of point 0; channels sum to/),
  // Tiny study tally: [sum, sumSq] × 8 channels (R_first, R_escape, A_film, A_absorber, A_rear, T_first,
  // T_escape, unresolved), nRays at 16, path sums at 17–18, events at 19, then the 86-entry trapping block.
  shard("a ray count ×4", (s) => (s.tallies[1][16] *= 4), /tallies\[1\]: expected a sound tally of point 2; 520 rays, expected the plan's 130/),
  shard("a tally entry as text", (s) => (s.tallies[0][0] = "0"), /tallies\[0\]\[0\]: expected a finite number/),
  // 8 channels: 2·8 + 4 tracer entries, the 86-entry light-trapping block, 16 pairing groups of 8 + 1 (src/sweep/tally.ts) = 250.
  shard("a tally too short", (s) => s.tallies[0].pop(), /tallies\[0\]: expected a list of 282 numbers, got 281/),
  shard("sum of squares above the sum", (s) => (s.tallies[0][7] = s.tallies[0][6] * 2), /tallies\[0\]: expected a sound tally of point 0; channel 3: sum of squares/),
  shard("a negative path sum", (s) => (s.tallies[0][17] = -1), /tallies\[0\]: expected a sound tally of point 0; tally entry 17 is negative/),
  shard("a point outside the plan", (s) => (s.points[1] = 999), /points\[1\]: expected an integer in \[0, 5\], got 999/),
  shard("points out of order", (s) => s.points.reverse(), /points\[1\]: expected values in increasing order/),
  shard("tallies and points of different lengths", (s) => s.tallies.pop(), /tallies: expected a list of 3 tallies/),
  shard("shard number beyond the split", (s) => (s.shard.index = 3), /shard\.index: expected an integer in \[1, 2\], got 3/),
  shard("grid θ of 90°", (s) => (s.plan.grid.thetaDeg = [0, 90]), /plan\.grid\.thetaDeg: expected angles below 90°/),
  shard("rays per point as text", (s) => (s.plan.rays.perPoint = "130"), /plan\.rays\.perPoint: expected an integer/),
  shard("another format", (s) => (s.format = "lightfold.run"), /not a lightfold shard output/),
  shard("duplicate combination labels", (s) => (s.plan.combos = [s.plan.combos[0], s.plan.combos[0]]), /plan\.combos\[1\]\.label: expected distinct labels/),
];

// ---- flags -------------------------------------------------------------------------------------
function flag(name: string, args: (dir: string) => string[], says: RegExp): Case {
  return { kind: "flag", name, says, setup: args };
}
const withStudy = (dir: string): string => json(dir, "s.study.json", tinyDoc());
const withSite = (dir: string): string => json(dir, "x.site.json", SITE);
const withMatrix = (dir: string): string => write(dir, "m.json", matrixText);
const FLAG_CASES: Case[] = [
  flag("sweep --workers 1e3", (d) => ["sweep", withStudy(d), "--out", join(d, "o"), "--workers", "1e3"], /--workers: expected a whole number from 1 to 256/),
  flag("sweep --workers 0x2", (d) => ["sweep", withStudy(d), "--out", join(d, "o"), "--workers", "0x2"], /--workers: expected a whole number .*"0x2"/),
  flag("sweep --workers 0", (d) => ["sweep", withStudy(d), "--out", join(d, "o"), "--workers", "0"], /--workers: expected a whole number from 1/),
  flag("sweep --workers 1000", (d) => ["sweep", withStudy(d), "--out", join(d, "o"), "--workers", "1000"], /--workers: expected a whole number from 1 to 256/),
  flag("sweep --shard 3/2", (d) => ["sweep", withStudy(d), "--out", join(d, "o"), "--shard", "3/2"], /--shard: expected 1 ≤ K ≤ N, got 3\/2/),
  flag("sweep --shard half", (d) => ["sweep", withStudy(d), "--out", join(d, "o"), "--shard", "half"], /--shard: expected K\/N/),
  flag("sweep --target-error 0.7", (d) => ["sweep", withStudy(d), "--out", join(d, "o"), "--target-error", "0.7"], /--target-error: expected a standard error in \(0, 0\.5\)/),
  flag("sweep --max-rays without --target-error", (d) => ["sweep", withStudy(d), "--out", join(d, "o"), "--max-rays", "1000"], /--channels and --max-rays go with --target-error/),
  flag("sweep --resume --fresh", (d) => ["sweep", withStudy(d), "--out", join(d, "o"), "--resume", "--fresh"], /--resume and --fresh exclude each other/),
  flag("sweep --out onto a file", (d) => ["sweep", withStudy(d), "--out", write(d, "afile", "x")], /afile: the output folder is a file/),
  flag("sweep of a missing study", (d) => ["sweep", join(d, "none.study.json"), "--out", join(d, "o")], /cannot read study file .*none\.study\.json/),
  flag("converge --steps 1000", (d) => ["converge", withStudy(d), "--wavelength", "600", "--steps", "1000"], /--steps: expected a whole number from 2 to 20/),
  flag("converge --start 1e5 --steps 20", (d) => ["converge", withStudy(d), "--wavelength", "600", "--steps", "20", "--start", "100000"], /the run would trace .* rays .* more than the limit/),
  flag("converge --replicas 0", (d) => ["converge", withStudy(d), "--wavelength", "600", "--replicas", "0"], /--replicas: expected a whole number from 1/),
  flag("sweep --sampling sobol with 4 batches", (d) => ["sweep", withStudy(d), "--out", join(d, "o"), "--sampling", "sobol"], /--sampling sobol: rays\.perPoint: Sobol' sampling .* at least 8 batches/),
  flag("sweep --sampling qmc", (d) => ["sweep", withStudy(d), "--out", join(d, "o"), "--sampling", "qmc"], /--sampling: expected "random" or "sobol", got "qmc"/),
  flag("converge --sampling halton", (d) => ["converge", withStudy(d), "--wavelength", "600", "--sampling", "halton"], /--sampling: expected "random" or "sobol", got "halton"/),
  flag("converge --sampling sobol --start 8", (d) => ["converge", withStudy(d), "--wavelength", "600", "--sampling", "sobol", "--start", "8"], /--start 8: Sobol' sampling .* at least 16 rays per run/),
  flag("trace --sampling sobol --rays 10", (d) => ["trace", withStudy(d), "--sampling", "sobol", "--rays", "10"], /--rays 10: Sobol' sampling .* at least 16 rays/),
  flag("converge --angle 95", (d) => ["converge", withStudy(d), "--wavelength", "600", "--angle", "95"], /--angle: expected an angle in \[0, 90\)/),
  flag("yield --tilt 0:90:-5", (d) => ["yield", "--matrix", withMatrix(d), "--site", withSite(d), "--tilt", "0:90:-5"], /--tilt "0:90:-5": a range is from:to:step with step > 0/),
  flag("yield --tilt 200", (d) => ["yield", "--matrix", withMatrix(d), "--site", withSite(d), "--tilt", "200"], /--tilt: 200° is outside/),
  flag("yield --tilt 0:90", (d) => ["yield", "--matrix", withMatrix(d), "--site", withSite(d), "--tilt", "0:90"], /--tilt "0:90": "0:90" is not a number/),
  flag("yield --sky unknown", (d) => ["yield", "--matrix", withMatrix(d), "--site", withSite(d), "--sky", "cloudy"], /--sky/),
  flag("yield --seed -1", (d) => ["yield", "--matrix", withMatrix(d), "--site", withSite(d), "--seed", "-1"], /--seed: expected a whole number from 0/),
  flag("weather --seed -3", (d) => ["weather", "--site", withSite(d), "--seed", "-3", "--out", join(d, "w.csv")], /--seed: expected a whole number from 0/),
  flag("weather --year 1e4", (d) => ["weather", "--site", withSite(d), "--year", "1e4", "--out", join(d, "w.csv")], /--year: expected a whole number from 1900 to 2200/),
  flag("export --format xls", (d) => ["export", withMatrix(d), "--format", "xls", "--out", join(d, "m.xls")], /--format/),
  flag("slurm-script --extra-sbatch --arr=1-9", (d) => ["slurm-script", withStudy(d), "--shards", "4", "--time", "01:00:00", "--mem", "4G", "--out-dir", join(d, "o"), "--extra-sbatch", "--arr=1-9"], /"--arr=1-9" is set by the generated scripts/),
  flag("slurm-script --extra-sbatch --dep=afterok:1", (d) => ["slurm-script", withStudy(d), "--shards", "4", "--time", "01:00:00", "--mem", "4G", "--out-dir", join(d, "o"), "--extra-sbatch", "--dep=afterok:1"], /"--dep=afterok:1" is set by the generated scripts/),
  flag("slurm-script --extra-sbatch -a1-100", (d) => ["slurm-script", withStudy(d), "--shards", "4", "--time", "01:00:00", "--mem", "4G", "--out-dir", join(d, "o"), "--extra-sbatch", "-a1-100"], /"-a1-100" is set by the generated scripts/),
  flag("slurm-script --extra-sbatch -o/tmp/x", (d) => ["slurm-script", withStudy(d), "--shards", "4", "--time", "01:00:00", "--mem", "4G", "--out-dir", join(d, "o"), "--extra-sbatch", "-o/tmp/x"], /"-o\/tmp\/x" is set by the generated scripts/),
  flag("slurm-script --extra-sbatch -Qe/tmp/x", (d) => ["slurm-script", withStudy(d), "--shards", "4", "--time", "01:00:00", "--mem", "4G", "--out-dir", join(d, "o"), "--extra-sbatch", "-Qe/tmp/x"], /"-Qe\/tmp\/x" is set by the generated scripts/),
  flag("slurm-script --shards 0", (d) => ["slurm-script", withStudy(d), "--shards", "0", "--time", "01:00:00", "--mem", "4G", "--out-dir", join(d, "o")], /--shards/),
  flag("merge of a folder without shards", (d) => ["merge", d, "--out", join(d, "merged")], /not a run directory with shards/),
  flag("an unknown verb option", (d) => ["check", withStudy(d), "--fast"], /unknown option '--fast'/),
];

const CASES: Case[] = [...STUDY_CASES, ...N_K_CASES, ...HEIGHT_MAP_CASES, ...SITE_CASES, ...WEATHER_CASES, ...MATRIX_CASES, ...SHARD_CASES, ...FLAG_CASES];

/** Every path under dir (files and folders, hidden ones too), relative, sorted. */
function listing(dir: string): string[] {
  const out: string[] = [];
  const visit = (d: string): void => {
    for (const e of readdirSync(d, { withFileTypes: true })) {
      out.push(relative(dir, join(d, e.name)));
      if (e.isDirectory()) visit(join(d, e.name));
    }
  };
  visit(dir);
  return out.sort();
}

let root = "";
beforeAll(async () => {
  root = mkdtempSync(join(tmpdir(), "lf-corpus-"));
  const site = siteFromObject(SITE, "corpus.site.json");
  weatherYear = weatherToCsv(syntheticWeather(site, 2027, 3), 1, "+01:00", ["corpus"]);
  const m = makeMatrix({ thetaDeg: range(0, 85, 5), wavelengthNm: [400, 600, 800, 1000], absorber: (t) => 0.9 * Math.cos((t * Math.PI) / 200), stderr: 0.002 });
  matrixText = matrixToJson(m);
  writeResponseMatrix(join(root, "ok.matrix.json"), m);
  shardRun = join(root, "shard-run");
  for (const index of [1, 2]) await runSweep({ study: tinyStudy(), outDir: shardRun, workers: 1, shard: { index, count: 2 } });
});

describe("bad-input corpus: exit 2, the file and field or line named with what was expected, nothing written", () => {
  it(`holds at least 150 cases over every kind of input (${CASES.length})`, () => {
    expect(CASES.length).toBeGreaterThanOrEqual(150);
    const kinds = new Map<string, number>();
    for (const c of CASES) kinds.set(c.kind, (kinds.get(c.kind) ?? 0) + 1);
    expect([...kinds.keys()].sort()).toEqual(["flag", "height map", "matrix", "n,k", "shard", "site", "study", "weather"]);
    expect(new Set(CASES.map((c) => `${c.kind}: ${c.name}`)).size).toBe(CASES.length);
  });

  it.each(CASES.map((c) => [`${c.kind}: ${c.name}`, c] as const))("%s", async (_label, c) => {
    const dir = join(root, `case-${CASES.indexOf(c)}`);
    mkdirSync(dir);
    const args = c.setup(dir);
    const before = listing(dir);
    const r = await runMain(...args);
    expect(r.code, r.err).toBe(2);
    expect(r.out).toBe("");
    expect(r.err).toMatch(c.says);
    if (c.file !== undefined) expect(r.err).toContain(c.file);
    expect(r.err).toMatch(/\nhint: /);
    // Nothing written, nothing left behind (no output, no lock, no journal, no temporary file).
    expect(listing(dir)).toEqual(before);
  });
});
