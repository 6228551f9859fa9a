/*
** bench_pwradial.c -- CPU time of bl_pw_radial (partial/radial.c) per
** kappa: Au (Thomas-Fermi screening, R = 7 fm), 2e4 grid points up to
** rc (tol 1e-12), best of 5 calls (make bench-pwradial)
** See Copyright Notice in LICENSE
**
** usage: bench_pwradial [E [mass_MeV]]   (E in units of m c^2; default
** the table of DEVELOPERS.md, "Partial waves: radial functions")
*/

#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <time.h>

#include <gsl/gsl_errno.h>

#include "brakelight.h"
#include "partial/internal.h"

static double cpu (void) {
  struct timespec t;
  clock_gettime(CLOCK_THREAD_CPUTIME_ID, &t);
  return t.tv_sec + 1e-9 * t.tv_nsec;
}

/* One row per kappa at energy E for mass m; 0 or the first failure. */
static int run (double E, double m) {
  const int ks[] = {-1, 1, -5, 20, -200, 2000};
  const bl_model *mod = bl_model_find("thomas-fermi");
  enum { N = 20000 };
  static double r[N], P[N], Q[N];
  double par[8];
  bl_yukawa y;
  bl_pwpot v;
  size_t j;
  int i, st;
  bl_model_defaults(mod, par);
  if (mod->yukawa(79, par, &y) != BL_SUCCESS)
    return 1;
  st = bl_pwpot_init(&v, -79.0 * BL_ALPHA, &y, m, 7.0, 1e-12);
  if (st != BL_SUCCESS)
    return st;
  for (i = 0; i < N; i++)
    r[i] = v.rc * (i + 1.0) / N;
  printf("E = %g, m = %g MeV: rc = %.6g hbar/(m c), x_c = p rc = %.6g\n", E,
         m, v.rc, v.rc * sqrt(E * E - 1.0));
  for (j = 0; j < sizeof ks / sizeof ks[0]; j++) {
    double best = HUGE_VAL, d = 0.0;
    int rep;
    for (rep = 0; rep < 5; rep++) {
      double t0 = cpu();
      st = bl_pw_radial(&v, E, ks[j], N, r, P, Q, &d);
      if (st != BL_SUCCESS)
        return st;
      best = fmin(best, cpu() - t0);
    }
    printf("  kappa %5d  delta %+.12f  %8.2f ms\n", ks[j], d, 1e3 * best);
  }
  return 0;
}

int main (int argc, char **argv) {
  int st = 0;
  gsl_set_error_handler_off();
  if (argc > 1)
    st = run(atof(argv[1]), argc > 2 ? atof(argv[2]) : BL_ME_MEV);
  else {
    st = run(1.02, BL_ME_MEV);
    if (st == 0) st = run(3.0, BL_ME_MEV);
    if (st == 0) st = run(40.0, BL_ME_MEV);
    if (st == 0) st = run(3.0, BL_MMU_MEV);
  }
  if (st != 0)
    fprintf(stderr, "bench_pwradial: status %d (%s)\n", st, bl_strerror(st));
  return st != 0;
}
