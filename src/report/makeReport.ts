/** Reads run directories, renders the page and writes it: the one call the CLI and the demo make. */
import { join } from "node:path";
import { loadReportInput } from "./loadRunDir.js";
import { renderReport } from "./page.js";
import { writeReport } from "./writeReport.js";

export interface MakeReportOptions {
  /** Incidence angle of the spectral plot and breakdown (must be in every matrix grid). Default 0. */
  angleDeg?: number;
  /** Output folder; default <first run dir>/report. */
  outDir?: string;
}

export interface MakeReportResult {
  indexPath: string;
  files: string[];
  figures: string[];
  stacks: number;
  notes: string[];
  omitted: string[];
}

export function makeReport(runDirs: string[], opts: MakeReportOptions = {}): MakeReportResult {
  const input = loadReportInput(runDirs, { angleDeg: opts.angleDeg ?? 0 });
  const rendered = renderReport(input);
  const outDir = opts.outDir ?? join(runDirs[0]!, "report");
  const files = writeReport(outDir, rendered);
  const omitted: string[] = [];
  if (input.stacks.length === 0) omitted.push("spectral", "angular");
  else if (!input.stacks.some((s) => s.photocurrent)) omitted.push("photocurrent");
  if (input.convergence.length === 0) omitted.push("convergence");
  if (input.yields.length === 0) omitted.push("monthly yield");
  if (input.tiltSweeps.length === 0) omitted.push("tilt sweep");
  if (input.benefit.length === 0) omitted.push("texture benefit");
  return {
    indexPath: join(outDir, "index.html"),
    files,
    figures: rendered.figures.map((f) => f.id),
    stacks: input.stacks.length,
    notes: input.notes,
    omitted,
  };
}
