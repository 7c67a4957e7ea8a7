import type { Command } from "commander";
import { MaterialRegistry } from "../../materials/registry.js";
import { parseNumberSweep, parseStackSpec } from "../../optics/stackSpec.js";
import { evaluateStack, type FilmPoint } from "../../optics/stackEval.js";
import { InputError } from "../../util/errors.js";

const f6 = (v: number): string => v.toFixed(6);

function table(rows: string[][]): string {
  const widths = rows[0]!.map((_, c) => Math.max(...rows.map((r) => r[c]!.length)));
  return rows.map((r) => r.map((cell, c) => (c === r.length - 1 ? cell : cell.padEnd(widths[c]!))).join("  ").trimEnd()).join("\n") + "\n";
}

function printPoint(p: FilmPoint, label: string, exitName: string): string {
  const rows = [["", "s", "p", "unpolarised"]];
  rows.push(["R", f6(p.Rs), f6(p.Rp), f6(p.R)]);
  rows.push([`T (into ${exitName})`, f6(p.Ts), f6(p.Tp), f6(p.T)]);
  p.films.forEach((f, j) => rows.push([`A film ${j + 1} ${f.material} ${f.thicknessNm} nm`, f6(f.As), f6(f.Ap), f6(f.A)]));
  return `${label}\n${p.wavelengthNm} nm, ${p.angleDeg}° in the incidence medium (n0 = ${p.n0.toFixed(4)})\n\n${table(rows)}`;
}

function printSweep(points: FilmPoint[], label: string): string {
  const head = ["wavelength_nm", "angle_deg", "Rs", "Rp", "R", "T"];
  points[0]!.films.forEach((f, j) => head.push(`A${j + 1}_${f.material}`));
  const rows = [head];
  for (const p of points) {
    rows.push([String(p.wavelengthNm), String(p.angleDeg), f6(p.Rs), f6(p.Rp), f6(p.R), f6(p.T), ...p.films.map((f) => f6(f.A))]);
  }
  return `${label}\nR, T, A: unpolarised fractions of the incident power (mean of s and p)\n\n${table(rows)}`;
}

/** `lightfold film --stack "air|SiNx:75|Si" --wavelength 600 --angle 0 [--json]` */
export function register(program: Command): void {
  program
    .command("film")
    .description("reflectance, transmittance and film absorptance of a coherent thin-film stack (transfer matrices)")
    .requiredOption("--stack <stack>", 'media and films separated by "|": incidence|material:thicknessNm|…|exit')
    .option("--wavelength <nm>", "vacuum wavelength in nm: 600, a list 400,600,800 or a range 400:1100:50", "600")
    .option("--angle <deg>", "incidence angle in degrees in the incidence medium: 0, a list 0,30,60 or a range 0:80:10", "0")
    .option("--json", "print JSON")
    .addHelpText(
      "after",
      `
The first and last entries are semi-infinite media, the entries between are coherent films
(thickness in nm), listed from the incidence side. Names are materials or aliases from
\`lightfold materials\`. T is the power crossing into the exit medium (absorbed there when it
absorbs, e.g. silicon or a metal); an absorbing incidence medium is taken with Re n.

Examples:
  lightfold film --stack "air|SiNx:75|Si" --wavelength 600 --angle 0
  lightfold film --stack "air|SiNx:75|Si" --wavelength 400:1100:50          pick an ARC thickness
  lightfold film --stack "EVA|SiNx:70|Si" --wavelength 600 --angle 0:80:10  angular response
  lightfold film --stack "Si|SiO2:100|Ag" --wavelength 1000 --angle 30      rear reflector from inside
  lightfold film --stack "air|SiO2:100|SiNx:60|Si" --wavelength 400:1100:100 --json   double-layer ARC`,
    )
    .action((opts: { stack: string; wavelength: string; angle: string; json?: boolean }) => {
      const spec = parseStackSpec(opts.stack, "--stack");
      const wavelengths = parseNumberSweep(opts.wavelength, "--wavelength", 1e-3, 1e9, "nm");
      if (wavelengths.some((w) => w <= 0)) throw new InputError(`--wavelength: wavelengths must be positive`, "e.g. --wavelength 600 or --wavelength 400:1100:50 (nm)");
      const angles = parseNumberSweep(opts.angle, "--angle", 0, 90, "deg");
      const registry = MaterialRegistry.withBuiltins();
      const resolve = (name: string) => registry.get(name);
      // resolve every name first, so an unknown one is reported before any output
      const incidence = resolve(spec.incidence);
      const exit = resolve(spec.exit);
      const filmMaterials = spec.films.map((f) => resolve(f.material));
      const points: FilmPoint[] = [];
      for (const w of wavelengths) for (const a of angles) points.push(evaluateStack(spec, resolve, w, a));
      if (opts.json === true) {
        const out = {
          stack: {
            incidence: { name: spec.incidence, material: incidence.name },
            films: spec.films.map((f, j) => ({ name: f.material, material: filmMaterials[j]!.name, thicknessNm: f.thicknessNm })),
            exit: { name: spec.exit, material: exit.name },
          },
          points,
        };
        process.stdout.write(JSON.stringify(out, null, 2) + "\n");
        return;
      }
      const named = (given: string, m: { name: string }): string => (given === m.name ? given : `${given} (${m.name})`);
      const label =
        [named(spec.incidence, incidence), ...spec.films.map((f, j) => `${named(f.material, filmMaterials[j]!)} ${f.thicknessNm} nm`), named(spec.exit, exit)].join(" | ");
      process.stdout.write(points.length === 1 ? printPoint(points[0]!, label, spec.exit) : printSweep(points, label));
    });
}
