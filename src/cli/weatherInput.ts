/**
 * Reads the `--weather` argument: "synthetic", lightfold's weather CSV, an EPW file or a TMY3 CSV
 * (recognised by content). The only place the yield verbs read weather files.
 */
import type { Site } from "../site/site.js";
import { readInputText } from "../util/inputFile.js";
import { InputError } from "../util/errors.js";
import { parseEpw } from "../weather/epw.js";
import type { StationWeather } from "../weather/stationFile.js";
import { siteForStation } from "../weather/stationSite.js";
import { syntheticWeather } from "../weather/synthetic.js";
import { parseTmy3 } from "../weather/tmy3.js";
import { parseWeatherCsv } from "../weather/weatherCsv.js";
import { detectWeatherFormat } from "../weather/weatherFormat.js";
import type { WeatherYear } from "../weather/weatherYear.js";

export type WeatherInput = { kind: "synthetic" } | { kind: "csv"; weather: WeatherYear } | { kind: "station"; station: StationWeather };

const HINT = "give an EPW file, a TMY3 CSV, an hourly weather CSV (e.g. one written by `lightfold weather --out`), or --weather synthetic";

/** Reads and parses a weather file (not yet paired with a site); `typicalYear` places typical-year files. */
export function readWeatherInput(spec: string, typicalYear: number): WeatherInput {
  if (spec === "synthetic") return { kind: "synthetic" };
  const text = readInputText(spec, "weather file", HINT);
  const format = detectWeatherFormat(text, spec);
  if (format === "epw") return { kind: "station", station: parseEpw(text, spec, typicalYear) };
  if (format === "tmy3") return { kind: "station", station: parseTmy3(text, spec, typicalYear) };
  return { kind: "csv", weather: parseWeatherCsv(text, spec) };
}

/** The site and the hourly year of a weather input; a station file supplies (or checks) the site's location. */
export function siteAndWeather(input: WeatherInput, site: Site | undefined, siteSrc: string | undefined, year: number, seed: number): { site: Site; weather: WeatherYear; station?: StationWeather } {
  if (input.kind === "station") {
    const s = siteForStation(input.station.meta, input.station.weather.source, site, siteSrc);
    return { site: s, weather: input.station.weather, station: input.station };
  }
  if (!site) throw new InputError("--site is needed unless --weather is an EPW or TMY3 file (they carry the site's location)", "e.g. --site configs/sites/brevenmark.site.json");
  return { site, weather: input.kind === "csv" ? input.weather : syntheticWeather(site, year, seed) };
}
