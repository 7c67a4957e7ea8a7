import { describe, expect, it } from "vitest";
import { MAX_FILM_THICKNESS_NM, parseNumberSweep, parseStackSpec } from "../../src/optics/stackSpec.js";
import { InputError } from "../../src/util/errors.js";

describe("parseStackSpec(text)", () => {
  it("reads incidence medium, films with thickness in nm, exit medium", () => {
    expect(parseStackSpec("air|SiNx:75|Si")).toEqual({ incidence: "air", films: [{ material: "SiNx", thicknessNm: 75 }], exit: "Si" });
    expect(parseStackSpec(" EVA | SiO2:10.5 | SiNx-Vogt2015-n2.09:70 | Si ")).toEqual({
      incidence: "EVA",
      films: [
        { material: "SiO2", thicknessNm: 10.5 },
        { material: "SiNx-Vogt2015-n2.09", thicknessNm: 70 },
      ],
      exit: "Si",
    });
    expect(parseStackSpec("glass|air")).toEqual({ incidence: "glass", films: [], exit: "air" });
  });

  it("rejects malformed stacks with InputError naming the entry and what was expected", () => {
    const cases: [string, RegExp][] = [
      ["air", /1 entry; expected "incidence\|material:thicknessNm/],
      ["air||Si", /entry 2 \(""\): empty/],
      ["air|SiNx|Si", /entry 2 \("SiNx"\): a film needs a thickness in nm/],
      ["air:1|Si", /entry 1 .*semi-infinite medium and takes no thickness/],
      ["air|Si:5", /entry 2 .*last entry is a semi-infinite medium/],
      ["air|SiNx:-5|Si", /thickness -5 nm is negative/],
      ["air|SiNx:2e6|Si", /beyond 1000000 nm/],
      ["air|SiNx:abc|Si", /thickness "abc" is not a number/],
      ["air|SiNx:|Si", /thickness "" is not a number/],
      ["air|7up:5|Si", /"7up" is neither a material name .* nor a constant index/],
    ];
    for (const [text, re] of cases) {
      expect(() => parseStackSpec(text), text).toThrow(InputError);
      expect(() => parseStackSpec(text), text).toThrow(re);
    }
    expect(parseStackSpec(`air|SiNx:${MAX_FILM_THICKNESS_NM}|Si`).films[0]!.thicknessNm).toBe(1e6);
  });
});

describe("parseNumberSweep(text, what, min, max, unit)", () => {
  it("reads a number, a list and an inclusive range", () => {
    expect(parseNumberSweep("600", "--wavelength", 1, 1e4, "nm")).toEqual([600]);
    expect(parseNumberSweep("400, 600,800", "--wavelength", 1, 1e4, "nm")).toEqual([400, 600, 800]);
    expect(parseNumberSweep("400:1100:100", "--wavelength", 1, 1e4, "nm")).toEqual([400, 500, 600, 700, 800, 900, 1000, 1100]);
    expect(parseNumberSweep("0:80:30", "--angle", 0, 90, "deg")).toEqual([0, 30, 60]);
  });

  it("rejects bad ranges and values out of bounds", () => {
    expect(() => parseNumberSweep("400:300:10", "--wavelength", 1, 1e4, "nm")).toThrow(/ends before it starts/);
    expect(() => parseNumberSweep("400:500:0", "--wavelength", 1, 1e4, "nm")).toThrow(/positive step/);
    expect(() => parseNumberSweep("400:500", "--wavelength", 1, 1e4, "nm")).toThrow(/not a range/);
    expect(() => parseNumberSweep("abc", "--wavelength", 1, 1e4, "nm")).toThrow(InputError);
    expect(() => parseNumberSweep("95", "--angle", 0, 90, "deg")).toThrow(/--angle: 95 deg is outside \[0, 90\]/);
    expect(() => parseNumberSweep("1:100000:1", "--wavelength", 1, 1e6, "nm")).toThrow(/at most 10000/);
  });
});
