import { readFileSync } from "node:fs";
import { InputError } from "./errors.js";

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

/** Parses JSON text; a syntax error is an InputError naming the file, line and column. */
export function parseJsonInput(text: string, source: string): unknown {
  try {
    return JSON.parse(text);
  } catch (err) {
    throw new InputError(`${source}: not valid JSON: ${jsonErrorWhere(text, err as Error)}`, "check the file for a missing comma, quote or bracket near that line");
  }
}

/** Line and column of a JSON.parse error (V8 reports a character position). */
function jsonErrorWhere(text: string, err: Error): string {
  const m = /position (\d+)/.exec(err.message);
  if (m === null) return err.message;
  const pos = Number(m[1]);
  const before = text.slice(0, pos);
  const line = before.split("\n").length;
  const col = pos - before.lastIndexOf("\n");
  return `line ${line}, column ${col} (${err.message})`;
}
