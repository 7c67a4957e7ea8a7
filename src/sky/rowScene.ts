import { rowEdges, type RowGeometry } from "./rowGeometry.js";

/** What a sightline meets: the sky, a module row, or the ground (cell index ≥ 0). */
export const SEES_SKY = -1;
export const SEES_ROW = -2;

/** Rows considered on each side of a ground point for its sky view (farther rows lie in a band ≲ (h/(M·pitch))² wide). */
export const ROWS_EACH_SIDE = 100;
/** Isolated row: the ground is split into cells over ±(this × (top-edge height + slant)), plus one far cell per side. */
export const ISOLATED_WINDOW_FACTOR = 25;
/** Isolated row: cell edges u = W sinh(a t)/sinh(a), t uniform in [−1, 1] — central cells about 1/20 of (height + slant), outer ones 2×. */
const ISOLATED_STRETCH = 4.5;

/**
 * The 2D scene of the rear-light model: row 0 (the module studied), its neighbours at the pitch, and
 * the ground split into cells. With rows the ground is periodic and one pitch is split into
 * `nCells` equal cells (cell 0 starts below row 0's centre); an isolated row gets `nCells` cells over
 * a window [−W, W], fine under the module and wider outward, and two far cells (index nCells:
 * u < −W, nCells + 1: u ≥ W).
 */
export class RowScene {
  readonly geometry: RowGeometry;
  readonly uA: number; readonly zA: number; readonly uB: number; readonly zB: number;
  readonly pitch: number;
  readonly periodic: boolean;
  readonly nInner: number;
  readonly nCells: number;
  readonly windowM: number;
  readonly zTop: number;
  /** Isolated row: the nInner + 1 cell edges along u. */
  readonly edges: Float64Array | null;

  constructor(g: RowGeometry, nCells = 100) {
    this.geometry = g;
    [this.uA, this.zA, this.uB, this.zB] = rowEdges(g);
    this.periodic = g.pitchM !== null;
    this.pitch = g.pitchM ?? Infinity;
    this.nInner = nCells;
    this.nCells = this.periodic ? nCells : nCells + 2;
    this.zTop = Math.max(this.zA, this.zB);
    this.windowM = ISOLATED_WINDOW_FACTOR * (this.zTop + g.slantLengthM);
    this.edges = null;
    if (!this.periodic) {
      const e = new Float64Array(nCells + 1), a = ISOLATED_STRETCH;
      for (let j = 0; j <= nCells; j++) e[j] = (this.windowM * Math.sinh(a * (2 * j / nCells - 1))) / Math.sinh(a);
      e[0] = -this.windowM; e[nCells] = this.windowM;
      this.edges = e;
    }
  }

  /** Ground cell holding ground position u. */
  cellOf(u: number): number {
    if (this.periodic) {
      const f = u / this.pitch - Math.floor(u / this.pitch);
      return Math.min(this.nInner - 1, Math.floor(f * this.nInner));
    }
    if (u < -this.windowM) return this.nInner;
    if (u >= this.windowM) return this.nInner + 1;
    const e = this.edges!;
    let lo = 0, hi = this.nInner - 1;
    while (lo < hi) {
      const mid = (lo + hi + 1) >> 1;
      if (e[mid]! <= u) lo = mid; else hi = mid - 1;
    }
    return lo;
  }

  /** [start, end] of inner cell k along u (one period, or the isolated window). */
  cellBounds(k: number): [number, number] {
    if (!this.periodic) return [this.edges![k]!, this.edges![k + 1]!];
    const w = this.pitch / this.nInner;
    return [k * w, (k + 1) * w];
  }

  /**
   * Follows a sightline from (pu, pz) along the unit 2D direction (du, dz), ignoring row 0 (the
   * sightline starts on it): SEES_ROW when another row is met first, else the ground cell where it
   * meets z = 0, else SEES_SKY.
   */
  cast(pu: number, pz: number, du: number, dz: number): number {
    const tEnd = dz < 0 ? -pz / dz : dz > 0 ? Math.max(0, (this.zTop - pz) / dz) : Infinity;
    if (this.periodic) {
      const half = 0.5 * Math.abs(this.uA - this.uB);
      const uEnd = pu + (Number.isFinite(tEnd) ? tEnd * du : Math.sign(du) * 1e300);
      const lo = Math.min(pu, uEnd) - half, hi = Math.max(pu, uEnd) + half;
      let k0 = Math.ceil(lo / this.pitch), k1 = Math.floor(hi / this.pitch);
      // at most 20000 rows along one sightline (a near-horizontal line between the rows' heights meets a row long before)
      k0 = Math.max(k0, -20000); k1 = Math.min(k1, 20000);
      const step = du >= 0 ? 1 : -1;
      for (let k = step > 0 ? k0 : k1; step > 0 ? k <= k1 : k >= k0; k += step) {
        if (k !== 0 && this.hitsRow(k, pu, pz, du, dz)) return SEES_ROW;
      }
    }
    if (dz < 0) return this.cellOf(pu + tEnd * du);
    return SEES_SKY;
  }

  /** Whether the sightline meets row k (segment test, t > 0). */
  hitsRow(k: number, pu: number, pz: number, du: number, dz: number): boolean {
    const au = this.uA + k * this.pitch, bu = this.uB + k * this.pitch;
    const eu = bu - au, ez = this.zB - this.zA;
    const den = du * ez - dz * eu;
    if (Math.abs(den) < 1e-15) return false;
    const wu = au - pu, wz = this.zA - pz;
    const t = (wu * ez - wz * eu) / den;
    const s = (wu * dz - wz * du) / den;
    return t > 1e-12 && s >= 0 && s <= 1;
  }

  /** Row indices whose shadows or sky blocking matter around ground position u. */
  rowRange(u: number): [number, number] {
    if (!this.periodic) return [0, 0];
    const k = Math.round(u / this.pitch);
    return [k - ROWS_EACH_SIDE, k + ROWS_EACH_SIDE];
  }
}
