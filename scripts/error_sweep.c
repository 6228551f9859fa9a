/*
** error_sweep.c -- true error and error estimate of exact-Born dsigma/dk
** points against a stored reference set (`make error-sweep`); not a test.
** See Copyright Notice in LICENSE
**
** Uses the public C API only, so the same source builds against this tree
** and against an earlier commit (make bench, make error-ref).
**
**   error_sweep gen [-n N] [-s SEED] [-r RTOL] [-j THREADS] [-k heavy-e]
**                   [-b FIRST] -o FILE
**       draws N random points (point i depends only on SEED and i) and
**       writes their inputs and dsigma/dk at RTOL (default 1e-10).  A point
**       whose reference does not reach RTOL (status, tolerance warning,
**       err > RTOL |val|, val <= 0) is dropped, with its reason written as
**       a comment line and printed.  With -k heavy-e only the points
**       whose projectile gets the other-projectile bound electron table are
**       computed and written (atomic electrons on, a screening model with an
**       electron field, i.e. not "none", mass >= BL_EBH_M_MIN, except the
**       spin-1/2 muon, which has a table of its own); the others are drawn
**       all the same (point i still depends only on SEED and i) but
**       skipped, and -b FIRST starts at point FIRST (of 0..N-1), to make
**       a long run in pieces.  Their lines go in place of the same indices
**       of a full set (the points of issue 14: tests/data/born-ref.txt).
**   error_sweep run [-r R1,R2,...] [-j THREADS] [-m MAX] -i REF [-o OUT]
**       evaluates every reference point at each rtol and prints per rtol:
**       the share of points with true error <= rtol, the median true error,
**       the median of estimate/true error, the median integrand calls.  OUT
**       gets one line per point and rtol (for `compare`).
**   error_sweep compare BASE.out HERE.out
**       calls at equal true error: for a target error E, the cost of a point
**       is the calls of the loosest rtol whose true error is <= E; prints
**       the median over points of cost(BASE)/cost(HERE) per E, and below
**       it the ceiling at each rtol R of HERE's ladder: the median of
**       cost(BASE)/calls(HERE at R) over the same points, the ratio if
**       every point met E already at R (no tuning of the loosest rtol that
**       meets E does better than the ceiling of the rtol it stops at).
**
** The draw: projectile electron, muon, pion or a user mass (log-uniform
** 0.1 MeV .. 1 TeV), spin 0 or 1/2 at random; Z 1..100; every registered
** screening model; nucleus point or uniform; atomic electrons on or off;
** T/m log-uniform in 1e-3 .. 1e6; y = k/T log-uniform in 1e-4 .. 0.999 on
** half the points and 1 - y log-uniform in 1e-3 .. 1 - 1e-4 on the other
** half (the tip).  The corrections (Coulomb, Elwert) are off: the sweep is
** about the integration of the Born cross section.
*/

#include <math.h>
#include <pthread.h>
#include <stdint.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <time.h>

#include <gsl/gsl_errno.h>

#include "brakelight.h"

#include "bench_util.h"

#define MAXRTOL 12
/* True errors below this are not resolved by references at 1e-10 (whose
** own true errors are smaller still); estimate/true ratios use
** max(true, TRUE_FLOOR) and the points below it are counted. */
#define TRUE_FLOOR 1e-12

typedef struct point {
  long idx;
  double mass, charge, spin;
  int Z, model, nucleus, electrons;
  double T, k;
  double ref, referr;
  int ok;                    /* 1: usable reference */
  char why[96];              /* reason it was dropped */
  /* run results, per rtol */
  double val[MAXRTOL], err[MAXRTOL];
  unsigned long calls[MAXRTOL];
  int st[MAXRTOL];
  unsigned warn[MAXRTOL];
  int skip;                  /* gen -k: not in the subset, not computed */
} point;

static const char *const models[] = {"none", "exponential", "thomas-fermi",
                                     "hartree-fock"};
#define NMODEL 4


/* splitmix64: the stream of point i is seeded from (seed, i) alone */
static uint64_t mix (uint64_t *s) {
  uint64_t z = (*s += 0x9E3779B97F4A7C15ULL);
  z = (z ^ (z >> 30)) * 0xBF58476D1CE4E5B9ULL;
  z = (z ^ (z >> 27)) * 0x94D049BB133111EBULL;
  return z ^ (z >> 31);
}

/* the splitmix64 finalizer alone: a hash of one word */
static uint64_t hash (uint64_t z) {
  z = (z ^ (z >> 30)) * 0xBF58476D1CE4E5B9ULL;
  z = (z ^ (z >> 27)) * 0x94D049BB133111EBULL;
  return z ^ (z >> 31);
}

static double unif (uint64_t *s) {
  return (mix(s) >> 11) * (1.0 / 9007199254740992.0);
}

static double logunif (uint64_t *s, double a, double b) {
  return exp(log(a) + (log(b) - log(a)) * unif(s));
}


static void draw (point *p, uint64_t seed, long i) {
  uint64_t s = hash(hash(seed + 0x632BE59BD9B4E019ULL) ^ (uint64_t)i);
  int kind;
  double t0, y;
  memset(p, 0, sizeof *p);
  p->idx = i;
  kind = (int)(unif(&s) * 4);
  p->charge = -1.0;
  switch (kind) {
    case 0: p->mass = BL_ME_MEV; break;
    case 1: p->mass = BL_MMU_MEV; break;
    case 2: p->mass = BL_MPI_MEV; p->charge = 1.0; break;
    default: p->mass = logunif(&s, 0.1, 1e6); p->charge = 1.0; break;
  }
  p->spin = unif(&s) < 0.5 ? 0.0 : 0.5;
  p->Z = 1 + (int)(unif(&s) * 100);
  p->model = (int)(unif(&s) * NMODEL);
  p->nucleus = unif(&s) < 0.5 ? BL_NUCLEUS_POINT : BL_NUCLEUS_UNIFORM;
  p->electrons = unif(&s) < 0.5;
  t0 = logunif(&s, 1e-3, 1e6);
  if (unif(&s) < 0.5)
    y = logunif(&s, 1e-4, 0.999);
  else
    y = 1.0 - logunif(&s, 1e-3, 1.0 - 1e-4);
  p->T = t0 * p->mass;
  p->k = y * p->T;
}


/* gen -k heavy-e: the points that get the other-projectile table in
** bl_case_setup (electrons on, mass >= BL_EBH_M_MIN, not the spin-1/2
** muon; "none" has no electron field and sets electrons off). */
static int heavy_e (const point *p) {
  int mu = p->spin == 0.5 && fabs(p->mass - BL_MMU_MEV) <= 1e-12 * BL_MMU_MEV;
  return p->electrons && strcmp(models[p->model], "none") != 0
         && p->mass >= BL_EBH_M_MIN && !mu;
}


static int mkcase (const point *p, bl_case *c) {
  bl_particle pa = {"sweep", p->mass, p->charge, p->spin, 0};
  bl_opts o = bl_opts_bare;
  o.nucleus = p->nucleus;
  o.electrons = p->electrons;
  return bl_case_setup(c, &pa, p->Z, bl_model_find(models[p->model]), NULL,
                       p->T, &o);
}


/* ---- threads over points ------------------------------------------------ */

typedef struct job {
  point *pts;
  long n, next, done, todo, every;
  double t0;
  int nr;
  double rtol[MAXRTOL];
  int gen;
  pthread_mutex_t mu;
} job;


static void one (job *jb, point *p, bl_quad *q) {
  bl_case c;
  int st, r;
  if (p->skip)
    return;
  st = mkcase(p, &c);
  if (jb->gen) {
    bl_result res;
    if (st != BL_SUCCESS) {
      snprintf(p->why, sizeof p->why, "case not set up: %s", bl_strerror(st));
      return;
    }
    bl_quad_set_rtol(q, jb->rtol[0]);
    bl_quad_reset_calls(q);
    st = bl_dcs_dk_e(&c, p->k, q, &res);
    p->ref = res.val;
    p->referr = res.err;
    p->calls[0] = bl_quad_calls(q);
    p->st[0] = st;
    if (!(res.val > 0.0) || !isfinite(res.val) || !isfinite(res.err))
      snprintf(p->why, sizeof p->why, "value %g +- %g, status %s", res.val,
               res.err, bl_strerror(st));
    else if (!(res.err <= jb->rtol[0] * res.val))
      snprintf(p->why, sizeof p->why, "estimate %.2e relative, not within "
               "%g (status %s)", res.err / res.val, jb->rtol[0],
               bl_strerror(st));
    else
      p->ok = 1;   /* a failure status with an estimate within rtol is kept */
    return;
  }
  for (r = 0; r < jb->nr; r++) {
    bl_result res = {0};
    bl_quad_set_rtol(q, jb->rtol[r]);
    bl_quad_reset_calls(q);
    p->st[r] = st == BL_SUCCESS ? bl_dcs_dk_e(&c, p->k, q, &res) : st;
    p->val[r] = res.val;
    p->err[r] = res.err;
    p->warn[r] = res.warn;
    p->calls[r] = bl_quad_calls(q);
  }
}


static void *worker (void *arg) {
  job *jb = arg;
  bl_quad *q = bl_quad_alloc(1000);
  if (q == NULL)
    return NULL;
  for (;;) {
    long i;
    pthread_mutex_lock(&jb->mu);
    i = jb->next++;
    pthread_mutex_unlock(&jb->mu);
    if (i >= jb->n)
      break;
    one(jb, &jb->pts[i], q);
    pthread_mutex_lock(&jb->mu);
    if (!jb->pts[i].skip && ++jb->done % jb->every == 0)
      fprintf(stderr, "error_sweep: %ld of %ld points, %.0f s\n", jb->done,
              jb->todo, now() - jb->t0);
    pthread_mutex_unlock(&jb->mu);
  }
  bl_quad_free(q);
  return NULL;
}


static void runall (job *jb, int nthreads) {
  pthread_t th[16];
  int t;
  if (nthreads < 1)
    nthreads = 1;
  if (nthreads > 16)
    nthreads = 16;
  if (jb->todo == 0)
    jb->todo = jb->n;
  if (jb->every == 0)
    jb->every = 500;
  jb->t0 = now();
  pthread_mutex_init(&jb->mu, NULL);
  for (t = 0; t < nthreads; t++)
    pthread_create(&th[t], NULL, worker, jb);
  for (t = 0; t < nthreads; t++)
    pthread_join(th[t], NULL);
  pthread_mutex_destroy(&jb->mu);
}



static int cmpd (const void *a, const void *b) {
  double x = *(const double *)a, y = *(const double *)b;
  return (x > y) - (x < y);
}

static double median (double *v, long n) {
  if (n <= 0)
    return NAN;
  qsort(v, n, sizeof *v, cmpd);
  return n % 2 ? v[n / 2] : 0.5 * (v[n / 2 - 1] + v[n / 2]);
}


/* ---- gen ----------------------------------------------------------------- */

#define LINEFMT "%ld %.17g %.17g %.17g %d %s %d %d %.17g %.17g"

static int gen (long n, uint64_t seed, double rtol, int nthreads,
                const char *keep, long first, const char *out) {
  job jb;
  FILE *f;
  long i, nok = 0, nsub = 0;
  double t1 = now();
  memset(&jb, 0, sizeof jb);
  jb.pts = calloc(n, sizeof *jb.pts);
  if (jb.pts == NULL)
    return 1;
  for (i = 0; i < n; i++) {
    draw(&jb.pts[i], seed, i);
    jb.pts[i].skip = i < first || (keep != NULL && !heavy_e(&jb.pts[i]));
    nsub += !jb.pts[i].skip;
  }
  jb.n = n;
  jb.todo = nsub;
  jb.every = keep != NULL ? 50 : 500;
  jb.gen = 1;
  jb.nr = 1;
  jb.rtol[0] = rtol;
  runall(&jb, nthreads);
  f = fopen(out, "w");
  if (f == NULL) {
    fprintf(stderr, "error_sweep: cannot write %s\n", out);
    return 1;
  }
  fprintf(f, "# brakelight exact-Born dsigma/dk references (scripts/error_sweep.c gen)\n"
             "# seed %llu, %ld points drawn, rtol %g, brakelight %s\n"
             "# columns: index mass[MeV] charge spin Z model nucleus electrons "
             "T[MeV] k[MeV] dsdk[mb/MeV] err[mb/MeV] calls status\n",
          (unsigned long long)seed, n, rtol, BL_VERSION);
  if (keep != NULL || first > 0)
    fprintf(f, "# only %ld points: %s, from point %ld on\n", nsub,
            keep != NULL ? "-k heavy-e" : "all", first);
  for (i = 0; i < n; i++) {
    const point *p = &jb.pts[i];
    if (p->skip)
      continue;
    if (!p->ok) {
      fprintf(f, "# dropped %ld (m %.6g MeV spin %g Z %d %s nucleus %d "
                 "electrons %d T/m %.4g y %.6g): %s\n", p->idx, p->mass,
              p->spin, p->Z, models[p->model], p->nucleus, p->electrons,
              p->T / p->mass, p->k / p->T, p->why);
      printf("dropped %ld (m %.6g MeV spin %g Z %d %s nucleus %d electrons %d "
             "T/m %.4g y %.6g): %s\n", p->idx, p->mass, p->spin, p->Z,
             models[p->model], p->nucleus, p->electrons, p->T / p->mass,
             p->k / p->T, p->why);
      continue;
    }
    nok++;
    fprintf(f, LINEFMT " %.17g %.3e %lu %d\n", p->idx, p->mass, p->charge,
            p->spin, p->Z, models[p->model], p->nucleus, p->electrons, p->T,
            p->k, p->ref, p->referr, p->calls[0], p->st[0]);
  }
  fclose(f);
  printf("error_sweep gen: %ld of %ld points kept (%ld dropped), %.0f s\n",
         nok, nsub, nsub - nok, now() - t1);
  free(jb.pts);
  return 0;
}


/* ---- run ----------------------------------------------------------------- */

static long readref (const char *in, point **pts, long max) {
  FILE *f = fopen(in, "r");
  char line[512], mname[32];
  long n = 0, cap = 1024;
  point *p;
  if (f == NULL) {
    fprintf(stderr, "error_sweep: cannot read %s\n", in);
    return -1;
  }
  p = malloc(cap * sizeof *p);
  while (p != NULL && fgets(line, sizeof line, f) != NULL && n < max) {
    point pt;
    int m;
    unsigned long calls;
    if (line[0] == '#')
      continue;
    memset(&pt, 0, sizeof pt);
    if (sscanf(line, "%ld %lf %lf %lf %d %31s %d %d %lf %lf %lf %lf %lu",
               &pt.idx, &pt.mass, &pt.charge, &pt.spin, &pt.Z, mname,
               &pt.nucleus, &pt.electrons, &pt.T, &pt.k, &pt.ref, &pt.referr,
               &calls) != 13) {
      fprintf(stderr, "error_sweep: bad line in %s: %s", in, line);
      continue;
    }
    pt.model = -1;
    for (m = 0; m < NMODEL; m++)
      if (strcmp(mname, models[m]) == 0)
        pt.model = m;
    if (pt.model < 0)
      continue;
    pt.ok = 1;
    if (n == cap) {
      point *np = realloc(p, 2 * cap * sizeof *p);
      if (np == NULL)
        break;
      p = np;
      cap *= 2;
    }
    p[n++] = pt;
  }
  fclose(f);
  *pts = p;
  return p == NULL ? -1 : n;
}


static int run (const char *in, const char *out, double *rtol, int nr,
                int nthreads, long max) {
  job jb;
  long n, i;
  int r;
  double t1;
  FILE *f = NULL;
  double *a, *b, *c;
  memset(&jb, 0, sizeof jb);
  n = readref(in, &jb.pts, max);
  if (n <= 0)
    return 1;
  jb.n = n;
  jb.nr = nr;
  memcpy(jb.rtol, rtol, nr * sizeof *rtol);
  t1 = now();
  runall(&jb, nthreads);
  printf("%ld reference points (%s), %.1f s with %d thread(s)\n", n, in,
         now() - t1, nthreads);
  printf("%8s %9s %9s %9s %11s %9s %9s %8s %10s\n", "rtol", "within", "misses",
         "worst", "med.true", "est/true", "est>=true", "below", "med.calls");
  a = malloc(n * sizeof *a);
  b = malloc(n * sizeof *b);
  c = malloc(n * sizeof *c);
  if (out != NULL)
    f = fopen(out, "w");
  for (r = 0; r < nr && a && b && c; r++) {
    long within = 0, est_ge = 0, below = 0;
    double worst = 0.0;
    long worsti = -1;
    for (i = 0; i < n; i++) {
      const point *p = &jb.pts[i];
      double tr = fabs(p->val[r] - p->ref) / p->ref;
      double est = p->err[r] / p->ref;
      if (!isfinite(tr))
        tr = HUGE_VAL;
      within += tr <= rtol[r];
      est_ge += est >= tr;
      below += tr < TRUE_FLOOR;
      if (tr > worst) {
        worst = tr;
        worsti = p->idx;
      }
      a[i] = tr;
      b[i] = est / (tr > TRUE_FLOOR ? tr : TRUE_FLOOR);
      c[i] = (double)p->calls[r];
      if (f != NULL)
        fprintf(f, "%ld %g %.17g %.3e %.3e %lu %d %u\n", p->idx, rtol[r],
                p->val[r], tr, est, p->calls[r], p->st[r], p->warn[r]);
    }
    printf("%8.0e %8.3f%% %9ld %9.1e %11.2e %9.2g %8.1f%% %8ld %10.0f"
           "  (worst: point %ld)\n", rtol[r], 100.0 * within / n, n - within,
           worst, median(a, n), median(b, n), 100.0 * est_ge / n, below,
           median(c, n), worsti);
  }
  printf("within: true error <= rtol; est/true: median of estimate / "
         "max(true, %.0e); below: true error < %.0e\n", TRUE_FLOOR,
         TRUE_FLOOR);
  if (f != NULL)
    fclose(f);
  free(a);
  free(b);
  free(c);
  free(jb.pts);
  return 0;
}


/* ---- compare ------------------------------------------------------------- */

typedef struct rec {
  long idx;
  double rtol, tr;
  unsigned long calls;
} rec;

static long readout (const char *fn, rec **out) {
  FILE *f = fopen(fn, "r");
  long n = 0, cap = 4096;
  rec *v = malloc(cap * sizeof *v);
  char line[256];
  if (f == NULL || v == NULL) {
    fprintf(stderr, "error_sweep: cannot read %s\n", fn);
    if (f)
      fclose(f);
    free(v);
    return -1;
  }
  while (fgets(line, sizeof line, f) != NULL) {
    rec x;
    double val, est;
    if (sscanf(line, "%ld %lf %lf %lf %lf %lu", &x.idx, &x.rtol, &val, &x.tr,
               &est, &x.calls) != 6)
      continue;
    if (n == cap) {
      rec *nv = realloc(v, 2 * cap * sizeof *v);
      if (nv == NULL)
        break;
      v = nv;
      cap *= 2;
    }
    v[n++] = x;
  }
  fclose(f);
  *out = v;
  return n;
}


/* The cost of every point at target error E: calls of the loosest rtol
** that met it, 0 if none did; cost[] is indexed by point (0..nidx-1). */
static void costs (const rec *v, long n, double E, double *cost,
                   double *loosest, long nidx) {
  long i;
  for (i = 0; i < nidx; i++) {
    cost[i] = 0.0;
    loosest[i] = -1.0;
  }
  for (i = 0; i < n; i++) {
    long k = v[i].idx;
    if (k < 0 || k >= nidx)
      continue;
    if (v[i].tr <= E && v[i].rtol > loosest[k]) {
      loosest[k] = v[i].rtol;
      cost[k] = (double)v[i].calls;
    }
  }
}


/* The ceiling line of compare: per rtol R of HERE (cost rows vh), the
** median over the points that met E in both (cb, ch > 0) of cb over
** HERE's calls at R; work holds nidx values. */
static void ceiling (const rec *vh, long nh, const double *cb,
                     const double *ch, long nidx, double *work) {
  double r[MAXRTOL];
  int nr = 0, j;
  long i, m;
  for (i = 0; i < nh; i++) {
    for (j = 0; j < nr && r[j] != vh[i].rtol; j++)
      ;
    if (j == nr && nr < MAXRTOL)
      r[nr++] = vh[i].rtol;
  }
  printf("%8s ceiling, every point at rtol R's calls:", "");
  for (j = 0; j < nr; j++) {
    for (i = m = 0; i < nh; i++) {
      long k = vh[i].idx;
      if (vh[i].rtol == r[j] && k >= 0 && k < nidx && cb[k] > 0
          && ch[k] > 0 && vh[i].calls > 0)
        work[m++] = cb[k] / (double)vh[i].calls;
    }
    if (m > 0)
      printf("%s %.2fx (%.0e)", j > 0 ? "," : "", median(work, m), r[j]);
  }
  printf("\n");
}
static int compare (const char *fb, const char *fh) {
  static const double E[] = {1e-2, 1e-3, 1e-4, 1e-6, 1e-8};
  rec *vb, *vh;
  long nb = readout(fb, &vb), nh = readout(fh, &vh), e, i, nidx = 0;
  double *cb, *ch, *lb, *lh, *ratio, *xb, *xh;
  if (nb <= 0 || nh <= 0)
    return 1;
  for (i = 0; i < nh; i++)
    if (vh[i].idx + 1 > nidx)
      nidx = vh[i].idx + 1;
  cb = malloc(nidx * sizeof *cb);
  ch = malloc(nidx * sizeof *ch);
  lb = malloc(nidx * sizeof *lb);
  lh = malloc(nidx * sizeof *lh);
  ratio = malloc(nidx * sizeof *ratio);
  xb = malloc(nidx * sizeof *xb);
  xh = malloc(nidx * sizeof *xh);
  printf("calls at equal true error (cost of a point: the calls of the "
         "loosest rtol that met E)\n%8s %8s %12s %12s %10s\n", "E", "points",
         "med.base", "med.here", "med.ratio");
  for (e = 0; e < (long)(sizeof E / sizeof E[0]) && cb && ch && lb && lh
              && ratio && xb && xh; e++) {
    long m = 0, nboth = 0;
    costs(vb, nb, E[e], cb, lb, nidx);
    costs(vh, nh, E[e], ch, lh, nidx);
    for (i = 0; i < nidx; i++) {
      if (lh[i] < -0.5 && lb[i] < -0.5)
        continue;
      nboth++;
      if (cb[i] > 0 && ch[i] > 0) {
        ratio[m] = cb[i] / ch[i];
        xb[m] = cb[i];
        xh[m++] = ch[i];
      }
    }
    if (m > 0) {
      printf("%8.0e %8ld %12.0f %12.0f %9.2fx   (%ld of %ld points met E "
             "in both)\n", E[e], m, median(xb, m), median(xh, m),
             median(ratio, m), m, nboth);
      ceiling(vh, nh, cb, ch, nidx, ratio);
    }
  }
  free(cb);
  free(ch);
  free(lb);
  free(lh);
  free(ratio);
  free(xb);
  free(xh);
  free(vb);
  free(vh);
  return 0;
}


/* -r R1,R2,...: 1 to MAXRTOL values in (0, 1); -1 (said) otherwise. */
static int parse_rtols (const char *s, double *r) {
  const char *s0 = s;
  int n = 0;
  char *end;
  while (*s) {
    double v = strtod(s, &end);
    if (end == s || !(v > 0.0 && v < 1.0) || (*end != ',' && *end != '\0')) {
      fprintf(stderr, "error_sweep: -r %s: each rtol must be a number in "
                      "(0, 1), separated by commas\n", s0);
      return -1;
    }
    if (n == MAXRTOL) {
      fprintf(stderr, "error_sweep: -r %s: at most %d rtols\n", s0, MAXRTOL);
      return -1;
    }
    r[n++] = v;
    s = *end == ',' ? end + 1 : end;
  }
  return n;
}


int main (int argc, char **argv) {
  const char *in = NULL, *out = NULL, *keep = NULL;
  long n = 10000, max = 1L << 40, first = 0;
  unsigned long long seed = 14;
  double rtol[MAXRTOL] = {1e-2, 1e-3, 1e-4, 1e-6};
  int nr = 4, nthreads = 2, i, rset = 0;
  gsl_set_error_handler_off();
  if (argc < 2) {
usage:
    fprintf(stderr, "usage: error_sweep gen [-n N] [-s SEED] [-r RTOL] [-j T] [-k heavy-e] [-b FIRST] -o FILE\n"
                    "       error_sweep run [-r R1,R2,..] [-j T] [-m MAX] -i REF [-o OUT]\n"
                    "       error_sweep compare BASE.out HERE.out\n");
    return 2;
  }
  if (strcmp(argv[1], "compare") == 0) {
    if (argc != 4)
      goto usage;
    return compare(argv[2], argv[3]);
  }
  for (i = 2; i + 1 < argc; i += 2) {
    const char *o = argv[i], *v = argv[i + 1];
    if (strcmp(o, "-n") == 0) n = atol(v);
    else if (strcmp(o, "-s") == 0) seed = strtoull(v, NULL, 10);
    else if (strcmp(o, "-r") == 0) {
      nr = parse_rtols(v, rtol);
      if (nr <= 0)
        return 2;
      rset = 1;
    }
    else if (strcmp(o, "-j") == 0) nthreads = atoi(v);
    else if (strcmp(o, "-m") == 0) max = atol(v);
    else if (strcmp(o, "-i") == 0) in = v;
    else if (strcmp(o, "-o") == 0) out = v;
    else if (strcmp(o, "-k") == 0) {
      if (strcmp(v, "heavy-e") != 0) {
        fprintf(stderr, "error_sweep: -k %s: the only subset is heavy-e\n", v);
        return 2;
      }
      keep = v;
    }
    else if (strcmp(o, "-b") == 0) {
      char *end;
      first = strtol(v, &end, 10);
      if (end == v || *end != '\0') {
        fprintf(stderr, "error_sweep: -b %s: the first point must be an "
                        "integer in 0..N - 1\n", v);
        return 2;
      }
    }
    else goto usage;
  }
  if (i != argc || nr < 1)
    goto usage;
  if (strcmp(argv[1], "gen") == 0 && out != NULL && n > 0) {
    if (first < 0 || first >= n) {
      fprintf(stderr, "error_sweep: -b %ld: the first point must be in "
                      "0..%ld (N - 1)\n", first, n - 1);
      return 2;
    }
    return gen(n, seed, rset ? rtol[0] : 1e-10, nthreads, keep, first, out);
  }
  if (strcmp(argv[1], "run") == 0 && in != NULL)
    return run(in, out, rtol, nr, nthreads, max);
  goto usage;
}
