import { readFileSync } from "node:fs";
import { join } from "node:path";
import { describe, expect, it } from "vitest";
import { MaterialRegistry, absorptionCoefficientPerCm } from "../../src/materials/index.js";
import { InputError } from "../../src/util/errors.js";

const DATA = join(import.meta.dirname, "..", "..", "data", "materials");
const registry = MaterialRegistry.withBuiltins();

/** Independent reader for the shipped CSVs: rows after the header as number arrays. */
function rows(file: string): { header: string[]; data: number[][] } {
  const lines = readFileSync(join(DATA, file), "utf8").split(/\r?\n/).filter((l) => l.trim() !== "" && !l.startsWith("#"));
  return { header: lines[0]!.split(","), data: lines.slice(1).map((l) => l.split(",").map(Number)) };
}

const TABLE_FILES: Record<string, string> = {
  "Si-Green2008": "si_green2008.csv",
  "Si-Schinke2015": "si_schinke2015.csv",
  "aSi-PierceSpicer1972": "asi_pierce_spicer1972.csv",
  "SiNx-Vogt2015-n1.91": "sinx_vogt2015_n1.91.csv",
  "SiNx-Vogt2015-n2.09": "sinx_vogt2015_n2.09.csv",
  "SiNx-Vogt2015-n2.13": "sinx_vogt2015_n2.13.csv",
  "SiO2-Lemarchand2013": "sio2_lemarchand2013.csv",
  "Al2O3-Franta2015": "al2o3_ebeam_franta2015.csv",
  "Al2O3-Boidin2016": "al2o3_boidin2016_n.csv",
  "Ag-JohnsonChristy1972": "ag_johnson_christy1972.csv",
  "Ag-Jiang2016": "ag_jiang2016.csv",
  "Ag-Ciesielski2017": "ag_ciesielski2017.csv",
  "Al-Rakic1995": "al_rakic1995.csv",
  "glass-lowiron-Vogt2016": "glass_sodalime_5ppmFe_vogt2016.csv",
  "ITO-Minenkov2024": "ito_minenkov2024_glass.csv",
  "EVA-S88-Vogt2016": "eva_evasky_s88_vogt2016.csv",
  "EVA-S87-Vogt2016": "eva_evasky_s87_vogt2016.csv",
};

describe("built-in tabulated materials", () => {
  it.each(Object.entries(TABLE_FILES))("%s reproduces every row of %s exactly and spans its range", (name, file) => {
    const m = registry.get(name);
    const { header, data } = rows(file);
    const iN = header.indexOf("n");
    const iK = header.indexOf("k");
    for (const r of data) {
      const nk = m.nk(r[0]!);
      expect(nk.n).toBe(r[iN]!);
      expect(nk.k).toBe(iK < 0 ? 0 : r[iK]!); // n-only source: lossless
    }
    expect(m.minWavelengthNm).toBe(data[0]![0]);
    expect(m.maxWavelengthNm).toBe(data[data.length - 1]![0]);
    expect(m.source.length).toBeGreaterThan(10);
    expect(m.description.length).toBeGreaterThan(5);
  });

  it("has the aliases of the contract (docs/contracts.md)", () => {
    for (const a of ["air", "Si", "SiNx", "SiO2", "Al2O3", "Ag", "Al", "glass", "EVA", "ITO", "aSi", "Si3N4"]) {
      expect(registry.has(a)).toBe(true);
    }
    expect(registry.get("Si").name).toBe("Si-Green2008");
    expect(registry.get("SiNx").nk(633).n).toBeCloseTo(2.09, 2); // Vogt 2015 film labelled n = 2.09 at 633 nm
    expect(registry.get("air").nk(600)).toEqual({ n: 1, k: 0 });
  });

  it("names material, range and wavelength outside the data range, never extrapolating", () => {
    const si = registry.get("Si");
    for (const bad of [1500, 249.9, Number.NaN]) {
      let err: unknown;
      try {
        si.nk(bad);
      } catch (e) {
        err = e;
      }
      expect(err).toBeInstanceOf(InputError);
      const msg = (err as Error).message;
      expect(msg).toContain("Si-Green2008");
      expect(msg).toContain("250–1450 nm");
      expect(msg).toContain(String(bad));
    }
    expect(si.nk(1450).n).toBe(3.485); // last node is inside
  });

  it("takes a film's range as the overlap of its n and k tables (Rubin: n formula 310–4600 nm, k table 310–4600 nm)", () => {
    const g = registry.get("glass-sodalime-Rubin1985");
    expect(g.minWavelengthNm).toBe(310);
    expect(g.maxWavelengthNm).toBe(4600);
    const k = rows("glass_sodalime_clear_rubin1985_k.csv").data;
    for (const r of k) expect(g.nk(r[0]!).k).toBe(r[1]!);
  });
});

describe("absorptionCoefficientPerCm(material, wavelengthNm)", () => {
  it("is 4πk/λ of Si at 1000 nm, about 64 /cm as in Green 2008's table", () => {
    // k(1000 nm) = 5.0930e-4 read from data/materials/si_green2008.csv; α = 4πk/λ (any optics text).
    const alpha = absorptionCoefficientPerCm(registry.get("Si-Green2008"), 1000);
    expect(alpha).toBeCloseTo((4 * Math.PI * 5.093e-4) / 1e-4, 9);
    // Green 2008, Table 1: α(1000 nm) ≈ 64 /cm (from memory).
    expect(Math.abs(alpha - 64)).toBeLessThan(0.5);
  });

  it("gives a sub-micron absorption length for Si at 400 nm (1/α ≈ 0.1 µm, common practice)", () => {
    const alpha = absorptionCoefficientPerCm(registry.get("Si"), 400);
    const lengthUm = 1e4 / alpha;
    expect(lengthUm).toBeGreaterThan(0.05);
    expect(lengthUm).toBeLessThan(0.2);
  });
});

describe("formula materials", () => {
  it("Malitson 1965 fused silica: n_d = 1.4585 at 587.6 nm (Malitson 1965; usual catalogue value)", () => {
    expect(Math.abs(registry.get("SiO2-Malitson1965").nk(587.6).n - 1.4585)).toBeLessThan(5e-5);
  });

  it("Malitson 1962 sapphire ordinary ray: n_o = 1.768 at 589.3 nm (Malitson 1962)", () => {
    expect(Math.abs(registry.get("Al2O3-sapphire-Malitson1962").nk(589.3).n - 1.768)).toBeLessThan(5e-4);
  });

  it("Luke 2015 Si3N4: n ≈ 1.996 at 1550 nm (Luke et al. 2015 formula; telecom-band value of LPCVD nitride, from memory)", () => {
    expect(Math.abs(registry.get("Si3N4").nk(1550).n - 1.996)).toBeLessThan(1e-3);
  });

  // The *.formula.json files hold the coefficients as read from the source database; the formula
  // definition (database "formula 1": n² − 1 = C1 + Σ B λ²/(λ² − C²), λ in µm; "formula 5":
  // n = C1 + Σ c λ^e) is written out here independently of src/.
  const FORMULAS: Array<[string, string, string]> = [
    ["SiO2-Malitson1965", "sio2_malitson1965.formula.json", "sio2_malitson1965_n.csv"],
    ["Si3N4-Luke2015", "si3n4_luke2015.formula.json", "si3n4_luke2015_n.csv"],
    ["Si3N4-Philipp1973", "si3n4_philipp1973_baak1982.formula.json", "si3n4_philipp1973_baak1982_n.csv"],
    ["Al2O3-sapphire-Malitson1962", "al2o3_sapphire_o_malitson1962.formula.json", "al2o3_sapphire_o_malitson1962_n.csv"],
    ["Al2O3-sapphire-MalitsonDodge1972", "al2o3_sapphire_o_malitson_dodge1972.formula.json", "al2o3_sapphire_o_malitson_dodge1972_n.csv"],
    ["glass-sodalime-Rubin1985", "glass_sodalime_clear_rubin1985.formula.json", "glass_sodalime_clear_rubin1985_n.csv"],
    ["glass-lowiron-Rubin1985", "glass_sodalime_lowiron_rubin1985.formula.json", "glass_sodalime_lowiron_rubin1985_n.csv"],
  ];

  it.each(FORMULAS)("%s matches the coefficients of %s and the evaluated table %s", (name, json, csv) => {
    const f = JSON.parse(readFileSync(join(DATA, json), "utf8")) as { type: string; coefficients: number[]; wavelength_range_um: [number, number] };
    const c = f.coefficients;
    const ref = (nm: number): number => {
      const l = nm / 1000;
      if (f.type === "formula 1") {
        let n2 = 1 + c[0]!;
        for (let i = 1; i + 1 < c.length; i += 2) n2 += (c[i]! * l * l) / (l * l - c[i + 1]! ** 2);
        return Math.sqrt(n2);
      }
      let n = c[0]!;
      for (let i = 1; i + 1 < c.length; i += 2) n += c[i]! * l ** c[i + 1]!;
      return n;
    };
    const m = registry.get(name);
    expect(m.minWavelengthNm).toBeCloseTo(f.wavelength_range_um[0] * 1000, 9);
    expect(m.maxWavelengthNm).toBeCloseTo(f.wavelength_range_um[1] * 1000, 9);
    for (const r of rows(csv).data) {
      const n = m.nk(r[0]!).n;
      expect(Math.abs(n - ref(r[0]!))).toBeLessThan(1e-12);
      expect(Math.abs(n - r[1]!)).toBeLessThanOrEqual(5.000001e-7); // table written with 6 decimals
      if (f.type === "formula 1") expect(m.nk(r[0]!).k).toBe(0); // Sellmeier entries are lossless
    }
  });
});

describe("metal optical constants", () => {
  it("silver reflects about 98 % at normal incidence at 600 nm in air (R = ((n−1)² + k²)/((n+1)² + k²), Hecht; common practice)", () => {
    for (const name of ["Ag-JohnsonChristy1972", "Ag-Jiang2016"]) {
      const { n, k } = registry.get(name).nk(600);
      const r = ((n - 1) ** 2 + k * k) / ((n + 1) ** 2 + k * k);
      expect(r).toBeGreaterThan(0.96);
      expect(r).toBeLessThan(0.995);
    }
  });
});
