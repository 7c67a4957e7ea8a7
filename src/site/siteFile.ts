import { readFileSync } from "node:fs";
import { InputError } from "../util/errors.js";
import { siteFromObject, type Site } from "./site.js";

/** Parses a site file's text; `src` names the file in errors. */
export function siteFromJson(text: string, src: string): Site {
  let raw: unknown;
  try {
    raw = JSON.parse(text);
  } catch (err) {
    throw new InputError(`${src}: not valid JSON (${(err as Error).message})`);
  }
  return siteFromObject(raw, src);
}

export function readSiteFile(path: string): Site {
  let text: string;
  try {
    text = readFileSync(path, "utf8");
  } catch {
    throw new InputError(
      `cannot read site file ${path}`,
      "give a site JSON file (name, latitudeDeg, longitudeDeg, utcOffsetHours, …); examples: configs/sites/*.site.json",
    );
  }
  return siteFromJson(text, path);
}
