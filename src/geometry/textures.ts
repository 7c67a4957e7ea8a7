import { InputError } from "../util/errors.js";
import { RandomStream, streamKey } from "../random/stream.js";
import type { BoundaryKind, TextureSpec } from "../study/stackTypes.js";
import { heightGridVerts } from "./heightField.js";
import { SurfaceKind, meshTile, mirroredVerts, planarTile, type PyramidShape, type SurfaceTile } from "./surfaceTile.js";

const DEG = Math.PI / 180;

/** Samples per mean pyramid base for random pyramids; per period for spherical caps. */
const RANDOM_PYRAMID_SAMPLES_PER_BASE = 32;
const CAP_SAMPLES_PER_PERIOD = 96;
const MAX_GRID = 512;

/**
 * Builds the periodic tile of a texture. Base plane conventions (z = 0, heights outward from the
 * absorber): upright pyramids, grooves, random pyramids, caps and height maps have their lowest
 * points (valleys, pyramid bases) at 0; inverted pyramids and dimples have their rims (the plane
 * of the pyramid bases) at 0 and reach down to negative heights. The absorber thickness is measured
 * between the base planes of front and rear.
 */
export function buildSurface(spec: TextureSpec, boundary: BoundaryKind, fieldPath: string): SurfaceTile {
  switch (spec.type) {
    case "planar":
      return planarTile(1);
    case "lambertian":
      return planarTile(1, SurfaceKind.LAMBERTIAN);
    case "upright-pyramids":
    case "inverted-pyramids": {
      const a = spec.baseUm;
      const hUm = (Math.tan(spec.facetAngleDeg * DEG) * a) / 2;
      const apexZ = spec.type === "upright-pyramids" ? hUm : -hUm;
      const c = a / 2;
      const verts = [
        0, 0, 0, a, 0, 0, c, c, apexZ,
        a, 0, 0, a, a, 0, c, c, apexZ,
        a, a, 0, 0, a, 0, c, c, apexZ,
        0, a, 0, 0, 0, 0, c, c, apexZ,
      ];
      const label = `${spec.type === "upright-pyramids" ? "upright" : "inverted"} pyramids, base ${a} µm, facets ${spec.facetAngleDeg}°`;
      const shape: PyramidShape = { inverted: spec.type === "inverted-pyramids", baseUm: a, facetAngleDeg: spec.facetAngleDeg };
      return finish(verts, a, a, 2, 2, boundary, label, 0, shape);
    }
    case "grooves": {
      const p = spec.periodUm;
      const hUm = (Math.tan(spec.facetAngleDeg * DEG) * p) / 2;
      const m = p / 2;
      // Grooves run along x; ridge at y = p/2. The orientation rotates the tile frame.
      const verts = [
        0, 0, 0, p, 0, 0, p, m, hUm,
        0, 0, 0, p, m, hUm, 0, m, hUm,
        0, m, hUm, p, m, hUm, p, p, 0,
        0, m, hUm, p, p, 0, 0, p, 0,
      ];
      return finish(verts, p, p, 1, 2, boundary, `V-grooves, period ${p} µm, facets ${spec.facetAngleDeg}°, along ${spec.orientationDeg}°`, spec.orientationDeg);
    }
    case "random-pyramids":
      return randomPyramids(spec, boundary);
    case "spherical-caps":
      return sphericalCaps(spec, boundary);
    case "height-map": {
      if (spec.grid === undefined) {
        throw new InputError(`${fieldPath}.csv: height map ${spec.csv} was not loaded`, "load the study with its file (baseDir) so the CSV can be read");
      }
      const { nx, ny, heightsUm } = spec.grid;
      let hMin = Infinity;
      for (let i = 0; i < heightsUm.length; i++) hMin = Math.min(hMin, heightsUm[i]);
      const shifted = heightsUm.map((h) => h - hMin);
      const verts = heightGridVerts(shifted, nx, ny, spec.pitchUm, spec.pitchUm);
      return finish(verts, nx * spec.pitchUm, ny * spec.pitchUm, accelCells(nx), accelCells(ny), boundary, `height map ${spec.csv} (${nx} × ${ny}, pitch ${spec.pitchUm} µm)`, 0);
    }
  }
}

function finish(
  verts: ArrayLike<number>,
  lx: number,
  ly: number,
  gx: number,
  gy: number,
  boundary: BoundaryKind,
  label: string,
  rotationDeg: number,
  pyramid: PyramidShape | null = null,
): SurfaceTile {
  // Regular pyramids are symmetric, so their mirror images are the same periodic pyramids.
  if (boundary === "mirror") {
    return meshTile(mirroredVerts(verts, lx, ly), 2 * lx, 2 * ly, 2 * gx, 2 * gy, `${label}, mirror walls`, rotationDeg, pyramid);
  }
  return meshTile(verts, lx, ly, gx, gy, label, rotationDeg, pyramid);
}

/**
 * Random upright pyramids: `count` square pyramids with random centres (uniform over the tile) and
 * base sizes mean·(1 + spread·N(0,1)) (clipped at 0.25·mean), all with the same facet angle and
 * axis-aligned edges (as alkaline etching gives). The surface is the tallest of them at each point
 * (periodic), sampled on a grid of mean/32 and triangulated (centres and sizes snapped to it).
 */
function randomPyramids(spec: Extract<TextureSpec, { type: "random-pyramids" }>, boundary: BoundaryKind): SurfaceTile {
  const rng = new RandomStream(streamKey(spec.seed, "random-pyramids"));
  const L = spec.tileUm;
  const n = spec.count;
  const cx = new Float64Array(n);
  const cy = new Float64Array(n);
  const half = new Float64Array(n);
  for (let k = 0; k < n; k++) {
    cx[k] = rng.next() * L;
    cy[k] = rng.next() * L;
    // Box–Muller normal deviate.
    const g = Math.sqrt(-2 * Math.log(rng.next())) * Math.cos(2 * Math.PI * rng.next());
    half[k] = (Math.max(0.25, 1 + spec.sizeSpread * g) * spec.meanBaseUm) / 2;
  }
  const tanA = Math.tan(spec.facetAngleDeg * DEG);
  const nGrid = Math.min(MAX_GRID, Math.max(32, Math.ceil((RANDOM_PYRAMID_SAMPLES_PER_BASE * L) / spec.meanBaseUm)));
  const pitch = L / nGrid;
  // Centres on grid nodes and half-bases in steps of two pitches: then every edge and every line
  // where two pyramids meet runs along grid lines or cell diagonals, and the triangulation is
  // exact except in cells where two such lines cross.
  for (let k = 0; k < n; k++) {
    cx[k] = (Math.round(cx[k] / pitch) % nGrid) * pitch;
    cy[k] = (Math.round(cy[k] / pitch) % nGrid) * pitch;
    half[k] = Math.max(2, Math.round(half[k] / (2 * pitch))) * 2 * pitch;
  }
  const heightAt = (x: number, y: number): number => {
    let h = 0;
    for (let k = 0; k < n; k++) {
      const dx = Math.abs(wrap(x - cx[k], L));
      const dy = Math.abs(wrap(y - cy[k], L));
      const hk = tanA * (half[k] - Math.max(dx, dy));
      if (hk > h) h = hk;
    }
    return h;
  };
  const heights = new Float64Array(nGrid * nGrid);
  for (let j = 0; j < nGrid; j++) for (let i = 0; i < nGrid; i++) heights[j * nGrid + i] = heightAt(i * pitch, j * pitch);
  const verts = heightGridVerts(heights, nGrid, nGrid, pitch, pitch, (i, j) => heightAt((i + 0.5) * pitch, (j + 0.5) * pitch));
  const label = `random upright pyramids, ${n} per ${L} µm tile, mean base ${spec.meanBaseUm} µm, spread ${spec.sizeSpread}, seed ${spec.seed}`;
  return finish(verts, L, L, accelCells(nGrid), accelCells(nGrid), boundary, label, 0);
}

/** Spherical caps (or dimples) of radius R and depth D on a square lattice of period P. */
function sphericalCaps(spec: Extract<TextureSpec, { type: "spherical-caps" }>, boundary: BoundaryKind): SurfaceTile {
  const P = spec.periodUm;
  const R = spec.radiusUm;
  const D = spec.depthUm;
  const n = CAP_SAMPLES_PER_PERIOD;
  const pitch = P / n;
  const sign = spec.inverted ? -1 : 1;
  const heightAt = (x: number, y: number): number => {
    const dx = x - P / 2;
    const dy = y - P / 2;
    let h = 0;
    // Neighbouring caps can overlap the cell when the cap is wider than the period.
    for (let sy = -1; sy <= 1; sy++) {
      for (let sx = -1; sx <= 1; sx++) {
        const r2 = (dx + sx * P) ** 2 + (dy + sy * P) ** 2;
        if (r2 < R * R) h = Math.max(h, Math.sqrt(R * R - r2) - (R - D));
      }
    }
    return h === 0 ? 0 : sign * h;
  };
  const heights = new Float64Array(n * n);
  for (let j = 0; j < n; j++) for (let i = 0; i < n; i++) heights[j * n + i] = heightAt(i * pitch, j * pitch);
  const verts = heightGridVerts(heights, n, n, pitch, pitch, (i, j) => heightAt((i + 0.5) * pitch, (j + 0.5) * pitch));
  const label = `spherical ${spec.inverted ? "dimples" : "caps"}, radius ${R} µm, depth ${D} µm, period ${P} µm`;
  return finish(verts, P, P, accelCells(n), accelCells(n), boundary, label, 0);
}

/**
 * Acceleration-grid cells along a side of n height samples: one per 2 × 2 samples (8 triangles)
 * was the fastest of 1, 2, 3, 4 on random pyramids (bench figures in trace-DEVELOPERS.md).
 */
function accelCells(n: number): number {
  return Math.max(1, Math.ceil(n / 2));
}

/** x wrapped into [−L/2, L/2). */
function wrap(x: number, L: number): number {
  return x - L * Math.floor(x / L + 0.5);
}
