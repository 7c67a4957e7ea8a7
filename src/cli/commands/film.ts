import type { Command } from "commander";
import { constantIndexMaterial, parseConstantIndex } from "../../materials/constantIndex.js";
import { MaterialRegistry } from "../../materials/registry.js";
import { materialFromSpec } from "../../materials/spec.js";
import type { Material } from "../../materials/types.js";
import { filmPointText, filmSweepText, pick, type FilmPolarization } from "../../optics/filmText.js";
import { parseNumberSweep, parseStackSpec } from "../../optics/stackSpec.js";
import { evaluateStack, type FilmPoint } from "../../optics/stackEval.js";
import type { Spectrum } from "../../spectrum/types.js";
import { loadStudy } from "../../study/load.js";
import { InputError } from "../../util/errors.js";
import { photonWeightedReflectance } from "../../weighting/weightedReflectance.js";
import { spectrumOption } from "./spectral.js";

const collect = (value: string, previous: string[] = []): string[] => [...previous, value];

const POLARIZATIONS: FilmPolarization[] = ["all", "s", "p", "unpolarized"];

function polarizationOption(text: string): FilmPolarization {
  const t = text === "unpolarised" ? "unpolarized" : text;
  if ((POLARIZATIONS as string[]).includes(t)) return t as FilmPolarization;
  throw new InputError(`--polarization: expected one of ${POLARIZATIONS.join(", ")}, got "${text}"`, "e.g. --polarization s");
}

/** The catalogue, a study's own materials (--study) and user n,k tables (--nk name=file.csv). */
function filmRegistry(studyPath: string | undefined, nk: string[]): MaterialRegistry {
  const registry = studyPath === undefined ? MaterialRegistry.withBuiltins() : loadStudy(studyPath).registry;
  for (const entry of nk) {
    const eq = entry.indexOf("=");
    if (eq <= 0 || eq === entry.length - 1) throw new InputError(`--nk: expected name=file.csv, got "${entry}"`, "e.g. --nk myNitride=nitride.csv");
    const name = entry.slice(0, eq);
    registry.add(materialFromSpec({ name, csv: entry.slice(eq + 1) }, process.cwd(), `--nk ${name}`));
  }
  return registry;
}

/** Material names of the stack, or constant indices written in it ("n=2.0", "2.05+0.01i"). */
function materialResolver(registry: MaterialRegistry): (name: string) => Material {
  const constants = new Map<string, Material>();
  return (name) => {
    const c = parseConstantIndex(name);
    if (c === null) return registry.get(name);
    if (!constants.has(name)) constants.set(name, constantIndexMaterial(name, c.n, c.k));
    return constants.get(name)!;
  };
}

/** "photon-weighted R …" lines, one per angle, of a wavelength sweep (unpolarised unless asked). */
function weightedLines(points: FilmPoint[], angles: number[], pol: FilmPolarization, spectrum: Spectrum): { text: string; json: object[] } {
  const which = pol === "all" ? "unpolarized" : pol;
  const json: object[] = [];
  const lines = angles.map((a) => {
    const at = points.filter((p) => p.angleDeg === a);
    const r = photonWeightedReflectance(at.map((p) => p.wavelengthNm), at.map((p) => pick(p, which).R), spectrum);
    json.push({ angleDeg: a, polarization: which, ...r });
    return `  ${a}°: ${(100 * r.reflectance).toFixed(3)} % (${r.reflectedMaCm2.toFixed(3)} of ${r.availableMaCm2.toFixed(3)} mA/cm² reflected)`;
  });
  const lo = points[0]!.wavelengthNm;
  const hi = points[points.length - 1]!.wavelengthNm;
  const head = `photon-weighted reflectance, ${lo}–${hi} nm under ${spectrum.name} (${which === "unpolarized" ? "unpolarised" : `${which}-polarised`}; R linear between the ${new Set(points.map((p) => p.wavelengthNm)).size} wavelengths):`;
  return { text: `\n${head}\n${lines.join("\n")}\n`, json };
}

/** `lightfold film --stack "air|SiNx:75|Si" --wavelength 600 --angle 0 [--json]` */
export function register(program: Command): void {
  program
    .command("film")
    .description("reflectance, transmittance and film absorptance of a coherent thin-film stack (transfer matrices)")
    .requiredOption("--stack <stack>", 'media and films separated by "|": incidence|material:thicknessNm|…|exit')
    .option("--wavelength <nm>", "vacuum wavelength in nm: 600, a list 400,600,800 or a range 400:1100:50 (default 600; 300:1200:5 with --weighted)")
    .option("--angle <deg>", "incidence angle in degrees in the incidence medium: 0, a list 0,30,60 or a range 0:80:10", "0")
    .option("--polarization <pol>", `${POLARIZATIONS.join(", ")}: which polarisation the tables show`, "all")
    .option("--weighted [spectrum]", "photon-weighted reflectance over the wavelengths under AM1.5G, AM1.5D, G173-ETR or a spectrum CSV")
    .option("--study <file>", "also use the materials defined in this study file")
    .option("--nk <name=file.csv>", "a user n,k table (wavelength_nm,n,k) under a name; repeatable", collect)
    .option("--json", "print JSON")
    .addHelpText(
      "after",
      `
The first and last entries are semi-infinite media, the entries between are coherent films
(thickness in nm), listed from the incidence side. Names are materials or aliases from
\`lightfold materials\`, materials of --study or --nk, or a constant index: n=2.0 or 2.05+0.01i. T is the power crossing into the exit medium (absorbed there when it
absorbs, e.g. silicon or a metal); an absorbing incidence medium is taken with Re n.

Examples:
  lightfold film --stack "air|SiNx:75|Si" --wavelength 600 --angle 0
  lightfold film --stack "air|SiNx:75|Si" --wavelength 400:1100:50          pick an ARC thickness
  lightfold film --stack "EVA|SiNx:70|Si" --wavelength 600 --angle 0:80:10  angular response
  lightfold film --stack "Si|SiO2:100|Ag" --wavelength 1000 --angle 30      rear reflector from inside
  lightfold film --stack "air|SiO2:100|SiNx:60|Si" --wavelength 400:1100:100 --json   double-layer ARC
  lightfold film --stack "EVA|SiNx:75|Si" --weighted                         photon-weighted R, 300–1200 nm, AM1.5G
  lightfold film --stack "air|n=2.05+0.01i:70|Si" --weighted my-spectrum.csv --polarization s
  lightfold film --stack "air|myNitride:75|Si" --nk myNitride=nitride.csv --wavelength 500:700:10
  lightfold film --stack "EVA|encapsulantCoat:80|Si" --study configs/my.study.json

The photon-weighted reflectance is R̄ = ∫R Φ dλ / ∫Φ dλ over the wavelength range (Φ the photon flux of
the spectrum, R linear between the listed wavelengths: use a step of 10 nm or less).`,
    )
    .action((opts: FilmFlags) => {
      const spec = parseStackSpec(opts.stack, "--stack");
      const pol = polarizationOption(opts.polarization);
      const wavelengthText = opts.wavelength ?? (opts.weighted !== undefined ? "300:1200:5" : "600");
      const wavelengths = parseNumberSweep(wavelengthText, "--wavelength", 1e-3, 1e9, "nm");
      if (wavelengths.some((w) => w <= 0)) throw new InputError(`--wavelength: wavelengths must be positive`, "e.g. --wavelength 600 or --wavelength 400:1100:50 (nm)");
      const angles = parseNumberSweep(opts.angle, "--angle", 0, 90, "deg");
      const spectrum = opts.weighted === undefined ? undefined : spectrumOption(opts.weighted === true ? "AM1.5G" : opts.weighted);
      if (spectrum !== undefined && wavelengths.length < 2) throw new InputError("--weighted needs at least two wavelengths", "e.g. --wavelength 300:1200:5");
      const resolve = materialResolver(filmRegistry(opts.study, opts.nk ?? []));
      // resolve every name first, so an unknown one is reported before any output
      const incidence = resolve(spec.incidence);
      const exit = resolve(spec.exit);
      const filmMaterials = spec.films.map((f) => resolve(f.material));
      const points: FilmPoint[] = [];
      for (const a of angles) for (const w of wavelengths) points.push(evaluateStack(spec, resolve, w, a));
      if (angles.length > 1) points.sort((p, q) => p.wavelengthNm - q.wavelengthNm || p.angleDeg - q.angleDeg);
      const weighted = spectrum === undefined ? undefined : weightedLines(points, angles, pol, spectrum);
      if (opts.json === true) {
        const out = {
          stack: {
            incidence: { name: spec.incidence, material: incidence.name },
            films: spec.films.map((f, j) => ({ name: f.material, material: filmMaterials[j]!.name, thicknessNm: f.thicknessNm })),
            exit: { name: spec.exit, material: exit.name },
          },
          points,
          ...(weighted !== undefined ? { weighted: { spectrum: spectrum!.name, perAngle: weighted.json } } : {}),
        };
        process.stdout.write(JSON.stringify(out, null, 2) + "\n");
        return;
      }
      const named = (given: string, m: { name: string }): string => (given === m.name ? given : `${given} (${m.name})`);
      const label =
        [named(spec.incidence, incidence), ...spec.films.map((f, j) => `${named(f.material, filmMaterials[j]!)} ${f.thicknessNm} nm`), named(spec.exit, exit)].join(" | ");
      process.stdout.write(points.length === 1 ? filmPointText(points[0]!, label, spec.exit, pol) : filmSweepText(points, label, pol));
      if (weighted !== undefined) process.stdout.write(weighted.text);
    });
}

interface FilmFlags {
  stack: string;
  wavelength?: string;
  angle: string;
  polarization: string;
  weighted?: string | true;
  study?: string;
  nk?: string[];
  json?: boolean;
}
