import type { RandomStream } from "../random/stream.js";
import type { CompiledStack } from "./compiledStack.js";
import { Ray } from "./rayState.js";
import { cosSinOfTurn } from "./turnTrig.js";

/** Polarisation of the incident light: s/p relative to the macroscopic plane of incidence (z, d). */
export type Polarization = "unpolarized" | "s" | "p";

/** 0 = unpolarised (random line per ray), 1 = s, 2 = p. */
export function polarizationMode(polarization: Polarization): number {
  return polarization === "s" ? 1 : polarization === "p" ? 2 : 0;
}

/** Sets the batch's launch direction (θ; φ unless it is drawn per ray) in the state. */
export function setLaunchAngles(st: Float64Array, sinT: number, cosT: number): void {
  st[Ray.L_SIN_T] = sinT;
  st[Ray.L_COS_T] = cosT;
}

/** Sets the launch azimuth (cos φ, sin φ) in the state. */
export function setLaunchAzimuth(st: Float64Array, phiRad: number): void {
  st[Ray.L_COS_P] = Math.cos(phiRad);
  st[Ray.L_SIN_P] = Math.sin(phiRad);
}

/** The launch's random numbers (launchRay). */
const draws = new Float64Array(4);

/**
 * Launches one ray: uniform over the front unit cell, above everything, travelling down along the
 * batch direction (sinθ cosφ, sinθ sinφ, −cosθ) — or, from the rear, below everything travelling up
 * along (sinθ cosφ, sinθ sinφ, +cosθ) — with its line of polarisation (s, p or a uniformly
 * random line), weight 1 and, for the analog estimator, its optical-depth budget. With launch
 * coordinates u = [x, y, ψ, φ] in [0, 1) (launchPoints.ts) x, y and ψ come from u, not from rng.
 */
export function launchRay(cs: CompiledStack, polMode: number, rng: RandomStream, fromRear: boolean, u: Float64Array | null = null): void {
  const st = cs.state;
  const sinT = st[Ray.L_SIN_T], cosT = st[Ray.L_COS_T];
  const cp = st[Ray.L_COS_P];
  const sp = st[Ray.L_SIN_P];
  const dx = sinT * cp, dy = sinT * sp, dz = fromRear ? cosT : -cosT;
  st[Ray.DX] = dx;
  st[Ray.DY] = dy;
  st[Ray.DZ] = dz;
  // s = (sinφ, −cosφ, 0) ⊥ plane of incidence; p = s × d.
  const sx = sp, sy = -cp;
  const px = sy * dz, py = -sx * dz, pz = sx * dy - sy * dx;
  // The ray's draws in the order they were always taken: ψ, x, y, then the optical-depth budget
  // (one fill, or the budget alone with launch points).
  if (u === null) rng.fill(draws, 4);
  else draws[3] = rng.next();
  // ψ as a fraction of a turn; cos ψ, sin ψ through the state's scratch slots PA, PB.
  const psiTurn = u === null ? draws[0] : u[2];
  if (polMode === 0) cosSinOfTurn(st, psiTurn, Ray.PA, Ray.PB);
  const a = polMode === 1 ? 1 : polMode === 2 ? 0 : st[Ray.PA];
  const b = polMode === 1 ? 0 : polMode === 2 ? 1 : st[Ray.PB];
  st[Ray.EX] = a * sx + b * px;
  st[Ray.EY] = a * sy + b * py;
  st[Ray.EZ] = b * pz;
  // Uniform over the launch window (compile: the one textured tile's cell, or a large multiple of
  // the largest cell when several textures with their own periods are met).
  st[Ray.X] = (u === null ? draws[1] : u[0]) * cs.launchLxUm;
  st[Ray.Y] = (u === null ? draws[2] : u[1]) * cs.launchLyUm;
  // Without layers: start 1 µm above the texture (the incidence medium does not absorb); from the
  // rear: on the last rear layer's outer plane, or 1 µm below the rear texture.
  st[Ray.Z] = fromRear ? cs.rearLaunchZUm
    : cs.nLayers === 0 ? cs.frontTile.zMaxUm + 1
    : cs.outerTile !== null ? cs.layerTopZUm[1] + cs.outerTile.zMaxUm + 1
    : cs.layerTopZUm[1];
  st[Ray.W] = 1;
  st[Ray.PATH] = 0;
  // The optical-depth budget is drawn for every ray (same random stream in both estimators) but
  // only the analog one reads it: expected-value rays draw a fresh one when they turn analog.
  const uTau = draws[3];
  const analog = st[Ray.BATCH_ANALOG] !== 0;
  st[Ray.TAU] = analog ? -Math.log(uTau) : 0;
  st[Ray.BUDGET_U] = analog ? uTau : 0;
  st[Ray.ANALOG] = analog ? 1 : 0;
}
