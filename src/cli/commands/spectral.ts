import { existsSync } from "node:fs";
import type { Command } from "commander";
import { readResponseMatrix } from "../../response/matrixFile.js";
import { spectrumFromSpec, type Spectrum } from "../../spectrum/index.js";
import { photocurrentForMatrix } from "../../weighting/writePhotocurrent.js";
import { formatPhotocurrentTable } from "../../weighting/table.js";
import { InputError } from "../../util/errors.js";
import { formatBifaciality, opticalBifaciality } from "../../weighting/bifaciality.js";

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
    .option("--rear <rear-matrix>", "the same stack's matrix with light from the rear: adds its table (rear IAM) and the optical bifaciality")
    .option("--json", "print the full summary (as written to photocurrent.json) as JSON")
    .addHelpText(
      "after",
      `
Examples:
  lightfold spectral runs/demo-planar/base/matrix.json
  lightfold spectral runs/demo-planar/base/matrix.json --spectrum AM1.5D
  lightfold spectral runs/demo-planar/base/matrix.json --spectrum my-spectrum.csv --json > pc.json
  lightfold spectral runs/demo/demo-glass-glass/base/matrix.json --rear runs/demo/demo-glass-glass/base-rear/matrix.json

Currents are in mA/cm² over the matrix's wavelength range; errors are Monte Carlo standard errors,
sqrt(Σ w² SE²) over independent wavelengths. J(θ) is per unit beam power reaching the cell, so
IAM = J(θ)/J(0°) at the same azimuth excludes the cos θ projection (as in Isc(θ)/(Isc(0)·cos θ)).
With --rear: optical bifaciality = J_rear / J_front at the reference angle (0°), azimuths averaged.`,
    )
    .action((matrixPath: string, opts: { spectrum: string; rear?: string; json?: boolean }) => {
      const matrix = readResponseMatrix(matrixPath);
      const spectrum = spectrumOption(opts.spectrum);
      const summary = photocurrentForMatrix(matrix, spectrum);
      if (opts.rear === undefined) {
        process.stdout.write(opts.json ? JSON.stringify(summary, null, 2) + "\n" : formatPhotocurrentTable(summary));
        return;
      }
      const rearMatrix = readResponseMatrix(opts.rear);
      if (rearMatrix.lightFrom !== "rear") throw new InputError(`--rear ${opts.rear}: this matrix was traced with light from the front`, 'sweep the study with "illumination": "both" and pass its <label>-rear/matrix.json');
      if (matrix.lightFrom === "rear") throw new InputError(`${matrixPath}: this matrix was traced with light from the rear; give the front one first`);
      const rear = photocurrentForMatrix(rearMatrix, spectrum);
      const b = opticalBifaciality(summary, rear);
      if (opts.json) process.stdout.write(JSON.stringify({ front: summary, rear, bifaciality: b }, null, 2) + "\n");
      else process.stdout.write(`front (${matrixPath})\n${formatPhotocurrentTable(summary)}\nrear (${opts.rear})\n${formatPhotocurrentTable(rear)}\n${formatBifaciality(b)}`);
    });
}
