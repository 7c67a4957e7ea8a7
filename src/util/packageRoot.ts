import { existsSync } from "node:fs";
import { dirname, join } from "node:path";
import { fileURLToPath } from "node:url";

/** Directory holding lightfold's package.json, found from this module (works from src/ and dist/src/). */
export function packageRoot(): string {
  let dir = dirname(fileURLToPath(import.meta.url));
  for (let i = 0; i < 8; i++) {
    if (existsSync(join(dir, "package.json")) && existsSync(join(dir, "data"))) return dir;
    dir = dirname(dir);
  }
  throw new Error("lightfold: cannot locate the package root (package.json + data/)");
}

/** Absolute path of a file shipped with the package, e.g. dataPath("materials", "si_green2008.csv"). */
export function dataPath(...parts: string[]): string {
  return join(packageRoot(), "data", ...parts);
}
