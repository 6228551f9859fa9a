/*
** bench_dw.c -- time of one distorted-wave dsigma/dk (`make bench`):
** electrons and positrons on Cu and Pb with the defaults of the module
** (Hartree-Fock screening, atomic electrons, uniform nucleus), T = 10 keV
** ... 1 GeV, y = 0.1, 0.5, 0.9, at rtol 1e-3; the median per point
** against the 20 ms target, and the ratio to the Born integral of the
** same point measured in the same run.  Never a test.
** See Copyright Notice in LICENSE
*/

#include <stdio.h>
#include <stdlib.h>
#include <time.h>

#include "brakelight.h"

#include "bench_util.h"

int main (void) {
  static const char *const parts[] = {"electron", "positron"};
  static const int Zs[] = {29, 82};
  static const double Ts[] = {0.01, 0.1, 1.0, 10.0, 100.0, 1000.0};
  static const double ys[] = {0.1, 0.5, 0.9};
  double tdw[72], ratio[72];
  bl_quad *q = bl_quad_alloc(200);
  size_t ip, iz, it, iy;
  int n = 0;
  if (q == NULL || bl_quad_set_rtol(q, 1e-3) != BL_SUCCESS)
    return 1;
  printf("%-9s %3s %7s %5s %10s %10s %8s %9s\n", "particle", "Z", "T/MeV",
         "y", "dw ms", "born ms", "dw/born", "calls");
  for (ip = 0; ip < 2; ip++)
    for (iz = 0; iz < 2; iz++)
      for (it = 0; it < 6; it++)
        for (iy = 0; iy < 3; iy++) {
          bl_case c;
          bl_result r;
          double k = ys[iy] * Ts[it], t0, t1, t2;
          unsigned long c0;
          if (bl_case_setup(&c, bl_particle_find(parts[ip]), Zs[iz],
                            bl_model_find("hartree-fock"), NULL, Ts[it],
                            &bl_opts_default) != BL_SUCCESS)
            return 1;
          c0 = bl_quad_calls(q);
          t0 = now();
          bl_method_dk_e(&c, NULL, BL_METHOD_DISTORTED, k, q, &r);
          t1 = now();
          bl_method_dk_e(&c, NULL, BL_METHOD_BORN, k, q, &r);
          t2 = now();
          tdw[n] = 1e3 * (t1 - t0);
          ratio[n] = (t1 - t0) / (t2 - t1);
          printf("%-9s %3d %7g %5g %10.2f %10.2f %8.1f %9lu\n", parts[ip],
                 Zs[iz], Ts[it], ys[iy], tdw[n], 1e3 * (t2 - t1), ratio[n],
                 bl_quad_calls(q) - c0);
          n++;
        }
  qsort(tdw, (size_t)n, sizeof tdw[0], cmp);
  qsort(ratio, (size_t)n, sizeof ratio[0], cmp);
  printf("median distorted dsigma/dk: %.1f ms (target 20 ms: %s); "
         "median time ratio distorted/born %.1f, range %.1f-%.1f\n",
         tdw[n / 2], tdw[n / 2] <= 20.0 ? "met" : "missed", ratio[n / 2],
         ratio[0], ratio[n - 1]);
  bl_quad_free(q);
  return 0;
}
