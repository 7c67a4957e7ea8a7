/** Hourly weather: one entry per hour; stamps mark the start of each hour (UTC milliseconds). */
export interface WeatherYear {
  /** Where it came from (file path or "synthetic …"), for messages. */
  source: string;
  hourStartUtcMs: Float64Array;
  ghiWm2: Float64Array;
  dniWm2: Float64Array;
  dhiWm2: Float64Array;
  /** Per-hour ground albedo when the file has the column. */
  albedo?: Float64Array;
  /** Line of the source file each record came from (for messages), when the reader kept it. */
  lineNumbers?: Int32Array;
  /** Non-fatal findings (with counts), shown to the user. */
  warnings: string[];
}

export const HOUR_MS = 3_600_000;
