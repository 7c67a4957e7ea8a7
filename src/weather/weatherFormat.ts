import { InputError } from "../util/errors.js";
import { EPW_HEADERS } from "./epw.js";

export type WeatherFormat = "epw" | "tmy3" | "lightfold-csv";

/**
 * Recognises a weather file by its content: EPW starts with its LOCATION record; TMY3 has a station
 * line of 7 fields followed by a column header starting "Date"; lightfold's CSV has `#` comments and
 * the header time,ghi_wm2,dni_wm2,dhi_wm2. Anything else is refused naming the file.
 */
export function detectWeatherFormat(text: string, src: string): WeatherFormat {
  const lines = text.replace(/^\uFEFF/, "").split(/\r?\n/, 3);
  const first = (lines[0] ?? "").trim();
  if (first.toUpperCase().startsWith(`${EPW_HEADERS[0]},`)) return "epw";
  if ((lines[1] ?? "").trim().toLowerCase().startsWith("date")) return "tmy3";
  const firstData = text.split(/\r?\n/).map((l) => l.trim()).find((l) => l !== "" && !l.startsWith("#")) ?? "";
  if (firstData.toLowerCase().startsWith("time,")) return "lightfold-csv";
  throw new InputError(
    `${src}: unknown weather file format (first line "${first.slice(0, 60)}")`,
    "give an EPW file (first line LOCATION,…), a TMY3 CSV (station line, then a header starting Date (MM/DD/YYYY)), or lightfold's CSV (header time,ghi_wm2,dni_wm2,dhi_wm2)",
  );
}
