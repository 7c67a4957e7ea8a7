import { describe, expect, it } from "vitest";
import { InputError } from "../../src/util/errors.js";
import { RandomStream } from "../../src/random/stream.js";
import { validateStack } from "../../src/study/validateStack.js";
import { compileStack } from "../../src/trace/compile.js";
import { traceBatch } from "../../src/trace/kernel.js";
import { createTally } from "../../src/trace/tally.js";
import { registryWith } from "./helpers.js";

const registry = registryWith();
const base = () => ({
  front: { texture: { type: "upright-pyramids", baseUm: 10 } as Record<string, unknown>, films: [{ material: "SiNx", thicknessNm: 75 }] },
  absorber: { material: "Si", thicknessUm: 180 },
  rear: { ideal: { kind: "mirror", reflectance: 0.95 } } as Record<string, unknown>,
});

function inputError(fn: () => unknown): InputError {
  try {
    fn();
  } catch (err) {
    if (err instanceof InputError) return err;
    throw err;
  }
  throw new Error("expected an InputError");
}

describe("validateStack", () => {
  it("applies defaults: incidence air, no layers, facet angle 54.74°, periodic boundary", () => {
    const s = validateStack(base(), "stack", registry);
    expect(s.incidence).toBe("air");
    expect(s.layers).toEqual([]);
    expect(s.boundary).toBe("periodic");
    expect(s.front.texture).toEqual({ type: "upright-pyramids", baseUm: 10, facetAngleDeg: 54.74 });
  });

  it("rejects a facet angle outside (0°, 90°), naming the field", () => {
    for (const bad of [95, 90, 0, -3]) {
      const raw = base();
      raw.front.texture.facetAngleDeg = bad;
      expect(inputError(() => validateStack(raw, "stack")).message).toBe(
        `stack.front.texture.facetAngleDeg: expected a number in (0, 90), got ${bad}`,
      );
    }
  });

  it("rejects non-positive sizes", () => {
    const raw = base();
    raw.front.texture.baseUm = 0;
    expect(inputError(() => validateStack(raw, "stack")).message).toMatch(/^stack\.front\.texture\.baseUm: expected a positive number, got 0/);
    const raw2 = base();
    raw2.absorber.thicknessUm = -5;
    expect(inputError(() => validateStack(raw2, "stack")).message).toMatch(/^stack\.absorber\.thicknessUm: expected a number in \[1, 10000\]/);
    const raw3 = base();
    raw3.front.films[0].thicknessNm = 0;
    expect(inputError(() => validateStack(raw3, "stack")).message).toMatch(/^stack\.front\.films\[0\]\.thicknessNm/);
  });

  it("rejects unknown fields with a did-you-mean hint", () => {
    const raw = base();
    raw.front.texture.baseUn = 3;
    const e = inputError(() => validateStack(raw, "stack"));
    expect(e.message).toBe("stack.front.texture.baseUn: unknown field");
    expect(e.hint).toBe('did you mean "baseUm"?');
    const e2 = inputError(() => validateStack({ ...base(), boundray: "mirror" }, "stack"));
    expect(e2.hint).toBe('did you mean "boundary"?');
  });

  it("rejects unknown texture types and materials, naming the field", () => {
    const raw = base();
    raw.front.texture = { type: "upright-pyramid", baseUm: 10 };
    const e = inputError(() => validateStack(raw, "stack"));
    expect(e.message).toMatch(/^stack\.front\.texture\.type: expected one of/);
    expect(e.hint).toBe('did you mean "upright-pyramids"?');
    const raw2 = base();
    raw2.absorber.material = "Sii";
    expect(inputError(() => validateStack(raw2, "stack", registry)).message).toMatch(/^stack\.absorber\.material: unknown material "Sii"/);
  });

  it("rejects an ideal reflectance outside [0, 1]", () => {
    const raw = base();
    raw.rear = { ideal: { kind: "mirror", reflectance: 1.2 } };
    expect(inputError(() => validateStack(raw, "stack")).message).toBe("stack.rear.ideal.reflectance: expected a number in [0, 1], got 1.2");
  });

  describe("height maps", () => {
    const withMap = (csv: string) => {
      const raw = base();
      raw.front.texture = { type: "height-map", csv: "afm.csv", pitchUm: 0.5 };
      return validateStack(raw, "stack", registry, { baseDir: "/data", readText: () => csv });
    };

    it("reads a regular grid", () => {
      const s = withMap("# AFM scan\n0,1,2\n1,2,3\n");
      const tex = s.front.texture;
      expect(tex.type === "height-map" && tex.grid?.nx).toBe(3);
      expect(tex.type === "height-map" && Array.from(tex.grid!.heightsUm)).toEqual([0, 1, 2, 1, 2, 3]);
    });

    it("names the line of a ragged row", () => {
      expect(inputError(() => withMap("0,1,2\n1,2,3\n4,5\n")).message).toBe("/data/afm.csv: line 3: expected 3 cells (as on line 1), got 2");
    });

    it("names the line and column of a non-numeric cell", () => {
      expect(inputError(() => withMap("0,1,2\n1,x,3\n")).message).toBe('/data/afm.csv: line 2, column 2: expected a number (height in µm), got "x"');
    });
  });
});

describe("compileStack / traceBatch bad input", () => {
  const stack = validateStack(base(), "stack", registry);

  it("a wavelength outside a material's range names the field and the range", () => {
    const e = inputError(() => compileStack(stack, registry, 2500));
    expect(e.message).toMatch(/^stack\.(front\.films\[0\]\.material|absorber\.material|incidence): /);
    expect(e.message).toMatch(/2500/);
  });

  it("zero rays is refused", () => {
    const cs = compileStack(stack, registry, 1000);
    expect(inputError(() => traceBatch(cs, 0, 0, 0, new RandomStream("x"), createTally(cs))).message).toBe(
      "rays: expected a positive whole number of rays, got 0",
    );
  });

  it("a polar angle of 90° or more is refused", () => {
    const cs = compileStack(stack, registry, 1000);
    expect(inputError(() => traceBatch(cs, 90, 0, 10, new RandomStream("x"), createTally(cs))).message).toMatch(/^angle: /);
  });

  it("textures reaching through the absorber are refused", () => {
    // Inverted 10 µm pyramids reach 7.07 µm into the absorber below their base plane.
    const raw = base();
    raw.front.texture = { type: "inverted-pyramids", baseUm: 10 };
    raw.absorber.thicknessUm = 5;
    expect(inputError(() => compileStack(validateStack(raw, "stack"), registry, 1000)).message).toMatch(/^stack\.absorber\.thicknessUm: /);
  });
});
