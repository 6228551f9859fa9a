/*
** $Id: bench_dsdk.c $
** bench_dsdk.c -- timing of dsigma/dk points of the brakelight core
** See Copyright Notice in LICENSE
**
** Built and run by scripts/bench.sh (`make bench`); not a test.
**
**   bench_dsdk [-r RTOL]            the grid: electrons on Pb, exponential
**                                   screening, spin 0 and 1/2, T = 1 MeV
**                                   ... 1 TeV, y = 0.1, 0.5, 0.9
**   bench_dsdk [-r RTOL] -p T:y ... single points (spin 1/2, Pb), one
**                                   machine-readable line each:
**                                   "T y dsdk err seconds calls status"
**   bench_dsdk [-r RTOL] -a         real atoms: Hartree-Fock and
**                                   Thomas-Fermi screening with the atomic
**                                   electrons and the uniform nucleus, C, Cu,
**                                   Pb at 10 MeV and 10 GeV (3 ms target)
*/

#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <time.h>

#include <gsl/gsl_errno.h>

#include "brakelight.h"

#include "bench_util.h"

#define TARGET_S   2e-3    /* goal per dsigma/dk point (issue 2, section 8) */
#define BUDGET_S   0.5     /* wall time spent repeating one point, at most */
#define MAXREPS    21
#define PB         82

static const double grid_T[] = {1, 10, 100, 1e4, 1e6};   /* MeV */
static const double grid_y[] = {0.1, 0.5, 0.9};
#define NT (sizeof grid_T / sizeof grid_T[0])
#define NY (sizeof grid_y / sizeof grid_y[0])


/*
** Monotonic wall clock, seconds.
*/

static int cmpdouble (const void *a, const void *b) {
  double x = *(const double *)a, y = *(const double *)b;
  return (x > y) - (x < y);
}


/*
** Median of t[0..n-1] (sorts t).
*/
static double median (double *t, int n) {
  qsort(t, n, sizeof *t, cmpdouble);
  return n % 2 ? t[n / 2] : 0.5 * (t[n / 2 - 1] + t[n / 2]);
}


/*
** One timed point: evaluate dsigma/dk at k = y T repeatedly (at least 3
** times, at most MAXREPS, stopping once BUDGET_S is spent; a single time if
** one evaluation alone exceeds the budget).  Fills the result of the last
** evaluation, its integrand call count, the number of repetitions and the
** median wall time; returns the status of the last evaluation.
*/
static int timepoint (const bl_case *c, double y, bl_quad *q, bl_result *r,
                      unsigned long *calls, int *reps, double *tmed) {
  double t[MAXREPS], spent = 0;
  int n = 0, st = BL_SUCCESS;
  do {
    double t1 = now();
    bl_quad_reset_calls(q);
    st = bl_dcs_dk_e(c, y * c->T, q, r);
    t[n] = now() - t1;
    spent += t[n++];
  } while (n < MAXREPS && (n < 3 || spent < BUDGET_S) && spent < 3 * BUDGET_S
           && !(n == 1 && spent > BUDGET_S));
  *calls = bl_quad_calls(q);
  *reps = n;
  *tmed = median(t, n);
  return st;
}


/*
** The grid: one line per point, then a summary.
*/
static int run_grid (bl_quad *q) {
  const bl_model *scr = bl_model_find("exponential");
  const bl_particle *el = bl_particle_find("electron");
  bl_particle spin0;
  double all[2 * NT * NY];
  int nall = 0, nmet = 0, nfail = 0, s;
  size_t i, j;
  if (scr == NULL || el == NULL) {
    fprintf(stderr, "bench_dsdk: electron or exponential screening not found\n");
    return 1;
  }
  spin0 = *el;
  spin0.name = "electron, spin 0";
  spin0.spin = 0;
  printf("dsigma/dk of electrons on Pb (Z = %d), exponential screening, "
         "rtol %.0e\n", PB, bl_quad_rtol(q));
  printf("target %.0f ms per point; time = median wall time of the repetitions\n\n",
         1e3 * TARGET_S);
  printf("%4s %9s %5s %14s %9s %10s %4s %10s  %s\n", "spin", "T [MeV]", "y",
         "dsdk [mb/MeV]", "rel.err", "calls", "reps", "time [ms]", "target");
  for (s = 0; s < 2; s++) {
    const bl_particle *p = s == 0 ? &spin0 : el;
    for (i = 0; i < NT; i++) {
      bl_case c;
      int st = bl_case_init(&c, p, PB, scr, NULL, grid_T[i]);
      if (st != BL_SUCCESS) {
        printf("%4s %9g  case not set up: %s\n", s == 0 ? "0" : "1/2",
               grid_T[i], bl_strerror(st));
        nfail++;
        continue;
      }
      for (j = 0; j < NY; j++) {
        bl_result r;
        unsigned long calls;
        int reps;
        double tmed;
        st = timepoint(&c, grid_y[j], q, &r, &calls, &reps, &tmed);
        all[nall++] = tmed;
        nmet += tmed <= TARGET_S;
        printf("%4s %9g %5.2f %14.6e %9.1e %10lu %4d %10.3f  %s%s%s\n",
               s == 0 ? "0" : "1/2", grid_T[i], grid_y[j], r.val,
               r.val != 0 ? r.err / r.val : r.err, calls, reps, 1e3 * tmed,
               tmed <= TARGET_S ? "met" : "MISSED",
               st != BL_SUCCESS ? "  status: " : "",
               st != BL_SUCCESS ? bl_strerror(st) : "");
        fflush(stdout);
        if (st != BL_SUCCESS)
          nfail++;
      }
    }
  }
  if (nall > 0) {
    double tm = median(all, nall);  /* sorts all[]: the last is the slowest */
    printf("\nsummary: %d points, median %.3f ms, slowest %.3f ms; "
           "%d of %d within %.0f ms; %d with a non-zero status\n",
           nall, 1e3 * tm, 1e3 * all[nall - 1], nmet, nall, 1e3 * TARGET_S,
           nfail);
  }
  return 0;
}


/*
** Real atoms (issue 3): screening with the atomic electrons' field and the
** uniform nucleus (the Lua defaults), electrons on C, Cu and Pb at
** T = 10 MeV and 10 GeV, against ATOMS_TARGET_S per point.
*/
#define ATOMS_TARGET_S 3e-3
static int run_atoms (bl_quad *q) {
  static const char *const models[] = {"hartree-fock", "thomas-fermi"};
  static const int Zs[] = {6, 29, 82};
  static const double Ts[] = {10.0, 1e4};
  const bl_particle *el = bl_particle_find("electron");
  double all[64];
  int nall = 0, nmet = 0;
  size_t im, iz, it, j;
  printf("\ndsigma/dk of electrons with the atomic electrons and the uniform "
         "nucleus, rtol %.0e; target %.0f ms per point\n\n", bl_quad_rtol(q),
         1e3 * ATOMS_TARGET_S);
  printf("%-13s %3s %9s %5s %14s %9s %10s %10s  %s\n", "screening", "Z",
         "T [MeV]", "y", "dsdk [mb/MeV]", "rel.err", "calls", "time [ms]",
         "target");
  for (im = 0; im < 2; im++) {
    const bl_model *scr = bl_model_find(models[im]);
    if (scr == NULL) {
      printf("%-13s not registered: skipped\n", models[im]);
      continue;
    }
    for (iz = 0; iz < 3; iz++)
      for (it = 0; it < 2; it++) {
        bl_case c;
        int st = bl_case_setup(&c, el, Zs[iz], scr, NULL, Ts[it],
                               &bl_opts_default);
        if (st != BL_SUCCESS) {
          printf("%-13s %3d case not set up: %s\n", models[im], Zs[iz],
                 bl_strerror(st));
          continue;
        }
        for (j = 0; j < NY; j++) {
          bl_result r;
          unsigned long calls;
          int reps;
          double tmed;
          st = timepoint(&c, grid_y[j], q, &r, &calls, &reps, &tmed);
          if (im == 0 && nall < 64) {
            all[nall++] = tmed;
            nmet += tmed <= ATOMS_TARGET_S;
          }
          printf("%-13s %3d %9g %5.2f %14.6e %9.1e %10lu %10.3f  %s%s%s\n",
                 models[im], Zs[iz], Ts[it], grid_y[j], r.val,
                 r.val != 0 ? r.err / r.val : r.err, calls, 1e3 * tmed,
                 tmed <= ATOMS_TARGET_S ? "met" : "MISSED",
                 st != BL_SUCCESS ? "  status: " : "",
                 st != BL_SUCCESS ? bl_strerror(st) : "");
          fflush(stdout);
        }
      }
  }
  if (nall > 0) {
    double tm = median(all, nall);
    printf("\nsummary (hartree-fock): %d points, median %.3f ms, slowest "
           "%.3f ms; %d of %d within %.0f ms\n", nall, 1e3 * tm,
           1e3 * all[nall - 1], nmet, nall, 1e3 * ATOMS_TARGET_S);
  }
  return 0;
}


/*
** Single points "T:y" for the comparison with the SciPy version.
*/
static int run_points (bl_quad *q, char **pts, int n) {
  const bl_model *scr = bl_model_find("exponential");
  const bl_particle *el = bl_particle_find("electron");
  int i;
  if (scr == NULL || el == NULL)
    return 1;
  for (i = 0; i < n; i++) {
    double T, y, tmed;
    bl_case c;
    bl_result r;
    unsigned long calls;
    int reps, st;
    if (sscanf(pts[i], "%lf:%lf", &T, &y) != 2) {
      fprintf(stderr, "bench_dsdk: bad point '%s' (want T:y)\n", pts[i]);
      return 1;
    }
    st = bl_case_init(&c, el, PB, scr, NULL, T);
    if (st == BL_SUCCESS)
      st = timepoint(&c, y, q, &r, &calls, &reps, &tmed);
    if (st != BL_SUCCESS && st != GSL_EMAXITER && st != GSL_EROUND) {
      printf("%g %g nan nan nan 0 %d\n", T, y, st);
      continue;
    }
    printf("%g %g %.10e %.3e %.6f %lu %d\n", T, y, r.val, r.err, tmed, calls, st);
  }
  return 0;
}


int main (int argc, char **argv) {
  double rtol = 1e-4;
  int i = 1, rc;
  bl_quad *q;
  gsl_set_error_handler_off();
  if (i + 1 < argc && strcmp(argv[i], "-r") == 0) {
    rtol = atof(argv[i + 1]);
    i += 2;
  }
  q = bl_quad_alloc(1000);
  if (q == NULL || bl_quad_set_rtol(q, rtol) != BL_SUCCESS) {
    fprintf(stderr, "bench_dsdk: cannot set up the workspace (rtol %g)\n", rtol);
    bl_quad_free(q);
    return 1;
  }
  if (i < argc && strcmp(argv[i], "-p") == 0)
    rc = run_points(q, argv + i + 1, argc - i - 1);
  else if (i < argc && strcmp(argv[i], "-a") == 0)
    rc = run_atoms(q);
  else if (i < argc) {
    fprintf(stderr, "usage: bench_dsdk [-r RTOL] [-a | -p T:y ...]\n");
    rc = 1;
  }
  else
    rc = run_grid(q);
  bl_quad_free(q);
  return rc;
}
