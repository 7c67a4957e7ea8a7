import { existsSync } from "node:fs";
import type { Command } from "commander";
import { readResponseMatrix } from "../../response/matrixFile.js";
import { spectrumFromSpec, type Spectrum } from "../../spectrum/index.js";
import { photocurrentForMatrix } from "../../weighting/writePhotocurrent.js";
import { formatPhotocurrentTable } from "../../weighting/table.js";
import { InputError } from "../../util/errors.js";

const NAMED = ["AM1.5G", "AM1.5D", "G173-ETR"];

/** "--spectrum": a named standard spectrum or a CSV file (wavelength_nm, irradiance). */
export function spectrumOption(text: string): Spectrum {
  if (NAMED.includes(text)) return spectrumFromSpec(text, process.cwd(), "--spectrum");
  if (/\.csv$/i.test(text) || existsSync(text)) return spectrumFromSpec({ csv: text }, process.cwd(), "--spectrum");
  throw new InputError(
    `--spectrum: expected ${NAMED.join(", ")} or a CSV file, got "${text}"`,
    "a spectrum CSV has the header wavelength_nm,irradiance_W_m2_nm",
  );
}

/** `lightfold spectral <matrix.json> [--spectrum AM1.5G|file.csv] [--json]` */
export function register(program: Command): void {
  program
    .command("spectral")
    .description("absorber photocurrent per incidence angle, loss breakdown and angular modifier (IAM) of a response matrix")
    .argument("<matrix>", "response matrix file (matrix.json)")
    .option("--spectrum <name|file.csv>", `spectrum: ${NAMED.join(", ")} or a CSV file`, "AM1.5G")
    .option("--json", "print the full summary (as written to photocurrent.json) as JSON")
    .addHelpText(
      "after",
      `
Examples:
  lightfold spectral runs/demo-planar/base/matrix.json
  lightfold spectral runs/demo-planar/base/matrix.json --spectrum AM1.5D
  lightfold spectral runs/demo-planar/base/matrix.json --spectrum my-spectrum.csv --json > pc.json

Currents are in mA/cm² over the matrix's wavelength range; errors are Monte Carlo standard errors,
sqrt(Σ w² SE²) over independent wavelengths. J(θ) is per unit beam power reaching the cell, so
IAM = J(θ)/J(0°) at the same azimuth excludes the cos θ projection (as in Isc(θ)/(Isc(0)·cos θ)).`,
    )
    .action((matrixPath: string, opts: { spectrum: string; json?: boolean }) => {
      const matrix = readResponseMatrix(matrixPath);
      const summary = photocurrentForMatrix(matrix, spectrumOption(opts.spectrum));
      process.stdout.write(opts.json ? JSON.stringify(summary, null, 2) + "\n" : formatPhotocurrentTable(summary));
    });
}
