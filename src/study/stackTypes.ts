/**
 * Typed form of the study file's "stack" section (see docs/contracts.md, Study file). Produced by
 * validateStack (defaults applied, units in names); read by the tracer's compileStack.
 */

/** Default facet angle: alkaline-etched (111) facets on a (100) wafer, arctan(√2) = 54.7356°. */
export const DEFAULT_FACET_ANGLE_DEG = 54.74;

/** A coherent thin film (transfer-matrix method). */
export interface FilmSpec {
  material: string;
  thicknessNm: number;
}

/** A height grid (row-major, ny rows of nx values, heights in µm) of a measured surface. */
export interface HeightGrid {
  nx: number;
  ny: number;
  heightsUm: Float64Array;
}

export interface PlanarTexture {
  type: "planar";
}
export interface UprightPyramidsTexture {
  type: "upright-pyramids";
  baseUm: number;
  facetAngleDeg: number;
}
export interface InvertedPyramidsTexture {
  type: "inverted-pyramids";
  baseUm: number;
  facetAngleDeg: number;
}
export interface RandomPyramidsTexture {
  type: "random-pyramids";
  meanBaseUm: number;
  /** Relative standard deviation of the base size (0 = all equal). */
  sizeSpread: number;
  /** Pyramids per periodic tile. */
  count: number;
  tileUm: number;
  facetAngleDeg: number;
  seed: number;
}
export interface GroovesTexture {
  type: "grooves";
  periodUm: number;
  facetAngleDeg: number;
  /** Groove direction in the plane, measured from the x axis (0 = grooves run along x). */
  orientationDeg: number;
}
export interface SphericalCapsTexture {
  type: "spherical-caps";
  radiusUm: number;
  periodUm: number;
  depthUm: number;
  /** true = dimples (caps pointing into the absorber). */
  inverted: boolean;
}
export interface HeightMapTexture {
  type: "height-map";
  /** Path as written in the study (relative to the study file). */
  csv: string;
  pitchUm: number;
  /** The parsed grid; present when the study loader could read the file. */
  grid?: HeightGrid;
}

/** Ideal Lambertian randomiser (reference case; front only, no films): see README "Physics and assumptions". */
export interface LambertianTexture {
  type: "lambertian";
}

export type TextureSpec =
  | PlanarTexture
  | LambertianTexture
  | UprightPyramidsTexture
  | InvertedPyramidsTexture
  | RandomPyramidsTexture
  | GroovesTexture
  | SphericalCapsTexture
  | HeightMapTexture;

export type TextureType = TextureSpec["type"];

/** A thick incoherent layer above the absorber (cover glass, encapsulant), planar. */
export interface LayerSpec {
  name: string;
  material: string;
  thicknessUm: number;
  /** Coherent films on the layer's top face, outermost first. */
  topFilms: FilmSpec[];
  /**
   * Outermost layer only: a texture on its top face (textured or anti-glare glass), pointing out of
   * the layer; its base plane is the layer's top plane (the thickness is counted below it).
   */
  topTexture?: TextureSpec;
}

/** The textured interface onto the absorber. Films outermost (light side) first. */
export interface FrontSpec {
  texture: TextureSpec;
  films: FilmSpec[];
}

export interface AbsorberSpec {
  material: string;
  /** From the front texture's base plane (valleys of upright pyramids) to the rear base plane. */
  thicknessUm: number;
}

/** A real rear interface: films inside-out (first = nearest the absorber), then the exit medium. */
export interface RearInterfaceSpec {
  texture: TextureSpec;
  films: FilmSpec[];
  /** Exit medium: a metal (what enters it is absorbed → A_rear) or a transparent medium (→ T). */
  exit: string;
}

/** Reference rear reflectors. */
export interface RearIdealSpec {
  ideal: { kind: "mirror" | "lambertian"; reflectance: number };
}

export type RearSpec = RearInterfaceSpec | RearIdealSpec;

export type BoundaryKind = "periodic" | "mirror";

/** A thick incoherent layer behind the absorber (rear encapsulant, rear glass), planar; nearest the absorber first. */
export interface RearLayerSpec {
  name: string;
  material: string;
  thicknessUm: number;
  /** Coherent films on the layer's outer (rear) face, inside-out (first = nearest the layer). */
  bottomFilms: FilmSpec[];
}

/** A diffusely reflecting back-sheet behind the last rear layer (reflectance as seen from that layer). */
export interface BacksheetSpec {
  /** A constant, or a table over wavelength (read from `csv` at study load; linear interpolation). */
  reflectance: number | { csv: string; wavelengthNm?: Float64Array; values?: Float64Array };
  /** Lambertian share of the reflected light; the rest is specular (1 = Lambertian). */
  haze: number;
}

/** What lies behind the last rear layer: a transparent medium (air: glass–glass, bifacial) or a back-sheet. */
export type RearOuterSpec = { medium: string } | { backsheet: BacksheetSpec };

export interface StackSpec {
  incidence: string;
  layers: LayerSpec[];
  front: FrontSpec;
  absorber: AbsorberSpec;
  rear: RearSpec;
  boundary: BoundaryKind;
  /** Thick layers behind the absorber (absent: the rear interface's exit medium is the outside). */
  rearLayers?: RearLayerSpec[];
  /** Behind the last rear layer (only with rear layers; default air). */
  rearOuter?: RearOuterSpec;
}

export function isBacksheet(o: RearOuterSpec): o is { backsheet: BacksheetSpec } {
  return (o as { backsheet?: BacksheetSpec }).backsheet !== undefined;
}

export function isIdealRear(rear: RearSpec): rear is RearIdealSpec {
  return (rear as RearIdealSpec).ideal !== undefined;
}
