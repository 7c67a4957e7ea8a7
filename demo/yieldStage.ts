/**
 * Demo step 4: a synthetic year for an invented site, yield of each stack at two tilts and over a tilt
 * sweep, and the texture-benefit table; written as yield/*.json for the report.
 */
import { join } from "node:path";
import type { ResponseMatrix } from "../src/response/responseMatrix.js";
import { readSiteFile } from "../src/site/siteFile.js";
import { writeFileAtomic } from "../src/util/atomicWrite.js";
import { toolVersion } from "../src/util/version.js";
import { syntheticWeather } from "../src/weather/synthetic.js";
import { pairedDeltaStdErr, textureBenefit } from "../src/yield/compare.js";
import { pairedMoments } from "../src/response/pairedMoments.js";
import { g173SpectralWeights } from "../src/yield/spectralTables.js";
import { yearContext } from "../src/yield/yearContext.js";
import { compareJson, formatCompareTable, matrixInfo, siteInfo, weatherInfo, yieldJson, type CompareRow } from "../src/yield/yieldJson.js";
import { bestPlane, planeList, prepareMatrix, yieldSweep } from "../src/yield/yieldRun.js";

export interface DemoYieldInput {
  sitePath: string;
  year: number;
  seed: number;
  tiltsDeg: number[];
  sweepTiltsDeg: number[];
  /** First = candidate texture (A), second = reference (B). */
  stacks: { label: string; dir: string; matrixPath: string; matrix: ResponseMatrix }[];
}

export interface DemoYieldSummary {
  siteName: string;
  annualAhM2: Map<string, number>;
  bestTiltDeg: Map<string, number>;
  benefitText: string;
  files: string[];
}

const SKY = "perez" as const;
const AZIMUTH_DEG = 180;

function fileSlug(s: string): string {
  return s.toLowerCase().replace(/[^a-z0-9]+/g, "-").replace(/^-+|-+$/g, "") || "site";
}

export function runDemoYield(input: DemoYieldInput): DemoYieldSummary {
  const site = readSiteFile(input.sitePath);
  const ctx = yearContext(site, syntheticWeather(site, input.year, input.seed));
  const few = planeList(input.tiltsDeg, [AZIMUTH_DEG], 0);
  const many = planeList(input.sweepTiltsDeg, [AZIMUTH_DEG], 0);
  const files: string[] = [];
  const annual = new Map<string, number>();
  const bestTilt = new Map<string, number>();
  const fewResults = input.stacks.map((s) => {
    const pm = prepareMatrix(s.matrix, s.matrixPath);
    const info = matrixInfo(s.matrix, s.matrixPath, pm.channel);
    const atTilts = yieldSweep(ctx, pm, few, SKY);
    const sweep = yieldSweep(ctx, pm, many, SKY);
    const best = bestPlane(sweep);
    const name = fileSlug(site.name);
    const a = join(s.dir, "yield", `yield-${name}-tilts.json`);
    const b = join(s.dir, "yield", `yield-${name}-tilt-sweep.json`);
    writeFileAtomic(a, JSON.stringify(yieldJson({ toolVersion: toolVersion(), matrix: info, site, ctx, skyModel: SKY, results: atTilts }), null, 2) + "\n");
    writeFileAtomic(b, JSON.stringify(yieldJson({ toolVersion: toolVersion(), matrix: info, site, ctx, skyModel: SKY, results: sweep, best }), null, 2) + "\n");
    files.push(a, b);
    atTilts.forEach((y) => annual.set(`${s.label}@${y.plane.tiltDeg}`, y.chargeAhM2));
    bestTilt.set(s.label, best.plane.tiltDeg);
    return { info, atTilts };
  });
  // texture benefit of A over B at the two tilts (same weather, sky model and planes)
  const [A, B] = fewResults;
  // Both demo studies share seed, grid and batches: the benefit gets the paired error.
  const moments = pairedMoments(input.stacks[0]!.matrix, input.stacks[1]!.matrix, "A_absorber", [input.stacks[0]!.matrixPath, input.stacks[1]!.matrixPath]);
  const pairingReason = typeof moments === "string" ? moments : undefined;
  const weights = g173SpectralWeights(input.stacks[0]!.matrix.wavelengthNm);
  const rows: CompareRow[] = A!.atTilts.map((ya, k) => {
    const d = typeof moments === "string" ? undefined : pairedDeltaStdErr(ya, B!.atTilts[k]!, weights, moments);
    return { site: site.name, a: ya, b: B!.atTilts[k]!, benefit: textureBenefit(ya, B!.atTilts[k]!, d) };
  });
  const doc = compareJson({
    toolVersion: toolVersion(),
    matrices: fewResults.map((r, i) => ({ label: i === 0 ? "A" : "B", ...r.info })),
    skyModel: SKY,
    sites: [siteInfo(site)],
    weather: [weatherInfo(ctx)],
    rows,
    ...(pairingReason !== undefined ? { pairingReason } : {}),
  });
  const c = join(input.stacks[0]!.dir, "yield", "compare.json");
  writeFileAtomic(c, JSON.stringify(doc, null, 2) + "\n");
  files.push(c);
  return {
    siteName: site.name,
    annualAhM2: annual,
    bestTiltDeg: bestTilt,
    benefitText: formatCompareTable(input.stacks[0]!.label, input.stacks[1]!.label, rows, pairingReason),
    files,
  };
}
