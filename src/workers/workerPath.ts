import { existsSync } from "node:fs";
import { fileURLToPath } from "node:url";

/**
 * File path of a compiled worker module next to `fromUrl` (pass import.meta.url of the caller).
 * Worker threads run plain JavaScript, so a caller running from src/*.ts (tests) is mapped to its
 * compiled twin under dist/src/ (built by `npm run build`, which `npm test` runs first).
 */
export function workerFile(fromUrl: string, relativeJs: string): string {
  let path = fileURLToPath(new URL(relativeJs, fromUrl));
  if (!existsSync(path) && /[\\/]src[\\/]/.test(path)) {
    const compiled = path.replace(/([\\/])src([\\/])/, "$1dist$1src$2");
    if (existsSync(compiled)) path = compiled;
    else throw new Error(`worker module ${compiled} is missing: run "npm run build" first`);
  }
  return path;
}
