import type { PlaneQuadrature } from "./hemisphere.js";
import type { SpectralTables, SpectralWeights } from "./spectralTables.js";

/**
 * Per-hour spectral shapes on the matrix's wavelength grid, as current weights per W/m² of
 * broadband light (A/m² per W/m² per unit absorptance; the same units as SpectralWeights), for the
 * three kinds of light of the transposition: beam (and circumsolar), sky diffuse (isotropic sky and
 * horizon band) and ground-reflected. Row h·nLambda + λ. Hours without their own spectra hold the
 * fixed G173 shapes (beam: direct; sky and ground: global − direct·cos 11.19°), so with no hour of
 * its own the yield equals the fixed-shape yield exactly.
 */
export interface HourlySpectra {
  /** What the spectra are (for the result file and messages). */
  source: string;
  nHours: number;
  nLambda: number;
  beam: Float64Array;
  sky: Float64Array;
  ground: Float64Array;
  /** Daylight hours that carry their own spectra, and those that fell back to the G173 shapes. */
  nOwnHours: number;
  nFallbackHours: number;
  /** Assumptions worth stating beside the result. */
  notes: string[];
}

/** Spectra of a year filled with the fixed G173 shapes (builders overwrite the hours they model). */
export function fixedShapeSpectra(nHours: number, w: SpectralWeights, source: string): HourlySpectra {
  const nL = w.beam.length;
  const s: HourlySpectra = {
    source, nHours, nLambda: nL, beam: new Float64Array(nHours * nL), sky: new Float64Array(nHours * nL), ground: new Float64Array(nHours * nL),
    nOwnHours: 0, nFallbackHours: 0, notes: [],
  };
  for (let h = 0; h < nHours; h++) {
    s.beam.set(w.beam, h * nL);
    s.sky.set(w.diffuse, h * nL);
    s.ground.set(w.diffuse, h * nL);
  }
  return s;
}

/**
 * The matrix response under one plane with hourly spectra: what annualYield asks per hour, and the
 * accumulators for the Monte Carlo error. Per plane it folds the hemisphere quadrature into
 * per-wavelength vectors Q_sky,λ = Σ_node q_sky A(node, λ) (and horizon, ground), so an hour costs
 * three dot products over λ plus the beam's ≤ 4 interpolation nodes.
 */
export class HourSpectralResponse {
  kSky = 0;
  kHorizon = 0;
  kGround = 0;
  private row = 0;
  private readonly nL: number;
  private readonly qSky: Float64Array;
  private readonly qHor: Float64Array;
  private readonly qGnd: Float64Array;
  private readonly beamCoef: Float64Array;
  private readonly isoAcc: Float64Array;
  private readonly horAcc: Float64Array;
  private readonly gndAcc: Float64Array;

  constructor(private readonly s: HourlySpectra, private readonly tables: SpectralTables, private readonly quad: PlaneQuadrature, private readonly nNodes: number) {
    const nL = (this.nL = tables.nLambda);
    if (s.nLambda !== nL) throw new Error(`hourly spectra on ${s.nLambda} wavelengths, matrix on ${nL}`);
    this.qSky = this.fold(quad.sky);
    this.qHor = this.fold(quad.horizon);
    this.qGnd = this.fold(quad.ground);
    this.beamCoef = new Float64Array(nNodes * nL);
    this.isoAcc = new Float64Array(nL);
    this.horAcc = new Float64Array(nL);
    this.gndAcc = new Float64Array(nL);
  }

  private fold(q: Float64Array): Float64Array {
    const nL = this.nL, a = this.tables.absorptance, out = new Float64Array(nL);
    for (let node = 0; node < this.nNodes; node++) {
      const qn = q[node]!;
      if (qn === 0) continue;
      for (let l = 0; l < nL; l++) out[l] += qn * a[node * nL + l]!;
    }
    return out;
  }

  /** Sets hour h: K for sky, horizon and ground light (A/m² per W/m²). */
  beginHour(h: number): void {
    const nL = this.nL, r = (this.row = h * nL), sky = this.s.sky, gnd = this.s.ground;
    let ks = 0, kh = 0, kg = 0;
    for (let l = 0; l < nL; l++) {
      ks += this.qSky[l]! * sky[r + l]!;
      kh += this.qHor[l]! * sky[r + l]!;
      kg += this.qGnd[l]! * gnd[r + l]!;
    }
    this.kSky = ks;
    this.kHorizon = kh;
    this.kGround = kg;
  }

  /** Beam response Σ_q w_q Σ_λ A(node_q, λ) b_h,λ; accumulates `pointWm2c` (W/m² on the plane) for the error. */
  beam(idx: Int32Array, w: Float64Array, k: number, pointWm2c: number): number {
    const nL = this.nL, a = this.tables.absorptance, b = this.s.beam, r = this.row;
    let j = 0;
    for (let q = 0; q < k; q++) {
      const base = idx[q]! * nL, wq = w[q]!, g = pointWm2c * wq;
      let jn = 0;
      for (let l = 0; l < nL; l++) {
        jn += a[base + l]! * b[r + l]!;
        this.beamCoef[base + l] += g * b[r + l]!;
      }
      j += wq * jn;
    }
    return j;
  }

  /** Accumulates the hour's diffuse irradiances (isotropic sky, horizon band, ground) for the error. */
  addDiffuse(isoWm2: number, horWm2: number, gndWm2: number): void {
    const nL = this.nL, r = this.row, sky = this.s.sky, gnd = this.s.ground;
    for (let l = 0; l < nL; l++) {
      this.isoAcc[l] += isoWm2 * sky[r + l]!;
      this.horAcc[l] += horWm2 * sky[r + l]!;
      this.gndAcc[l] += gndWm2 * gnd[r + l]!;
    }
  }

  /** Monte Carlo variance of the year's charge: Σ_node,λ c²·se², c the charge's coefficient of A(node, λ). */
  variance(): number {
    const nL = this.nL, se = this.tables.stderr, q = this.quad;
    let v = 0;
    for (let node = 0; node < this.nNodes; node++) {
      const qs = q.sky[node]!, qh = q.horizon[node]!, qg = q.ground[node]!;
      for (let l = 0; l < nL; l++) {
        const c = this.beamCoef[node * nL + l]! + qs * this.isoAcc[l]! + qh * this.horAcc[l]! + qg * this.gndAcc[l]!;
        const s = c * se[node * nL + l]!;
        v += s * s;
      }
    }
    return v;
  }
}
