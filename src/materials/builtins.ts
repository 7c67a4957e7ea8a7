import { readBuiltinTable } from "./catalogFiles.js";
import { ComposedMaterial, type MaterialInfo } from "./composedMaterial.js";
import { constantCurve, formulaCurve, tableCurve, type Curve } from "./curve.js";
import { powerSeriesIndex, sellmeierIndex } from "./formulas.js";
import type { CatalogMaterial } from "./types.js";

/** Material measured as a table of n and k (n-only tables: k = 0, i.e. lossless). */
function table(info: Omit<MaterialInfo, "kind">, fileName: string): CatalogMaterial {
  return new ComposedMaterial({ ...info, kind: "table" }, () => {
    const t = readBuiltinTable(fileName);
    const n = tableCurve(t.wavelengthNm, t.n!, "linear");
    const k: Curve = t.k ? tableCurve(t.wavelengthNm, t.k, "logPositive") : constantCurve(0, n.minNm, n.maxNm);
    return { n, k };
  });
}

/** Lossless Sellmeier material: n² = 1 + Σ Bᵢλ²/(λ² − Cᵢ²), resonance wavelengths Cᵢ in µm. */
function sellmeier(info: Omit<MaterialInfo, "kind">, B: number[], cUm: number[], minNm: number, maxNm: number): CatalogMaterial {
  const cUm2 = cUm.map((c) => c * c);
  return new ComposedMaterial({ ...info, kind: "formula" }, () => ({
    n: formulaCurve((w) => sellmeierIndex(w, B, cUm2), minNm, maxNm),
    k: constantCurve(0, minNm, maxNm),
  }));
}

/** Rubin 1985 soda-lime glass: n = 1.5130 − 0.003169 λ² + 0.003962 λ⁻² (λ in µm, 310–4600 nm), k tabulated. */
function rubinGlass(info: Omit<MaterialInfo, "kind">, kFile: string): CatalogMaterial {
  return new ComposedMaterial({ ...info, kind: "formula" }, () => {
    const t = readBuiltinTable(kFile);
    return {
      n: formulaCurve((w) => powerSeriesIndex(w, 1.513, [-0.003169, 0.003962], [2, -2]), 310, 4600),
      k: tableCurve(t.wavelengthNm, t.k!, "logPositive"),
    };
  });
}

function constant(info: Omit<MaterialInfo, "kind">, n: number, k: number, minNm: number, maxNm: number): CatalogMaterial {
  return new ComposedMaterial({ ...info, kind: "constant" }, () => ({
    n: constantCurve(n, minNm, maxNm),
    k: constantCurve(k, minNm, maxNm),
  }));
}

const VOGT_THESIS =
  "M. R. Vogt, Development of physical models for the simulation of optical properties of solar cell modules, PhD thesis, Leibniz Universität Hannover (2015), TIBKAT:852464657";
const VOGT_EVA =
  "M. R. Vogt et al., Optical constants of UV transparent EVA and the impact on the PV module output power under realistic illumination, Energy Procedia 92, 523-530 (2016), doi:10.1016/j.egypro.2016.07.136";
const RUBIN =
  "M. Rubin, Optical properties of soda lime silica glasses, Sol. Energy Mater. 12, 275-288 (1985), doi:10.1016/0165-1633(85)90052-8";

/** Every built-in material, in listing order. Tables are read on first use. */
export function builtinMaterials(): CatalogMaterial[] {
  return [
    constant(
      {
        name: "air",
        description: "air / vacuum, n = 1, k = 0 (dispersion of air, about 3e-4 in n, neglected; common practice)",
        source: "definition (n = 1)",
        shortSource: "n = 1",
      },
      1,
      0,
      100,
      100000,
    ),
    ...silicon(),
    ...nitrides(),
    ...oxides(),
    ...metals(),
    ...moduleLayers(),
  ];
}

/** Crystalline and amorphous silicon. */
function silicon(): CatalogMaterial[] {
  return [
    table(
      {
        name: "Si-Green2008",
        description: "crystalline silicon, intrinsic, 300 K (self-consistent n, k)",
        source:
          "M. A. Green, Self-consistent optical parameters of intrinsic silicon at 300K including temperature coefficients, Sol. Energ. Mat. Sol. Cells 92, 1305-1310 (2008), doi:10.1016/j.solmat.2008.06.009",
        shortSource: "Green 2008",
      },
      "si_green2008.csv",
    ),
    table(
      {
        name: "Si-Schinke2015",
        description: "crystalline silicon, 295 K (band-to-band absorption with uncertainty analysis)",
        source:
          "C. Schinke et al., Uncertainty analysis for the coefficient of band-to-band absorption of crystalline silicon, AIP Advances 5, 067168 (2015), doi:10.1063/1.4923379",
        shortSource: "Schinke 2015",
      },
      "si_schinke2015.csv",
    ),
    table(
      {
        name: "aSi-PierceSpicer1972",
        description: "amorphous silicon (unhydrogenated), 60 nm evaporated film",
        source:
          "D. T. Pierce, W. E. Spicer, Electronic structure of amorphous Si from photoemission and optical studies, Phys. Rev. B 5, 3017-3029 (1972), doi:10.1103/PhysRevB.5.3017; values as in Palik, Handbook of Optical Constants of Solids (1985)",
        shortSource: "Pierce & Spicer 1972",
      },
      "asi_pierce_spicer1972.csv",
    ),
  ];
}

/** Silicon nitrides: PECVD SiNx of three indices and stoichiometric Si3N4. */
function nitrides(): CatalogMaterial[] {
  return [
    table(
      {
        name: "SiNx-Vogt2015-n1.91",
        description: "PECVD silicon nitride film, n = 1.91 at 633 nm (105 nm on polished Si)",
        source: VOGT_THESIS,
        shortSource: "Vogt 2015",
      },
      "sinx_vogt2015_n1.91.csv",
    ),
    table(
      {
        name: "SiNx-Vogt2015-n2.09",
        description: "PECVD silicon nitride film, n = 2.09 at 633 nm (67 nm on polished Si); typical cell ARC",
        source: VOGT_THESIS,
        shortSource: "Vogt 2015",
      },
      "sinx_vogt2015_n2.09.csv",
    ),
    table(
      {
        name: "SiNx-Vogt2015-n2.13",
        description: "PECVD silicon nitride film, n = 2.13 at 633 nm (85 nm on polished Si)",
        source: VOGT_THESIS,
        shortSource: "Vogt 2015",
      },
      "sinx_vogt2015_n2.13.csv",
    ),
    // Luke 2015 Sellmeier: B = 3.0249, 40314; C = 0.1353406, 1239.842 µm; valid 0.310–5.504 µm.
    sellmeier(
      {
        name: "Si3N4-Luke2015",
        description: "stoichiometric LPCVD Si3N4 film, Sellmeier formula, lossless (k = 0)",
        source:
          "K. Luke, Y. Okawachi, M. R. E. Lamont, A. L. Gaeta, M. Lipson, Broadband mid-infrared frequency comb generation in a Si3N4 microresonator, Opt. Lett. 40, 4823-4826 (2015), doi:10.1364/OL.40.004823",
        shortSource: "Luke 2015",
      },
      [3.0249, 40314],
      [0.1353406, 1239.842],
      310,
      5504,
    ),
    // Bååk 1982 one-term Sellmeier fitted to Philipp 1973: B = 2.8939, C = 0.13967 µm; valid 0.207–1.24 µm.
    sellmeier(
      {
        name: "Si3N4-Philipp1973",
        description: "Si3N4, one-term Sellmeier formula (Bååk 1982 fit to Philipp 1973), lossless (k = 0)",
        source:
          "H. R. Philipp, Optical properties of silicon nitride, J. Electrochem. Soc. 120, 295-300 (1973), doi:10.1149/1.2403440; formula: T. Bååk, Appl. Opt. 21, 1069-1072 (1982), doi:10.1364/AO.21.001069",
        shortSource: "Philipp 1973 / Bååk 1982",
      },
      [2.8939],
      [0.13967],
      207,
      1240,
    ),
    // Malitson 1965 fused silica: B = 0.6961663, 0.4079426, 0.8974794; C = 0.0684043, 0.1162414, 9.896161 µm.
  ];
}

/** SiO2 and Al2O3 (films, and sapphire for reference). */
function oxides(): CatalogMaterial[] {
  return [
    sellmeier(
      {
        name: "SiO2-Malitson1965",
        description: "fused silica (amorphous SiO2), 20 °C, Sellmeier formula, lossless (k = 0)",
        source:
          "I. H. Malitson, Interspecimen comparison of the refractive index of fused silica, J. Opt. Soc. Am. 55, 1205-1208 (1965), doi:10.1364/JOSA.55.001205; IR validity: C. Z. Tan, J. Non-Cryst. Solids 223, 158-163 (1998)",
        shortSource: "Malitson 1965",
      },
      [0.6961663, 0.4079426, 0.8974794],
      [0.0684043, 0.1162414, 9.896161],
      210,
      6700,
    ),
    table(
      {
        name: "SiO2-Lemarchand2013",
        description: "magnetron-sputtered SiO2 film (580 nm on BK7), with weak absorption",
        source:
          "F. Lemarchand (2013); method: L. Gao, F. Lemarchand, M. Lequime, Opt. Express 20, 15734-15751 (2012), doi:10.1364/OE.20.015734",
        shortSource: "Lemarchand 2013",
      },
      "sio2_lemarchand2013.csv",
    ),
    table(
      {
        name: "Al2O3-Franta2015",
        description: "e-beam evaporated Al2O3 film (121.5 nm on c-Si), amorphous",
        source:
          "D. Franta, D. Nečas, I. Ohlídal, A. Giglia, Dispersion model for optical thin films applicable in wide spectral range, Proc. SPIE 9628, 96281U (2015), doi:10.1117/12.2190104",
        shortSource: "Franta 2015",
      },
      "al2o3_ebeam_franta2015.csv",
    ),
    table(
      {
        name: "Al2O3-Boidin2016",
        description: "amorphous pulsed-laser-deposited Al2O3 film; the source gives n only, used as lossless (k = 0)",
        source:
          "R. Boidin, T. Halenkovič, V. Nazabal, L. Beneš, P. Němec, Pulsed laser deposited alumina thin films, Ceramics International 42, 1177-1182 (2016), doi:10.1016/j.ceramint.2015.09.048",
        shortSource: "Boidin 2016",
      },
      "al2o3_boidin2016_n.csv",
    ),
    // Malitson 1962 sapphire (ordinary ray): B = 1.023798, 1.058264, 5.280792; C = 0.06144821, 0.1106997, 17.92656 µm.
    sellmeier(
      {
        name: "Al2O3-sapphire-Malitson1962",
        description: "synthetic sapphire, ordinary ray, 24 °C, Sellmeier formula, lossless (k = 0)",
        source:
          "I. H. Malitson, Refraction and dispersion of synthetic sapphire, J. Opt. Soc. Am. 52, 1377-1379 (1962), doi:10.1364/JOSA.52.001377",
        shortSource: "Malitson 1962",
      },
      [1.023798, 1.058264, 5.280792],
      [0.06144821, 0.1106997, 17.92656],
      265.2,
      5577,
    ),
    // Malitson & Dodge 1972 sapphire (ordinary ray): B = 1.4313493, 0.65054713, 5.3414021; C = 0.0726631, 0.1193242, 18.028251 µm.
    sellmeier(
      {
        name: "Al2O3-sapphire-MalitsonDodge1972",
        description: "synthetic sapphire, ordinary ray, 20 °C, Sellmeier formula, lossless (k = 0)",
        source:
          "I. H. Malitson, M. J. Dodge, J. Opt. Soc. Am. 62, 1405 (1972) (abstract); formula: M. J. Dodge, Handbook of Laser Science and Technology, Vol. IV, Part 2, CRC Press (1986), p. 30",
        shortSource: "Malitson & Dodge 1972",
      },
      [1.4313493, 0.65054713, 5.3414021],
      [0.0726631, 0.1193242, 18.028251],
      200,
      5000,
    ),
  ];
}

/** Rear and contact metals. */
function metals(): CatalogMaterial[] {
  return [
    table(
      {
        name: "Ag-JohnsonChristy1972",
        description: "silver, evaporated films, room temperature",
        source:
          "P. B. Johnson, R. W. Christy, Optical constants of the noble metals, Phys. Rev. B 6, 4370-4379 (1972), doi:10.1103/PhysRevB.6.4370",
        shortSource: "Johnson & Christy 1972",
      },
      "ag_johnson_christy1972.csv",
    ),
    table(
      {
        name: "Ag-Jiang2016",
        description: "silver, overlayer-protected films on SiNx and glass (fresh and annealed), 1 nm grid",
        source:
          "Y. Jiang, S. Pillai, M. A. Green, Realistic silver optical constants for plasmonics, Sci. Rep. 6, 30605 (2016), doi:10.1038/srep30605",
        shortSource: "Jiang 2016",
      },
      "ag_jiang2016.csv",
    ),
    table(
      {
        name: "Ag-Ciesielski2017",
        description: "silver, 20 nm film on SiO2 (no data between 1347.8 and 1441.9 nm: interpolated across)",
        source:
          "A. Ciesielski, L. Skowronski, M. Trzinski (spelling as in the data file), T. Szoplik, Controlling the optical parameters of self-assembled silver films with wetting layers and annealing, Appl. Surf. Sci. 421B, 349-356 (2017), doi:10.1016/j.apsusc.2017.01.039",
        shortSource: "Ciesielski 2017",
      },
      "ag_ciesielski2017.csv",
    ),
    table(
      {
        name: "Al-Rakic1995",
        description: "aluminium, evaporated films",
        source:
          "A. D. Rakić, Algorithm for the determination of intrinsic optical constants of metal films: application to aluminum, Appl. Opt. 34, 4755-4767 (1995), doi:10.1364/AO.34.004755",
        shortSource: "Rakić 1995",
      },
      "al_rakic1995.csv",
    ),
  ];
}

/** Module glass, the transparent conductive oxide and encapsulants. */
function moduleLayers(): CatalogMaterial[] {
  return [
    table(
      {
        name: "glass-lowiron-Vogt2016",
        description: "low-iron soda-lime module glass, 5 ppm Fe2O3, room temperature",
        source:
          "M. R. Vogt et al., Measurement of the optical constants of soda-lime glasses in dependence of iron content, and modeling of iron-related power losses in crystalline Si solar cell modules, IEEE J. Photovolt. 6, 111-118 (2016), doi:10.1109/JPHOTOV.2015.2498043",
        shortSource: "Vogt 2016",
      },
      "glass_sodalime_5ppmFe_vogt2016.csv",
    ),
    rubinGlass(
      {
        name: "glass-sodalime-Rubin1985",
        description: "clear soda-lime silica window glass; n from Rubin's formula, k tabulated",
        source: RUBIN,
        shortSource: "Rubin 1985",
      },
      "glass_sodalime_clear_rubin1985_k.csv",
    ),
    rubinGlass(
      {
        name: "glass-lowiron-Rubin1985",
        description: "low-iron soda-lime silica window glass; n from Rubin's formula, k tabulated",
        source: RUBIN,
        shortSource: "Rubin 1985",
      },
      "glass_sodalime_lowiron_rubin1985_k.csv",
    ),
    table(
      {
        name: "ITO-Minenkov2024",
        description: "indium tin oxide, 110 nm film on glass (ellipsometry)",
        source:
          "A. Minenkov et al., Monitoring the electrochemical failure of indium tin oxide electrodes via operando ellipsometry, ACS Appl. Mater. Interfaces 16, 9517-9531 (2024), doi:10.1021/acsami.3c17923",
        shortSource: "Minenkov 2024",
      },
      "ito_minenkov2024_glass.csv",
    ),
    table(
      {
        name: "EVA-S88-Vogt2016",
        description: "EVA encapsulant EVASKY S88, conventional (UV-absorbing)",
        source: VOGT_EVA,
        shortSource: "Vogt 2016",
      },
      "eva_evasky_s88_vogt2016.csv",
    ),
    table(
      {
        name: "EVA-S87-Vogt2016",
        description: "EVA encapsulant EVASKY S87, UV-transparent",
        source: VOGT_EVA,
        shortSource: "Vogt 2016",
      },
      "eva_evasky_s87_vogt2016.csv",
    ),
    constant(
      {
        name: "encapsulant-n1.50",
        description:
          "constant-index encapsulant, n = 1.50, k = 0 (common practice for EVA/POE in the visible and near IR; ignores UV absorption)",
        source: "common practice (typical EVA n ≈ 1.48-1.50 in the visible)",
        shortSource: "common practice",
      },
      1.5,
      0,
      300,
      2500,
    ),
  ];
}

/** Short names resolving to a built-in material. */
export const BUILTIN_ALIASES: Readonly<Record<string, string>> = {
  Si: "Si-Green2008",
  aSi: "aSi-PierceSpicer1972",
  SiNx: "SiNx-Vogt2015-n2.09",
  Si3N4: "Si3N4-Luke2015",
  SiO2: "SiO2-Malitson1965",
  Al2O3: "Al2O3-Franta2015",
  Ag: "Ag-JohnsonChristy1972",
  Al: "Al-Rakic1995",
  glass: "glass-lowiron-Vogt2016",
  ITO: "ITO-Minenkov2024",
  EVA: "EVA-S88-Vogt2016",
};
