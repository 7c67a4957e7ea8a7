import { describe, expect, it } from "vitest";
import { budgetFreePath } from "../../src/trace/bulkTransport.js";

describe("α → 0 path of a ray whose whole budget went in the absorber", () => {
  // An analog ray draws its optical-depth budget −ln u and is absorbed where it is used up, so along
  // its absorber path L, αL = −ln u and (e^{αL} − 1)/α = (1/u − 1)/α (e^{−ln u} = 1/u). The shortcut
  // must agree with the exponential form to rounding, over the whole range of draws (2^-33 … 1 − 2^-33).
  it("equals (e^{−ln u} − 1)/α to rounding", () => {
    const alphas = [1e-6, 3.7e-3, 0.41, 12];
    let worst = 0;
    for (let i = 0; i <= 4000; i++) {
      // log-spaced towards 0 and towards 1: both ends of the budget's range.
      const u = i < 2000 ? 2 ** (-33 + (32 * i) / 2000) : 1 - 2 ** (-1 - (32 * (i - 2000)) / 2000);
      for (const a of alphas) {
        const ref = Math.expm1(-Math.log(u)) / a;
        worst = Math.max(worst, Math.abs(budgetFreePath(u, a) - ref) / ref);
      }
    }
    // −ln u carries one rounding (relative 2^-53 of −ln u), which expm1 turns into up to about
    // (−ln u)·2^-53 ≈ 23·1.1e-16 at u = 2^-33; the shortcut itself rounds twice.
    expect(worst).toBeLessThan(5e-15);
  });
});
