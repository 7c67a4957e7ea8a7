import { InputError } from "../util/errors.js";
import type { RandomStream } from "../random/stream.js";
import { lookupInterface } from "../optics/interfaceTable.js";
import { LOST, NO_HIT, Q_DX, Q_DY, Q_DZ, Q_LIMIT, Q_OX, Q_OY, Q_OZ, Q_T, meshHit, pyramidHit } from "../geometry/surfaceHit.js";
import { SURFACE_LAMBERTIAN, SURFACE_MESH, TRI_STRIDE, type SurfaceTile } from "../geometry/surfaceTile.js";
import {
  REAR_IDEAL_LAMBERTIAN,
  REAR_IDEAL_MIRROR,
  type CompiledInterface,
  type CompiledStack,
} from "./compiledStack.js";

/** Polarisation of the incident light: s/p relative to the macroscopic plane of incidence (z, d). */
export type Polarization = "unpolarized" | "s" | "p";

// Ray state slots in cs.state (one ray at a time; nothing allocated per ray or event).
const X = 0, Y = 1, Z = 2, DX = 3, DY = 4, DZ = 5, EX = 6, EY = 7, EZ = 8;
const W = 9, TAU = 10, PATH = 11, NX = 12, NY = 13, NZ = 14, ANALOG = 15, T = 16;
// Polarisation update inputs: s vector and the two amplitudes (see setPolarization).
const SX = 17, SY = 18, SZ = 19, PA = 20, PB = 21;
// Launch direction of the batch: sin θ, cos θ, cos φ, sin φ (φ per ray when the azimuth is random).
const L_SIN_T = 22, L_COS_T = 23, L_COS_P = 24, L_SIN_P = 25;
// Doubles travel through these slots, never as arguments or return values of non-inlined
// functions, so the hot path allocates no boxed numbers.
/** Search result: a hit, its distance in st[T]. */
const HIT = 0;

// Interface outcomes.
const REFLECT = 0;
const TRANSMIT = 1;
const DIED = 2;

const TWO_PI = 2 * Math.PI;
const DEG = Math.PI / 180;

/**
 * Traces nRays rays arriving from the incidence medium at polar angle θ and azimuth φ (null = a
 * random azimuth per ray) and adds them to the tally (docs/contracts.md, Tracer): per channel
 * [Σc, Σc²] of each ray's contribution c, then [nRays, Σp, Σp², events] with p the ray's optical
 * path in the absorber divided by its thickness. Each ray's contributions sum to 1.
 */
export function traceBatch(
  cs: CompiledStack,
  thetaDeg: number,
  phiDeg: number | null,
  nRays: number,
  rng: RandomStream,
  tally: Float64Array,
  polarization: Polarization = "unpolarized",
): void {
  if (!Number.isInteger(nRays) || nRays < 1) throw new InputError(`rays: expected a positive whole number of rays, got ${nRays}`);
  if (!(thetaDeg >= 0 && thetaDeg < 90)) throw new InputError(`angle: expected a polar angle in [0, 90) degrees, got ${thetaDeg}`);
  if (phiDeg !== null && !Number.isFinite(phiDeg)) throw new InputError(`azimuth: expected a number of degrees, got ${phiDeg}`);
  const nC = cs.nChannels;
  if (tally.length < 2 * nC + 4) throw new RangeError(`tally has ${tally.length} entries, needs ${2 * nC + 4}`);
  const polMode = polarization === "s" ? 1 : polarization === "p" ? 2 : 0;
  const sinT = Math.sin(thetaDeg * DEG);
  const cosT = Math.cos(thetaDeg * DEG);
  const contrib = cs.contrib;
  const st = cs.state;
  const invW = 1 / cs.thicknessUm;
  let events = 0;
  let pathSum = 0;
  let pathSumSq = 0;
  st[L_SIN_T] = sinT;
  st[L_COS_T] = cosT;
  if (phiDeg !== null) {
    st[L_COS_P] = Math.cos(phiDeg * DEG);
    st[L_SIN_P] = Math.sin(phiDeg * DEG);
  }
  for (let r = 0; r < nRays; r++) {
    if (phiDeg === null) {
      const phi = TWO_PI * rng.next();
      st[L_COS_P] = Math.cos(phi);
      st[L_SIN_P] = Math.sin(phi);
    }
    events += traceRay(cs, polMode, rng);
    for (let c = 0; c < nC; c++) {
      const v = contrib[c];
      tally[2 * c] += v;
      tally[2 * c + 1] += v * v;
      contrib[c] = 0;
    }
    const p = st[PATH] * invW;
    pathSum += p;
    pathSumSq += p * p;
  }
  tally[2 * nC] += nRays;
  tally[2 * nC + 1] += pathSum;
  tally[2 * nC + 2] += pathSumSq;
  tally[2 * nC + 3] += events;
}

/** One ray from launch to its end; returns the number of interface events. */
function traceRay(cs: CompiledStack, polMode: number, rng: RandomStream): number {
  const st = cs.state;
  const contrib = cs.contrib;
  const nL = cs.nLayers;
  const ABS = nL + 1;
  const frontKind = cs.frontTile.kind;
  const rearKind = cs.rearKind;
  const maxEvents = cs.maxEvents;

  // Launch: uniform over the front unit cell, above everything, travelling down.
  const sinT = st[L_SIN_T], cosT = st[L_COS_T];
  const cp = st[L_COS_P];
  const sp = st[L_SIN_P];
  const dx = sinT * cp, dy = sinT * sp, dz = -cosT;
  st[DX] = dx;
  st[DY] = dy;
  st[DZ] = dz;
  // s = (sinφ, −cosφ, 0) ⊥ plane of incidence; p = s × d.
  const sx = sp, sy = -cp;
  const px = sy * dz, py = -sx * dz, pz = sx * dy - sy * dx;
  const psi = TWO_PI * rng.next();
  const a = polMode === 1 ? 1 : polMode === 2 ? 0 : Math.cos(psi);
  const b = polMode === 1 ? 0 : polMode === 2 ? 1 : Math.sin(psi);
  st[EX] = a * sx + b * px;
  st[EY] = a * sy + b * py;
  st[EZ] = b * pz;
  st[X] = rng.next() * cs.frontTile.lxUm;
  st[Y] = rng.next() * cs.frontTile.lyUm;
  // Without layers: start 1 µm above the texture (the incidence medium does not absorb).
  st[Z] = nL > 0 ? cs.layerTopZUm[1] : cs.frontTile.zMaxUm + 1;
  st[W] = 1;
  st[PATH] = 0;
  // The optical-depth budget is drawn for every ray (same random stream in both estimators) but
  // only the analog one reads it: expected-value rays draw a fresh one when they turn analog.
  const uTau = rng.next();
  const analog = cs.estimator === "analog";
  st[TAU] = analog ? -Math.log(uTau) : 0;
  st[ANALOG] = analog ? 1 : 0;

  let m = 0;
  let events = 0;
  for (;;) {
    if (events >= maxEvents) {
      contrib[cs.chUnresolved] += st[W];
      return events;
    }
    if (m === ABS) {
      // In the absorber: the front texture first (rays going up, or still inside its slab).
      let found = frontSearch(cs, st, true);
      if (found === LOST) break;
      if (found === HIT) {
        if (absorbAlong(cs, st, ABS, rng)) return events;
        advance(st);
        events++;
        if (frontKind === SURFACE_LAMBERTIAN) {
          if (lambertianFrontFromBelow(cs, st, rng)) m = nL;
          continue;
        }
        const out = interfaceEvent(cs, st, cs.front, rng);
        if (out === DIED) return events;
        if (out === TRANSMIT) m = nL;
        continue;
      }
      // Travelling down to the rear.
      found = rearSearch(cs, st);
      if (found === LOST) break;
      if (found === NO_HIT) continue; // left the rear texture's slab upward
      if (absorbAlong(cs, st, ABS, rng)) return events;
      advance(st);
      events++;
      if (rearKind === REAR_IDEAL_MIRROR || rearKind === REAR_IDEAL_LAMBERTIAN) {
        if (idealRear(cs, st, rng)) return events;
        continue;
      }
      if (interfaceEvent(cs, st, cs.rear as CompiledInterface, rng) !== REFLECT) return events;
      continue;
    }
    if (m === nL) {
      // The medium touching the front texture.
      const found = frontSearch(cs, st, false);
      if (found === LOST) break;
      if (found === HIT) {
        if (absorbAlong(cs, st, m, rng)) return events;
        advance(st);
        events++;
        if (frontKind === SURFACE_LAMBERTIAN) {
          // Ideal randomiser: everything enters the absorber, in a Lambertian direction.
          lambertianDirection(st, -1, rng);
          randomPolarization(st, rng);
          m = ABS;
          continue;
        }
        const out = interfaceEvent(cs, st, cs.front, rng);
        if (out === DIED) return events;
        if (out === TRANSMIT) m = ABS;
        continue;
      }
    }
    // Planar thick layers (and the incidence medium above them).
    const vz = st[DZ];
    if (vz > 0) {
      if (m === 0) {
        contrib[cs.chR] += st[W];
        return events;
      }
      st[T] = (cs.layerTopZUm[m] - st[Z]) / vz;
      if (absorbAlong(cs, st, m, rng)) return events;
      advance(st);
      st[Z] = cs.layerTopZUm[m];
      events++;
      setNormal(st, 0, 0, 1);
      const out = interfaceEvent(cs, st, cs.topInterfaces[m - 1], rng);
      if (out === DIED) return events;
      if (out === TRANSMIT) m--;
    } else if (vz < 0) {
      st[T] = (cs.layerTopZUm[m + 1] - st[Z]) / vz;
      if (absorbAlong(cs, st, m, rng)) return events;
      advance(st);
      st[Z] = cs.layerTopZUm[m + 1];
      events++;
      setNormal(st, 0, 0, 1);
      const out = interfaceEvent(cs, st, cs.topInterfaces[m], rng);
      if (out === DIED) return events;
      if (out === TRANSMIT) m++;
    } else {
      break;
    }
  }
  // A ray that runs parallel to the layers or slips through a mesh edge: its weight is reported.
  contrib[cs.chUnresolved] += st[W];
  return events;
}

/** Moves the ray by st[T]. */
function advance(st: Float64Array): void {
  const t = st[T];
  st[X] += t * st[DX];
  st[Y] += t * st[DY];
  st[Z] += t * st[DZ];
}

function setNormal(st: Float64Array, nx: number, ny: number, nz: number): void {
  st[NX] = nx;
  st[NY] = ny;
  st[NZ] = nz;
}

/**
 * Beer–Lambert along a straight path of length st[T] (µm) in medium m. Analog: the ray carries an
 * exponentially distributed optical depth budget (TAU) and dies where it runs out. Expected value:
 * the weight falls by exp(−αL) and the difference is tallied. Roulette: once the weight would fall
 * below the roulette weight the ray turns analog (its remaining weight survives or is absorbed
 * whole: unbiased, and each ray's channels still sum to 1, unlike classic Russian roulette that
 * discards weight). Returns true when the ray was absorbed.
 */
function absorbAlong(cs: CompiledStack, st: Float64Array, m: number, rng: RandomStream): boolean {
  const lenUm = st[T];
  const alpha = cs.mediumAlphaPerUm[m];
  const inAbsorber = m === cs.nLayers + 1;
  const w = st[W];
  if (!(alpha > 0)) {
    if (inAbsorber) st[PATH] += w * lenUm;
    return false;
  }
  // Expected value, unless this stretch would take the weight below the roulette weight: then the
  // ray turns analog before it (the same expectation, and no work spent on negligible weights).
  const att = Math.exp(-alpha * lenUm);
  if (st[ANALOG] === 0 && w * att < cs.rouletteWeight) {
    st[ANALOG] = 1;
    st[TAU] = -Math.log(rng.next());
  }
  if (st[ANALOG] !== 0) {
    const tau = alpha * lenUm;
    if (tau >= st[TAU]) {
      if (inAbsorber) st[PATH] += (w * st[TAU]) / alpha;
      cs.contrib[cs.mediumChan[m]] += w;
      return true;
    }
    st[TAU] -= tau;
    if (inAbsorber) st[PATH] += w * lenUm;
    return false;
  }
  const dep = w - w * att;
  cs.contrib[cs.mediumChan[m]] += dep;
  // Expected path length of the analog ray over this stretch: w(1 − e^−αL)/α.
  if (inAbsorber) st[PATH] += dep / alpha;
  st[W] = w - dep;
  return false;
}

/** Expected-value mode: turn analog once the weight is small (see absorbAlong). */
function rouletteCheck(cs: CompiledStack, st: Float64Array, rng: RandomStream): void {
  if (st[ANALOG] === 0 && st[W] < cs.rouletteWeight) {
    st[ANALOG] = 1;
    st[TAU] = -Math.log(rng.next());
  }
}

/**
 * Front texture search in world coordinates (front tile frame: z is the height). Sets the hit's
 * outward normal (towards the medium above) in the state.
 */
function frontSearch(cs: CompiledStack, st: Float64Array, fromBelow: boolean): number {
  const tile = cs.frontTile;
  const z = st[Z];
  const dz = st[DZ];
  if (tile.kind !== SURFACE_MESH) {
    if (fromBelow ? dz > 0 : dz < 0) {
      setNormal(st, 0, 0, 1);
      const t = -z / dz;
      st[T] = t > 0 ? t : 0;
      return HIT;
    }
    return NO_HIT;
  }
  return tileSearch(tile, st, cs.query, fromBelow, false, 0);
}

/**
 * Rear search for a ray in the absorber. The rear tile is a height field pointing away from the
 * absorber: local z = −(z + W). Sets the normal pointing back into the absorber (the rear table's
 * upper medium).
 */
function rearSearch(cs: CompiledStack, st: Float64Array): number {
  const tile = cs.rearTile;
  const W_ = cs.thicknessUm;
  const dz = st[DZ];
  if (tile.kind !== SURFACE_MESH) {
    if (dz < 0) {
      setNormal(st, 0, 0, 1);
      const t = (-W_ - st[Z]) / dz;
      st[T] = t > 0 ? t : 0;
      return HIT;
    }
    return NO_HIT;
  }
  const found = tileSearch(tile, st, cs.query, true, true, W_);
  if (found === HIT) {
    st[NX] = -st[NX];
    st[NY] = -st[NY];
  }
  return found;
}

/**
 * Hit search on a mesh tile in its local frame (z = height, outward positive; xy rotated by the
 * texture orientation and wrapped into the tile) for the ray in the state; distance → st[T]. Writes the outward normal (xy rotated back) to
 * the state. Rays heading into the surface must hit it: a miss there is LOST.
 */
function tileSearch(tile: SurfaceTile, st: Float64Array, q: Float64Array, fromBelow: boolean, rear: boolean, thicknessUm: number): number {
  const x = st[X];
  const y = st[Y];
  const dx = st[DX];
  const dy = st[DY];
  // The rear tile's frame has z flipped: local z = −(z + W).
  const zl = rear ? -(st[Z] + thicknessUm) : st[Z];
  const dzl = rear ? -st[DZ] : st[DZ];
  const c = tile.cosRot;
  const s = tile.sinRot;
  const dxl = c * dx + s * dy;
  const dyl = -s * dx + c * dy;
  const zMin = tile.zMinUm;
  const zMax = tile.zMaxUm;
  let t0 = 0;
  let tLimit = Infinity;
  let mustHit = false;
  // Entry into the slab stops short of its bounding plane: flat parts of the surface lie on it.
  const margin = 1e-7 * (zMax - zMin + tile.lxUm);
  if (fromBelow) {
    if (dzl > 0) {
      if (zl < zMin - margin) t0 = (zMin - margin - zl) / dzl;
      tLimit = (zMax - zl) / dzl - t0;
      mustHit = true;
    } else if (dzl < 0) {
      if (zl <= zMin) return NO_HIT;
      tLimit = (zMin - zl) / dzl;
    }
  } else {
    if (dzl < 0) {
      if (zl > zMax + margin) t0 = (zMax + margin - zl) / dzl;
      tLimit = (zMin - zl) / dzl - t0;
      mustHit = true;
    } else if (dzl > 0) {
      if (zl >= zMax) return NO_HIT;
      tLimit = (zMax - zl) / dzl;
    }
  }
  if (mustHit) tLimit = tLimit * (1 + 1e-9) + 1e-9 * (zMax - zMin);
  const lx = tile.lxUm;
  const ly = tile.lyUm;
  let px = c * x + s * y + t0 * dxl;
  let py = -s * x + c * y + t0 * dyl;
  px -= lx * Math.floor(px / lx);
  py -= ly * Math.floor(py / ly);
  q[Q_OX] = px;
  q[Q_OY] = py;
  q[Q_OZ] = zl + t0 * dzl;
  q[Q_DX] = dxl;
  q[Q_DY] = dyl;
  q[Q_DZ] = dzl;
  q[Q_LIMIT] = tLimit;
  let nxl: number, nyl: number, nzl: number;
  if (tile.pyramidSign !== 0) {
    const k = pyramidHit(tile, q, fromBelow);
    if (k < 0) return k === NO_HIT && !mustHit ? NO_HIT : LOST;
    const nrm = tile.pyramidNormals;
    nxl = nrm[3 * k];
    nyl = nrm[3 * k + 1];
    nzl = nrm[3 * k + 2];
  } else {
    const tri = meshHit(tile, q, fromBelow);
    if (tri < 0) return tri === NO_HIT && !mustHit ? NO_HIT : LOST;
    const o = tri * TRI_STRIDE;
    nxl = tile.tri[o];
    nyl = tile.tri[o + 1];
    nzl = tile.tri[o + 2];
  }
  st[NX] = c * nxl - s * nyl;
  st[NY] = s * nxl + c * nyl;
  st[NZ] = nzl;
  st[T] = t0 + q[Q_T];
  return HIT;
}

/**
 * Scattering at an interface with films, normal N (state NX..NZ) pointing into the upper medium.
 * The ray's linear polarisation is split into s and p parts in the local plane of incidence; the
 * outcome (reflect, transmit, absorb in film i) is drawn with the s/p-weighted power fractions from
 * the interface table, and the polarisation after the event follows the amplitude ratios
 * (√R, √T of each part; phase and ellipticity neglected).
 */
function interfaceEvent(cs: CompiledStack, st: Float64Array, iface: CompiledInterface, rng: RandomStream): number {
  const dx = st[DX], dy = st[DY], dz = st[DZ];
  const nx = st[NX], ny = st[NY], nz = st[NZ];
  const dn = dx * nx + dy * ny + dz * nz;
  const up = dn > 0;
  const cosI = up ? dn : -dn;
  const row = cs.scratchRow;
  lookupInterface(iface.table, up ? 1 : 0, cosI, row, 0);

  // s = d × N (normalised), p_i = s × d.
  let sx = dy * nz - dz * ny;
  let sy = dz * nx - dx * nz;
  let sz = dx * ny - dy * nx;
  const sl = Math.sqrt(sx * sx + sy * sy + sz * sz);
  const ex = st[EX], ey = st[EY], ez = st[EZ];
  if (sl > 1e-12) {
    sx /= sl;
    sy /= sl;
    sz /= sl;
  } else {
    // Normal incidence: any direction ⊥ d is "s"; take the polarisation itself.
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
  const nF = iface.nFilms;
  const sink = up ? -1 : iface.lowerSinkChan;
  const contrib = cs.contrib;
  const u = rng.next();
  let reflect: boolean;
  if (st[ANALOG] !== 0) {
    if (u < Rpow) {
      reflect = true;
    } else if (u < Rpow + Tpow) {
      if (sink >= 0) {
        contrib[sink] += st[W];
        return DIED;
      }
      reflect = false;
    } else {
      // Absorbed in a film (or, by rounding, nowhere: then transmit/reflect).
      let acc = Rpow + Tpow;
      for (let i = 0; i < nF; i++) {
        acc += fs * row[4 + i] + fp * row[4 + nF + i];
        if (u < acc || i === nF - 1) {
          contrib[iface.filmChan0 + i] += st[W];
          return DIED;
        }
      }
      if (Tpow > 0 && sink >= 0) {
        contrib[sink] += st[W];
        return DIED;
      }
      reflect = Tpow <= 0;
    }
  } else {
    // Expected value: absorption in films (and in a sink below) is tallied as weight.
    const w = st[W];
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
      return DIED;
    }
    st[W] = wNew;
    reflect = u * (Rpow + pT) < Rpow;
    rouletteCheck(cs, st, rng);
  }

  if (reflect) {
    const rdx = dx - 2 * dn * nx, rdy = dy - 2 * dn * ny, rdz = dz - 2 * dn * nz;
    st[DX] = rdx;
    st[DY] = rdy;
    st[DZ] = rdz;
    // E' = √Rs·Es·s − √Rp·Ep·p_r (keeps the line of polarisation at normal incidence).
    st[SX] = sx;
    st[SY] = sy;
    st[SZ] = sz;
    st[PA] = Es * Math.sqrt(Rs);
    st[PB] = -Ep * Math.sqrt(Rp);
    setPolarization(st);
    return REFLECT;
  }
  // Snell (real indices): t = η d + (η cosθi − cosθt) n_i, n_i the normal facing the incoming ray.
  const n1 = up ? iface.nLower : iface.nUpper;
  const n2 = up ? iface.nUpper : iface.nLower;
  const eta = n1 / n2;
  const sin2T = eta * eta * (1 - cosI * cosI);
  const cosTr = sin2T < 1 ? Math.sqrt(1 - sin2T) : 0;
  const k = (eta * cosI - cosTr) * (up ? -1 : 1);
  let tx = eta * dx + k * nx, ty = eta * dy + k * ny, tz = eta * dz + k * nz;
  const tl = Math.sqrt(tx * tx + ty * ty + tz * tz);
  tx /= tl;
  ty /= tl;
  tz /= tl;
  st[DX] = tx;
  st[DY] = ty;
  st[DZ] = tz;
  st[SX] = sx;
  st[SY] = sy;
  st[SZ] = sz;
  st[PA] = Es * Math.sqrt(Ts);
  st[PB] = Ep * Math.sqrt(Tp);
  setPolarization(st);
  return TRANSMIT;
}

/** E = a·s + b·(s × d) from the state slots (d = the new direction), normalised; s when both vanish. */
function setPolarization(st: Float64Array): void {
  const sx = st[SX], sy = st[SY], sz = st[SZ], dx = st[DX], dy = st[DY], dz = st[DZ], a = st[PA], b = st[PB];
  let ex = a * sx + b * (sy * dz - sz * dy);
  let ey = a * sy + b * (sz * dx - sx * dz);
  let ez = a * sz + b * (sx * dy - sy * dx);
  const l = Math.sqrt(ex * ex + ey * ey + ez * ez);
  if (l > 1e-300) {
    ex /= l;
    ey /= l;
    ez /= l;
  } else {
    ex = sx;
    ey = sy;
    ez = sz;
  }
  st[EX] = ex;
  st[EY] = ey;
  st[EZ] = ez;
}

/**
 * Ideal rear reflector (planar, normal +z into the absorber): reflectance r, the rest → A_rear.
 * Mirror: specular; Lambertian: cosine-weighted, depolarising. Returns true when the ray ended.
 */
function idealRear(cs: CompiledStack, st: Float64Array, rng: RandomStream): boolean {
  const r = cs.rearReflectance;
  const u = rng.next();
  if (st[ANALOG] !== 0) {
    if (u >= r) {
      cs.contrib[cs.chRear] += st[W];
      return true;
    }
  } else {
    const dep = st[W] * (1 - r);
    cs.contrib[cs.chRear] += dep;
    st[W] -= dep;
    if (!(st[W] > 0)) return true;
    rouletteCheck(cs, st, rng);
  }
  if (cs.rearKind === REAR_IDEAL_MIRROR) {
    // Specular at a horizontal plane: z flips; the polarisation keeps its line (r_s = r_p).
    st[DZ] = -st[DZ];
    st[EZ] = -st[EZ];
  } else {
    lambertianDirection(st, 1, rng);
    randomPolarization(st, rng);
  }
  return false;
}

/**
 * Ideal randomiser front, ray arriving from the absorber: escapes with probability (n_out/n_in)²
 * (the escape-cone fraction of isotropic light) into a Lambertian direction of the medium above,
 * otherwise it is sent back into the absorber in a Lambertian direction. Returns true on escape.
 */
function lambertianFrontFromBelow(cs: CompiledStack, st: Float64Array, rng: RandomStream): boolean {
  const ratio = cs.mediumN[cs.nLayers] / cs.mediumN[cs.nLayers + 1];
  const pEscape = ratio < 1 ? ratio * ratio : 1;
  const escape = rng.next() < pEscape;
  lambertianDirection(st, escape ? 1 : -1, rng);
  randomPolarization(st, rng);
  return escape;
}

/** Cosine-weighted direction about ±z (Lambertian): cosθ = √u. */
function lambertianDirection(st: Float64Array, zSign: number, rng: RandomStream): void {
  const cosT = Math.sqrt(rng.next());
  const sinT = Math.sqrt(1 - cosT * cosT);
  const ph = TWO_PI * rng.next();
  st[DX] = sinT * Math.cos(ph);
  st[DY] = sinT * Math.sin(ph);
  st[DZ] = zSign * cosT;
}

/** Uniformly random line of polarisation ⊥ d. */
function randomPolarization(st: Float64Array, rng: RandomStream): void {
  const dx = st[DX], dy = st[DY], dz = st[DZ];
  // e1 = normalise(a × d) with a the axis least aligned with d; e2 = d × e1.
  let e1x: number, e1y: number, e1z: number;
  if (Math.abs(dx) < 0.9) {
    e1x = 0;
    e1y = -dz;
    e1z = dy;
  } else {
    e1x = dz;
    e1y = 0;
    e1z = -dx;
  }
  const l = Math.sqrt(e1x * e1x + e1y * e1y + e1z * e1z);
  e1x /= l;
  e1y /= l;
  e1z /= l;
  const e2x = dy * e1z - dz * e1y, e2y = dz * e1x - dx * e1z, e2z = dx * e1y - dy * e1x;
  const psi = TWO_PI * rng.next();
  const c = Math.cos(psi), s = Math.sin(psi);
  st[EX] = c * e1x + s * e2x;
  st[EY] = c * e1y + s * e2y;
  st[EZ] = c * e1z + s * e2z;
}
