import { makeReport } from "../../report/makeReport.js";
import { join } from "node:path";
import type { Command } from "commander";
import { readResponseMatrix } from "../../response/matrixFile.js";
import { readSiteFile } from "../../site/siteFile.js";
import { writeFileAtomic } from "../../util/atomicWrite.js";
import { InputError } from "../../util/errors.js";
import { toolVersion } from "../../util/version.js";
import { parseAngleList } from "../../yield/angleList.js";
import { textureBenefit } from "../../yield/compare.js";
import { yearContext } from "../../yield/yearContext.js";
import { compareJson, formatCompareTable, matrixInfo, siteInfo, weatherInfo, type CompareRow } from "../../yield/yieldJson.js";
import { planeList, prepareMatrix, yieldSweep } from "../../yield/yieldRun.js";
import { intOption, loadWeather } from "./weather.js";
import { skyModelOption, textureRotationOption } from "./yield.js";

const collect = (value: string, previous: string[] = []): string[] => [...previous, value];

interface CompareOpts {
  matrix: string[]; site: string[]; weather?: string[]; year: string; seed: string; tilt: string; azimuth: string;
  textureRotation: string; sky: string; channel: string; json?: boolean; out?: string; runDir?: string; report?: boolean;
}

/** `lightfold compare --matrix a.json --matrix b.json --site s1 [--site s2] --tilt 20,35` */
export function register(program: Command): void {
  program
    .command("compare")
    .description("texture benefit: yearly absorbed charge of matrix A relative to matrix B, per site and tilt, with Monte Carlo error")
    .requiredOption("--matrix <matrix.json>", "give twice: A (candidate) then B (reference)", collect)
    .requiredOption("--site <site.json>", "site file; repeat for several sites", collect)
    .option("--weather <file.csv|synthetic>", "weather per site, in the order of --site (default: synthetic for all)", collect)
    .option("--year <year>", "year of synthetic weather", "2027")
    .option("--seed <n>", "seed of synthetic weather", "7")
    .option("--tilt <deg|list|from:to:step>", "tilt(s)", "20,35")
    .option("--azimuth <deg|list>", "facing direction(s) from north, clockwise (180 = south)", "180")
    .option("--texture-rotation <deg>", "texture rotation on the module (both matrices)", "0")
    .option("--sky <model>", "diffuse sky model: isotropic, hay-davies, perez", "perez")
    .option("--channel <name>", "response channel that counts as current", "A_absorber")
    .option("--out <file.json>", "write the comparison JSON to this file")
    .option("--no-report", "with --run-dir: do not refresh <dir>/report/index.html")
    .option("--run-dir <dir>", "write the comparison JSON to <dir>/yield/compare.json")
    .option("--json", "print the comparison JSON instead of the table")
    .addHelpText(
      "after",
      `
Examples:
  lightfold compare --matrix runs/pyr/base/matrix.json --matrix runs/planar/base/matrix.json \\
      --site configs/sites/nordvik-fjell.site.json --site configs/sites/tessarit-reg.site.json --tilt 20,35
  lightfold compare --matrix a.json --matrix b.json --site s.json --weather measured.csv --tilt 0:60:10 --run-dir runs/cmp

benefit % = 100 (Q_A/Q_B − 1); its ± is the Monte Carlo standard error propagated linearly from both
matrices' stderr (independent runs). Both use the same weather, sky model and planes.`,
    )
    .action((opts: CompareOpts) => {
      if (opts.matrix.length !== 2) throw new InputError(
          `--matrix: give exactly two matrices (A then B), got ${opts.matrix.length}`,
          "repeat the flag: --matrix candidate.matrix.json --matrix reference.matrix.json",
        );
      const weatherSpecs = opts.weather ?? opts.site.map(() => "synthetic");
      if (weatherSpecs.length !== opts.site.length) {
        throw new InputError(
          `--weather: give one per --site (${opts.site.length}), got ${weatherSpecs.length}`,
          "give --weather once per --site in the same order (synthetic for a generated year), or leave it out for synthetic everywhere",
        );
      }
      const sky = skyModelOption(opts.sky);
      const planes = planeList(
        parseAngleList(opts.tilt, "--tilt", 0, 180, "0 = facing up, 90 = vertical"),
        parseAngleList(opts.azimuth, "--azimuth", 0, 360, "degrees from north, clockwise"),
        textureRotationOption(opts.textureRotation),
      );
      const sites = opts.site.map((s) => readSiteFile(s));
      const matrices = opts.matrix.map((f) => readResponseMatrix(f));
      const prepared = matrices.map((m, i) => prepareMatrix(m, opts.matrix[i]!, opts.channel));
      const year = intOption(opts.year, "--year", 2027), seed = intOption(opts.seed, "--seed", 7);
      const rows: CompareRow[] = [];
      const weatherInfos: Record<string, unknown>[] = [];
      sites.forEach((site, i) => {
        const ctx = yearContext(site, loadWeather(weatherSpecs[i]!, site, year, seed));
        weatherInfos.push(weatherInfo(ctx));
        const a = yieldSweep(ctx, prepared[0]!, planes, sky);
        const b = yieldSweep(ctx, prepared[1]!, planes, sky);
        a.forEach((ya, k) => rows.push({ site: site.name, a: ya, b: b[k]!, benefit: textureBenefit(ya, b[k]!) }));
      });
      const doc = compareJson({
        toolVersion: toolVersion(),
        matrices: matrices.map((m, i) => ({ label: i === 0 ? "A" : "B", ...matrixInfo(m, opts.matrix[i]!, opts.channel) })),
        skyModel: sky,
        sites: sites.map(siteInfo),
        weather: weatherInfos,
        rows,
      });
      const text = JSON.stringify(doc, null, 2) + "\n";
      if (opts.out) writeFileAtomic(opts.out, text);
      if (opts.runDir) writeFileAtomic(join(opts.runDir, "yield", "compare.json"), text);
      const report = opts.runDir && opts.report !== false ? makeReport([opts.runDir]) : undefined;
      if (opts.json) process.stdout.write(text);
      else {
        const label = (i: number): string => `${matrices[i]!.studyName} (${opts.matrix[i]!})`;
        process.stdout.write(formatCompareTable(label(0), label(1), rows));
        if (report) process.stdout.write(`report: ${report.indexPath}\n`);
      }
    });
}
