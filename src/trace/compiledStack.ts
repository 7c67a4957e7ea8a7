import type { InterfaceTable } from "../optics/types.js";
import type { SurfaceTile } from "../geometry/surfaceTile.js";
import type { StackSpec } from "../study/stackTypes.js";

/** How bulk absorption is sampled (README "Physics and assumptions"; DEVELOPERS.md "Geometry and tracer"). */
export type Estimator = "analog" | "expected";

/** The rear: a real interface (absorber | films | exit), or an ideal reflector, specular or Lambertian. */
export const enum RearKind {
  INTERFACE = 0,
  IDEAL_MIRROR = 1,
  IDEAL_LAMBERTIAN = 2,
}

/** One interface with its tables (films upper → lower) and the channels its films absorb into. */
export interface CompiledInterface {
  table: InterfaceTable;
  /** Real indices of the upper and lower media (Snell). */
  nUpper: number;
  nLower: number;
  nFilms: number;
  /** Channel of film 0 (films i → filmChan0 + i); −1 without films. */
  filmChan0: number;
  /** Channel that takes light transmitted into the lower medium when it ends there (metal → A_rear, transparent exit → T_first, chosen by history as T_first or T_escape in interfaceEvent); −1 when it propagates on. */
  lowerSinkChan: number;
}

/**
 * Slots of CompiledStack.estimatorSettings. A typed array, not five number fields: these numbers
 * change from wavelength to wavelength of one stack (estimatorChoice.ts), and a field that first
 * held only whole numbers (0, 70) becomes a double field when a later stack stores 0.001 or
 * Infinity; V8 then drops the optimised code of every function that reads a compiled stack (a
 * bench run's analog rays at 1150 nm ran 8 % slower after it, 2026-12-05).
 */
export const enum Setting {
  /** From this polar angle of incidence on, an expected-value stack's default traces analog (estimatorChoice.ts); Infinity = never. */
  ANALOG_FROM_THETA_DEG = 0,
  /** Expected-value mode: below this weight a ray continues with analog absorption. */
  ROULETTE_WEIGHT = 1,
  /** Expected-value mode: least weight of both parts for an interface event to split the ray on its way in (0 = never). */
  SPLIT_MIN_WEIGHT = 2,
  /** The same for the escape split at the incidence face from inside. */
  ESCAPE_SPLIT_MIN_WEIGHT = 3,
  /** Expected-value batches of unpolarised front light: from this polar angle on a ray goes as its s and p halves. */
  POLARIZATION_SPLIT_FROM_THETA_DEG = 4,
}

/**
 * A stack ready for tracing at one wavelength. Media are numbered from the incidence side:
 * 0 = incidence medium, 1..nLayers = thick layers, nLayers + 1 = absorber, then the rear layers
 * (nLayers + 2 …) and last the medium behind the rear (`outerMedium`: the rear exit medium, or what
 * lies behind the last rear layer). World z: the front texture's base plane is z = 0, the rear base
 * plane z = −thicknessUm; layer j's top plane is layerTopZUm[j] (the bottom layer's bottom plane is
 * the top of the front texture); rear layer j's bottom plane is rearBottomZUm[j] (the first rear
 * layer's top is the rear texture).
 */
export interface CompiledStack {
  stack: StackSpec;
  wavelengthNm: number;
  channels: string[];
  nChannels: number;
  nLayers: number;
  /** Real index, extinction coefficient and absorption coefficient (1/µm) per medium. */
  mediumN: Float64Array;
  mediumK: Float64Array;
  mediumAlphaPerUm: Float64Array;
  /** Channel taking absorption in each medium (−1 for the incidence medium). */
  mediumChan: Int32Array;
  /** Top plane z (µm) of medium j (j ≥ 1); entry 0 unused. */
  layerTopZUm: Float64Array;
  /** Planar interface at the top of layer j (between media j−1 and j), index j − 1. */
  topInterfaces: CompiledInterface[];
  front: CompiledInterface;
  frontTile: SurfaceTile;
  /** Texture of the outermost layer's top face (null: planar); its base plane is layerTopZUm[1]. */
  outerTile: SurfaceTile | null;
  /** Rays start uniformly over [0, launchLxUm) × [0, launchLyUm) (see launchWindow in compile.ts). */
  launchLxUm: number;
  launchLyUm: number;
  rearKind: number;
  rear: CompiledInterface | null;
  rearTile: SurfaceTile;
  rearReflectance: number;
  thicknessUm: number;
  /** 1 / thicknessUm: the per-ray folds scale paths by it (no division per ray). */
  invThicknessUm: number;
  /** Rear layers, their bottom planes (z, µm) and the planar interfaces there (the last one null for a back-sheet). */
  nRear: number;
  rearBottomZUm: Float64Array;
  rearBottomInterfaces: (CompiledInterface | null)[];
  /** Index of the medium behind the rear. */
  outerMedium: number;
  /** Back-sheet behind the last rear layer: reflectance at this wavelength and Lambertian share (−1 = none). */
  backsheetReflectance: number;
  backsheetHaze: number;
  /** Light cannot enter from the rear (ideal reflector, metal exit, back-sheet). */
  rearOpaque: boolean;
  /** z (µm) where rays from the rear start, in the outer medium. */
  rearLaunchZUm: number;
  /** R_first / R_escape and T_first / T_escape (see channels.ts). */
  chRFirst: number;
  chREscape: number;
  chTFirst: number;
  chTEscape: number;
  chAbsorber: number;
  chRear: number;
  chUnresolved: number;
  estimator: Estimator;
  /** The estimator's numbers, at the slots of Setting (see there). */
  estimatorSettings: Float64Array;
  maxEvents: number;
  /** Pending branches of the ray in flight (src/trace/branches.ts). */
  branches: Float64Array;
  /** Scratch (not shared between threads): interface row, per-ray contributions, state, hit. */
  scratchRow: Float64Array;
  contrib: Float64Array;
  state: Float64Array;
  /** Hit query of meshHit (Query slots). */
  query: Float64Array;
  /** The diagnostics block of the batch tally being filled (src/trace/tallyLayout.ts); set by traceBatch. */
  diag: Float64Array;
  /** Generation profile: depth bin edges (µm, ascending from 0) or null when not tallied. */
  depthEdgesUm: Float64Array | null;
  /** World z of depth 0: the highest points of the front texture. */
  depthTopZUm: number;
  /** Depth from depthTopZUm to the deepest point of the absorber (rear texture included), µm. */
  absorberDepthUm: number;
  /** Per-ray depth deposits (one per bin; empty without a depth grid). */
  rayDepth: Float64Array;
  /** Per-ray power still inside after passes 1..MAX_PASSES and R_escape power per polar bin (history.ts). */
  rayPasses: Float64Array;
  rayEscape: Float64Array;
  /** Analog batches of front light take the bare-cell loop (analogCell.ts); false sends them through the general loop. */
  analogCellLoop: boolean;
}
