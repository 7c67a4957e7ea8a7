import { readFileSync } from "node:fs";
import { join } from "node:path";
import { packageRoot } from "./packageRoot.js";

let cached: string | undefined;
/** lightfold's version from package.json (recorded in every output file). */
export function toolVersion(): string {
  if (cached === undefined) {
    cached = String(JSON.parse(readFileSync(join(packageRoot(), "package.json"), "utf8")).version);
  }
  return cached;
}
