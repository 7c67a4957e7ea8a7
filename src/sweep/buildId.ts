import { createHash } from "node:crypto";
import { readdirSync, readFileSync } from "node:fs";
import { dirname, join, relative } from "node:path";
import { fileURLToPath } from "node:url";

let cached: string | undefined;

/**
 * Fingerprint of the code that is running: sha256 over the names and contents of every module
 * under the code root (dist/src/**.js when installed, src/**.ts when run from source), first 16
 * hex digits. Two builds of the same version number that trace differently (a development
 * checkout between commits) thus never resume each other's journals or merge each other's shards.
 */
export function buildId(): string {
  if (cached !== undefined) return cached;
  const root = dirname(dirname(fileURLToPath(import.meta.url)));
  const ext = import.meta.url.endsWith(".ts") ? ".ts" : ".js";
  const files: string[] = [];
  const walk = (dir: string): void => {
    for (const e of readdirSync(dir, { withFileTypes: true })) {
      const p = join(dir, e.name);
      if (e.isDirectory()) walk(p);
      else if (e.name.endsWith(ext) && !e.name.endsWith(".d.ts")) files.push(p);
    }
  };
  walk(root);
  const h = createHash("sha256");
  for (const f of files.sort()) {
    h.update(relative(root, f).split("\\").join("/"));
    h.update("\0");
    h.update(readFileSync(f));
    h.update("\0");
  }
  cached = h.digest("hex").slice(0, 16);
  return cached;
}
