import { describe, expect, it } from "vitest";
import { astmG173, totalIrradianceWm2, trapezoid } from "../../src/spectrum/index.js";

// Quadrature for every integral here: trapezoid rule over the tabulated (non-uniform) G173 grid,
// 280–4000 nm. The standard states the totals to 0.1 W/m²; tolerance = half that last digit.
describe("astmG173(kind)", () => {
  it("global tilt integrates to 1000.4 W/m² (ASTM G173-03: about 1000.4 W/m²)", () => {
    const s = astmG173("global");
    expect(s.name).toBe("AM1.5G");
    expect(Math.abs(trapezoid(s.wavelengthNm, s.irradianceWm2PerNm) - 1000.4)).toBeLessThan(0.05);
  });

  it("direct + circumsolar integrates to 900.1 W/m² (ASTM G173-03: about 900.1 W/m²)", () => {
    const s = astmG173("direct");
    expect(Math.abs(trapezoid(s.wavelengthNm, s.irradianceWm2PerNm) - 900.1)).toBeLessThan(0.05);
  });

  it("extraterrestrial column integrates to 1348 W/m², close to the solar constant 1361–1367 W/m² less the light outside 280–4000 nm (from memory)", () => {
    const s = astmG173("extraterrestrial");
    const e = trapezoid(s.wavelengthNm, s.irradianceWm2PerNm);
    expect(e).toBeGreaterThan(1300);
    expect(e).toBeLessThan(1366);
  });

  it("has the grid of the standard: 2002 rows, 280–4000 nm, 0.5 nm steps to 400 nm (data/SOURCES.md)", () => {
    const s = astmG173("global");
    expect(s.wavelengthNm.length).toBe(2002);
    expect(s.wavelengthNm[0]).toBe(280);
    expect(s.wavelengthNm[s.wavelengthNm.length - 1]).toBe(4000);
    expect(s.wavelengthNm[1]).toBe(280.5);
  });

  it("returns fresh arrays (callers may not corrupt the cached table)", () => {
    const a = astmG173("global");
    a.irradianceWm2PerNm.fill(0);
    expect(totalIrradianceWm2(astmG173("global").wavelengthNm, astmG173("global").irradianceWm2PerNm)).toBeGreaterThan(999);
  });
});
