import { describe, expect, it } from "vitest";
import { RandomStream, streamKey } from "../../src/random/stream.js";
import type { StackSpec, TextureSpec } from "../../src/study/stackTypes.js";
import { validateStack } from "../../src/study/validateStack.js";
import { compileStack } from "../../src/trace/compile.js";
import { traceBatch, type LightSide } from "../../src/trace/kernel.js";
import { createTally, summarizeTally } from "../../src/trace/tally.js";
import { summarizeTrapping } from "../../src/trace/trappingSummary.js";
import { inputErrorOf } from "../helpers/inputError.js";
import { constantMaterial, expectWithin4Sigma, fresnelRsRp, registryWith } from "./helpers.js";

const registry = registryWith(constantMaterial("n15", 1.5, 0), constantMaterial("lossy15", 1.5, 2e-6));

function trace(stack: StackSpec, side: LightSide, o: { wavelengthNm?: number; thetaDeg?: number; nRays?: number; seed?: number } = {}) {
  const cs = compileStack(stack, registry, o.wavelengthNm ?? 1000);
  const tally = createTally(cs);
  traceBatch(cs, o.thetaDeg ?? 0, 0, o.nRays ?? 20000, new RandomStream(streamKey(o.seed ?? 1, side, "rear-layers")), tally, "unpolarized", side);
  const s = summarizeTally(cs.channels, tally);
  const get = (ch: string) => {
    const i = cs.channels.indexOf(ch);
    if (i < 0) throw new Error(`no channel ${ch} in ${cs.channels.join(", ")}`);
    return { mean: s.mean[i]!, se: s.stderr[i]! };
  };
  // R or T as a whole (first + escape), the error from the per-ray totals (src/trace/tallyLayout.ts).
  const total = (face: "R" | "T") => {
    const t = summarizeTrapping(tally, cs.channels.length);
    const e = face === "R" ? t.reflectionTotal : t.transmissionTotal;
    return { mean: e.mean, se: e.stderr };
  };
  return { cs, s, get, total };
}

/** Glass–glass module, mirror-symmetric about the absorber's mid-plane. */
function symmetricStack(texture: TextureSpec): StackSpec {
  return {
    incidence: "air",
    layers: [
      { name: "front glass", material: "glass", thicknessUm: 2000, topFilms: [] },
      { name: "front EVA", material: "EVA", thicknessUm: 450, topFilms: [] },
    ],
    front: { texture, films: [{ material: "SiNx", thicknessNm: 75 }] },
    absorber: { material: "Si", thicknessUm: 120 },
    rear: { texture, films: [{ material: "SiNx", thicknessNm: 75 }], exit: "EVA" },
    boundary: "periodic",
    rearLayers: [
      { name: "rear EVA", material: "EVA", thicknessUm: 450, bottomFilms: [] },
      { name: "rear glass", material: "glass", thicknessUm: 2000, bottomFilms: [] },
    ],
    rearOuter: { medium: "air" },
  };
}

describe("rear layers and light from the rear", () => {
  it("a stack symmetric under front↔rear swap gives the same response from either side (|z| < 4 per channel)", () => {
    // exact mirror symmetry of the physics (reflection z → −z maps the stack and the incident beam
    // onto themselves): R ↔ T, front layers ↔ rear layers, front films ↔ rear films. The history
    // split swaps with the faces: "first" is relative to the face the light came in by.
    const pairs: [string, string][] = [
      ["R_first", "T_first"], ["R_escape", "T_escape"], ["T_first", "R_first"], ["T_escape", "R_escape"], ["A_absorber", "A_absorber"],
      ["A_layer:front glass", "A_layer:rear glass"], ["A_layer:front EVA", "A_layer:rear EVA"],
      ["A_film:front:0:SiNx", "A_film:rear:0:SiNx"],
    ];
    const cases: [TextureSpec, number, number][] = [
      [{ type: "planar" }, 1000, 30],
      [{ type: "upright-pyramids", baseUm: 10, facetAngleDeg: 54.74 }, 1050, 0],
      [{ type: "upright-pyramids", baseUm: 10, facetAngleDeg: 54.74 }, 500, 45],
    ];
    const pyr: TextureSpec = { type: "upright-pyramids", baseUm: 10, facetAngleDeg: 54.74 };
    const bare: StackSpec = { ...symmetricStack(pyr), layers: [], rear: { texture: pyr, films: [{ material: "SiNx", thicknessNm: 75 }], exit: "air" }, rearLayers: undefined, rearOuter: undefined };
    const stacks: [StackSpec, number, number][] = [...cases.map(([t, wl, th]) => [symmetricStack(t), wl, th] as [StackSpec, number, number]), [bare, 1050, 0]];
    for (const [st, wl, th] of stacks) {
      const tex = st.front.texture;
      const f = trace(st, "front", { wavelengthNm: wl, thetaDeg: th, nRays: 20000, seed: 3 });
      const r = trace(st, "rear", { wavelengthNm: wl, thetaDeg: th, nRays: 20000, seed: 4 });
      for (const [a, b] of pairs) {
        if (!f.cs.channels.includes(a)) continue; // the bare wafer has no layers
        const x = f.get(a), y = r.get(b);
        expectWithin4Sigma(`symmetry ${tex.type} ${wl} nm ${th}°: ${a} vs ${b}`, { mean: x.mean - y.mean, se: Math.hypot(x.se, y.se) }, 0);
      }
    }
  });

  it("a stack lit from the front equals its mirror image lit from the rear (planar front, textured rear: every texture's cell sampled)", () => {
    // mirror symmetry z → −z maps stack A (planar front, pyramids at the rear) lit from the front onto
    // stack B (pyramids in front, planar rear) lit from the rear. At normal incidence through planar
    // layers rays keep their lateral position, so this also checks that rays start uniformly over
    // the textured tile's cell, not over the planar face's.
    const pyr: TextureSpec = { type: "upright-pyramids", baseUm: 10, facetAngleDeg: 54.74 };
    const a = symmetricStack({ type: "planar" });
    a.rear = { texture: pyr, films: [{ material: "SiNx", thicknessNm: 75 }], exit: "EVA" };
    const b = symmetricStack(pyr);
    b.rear = { texture: { type: "planar" }, films: [{ material: "SiNx", thicknessNm: 75 }], exit: "EVA" };
    const f = trace(a, "front", { wavelengthNm: 1050, nRays: 12000, seed: 6 });
    const r = trace(b, "rear", { wavelengthNm: 1050, nRays: 12000, seed: 7 });
    // The history split swaps with the faces too ("first" is relative to the face the light came in by).
    for (const [x, y] of [["R_first", "T_first"], ["R_escape", "T_escape"], ["T_first", "R_first"], ["T_escape", "R_escape"], ["A_absorber", "A_absorber"], ["A_layer:front glass", "A_layer:rear glass"]] as const) {
      expectWithin4Sigma(`mirror pair 1050 nm 0°: ${x} vs ${y}`, { mean: f.get(x).mean - r.get(y).mean, se: Math.hypot(f.get(x).se, r.get(y).se) }, 0);
    }
  });

  it("splits light from the rear on its way in, as light from the front: the first reflection is an expected value", () => {
    // Mirror symmetry (as above): T_first lit from the rear equals R_first lit from the front. At
    // 600 nm one pass through the wafer takes everything (αW ≫ 0.5), so the default estimator splits
    // the way in from either side (src/trace/estimatorChoice.ts) and the first reflection carries
    // almost no sampling error: far below the analog error √(p(1 − p)/n).
    const stack = symmetricStack({ type: "planar" });
    const n = 4000;
    const front = trace(stack, "front", { wavelengthNm: 600, nRays: n }).get("R_first");
    const rear = trace(stack, "rear", { wavelengthNm: 600, nRays: n }).get("T_first");
    expect(front.mean).toBeGreaterThan(0.01);
    expectWithin4Sigma("T_first from the rear vs R_first from the front", { mean: rear.mean - front.mean, se: Math.hypot(rear.se, front.se) + 1e-9 }, 0);
    const analogSe = Math.sqrt((rear.mean * (1 - rear.mean)) / n);
    expect(rear.se).toBeLessThan(0.1 * analogSe);
    expect(front.se).toBeLessThan(0.1 * analogSe);
  });

  it("conserves energy with rear layers, films on their outer faces and every rear boundary", () => {
    // Σ channels = 1 per ray (energy conservation; docs/contracts.md "Channels sum to 1 per point")
    const base = symmetricStack({ type: "upright-pyramids", baseUm: 8, facetAngleDeg: 54.74 });
    base.rearLayers![1]!.bottomFilms = [{ material: "SiO2", thicknessNm: 110 }];
    const variants: StackSpec[] = [
      base,
      { ...base, rearLayers: base.rearLayers!.slice(0, 1), rearOuter: { backsheet: { reflectance: 0.85, haze: 1 } } },
      { ...base, rearLayers: base.rearLayers!.slice(0, 1), rearOuter: { backsheet: { reflectance: 0.6, haze: 0.3 } } },
    ];
    for (const [i, st] of variants.entries()) {
      for (const side of i === 0 ? (["front", "rear"] as const) : (["front"] as const)) {
        for (const wl of [450, 1000, 1150]) {
          const t = trace(st, side, { wavelengthNm: wl, thetaDeg: 20, nRays: 3000 });
          const sum = t.s.mean.reduce((a, b) => a + b, 0);
          expect(Math.abs(sum - 1)).toBeLessThan(1e-12);
          for (const m of t.s.mean) expect(m).toBeGreaterThanOrEqual(0);
        }
      }
    }
    const bottomFilm = trace(base, "rear", { wavelengthNm: 450, nRays: 3000 }).cs.channels;
    expect(bottomFilm).toContain("A_film:bottom:rear glass:0:SiO2");
  });

  it("traps light beyond the critical angle in the rear glass (TIR): T of a Lambertian source matches the escape-cone sum", () => {
    // Ideal randomiser front, index-matched lossless absorber and rear glass (n = 1.5), air behind.
    // Lambertian light meets glass|air: it escapes with τ = ∫₀^θc T_F(θ) 2 sinθ cosθ dθ (Fresnel,
    // Hecht; T_F = 0 beyond θc by TIR); the rest returns to the randomiser, which lets out 1/n²
    // (escape-cone fraction, Yablonovitch 1982) and re-randomises the rest. Geometric series:
    // T = τ / (1 − (1 − τ)(1 − 1/n²)).
    const n = 1.5, cosC = Math.sqrt(1 - 1 / (n * n));
    let tau = 0;
    const N = 20000;
    for (let i = 0; i < N; i++) {
      const c = cosC + ((i + 0.5) / N) * (1 - cosC);
      const { Rs, Rp } = fresnelRsRp(n, 1, c);
      tau += (1 - 0.5 * (Rs + Rp)) * 2 * c * ((1 - cosC) / N);
    }
    const pf = 1 / (n * n);
    const tRef = tau / (1 - (1 - tau) * (1 - pf));
    const st: StackSpec = {
      incidence: "air", layers: [], front: { texture: { type: "lambertian" }, films: [] },
      absorber: { material: "n15", thicknessUm: 100 }, rear: { texture: { type: "planar" }, films: [], exit: "n15" },
      boundary: "periodic", rearLayers: [{ name: "rear glass", material: "n15", thicknessUm: 3000, bottomFilms: [] }], rearOuter: { medium: "air" },
    };
    const t = trace(st, "front", { nRays: 40000, seed: 9 });
    expectWithin4Sigma("TIR in the rear glass: T", t.total("T"), tRef);
    expect(tau).toBeLessThan(pf); // Fresnel loss inside the cone: less than the cone's 1/n²
  });

  it("a specular back-sheet behind a lossless slab gives the incoherent multiple-reflection sums", () => {
    // incoherent slab with front reflectance R0 (Fresnel air|n, normal incidence, Hecht) and a rear
    // reflector r: R = R0 + T0² r/(1 − R0 r), A_rear = T0 (1 − r)/(1 − R0 r) (geometric series)
    const r = 0.7, R0 = ((1.5 - 1) / (1.5 + 1)) ** 2, T0 = 1 - R0;
    const st: StackSpec = {
      incidence: "air", layers: [], front: { texture: { type: "planar" }, films: [] },
      absorber: { material: "n15", thicknessUm: 100 }, rear: { texture: { type: "planar" }, films: [], exit: "n15" },
      boundary: "periodic", rearLayers: [{ name: "rear glass", material: "n15", thicknessUm: 3000, bottomFilms: [] }],
      rearOuter: { backsheet: { reflectance: r, haze: 0 } },
    };
    const t = trace(st, "front", { nRays: 40000, seed: 5 });
    expectWithin4Sigma("specular back-sheet: R", t.total("R"), R0 + (T0 * T0 * r) / (1 - R0 * r));
    // Split by history: R_first is the front Fresnel reflection alone (never entered).
    expectWithin4Sigma("specular back-sheet: R_first", t.get("R_first"), R0);
    expectWithin4Sigma("specular back-sheet: A_rear", t.get("A_rear"), (T0 * (1 - r)) / (1 - R0 * r));
  });

  it("a Lambertian back-sheet: escape through a planar front = r T0 τ_front … (energy split R + A_rear = 1)", () => {
    // lossless slab: whatever the back-sheet does not absorb leaves through the front
    const st: StackSpec = {
      incidence: "air", layers: [], front: { texture: { type: "planar" }, films: [] },
      absorber: { material: "n15", thicknessUm: 100 }, rear: { texture: { type: "planar" }, films: [], exit: "n15" },
      boundary: "periodic", rearLayers: [{ name: "rear glass", material: "n15", thicknessUm: 3000, bottomFilms: [] }],
      rearOuter: { backsheet: { reflectance: 0.9, haze: 1 } },
    };
    const t = trace(st, "front", { nRays: 5000 });
    expect(t.total("R").mean + t.get("A_rear").mean).toBeCloseTo(1, 12);
    expect(t.total("T").mean).toBe(0);
  });
});

describe("rear layer input", () => {
  const raw = {
    front: { texture: { type: "planar" } }, absorber: { thicknessUm: 150 },
    rear: { exit: "EVA" }, rearLayers: [{ material: "EVA", thicknessUm: 450 }, { material: "glass", thicknessUm: 2000 }],
  };
  it("reads a spectral back-sheet reflectance and interpolates it linearly", () => {
    const csv = "wavelength_nm,reflectance\n400,0.5\n800,0.9\n1200,0.7\n";
    const st = validateStack({ ...raw, rearLayers: raw.rearLayers.slice(0, 1), rearOuter: { backsheet: { reflectance: { csv: "bs.csv" }, haze: 0.8 } } }, "stack", undefined, { baseDir: "/v", readText: () => csv });
    expect(compileStack(st, registry, 600).backsheetReflectance).toBeCloseTo(0.7, 12);
    expect(compileStack(st, registry, 1000).backsheetReflectance).toBeCloseTo(0.8, 12);
  });

  it("refuses bad input with the field named", () => {
    const bad = (o: object, re: RegExp) => expect(inputErrorOf(() => validateStack({ ...raw, ...o }, "stack", undefined, { baseDir: "/v", readText: () => "400,0.5\n800,1.2\n" }))).toMatch(re);
    bad({ rear: { exit: "glass" } }, /stack\.rear\.exit.*"EVA"/);
    bad({ rearLayers: undefined, rearOuter: "air" }, /stack\.rearOuter/);
    bad({ rearOuter: { backsheet: { reflectance: 1.3 } } }, /reflectance/);
    bad({ rearOuter: { backsheet: { reflectance: { csv: "bs.csv" } } } }, /bs\.csv:2: reflectance 1\.2 is outside \[0, 1\]/);
    bad({ rear: { ideal: { kind: "mirror" } } }, /stack\.rearLayers/);
    bad({ rearLayers: [{ name: "x", material: "EVA", thicknessUm: -3 }] }, /rearLayers\/0\/thicknessUm|rearLayers\[0\]\.thicknessUm/);
  });

  it("refuses light from the rear of an opaque rear (metal exit)", () => {
    const st = validateStack({ front: { texture: { type: "planar" } }, absorber: { thicknessUm: 150 }, rear: { exit: "Ag" } }, "stack");
    const cs = compileStack(st, registry, 800);
    expect(inputErrorOf(() => traceBatch(cs, 0, 0, 10, new RandomStream("rear-light"), createTally(cs), "unpolarized", "rear"))).toMatch(/illumination/);
  });
});
