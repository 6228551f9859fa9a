/*
** bench_he.c -- evaluations per second of the high-energy dsigma/dk after
** its tables are cached (`make bench`); never a test.
** See Copyright Notice in LICENSE
**
** Usage: bench_he [-n N]   (N evaluations per target, default 1e6)
** For electrons at 100 GeV on C, Cu and Pb (Hartree-Fock screening, atomic
** electrons, uniform nucleus, the module's defaults), prepares the case
** (building the cached tables: timed separately), then evaluates N points
** on a log grid of k from 1e-4 T to 0.99 T and prints the rate against
** the target of 1e6 evaluations per second.  Then the first high-energy
** call of several projectiles with the cache cleared (target 20 ms), and
** the cost of a re-prepare once the tables are cached.
*/

#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <time.h>
#include <math.h>

#include <gsl/gsl_errno.h>

#include "brakelight.h"

#include "bench_util.h"

#define TARGET 1e6   /* evaluations per second */



int main (int argc, char **argv) {
  static const int Zs[] = {6, 29, 82};
  long n = 1000000, i;
  int j, missed = 0;
  bl_quad *q = bl_quad_alloc(1000);
  if (argc == 3 && strcmp(argv[1], "-n") == 0)
    n = atol(argv[2]);
  if (q == NULL || n < 1) {
    fprintf(stderr, "usage: bench_he [-n N]\n");
    return 2;
  }
  gsl_set_error_handler_off();
  printf("high-energy dsigma/dk, electrons at 100 GeV, hartree-fock, "
         "electrons, uniform nucleus\n");
  printf("%4s %12s %14s %12s %8s\n", "Z", "prepare[ms]", "evals/s",
         "checksum", "target");
  for (j = 0; j < 3; j++) {
    bl_case c;
    bl_he h;
    double T = 1e5, t0, t1, t2, sum = 0.0, rate;
    bl_case_setup(&c, bl_particle_find("electron"), Zs[j],
                  bl_model_find("hartree-fock"), NULL, T, &bl_opts_default);
    t0 = now();
    if (bl_he_prepare(&c, q, &h) != BL_SUCCESS) {
      printf("%4d: cannot prepare\n", Zs[j]);
      missed = 1;
      continue;
    }
    t1 = now();
    for (i = 0; i < n; i++) {
      bl_result r;
      double k = T * 1e-4 * pow(0.99e4, (double)(i % 1000) / 999.0);
      bl_he_dk_e(&c, &h, k, &r);
      sum += r.val;
    }
    t2 = now();
    bl_he_release(&h);
    rate = n / (t2 - t1);
    printf("%4d %12.2f %14.3g %12.6g %8s\n", Zs[j], 1e3 * (t1 - t0), rate,
           sum / n, rate >= TARGET ? "met" : "MISSED");
    if (rate < TARGET)
      missed = 1;
  }
  /* first calls: the cache cleared, then prepare + one dsigma/dk, for
  ** projectiles whose nuclear-size correction was calibrated on first use
  ** before issue 14 (0.6 s for a muon on Pb at 1 TeV); target 20 ms */
  printf("\nfirst high-energy call (cache cleared: screening tables built; "
         "prepare + one dsigma/dk at y = 0.5)\n");
  printf("%-22s %4s %10s %12s %8s\n", "projectile", "Z", "T [MeV]",
         "first [ms]", "target");
  {
    static const struct { const char *name; double mass, spin; int Z;
                          double T; } fc[] = {
      {"muon", 105.6583755, 0.5, 82, 1e6}, {"pion", 139.57039, 0.0, 82, 1e6},
      {"electron", 0.51099895, 0.5, 1, 1e5},
      {"10 GeV spin 1/2", 1e4, 0.5, 92, 1e8},
      {"1 TeV spin 0", 1e6, 0.0, 26, 1e12}
    };
    for (j = 0; j < 5; j++) {
      bl_particle p = {"probe", 0.0, -1.0, 0.0, 0u};
      bl_case c;
      bl_he h;
      bl_result r;
      double t0, t1, t2;
      int k;
      p.mass = fc[j].mass;
      p.spin = fc[j].spin;
      bl_method_cache_clear();
      bl_case_setup(&c, &p, fc[j].Z, bl_model_find("hartree-fock"), NULL,
                    fc[j].T, &bl_opts_default);
      t0 = now();
      if (bl_he_prepare(&c, q, &h) != BL_SUCCESS
          || bl_he_dk_e(&c, &h, 0.5 * c.T, &r) != BL_SUCCESS) {
        printf("%-22s: failed\n", fc[j].name);
        missed = 1;
        continue;
      }
      t1 = now();
      bl_he_release(&h);
      for (k = 0; k < 1000; k++) {   /* a re-prepare, the tables cached */
        bl_he_prepare(&c, q, &h);
        bl_he_release(&h);
      }
      t2 = now();
      printf("%-22s %4d %10.3g %12.2f %8s   re-prepare %.2f us\n",
             fc[j].name, fc[j].Z, fc[j].T, 1e3 * (t1 - t0),
             t1 - t0 <= 20e-3 ? "met" : "MISSED", 1e3 * (t2 - t1));
      if (t1 - t0 > 20e-3)
        missed = 1;
    }
  }
  bl_quad_free(q);
  printf("%s\n", missed ? "bench_he: target missed (reported, not a failure)"
                        : "bench_he: target met");
  return 0;
}
