import { readFileSync } from "node:fs";
import { resolve } from "node:path";
import { InputError } from "../util/errors.js";
import { checkStudySchema } from "./studySchema.js";
import { parseHeightMapCsv } from "../geometry/heightMapCsv.js";
import { parseReflectanceCsv } from "./reflectanceCsv.js";
import {
  DEFAULT_FACET_ANGLE_DEG,
  type BoundaryKind,
  type FilmSpec,
  type FrontSpec,
  type BacksheetSpec,
  type LayerSpec,
  type RearLayerSpec,
  type RearSpec,
  type StackSpec,
  type TextureSpec,
} from "./stackTypes.js";

/** Anything with a `get(name)` that throws InputError on unknown materials (MaterialRegistry). */
export interface MaterialLookup {
  get(name: string): unknown;
}

export interface ValidateStackOptions {
  /** Directory of the study file; relative height-map paths resolve against it. */
  baseDir?: string;
  /** Reads a file as text (default: fs.readFileSync utf8). Used for height maps only. */
  readText?: (absPath: string) => string;
}

/**
 * Validates the raw "stack" JSON of a study file into a StackSpec: the schema
 * (schema/study.schema.json, `$defs/stack`) checks every field (types, ranges, unknown fields with
 * a did-you-mean hint); this code applies defaults and the checks that relate several fields or
 * need the material registry. Every error is an InputError naming the field path. Height maps are
 * read (relative to options.baseDir) when a base directory or a reader is given; otherwise `grid`
 * stays unset.
 */
export function validateStack(
  raw: unknown,
  path: string,
  registry?: MaterialLookup,
  options: ValidateStackOptions = {},
): StackSpec {
  checkStudySchema("stack", raw, path);
  const ctx: Ctx = { registry, options };
  const o = raw as RawStack;
  const front: FrontSpec = {
    texture: texture(ctx, o.front.texture ?? { type: "planar" }, `${path}.front.texture`),
    films: filmList(ctx, o.front.films, `${path}.front.films`),
  };
  if (front.texture.type === "lambertian" && front.films.length > 0) {
    throw new InputError(`${path}.front.films: the ideal Lambertian randomiser takes no films`);
  }
  return {
    incidence: material(ctx, o.incidence ?? "air", `${path}.incidence`),
    layers: layerList(ctx, o.layers ?? [], `${path}.layers`),
    front,
    absorber: {
      material: material(ctx, o.absorber.material ?? "Si", `${path}.absorber.material`),
      thicknessUm: o.absorber.thicknessUm,
    },
    rear: rearSpec(ctx, o.rear, `${path}.rear`),
    boundary: o.boundary ?? "periodic",
    ...rearLayersOf(ctx, o, path),
  };
}

/**
 * Rear layers and what lies behind them. The rear interface's exit medium is the first rear layer,
 * so `rear.exit` must name its material; names are unique among all layers (one A_layer channel each).
 */
function rearLayersOf(ctx: Ctx, o: RawStack, path: string): Pick<StackSpec, "rearLayers" | "rearOuter"> {
  if (o.rearLayers === undefined || o.rearLayers.length === 0) {
    if (o.rearOuter !== undefined) {
      throw new InputError(`${path}.rearOuter: needs rear layers (stack.rearLayers) to stand behind`, 'add e.g. "rearLayers": [{ "material": "glass", "thicknessUm": 2000 }]');
    }
    return {};
  }
  if ("ideal" in o.rear) {
    throw new InputError(`${path}.rearLayers: an ideal rear reflector has nothing behind it`, 'use a real rear: { "texture": …, "films": […], "exit": "<first rear layer material>" }');
  }
  if (o.rear.exit !== o.rearLayers[0]!.material) {
    throw new InputError(
      `${path}.rear.exit: expected ${JSON.stringify(o.rearLayers[0]!.material)}, the material of the first rear layer (the medium behind the rear interface), got ${JSON.stringify(o.rear.exit)}`,
    );
  }
  const names = new Set((o.layers ?? []).map((l) => l.name ?? l.material));
  const rearLayers: RearLayerSpec[] = o.rearLayers.map((l, i) => {
    const p = `${path}.rearLayers[${i}]`;
    const mat = material(ctx, l.material, `${p}.material`);
    const name = l.name ?? mat;
    if (names.has(name)) throw new InputError(`${p}.name: layer name ${JSON.stringify(name)} is used twice`, "give each layer (front and rear) its own name");
    names.add(name);
    return { name, material: mat, thicknessUm: l.thicknessUm, bottomFilms: filmList(ctx, l.bottomFilms, `${p}.bottomFilms`) };
  });
  const outer = o.rearOuter ?? "air";
  if (typeof outer === "string") return { rearLayers, rearOuter: { medium: material(ctx, outer, `${path}.rearOuter`) } };
  const bs = outer.backsheet;
  const haze = bs.haze ?? 1;
  if (typeof bs.reflectance === "number") return { rearLayers, rearOuter: { backsheet: { reflectance: bs.reflectance, haze } } };
  return { rearLayers, rearOuter: { backsheet: { reflectance: reflectanceTable(ctx, bs.reflectance.csv, `${path}.rearOuter.backsheet.reflectance.csv`), haze } } };
}

/** A back-sheet reflectance table (wavelength_nm, reflectance 0–1), read when the study's folder is known. */
function reflectanceTable(ctx: Ctx, csv: string, path: string): BacksheetSpec["reflectance"] {
  const { baseDir, readText } = ctx.options;
  if (baseDir === undefined && readText === undefined) return { csv };
  const abs = resolve(baseDir ?? ".", csv);
  let text: string;
  try {
    text = (readText ?? ((p: string) => readFileSync(p, "utf8")))(abs);
  } catch (err) {
    throw new InputError(`${path}: cannot read back-sheet reflectance ${abs}: ${(err as Error).message}`);
  }
  return { csv, ...parseReflectanceCsv(text, abs) };
}

/** The stack as the schema admits it (optional fields still unset). */
interface RawStack {
  incidence?: string;
  layers?: { name?: string; material: string; thicknessUm: number; topFilms?: FilmSpec[]; topTexture?: RawTexture }[];
  front: { texture?: RawTexture; films?: FilmSpec[] };
  absorber: { material?: string; thicknessUm: number };
  rear: { ideal: { kind: "mirror" | "lambertian"; reflectance?: number } } | { texture?: RawTexture; films?: FilmSpec[]; exit: string };
  boundary?: BoundaryKind;
  rearLayers?: { name?: string; material: string; thicknessUm: number; bottomFilms?: FilmSpec[] }[];
  rearOuter?: string | { backsheet: { reflectance: number | { csv: string }; haze?: number } };
}
type RawTexture = { type: TextureSpec["type"] } & Record<string, number | boolean | string | undefined>;

interface Ctx {
  registry: MaterialLookup | undefined;
  options: ValidateStackOptions;
}

function layerList(ctx: Ctx, raw: NonNullable<RawStack["layers"]>, path: string): LayerSpec[] {
  const names = new Set<string>();
  return raw.map((o, i) => {
    const p = `${path}[${i}]`;
    const mat = material(ctx, o.material, `${p}.material`);
    const name = o.name ?? mat;
    if (names.has(name)) {
      throw new InputError(`${p}.name: layer name ${JSON.stringify(name)} is used twice`, "give each layer its own name");
    }
    names.add(name);
    const layer: LayerSpec = { name, material: mat, thicknessUm: o.thicknessUm, topFilms: filmList(ctx, o.topFilms, `${p}.topFilms`) };
    if (o.topTexture !== undefined) {
      if (i > 0) throw new InputError(`${p}.topTexture: only the outermost layer (layers[0]) can have a textured top face`);
      if (o.topTexture.type === "lambertian") throw new InputError(`${p}.topTexture.type: "lambertian" (ideal randomiser) is a front texture only`);
      layer.topTexture = texture(ctx, o.topTexture, `${p}.topTexture`);
    }
    return layer;
  });
}

function rearSpec(ctx: Ctx, o: RawStack["rear"], path: string): RearSpec {
  if ("ideal" in o) return { ideal: { kind: o.ideal.kind, reflectance: o.ideal.reflectance ?? 1 } };
  return {
    texture: texture(ctx, o.texture ?? { type: "planar" }, `${path}.texture`),
    films: filmList(ctx, o.films, `${path}.films`),
    exit: material(ctx, o.exit, `${path}.exit`),
  };
}

function filmList(ctx: Ctx, raw: FilmSpec[] | undefined, path: string): FilmSpec[] {
  return (raw ?? []).map((f, i) => ({ material: material(ctx, f.material, `${path}[${i}].material`), thicknessNm: f.thicknessNm }));
}

function texture(ctx: Ctx, o: RawTexture, path: string): TextureSpec {
  const type = o.type;
  const num = (key: string, fallback?: number): number => (o[key] as number | undefined) ?? fallback!;
  const facetAngleDeg = num("facetAngleDeg", DEFAULT_FACET_ANGLE_DEG);
  switch (type) {
    case "planar":
      return { type };
    case "lambertian":
      if (!path.endsWith(".front.texture")) {
        throw new InputError(`${path}.type: "lambertian" (ideal randomiser) is a front texture only`, 'use rear "ideal": { "kind": "lambertian" }');
      }
      return { type };
    case "upright-pyramids":
    case "inverted-pyramids":
      return { type, baseUm: num("baseUm"), facetAngleDeg };
    case "random-pyramids": {
      const meanBaseUm = num("meanBaseUm");
      const count = num("count", 20);
      // Default tile: coverage count·mean²/tile² = 4, so about e^-4 ≈ 2 % of the base plane stays flat.
      const tileUm = num("tileUm", (meanBaseUm * Math.sqrt(count)) / 2);
      return { type, meanBaseUm, sizeSpread: num("sizeSpread", 0.3), count, tileUm, facetAngleDeg, seed: num("seed", 1) };
    }
    case "grooves":
      return { type, periodUm: num("periodUm"), facetAngleDeg, orientationDeg: num("orientationDeg", 0) };
    case "spherical-caps":
      return sphericalCaps(o, path);
    case "height-map":
      return heightMap(ctx, o, path);
  }
}

/** A cap no deeper than its radius, whose rim fits the cell diagonal. */
function sphericalCaps(o: RawTexture, path: string): TextureSpec {
  const radiusUm = o.radiusUm as number;
  const periodUm = o.periodUm as number;
  const depthUm = o.depthUm as number;
  if (depthUm > radiusUm) {
    throw new InputError(`${path}.depthUm: expected at most radiusUm (${radiusUm}), got ${depthUm}`);
  }
  const chordUm = 2 * Math.sqrt(depthUm * (2 * radiusUm - depthUm));
  if (chordUm > periodUm * Math.SQRT2 + 1e-9) {
    throw new InputError(
      `${path}.depthUm: a cap of radius ${radiusUm} µm and depth ${depthUm} µm is ${chordUm.toFixed(3)} µm wide, ` +
        `more than the cell diagonal ${(periodUm * Math.SQRT2).toFixed(3)} µm`,
      "lower depthUm or raise periodUm",
    );
  }
  return { type: "spherical-caps", radiusUm, periodUm, depthUm, inverted: (o.inverted as boolean | undefined) ?? false };
}

function heightMap(ctx: Ctx, o: RawTexture, path: string): TextureSpec {
  const csv = o.csv as string;
  const spec: TextureSpec = { type: "height-map", csv, pitchUm: o.pitchUm as number };
  const { baseDir, readText } = ctx.options;
  if (baseDir !== undefined || readText !== undefined) {
    const abs = resolve(baseDir ?? ".", csv);
    let text: string;
    try {
      text = (readText ?? ((p: string) => readFileSync(p, "utf8")))(abs);
    } catch (err) {
      throw new InputError(`${path}.csv: cannot read height map ${abs}: ${(err as Error).message}`);
    }
    spec.grid = parseHeightMapCsv(text, abs);
  }
  return spec;
}

/** A material name the registry knows (its error carries the did-you-mean hint). */
function material(ctx: Ctx, name: string, path: string): string {
  if (ctx.registry !== undefined) {
    try {
      ctx.registry.get(name);
    } catch (err) {
      if (err instanceof InputError) throw new InputError(`${path}: ${err.message}`, err.hint);
      throw err;
    }
  }
  return name;
}
