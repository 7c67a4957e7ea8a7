import { readFileSync } from "node:fs";
import { dataPath } from "../util/packageRoot.js";
import { readDataFile } from "../util/inputFile.js";
import { parseNkCsv, type NkColumns } from "./nkCsv.js";

/** Reads and parses a user's n,k CSV file (readDataFile: a regular .csv/.tsv/.txt/.dat of sane size). */
export function readNkCsvFile(path: string, label = path): NkColumns {
  const text = readDataFile(path, "n,k file", "check the path (a csv path in a study file is relative to the study file's folder)");
  return parseNkCsv(text, label);
}

/** Reads a table shipped in data/materials/. */
export function readBuiltinTable(fileName: string): NkColumns {
  return parseNkCsv(readFileSync(dataPath("materials", fileName), "utf8"), `data/materials/${fileName}`);
}
