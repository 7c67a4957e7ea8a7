import { readFileSync, statSync } from "node:fs";
import { extname } from "node:path";
import { InputError } from "./errors.js";
import { lineColumn, scanJson } from "./jsonScan.js";

/**
 * Reads a user-supplied text file; an unreadable one is an InputError
 * "cannot read <what> <path>: <reason>" with the caller's hint (exit code 2).
 */
export function readInputText(path: string, what: string, hint: string): string {
  try {
    return readFileSync(path, "utf8");
  } catch (err) {
    throw new InputError(`cannot read ${what} ${path}: ${(err as NodeJS.ErrnoException).code ?? (err as Error).message}`, hint);
  }
}

/** Largest data table (n,k, spectrum, height map) a study may name. */
export const MAX_DATA_FILE_BYTES = 32 * 1024 * 1024;
/** File endings a data table named in a study may have. */
export const DATA_FILE_EXTENSIONS = [".csv", ".tsv", ".txt", ".dat"];

/**
 * Why a data table a study names cannot be read as one (not a regular file, another ending, too
 * large), or undefined. Checked before reading, so a path pointing at some other file is refused by
 * its name alone and nothing of its contents is read or quoted.
 */
export function dataFileProblem(path: string): string | undefined {
  const st = statSync(path, { throwIfNoEntry: false });
  if (st === undefined) return "no such file";
  if (!st.isFile()) return "not a regular file";
  if (!DATA_FILE_EXTENSIONS.includes(extname(path).toLowerCase())) return `expected a data table ending in ${DATA_FILE_EXTENSIONS.join(", ")}`;
  if (st.size > MAX_DATA_FILE_BYTES) return `${(st.size / 1048576).toFixed(0)} MB, more than the ${MAX_DATA_FILE_BYTES / 1048576} MB a data table may have`;
  return undefined;
}

/** Reads a data table a study names (dataFileProblem first); `what` and `hint` go into the InputError. */
export function readDataFile(path: string, what: string, hint: string): string {
  const problem = dataFileProblem(path);
  if (problem !== undefined) throw new InputError(`cannot read ${what} ${path}: ${problem}`, hint);
  return readInputText(path, what, hint);
}

/**
 * Parses JSON text (a leading byte-order mark is dropped); a syntax error or a key repeated within
 * one object is an InputError naming the file, line and column (and the object's path).
 */
export function parseJsonInput(text: string, source: string): unknown {
  const body = text.charCodeAt(0) === 0xfeff ? text.slice(1) : text;
  const problem = scanJson(body);
  if (problem !== undefined) {
    const { line, column } = lineColumn(body, problem.offset);
    if (problem.kind === "duplicate") {
      throw new InputError(
        `${source}: line ${line}, column ${column}: key ${JSON.stringify(problem.key)} appears twice in ${problem.path}; expected each key once`,
        "JSON keeps only the last of repeated keys: delete or merge the other",
      );
    }
    throw new InputError(`${source}: not valid JSON: line ${line}, column ${column} (${problem.message})`, "check the file for a missing comma, quote or bracket near that line");
  }
  return JSON.parse(body);
}
