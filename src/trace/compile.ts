import { InputError } from "../util/errors.js";
import { buildInterfaceTable } from "../optics/interfaceTable.js";
import type { FilmLayer, NK } from "../optics/types.js";
import type { Material } from "../materials/types.js";
import { buildSurface } from "../geometry/textures.js";
import { Query } from "../geometry/surfaceHit.js";
import { SurfaceKind, planarTile, type SurfaceTile } from "../geometry/surfaceTile.js";
import { isBacksheet, isIdealRear, type BacksheetSpec, type BoundaryKind, type FilmSpec, type StackSpec, type TextureSpec } from "../study/stackTypes.js";
import { reflectanceAt } from "../study/reflectanceCsv.js";
import { DIAG_LENGTH, ESCAPE_ANGLE_BINS, MAX_PASSES } from "./tallyLayout.js";
import { CH_R_ESCAPE, CH_R_FIRST, CH_T_ESCAPE, CH_T_FIRST, channelNamesOfStack } from "./channels.js";
import { BRANCH_SLOTS, MAX_BRANCHES } from "./branches.js";
import { STATE_LENGTH } from "./rayState.js";
import { analogCellEligible } from "./analogCell.js";
import { chooseEstimator, type EstimatorChoice } from "./estimatorChoice.js";
import type { LaunchSampling } from "../random/sobol.js";
import { RearKind, type CompiledInterface, type CompiledStack, type Estimator } from "./compiledStack.js";

/** Anything that returns a Material by name (MaterialRegistry). */
export interface MaterialSource {
  get(name: string): Material;
}

export interface CompileOptions {
  /** Default: chosen per wavelength from the absorber's αW and the stack (estimatorChoice.ts). */
  estimator?: Estimator;
  /** Interface events per ray before the rest of its weight goes to `unresolved` (default 10000). */
  maxEvents?: number;
  /** Expected-value mode: weight below which absorption turns analog (default per wavelength, estimatorChoice.ts). */
  rouletteWeight?: number;
  /**
   * Expected-value mode: an interface event on the way in splits the ray into its reflected and
   * transmitted parts when both weigh at least this much (0 = never split, sample the branch).
   * Default per wavelength and front (estimatorChoice.ts).
   */
  splitMinWeight?: number;
  /**
   * Expected-value mode: light in the absorber that meets a face it may leave through splits into its
   * escaping and returned parts when both weigh at least this much (0 = never; default per point,
   * estimatorChoice.ts).
   */
  escapeSplitMinWeight?: number;
  /** Launch sampling the stack will be traced with (default: a study's rays.sampling, else random); it steers the default estimator. */
  launchSampling?: LaunchSampling;
  /** Rows of the interface tables over cosθ (default 1024). */
  nCos?: number;
  /**
   * Generation profile: tally absorber absorption per depth bin (edges in µm from the top of the
   * front texture, ascending from 0; the last bin also takes anything deeper). Off by default.
   */
  depthEdgesUm?: Float64Array | number[];
}

export const DEFAULT_MAX_EVENTS = 10000;

/**
 * Prepares a stack for tracing at one wavelength: n, k, α per medium, interface tables for every
 * interface (thin films included), surface tiles. Accepts a Study (uses its `stack`, and its
 * `rays.sampling` for the default estimator) or a StackSpec.
 * Throws InputError when a material has no data at the wavelength (naming the field).
 */
export function compileStack(
  studyOrStack: StackSpec | { stack: StackSpec; rays?: { sampling?: LaunchSampling } },
  registry: MaterialSource,
  wavelengthNm: number,
  options: CompileOptions = {},
): CompiledStack {
  const stack: StackSpec = "stack" in studyOrStack ? studyOrStack.stack : studyOrStack;
  if (!(wavelengthNm > 0) || !Number.isFinite(wavelengthNm)) {
    throw new InputError(`wavelength: expected a positive number of nm, got ${wavelengthNm}`);
  }
  const { nkOf, films } = materialLookups(registry, wavelengthNm);
  const channels = channelNamesOfStack(stack);
  const ch = (name: string): number => channels.indexOf(name);
  const nLayers = stack.layers.length;
  const nRear = (stack.rearLayers ?? []).length;
  const ABS = nLayers + 1;
  const outerMedium = ABS + nRear + 1;
  const { mediumNK, mediumN, mediumK, mediumAlphaPerUm, mediumChan } = compileMedia(stack, wavelengthNm, nkOf, ch);
  const tableRows = options.nCos ?? 1024;

  const cx: CompileContext = { stack, wavelengthNm, tableRows, nkOf, films, ch, mediumNK, mediumN, nRear };
  const { topInterfaces, front } = compileFrontInterfaces(cx);
  const frontTile = surfaceOf(stack.front.texture, stack.boundary, "stack.front.texture");
  // Rear: real interface (absorber | films | exit) or an ideal reflector.
  const { rearKind, rear, rearTile, rearReflectance, metalExit } = compileRearInterface(cx);

  const { layerTopZUm, outerTile } = compileLayerPlanes(stack, frontTile);
  const thicknessUm = stack.absorber.thicknessUm;
  checkBulk(thicknessUm, frontTile, rearTile);

  const rl = compileRearLayers(cx, thicknessUm, rearTile, outerMedium);
  const rearOpaque = isIdealRear(stack.rear) || (metalExit && nRear === 0) || rl.backsheetReflectance >= 0;

  const depthEdges = options.depthEdgesUm === undefined ? null : checkDepthEdges(options.depthEdgesUm);
  const sampling = options.launchSampling ?? ("stack" in studyOrStack ? studyOrStack.rays?.sampling : undefined);
  const choice = chooseEstimator(mediumAlphaPerUm[ABS] * thicknessUm, frontTile.kind === SurfaceKind.PLANAR && outerTile === null, nLayers > 0 || nRear > 0, sampling === "sobol");
  const cs: CompiledStack = {
    stack,
    wavelengthNm,
    nRear,
    ...rl,
    outerMedium,
    rearOpaque,
    rearLaunchZUm: nRear > 0 ? rl.rearBottomZUm[nRear - 1] : -thicknessUm - rearTile.zMaxUm - 1,
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
    outerTile,
    ...launchWindow([outerTile, frontTile, rearTile]),
    rearKind,
    rear,
    rearTile,
    rearReflectance,
    thicknessUm,
    invThicknessUm: 1 / thicknessUm,
    chRFirst: ch(CH_R_FIRST),
    chREscape: ch(CH_R_ESCAPE),
    chTFirst: ch(CH_T_FIRST),
    chTEscape: ch(CH_T_ESCAPE),
    chAbsorber: ch("A_absorber"),
    chRear: ch("A_rear"),
    chUnresolved: ch("unresolved"),
    ...estimatorOf(options, choice),
    maxEvents: options.maxEvents ?? DEFAULT_MAX_EVENTS,
    branches: new Float64Array(MAX_BRANCHES * BRANCH_SLOTS),
    scratchRow: new Float64Array(4 + 2 * 64),
    contrib: new Float64Array(channels.length),
    state: new Float64Array(STATE_LENGTH),
    query: new Float64Array(Query.LENGTH),
    diag: new Float64Array(DIAG_LENGTH),
    depthEdgesUm: depthEdges,
    depthTopZUm: frontTile.zMaxUm,
    absorberDepthUm: frontTile.zMaxUm + thicknessUm + rearTile.zMaxUm,
    rayDepth: new Float64Array(depthEdges === null ? 0 : depthEdges.length - 1),
    rayPasses: new Float64Array(MAX_PASSES),
    rayEscape: new Float64Array(ESCAPE_ANGLE_BINS),
    analogCellLoop: false,
  };
  cs.analogCellLoop = analogCellEligible(cs);
  return cs;
}

/**
 * n, k of a named material at the wavelength, and a film list as layers; a material without data
 * there is refused naming the stack field.
 */
function materialLookups(registry: MaterialSource, wavelengthNm: number): Pick<CompileContext, "nkOf" | "films"> {
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
  return { nkOf, films };
}

/** The thick layers' planar top faces with their coherent films, and the front interface onto the absorber. */
function compileFrontInterfaces(cx: CompileContext): { topInterfaces: CompiledInterface[]; front: CompiledInterface } {
  const { stack, wavelengthNm, tableRows, films, ch, mediumNK, mediumN } = cx;
  const nLayers = stack.layers.length;
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
  const frontFilms = films(stack.front.films, "front.films");
  const front: CompiledInterface = {
    table: buildInterfaceTable(mediumNK[nLayers], frontFilms, mediumNK[nLayers + 1], wavelengthNm, tableRows),
    nUpper: mediumN[nLayers],
    nLower: mediumN[nLayers + 1],
    nFilms: frontFilms.length,
    filmChan0: frontFilms.length > 0 ? ch(`A_film:front:0:${stack.front.films[0].material}`) : -1,
    lowerSinkChan: -1,
  };
  return { topInterfaces, front };
}

/**
 * The thick layers' top planes (the bottom layer starts at the top of the front texture) and the
 * outer layer's top texture (textured glass: it points out of the layer from its top plane).
 */
function compileLayerPlanes(stack: StackSpec, frontTile: SurfaceTile): { layerTopZUm: Float64Array; outerTile: SurfaceTile | null } {
  const nLayers = stack.layers.length;
  const layerTopZUm = new Float64Array(nLayers + 1);
  let z = frontTile.zMaxUm;
  for (let j = nLayers; j >= 1; j--) {
    z += stack.layers[j - 1].thicknessUm;
    layerTopZUm[j] = z;
  }
  const outerSpec = stack.layers[0]?.topTexture;
  const outerTile = outerSpec ? surfaceOf(outerSpec, stack.boundary, "stack.layers[0].topTexture") : null;
  if (outerTile !== null && -outerTile.zMinUm >= stack.layers[0]!.thicknessUm) {
    throw new InputError(`stack.layers[0].topTexture: its pits reach ${-outerTile.zMinUm} µm into a ${stack.layers[0]!.thicknessUm} µm layer`);
  }
  return { layerTopZUm, outerTile };
}

/** Refuses front and rear textures that reach so far into the absorber that no bulk is left between them. */
function checkBulk(thicknessUm: number, frontTile: SurfaceTile, rearTile: SurfaceTile): void {
  const frontDepth = -frontTile.zMinUm;
  const rearDepth = -rearTile.zMinUm;
  if (frontDepth + rearDepth >= thicknessUm) {
    throw new InputError(
      `stack.absorber.thicknessUm: ${thicknessUm} µm leaves no bulk between the textures (they reach ${frontDepth + rearDepth} µm into it)`,
    );
  }
}

/**
 * The estimator and its settings (slots of CompiledStack.estimatorSettings): what the options name
 * wins over the point's default; an estimator named explicitly holds at every angle.
 */
function estimatorOf(options: CompileOptions, choice: EstimatorChoice): { estimator: Estimator; estimatorSettings: Float64Array } {
  return {
    estimator: options.estimator ?? choice.estimator,
    estimatorSettings: Float64Array.of(
      options.estimator === undefined ? choice.analogFromThetaDeg : Infinity,
      options.rouletteWeight ?? choice.rouletteWeight,
      options.splitMinWeight ?? choice.splitMinWeight,
      options.escapeSplitMinWeight ?? choice.escapeSplitMinWeight,
      choice.polarizationSplitFromThetaDeg,
    ),
  };
}

function checkDepthEdges(edges: Float64Array | number[]): Float64Array {
  const e = Float64Array.from(edges);
  let ok = e.length >= 2 && e[0] === 0;
  for (let i = 1; i < e.length && ok; i++) ok = e[i] > e[i - 1] && Number.isFinite(e[i]);
  if (!ok) throw new InputError(`depth bins: expected edges in µm ascending from 0 (at least one bin), got [${Array.from(e).join(", ")}]`);
  return e;
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
    if (tile.kind === SurfaceKind.LAMBERTIAN && fieldPath.includes("rear")) {
      throw new InputError(`${fieldPath}: the ideal Lambertian randomiser is a front texture only`);
    }
    byBoundary.set(boundary, tile);
  }
  return tile;
}

/** The medium behind the rear: behind the last rear layer (default air; a back-sheet counts as air for indexing), else the rear exit. */
function outerNK(stack: StackSpec, nkOf: (name: string, field: string) => NK): NK {
  const outer = stack.rearOuter;
  if ((stack.rearLayers ?? []).length > 0) {
    if (outer !== undefined && !isBacksheet(outer)) return nkOf(outer.medium, "rearOuter");
    return { n: 1, k: 0 };
  }
  if (isIdealRear(stack.rear)) return { n: 1, k: 0 };
  return nkOf(stack.rear.exit, "rear.exit");
}

/** A back-sheet reflectance table at λ (read at study load). */
function backsheetTableValue(t: Exclude<BacksheetSpec["reflectance"], number>, wavelengthNm: number): number {
  if (!t.wavelengthNm || !t.values) {
    throw new InputError(`stack.rearOuter.backsheet.reflectance.csv: table ${t.csv} was not read (load the study with its folder)`);
  }
  return reflectanceAt({ wavelengthNm: t.wavelengthNm, values: t.values }, wavelengthNm, `stack.rearOuter.backsheet.reflectance (${t.csv})`);
}

/** Cells of this many of the largest period make the window when several textured tiles are met. */
export const LAUNCH_WINDOW_CELLS = 4096;

/**
 * Where rays start. Every textured tile must see the rays' lateral positions uniformly over its own
 * cell, or (at normal incidence through planar layers) part of a texture is never met. With one
 * textured tile its cell is exact (the older behaviour); with several, a window of 4096 of the
 * largest cells makes each tile's phase uniform to within 1/4096 of its period.
 */
function launchWindow(tiles: (SurfaceTile | null)[]): { launchLxUm: number; launchLyUm: number } {
  const textured = tiles.filter((t): t is SurfaceTile => t !== null && t.kind === SurfaceKind.MESH);
  if (textured.length === 0) {
    const front = tiles[1]!;
    return { launchLxUm: front.lxUm, launchLyUm: front.lyUm };
  }
  const same = textured.every((t) => t === textured[0] || (t.lxUm === textured[0]!.lxUm && t.lyUm === textured[0]!.lyUm));
  if (same) return { launchLxUm: textured[0]!.lxUm, launchLyUm: textured[0]!.lyUm };
  const lx = Math.max(...textured.map((t) => t.lxUm)), ly = Math.max(...textured.map((t) => t.lyUm));
  return { launchLxUm: LAUNCH_WINDOW_CELLS * lx, launchLyUm: LAUNCH_WINDOW_CELLS * ly };
}

/** What the rear's compilation needs from compileStack. */
/** What the parts of compileStack share: the stack at one wavelength, its media and channel lookup. */
interface CompileContext {
  stack: StackSpec;
  wavelengthNm: number;
  tableRows: number;
  nkOf: (name: string, field: string) => NK;
  films: (list: FilmSpec[], field: string) => FilmLayer[];
  ch: (name: string) => number;
  mediumNK: NK[];
  mediumN: Float64Array;
  nRear: number;
}

/** The rear interface (absorber | films | exit) or an ideal reflector, and the rear tile. */
function compileRearInterface(cx: CompileContext): {
  rearKind: number; rear: CompiledInterface | null; rearTile: SurfaceTile; rearReflectance: number; metalExit: boolean;
} {
  const { stack, wavelengthNm, tableRows, nkOf, films, ch, mediumNK, mediumN, nRear } = cx;
  const abs = stack.layers.length + 1;
  const rearSpec = stack.rear;
  if (isIdealRear(rearSpec)) {
    const rearKind = rearSpec.ideal.kind === "mirror" ? RearKind.IDEAL_MIRROR : RearKind.IDEAL_LAMBERTIAN;
    return { rearKind, rear: null, rearTile: planarTile(1), rearReflectance: rearSpec.ideal.reflectance, metalExit: false };
  }
  const rearTile = surfaceOf(rearSpec.texture, stack.boundary, "stack.rear.texture");
  const rearFilms = films(rearSpec.films, "rear.films");
  const exitNK = nkOf(rearSpec.exit, "rear.exit");
  // A metal-like exit (k ≥ n, as the interface tables treat it) absorbs what enters it.
  const metal = exitNK.k >= exitNK.n;
  if (nRear > 0 && metal) throw new InputError(`stack.rear.exit: "${rearSpec.exit}" is a metal at ${wavelengthNm} nm; rear layers need a transparent medium behind the rear interface`);
  const rear: CompiledInterface = {
    table: buildInterfaceTable(mediumNK[abs], rearFilms, exitNK, wavelengthNm, tableRows),
    nUpper: mediumN[abs],
    nLower: exitNK.n,
    nFilms: rearFilms.length,
    filmChan0: rearFilms.length > 0 ? ch(`A_film:rear:0:${rearSpec.films[0].material}`) : -1,
    // A metal takes what enters it. Light entering a transparent exit ends as T at once only
    // behind a planar rear; behind a texture it may meet a neighbouring facet again, so it goes on.
    lowerSinkChan: metal ? ch("A_rear") : nRear === 0 && rearTile.kind !== SurfaceKind.MESH ? ch(CH_T_FIRST) : -1,
  };
  return { rearKind: RearKind.INTERFACE, rear, rearTile, rearReflectance: 0, metalExit: metal };
}

/** Rear layers: planar, stacked below the rear texture's outermost points; their outer faces; a back-sheet. */
function compileRearLayers(cx: CompileContext, thicknessUm: number, rearTile: SurfaceTile, outerMedium: number): {
  rearBottomZUm: Float64Array; rearBottomInterfaces: (CompiledInterface | null)[]; backsheetReflectance: number; backsheetHaze: number;
} {
  const { stack, wavelengthNm, tableRows, films, ch, mediumNK, mediumN, nRear } = cx;
  const rearLayers = stack.rearLayers ?? [];
  const abs = stack.layers.length + 1;
  const rearBottomZUm = new Float64Array(nRear);
  let zr = -thicknessUm - rearTile.zMaxUm;
  for (let j = 0; j < nRear; j++) {
    zr -= rearLayers[j].thicknessUm;
    rearBottomZUm[j] = zr;
  }
  const outer = stack.rearOuter;
  const backsheet = outer !== undefined && isBacksheet(outer) ? outer.backsheet : null;
  const rearBottomInterfaces: (CompiledInterface | null)[] = rearLayers.map((l, j) => {
    const below = abs + j + 2;
    if (j === nRear - 1 && backsheet) return null;
    const f = films(l.bottomFilms, `rearLayers[${j}].bottomFilms`);
    return {
      table: buildInterfaceTable(mediumNK[below - 1], f, mediumNK[below], wavelengthNm, tableRows),
      nUpper: mediumN[below - 1],
      nLower: mediumN[below],
      nFilms: f.length,
      filmChan0: f.length > 0 ? ch(`A_film:bottom:${l.name}:0:${l.bottomFilms[0].material}`) : -1,
      lowerSinkChan: below === outerMedium ? ch(CH_T_FIRST) : -1,
    };
  });
  const backsheetReflectance = backsheet === null ? -1
    : typeof backsheet.reflectance === "number" ? backsheet.reflectance
    : backsheetTableValue(backsheet.reflectance, wavelengthNm);
  return { rearBottomZUm, rearBottomInterfaces, backsheetReflectance, backsheetHaze: backsheet ? backsheet.haze : 0 };
}

/**
 * Media from the incidence side: incidence, front layers, absorber, rear layers, the medium behind
 * the rear; their n, k, α = 4πk/λ (any optics text; λ in µm gives 1/µm) and absorption channel. The
 * outside media do not absorb.
 */
function compileMedia(stack: StackSpec, wavelengthNm: number, nkOf: (name: string, field: string) => NK, ch: (name: string) => number): {
  mediumNK: NK[]; mediumN: Float64Array; mediumK: Float64Array; mediumAlphaPerUm: Float64Array; mediumChan: Int32Array;
} {
  const rearLayers = stack.rearLayers ?? [];
  const abs = stack.layers.length + 1;
  const mediumNK: NK[] = [nkOf(stack.incidence, "incidence")];
  stack.layers.forEach((l, j) => mediumNK.push(nkOf(l.material, `layers[${j}].material`)));
  mediumNK.push(nkOf(stack.absorber.material, "absorber.material"));
  rearLayers.forEach((l, j) => mediumNK.push(nkOf(l.material, `rearLayers[${j}].material`)));
  mediumNK.push(outerNK(stack, nkOf));
  const nMedia = mediumNK.length, outerMedium = nMedia - 1;
  const mediumN = new Float64Array(nMedia), mediumK = new Float64Array(nMedia);
  const mediumAlphaPerUm = new Float64Array(nMedia), mediumChan = new Int32Array(nMedia);
  for (let m = 0; m < nMedia; m++) {
    mediumN[m] = mediumNK[m].n;
    mediumK[m] = mediumNK[m].k;
    const outside = m === 0 || m === outerMedium;
    mediumAlphaPerUm[m] = outside ? 0 : (4 * Math.PI * mediumNK[m].k) / (wavelengthNm * 1e-3);
    mediumChan[m] = outside ? -1 : m === abs ? ch("A_absorber") : m < abs ? ch(`A_layer:${stack.layers[m - 1].name}`) : ch(`A_layer:${rearLayers[m - abs - 1].name}`);
  }
  return { mediumNK, mediumN, mediumK, mediumAlphaPerUm, mediumChan };
}
