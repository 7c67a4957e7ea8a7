import { createHash } from "node:crypto";

/**
 * Canonical JSON: object keys sorted, undefined fields dropped, typed arrays written as arrays.
 * Two studies that mean the same thing (same values, keys in another order) give the same text.
 */
export function canonicalJson(value: unknown): string {
  if (value === null || typeof value !== "object") {
    if (typeof value === "number" && !Number.isFinite(value)) throw new Error(`canonicalJson: non-finite number ${value}`);
    return JSON.stringify(value) ?? "null";
  }
  if (ArrayBuffer.isView(value)) return canonicalJson(Array.from(value as unknown as ArrayLike<number>));
  if (Array.isArray(value)) return `[${value.map((v) => canonicalJson(v === undefined ? null : v)).join(",")}]`;
  const o = value as Record<string, unknown>;
  const keys = Object.keys(o).filter((k) => o[k] !== undefined).sort();
  return `{${keys.map((k) => `${JSON.stringify(k)}:${canonicalJson(o[k])}`).join(",")}}`;
}

export function sha256Hex(text: string | Uint8Array): string {
  return createHash("sha256").update(text).digest("hex");
}

/**
 * Hash of a resolved study plus the contents of the files it refers to (user materials, spectra,
 * height maps), so editing a referenced CSV changes the hash as much as editing the study does.
 */
export function studyHash(resolved: unknown, files: Record<string, string>): string {
  const fileHashes: Record<string, string> = {};
  for (const name of Object.keys(files).sort()) fileHashes[name] = sha256Hex(files[name]);
  return sha256Hex(canonicalJson({ study: resolved, files: fileHashes }));
}
