/*
** bench_ebrems.c -- cost of one electron-target dsigma/dk point
** (bl_ebrems_dk_e, src/core/ebrems/) at rtol 1e-3, as a ratio against one
** nuclear Born dsigma/dk point (bl_dcs_dk_e, hydrogen, Hartree-Fock
** screening, the module's defaults) of the same projectile, T and k,
** measured side by side in this run (`make bench`).  Electrons 10 keV ...
** 100 MeV, a positron at 1 MeV, muons at 1 and 100 GeV, k = 0.1, 0.5, 0.9 of the electron-target
** end point.  Never a test.
** See Copyright Notice in LICENSE
*/

#include <stdio.h>
#include <stdlib.h>
#include <time.h>

#include "brakelight.h"

#include "bench_util.h"

int main (void) {
  static const struct { const char *name; double T; } pts[] = {
    {"electron", 0.01}, {"electron", 0.1}, {"electron", 1.0},
    {"electron", 10.0}, {"electron", 100.0}, {"positron", 1.0},
    {"muon", 1000.0}, {"muon", 1e5}};
  static const double ys[] = {0.1, 0.5, 0.9};
  double ratio[24], tee[24];
  bl_quad *q = bl_quad_alloc(200);
  size_t ip, iy;
  int n = 0;
  if (q == NULL || bl_quad_set_rtol(q, 1e-3) != BL_SUCCESS)
    return 1;
  printf("%-9s %8s %5s %12s %10s %10s %9s %9s\n", "particle", "T/MeV",
         "k/kmax", "e-term mb/MeV", "e ms", "born ms", "e/born", "e calls");
  for (ip = 0; ip < sizeof pts / sizeof pts[0]; ip++)
    for (iy = 0; iy < 3; iy++) {
      const bl_particle *p = bl_particle_find(pts[ip].name);
      bl_ebrems e;
      bl_case c;
      bl_result r, rb;
      double k, t0, t1, t2;
      unsigned long c0, c1;
      if (bl_ebrems_init(&e, p, pts[ip].T) != BL_SUCCESS
          || bl_case_setup(&c, p, 1, bl_model_find("hartree-fock"), NULL,
                           pts[ip].T, &bl_opts_default) != BL_SUCCESS)
        return 1;
      k = ys[iy] * bl_ebrems_kmax(&e);
      c0 = bl_quad_calls(q);
      t0 = now();
      bl_ebrems_dk_e(&e, k, q, &r);
      t1 = now();
      c1 = bl_quad_calls(q);
      bl_dcs_dk_e(&c, k, q, &rb);
      t2 = now();
      tee[n] = 1e3 * (t1 - t0);
      ratio[n] = (t1 - t0) / (t2 - t1);
      printf("%-9s %8g %5g %12.5e %10.2f %10.2f %9.1f %9lu%s\n",
             pts[ip].name, pts[ip].T, ys[iy], r.val, tee[n], 1e3 * (t2 - t1),
             ratio[n], c1 - c0, r.warn & BL_WARN_TOLERANCE ? " (tol)" : "");
      n++;
    }
  qsort(tee, (size_t)n, sizeof tee[0], cmp);
  qsort(ratio, (size_t)n, sizeof ratio[0], cmp);
  printf("median electron-term dsigma/dk at rtol 1e-3: %.1f ms; median time "
         "ratio electron-term/nuclear Born %.1f, range %.1f-%.1f (issue 13 "
         "target: <= 1: %s)\n", tee[n / 2], ratio[n / 2], ratio[0],
         ratio[n - 1], ratio[n / 2] <= 1.0 ? "met" : "missed");
  bl_quad_free(q);
  return 0;
}
