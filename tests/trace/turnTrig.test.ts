import { describe, expect, it } from "vitest";
import { cosSinOfTurn } from "../../src/trace/turnTrig.js";

// The ray loop's cos/sin of a fraction of a turn against the engine's Math.cos and Math.sin
// (ECMAScript built-ins, correctly reduced): the same values to a few units in the last place,
// over the open unit interval the random streams give, its ends, the quadrant boundaries, and
// negative or larger turns.
describe("cosSinOfTurn", () => {
  const st = new Float64Array(2);
  const check = (turn: number): number => {
    cosSinOfTurn(st, turn, 0, 1);
    const a = 2 * Math.PI * turn;
    return Math.max(Math.abs(st[0] - Math.cos(a)), Math.abs(st[1] - Math.sin(a)));
  };
  it("agrees with Math.cos and Math.sin within 1e-15 over (0, 1)", () => {
    let worst = 0;
    for (let i = 0; i < 200000; i++) worst = Math.max(worst, check((i + 0.5) / 200000));
    // quadrant and octant boundaries, and the ends of the random numbers' range
    for (const t of [0, 0.125, 0.25, 0.375, 0.5, 0.625, 0.75, 0.875, 1, 2 ** -33, 1 - 2 ** -33]) worst = Math.max(worst, check(t));
    expect(worst).toBeLessThan(1e-15);
  });
  it("keeps cos² + sin² = 1 and handles turns outside [0, 1)", () => {
    for (const t of [-0.3, -1.75, 3.1, 1234.5678]) {
      expect(check(t)).toBeLessThan(1e-12);
      cosSinOfTurn(st, t, 0, 1);
      expect(Math.abs(st[0] * st[0] + st[1] * st[1] - 1)).toBeLessThan(1e-15);
    }
  });
});
