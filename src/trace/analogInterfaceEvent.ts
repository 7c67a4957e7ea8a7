import type { RandomStream } from "../random/stream.js";
import { lookupInterface, plainPowers } from "../optics/interfaceTable.js";
import type { CompiledInterface, CompiledStack } from "./compiledStack.js";
import { Ray, Outcome } from "./rayState.js";
import { rearExitChannel } from "./history.js";

/**
 * interfaceEvent (interfaceEvent.ts) for a ray in analog mode, in one function: the outcome is drawn
 * from the s/p-weighted powers (reflect, transmit, or absorbed in a film or in a sink below), and
 * the new direction (specular reflection, or Snell) and line of polarisation (amplitudes √R, √T of
 * each part) are computed in place. The same arithmetic and draws as the general event's analog
 * branch with its reflectInto / transmitInto / setPolarization, so the two agree bit for bit; the
 * ray's state is read once and written once. Returns REFLECT, TRANSMIT or DIED. The s/p split and
 * the redirection are written out here again on purpose: shared through helpers with the
 * expected-value event (splitPolarization + redirect, not inlined by V8) the analog kernel ran
 * 5–11 % slower and the expected-value one 5 %; the s/p split alone shared, 3–11 % (measured
 * 2026-12-04, load 0.4–1.0).
 */
export function analogInterfaceEvent(cs: CompiledStack, st: Float64Array, iface: CompiledInterface, rng: RandomStream): number {
  const dx = st[Ray.DX], dy = st[Ray.DY], dz = st[Ray.DZ];
  const nx = st[Ray.NX], ny = st[Ray.NY], nz = st[Ray.NZ];
  const dn = dx * nx + dy * ny + dz * nz;
  const up = dn > 0;
  const cosI = up ? dn : -dn;
  const row = cs.scratchRow;
  const table = iface.table;
  if (up ? table.plainUp : table.plainDown) plainPowers(table, up, cosI, row, 0);
  else lookupInterface(table, up ? 1 : 0, cosI, row, 0, 4);
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
    sx = ex;
    sy = ey;
    sz = ez;
  }
  const Es = ex * sx + ey * sy + ez * sz;
  const Ep = ex * (sy * dz - sz * dy) + ey * (sz * dx - sx * dz) + ez * (sx * dy - sy * dx);
  const e2 = Es * Es + Ep * Ep;
  const fs = e2 > 0 ? (Es * Es) / e2 : 1;
  const fp = 1 - fs;
  const Rs = row[0], Rp = row[1], Ts = row[2], Tp = row[3];
  const Rpow = fs * Rs + fp * Rp;
  const Tpow = fs * Ts + fp * Tp;
  let sink = up ? -1 : iface.lowerSinkChan;
  if (sink === cs.chTFirst) sink = rearExitChannel(cs, st);
  const u = Rpow < 1 ? rng.next() : 0;
  let reflect = u < Rpow;
  if (!reflect) {
    if (u < Rpow + Tpow) {
      if (sink >= 0) {
        cs.contrib[sink] += st[Ray.W];
        return Outcome.DIED;
      }
    } else {
      const outcome = filmOrRounding(cs, st, iface, up, cosI, fs, fp, Rpow, Tpow, u, sink);
      if (outcome === Outcome.DIED) return Outcome.DIED;
      reflect = outcome === Outcome.REFLECT;
    }
  }
  // New direction: specular, or Snell with real indices (t = η d + (η cosθi − cosθt) n_i, n_i facing the ray).
  let ox: number, oy: number, oz: number, a: number, b: number;
  if (reflect) {
    ox = dx - 2 * dn * nx;
    oy = dy - 2 * dn * ny;
    oz = dz - 2 * dn * nz;
    a = Es * Math.sqrt(Rs);
    b = -Ep * Math.sqrt(Rp);
  } else {
    const n1 = up ? iface.nLower : iface.nUpper;
    const n2 = up ? iface.nUpper : iface.nLower;
    const eta = n1 / n2;
    const sin2T = eta * eta * (1 - cosI * cosI);
    const cosTr = sin2T < 1 ? Math.sqrt(1 - sin2T) : 0;
    const k = (eta * cosI - cosTr) * (up ? -1 : 1);
    const tx = eta * dx + k * nx, ty = eta * dy + k * ny, tz = eta * dz + k * nz;
    const inv = 1 / Math.sqrt(tx * tx + ty * ty + tz * tz);
    ox = tx * inv;
    oy = ty * inv;
    oz = tz * inv;
    a = Es * Math.sqrt(Ts);
    b = Ep * Math.sqrt(Tp);
  }
  st[Ray.DX] = ox;
  st[Ray.DY] = oy;
  st[Ray.DZ] = oz;
  // E = a·s + b·(s × d'), normalised; s when both vanish.
  let qx = a * sx + b * (sy * oz - sz * oy);
  let qy = a * sy + b * (sz * ox - sx * oz);
  let qz = a * sz + b * (sx * oy - sy * ox);
  const l = Math.sqrt(qx * qx + qy * qy + qz * qz);
  if (l > 1e-300) {
    const inv = 1 / l;
    qx *= inv;
    qy *= inv;
    qz *= inv;
  } else {
    qx = sx;
    qy = sy;
    qz = sz;
  }
  st[Ray.EX] = qx;
  st[Ray.EY] = qy;
  st[Ray.EZ] = qz;
  return reflect ? Outcome.REFLECT : Outcome.TRANSMIT;
}

/**
 * The draw u fell past reflection and transmission: absorbed in film i where the films' s/p
 * absorptances reach u (DIED), or, by rounding, nowhere: transmitted into a sink (DIED), else
 * transmitted or, with no transmission at all, reflected.
 */
function filmOrRounding(cs: CompiledStack, st: Float64Array, iface: CompiledInterface, up: boolean, cosI: number, fs: number, fp: number, Rpow: number, Tpow: number, u: number, sink: number): number {
  const nF = iface.nFilms;
  const row = cs.scratchRow;
  if (nF > 0) lookupInterface(iface.table, up ? 1 : 0, cosI, row, 0);
  let acc = Rpow + Tpow;
  for (let i = 0; i < nF; i++) {
    acc += fs * row[4 + i] + fp * row[4 + nF + i];
    if (u < acc || i === nF - 1) {
      cs.contrib[iface.filmChan0 + i] += st[Ray.W];
      return Outcome.DIED;
    }
  }
  if (Tpow > 0 && sink >= 0) {
    cs.contrib[sink] += st[Ray.W];
    return Outcome.DIED;
  }
  return Tpow <= 0 ? Outcome.REFLECT : Outcome.TRANSMIT;
}
