import type { Command } from "commander";
import { addResultOptions, addYearPlaneOptions, writeResult, yearPlaneOf, type ResultFlags, type YearPlaneFlags } from "../yearPlaneOptions.js";
import { readResponseMatrix } from "../../response/matrixFile.js";
import { readSiteFile } from "../../site/siteFile.js";
import { InputError } from "../../util/errors.js";
import { toolVersion } from "../../util/version.js";
import { pairedDeltaStdErr, textureBenefit } from "../../yield/compare.js";
import { yearContext } from "../../yield/yearContext.js";
import { compareJson, formatCompareTable, matrixInfo, siteInfo, weatherInfo, type CompareRow } from "../../yield/yieldJson.js";
import { prepareMatrix, yieldSweep } from "../../yield/yieldRun.js";
import { loadWeather } from "./weather.js";
import { addMountOptions, mountOf, type MountFlags } from "../mountOptions.js";
import type { ResponseMatrix } from "../../response/responseMatrix.js";
import type { Plane, Site } from "../../site/site.js";
import { checkRowGeometry } from "../../sky/rowGeometry.js";
import type { SkyModel } from "../../sky/transposition.js";
import { bifacialSweep } from "../../yield/bifacialYield.js";
import { bifacialCompareJson, formatBifacialCompareTable, type BifacialCompareRow, type PairingNote } from "../../yield/bifacialJson.js";
import { bifacialDifference, type BifacialPairing } from "../../yield/bifacialDifference.js";
import { pairedMoments } from "../../response/pairedMoments.js";
import type { PreparedMatrix } from "../../yield/yieldRun.js";

const collect = (value: string, previous: string[] = []): string[] => [...previous, value];

interface CompareOpts extends YearPlaneFlags, ResultFlags, Omit<MountFlags, "rearMatrix"> {
  matrix: string[]; site: string[]; weather?: string[]; rearMatrix?: string[];
}

/** `lightfold compare --matrix a.json --matrix b.json --site s1 [--site s2] --tilt 20,35` */
export function register(program: Command): void {
  const cmd = program
    .command("compare")
    .description("texture benefit: yearly absorbed charge of matrix A relative to matrix B, per site and tilt, with Monte Carlo error")
    .requiredOption("--matrix <matrix.json>", "give twice: A (candidate) then B (reference)", collect)
    .requiredOption("--site <site.json>", "site file; repeat for several sites", collect)
    .option("--weather <file.csv|synthetic>", "weather per site, in the order of --site (default: synthetic for all)", collect);
  addYearPlaneOptions(cmd, { tilt: "20,35" });
  addMountOptions(cmd, { rearMatrixRepeatable: collect });
  addResultOptions(cmd, "compare.json", "comparison")
    .addHelpText(
      "after",
      `
Examples:
  lightfold compare --matrix runs/pyr/base/matrix.json --matrix runs/planar/base/matrix.json \\
      --site configs/sites/nordvik-fjell.site.json --site configs/sites/tessarit-reg.site.json --tilt 20,35
  lightfold compare --matrix a.json --matrix b.json --site s.json --weather measured.csv --tilt 0:60:10 --run-dir runs/cmp
  lightfold compare --matrix a.json --matrix b.json --rear-matrix a-rear.json --rear-matrix b-rear.json \
      --site configs/sites/saltmere-plain.site.json --tilt 20,30 --pitch 5,8 --height 1.2

benefit % = 100 (Q_A/Q_B − 1); its ± is the Monte Carlo standard error propagated linearly. Two
matrices with pairing groups on one grid (lightfold sweeps with the same seed: common random
numbers; the rays per point may differ) get the paired error of the difference; else the quadrature of both matrices'
errors, and the output says why pairing failed. Both use the same weather, sky model and planes.
With --rear-matrix twice (the rear-lit matrices of A and B): Q is the front + rear yearly charge of
each bifacial stack (as yield --rear-matrix, per tilt and --pitch/--gcr); each row also gives both
stacks' rear charge and bifacial gain, and A − B of the total charge and of the gain. Front A is
paired with front B and rear A with rear B; front and rear light run on separate streams, so their
errors add as independent.`,
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
      const { year, seed, planes, sky } = yearPlaneOf(opts);
      const sites = opts.site.map((s) => readSiteFile(s));
      const matrices = opts.matrix.map((f) => readResponseMatrix(f));
      const prepared = matrices.map((m, i) => prepareMatrix(m, opts.matrix[i]!, opts.channel));
      if (opts.rearMatrix !== undefined) return bifacialCompare(opts, matrices, prepared, weatherSpecs, sites, year, seed, planes, sky);
      const rows: CompareRow[] = [];
      const weatherInfos: Record<string, unknown>[] = [];
      // Paired errors where both matrices carry pairing groups on one grid (common random numbers).
      const moments = pairedMoments(matrices[0]!, matrices[1]!, opts.channel, [opts.matrix[0]!, opts.matrix[1]!]);
      const pairingReason = typeof moments === "string" ? moments : undefined;
      sites.forEach((site, i) => {
        const ctx = yearContext(site, loadWeather(weatherSpecs[i]!, site, year, seed));
        weatherInfos.push(weatherInfo(ctx));
        const a = yieldSweep(ctx, prepared[0]!, planes, sky);
        const b = yieldSweep(ctx, prepared[1]!, planes, sky);
        a.forEach((ya, k) => {
          const d = typeof moments === "string" ? undefined : pairedDeltaStdErr(ya, b[k]!, prepared[0]!.tables.weights, moments);
          rows.push({ site: site.name, a: ya, b: b[k]!, benefit: textureBenefit(ya, b[k]!, d) });
        });
      });
      const doc = compareJson({
        toolVersion: toolVersion(),
        matrices: matrices.map((m, i) => ({ label: i === 0 ? "A" : "B", ...matrixInfo(m, opts.matrix[i]!, opts.channel) })),
        skyModel: sky,
        sites: sites.map(siteInfo),
        weather: weatherInfos,
        rows,
        ...(pairingReason !== undefined ? { pairingReason } : {}),
      });
      const text = JSON.stringify(doc, null, 2) + "\n";
      const report = writeResult(opts, "compare.json", text);
      if (opts.json) process.stdout.write(text);
      else {
        const label = (i: number): string => `${matrices[i]!.studyName} (${opts.matrix[i]!})`;
        process.stdout.write(formatCompareTable(label(0), label(1), rows, pairingReason));
        if (report) process.stdout.write(`report: ${report}\n`);
      }
    });
}

/** `compare --rear-matrix A --rear-matrix B`: benefit of A over B in front + rear yearly charge. */
function bifacialCompare(
  opts: CompareOpts, matrices: ResponseMatrix[], prepared: PreparedMatrix[], weatherSpecs: string[], sites: Site[],
  year: number, seed: number, planes: Plane[], sky: SkyModel,
): void {
  const rearFiles = opts.rearMatrix!;
  if (rearFiles.length !== 2) throw new InputError(`--rear-matrix: give exactly two rear-lit matrices (of A then of B), got ${rearFiles.length}`);
  const mount = mountOf(opts);
  const rears = rearFiles.map((f) => readResponseMatrix(f));
  rears.forEach((m, i) => {
    if (m.lightFrom !== "rear") throw new InputError(`--rear-matrix ${rearFiles[i]}: this matrix was traced with light from the front`, 'sweep the study with "illumination": "both" and pass <label>-rear/matrix.json');
  });
  const rearPrepared = rears.map((m, i) => prepareMatrix(m, rearFiles[i]!, opts.channel));
  const pairing = bifacialPairing(opts, matrices, rears, prepared, rearPrepared);
  for (const p of planes) {
    for (const pitchM of mount.pitchesM) checkRowGeometry({ tiltDeg: p.tiltDeg, slantLengthM: mount.slantLengthM, centreHeightM: mount.centreHeightM, ...(pitchM === null ? {} : { pitchM }) }, "--tilt/--height/--module-width/--pitch");
  }
  const rows: BifacialCompareRow[] = [];
  const weatherInfos: Record<string, unknown>[] = [];
  sites.forEach((site, i) => {
    const ctx = yearContext(site, loadWeather(weatherSpecs[i]!, site, year, seed));
    weatherInfos.push(weatherInfo(ctx));
    const a = bifacialSweep(ctx, planes, mount.pitchesM, mount, prepared[0]!, rearPrepared[0]!, sky);
    const b = bifacialSweep(ctx, planes, mount.pitchesM, mount, prepared[1]!, rearPrepared[1]!, sky);
    a.forEach((ya, k) => rows.push({ site: site.name, a: ya, b: b[k]!, diff: bifacialDifference(ya, b[k]!, typeof pairing === "string" ? undefined : pairing) }));
  });
  const note: PairingNote = typeof pairing === "string" ? { errorKind: "independent", reason: pairing } : { errorKind: "paired" };
  const doc = bifacialCompareJson({
    toolVersion: toolVersion(),
    matrices: matrices.map((m, i) => ({ label: i === 0 ? "A" : "B", ...matrixInfo(m, opts.matrix[i]!, opts.channel), rear: matrixInfo(rears[i]!, rearFiles[i]!, opts.channel) })),
    skyModel: sky, sites: sites.map(siteInfo), weather: weatherInfos, mounting: mount, pairing: note, rows,
  });
  const text = JSON.stringify(doc, null, 2) + "\n";
  const report = writeResult(opts, "compare.json", text);
  if (opts.json) process.stdout.write(text);
  else {
    process.stdout.write(formatBifacialCompareTable(`${matrices[0]!.studyName} (${opts.matrix[0]!})`, `${matrices[1]!.studyName} (${opts.matrix[1]!})`, note, rows));
    if (report) process.stdout.write(`report: ${report}\n`);
  }
}

/**
 * Pairing groups of both faces (front A with front B, rear A with rear B), or why they cannot be
 * paired (then every ± is the quadrature of independent errors, and the output says so).
 */
function bifacialPairing(opts: CompareOpts, fronts: ResponseMatrix[], rears: ResponseMatrix[], prepared: PreparedMatrix[], rearPrepared: PreparedMatrix[]): BifacialPairing | string {
  const front = pairedMoments(fronts[0]!, fronts[1]!, opts.channel, [opts.matrix[0]!, opts.matrix[1]!]);
  if (typeof front === "string") return `front: ${front}`;
  const rear = pairedMoments(rears[0]!, rears[1]!, opts.channel, [opts.rearMatrix![0]!, opts.rearMatrix![1]!]);
  if (typeof rear === "string") return `rear: ${rear}`;
  return { front, rear, frontWeights: prepared[0]!.tables.weights, rearWeights: rearPrepared[0]!.tables.weights };
}
