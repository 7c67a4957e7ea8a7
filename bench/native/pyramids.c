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
 * usage: pyramids [--figures] nSi kSi wavelengthNm nRays seed [baseUm facetDeg thicknessUm mirrorR]
 * prints one JSON line: rays, events, seconds (CPU), and per channel mean and standard error.
 *
 * --figures (a calibration, not a target): the same rays and physics, plus the per-ray work
 * lightfold's analog kernel does and the bare kernel does not, so `npm run bench` can tell what
 * lightfold's figures cost apart from what its kernel costs. Per ray: its own random substream
 * (xoshiro128**, its 4 words re-derived from the batch seed words and the ray index through 8
 * MurmurHash3 finalisers, as lightfold's RandomStream.startSubstream); reflection split into
 * R_first / R_escape; the power still inside after each pass 1..MAX_PASSES plus a tail; R_escape
 * in 5° polar-angle bins; the optical path in the absorber and the α → 0 path ((e^{αL} − 1)/α of
 * the analog path L); and per channel and per figure the sum and sum of squares over rays (the
 * layout of lightfold's point tally, src/trace/tallyLayout.ts). The JSON adds "mode" and "figures".
 */
#include <complex.h>
#include <math.h>
#include <stdint.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
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
 * Returns 1 when the ray is transmitted (u, uniform in (0, 1), decides: transmitted when u ≥ R). Snell
 * with the real index.
 */
static int interface_event_u(V3 *d, V3 *e, V3 n, int fromSi, double u) {
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
  int transmit = u >= R;
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
/* The bare kernel's event: its uniform from xoshiro256+ (the only draw of the event). */
static int interface_event(V3 *d, V3 *e, V3 n, int fromSi) { return interface_event_u(d, e, n, fromSi, urand()); }

/* ---------------------------------------------------------------------------------------------
 * --figures: lightfold's per-ray figures in C (see the header). Same geometry and Fresnel events as
 * the bare kernel; only the random numbers and the bookkeeping differ.
 */

/* xoshiro128** (Blackman & Vigna 2018) with one substream per ray, as lightfold's RandomStream. */
static uint32_t xs[4], xbase[4];
static inline uint32_t rotl32(uint32_t x, int k) { return (x << k) | (x >> (32 - k)); }
/* MurmurHash3 32-bit finaliser (Appleby 2011). */
static inline uint32_t fmix32(uint32_t h) {
  h ^= h >> 16; h *= 0x85ebca6bu; h ^= h >> 13; h *= 0xc2b2ae35u; h ^= h >> 16;
  return h;
}
/* The batch's 4 seed words from the seed (splitmix64, the high halves). */
static void seed_words(uint64_t s) {
  for (int i = 0; i < 4; i++) {
    uint64_t z = (s += 0x9e3779b97f4a7c15ULL);
    z = (z ^ (z >> 30)) * 0xbf58476d1ce4e5b9ULL; z = (z ^ (z >> 27)) * 0x94d049bb133111ebULL;
    xbase[i] = (uint32_t)((z ^ (z >> 31)) >> 32);
  }
}
/* Substream `index` of the batch: each seed word hashed with the index (8 finalisers). */
static inline void start_substream(uint32_t index) {
  uint32_t i4 = index << 2;
  for (int j = 0; j < 4; j++) xs[j] = fmix32(xbase[j] ^ fmix32(i4 + (uint32_t)j + 1));
  if ((xs[0] | xs[1] | xs[2] | xs[3]) == 0) xs[0] = 0x9e3779b9u;
}
/* Next uniform in (0, 1), resolution 2^-32. */
static inline double xrand(void) {
  uint32_t r = rotl32(xs[1] * 5, 7) * 9, t = xs[1] << 9;
  xs[2] ^= xs[0]; xs[3] ^= xs[1]; xs[1] ^= xs[2]; xs[0] ^= xs[3]; xs[2] ^= t; xs[3] = rotl32(xs[3], 11);
  return ((double)r + 0.5) * 0x1.0p-32;
}

/* Channels in lightfold's order (src/trace/channels.ts). */
enum { F_R_FIRST, F_R_ESCAPE, F_A_ABS, F_A_REAR, F_T_FIRST, F_T_ESCAPE, F_UNRESOLVED, NFCH };
enum { FACE_NONE, FACE_FRONT, FACE_REAR };
#define MAX_PASSES 20
#define ESC_BINS 18
/* Diagnostics block as lightfold's tallyLayout.ts, each a [Σx, Σx²] pair over rays. */
enum {
  D_ENTERED = 0, D_FREE_PATH = 2, D_PASSES = 4, /* pass k (1..MAX_PASSES + 1 = tail) at D_PASSES + 2(k − 1) */
  D_ESCAPE = D_PASSES + 2 * (MAX_PASSES + 1), D_R_TOTAL = D_ESCAPE + 2 * ESC_BINS, D_T_TOTAL = D_R_TOTAL + 2,
  D_LENGTH = D_T_TOTAL + 2
};

/* One ray's history (lightfold's history.ts): a pass ends at the first arrival at the other face;
 * the power still inside after it is taken when the ray sets off again (depart). */
typedef struct {
  int passes, face, pending, maxPass; /* pass under way (0: never entered), last face touched */
  unsigned escaped;                   /* escape-angle bins touched, a bit each */
  double entered, path, analogPath, freePath, tail;
  double passW[MAX_PASSES], escW[ESC_BINS], contrib[NFCH];
} History;
static History hy;
static double EDGE_COS[ESC_BINS + 1]; /* cos of the bin edges b·5°, falling */

static inline void arrive(int face) {
  if (hy.face == face) return;
  hy.face = face; hy.passes++; hy.pending = 1;
}
static inline void depart(double w) {
  if (!hy.pending) return;
  hy.pending = 0;
  int k = hy.passes - 1; /* passes completed */
  if (k > MAX_PASSES) { hy.tail += w; return; }
  hy.passW[k - 1] += w;
  if (k > hy.maxPass) hy.maxPass = k;
}
/* Out through the front going up (cosθ = dz): R_first before ever entering, else R_escape, binned. */
static inline void leave_front(double w, double dz) {
  if (hy.passes == 0) { hy.contrib[F_R_FIRST] += w; return; }
  hy.contrib[F_R_ESCAPE] += w;
  int bin = 0;
  while (bin < ESC_BINS - 1 && dz <= EDGE_COS[bin + 1]) bin++;
  hy.escW[bin] += w;
  hy.escaped |= 1u << bin;
}
static inline void add_pair(double *t, double v) { t[0] += v; t[1] += v * v; }
/* The ray's sums and squares into the tallies; clears its scratch. */
static void fold_ray(double *chT, double *diag, double invW) {
  double *c = hy.contrib;
  add_pair(diag + D_R_TOTAL, c[F_R_FIRST] + c[F_R_ESCAPE]);
  add_pair(diag + D_T_TOTAL, c[F_T_FIRST] + c[F_T_ESCAPE]);
  if (hy.entered != 0) add_pair(diag + D_ENTERED, hy.entered);
  if (hy.freePath != 0) add_pair(diag + D_FREE_PATH, hy.freePath * invW);
  for (int k = 1; k <= hy.maxPass; k++) { add_pair(diag + D_PASSES + 2 * (k - 1), hy.passW[k - 1]); hy.passW[k - 1] = 0; }
  if (hy.tail != 0) add_pair(diag + D_PASSES + 2 * MAX_PASSES, hy.tail);
  for (unsigned m = hy.escaped; m != 0; m &= m - 1) {
    int b = 0;
    while (!((m >> b) & 1u)) b++; /* lowest bit set */
    add_pair(diag + D_ESCAPE + 2 * b, hy.escW[b]);
    hy.escW[b] = 0;
  }
  for (int ch = 0; ch < NFCH; ch++) {
    if (c[ch] == 0) continue;
    add_pair(chT + 2 * ch, c[ch]);
    c[ch] = 0;
  }
}

static void print_pair(const char *name, const double *t, long n, int comma) {
  double m = t[0] / n, var = (t[1] - n * m * m) / (n - 1);
  printf("%s\"%s\":[%.8f,%.8f]", comma ? "," : "", name, m, sqrt((var > 0 ? var : 0) / n));
}

static int run_figures(long nRays, uint64_t seed, double alpha, double mirror) {
  seed_words(seed);
  for (int b = 0; b <= ESC_BINS; b++) EDGE_COS[b] = cos(b * (90.0 / ESC_BINS) * PI_ / 180);
  double chT[2 * NFCH] = {0}, diag[D_LENGTH] = {0}, pathT[2] = {0};
  const double invW = 1 / WUM, w = 1; /* analog: every ray carries weight 1 */
  long events = 0;
  clock_t c0 = clock();
  for (long r = 0; r < nRays; r++) {
    start_substream((uint32_t)r);
    double psi = 2 * PI_ * xrand();
    V3 d = v3(0, 0, -1), e = v3(cos(psi), sin(psi), 0);
    double x = xrand() * A, y = xrand() * A;
    V3 o = v3(x, y, H + 1);
    double tau = -log(xrand());
    hy.passes = 0; hy.face = FACE_NONE; hy.pending = 0; hy.maxPass = 0; hy.escaped = 0;
    hy.entered = hy.path = hy.analogPath = hy.freePath = hy.tail = 0;
    int inSi = 0, ev = 0;
    for (;;) {
      if (ev >= 10000) { hy.contrib[F_UNRESOLVED] += w; break; }
      int f;
      if (!inSi) {
        double t = surface_hit(o, d, 0, &f);
        if (t == -1) { leave_front(w, d.z); break; }
        if (t < 0) { hy.contrib[F_UNRESOLVED] += w; break; }
        o = add(o, scale(d, t)); ev++;
        if (interface_event_u(&d, &e, NRM[f], 0, xrand())) {
          inSi = 1;
          if (hy.passes == 0) { hy.passes = 1; hy.entered += w; }
          hy.face = FACE_FRONT;
        }
        continue;
      }
      if (d.z > 0 && hy.face == FACE_REAR) depart(w);
      double t = surface_hit(o, d, 1, &f);
      if (t == -2) { hy.contrib[F_UNRESOLVED] += w; break; }
      int rear = t < 0;
      if (rear) {
        if (hy.face == FACE_FRONT) depart(w);
        t = (-WUM - o.z) / d.z;
      }
      double od = alpha * t;
      if (od >= tau) {
        double s = tau / alpha;
        hy.path += w * s; hy.analogPath += s;
        hy.contrib[F_A_ABS] += w;
        break;
      }
      tau -= od;
      hy.path += w * t; hy.analogPath += t;
      o = add(o, scale(d, t)); ev++;
      arrive(rear ? FACE_REAR : FACE_FRONT);
      if (rear) {
        if (xrand() >= mirror) { hy.contrib[F_A_REAR] += w; break; }
        d.z = -d.z; e.z = -e.z;
        continue;
      }
      if (interface_event_u(&d, &e, NRM[f], 1, xrand())) inSi = 0;
    }
    /* α → 0 path of the analog path L: (e^{αL} − 1)/α (lightfold's bulkTransport.ts, endAnalogPath). */
    if (hy.analogPath != 0) hy.freePath += w * (expm1(alpha * hy.analogPath) / alpha);
    fold_ray(chT, diag, invW);
    add_pair(pathT, hy.path / w * invW);
    events += ev;
  }
  double secs = (double)(clock() - c0) / CLOCKS_PER_SEC;
  printf("{\"rays\":%ld,\"events\":%ld,\"seconds\":%.6f,\"mode\":\"figures\",\"channels\":{", nRays, events, secs);
  print_pair("R", diag + D_R_TOTAL, nRays, 0);
  print_pair("A_absorber", chT + 2 * F_A_ABS, nRays, 1);
  print_pair("A_rear", chT + 2 * F_A_REAR, nRays, 1);
  print_pair("T", diag + D_T_TOTAL, nRays, 1);
  print_pair("unresolved", chT + 2 * F_UNRESOLVED, nRays, 1);
  printf("},\"figures\":{");
  static const char *names[NFCH] = {"R_first", "R_escape", "A_absorber", "A_rear", "T_first", "T_escape", "unresolved"};
  for (int ch = 0; ch < NFCH; ch++) print_pair(names[ch], chT + 2 * ch, nRays, ch > 0);
  print_pair("pathRatio", pathT, nRays, 1);
  print_pair("entered", diag + D_ENTERED, nRays, 1);
  print_pair("freePath", diag + D_FREE_PATH, nRays, 1);
  char name[32];
  for (int k = 1; k <= MAX_PASSES + 1; k++) {
    snprintf(name, sizeof name, k <= MAX_PASSES ? "afterPass%d" : "afterPassTail", k);
    print_pair(name, diag + D_PASSES + 2 * (k - 1), nRays, 1);
  }
  for (int b = 0; b < ESC_BINS; b++) {
    snprintf(name, sizeof name, "escapeDeg%d", b * (90 / ESC_BINS));
    print_pair(name, diag + D_ESCAPE + 2 * b, nRays, 1);
  }
  printf("}}\n");
  return 0;
}

enum { CH_R, CH_A, CH_REAR, CH_T, CH_LOST, NCH };

int main(int argc, char **argv) {
  int figures = argc > 1 && strcmp(argv[1], "--figures") == 0;
  if (figures) { argc--; argv++; }
  if (argc < 6) { fprintf(stderr, "usage: pyramids [--figures] nSi kSi wavelengthNm nRays seed [baseUm facetDeg thicknessUm mirrorR]\n"); return 2; }
  double n = atof(argv[1]), k = atof(argv[2]), wl = atof(argv[3]);
  long nRays = atol(argv[4]);
  uint64_t seed = strtoull(argv[5], 0, 10);
  seed_rng(seed);
  A = argc > 6 ? atof(argv[6]) : 10; double facet = argc > 7 ? atof(argv[7]) : 54.74;
  WUM = argc > 8 ? atof(argv[8]) : 180; double mirror = argc > 9 ? atof(argv[9]) : 0.95;
  HALF = A / 2; TA = tan(facet * PI_ / 180); H = HALF * TA;
  double nl = sqrt(1 + TA * TA);
  NRM[0] = v3(TA / nl, 0, 1 / nl); NRM[1] = v3(-TA / nl, 0, 1 / nl); NRM[2] = v3(0, TA / nl, 1 / nl); NRM[3] = v3(0, -TA / nl, 1 / nl);
  NSI = n + I * k; NREAL = n;
  double alpha = 4 * PI_ * k / (wl * 1e-3); /* 1/µm */
  if (figures) return run_figures(nRays, seed, alpha, mirror);
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
