import { describe, expect, it } from "vitest";
import { Tri, type SurfaceTile } from "../../src/geometry/surfaceTile.js";
import { buildSurface } from "../../src/geometry/textures.js";
import { heightGridVerts } from "../../src/geometry/heightField.js";
import { parseHeightMapCsv } from "../../src/geometry/heightMapCsv.js";

/** Facet tilts (degrees) of a tile's triangles. */
function tilts(tile: SurfaceTile): number[] {
  const out: number[] = [];
  for (let t = 0; t < tile.nTri; t++) out.push((Math.acos(tile.tri[t * Tri.STRIDE + 2]) * 180) / Math.PI);
  return out;
}

describe("buildSurface", () => {
  it("random pyramids: a periodic tile whose sloped triangles all lie on facets at the facet angle", () => {
    const tile = buildSurface(
      { type: "random-pyramids", meanBaseUm: 5, sizeSpread: 0.3, count: 16, tileUm: 10, facetAngleDeg: 54.74, seed: 7 },
      "periodic",
      "t",
    );
    expect(tile.lxUm).toBe(10);
    expect(tile.zMinUm).toBeGreaterThanOrEqual(0);
    // Centres and sizes are snapped to the sampling grid so that edges and the lines where
    // pyramids meet fall on grid lines or cell diagonals: facets are exact, only cells where two
    // such lines cross get a blended normal.
    const sloped = tilts(tile).filter((t) => t > 1e-9);
    const onFacet = sloped.filter((t) => Math.abs(t - 54.74) < 0.01).length;
    expect(onFacet / sloped.length).toBeGreaterThan(0.99);
    // 16 pyramids of 5 µm on 10 µm (coverage 4): little of the base plane stays flat (e^-4 ≈ 2 %).
    expect(1 - sloped.length / tile.nTri).toBeLessThan(0.05);
  });

  it("random pyramids are reproducible from their seed and differ between seeds", () => {
    const spec = { type: "random-pyramids" as const, meanBaseUm: 5, sizeSpread: 0.3, count: 8, tileUm: 15, facetAngleDeg: 54.74, seed: 1 };
    const a = buildSurface(spec, "periodic", "t");
    const b = buildSurface({ ...spec }, "periodic", "t");
    const c = buildSurface({ ...spec, seed: 2 }, "periodic", "t");
    expect(Array.from(b.tri)).toEqual(Array.from(a.tri));
    expect(Array.from(c.tri)).not.toEqual(Array.from(a.tri));
  });

  it("spherical caps reach the given depth; dimples mirror them below the base plane", () => {
    const caps = buildSurface({ type: "spherical-caps", radiusUm: 6, periodUm: 8, depthUm: 2.5, inverted: false }, "periodic", "t");
    const dimples = buildSurface({ type: "spherical-caps", radiusUm: 6, periodUm: 8, depthUm: 2.5, inverted: true }, "periodic", "t");
    expect(caps.zMaxUm).toBeCloseTo(2.5, 6);
    expect(caps.zMinUm).toBe(0);
    expect(dimples.zMinUm).toBeCloseTo(-2.5, 6);
    expect(dimples.zMaxUm).toBe(0);
  });

  it("a height map becomes a periodic tile of nx × ny cells, lowest point at the base plane", () => {
    const grid = parseHeightMapCsv("1,2,1\n2,3,2\n1,2,1\n", "m.csv");
    const tile = buildSurface({ type: "height-map", csv: "m.csv", pitchUm: 0.5, grid }, "periodic", "t");
    expect(tile.lxUm).toBe(1.5);
    expect(tile.nTri).toBe(2 * 9);
    expect(tile.zMinUm).toBe(0);
    expect(tile.zMaxUm).toBe(2);
  });

  it("heightGridVerts wraps the last column and row onto the first", () => {
    const v = heightGridVerts([0, 1, 2, 3], 2, 2, 1, 1);
    // 4 cells × 2 triangles × 3 vertices; every vertex at x = 2 or y = 2 repeats column/row 0.
    expect(v.length).toBe(4 * 18);
    for (let i = 0; i < v.length; i += 3) {
      const ix = Math.round(v[i]) % 2;
      const iy = Math.round(v[i + 1]) % 2;
      expect(v[i + 2]).toBe([0, 1, 2, 3][iy * 2 + ix]);
    }
  });
});
