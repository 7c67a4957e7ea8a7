import { describe, expect, it } from "vitest";
import { MaterialRegistry } from "../../src/materials/registry.js";
import { RandomStream, streamKey } from "../../src/random/stream.js";
import type { StackSpec } from "../../src/study/stackTypes.js";
import { compileStack } from "../../src/trace/compile.js";
import { Hit } from "../../src/geometry/surfaceHit.js";
import { Ray } from "../../src/trace/rayState.js";
import { frontSearch, rearSearch } from "../../src/trace/surfaceSearch.js";

// The tracer searches regular pyramids analytically in one step (slab entry, wrap into the tile,
// facet walk); the same tile also carries the pyramids as triangles. Both searches must find the
// same surface: same distance (to rounding), same normal, same misses, front and rear, from either side.
describe("analytic pyramid search in world coordinates agrees with the triangle search", () => {
  const cases: [string, StackSpec][] = [
    ["upright front, inverted rear", stack("upright-pyramids", "inverted-pyramids")],
    ["inverted front, upright rear", stack("inverted-pyramids", "upright-pyramids")],
  ];
  for (const [label, spec] of cases) {
    it(label, () => {
      const cs = compileStack(spec, MaterialRegistry.withBuiltins(), 1000);
      const st = cs.state;
      const rng = new RandomStream(streamKey(11, "surface-search", label));
      const analytic = { front: cs.frontTile, rear: cs.rearTile };
      const mesh = { front: { ...cs.frontTile, pyramidSign: 0 }, rear: { ...cs.rearTile, pyramidSign: 0 } };
      let hits = 0;
      for (let i = 0; i < 4000; i++) {
        const rear = i % 2 === 1;
        const fromBelow = i % 4 < 2;
        // Start well away from the surface: in the absorber, or above the front texture.
        const x = (rng.next() - 0.5) * 60, y = (rng.next() - 0.5) * 60;
        const z = rear ? -cs.thicknessUm + 8 + 20 * rng.next() : fromBelow ? -20 - 20 * rng.next() : 10 + 20 * rng.next();
        const cz = 2 * rng.next() - 1, ph = 2 * Math.PI * rng.next(), sz = Math.sqrt(1 - cz * cz);
        const results: number[][] = [];
        for (const tiles of [analytic, mesh]) {
          cs.frontTile = tiles.front;
          cs.rearTile = tiles.rear;
          st[Ray.X] = x; st[Ray.Y] = y; st[Ray.Z] = z; st[Ray.DX] = sz * Math.cos(ph); st[Ray.DY] = sz * Math.sin(ph); st[Ray.DZ] = cz;
          const found = rear ? rearSearch(cs, st) : frontSearch(cs, st, fromBelow);
          results.push([found, st[Ray.T], st[Ray.NX], st[Ray.NY], st[Ray.NZ]]);
        }
        const [a, m] = results;
        expect(a[0]).toBe(m[0]);
        if (a[0] !== Hit.HIT) continue;
        hits++;
        expect(Math.abs(a[1] - m[1])).toBeLessThan(1e-9 * (1 + m[1]));
        for (let j = 2; j < 5; j++) expect(Math.abs(a[j] - m[j])).toBeLessThan(1e-12);
      }
      expect(hits).toBeGreaterThan(1500);
    });
  }
});

function stack(front: "upright-pyramids" | "inverted-pyramids", rear: "upright-pyramids" | "inverted-pyramids"): StackSpec {
  return {
    incidence: "air",
    layers: [],
    front: { texture: { type: front, baseUm: 10, facetAngleDeg: 54.74 }, films: [] },
    absorber: { material: "Si-Green2008", thicknessUm: 180 },
    rear: { texture: { type: rear, baseUm: 6, facetAngleDeg: 54.74 }, films: [], exit: "air" },
    boundary: "periodic",
  };
}
