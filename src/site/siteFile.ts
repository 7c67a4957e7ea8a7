import { parseJsonInput, readInputText } from "../util/inputFile.js";
import { siteFromObject, type Site } from "./site.js";

/** Parses a site file's text; `src` names the file in errors. */
export function siteFromJson(text: string, src: string): Site {
  return siteFromObject(parseJsonInput(text, src), src);
}

export function readSiteFile(path: string): Site {
  const text = readInputText(
    path,
    "site file",
    "give a site JSON file (name, latitudeDeg, longitudeDeg, utcOffsetHours, …); examples: configs/sites/*.site.json",
  );
  return siteFromJson(text, path);
}
