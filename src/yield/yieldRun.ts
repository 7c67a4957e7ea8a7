import type { ResponseMatrix } from "../response/responseMatrix.js";
import { checkPlane, type Plane } from "../site/site.js";
import type { SkyModel } from "../sky/transposition.js";
import { yieldGrid, type AngularGrid } from "./angularGrid.js";
import { annualYield, planeSetup, type YieldResult } from "./annualYield.js";
import type { HourlySpectra } from "./hourlySpectra.js";
import { g173SpectralWeights, spectralTables, type SpectralTables } from "./spectralTables.js";
import type { YearContext } from "./yearContext.js";
import { InputError } from "../util/errors.js";

/** A matrix prepared for yields: its grid and spectral tables (built once, reused for every plane and site). */
export interface PreparedMatrix {
  grid: AngularGrid;
  tables: SpectralTables;
  channel: string;
}

export function prepareMatrix(m: ResponseMatrix, src: string, channel = "A_absorber"): PreparedMatrix {
  const grid = yieldGrid(m, src);
  if (!m.channels.includes(channel)) {
    throw new InputError(`${src}: no channel "${channel}" (has ${m.channels.join(", ")})`);
  }
  return { grid, tables: spectralTables(m, channel, grid, g173SpectralWeights(m.wavelengthNm)), channel };
}

/** Every combination of tilts and azimuths (tilt varies fastest within an azimuth). */
export function planeList(tiltsDeg: number[], azimuthsDeg: number[], textureRotationDeg: number): Plane[] {
  const planes: Plane[] = [];
  for (const azimuthDeg of azimuthsDeg) {
    for (const tiltDeg of tiltsDeg) planes.push(checkPlane({ tiltDeg, azimuthDeg, textureRotationDeg }, "--tilt/--azimuth"));
  }
  return planes;
}

/** Yields for a list of planes at one site; the plane-independent work (sun, spectra) is shared. */
export function yieldSweep(ctx: YearContext, pm: PreparedMatrix, planes: Plane[], skyModel: SkyModel, hourly = false, spectra?: HourlySpectra): YieldResult[] {
  return planes.map((p) => annualYield(ctx, planeSetup(p, pm.grid), pm.grid, pm.tables, { skyModel, hourly, spectra }));
}

/** The plane with the largest yearly charge. */
export function bestPlane(results: YieldResult[]): YieldResult {
  let best = results[0]!;
  for (const r of results) if (r.chargeAhM2 > best.chargeAhM2) best = r;
  return best;
}
