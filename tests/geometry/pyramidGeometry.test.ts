import { describe, expect, it } from "vitest";
import { RandomStream, streamKey } from "../../src/random/stream.js";
import { Query, meshHit } from "../../src/geometry/surfaceHit.js";
import { Tri, type SurfaceTile } from "../../src/geometry/surfaceTile.js";
import { buildSurface } from "../../src/geometry/textures.js";

const FACET_111_DEG = (Math.atan(Math.SQRT2) * 180) / Math.PI; // 54.7356°, (111) facets on (100)

/** Follows a vertically incident ray over the texture with specular reflections only. */
function bounceSequence(tile: SurfaceTile, x0: number, y0: number): number[] {
  const q = new Float64Array(Query.LENGTH);
  let x = x0, y = y0, z = tile.zMaxUm, dx = 0, dy = 0, dz = -1;
  const anglesDeg: number[] = [];
  for (let k = 0; k < 10; k++) {
    x -= tile.lxUm * Math.floor(x / tile.lxUm);
    y -= tile.lyUm * Math.floor(y / tile.lyUm);
    q[Query.OX] = x; q[Query.OY] = y; q[Query.OZ] = z; q[Query.DX] = dx; q[Query.DY] = dy; q[Query.DZ] = dz;
    q[Query.LIMIT] = dz < 0 ? ((tile.zMinUm - z) / dz) * 1.000001 : (tile.zMaxUm - z) / dz;
    const tri = meshHit(tile, q, false);
    if (tri < 0) {
      if (dz < 0) throw new Error("ray went through the surface");
      break;
    }
    const t = q[Query.T];
    x += t * dx; y += t * dy; z += t * dz;
    const o = tri * Tri.STRIDE;
    const [nx, ny, nz] = [tile.tri[o], tile.tri[o + 1], tile.tri[o + 2]];
    const dn = dx * nx + dy * ny + dz * nz;
    anglesDeg.push((Math.acos(-dn) * 180) / Math.PI);
    dx -= 2 * dn * nx; dy -= 2 * dn * ny; dz -= 2 * dn * nz;
  }
  return anglesDeg;
}

describe("regular upright pyramids at normal incidence (geometry only)", () => {
  const tile = buildSurface({ type: "upright-pyramids", baseUm: 10, facetAngleDeg: FACET_111_DEG }, "periodic", "t");
  const rng = new RandomStream(streamKey(1, "pyramid-geometry"));
  const n = 20000;
  let triple = 0;
  let other = 0;
  const first: number[] = [];
  for (let i = 0; i < n; i++) {
    const a = bounceSequence(tile, rng.next() * 10, rng.next() * 10);
    first.push(a[0]);
    if (a.length === 3) triple++;
    else if (a.length !== 2) other++;
  }

  it("every ray hits at least two facets and 1/9 hit a third (Baker-Finch & McIntosh 2011, from memory; derivable)", () => {
    expect(other).toBe(0);
    const p = 1 / 9;
    const se = Math.sqrt((p * (1 - p)) / n); // binomial standard error
    expect(Math.abs(triple / n - p) / se).toBeLessThan(4);
  });

  it("the first hit is at the facet angle, 54.7356° local incidence", () => {
    for (const a of first) expect(a).toBeCloseTo(FACET_111_DEG, 9);
  });

  it("second hit at 180° − 3α (15.79°), third at grazing incidence", () => {
    const a = bounceSequence(tile, 2.1, 4.9);
    expect(a[1]).toBeCloseTo(Math.abs(180 - 3 * FACET_111_DEG), 9);
  });
});

describe("inverted pyramids and grooves", () => {
  it("inverted pyramids: base plane on top (z = 0), apex below at −tan(α)·a/2", () => {
    const tile = buildSurface({ type: "inverted-pyramids", baseUm: 8, facetAngleDeg: 54.74 }, "periodic", "t");
    expect(tile.zMaxUm).toBe(0);
    expect(tile.zMinUm).toBeCloseTo(-Math.tan((54.74 * Math.PI) / 180) * 4, 12);
  });

  it("a mirror-walled cell is the 2×2 tile of mirror images", () => {
    const spec = { type: "grooves" as const, periodUm: 5, facetAngleDeg: 40, orientationDeg: 0 };
    const periodic = buildSurface(spec, "periodic", "t");
    const mirror = buildSurface(spec, "mirror", "t");
    expect(mirror.lxUm).toBe(2 * periodic.lxUm);
    expect(mirror.nTri).toBe(4 * periodic.nTri);
  });
});
