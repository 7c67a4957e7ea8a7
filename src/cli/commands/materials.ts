import type { Command } from "commander";
import { basename } from "node:path";
import { absorptionCoefficientPerCm } from "../../materials/absorption.js";
import { formatRangeNm } from "../../materials/composedMaterial.js";
import { MaterialRegistry } from "../../materials/registry.js";
import { materialFromSpec } from "../../materials/spec.js";
import type { CatalogMaterial, Material } from "../../materials/types.js";
import { InputError } from "../../util/errors.js";

const LIST_WAVELENGTH_NM = 600;
const DEFAULT_WAVELENGTHS_NM = [400, 600, 800, 1000, 1200];

function shortSource(m: Material): string {
  return (m as Partial<CatalogMaterial>).shortSource ?? m.source;
}

function inRange(m: Material, wavelengthNm: number): boolean {
  return wavelengthNm >= m.minWavelengthNm && wavelengthNm <= m.maxWavelengthNm;
}

function fmtN(n: number): string {
  return n.toFixed(4);
}

function fmtSci(v: number): string {
  if (v === 0) return "0";
  return Math.abs(v) >= 0.01 && Math.abs(v) < 1e4 ? v.toPrecision(4) : v.toExponential(3);
}

function table(rows: string[][]): string {
  const widths = rows[0]!.map((_, c) => Math.max(...rows.map((r) => r[c]!.length)));
  return rows.map((r) => r.map((cell, c) => (c === r.length - 1 ? cell : cell.padEnd(widths[c]!))).join("  ").trimEnd()).join("\n") + "\n";
}

/** Parses "--wavelength 600" or "--wavelength 400,600,1000" into numbers (nm). */
export function parseWavelengthList(text: string): number[] {
  const parts = text.split(",").map((s) => s.trim());
  return parts.map((p) => {
    const v = Number(p);
    if (p === "" || !Number.isFinite(v) || v <= 0) {
      throw new InputError(`--wavelength: "${p}" is not a wavelength in nm (expected e.g. 600 or 400,600,1000)`, "wavelengths are in nm, comma-separated, e.g. --wavelength 400,600,1000");
    }
    return v;
  });
}

function listMaterials(registry: MaterialRegistry, json: boolean): void {
  const aliases = registry.aliasTable();
  const aliasOf = new Map<string, string[]>();
  for (const [a, t] of Object.entries(aliases)) aliasOf.set(t, [...(aliasOf.get(t) ?? []), a]);
  const entries = registry.list().map((m) => {
    const nk = inRange(m, LIST_WAVELENGTH_NM) ? m.nk(LIST_WAVELENGTH_NM) : null;
    return { m, nk, aliases: aliasOf.get(m.name) ?? [] };
  });
  if (json) {
    const out = {
      wavelengthNm: LIST_WAVELENGTH_NM,
      materials: entries.map(({ m, nk, aliases: al }) => ({
        name: m.name,
        aliases: al,
        description: m.description,
        source: m.source,
        shortSource: shortSource(m),
        minWavelengthNm: m.minWavelengthNm,
        maxWavelengthNm: m.maxWavelengthNm,
        n: nk?.n ?? null,
        k: nk?.k ?? null,
      })),
      aliases,
    };
    process.stdout.write(JSON.stringify(out, null, 2) + "\n");
    return;
  }
  const rows = [["name", "alias", "range", "n@600nm", "k@600nm", "source"]];
  for (const { m, nk, aliases: al } of entries) {
    rows.push([
      m.name,
      al.join(","),
      formatRangeNm(m.minWavelengthNm, m.maxWavelengthNm),
      nk ? fmtN(nk.n) : "-",
      nk ? fmtSci(nk.k) : "-",
      shortSource(m),
    ]);
  }
  process.stdout.write(table(rows));
  process.stdout.write(`\n${entries.length} materials; details: lightfold materials <name> [--wavelength <nm>]\n`);
}

function showMaterial(m: Material, requestedName: string, wavelengths: number[] | null, json: boolean): void {
  const list = wavelengths ?? DEFAULT_WAVELENGTHS_NM.filter((w) => inRange(m, w));
  const values = list.map((w) => {
    const nk = m.nk(w); // throws InputError naming the range when w is outside
    return { wavelengthNm: w, n: nk.n, k: nk.k, alphaPerCm: absorptionCoefficientPerCm(m, w) };
  });
  if (json) {
    const out = {
      name: m.name,
      requested: requestedName,
      description: m.description,
      source: m.source,
      minWavelengthNm: m.minWavelengthNm,
      maxWavelengthNm: m.maxWavelengthNm,
      values,
    };
    process.stdout.write(JSON.stringify(out, null, 2) + "\n");
    return;
  }
  const head = requestedName === m.name ? m.name : `${m.name} (alias ${requestedName})`;
  process.stdout.write(`${head}: ${m.description}\nsource: ${m.source}\nrange:  ${formatRangeNm(m.minWavelengthNm, m.maxWavelengthNm)}\n\n`);
  const rows = [["wavelength_nm", "n", "k", "alpha_per_cm"]];
  for (const v of values) rows.push([String(v.wavelengthNm), fmtN(v.n), fmtSci(v.k), fmtSci(v.alphaPerCm)]);
  process.stdout.write(table(rows));
}

/** `lightfold materials [name] [--wavelength <nm>[,<nm>…]] [--csv <file>] [--json]` */
export function register(program: Command): void {
  program
    .command("materials")
    .description("list the built-in optical materials, or print n, k and alpha of one material")
    .argument("[name]", "material name or alias (e.g. Si, SiNx, Si-Schinke2015)")
    .option("--wavelength <nm>", "vacuum wavelength(s) in nm, comma-separated (default 400,600,800,1000,1200 within range)")
    .option("--csv <file>", "inspect a user n,k CSV file (wavelength_nm,n,k) instead of a built-in material")
    .option("--json", "print JSON")
    .addHelpText(
      "after",
      `
Examples:
  lightfold materials                          list built-ins: name, alias, range, n and k at 600 nm, source
  lightfold materials Si --wavelength 1000     n, k and alpha = 4*pi*k/lambda (1/cm) of Si-Green2008
  lightfold materials SiNx --wavelength 400,600,800
  lightfold materials --csv my-nitride.csv --wavelength 633   check a user table before using it
  lightfold materials --json                   machine-readable list`,
    )
    .action((name: string | undefined, opts: { wavelength?: string; csv?: string; json?: boolean }) => {
      const wavelengths = opts.wavelength === undefined ? null : parseWavelengthList(opts.wavelength);
      const json = opts.json === true;
      if (opts.csv !== undefined) {
        if (name !== undefined) throw new InputError(`give either a material name or --csv, not both`, "lightfold materials Si, or lightfold materials --csv my-film.csv");
        const stem = basename(opts.csv).replace(/\.[^.]*$/, "");
        const label = /^[A-Za-z0-9][A-Za-z0-9_.+\-]*$/.test(stem) ? stem : "csv";
        const m = materialFromSpec({ name: label, csv: opts.csv, description: `user table ${opts.csv}` }, process.cwd(), "--csv");
        showMaterial(m, m.name, wavelengths, json);
        return;
      }
      const registry = MaterialRegistry.withBuiltins();
      if (name === undefined) {
        if (wavelengths !== null) throw new InputError(
          `--wavelength needs a material name (e.g. lightfold materials Si --wavelength ${wavelengths[0]})`,
          "run `lightfold materials` for the names of the built-ins",
        );
        listMaterials(registry, json);
        return;
      }
      showMaterial(registry.get(name), name, wavelengths, json);
    });
}
