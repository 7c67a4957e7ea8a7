/** Writes the rendered report: <out>/index.html and one <id>.svg per plot, each atomically. */
import { join } from "node:path";
import { writeFileAtomic } from "../util/atomicWrite.js";
import type { RenderedReport } from "./page.js";

const SVG_PROLOGUE = '<?xml version="1.0" encoding="UTF-8"?>\n';

export function writeReport(outDir: string, r: RenderedReport): string[] {
  // Render everything first (done by the caller), then write: a failure leaves no half page.
  const written: string[] = [];
  for (const f of r.figures) {
    const p = join(outDir, `${f.id}.svg`);
    writeFileAtomic(p, SVG_PROLOGUE + f.svg + "\n");
    written.push(p);
  }
  const index = join(outDir, "index.html");
  writeFileAtomic(index, r.html);
  written.push(index);
  return written;
}
