import { isAbsolute, relative, resolve } from "node:path";
import { InputError } from "./errors.js";

/** Longest file or folder name lightfold writes (file systems allow 255 bytes). */
export const MAX_SEGMENT_LENGTH = 100;
const SAFE_SEGMENT = /^[A-Za-z0-9][A-Za-z0-9._-]*$/;

/** True for a name that is one harmless path segment: letters, digits, . _ -, not starting with a dot. */
export function isSafeSegment(name: string): boolean {
  return name.length <= MAX_SEGMENT_LENGTH && SAFE_SEGMENT.test(name);
}

/** Refuses a name that is not one safe path segment (`what` names where it came from). */
export function requireSafeSegment(name: string, what: string): string {
  if (!isSafeSegment(name)) {
    throw new InputError(`${what}: expected a plain name (letters, digits, ".", "_", "-"; at most ${MAX_SEGMENT_LENGTH} characters, not starting with "."), got ${JSON.stringify(name.slice(0, 60))}`);
  }
  return name;
}

/** `path` resolved, refused unless it lies inside `root` (an output path built from file contents). */
export function insideDir(root: string, path: string): string {
  const r = relative(resolve(root), resolve(path));
  if (r === "" || r.startsWith("..") || isAbsolute(r)) throw new InputError(`${path}: would be written outside the output folder ${root}; refused`);
  return path;
}

/**
 * A file-name-safe slug of free text (a site or study name): lower-case letters, digits and "_" joined by
 * "-", at most `max` characters, "x" when nothing is left.
 */
export function slugOf(text: string, max = 60, empty = "x"): string {
  const s = text.toLowerCase().normalize("NFKD").replace(/[^a-z0-9_]+/g, "-").replace(/^[-_]+|-+$/g, "").slice(0, max).replace(/-+$/, "");
  return s === "" ? empty : s;
}
