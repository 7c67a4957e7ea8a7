import type { Command } from "commander";
import { makeReport } from "../../report/makeReport.js";
import { InputError } from "../../util/errors.js";

function parseAngle(text: string): number {
  const v = Number(text);
  if (text.trim() === "" || !Number.isFinite(v) || v < 0 || v >= 90) {
    throw new InputError(`--angle must be an incidence angle in degrees, 0 ≤ θ < 90 (got "${text}")`, "e.g. --angle 0 or --angle 30 (a θ of the matrix grid)");
  }
  return v;
}

/** `lightfold report <run dir> [more run dirs] [--angle 0] [--out dir] [--json]` */
export function register(program: Command): void {
  program
    .command("report")
    .description("write a self-contained HTML report (inline SVG plots, no network) plus each plot as .svg for one or more run folders")
    .argument("<runDirs...>", "run folder(s) written by sweep / converge / yield (holding <combo>/matrix.json, convergence.json, yield/*.json)")
    .option("--angle <deg>", "incidence angle θ of the spectral plot and loss table (must be on the matrix grid)", "0")
    .option("--out <dir>", "output folder (default: <first run dir>/report)")
    .option("--json", "print a JSON summary (index path, files, omitted sections) instead of text")
    .addHelpText(
      "after",
      `
Examples:
  lightfold report runs/demo/demo-random-pyramids
      -> runs/demo/demo-random-pyramids/report/index.html and one .svg per plot
  lightfold report runs/a runs/b --angle 30 --out runs/a-vs-b-report
      -> one page for both runs, spectral plot at θ = 30°
  lightfold report runs/demo/demo-random-pyramids --json | jq .indexPath

Sections whose data are missing (no photocurrent.json, convergence.json or yield/*.json) are left
out with a short note; a missing folder, a malformed file or an angle not on the grid is bad input.`,
    )
    .action((runDirs: string[], opts: { angle: string; out?: string; json?: boolean }) => {
      const result = makeReport(runDirs, { angleDeg: parseAngle(opts.angle), outDir: opts.out });
      if (opts.json) {
        process.stdout.write(JSON.stringify(result) + "\n");
        return;
      }
      for (const n of result.notes) process.stderr.write(`note: ${n}\n`);
      process.stdout.write(`report: ${result.indexPath}\n`);
      process.stdout.write(`  ${result.stacks} stack(s), ${result.figures.length} plot(s): ${result.figures.join(", ")}\n`);
      if (result.omitted.length) process.stdout.write(`  left out (no data): ${result.omitted.join(", ")}\n`);
    });
}
