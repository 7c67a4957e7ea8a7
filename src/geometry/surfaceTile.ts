/**
 * A textured interface as one periodic unit-cell tile of a height field z = h(x, y), heights in µm
 * measured outward from the absorber (base plane z = 0). Flat surfaces are analytic; everything else
 * is a set of triangles with a uniform grid over the tile for the hit test (surfaceHit.ts).
 *
 * Triangle record (Tri.STRIDE numbers): unit normal (nx, ny, nz) with nz > 0 (pointing outward,
 * away from the absorber), plane offset d = n·v0, then three edge functions (a, b, c) of the
 * triangle's xy projection, each normalised so that a·x + b·y + c is the signed distance (≥ 0 inside).
 */
export const enum Tri {
  STRIDE = 13,
}

/** What a tile is: flat, a triangle mesh, or the ideal Lambertian randomiser (reference case, front only: flat, scatters every ray diffusely). */
export const enum SurfaceKind {
  PLANAR = 0,
  MESH = 1,
  LAMBERTIAN = 2,
}

export interface SurfaceTile {
  kind: number;
  /** Tile size in µm (the lateral period). */
  lxUm: number;
  lyUm: number;
  /** Height range of the surface (µm, outward positive). */
  zMinUm: number;
  zMaxUm: number;
  nTri: number;
  tri: Float64Array;
  /** Acceleration grid: gx × gy cells; triangles of cell c are cellTri[cellStart[c] .. cellStart[c+1]). */
  gx: number;
  gy: number;
  /** Grid cell size and its inverse (µm, 1/µm). */
  cellXUm: number;
  cellYUm: number;
  invCellXUm: number;
  invCellYUm: number;
  cellStart: Int32Array;
  cellTri: Int32Array;
  /** Height range of the triangles listed in each cell (lets a ray skip cells it passes clear of). */
  cellZMin: Float64Array;
  cellZMax: Float64Array;
  /** Texture orientation in the plane (rotation of the tile frame against the stack frame). */
  cosRot: number;
  sinRot: number;
  /**
   * Regular square pyramids (same surface as the triangles, searched analytically by pyramidSearch,
   * src/trace/surfaceSearch.ts):
   * +1 upright, −1 inverted, 0 not such a texture. Period (base) in µm, tan of the facet angle,
   * apex height, and the four facet normals (+u, −u, +v, −v; 3 numbers each, outward).
   */
  pyramidSign: number;
  pyramidPeriodUm: number;
  /** 1 / pyramidPeriodUm (0 when not such a texture). */
  pyramidInvPeriod: number;
  pyramidTan: number;
  pyramidHeightUm: number;
  pyramidNormals: Float64Array;
  /** Human-readable description (for `trace` output and errors). */
  label: string;
}

/** Regular square pyramids of a tile (an analytic description of its triangles). */
export interface PyramidShape {
  inverted: boolean;
  baseUm: number;
  facetAngleDeg: number;
}

/** A flat interface; `periodUm` only sets the launch cell when it is the front. */
export function planarTile(periodUm = 1, kind = SurfaceKind.PLANAR): SurfaceTile {
  return {
    kind,
    lxUm: periodUm,
    lyUm: periodUm,
    zMinUm: 0,
    zMaxUm: 0,
    nTri: 0,
    tri: new Float64Array(0),
    gx: 1,
    gy: 1,
    cellXUm: periodUm,
    cellYUm: periodUm,
    invCellXUm: 1 / periodUm,
    invCellYUm: 1 / periodUm,
    cellStart: new Int32Array(2),
    cellTri: new Int32Array(0),
    cellZMin: new Float64Array(1),
    cellZMax: new Float64Array(1),
    cosRot: 1,
    sinRot: 0,
    pyramidSign: 0,
    pyramidPeriodUm: 0,
    pyramidInvPeriod: 0,
    pyramidTan: 0,
    pyramidHeightUm: 0,
    pyramidNormals: new Float64Array(12),
    label: kind === SurfaceKind.LAMBERTIAN ? "ideal Lambertian randomiser" : "planar",
  };
}

/**
 * Builds a mesh tile from triangles given as flat vertex coordinates (9 numbers per triangle:
 * x0 y0 z0 x1 y1 z1 x2 y2 z2), all inside [0, lx] × [0, ly]. Triangles may come in any winding;
 * they are oriented so the normal points to +z. Vertical or degenerate triangles are dropped (a
 * height field has none that matter). The grid has gx × gy cells.
 */
export function meshTile(
  verts: ArrayLike<number>,
  lxUm: number,
  lyUm: number,
  gx: number,
  gy: number,
  label: string,
  rotationDeg = 0,
  pyramid: PyramidShape | null = null,
): SurfaceTile {
  const nIn = Math.floor(verts.length / 9);
  const tri = new Float64Array(nIn * Tri.STRIDE);
  const keep: number[] = [];
  const triZ: number[] = [];
  let zMin = Infinity;
  let zMax = -Infinity;
  let nTri = 0;
  for (let t = 0; t < nIn; t++) {
    let ax = verts[9 * t], ay = verts[9 * t + 1], az = verts[9 * t + 2];
    let bx = verts[9 * t + 3], by = verts[9 * t + 4], bz = verts[9 * t + 5];
    const cx = verts[9 * t + 6], cy = verts[9 * t + 7], cz = verts[9 * t + 8];
    // Normal (b − a) × (c − a); flip the winding when it points down.
    let nx = (by - ay) * (cz - az) - (bz - az) * (cy - ay);
    let ny = (bz - az) * (cx - ax) - (bx - ax) * (cz - az);
    let nz = (bx - ax) * (cy - ay) - (by - ay) * (cx - ax);
    const len = Math.hypot(nx, ny, nz);
    if (!(len > 0) || Math.abs(nz) < 1e-12 * len) continue;
    if (nz < 0) {
      [ax, bx] = [bx, ax];
      [ay, by] = [by, ay];
      [az, bz] = [bz, az];
      nx = -nx;
      ny = -ny;
      nz = -nz;
    }
    nx /= len;
    ny /= len;
    nz /= len;
    const o = nTri * Tri.STRIDE;
    tri[o] = nx;
    tri[o + 1] = ny;
    tri[o + 2] = nz;
    tri[o + 3] = nx * ax + ny * ay + nz * az;
    edge(tri, o + 4, ax, ay, bx, by);
    edge(tri, o + 7, bx, by, cx, cy);
    edge(tri, o + 10, cx, cy, ax, ay);
    keep.push(Math.min(ax, bx, cx), Math.max(ax, bx, cx), Math.min(ay, by, cy), Math.max(ay, by, cy));
    triZ.push(az, bz, cz);
    zMin = Math.min(zMin, az, bz, cz);
    zMax = Math.max(zMax, az, bz, cz);
    nTri++;
  }
  // Uniform grid: each triangle goes into every cell its xy bounding box overlaps.
  const csx = lxUm / gx;
  const csy = lyUm / gy;
  const lists: number[][] = Array.from({ length: gx * gy }, () => []);
  const slack = 1e-9 * Math.max(lxUm, lyUm);
  for (let t = 0; t < nTri; t++) {
    const i0 = clampInt(Math.floor((keep[4 * t] + slack) / csx), gx);
    const i1 = clampInt(Math.ceil((keep[4 * t + 1] - slack) / csx) - 1, gx);
    const j0 = clampInt(Math.floor((keep[4 * t + 2] + slack) / csy), gy);
    const j1 = clampInt(Math.ceil((keep[4 * t + 3] - slack) / csy) - 1, gy);
    for (let j = j0; j <= Math.max(j0, j1); j++) for (let i = i0; i <= Math.max(i0, i1); i++) lists[j * gx + i].push(t);
  }
  const cellStart = new Int32Array(gx * gy + 1);
  for (let c = 0; c < gx * gy; c++) cellStart[c + 1] = cellStart[c] + lists[c].length;
  const cellTri = new Int32Array(cellStart[gx * gy]);
  for (let c = 0; c < gx * gy; c++) cellTri.set(lists[c], cellStart[c]);
  const cellZMin = new Float64Array(gx * gy).fill(Infinity);
  const cellZMax = new Float64Array(gx * gy).fill(-Infinity);
  for (let c = 0; c < gx * gy; c++) {
    for (const t of lists[c]) {
      cellZMin[c] = Math.min(cellZMin[c], triZ[3 * t], triZ[3 * t + 1], triZ[3 * t + 2]);
      cellZMax[c] = Math.max(cellZMax[c], triZ[3 * t], triZ[3 * t + 1], triZ[3 * t + 2]);
    }
  }
  const rot = (rotationDeg * Math.PI) / 180;
  const tanA = pyramid === null ? 0 : Math.tan((pyramid.facetAngleDeg * Math.PI) / 180);
  const sign = pyramid === null ? 0 : pyramid.inverted ? -1 : 1;
  const pyramidNormals = new Float64Array(12);
  if (pyramid !== null) {
    // Facet z = ±(H − T·w) over w ∈ {u, −u, v, −v} from the apex: normal (±T·∇w, 1)/√(1 + T²).
    const inv = 1 / Math.sqrt(1 + tanA * tanA);
    const g = sign * tanA * inv;
    pyramidNormals.set([g, 0, inv, -g, 0, inv, 0, g, inv, 0, -g, inv]);
  }
  return {
    kind: SurfaceKind.MESH,
    lxUm,
    lyUm,
    zMinUm: zMin,
    zMaxUm: zMax,
    nTri,
    tri: tri.slice(0, nTri * Tri.STRIDE),
    gx,
    gy,
    cellXUm: csx,
    cellYUm: csy,
    invCellXUm: 1 / csx,
    invCellYUm: 1 / csy,
    cellStart,
    cellTri,
    cellZMin,
    cellZMax,
    cosRot: Math.cos(rot),
    sinRot: Math.sin(rot),
    pyramidSign: sign,
    pyramidPeriodUm: pyramid === null ? 0 : pyramid.baseUm,
    pyramidInvPeriod: pyramid === null ? 0 : 1 / pyramid.baseUm,
    pyramidTan: tanA,
    pyramidHeightUm: pyramid === null ? 0 : (tanA * pyramid.baseUm) / 2,
    pyramidNormals,
    label,
  };
}

/** Edge a→b of a counter-clockwise triangle: inside is to the left; stored as a unit-normal line. */
function edge(out: Float64Array, o: number, ax: number, ay: number, bx: number, by: number): void {
  let a = -(by - ay);
  let b = bx - ax;
  const len = Math.hypot(a, b);
  a /= len;
  b /= len;
  out[o] = a;
  out[o + 1] = b;
  out[o + 2] = -(a * ax + b * ay);
}

function clampInt(i: number, n: number): number {
  return i < 0 ? 0 : i >= n ? n - 1 : i;
}

/**
 * Mirror-walled cell as a periodic tile: the cell and its mirror images across x = lx and y = ly
 * (a 2lx × 2ly tile). Tracing a periodic tile of mirror images is the same as reflecting at walls.
 */
export function mirroredVerts(verts: ArrayLike<number>, lxUm: number, lyUm: number): Float64Array {
  const n = verts.length;
  const out = new Float64Array(4 * n);
  for (let copy = 0; copy < 4; copy++) {
    const fx = (copy & 1) !== 0;
    const fy = (copy & 2) !== 0;
    for (let i = 0; i < n; i += 3) {
      out[copy * n + i] = fx ? 2 * lxUm - verts[i] : verts[i];
      out[copy * n + i + 1] = fy ? 2 * lyUm - verts[i + 1] : verts[i + 1];
      out[copy * n + i + 2] = verts[i + 2];
    }
  }
  return out;
}
