import type { Command } from "commander";
import { countFlag } from "../countFlag.js";
import { readSiteFile } from "../../site/siteFile.js";
import type { Site } from "../../site/site.js";
import { formatUtcOffset } from "../../site/utcOffset.js";
import { sunTrack } from "../../sky/sunPosition.js";
import { writeFileAtomic } from "../../util/atomicWrite.js";
import { InputError } from "../../util/errors.js";
import { toolVersion } from "../../util/version.js";
import { checkAgainstSun } from "../../weather/sunChecks.js";
import { syntheticWeather, type SyntheticWeather } from "../../weather/synthetic.js";
import { weatherToCsv } from "../../weather/weatherCsv.js";
import { readWeatherInput, siteAndWeather } from "../weatherInput.js";
import { precipitableWaterCm } from "../../weather/precipitableWater.js";
import type { StationMeta } from "../../weather/stationFile.js";
import { epwText, tmy3Text } from "../../weather/stationWrite.js";
import { syntheticMet } from "../../weather/syntheticMet.js";
import type { WeatherYear } from "../../weather/weatherYear.js";

/** Integer flag value; `flag` names it in errors. */
export function intOption(text: string | undefined, flag: string, fallback: number): number {
  if (text === undefined) return fallback;
  // A year of the Gregorian calendar that the weather readers and the sun model cover; a seed as the
  // 32-bit word the random streams take.
  const [min, max] = flag === "--year" ? [1900, 2200] : [0, 4294967295];
  return countFlag(text, flag, min, max, "e.g. --year 2027 --seed 7");
}

/**
 * "--weather <file|synthetic>": reads and validates a weather file (lightfold CSV, EPW or TMY3, told
 * apart by content) or makes a synthetic year. A station file (EPW, TMY3) must describe the site's place.
 */
export function loadWeather(spec: string, site: Site, year: number, seed: number): WeatherYear {
  return siteAndWeather(readWeatherInput(spec, year), site, "site file", year, seed).weather;
}

const MONTHS = ["Jan", "Feb", "Mar", "Apr", "May", "Jun", "Jul", "Aug", "Sep", "Oct", "Nov", "Dec"];

function monthlySummary(site: Site, w: SyntheticWeather): { month: string; targetKt: number; kt: number; ghiKWhM2: number }[] {
  const off = site.utcOffsetHours * 3_600_000;
  const ghi = new Array<number>(12).fill(0);
  for (let i = 0; i < w.ghiWm2.length; i++) ghi[new Date(w.hourStartUtcMs[i]! + off).getUTCMonth()] += w.ghiWm2[i]!;
  return MONTHS.map((month, m) => {
    let q = 0, h0 = 0;
    for (let d = 0; d < w.dailyKt.length; d++) if (w.dailyMonth[d] === m) { q += w.dailyKt[d]! * w.dailyH0Whm2[d]!; h0 += w.dailyH0Whm2[d]!; }
    return { month, targetKt: w.targetKt[m]!, kt: h0 > 0 ? Number((q / h0).toFixed(4)) : 0, ghiKWhM2: Number((ghi[m]! / 1000).toFixed(2)) };
  });
}

/** `lightfold weather --site s.json --year 2027 --seed 7 [--out file.csv]` and `--check file.csv`. */
export function register(program: Command): void {
  program
    .command("weather")
    .description("make a synthetic hourly weather year for a site (GHI/DNI/DHI CSV), or check a weather file")
    .requiredOption("--site <site.json>", "site file (latitude, longitude, time zone, albedo, monthlyClearness)")
    .option("--year <year>", "calendar year (local standard time)", "2027")
    .option("--seed <n>", "random seed", "7")
    .option("--out <file>", "write the file here (atomically) instead of to standard output")
    .option("--format <csv|epw|tmy3>", "file format of the synthetic year: lightfold CSV, EPW or TMY3 CSV (with an invented temperature and humidity)", "csv")
    .option("--check <file>", "validate a weather file (lightfold CSV, EPW or TMY3) against the site's sun instead of generating one")
    .option("--json", "print the summary as JSON")
    .addHelpText(
      "after",
      `
Examples:
  lightfold weather --site configs/sites/brevenmark.site.json --year 2027 --seed 7 --out brevenmark-2027.csv
  lightfold weather --site configs/sites/nordvik-fjell.site.json --check my-measured-year.csv
  lightfold weather --site configs/sites/brevenmark.site.json --format epw --out brevenmark-2027.epw

CSV format: comment lines start with #; header time,ghi_wm2,dni_wm2,dhi_wm2[,albedo]; time is ISO-8601
with its offset (2027-06-01T12:00:00+01:00) and marks the START of the hour; the sun is evaluated at
mid-hour. Synthetic years: Spencer eccentricity, Ineichen–Perez clear sky (Linke turbidity from the
site), daily clearness as a first-order autoregression around monthlyClearness, hourly TAG fluctuation,
Erbs diffuse fraction.`,
    )
    .action((opts: { site: string; year: string; seed: string; out?: string; format: string; check?: string; json?: boolean }) => {
      const site = readSiteFile(opts.site);
      if (opts.check) {
        const input = readWeatherInput(opts.check, intOption(opts.year, "--year", 2027));
        if (input.kind === "synthetic") throw new InputError("--check needs a weather file, not \"synthetic\"");
        const { site: where, weather: w } = siteAndWeather(input, site, opts.site, 2027, 7);
        checkAgainstSun(w, sunTrack(w.hourStartUtcMs, where.latitudeDeg, where.longitudeDeg));
        const full = w.hourStartUtcMs.length === 8760 || w.hourStartUtcMs.length === 8784;
        const summary = { file: opts.check, hours: w.hourStartUtcMs.length, fullYear: full, warnings: w.warnings };
        if (opts.json) process.stdout.write(JSON.stringify(summary, null, 2) + "\n");
        else {
          process.stdout.write(`${opts.check}: ${summary.hours} hourly records, ${full ? "a full year" : "NOT a full year (a yield needs 8760 or 8784)"}\n`);
          for (const x of w.warnings) process.stdout.write(`warning: ${x}\n`);
        }
        return;
      }
      const year = intOption(opts.year, "--year", 2027);
      const seed = intOption(opts.seed, "--seed", 7);
      const w = syntheticWeather(site, year, seed);
      const comments = [
        `lightfold ${toolVersion()} synthetic weather: site "${site.name}" (${site.latitudeDeg}°, ${site.longitudeDeg}°, ${site.elevationM} m), year ${year}, seed ${seed}`,
        "hour stamps = start of the hour in local standard time; irradiance = hourly mean, W/m²",
      ];
      const csv = formatted(opts.format, site, w, comments);
      if (!opts.out) {
        process.stdout.write(csv);
        return;
      }
      writeFileAtomic(opts.out, csv);
      const months = monthlySummary(site, w);
      if (opts.json) {
        process.stdout.write(JSON.stringify({ file: opts.out, site: site.name, year, seed, hours: w.ghiWm2.length, months }, null, 2) + "\n");
        return;
      }
      const total = months.reduce((a, m) => a + m.ghiKWhM2, 0);
      const lines = [`wrote ${opts.out}: ${w.ghiWm2.length} hours, GHI ${total.toFixed(1)} kWh/m²`, "month  target K̄T  realised K̄T  GHI kWh/m²"];
      for (const m of months) lines.push(`${m.month}    ${m.targetKt.toFixed(3).padStart(7)}  ${m.kt.toFixed(3).padStart(11)}  ${m.ghiKWhM2.toFixed(1).padStart(10)}`);
      process.stdout.write(lines.join("\n") + "\n");
    });
}

/** The synthetic year as text in the chosen format (EPW and TMY3 get an invented temperature and humidity). */
function formatted(format: string, site: Site, w: WeatherYear, comments: string[]): string {
  const meta: StationMeta = {
    format: "epw", name: site.name, latitudeDeg: site.latitudeDeg, longitudeDeg: site.longitudeDeg,
    utcOffsetHours: site.utcOffsetHours, elevationM: site.elevationM,
  };
  if (format === "epw") return epwText(meta, w, syntheticMet(site, w.hourStartUtcMs), comments[0]!);
  if (format === "tmy3") {
    const met = syntheticMet(site, w.hourStartUtcMs);
    for (let i = 0; i < met.airTempC.length; i++) met.precipitableWaterCm[i] = precipitableWaterCm(met.airTempC[i]!, met.relHumidityPct[i]!);
    return tmy3Text({ ...meta, format: "tmy3" }, "999000", w, met);
  }
  if (format === "csv") return weatherToCsv(w, site.utcOffsetHours, formatUtcOffset(site.utcOffsetHours), comments);
  throw new InputError(`--format: expected csv, epw or tmy3, got "${format}"`, "e.g. --format epw --out site-2027.epw");
}
