import type { RandomStream } from "../random/stream.js";
import { interfacePowers } from "../optics/interfaceTable.js";
import { Setting, type CompiledInterface, type CompiledStack } from "./compiledStack.js";
import { rouletteCheck } from "./bulkTransport.js";
import { canBranch, pushBranch } from "./branches.js";
import { Ray, Outcome } from "./rayState.js";
import { Face, rearExitChannel } from "./history.js";
import { analogInterfaceEvent } from "./analogInterfaceEvent.js";

/**
 * Scattering at an interface with films, normal N (state NX..NZ) pointing into the upper medium.
 * The ray's linear polarisation is split into s and p parts in the local plane of incidence; the
 * outcome (reflect, transmit, absorb in film i) is drawn with the s/p-weighted power fractions from
 * the interface table, and the polarisation after the event follows the amplitude ratios
 * (√R, √T of each part; phase and ellipticity neglected).
 */
export function interfaceEvent(cs: CompiledStack, st: Float64Array, iface: CompiledInterface, rng: RandomStream): number {
  if (st[Ray.ANALOG] !== 0) return analogInterfaceEvent(cs, st, iface, rng);
  const dx = st[Ray.DX], dy = st[Ray.DY], dz = st[Ray.DZ];
  const nx = st[Ray.NX], ny = st[Ray.NY], nz = st[Ray.NZ];
  const dn = dx * nx + dy * ny + dz * nz;
  const up = dn > 0;
  const cosI = up ? dn : -dn;
  const row = cs.scratchRow;
  interfacePowers(iface.table, up ? 1 : 0, cosI, row, 0, iface.table.stride);

  // s = d × N (normalised), p_i = s × d.
  let sx = dy * nz - dz * ny;
  let sy = dz * nx - dx * nz;
  let sz = dx * ny - dy * nx;
  const sl = Math.sqrt(sx * sx + sy * sy + sz * sz);
  const ex = st[Ray.EX], ey = st[Ray.EY], ez = st[Ray.EZ];
  if (sl > 1e-12) {
    const inv = 1 / sl;
    sx *= inv;
    sy *= inv;
    sz *= inv;
  } else {
    // Normal incidence: any direction ⊥ d is "s"; take the polarisation itself.
    sx = ex;
    sy = ey;
    sz = ez;
  }
  const Es = ex * sx + ey * sy + ez * sz;
  const Ep = ex * (sy * dz - sz * dy) + ey * (sz * dx - sx * dz) + ez * (sx * dy - sy * dx);
  // The outcome helpers read s and the amplitudes from the state (no doubles as call arguments).
  st[Ray.SX] = sx;
  st[Ray.SY] = sy;
  st[Ray.SZ] = sz;
  st[Ray.ES] = Es;
  st[Ray.EP] = Ep;
  const e2 = Es * Es + Ep * Ep;
  const fs = e2 > 0 ? (Es * Es) / e2 : 1;
  const fp = 1 - fs;
  const Rs = row[0], Rp = row[1], Ts = row[2], Tp = row[3];
  const Rpow = fs * Rs + fp * Rp;
  const Tpow = fs * Ts + fp * Tp;
  const nF = iface.nFilms;
  // Light that ends below in a transparent exit leaves through the rear: T_first or T_escape by its history.
  let sink = up ? -1 : iface.lowerSinkChan;
  if (sink === cs.chTFirst) sink = rearExitChannel(cs, st);
  const contrib = cs.contrib;
  // Total reflection (Rpow = 1) needs no random number: u = 0 reflects (as in the analog event).
  const u = Rpow < 1 ? rng.next() : 0;
  // Expected value: absorption in films (and in a sink below) is tallied as weight.
  const w = st[Ray.W];
  let dep = 0;
  for (let i = 0; i < nF; i++) {
    const d = w * (fs * row[4 + i] + fp * row[4 + nF + i]);
    contrib[iface.filmChan0 + i] += d;
    dep += d;
  }
  let pT = Tpow;
  if (sink >= 0) {
    const d = w * Tpow;
    contrib[sink] += d;
    dep += d;
    pT = 0;
  }
  const wNew = w - dep;
  if (!(wNew > 0) || Rpow + pT <= 0) {
    if (wNew > 0) contrib[sink >= 0 ? sink : iface.filmChan0 >= 0 ? iface.filmChan0 : cs.chUnresolved] += wNew;
    return Outcome.DIED;
  }
  const pR = Rpow / (Rpow + pT);
  // Split on the way in (events met travelling away from the side the light came from, before the
  // ray first reaches the absorber): the reflected part waits as a branch, the transmitted part
  // goes on now. The light's first reflection, the largest loss at most wavelengths, is then an
  // expected value instead of a coin toss; later events stay sampled, where splitting would grow
  // trees of little weight.
  const settings = cs.estimatorSettings;
  const floor = up === (st[Ray.INCIDENT] === Face.REAR) && st[Ray.ENTERED] === 0 ? settings[Setting.SPLIT_MIN_WEIGHT] : st[Ray.ENTERED] !== 0 && (up ? iface === cs.front : iface === cs.rear) ? settings[Setting.ESCAPE_SPLIT_MIN_WEIGHT] : 0;
  if (floor > 0 && wNew * (pR < 0.5 ? pR : 1 - pR) >= floor && canBranch(st)) {
    reflectInto(st, row);
    st[Ray.W] = wNew * pR;
    pushBranch(cs, st);
    // Back to the incoming direction for the transmitted part.
    st[Ray.DX] = dx;
    st[Ray.DY] = dy;
    st[Ray.DZ] = dz;
    st[Ray.W] = wNew * (1 - pR);
    transmitInto(st, row, iface, up);
    return Outcome.SPLIT;
  }
  st[Ray.W] = wNew;
  const reflect = u * (Rpow + pT) < Rpow;
  // Roulette is for the bulk: before the absorber, small branches stay expected-value (the split
  // weight floor bounds their number) so that later events of the first pass are split too.
  if (st[Ray.ENTERED] !== 0) rouletteCheck(cs, st, rng);

  if (reflect) {
    reflectInto(st, row);
    return Outcome.REFLECT;
  }
  transmitInto(st, row, iface, up);
  return Outcome.TRANSMIT;
}

/**
 * Specular reflection of the direction d (state) at the normal n (state), with the polarisation after
 * it from s and the amplitudes in the state and Rs, Rp from the interface row.
 */
function reflectInto(st: Float64Array, row: Float64Array): void {
  const dx = st[Ray.DX], dy = st[Ray.DY], dz = st[Ray.DZ], nx = st[Ray.NX], ny = st[Ray.NY], nz = st[Ray.NZ];
  const dn = dx * nx + dy * ny + dz * nz;
  st[Ray.DX] = dx - 2 * dn * nx;
  st[Ray.DY] = dy - 2 * dn * ny;
  st[Ray.DZ] = dz - 2 * dn * nz;
  // E' = √Rs·Es·s − √Rp·Ep·p_r (keeps the line of polarisation at normal incidence).
  st[Ray.PA] = st[Ray.ES] * Math.sqrt(row[0]);
  st[Ray.PB] = -st[Ray.EP] * Math.sqrt(row[1]);
  setPolarization(st);
}

/** Refraction of the direction d (state) at the normal n (state), Snell, with the polarisation after it (Ts, Tp from the row). */
function transmitInto(st: Float64Array, row: Float64Array, iface: CompiledInterface, up: boolean): void {
  const dx = st[Ray.DX], dy = st[Ray.DY], dz = st[Ray.DZ], nx = st[Ray.NX], ny = st[Ray.NY], nz = st[Ray.NZ];
  const dn = dx * nx + dy * ny + dz * nz;
  const cosI = dn > 0 ? dn : -dn;
  // Snell (real indices): t = η d + (η cosθi − cosθt) n_i, n_i the normal facing the incoming ray.
  const n1 = up ? iface.nLower : iface.nUpper;
  const n2 = up ? iface.nUpper : iface.nLower;
  const eta = n1 / n2;
  const sin2T = eta * eta * (1 - cosI * cosI);
  const cosTr = sin2T < 1 ? Math.sqrt(1 - sin2T) : 0;
  const k = (eta * cosI - cosTr) * (up ? -1 : 1);
  const tx = eta * dx + k * nx, ty = eta * dy + k * ny, tz = eta * dz + k * nz;
  const inv = 1 / Math.sqrt(tx * tx + ty * ty + tz * tz);
  st[Ray.DX] = tx * inv;
  st[Ray.DY] = ty * inv;
  st[Ray.DZ] = tz * inv;
  st[Ray.PA] = st[Ray.ES] * Math.sqrt(row[2]);
  st[Ray.PB] = st[Ray.EP] * Math.sqrt(row[3]);
  setPolarization(st);
}

/** E = a·s + b·(s × d) from the state slots (d = the new direction), normalised; s when both vanish. */
function setPolarization(st: Float64Array): void {
  const sx = st[Ray.SX], sy = st[Ray.SY], sz = st[Ray.SZ], dx = st[Ray.DX], dy = st[Ray.DY], dz = st[Ray.DZ], a = st[Ray.PA], b = st[Ray.PB];
  let ex = a * sx + b * (sy * dz - sz * dy);
  let ey = a * sy + b * (sz * dx - sx * dz);
  let ez = a * sz + b * (sx * dy - sy * dx);
  const l = Math.sqrt(ex * ex + ey * ey + ez * ez);
  if (l > 1e-300) {
    const inv = 1 / l;
    ex *= inv;
    ey *= inv;
    ez *= inv;
  } else {
    ex = sx;
    ey = sy;
    ez = sz;
  }
  st[Ray.EX] = ex;
  st[Ray.EY] = ey;
  st[Ray.EZ] = ez;
}
