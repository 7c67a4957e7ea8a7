/**
 * Demo step 5: the invented glass–glass bifacial stack traced from the front and from the rear, its
 * optical bifaciality, and a synthetic year at an invented bright-ground site: front, rear and total
 * charge over tilts and row pitches (and one isolated row), written as yield/bifacial-*.json.
 */
import { join } from "node:path";
import type { ResponseMatrix } from "../src/response/responseMatrix.js";
import { readSiteFile } from "../src/site/siteFile.js";
import { writeFileAtomic } from "../src/util/atomicWrite.js";
import { toolVersion } from "../src/util/version.js";
import { syntheticWeather } from "../src/weather/synthetic.js";
import { bifacialSweep, opticalBifaciality, type BifacialResult } from "../src/yield/bifacialYield.js";
import { bifacialJson, formatBifacialTable } from "../src/yield/bifacialJson.js";
import { yearContext } from "../src/yield/yearContext.js";
import { matrixInfo } from "../src/yield/yieldJson.js";
import { planeList, prepareMatrix } from "../src/yield/yieldRun.js";

export interface DemoBifacialInput {
  sitePath: string;
  dir: string;
  front: ResponseMatrix;
  rear: ResponseMatrix;
  tiltsDeg: number[];
  pitchesM: (number | null)[];
  centreHeightM: number;
  slantLengthM: number;
}

export function runDemoBifacial(input: DemoBifacialInput): { text: string; bifaciality: number; results: BifacialResult[]; file: string } {
  const site = readSiteFile(input.sitePath);
  const ctx = yearContext(site, syntheticWeather(site, 2027, 7));
  const frontPath = join(input.dir, "base", "matrix.json"), rearPath = join(input.dir, "base-rear", "matrix.json");
  const front = prepareMatrix(input.front, frontPath), rear = prepareMatrix(input.rear, rearPath);
  const mount = { slantLengthM: input.slantLengthM, centreHeightM: input.centreHeightM };
  const results = bifacialSweep(ctx, planeList(input.tiltsDeg, [180], 0), input.pitchesM, mount, front, rear, "perez");
  const b = opticalBifaciality(front, rear);
  const doc = bifacialJson({
    toolVersion: toolVersion(), front: matrixInfo(input.front, frontPath, front.channel), rear: matrixInfo(input.rear, rearPath, rear.channel),
    site, ctx, skyModel: "perez", mounting: mount, opticalBifaciality: b, results,
  });
  const file = join(input.dir, "yield", `bifacial-${site.name.toLowerCase().replace(/[^a-z0-9]+/g, "-")}.json`);
  writeFileAtomic(file, JSON.stringify(doc, null, 2) + "\n");
  return { text: formatBifacialTable(site.name, "perez", b, results), bifaciality: b, results, file };
}
