import type { Command } from "commander";
import { defaultExportPath, parseExportFormat, writeExport } from "../../export/writeExport.js";
import { readResponseMatrix } from "../../response/matrixFile.js";

/** `lightfold export <matrix.json> --format csv|json|npy [--out path]` */
export function register(program: Command): void {
  program
    .command("export")
    .description("write a response matrix as tidy CSV, nested JSON, or NumPy .npy arrays with a JSON sidecar")
    .argument("<matrix>", "response matrix file (matrix.json from a sweep run folder)")
    .requiredOption("--format <format>", "csv | json | npy")
    .option("--out <path>", "output file (npy: the sidecar .json; arrays are written beside it)")
    .option("--json", "print the list of written files as JSON")
    .addHelpText(
      "after",
      `
Examples:
  lightfold export runs/demo-planar/base/matrix.json --format csv
      -> runs/demo-planar/base/matrix.csv (theta_deg,phi_deg,wavelength_nm,channel,value,stderr)
  lightfold export runs/demo-planar/base/matrix.json --format npy
      -> matrix.npy.json (axes, shapes, files) + matrix_mean.npy, matrix_stderr.npy,
         matrix_nrays.npy, matrix_path_ratio.npy; in Python: numpy.load("matrix_mean.npy")
  lightfold export runs/demo-planar/base/matrix.json --format json --out demo.export.json`,
    )
    .action((matrixPath: string, opts: { format: string; out?: string; json?: boolean }) => {
      const format = parseExportFormat(opts.format);
      const matrix = readResponseMatrix(matrixPath);
      const out = opts.out ?? defaultExportPath(matrixPath, format);
      const written = writeExport(matrix, format, out);
      if (opts.json) process.stdout.write(JSON.stringify({ format, files: written }) + "\n");
      else for (const p of written) process.stdout.write(`wrote ${p}\n`);
    });
}
