import { readFileSync } from "node:fs";
import { resolve } from "node:path";
import { InputError } from "../util/errors.js";
import {
  describeValue,
  expectInteger,
  expectNumber,
  expectObject,
  expectOneOf,
  expectPositive,
  expectString,
  rejectUnknownFields,
  requireField,
} from "./fieldChecks.js";
import { parseHeightMapCsv } from "../geometry/heightMapCsv.js";
import {
  DEFAULT_FACET_ANGLE_DEG,
  type BoundaryKind,
  type FilmSpec,
  type FrontSpec,
  type LayerSpec,
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
 * Validates the raw "stack" JSON of a study file into a StackSpec: defaults applied, unknown fields
 * rejected with a did-you-mean hint, every error an InputError naming the field path. With a
 * registry, material names are checked too. Height maps are read (relative to options.baseDir) when
 * a base directory or a reader is given; otherwise `grid` stays unset.
 */
export function validateStack(
  raw: unknown,
  path: string,
  registry?: MaterialLookup,
  options: ValidateStackOptions = {},
): StackSpec {
  const ctx: Ctx = { registry, options };
  const o = expectObject(raw, path);
  rejectUnknownFields(o, path, ["incidence", "layers", "front", "absorber", "rear", "boundary"]);
  const incidence = material(ctx, o.incidence ?? "air", `${path}.incidence`);
  const layers = layerList(ctx, o.layers, `${path}.layers`);
  const front = frontSpec(ctx, requireField(o, "front", path), `${path}.front`);
  const a = expectObject(requireField(o, "absorber", path), `${path}.absorber`);
  rejectUnknownFields(a, `${path}.absorber`, ["material", "thicknessUm"]);
  const absorber = {
    material: material(ctx, a.material ?? "Si", `${path}.absorber.material`),
    thicknessUm: expectPositive(requireField(a, "thicknessUm", `${path}.absorber`), `${path}.absorber.thicknessUm`),
  };
  const rear = rearSpec(ctx, requireField(o, "rear", path), `${path}.rear`);
  const boundary = expectOneOf(o.boundary ?? "periodic", `${path}.boundary`, ["periodic", "mirror"]) as BoundaryKind;
  return { incidence, layers, front, absorber, rear, boundary };
}

interface Ctx {
  registry: MaterialLookup | undefined;
  options: ValidateStackOptions;
}

function layerList(ctx: Ctx, raw: unknown, path: string): LayerSpec[] {
  if (raw === undefined) return [];
  if (!Array.isArray(raw)) throw new InputError(`${path}: expected a list of layers, got ${describeValue(raw)}`);
  const names = new Set<string>();
  return raw.map((item, i) => {
    const p = `${path}[${i}]`;
    const o = expectObject(item, p);
    rejectUnknownFields(o, p, ["name", "material", "thicknessUm", "topFilms"]);
    const mat = material(ctx, requireField(o, "material", p), `${p}.material`);
    const name = o.name === undefined ? mat : expectString(o.name, `${p}.name`);
    if (names.has(name)) {
      throw new InputError(`${p}.name: layer name ${JSON.stringify(name)} is used twice`, "give each layer its own name");
    }
    names.add(name);
    return {
      name,
      material: mat,
      thicknessUm: expectPositive(requireField(o, "thicknessUm", p), `${p}.thicknessUm`),
      topFilms: filmList(ctx, o.topFilms, `${p}.topFilms`),
    };
  });
}

function frontSpec(ctx: Ctx, raw: unknown, path: string): FrontSpec {
  const o = expectObject(raw, path);
  rejectUnknownFields(o, path, ["texture", "films"]);
  const spec = {
    texture: texture(ctx, o.texture ?? { type: "planar" }, `${path}.texture`),
    films: filmList(ctx, o.films, `${path}.films`),
  };
  if (spec.texture.type === "lambertian" && spec.films.length > 0) {
    throw new InputError(`${path}.films: the ideal Lambertian randomiser takes no films`);
  }
  return spec;
}

function rearSpec(ctx: Ctx, raw: unknown, path: string): RearSpec {
  const o = expectObject(raw, path);
  if (o.ideal !== undefined) {
    rejectUnknownFields(o, path, ["ideal"]);
    const p = `${path}.ideal`;
    const ideal = expectObject(o.ideal, p);
    rejectUnknownFields(ideal, p, ["kind", "reflectance"]);
    const kind = expectOneOf(requireField(ideal, "kind", p), `${p}.kind`, ["mirror", "lambertian"]) as "mirror" | "lambertian";
    const reflectance = expectNumber(ideal.reflectance ?? 1, `${p}.reflectance`);
    if (!(reflectance >= 0 && reflectance <= 1)) {
      throw new InputError(`${p}.reflectance: expected a number in [0, 1], got ${reflectance}`);
    }
    return { ideal: { kind, reflectance } };
  }
  rejectUnknownFields(o, path, ["texture", "films", "exit", "ideal"]);
  return {
    texture: texture(ctx, o.texture ?? { type: "planar" }, `${path}.texture`),
    films: filmList(ctx, o.films, `${path}.films`),
    exit: material(ctx, requireField(o, "exit", path), `${path}.exit`),
  };
}

function filmList(ctx: Ctx, raw: unknown, path: string): FilmSpec[] {
  if (raw === undefined) return [];
  if (!Array.isArray(raw)) throw new InputError(`${path}: expected a list of films, got ${describeValue(raw)}`);
  return raw.map((item, i) => {
    const p = `${path}[${i}]`;
    const o = expectObject(item, p);
    rejectUnknownFields(o, p, ["material", "thicknessNm"]);
    return {
      material: material(ctx, requireField(o, "material", p), `${p}.material`),
      thicknessNm: expectPositive(requireField(o, "thicknessNm", p), `${p}.thicknessNm`),
    };
  });
}

const TEXTURE_FIELDS: Record<TextureSpec["type"], string[]> = {
  planar: [],
  lambertian: [],
  "upright-pyramids": ["baseUm", "facetAngleDeg"],
  "inverted-pyramids": ["baseUm", "facetAngleDeg"],
  "random-pyramids": ["meanBaseUm", "sizeSpread", "count", "tileUm", "facetAngleDeg", "seed"],
  grooves: ["periodUm", "facetAngleDeg", "orientationDeg"],
  "spherical-caps": ["radiusUm", "periodUm", "depthUm", "inverted"],
  "height-map": ["csv", "pitchUm"],
};

function texture(ctx: Ctx, raw: unknown, path: string): TextureSpec {
  const o = expectObject(raw, path);
  const type = expectOneOf(requireField(o, "type", path), `${path}.type`, Object.keys(TEXTURE_FIELDS)) as TextureSpec["type"];
  rejectUnknownFields(o, path, ["type", ...TEXTURE_FIELDS[type]]);
  const facet = (): number => facetAngle(o.facetAngleDeg ?? DEFAULT_FACET_ANGLE_DEG, `${path}.facetAngleDeg`);
  const pos = (key: string): number => expectPositive(requireField(o, key, path), `${path}.${key}`);
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
      return { type, baseUm: pos("baseUm"), facetAngleDeg: facet() };
    case "random-pyramids": {
      const meanBaseUm = pos("meanBaseUm");
      const sizeSpread = expectNumber(o.sizeSpread ?? 0.3, `${path}.sizeSpread`);
      if (!(sizeSpread >= 0 && sizeSpread < 1)) {
        throw new InputError(`${path}.sizeSpread: expected a relative standard deviation in [0, 1), got ${sizeSpread}`);
      }
      const count = expectInteger(o.count ?? 20, `${path}.count`, 1, 10000);
      // Default tile: coverage count·mean²/tile² = 4, so about e^-4 ≈ 2 % of the base plane stays flat.
      const tileUm = o.tileUm === undefined ? (meanBaseUm * Math.sqrt(count)) / 2 : expectPositive(o.tileUm, `${path}.tileUm`);
      const seed = expectInteger(o.seed ?? 1, `${path}.seed`, 0, 2 ** 31);
      return { type, meanBaseUm, sizeSpread, count, tileUm, facetAngleDeg: facet(), seed };
    }
    case "grooves":
      return {
        type,
        periodUm: pos("periodUm"),
        facetAngleDeg: facet(),
        orientationDeg: expectNumber(o.orientationDeg ?? 0, `${path}.orientationDeg`),
      };
    case "spherical-caps": {
      const radiusUm = pos("radiusUm");
      const periodUm = pos("periodUm");
      const depthUm = pos("depthUm");
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
      const inverted = o.inverted ?? false;
      if (typeof inverted !== "boolean") throw new InputError(`${path}.inverted: expected true or false, got ${describeValue(inverted)}`);
      return { type, radiusUm, periodUm, depthUm, inverted };
    }
    case "height-map": {
      const csv = expectString(requireField(o, "csv", path), `${path}.csv`);
      const pitchUm = pos("pitchUm");
      const spec: TextureSpec = { type, csv, pitchUm };
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
  }
}

// ---- primitive checks -------------------------------------------------------------------------

function facetAngle(raw: unknown, path: string): number {
  if (typeof raw !== "number" || !Number.isFinite(raw) || raw <= 0 || raw >= 90) {
    throw new InputError(`${path}: expected a number in (0, 90), got ${describeValue(raw)}`);
  }
  return raw;
}

function material(ctx: Ctx, raw: unknown, path: string): string {
  const name = expectString(raw, path);
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
