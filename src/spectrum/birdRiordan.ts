import { readFileSync } from "node:fs";
import { parseNumericTable } from "../materials/numericTable.js";
import { kastenYoungAirMass } from "../sky/irradianceBasics.js";
import { DEG } from "../util/math.js";
import { dataPath } from "../util/packageRoot.js";

/**
 * Bird & Riordan simple spectral model for cloudless atmospheres: R. Bird and C. Riordan,
 * SERI/TR-215-2436 (1984); J. Climate Appl. Meteor. 25, 87–97 (1986). Equation numbers below are
 * the report's. Table: data/spectra/spctrl2-bird-riordan.csv (122 wavelengths, 300–4000 nm).
 */
export interface BirdRiordanTable {
  wavelengthNm: Float64Array;
  wavelengthUm: Float64Array;
  /** Extraterrestrial spectrum at mean Earth–Sun distance, W m⁻² nm⁻¹ (the file's per-µm ÷ 1000). */
  etrWm2PerNm: Float64Array;
  /** Absorption coefficients of water vapour, ozone (1/atm-cm) and uniformly mixed gases. */
  aw: Float64Array;
  ao: Float64Array;
  au: Float64Array;
}

let table: BirdRiordanTable | null = null;

/** The model's table, read once per process. */
export function birdRiordanTable(): BirdRiordanTable {
  if (table) return table;
  const t = parseNumericTable(readFileSync(dataPath("spectra", "spctrl2-bird-riordan.csv"), "utf8"), "data/spectra/spctrl2-bird-riordan.csv");
  const col = (name: string): Float64Array => {
    const i = t.header.indexOf(name);
    if (i < 0) throw new Error(`data/spectra/spctrl2-bird-riordan.csv lacks column ${name}`);
    return t.columns[i]!;
  };
  const nm = col("wavelength_nm");
  table = {
    wavelengthNm: nm,
    wavelengthUm: nm.map((x) => x / 1000),
    etrWm2PerNm: col("etr_w_m2_um").map((x) => x / 1000),
    aw: col("aw"),
    ao: col("ao"),
    au: col("au"),
  };
  return table;
}

/** The atmosphere of one hour. */
export interface ClearSkyAtmosphere {
  /** Surface pressure, hPa. */
  pressureHpa: number;
  precipitableWaterCm: number;
  /** Total ozone column, atm-cm. */
  ozoneAtmCm: number;
  /** Aerosol optical depth at 500 nm and Ångström exponent: τa(λ) = τ500 (λ / 0.5 µm)^−α (Eq. 2-7). */
  aod500: number;
  angstromExponent: number;
  /** Broadband ground albedo for the ground–sky multiple reflection (Eq. 3-7). */
  groundAlbedo: number;
}

/** Rural aerosol of the report: single-scattering albedo at 0.4 µm, its wavelength variation, asymmetry factor. */
export const RURAL_AEROSOL = { omega04: 0.945, omegaPrime: 0.095, asymmetry: 0.65 } as const;
/** The report's reference surface pressure, hPa (M' = M P / P0). */
export const P0_HPA = 1013;
/** Air mass of the diffuse ground–sky reflection terms (primed quantities, Section 3.1). */
const M_PRIME = 1.8;

/** Transmittance of the uniformly mixed gases (Eq. 2-11) and water vapour (Eq. 2-8) at air mass m; 1 where the coefficient is 0. */
function mixedGas(au: number, m: number): number {
  return au === 0 ? 1 : Math.exp((-1.41 * au * m) / Math.pow(1 + 118.93 * au * m, 0.45));
}
function waterVapour(aw: number, w: number, m: number): number {
  return aw === 0 ? 1 : Math.exp((-0.2385 * aw * w * m) / Math.pow(1 + 20.07 * aw * w * m, 0.45));
}

/** Per-wavelength constants of the model (independent of sun and atmosphere), computed once per table. */
interface Derived {
  /** Rayleigh optical depth at unit air mass, 1/(λ⁴ (115.6406 − 1.335/λ²)) (Eq. 2-4, λ in µm). */
  tauRayleigh: Float64Array;
  /** ln(λ / 0.5 µm), for τa = τ500 (λ/0.5)^−α (Eq. 2-7). */
  lnOver500: Float64Array;
  /** Aerosol single-scattering albedo ω(λ) (Eq. 3-16). */
  omega: Float64Array;
  /** Rayleigh and mixed-gas transmittance at the primed air mass 1.8 (Section 3.1). */
  trPrime: Float64Array;
  tuPrime: Float64Array;
}
const derivedOf = new WeakMap<BirdRiordanTable, Derived>();

function derived(t: BirdRiordanTable): Derived {
  let d = derivedOf.get(t);
  if (d) return d;
  const n = t.wavelengthUm.length;
  const { omega04, omegaPrime } = RURAL_AEROSOL;
  d = { tauRayleigh: new Float64Array(n), lnOver500: new Float64Array(n), omega: new Float64Array(n), trPrime: new Float64Array(n), tuPrime: new Float64Array(n) };
  for (let i = 0; i < n; i++) {
    const lam = t.wavelengthUm[i]!, l2 = lam * lam;
    d.tauRayleigh[i] = 1 / (l2 * l2 * (115.6406 - 1.335 / l2));
    d.lnOver500[i] = Math.log(lam / 0.5);
    d.omega[i] = omega04 * Math.exp(-omegaPrime * Math.log(lam / 0.4) ** 2);
    d.trPrime[i] = Math.exp(-d.tauRayleigh[i]! * M_PRIME);
    d.tuPrime[i] = mixedGas(t.au[i]!, M_PRIME);
  }
  derivedOf.set(t, d);
  return d;
}

/**
 * Direct normal and diffuse horizontal spectral irradiance (W m⁻² nm⁻¹ on the table's grid) for the
 * sun at apparent zenith `zenithDeg` and Earth–Sun distance factor `earthSunFactor` ((R_av/R)²):
 *   I_d = H0 D Tr Ta Tw To Tu (Eq. 2-1); diffuse I_s = (I_r + I_a + I_g) C_s (Eq. 3-1) with the
 *   Rayleigh (3-5), aerosol (3-6) and ground–sky (3-7, 3-8) parts and C_s = (λ + 0.55)^1.8 below 0.45 µm (3-17).
 * Air mass: Kasten & Young (1989) (the report uses Kasten 1966; they differ by under 0.1 % below 80°).
 * Writes zeros with the sun at or below the horizon. No allocation (per-wavelength constants cached).
 */
export function birdRiordanInto(t: BirdRiordanTable, zenithDeg: number, earthSunFactor: number, atm: ClearSkyAtmosphere, directNormal: Float64Array, diffuseHorizontal: Float64Array): void {
  const n = t.wavelengthUm.length;
  if (!(zenithDeg < 90)) {
    directNormal.fill(0, 0, n);
    diffuseHorizontal.fill(0, 0, n);
    return;
  }
  const d = derived(t);
  const cz = Math.cos(zenithDeg * DEG);
  const m = kastenYoungAirMass(zenithDeg);
  const mp = (m * atm.pressureHpa) / P0_HPA;
  // ozone air mass, Robinson as given by Iqbal (Section 2.4), ozone layer at 22 km: (1 + 22/6370) / (cos²Z + 2·22/6370)^0.5
  const mo = (1 + 22 / 6370) / Math.sqrt(cz * cz + (2 * 22) / 6370);
  const alg = Math.log(1 - RURAL_AEROSOL.asymmetry); // Eq. 3-14
  const afs = alg * (1.459 + alg * (0.1595 + alg * 0.4129)); // Eq. 3-12
  const bfs = alg * (0.0783 + alg * (-0.3824 - alg * 0.5874)); // Eq. 3-13
  const fs = 1 - 0.5 * Math.exp((afs + bfs * cz) * cz); // Eq. 3-11
  const fsp = 1 - 0.5 * Math.exp((afs + bfs / M_PRIME) / M_PRIME); // Eq. 3-15 (Z' with cos Z' = 1/1.8)
  const w = atm.precipitableWaterCm, rg = atm.groundAlbedo, alpha = atm.angstromExponent;
  for (let i = 0; i < n; i++) {
    const lam = t.wavelengthUm[i]!;
    const h0 = t.etrWm2PerNm[i]! * earthSunFactor;
    const tauA = atm.aod500 * Math.exp(-alpha * d.lnOver500[i]!); // Eq. 2-7
    const omega = d.omega[i]!;
    const kr = d.tauRayleigh[i]! * mp;
    const tr = Math.exp(-kr); // Eq. 2-4
    const ta = Math.exp(-tauA * m); // Eq. 2-6
    const tw = waterVapour(t.aw[i]!, w, m);
    const to = t.ao[i] === 0 ? 1 : Math.exp(-t.ao[i]! * atm.ozoneAtmCm * mo); // Eq. 2-9
    const tu = mixedGas(t.au[i]!, mp);
    const tas = Math.exp(-omega * tauA * m); // Eq. 3-9
    const taa = ta / tas; // Eq. 3-10: exp(−(1 − ω) τa M)
    const dir = h0 * tr * ta * tw * to * tu; // Eq. 2-1
    // sky reflectivity for ground-reflected light (Eq. 3-8), primed quantities at M = 1.8
    const trp = d.trPrime[i]!, tasp = Math.exp(-omega * tauA * M_PRIME), taap = Math.exp(-tauA * M_PRIME) / tasp;
    const rs = d.tuPrime[i]! * waterVapour(t.aw[i]!, w, M_PRIME) * taap * (0.5 * (1 - trp) + (1 - fsp) * trp * (1 - tasp));
    const base = h0 * cz * to * tu * tw * taa;
    const ir = base * (1 - Math.exp(-0.95 * kr)) * 0.5; // Eq. 3-5 (Tr^0.95)
    const ia = base * Math.exp(-1.5 * kr) * (1 - tas) * fs; // Eq. 3-6 (Tr^1.5)
    const ig = ((dir * cz + ir + ia) * rs * rg) / (1 - rs * rg); // Eq. 3-7
    const cs = lam <= 0.45 ? Math.pow(lam + 0.55, 1.8) : 1; // Eq. 3-17
    directNormal[i] = dir;
    diffuseHorizontal[i] = (ir + ia + ig) * cs;
  }
}

/**
 * Global spectral irradiance on a tilted plane (Eq. 3-18, after Hay & Davies): beam, circumsolar part
 * of the diffuse weighted by I_d/(H0 D), isotropic rest, and ground reflection with the model's
 * constant albedo:
 *   I_T = I_d cos θ + I_s [ (I_d/(H0 D)) cos θ / cos Z + ½ (1 − I_d/(H0 D)) (1 + cos t) ] + ½ (I_d cos Z + I_s) r_g (1 − cos t).
 */
export function birdRiordanTiltedInto(t: BirdRiordanTable, zenithDeg: number, incidenceDeg: number, tiltDeg: number, earthSunFactor: number, atm: ClearSkyAtmosphere, out: Float64Array): void {
  const n = t.wavelengthUm.length;
  const dir = new Float64Array(n), dif = new Float64Array(n);
  birdRiordanInto(t, zenithDeg, earthSunFactor, atm, dir, dif);
  const cz = Math.cos(zenithDeg * DEG), ci = Math.max(0, Math.cos(incidenceDeg * DEG)), ct = Math.cos(tiltDeg * DEG);
  for (let i = 0; i < n; i++) {
    const h0 = t.etrWm2PerNm[i]! * earthSunFactor;
    const k = h0 > 0 ? dir[i]! / h0 : 0;
    const ground = 0.5 * (dir[i]! * cz + dif[i]!) * atm.groundAlbedo * (1 - ct);
    out[i] = dir[i]! * ci + dif[i]! * ((k * ci) / cz + 0.5 * (1 - k) * (1 + ct)) + ground;
  }
}
