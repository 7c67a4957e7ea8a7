import { InputError } from "../util/errors.js";
import { buildInterfaceTable } from "../optics/interfaceTable.js";
import type { FilmLayer, NK } from "../optics/types.js";
import type { Material } from "../materials/types.js";
import { buildSurface } from "../geometry/textures.js";
import { Q_LENGTH } from "../geometry/surfaceHit.js";
import { planarTile, SURFACE_LAMBERTIAN, type SurfaceTile } from "../geometry/surfaceTile.js";
import { isIdealRear, type BoundaryKind, type FilmSpec, type StackSpec, type TextureSpec } from "../study/stackTypes.js";
import { channelNamesOfStack } from "./channels.js";
import {
  REAR_IDEAL_LAMBERTIAN,
  REAR_IDEAL_MIRROR,
  REAR_INTERFACE,
  type CompiledInterface,
  type CompiledStack,
  type Estimator,
} from "./compiledStack.js";

/** Anything that returns a Material by name (MaterialRegistry). */
export interface MaterialSource {
  get(name: string): Material;
}

export interface CompileOptions {
  /** Default "expected" (chosen by measured variance per unit time, see trace-DEVELOPERS.md). */
  estimator?: Estimator;
  /** Interface events per ray before the rest of its weight goes to `unresolved` (default 10000). */
  maxEvents?: number;
  /** Expected-value mode: weight below which absorption turns analog (default 0.2). */
  rouletteWeight?: number;
  /** Rows of the interface tables over cosθ (default 1024). */
  nCos?: number;
}

export const DEFAULT_ESTIMATOR: Estimator = "expected";
export const DEFAULT_MAX_EVENTS = 10000;
export const DEFAULT_ROULETTE_WEIGHT = 0.2;

/**
 * Prepares a stack for tracing at one wavelength: n, k, α per medium, interface tables for every
 * interface (thin films included), surface tiles. Accepts a Study (uses its `stack`) or a StackSpec.
 * Throws InputError when a material has no data at the wavelength (naming the field).
 */
export function compileStack(
  studyOrStack: StackSpec | { stack: StackSpec },
  registry: MaterialSource,
  wavelengthNm: number,
  options: CompileOptions = {},
): CompiledStack {
  const stack: StackSpec = "stack" in studyOrStack ? studyOrStack.stack : studyOrStack;
  if (!(wavelengthNm > 0) || !Number.isFinite(wavelengthNm)) {
    throw new InputError(`wavelength: expected a positive number of nm, got ${wavelengthNm}`);
  }
  const nkOf = (name: string, field: string): NK => {
    try {
      return registry.get(name).nk(wavelengthNm);
    } catch (err) {
      if (err instanceof InputError) throw new InputError(`stack.${field}: ${err.message}`, err.hint);
      throw err;
    }
  };
  const films = (list: FilmSpec[], field: string): FilmLayer[] =>
    list.map((f, i) => {
      const nk = nkOf(f.material, `${field}[${i}].material`);
      return { n: nk.n, k: nk.k, thicknessNm: f.thicknessNm };
    });

  const channels = channelNamesOfStack(stack);
  const ch = (name: string): number => channels.indexOf(name);
  const nLayers = stack.layers.length;
  const nMedia = nLayers + 2;
  const mediumNK: NK[] = [nkOf(stack.incidence, "incidence")];
  stack.layers.forEach((l, j) => mediumNK.push(nkOf(l.material, `layers[${j}].material`)));
  mediumNK.push(nkOf(stack.absorber.material, "absorber.material"));
  const mediumN = new Float64Array(nMedia);
  const mediumK = new Float64Array(nMedia);
  const mediumAlphaPerUm = new Float64Array(nMedia);
  const mediumChan = new Int32Array(nMedia);
  for (let m = 0; m < nMedia; m++) {
    mediumN[m] = mediumNK[m].n;
    mediumK[m] = mediumNK[m].k;
    // α = 4πk/λ (any optics text); λ in µm gives α in 1/µm.
    mediumAlphaPerUm[m] = m === 0 ? 0 : (4 * Math.PI * mediumNK[m].k) / (wavelengthNm * 1e-3);
    mediumChan[m] = m === 0 ? -1 : m === nMedia - 1 ? ch("A_absorber") : ch(`A_layer:${stack.layers[m - 1].name}`);
  }
  const tableRows = options.nCos ?? 1024;

  // Thick layers: planar top faces, with their coherent films.
  const topInterfaces: CompiledInterface[] = stack.layers.map((l, j) => {
    const f = films(l.topFilms, `layers[${j}].topFilms`);
    return {
      table: buildInterfaceTable(mediumNK[j], f, mediumNK[j + 1], wavelengthNm, tableRows),
      nUpper: mediumN[j],
      nLower: mediumN[j + 1],
      nFilms: f.length,
      filmChan0: f.length > 0 ? ch(`A_film:top:${l.name}:0:${l.topFilms[0].material}`) : -1,
      lowerSinkChan: -1,
    };
  });

  // Front interface onto the absorber.
  const frontFilms = films(stack.front.films, "front.films");
  const front: CompiledInterface = {
    table: buildInterfaceTable(mediumNK[nLayers], frontFilms, mediumNK[nLayers + 1], wavelengthNm, tableRows),
    nUpper: mediumN[nLayers],
    nLower: mediumN[nLayers + 1],
    nFilms: frontFilms.length,
    filmChan0: frontFilms.length > 0 ? ch(`A_film:front:0:${stack.front.films[0].material}`) : -1,
    lowerSinkChan: -1,
  };
  const frontTile = surfaceOf(stack.front.texture, stack.boundary, "stack.front.texture");

  // Rear: real interface (absorber | films | exit) or an ideal reflector.
  let rearKind = REAR_INTERFACE;
  let rear: CompiledInterface | null = null;
  let rearTile: SurfaceTile = planarTile(1);
  let rearReflectance = 0;
  const rearSpec = stack.rear;
  if (isIdealRear(rearSpec)) {
    rearKind = rearSpec.ideal.kind === "mirror" ? REAR_IDEAL_MIRROR : REAR_IDEAL_LAMBERTIAN;
    rearReflectance = rearSpec.ideal.reflectance;
  } else {
    const rearFilms = films(rearSpec.films, "rear.films");
    const exitNK = nkOf(rearSpec.exit, "rear.exit");
    // A metal-like exit (k ≥ n, as the interface tables treat it) absorbs what enters it.
    const metal = exitNK.k >= exitNK.n;
    rear = {
      table: buildInterfaceTable(mediumNK[nLayers + 1], rearFilms, exitNK, wavelengthNm, tableRows),
      nUpper: mediumN[nLayers + 1],
      nLower: exitNK.n,
      nFilms: rearFilms.length,
      filmChan0: rearFilms.length > 0 ? ch(`A_film:rear:0:${rearSpec.films[0].material}`) : -1,
      lowerSinkChan: metal ? ch("A_rear") : ch("T"),
    };
    rearTile = surfaceOf(rearSpec.texture, stack.boundary, "stack.rear.texture");
  }

  // Layer planes: the bottom layer starts at the top of the front texture.
  const layerTopZUm = new Float64Array(nLayers + 1);
  let z = frontTile.zMaxUm;
  for (let j = nLayers; j >= 1; j--) {
    z += stack.layers[j - 1].thicknessUm;
    layerTopZUm[j] = z;
  }

  const thicknessUm = stack.absorber.thicknessUm;
  const frontDepth = -frontTile.zMinUm;
  const rearDepth = -rearTile.zMinUm;
  if (frontDepth + rearDepth >= thicknessUm) {
    throw new InputError(
      `stack.absorber.thicknessUm: ${thicknessUm} µm leaves no bulk between the textures (they reach ${frontDepth + rearDepth} µm into it)`,
    );
  }

  return {
    stack,
    wavelengthNm,
    channels,
    nChannels: channels.length,
    nLayers,
    mediumN,
    mediumK,
    mediumAlphaPerUm,
    mediumChan,
    layerTopZUm,
    topInterfaces,
    front,
    frontTile,
    rearKind,
    rear,
    rearTile,
    rearReflectance,
    thicknessUm,
    chR: ch("R"),
    chT: ch("T"),
    chAbsorber: ch("A_absorber"),
    chRear: ch("A_rear"),
    chUnresolved: ch("unresolved"),
    estimator: options.estimator ?? DEFAULT_ESTIMATOR,
    rouletteWeight: options.rouletteWeight ?? DEFAULT_ROULETTE_WEIGHT,
    maxEvents: options.maxEvents ?? DEFAULT_MAX_EVENTS,
    scratchRow: new Float64Array(4 + 2 * 64),
    contrib: new Float64Array(channels.length),
    state: new Float64Array(32),
    query: new Float64Array(Q_LENGTH),
  };
}

/** Surface tiles depend only on the texture and boundary: built once per spec object. */
const tileCache = new WeakMap<TextureSpec, Map<BoundaryKind, SurfaceTile>>();

function surfaceOf(spec: TextureSpec, boundary: BoundaryKind, fieldPath: string): SurfaceTile {
  let byBoundary = tileCache.get(spec);
  if (byBoundary === undefined) {
    byBoundary = new Map();
    tileCache.set(spec, byBoundary);
  }
  let tile = byBoundary.get(boundary);
  if (tile === undefined) {
    tile = buildSurface(spec, boundary, fieldPath);
    if (tile.kind === SURFACE_LAMBERTIAN && fieldPath.includes("rear")) {
      throw new InputError(`${fieldPath}: the ideal Lambertian randomiser is a front texture only`);
    }
    byBoundary.set(boundary, tile);
  }
  return tile;
}
