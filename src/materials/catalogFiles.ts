import { readFileSync } from "node:fs";
import { dataPath } from "../util/packageRoot.js";
import { InputError } from "../util/errors.js";
import { parseNkCsv, type NkColumns } from "./nkCsv.js";

/** Reads and parses an n,k CSV file; a missing or unreadable file is an InputError naming it. */
export function readNkCsvFile(path: string, label = path): NkColumns {
  let text: string;
  try {
    text = readFileSync(path, "utf8");
  } catch (err) {
    const why = err instanceof Error ? err.message : String(err);
    throw new InputError(`${label}: cannot read n,k file (${why})`, "check the path (a csv path in a study file is relative to the study file's folder)");
  }
  return parseNkCsv(text, label);
}

/** Reads a table shipped in data/materials/. */
export function readBuiltinTable(fileName: string): NkColumns {
  return readNkCsvFile(dataPath("materials", fileName), `data/materials/${fileName}`);
}
