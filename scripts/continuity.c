/*
** continuity.c -- steps in dsigma/dk along T and along y (`make
** continuity`): for e-/e+ on C, Cu, W, Pb, U and mu- on Fe, Pb with the
** module's defaults (Hartree-Fock screening, electrons, uniform nucleus),
** method "auto" and method "distorted" side by side, each value against
** its neighbours: with d_i = ln(v_{i+1}/v_i) the step anomaly is
** |d_i - (d_{i-1} + d_{i+1})/2|, the part of a step the smooth trend of
** the two next to it does not explain (a jump of 5 % shows as about
** 0.05; smooth physics on this grid as < 1e-2).  Not part of make check.
** See Copyright Notice in LICENSE
**
**   build/continuity [-n points_per_decade] [-t Tmax_MeV] [-y ny]
**                    [-a] [-s i/N] [-l limit] [-e]
**
** -y ny: along y instead: ny points of y = k/T at one T per decade (1 keV
**        ... Tmax), half log-spaced in y from 1e-4 to 1/2, half in 1 - y
**        from 1/2 to 1e-4.
** -a:    method "auto" only (not "distorted" beside it).
** -s i/N: only the i-th of N shards of the (beam, y) or (beam, T) rows
**        (i = 1..N), for several processes or a cluster.
** -l:    the anomaly above which a row counts as a step (default 0.05);
**        the exit status is 1 when any "auto" row has one.
** -e: instead, the radiative energy loss of e- and e+ in C, Cu, W, Pb and U by method
** "auto" along T (4 points per decade from 1 keV to Tmax): it must rise
** with T; prints each value and the number of falls.
**
** The grid of issue 12 (100 per decade from 1 keV to 1 PeV, 400 in y) is
** `make continuity-full` (hours on one core: below the high-energy switch
** a point costs 20-50 ms).
*/

#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <unistd.h>

#include "brakelight.h"

#define NMAX 2000
#define YMAX 2000

typedef struct beam { const char *particle; int Z; } beam;

static double value (const char *particle, int Z, double T, double y,
                     int method, bl_quad *q) {
  bl_case c;
  bl_he h;
  bl_result r;
  int st;
  if (bl_case_setup(&c, bl_particle_find(particle), Z,
                    bl_model_find("hartree-fock"), NULL, T,
                    &bl_opts_default) != BL_SUCCESS)
    return NAN;
  if (bl_method_prepare(&c, method, q, &h) != BL_SUCCESS)
    return NAN;
  st = bl_method_dk_e(&c, &h, method, y * T, q, &r);
  bl_he_release(&h);
  return st == BL_SUCCESS || bl_status_soft(st) ? r.val : NAN;
}

/* Radiative energy loss per atom (MeV mb) of `particle` in element Z at T
** by method "auto" with the module's defaults. */
static double eloss (const char *particle, const char *target, double T,
                     bl_quad *q) {
  static bl_target t;
  bl_material m;
  bl_tresult r;
  int failZ, st;
  if (bl_material_lookup(&m, target, NULL) != BL_SUCCESS
      || bl_target_setup(&t, bl_particle_find(particle), &m,
                         bl_model_find("hartree-fock"), NULL, T,
                         &bl_opts_default, BL_METHOD_AUTO, NULL,
                         &failZ) != BL_SUCCESS
      || bl_target_prepare(&t, q, &failZ) != BL_SUCCESS)
    return NAN;
  st = bl_target_energy_loss_e(&t, q, &r);
  if (st != BL_SUCCESS && !bl_status_soft(st))
    r.r.val = NAN;
  bl_target_release(&t);
  return r.r.val;
}


static int monotonic (double tmax, bl_quad *q) {
  static const char *const ps[] = {"electron", "positron"};
  static const char *const ts[] = {"C", "Cu", "W", "Pb", "U"};
  int ip, it, i, falls = 0;
  for (it = 0; it < 5; it++)
    for (ip = 0; ip < 2; ip++) {
      double prev = 0.0;
      for (i = 0; ; i++) {
        double T = 1e-3 * pow(10.0, i / 4.0), v;
        if (T > tmax * (1.0 + 1e-9))
          break;
        v = eloss(ps[ip], ts[it], T, q);
        printf("  %-9s %-2s T = %10.4g MeV  energy loss %.6e MeV mb%s\n",
               ps[ip], ts[it], T, v, i > 0 && !(v > prev) ? "  FALLS" : "");
        if (i > 0 && !(v > prev))
          falls++;
        prev = v;
        fflush(stdout);
      }
    }
  printf("# %d falls\n", falls);
  return falls > 0;
}


/* The largest step anomaly of v[0..n-1] and its index. */
static double anomaly (const double *v, int n, int *at) {
  double worst = 0.0;
  int i;
  *at = -1;
  for (i = 1; i + 2 < n; i++) {
    double dm = log(v[i] / v[i - 1]), d = log(v[i + 1] / v[i]);
    double dp = log(v[i + 2] / v[i + 1]), a = fabs(d - 0.5 * (dm + dp));
    if (isfinite(a) && a > worst) {
      worst = a;
      *at = i;
    }
  }
  return worst;
}

/* ny values of y: half log-spaced in y from 1e-4 to 1/2, half in 1 - y. */
static int ygrid (double *y, int ny) {
  int h = ny / 2, i, n = 0;
  for (i = 0; i < h; i++)
    y[n++] = 1e-4 * pow(0.5 / 1e-4, (double)i / h);
  for (i = 0; i < ny - h; i++)
    y[n++] = 1.0 - 0.5 * pow(1e-4 / 0.5, (double)i / (ny - h - 1 > 0
                                                      ? ny - h - 1 : 1));
  return n;
}

int main (int argc, char **argv) {
  static const beam beams[] = {
    {"electron", 6}, {"electron", 29}, {"electron", 74}, {"electron", 82},
    {"electron", 92}, {"positron", 6}, {"positron", 29}, {"positron", 74},
    {"positron", 82}, {"positron", 92}, {"muon", 26}, {"muon", 82}
  };
  static const double ys4[] = {0.3, 0.7, 0.95, 0.99};
  static const int methods[] = {BL_METHOD_AUTO, BL_METHOD_DISTORTED};
  static double T[NMAX], v[NMAX], ys[YMAX];
  double perdec = 10.0, tmax = 1e4, limit = 0.05, worst_all = 0.0;
  int eonly = 0, ny = 0, nmeth = 2, shard = 1, nshards = 1, row = 0;
  int steps = 0, nrows, nts;
  bl_quad *q = bl_quad_alloc(200);
  size_t ib;
  int opt, n, i, iy, im;
  while ((opt = getopt(argc, argv, "n:t:y:as:l:e")) != -1) {
    if (opt == 'n')
      perdec = atof(optarg);
    else if (opt == 't')
      tmax = atof(optarg);
    else if (opt == 'y')
      ny = atoi(optarg);
    else if (opt == 'a')
      nmeth = 1;
    else if (opt == 's') {
      if (sscanf(optarg, "%d/%d", &shard, &nshards) != 2 || nshards < 1
          || shard < 1 || shard > nshards) {
        fprintf(stderr, "continuity: -s wants i/N with 1 <= i <= N, got "
                "'%s'\n", optarg);
        return 2;
      }
    }
    else if (opt == 'l')
      limit = atof(optarg);
    else if (opt == 'e')
      eonly = 1;
    else {
      fprintf(stderr, "usage: continuity [-n per_decade] [-t Tmax_MeV] "
              "[-y ny] [-a] [-s i/N] [-l limit] [-e]\n");
      return 2;
    }
  }
  if (q == NULL || bl_quad_set_rtol(q, 1e-4) != BL_SUCCESS || perdec < 2
      || ny < 0 || ny > YMAX || (ny > 0 && ny < 4))
    return 1;
  if (eonly) {
    bl_quad_set_rtol(q, 1e-3);
    return monotonic(tmax, q);
  }
  if (ny > 0) {
    nrows = ygrid(ys, ny);
    nts = (int)floor(log10(tmax / 1e-3) + 1e-9) + 1;   /* one T per decade */
    printf("# step anomaly along y (%d points, 1e-4 .. 1 - 1e-4) at one T "
           "per decade (1 keV .. %g MeV): largest, at y\n", nrows, tmax);
  }
  else {
    nrows = 4;
    nts = 0;
    for (i = 0; i < 4; i++)
      ys[i] = ys4[i];
    printf("# step anomaly along T (1 keV .. %g MeV, %g per decade): "
           "largest, at T (MeV)\n", tmax, perdec);
  }
  printf("# %-9s %3s %10s  %-24s %-24s\n", "particle", "Z",
         ny > 0 ? "T" : "y", "auto", nmeth > 1 ? "distorted" : "");
  for (ib = 0; ib < sizeof beams / sizeof beams[0]; ib++)
    for (iy = 0; iy < (ny > 0 ? nts : nrows); iy++) {
      char col[2][64] = {"", ""};
      if (row++ % nshards != shard - 1)
        continue;
      for (im = 0; im < nmeth; im++) {
        double worst;
        int at;
        n = 0;
        if (ny > 0) {   /* along y at T = 1 keV 10^iy */
          double t = 1e-3 * pow(10.0, iy);
          for (i = 0; i < nrows; i++) {
            T[n] = ys[i];
            v[n++] = value(beams[ib].particle, beams[ib].Z, t, ys[i],
                           methods[im], q);
          }
        }
        else
          for (i = 0; n < NMAX; i++) {
            double t = 1e-3 * pow(10.0, i / perdec);
            if (t > tmax * (1.0 + 1e-9))
              break;
            T[n] = t;
            v[n++] = value(beams[ib].particle, beams[ib].Z, t, ys[iy],
                           methods[im], q);
          }
        worst = anomaly(v, n, &at);
        if (im == 0) {
          worst_all = fmax(worst_all, worst);
          steps += worst > limit;
        }
        snprintf(col[im], sizeof col[im], "%.3g at %.6g%s", worst,
                 at >= 0 ? T[at] : 0.0, worst > limit ? " STEP" : "");
      }
      printf("  %-9s %3d %10.4g  %-24s %-24s\n", beams[ib].particle,
             beams[ib].Z, ny > 0 ? 1e-3 * pow(10.0, iy) : ys[iy], col[0],
             col[1]);
      fflush(stdout);
    }
  printf("# auto: largest anomaly %.3g; %d rows above %g\n", worst_all,
         steps, limit);
  bl_quad_free(q);
  return steps > 0;
}
