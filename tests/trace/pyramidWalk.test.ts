import { describe, expect, it } from "vitest";
import { MaterialRegistry } from "../../src/materials/registry.js";
import { RandomStream, streamKey } from "../../src/random/stream.js";
import { Query, Hit, meshHit } from "../../src/geometry/surfaceHit.js";
import { Tri } from "../../src/geometry/surfaceTile.js";
import { buildSurface } from "../../src/geometry/textures.js";
import { compileStack } from "../../src/trace/compile.js";
import { Ray } from "../../src/trace/rayState.js";
import { frontSearch } from "../../src/trace/surfaceSearch.js";
import type { StackSpec } from "../../src/study/stackTypes.js";

// The tracer's analytic pyramid walk must find what the triangle search finds (the same surface):
// same distance (to rounding), same outward normal, same misses, for rays from either side that
// start inside the texture's slab, close to the surface (the tile's own frame: the front tile of a
// stack, z = height).
describe("analytic pyramid search agrees with the triangle mesh", () => {
  const cases: ["upright-pyramids" | "inverted-pyramids", "periodic" | "mirror", number][] = [
    ["upright-pyramids", "periodic", 54.74],
    ["inverted-pyramids", "periodic", 54.74],
    ["upright-pyramids", "mirror", 40],
    ["inverted-pyramids", "mirror", 62],
  ];
  for (const [type, boundary, angle] of cases) {
    it(`${type}, ${boundary} boundary, ${angle}° facets`, () => {
      const tile = buildSurface({ type, baseUm: 7, facetAngleDeg: angle }, boundary, "t");
      expect(tile.pyramidSign).toBe(type === "upright-pyramids" ? 1 : -1);
      const rng = new RandomStream(streamKey(7, "pyramid-hit", type, boundary));
      const q = new Float64Array(Query.LENGTH);
      const cs = compileStack(pyramidStack(type), MaterialRegistry.withBuiltins(), 1000);
      cs.frontTile = tile;
      const st = cs.state;
      let hits = 0;
      let compared = 0;
      for (let i = 0; i < 10000; i++) {
        const fromBelow = i % 2 === 0;
        const x = rng.next() * tile.lxUm, y = rng.next() * tile.lyUm;
        // Start on the surface's own side: strictly above (below) the height at (x, y), inside the slab.
        const h = surfaceHeight(tile.pyramidSign, tile.pyramidTan, 7, x, y);
        const z = fromBelow ? tile.zMinUm + rng.next() * (h - tile.zMinUm) : h + rng.next() * (tile.zMaxUm - h);
        const cz = 2 * rng.next() - 1;
        const ph = 2 * Math.PI * rng.next();
        const sz = Math.sqrt(1 - cz * cz);
        const dx = sz * Math.cos(ph), dy = sz * Math.sin(ph), dz = cz;
        const limit = dz > 0 ? (tile.zMaxUm - z) / dz : dz < 0 ? (tile.zMinUm - z) / dz : 50;
        const set = (): void => {
          q[Query.OX] = x; q[Query.OY] = y; q[Query.OZ] = z; q[Query.DX] = dx; q[Query.DY] = dy; q[Query.DZ] = dz; q[Query.LIMIT] = limit;
        };
        set();
        const tri = meshHit(tile, q, fromBelow);
        const tMesh = q[Query.T];
        st[Ray.X] = x; st[Ray.Y] = y; st[Ray.Z] = z; st[Ray.DX] = dx; st[Ray.DY] = dy; st[Ray.DZ] = dz;
        const found = frontSearch(cs, st, fromBelow);
        const tPyr = st[Ray.T];
        if (tri === Hit.LOST || Math.abs(h - z) < 1e-6) continue; // grazing start: either answer is fair
        compared++;
        expect(found === Hit.HIT).toBe(tri >= 0);
        if (tri === Hit.NO_HIT) continue;
        hits++;
        expect(Math.abs(tPyr - tMesh)).toBeLessThan(1e-9);
        const o = tri * Tri.STRIDE;
        const normal = [st[Ray.NX], st[Ray.NY], st[Ray.NZ]];
        for (let j = 0; j < 3; j++) expect(Math.abs(normal[j] - tile.tri[o + j])).toBeLessThan(1e-12);
      }
      expect(compared).toBeGreaterThan(9500);
      expect(hits).toBeGreaterThan(2500);
    });
  }
});

/** Height of regular pyramids of base a (apex at the centre of each a × a square). */
function surfaceHeight(sign: number, tanA: number, a: number, x: number, y: number): number {
  const u = x - a * Math.floor(x / a) - a / 2;
  const v = y - a * Math.floor(y / a) - a / 2;
  const H = (tanA * a) / 2;
  return sign * (H - tanA * Math.max(Math.abs(u), Math.abs(v)));
}

function pyramidStack(type: "upright-pyramids" | "inverted-pyramids"): StackSpec {
  return {
    incidence: "air",
    layers: [],
    front: { texture: { type, baseUm: 7, facetAngleDeg: 54.74 }, films: [] },
    absorber: { material: "Si-Green2008", thicknessUm: 180 },
    rear: { ideal: { kind: "mirror", reflectance: 0.95 } },
    boundary: "periodic",
  };
}
