/*
 * Native reference of lightfold's tracer bench case, written for `npm run bench` (bench/native.ts
 * compiles it with cc when one is present): bare regular upright pyramids (base a, facet angle α)
 * on a Si wafer of thickness W (pyramid base plane to rear), planar ideal rear mirror of
 * reflectance r, light at normal incidence from air, analog Beer–Lambert absorption, linear
 * polarisation carried through every Fresnel event (s/p split in the local plane of incidence).
 *
 * Its own geometry (one convex pyramid per square column, walked column by column) and its own
 * random numbers (xoshiro256+, Blackman & Vigna 2018), so agreement with lightfold is a check of
 * both, not a copy. The optical constants come from the caller (n, k of Si at the wavelength).
 *
 * usage: pyramids nSi kSi wavelengthNm nRays seed [baseUm facetDeg thicknessUm mirrorR]
 * prints one JSON line: rays, events, seconds (CPU), and per channel mean and standard error.
 */
#include <complex.h>
#include <math.h>
#include <stdint.h>
#include <stdio.h>
#include <stdlib.h>
#include <time.h>

#define PI_ 3.14159265358979323846

static uint64_t rs[4];
static inline uint64_t rotl64(uint64_t x, int k) { return (x << k) | (x >> (64 - k)); }
static inline double urand(void) {
  /* xoshiro256+ → (0, 1) with 53 bits */
  uint64_t r = rs[0] + rs[3], t = rs[1] << 17;
  rs[2] ^= rs[0]; rs[3] ^= rs[1]; rs[1] ^= rs[2]; rs[0] ^= rs[3]; rs[2] ^= t; rs[3] = rotl64(rs[3], 45);
  return ((double)(r >> 11) + 0.5) * 0x1.0p-53;
}
static void seed_rng(uint64_t s) {
  /* splitmix64 seeding */
  for (int i = 0; i < 4; i++) {
    uint64_t z = (s += 0x9e3779b97f4a7c15ULL);
    z = (z ^ (z >> 30)) * 0xbf58476d1ce4e5b9ULL; z = (z ^ (z >> 27)) * 0x94d049bb133111ebULL;
    rs[i] = z ^ (z >> 31);
  }
}

typedef struct { double x, y, z; } V3;
static inline V3 v3(double x, double y, double z) { V3 v = {x, y, z}; return v; }
static inline double dot(V3 a, V3 b) { return a.x * b.x + a.y * b.y + a.z * b.z; }
static inline V3 cross(V3 a, V3 b) { return v3(a.y * b.z - a.z * b.y, a.z * b.x - a.x * b.z, a.x * b.y - a.y * b.x); }
static inline V3 add(V3 a, V3 b) { return v3(a.x + b.x, a.y + b.y, a.z + b.z); }
static inline V3 scale(V3 a, double s) { return v3(a.x * s, a.y * s, a.z * s); }
static inline V3 unit(V3 a) { return scale(a, 1.0 / sqrt(dot(a, a))); }

/* Geometry: apexes at ((i + ½)a, (j + ½)a, H), H = (a/2) tan α; surface z = H − tan α · max(|u|, |v|). */
static double A, HALF, TA, H, WUM;
static V3 NRM[4]; /* outward (upward) facet normals: +u, −u, +v, −v facets */

/*
 * Distance along the ray to the pyramid surface, walking square columns. fromBelow: the ray is in
 * the Si. Returns −1 when there is no hit (escapes upward from above, heads to the rear from below)
 * and sets *facet.
 */
static double surface_hit(V3 o, V3 d, int fromBelow, int *facet) {
  double t0 = 0;
  if (fromBelow) {
    if (o.z < 0) { if (d.z <= 0) return -1; t0 = -o.z / d.z; }
  } else {
    if (o.z > H) { if (d.z >= 0) return -1; t0 = (H - o.z) / d.z; }
  }
  double px = o.x + t0 * d.x, py = o.y + t0 * d.y;
  double ci = floor(px / A), cj = floor(py / A);
  for (int step = 0; step < 100000; step++) {
    double cx = (ci + 0.5) * A, cy = (cj + 0.5) * A;
    /* column stretch [ta, tb] */
    double ta = t0, tb = INFINITY;
    if (d.x > 0) tb = fmin(tb, (ci * A + A - o.x) / d.x); else if (d.x < 0) tb = fmin(tb, (ci * A - o.x) / d.x);
    if (d.y > 0) tb = fmin(tb, (cj * A + A - o.y) / d.y); else if (d.y < 0) tb = fmin(tb, (cj * A - o.y) / d.y);
    /* g_k(t) = z(t) − P_k(t), P_0 = H − tanα (x − cx), P_1 = H + tanα (x − cx), P_2, P_3 likewise in y */
    double lo = -INFINITY, hi = INFINITY; int klo = -1, khi = -1;
    for (int k = 0; k < 4; k++) {
      double s = (k & 1) ? -1 : 1;
      double g0, g1;
      if (k < 2) { g0 = o.z - H + s * TA * (o.x - cx); g1 = d.z + s * TA * d.x; }
      else { g0 = o.z - H + s * TA * (o.y - cy); g1 = d.z + s * TA * d.y; }
      if (g1 > 0) { double r = -g0 / g1; if (r < hi) { hi = r; khi = k; } }
      else if (g1 < 0) { double r = -g0 / g1; if (r > lo) { lo = r; klo = k; } }
      else if (g0 > 0) { lo = INFINITY; }
    }
    const double eps = 1e-9 * A;
    if (fromBelow) {
      if (khi >= 0 && hi > 1e-12 && hi >= lo - eps && hi >= ta - eps && hi <= tb + eps) { *facet = khi; return hi; }
      double zb = o.z + tb * d.z;
      if (d.z <= 0 && zb < 0) return -1;
    } else {
      if (klo >= 0 && lo > 1e-12 && lo <= hi + eps && lo >= ta - eps && lo <= tb + eps) { *facet = klo; return lo; }
      double zb = o.z + tb * d.z;
      if (d.z >= 0 && zb > H) return -1;
    }
    /* next column */
    double tx = d.x > 0 ? (ci * A + A - o.x) / d.x : d.x < 0 ? (ci * A - o.x) / d.x : INFINITY;
    double ty = d.y > 0 ? (cj * A + A - o.y) / d.y : d.y < 0 ? (cj * A - o.y) / d.y : INFINITY;
    if (tx < ty) ci += d.x > 0 ? 1 : -1; else cj += d.y > 0 ? 1 : -1;
    t0 = tb;
  }
  return -2;
}

/* Fresnel power coefficients: from air (n1 = 1) into Si with complex index N, or from Si (real n) to air. */
static double complex NSI;
static double NREAL;
static void fresnel(double cosI, int fromSi, double *Rs, double *Rp) {
  if (!fromSi) {
    double sin2 = 1 - cosI * cosI;
    double complex ct = csqrt(NSI * NSI - sin2); /* N cosθt */
    double complex rs = (cosI - ct) / (cosI + ct);
    double complex rp = (NSI * NSI * cosI - ct) / (NSI * NSI * cosI + ct);
    *Rs = creal(rs * conj(rs)); *Rp = creal(rp * conj(rp));
  } else {
    double sinT2 = NREAL * NREAL * (1 - cosI * cosI);
    if (sinT2 >= 1) { *Rs = 1; *Rp = 1; return; }
    double ct = sqrt(1 - sinT2);
    double rs = (NREAL * cosI - ct) / (NREAL * cosI + ct), rp = (cosI - NREAL * ct) / (cosI + NREAL * ct);
    *Rs = rs * rs; *Rp = rp * rp;
  }
}

/*
 * One Fresnel event at normal n (pointing up, into the air) for direction *d and polarisation *e.
 * Returns 1 when the ray is transmitted. Snell with the real index.
 */
static int interface_event(V3 *d, V3 *e, V3 n, int fromSi) {
  double dn = dot(*d, n);
  double cosI = fabs(dn);
  V3 s = cross(*d, n);
  double sl = sqrt(dot(s, s));
  s = sl > 1e-12 ? scale(s, 1 / sl) : *e;
  double Es = dot(*e, s), Ep = dot(*e, cross(s, *d));
  double e2 = Es * Es + Ep * Ep, fs = e2 > 0 ? Es * Es / e2 : 1;
  double Rs, Rp;
  fresnel(cosI, fromSi, &Rs, &Rp);
  double R = fs * Rs + (1 - fs) * Rp;
  V3 nd; double a, b;
  int transmit = urand() >= R;
  if (!transmit) {
    nd = add(*d, scale(n, -2 * dn));
    a = Es * sqrt(Rs); b = -Ep * sqrt(Rp);
  } else {
    double eta = fromSi ? NREAL : 1 / NREAL;
    double ct = sqrt(1 - eta * eta * (1 - cosI * cosI));
    double kk = (eta * cosI - ct) * (fromSi ? -1 : 1);
    nd = unit(add(scale(*d, eta), scale(n, kk)));
    a = Es * sqrt(1 - Rs); b = Ep * sqrt(1 - Rp);
  }
  V3 ne = add(scale(s, a), scale(cross(s, nd), b));
  double l = sqrt(dot(ne, ne));
  *e = l > 1e-300 ? scale(ne, 1 / l) : s;
  *d = nd;
  return transmit;
}

enum { CH_R, CH_A, CH_REAR, CH_T, CH_LOST, NCH };

int main(int argc, char **argv) {
  if (argc < 6) { fprintf(stderr, "usage: pyramids nSi kSi wavelengthNm nRays seed [baseUm facetDeg thicknessUm mirrorR]\n"); return 2; }
  double n = atof(argv[1]), k = atof(argv[2]), wl = atof(argv[3]);
  long nRays = atol(argv[4]);
  seed_rng(strtoull(argv[5], 0, 10));
  A = argc > 6 ? atof(argv[6]) : 10; double facet = argc > 7 ? atof(argv[7]) : 54.74;
  WUM = argc > 8 ? atof(argv[8]) : 180; double mirror = argc > 9 ? atof(argv[9]) : 0.95;
  HALF = A / 2; TA = tan(facet * PI_ / 180); H = HALF * TA;
  double nl = sqrt(1 + TA * TA);
  NRM[0] = v3(TA / nl, 0, 1 / nl); NRM[1] = v3(-TA / nl, 0, 1 / nl); NRM[2] = v3(0, TA / nl, 1 / nl); NRM[3] = v3(0, -TA / nl, 1 / nl);
  NSI = n + I * k; NREAL = n;
  double alpha = 4 * PI_ * k / (wl * 1e-3); /* 1/µm */
  double sum[NCH] = {0};
  long events = 0;
  clock_t c0 = clock();
  for (long r = 0; r < nRays; r++) {
    double psi = 2 * PI_ * urand();
    V3 d = v3(0, 0, -1), e = v3(cos(psi), sin(psi), 0);
    V3 o = v3(urand() * A, urand() * A, H + 1);
    double tau = -log(urand());
    int inSi = 0, ch = CH_LOST, ev = 0;
    for (;;) {
      if (ev >= 10000) { ch = CH_LOST; break; }
      int f;
      if (!inSi) {
        double t = surface_hit(o, d, 0, &f);
        if (t == -1) { ch = CH_R; break; }
        if (t < 0) { ch = CH_LOST; break; }
        o = add(o, scale(d, t)); ev++;
        if (interface_event(&d, &e, NRM[f], 0)) inSi = 1;
        continue;
      }
      double t = surface_hit(o, d, 1, &f);
      if (t == -2) { ch = CH_LOST; break; }
      int rear = t < 0;
      if (rear) t = (-WUM - o.z) / d.z;
      double od = alpha * t;
      if (od >= tau) { ch = CH_A; break; }
      tau -= od;
      o = add(o, scale(d, t)); ev++;
      if (rear) {
        if (urand() >= mirror) { ch = CH_REAR; break; }
        d.z = -d.z; e.z = -e.z;
        continue;
      }
      if (interface_event(&d, &e, NRM[f], 1)) inSi = 0;
    }
    sum[ch] += 1;
    events += ev;
  }
  double secs = (double)(clock() - c0) / CLOCKS_PER_SEC;
  static const char *names[NCH] = {"R", "A_absorber", "A_rear", "T", "unresolved"};
  printf("{\"rays\":%ld,\"events\":%ld,\"seconds\":%.6f,\"channels\":{", nRays, events, secs);
  for (int c = 0; c < NCH; c++) {
    double m = sum[c] / nRays, se = sqrt(m * (1 - m) / (nRays - 1));
    printf("%s\"%s\":[%.8f,%.8f]", c ? "," : "", names[c], m, se);
  }
  printf("}}\n");
  return 0;
}
