/*
** dw-positron-ratio.c -- the positron/electron ratio of the radiative
** energy loss (field of the nucleus, atomic electrons off) by the
** distorted-wave method, against the parametrization of Kim, Pratt,
** Seltzer & Berger (1986, Phys. Rev. A 33, 3002; coefficients from memory:
** tests/ref/kim1986.c).  `make dw-positron` builds and runs it; not part
** of make check (about 20 s).
** See Copyright Notice in LICENSE
**
** int_0^T k dsigma/dk dk by 16-point Gauss-Legendre in x with
** y = 1 - (1 - x)^2 (points gather at the tip), for both charge signs;
** Hartree-Fock screening, uniform nucleus, no atomic electrons.
*/

#include <math.h>
#include <stdio.h>

#include <gsl/gsl_integration.h>

#include "brakelight.h"
#include "distorted/internal.h"
#include "kim1986.h"

#define NPT 16

static double loss (const char *particle, int Z, double T, bl_quad *q,
                    const gsl_integration_glfixed_table *gl) {
  bl_opts o = bl_opts_default;
  bl_case c;
  double s = 0.0;
  int n;
  o.electrons = 0;
  o.elwert = o.coulomb = BL_APPLY_OFF;
  if (bl_case_setup(&c, bl_particle_find(particle), Z,
                    bl_model_find("hartree-fock"), NULL, T, &o) != BL_SUCCESS)
    return NAN;
  for (n = 0; n < NPT; n++) {
    double x, w, y, jac;
    bl_result r;
    gsl_integration_glfixed_point(0.0, 1.0, (size_t)n, &x, &w, gl);
    y = 1.0 - (1.0 - x) * (1.0 - x);
    jac = 2.0 * (1.0 - x);
    if (bl_dw_dk_e(&c, y * T, q, &r) != BL_SUCCESS && r.val == 0.0)
      return NAN;
    s += w * jac * y * T * r.val;
  }
  return s;
}

int main (void) {
  static const int Zs[] = {6, 13, 29, 50, 79, 92};
  static const double Ts[] = {0.01, 0.1, 1.0, 10.0, 50.0};
  gsl_integration_glfixed_table *gl = gsl_integration_glfixed_table_alloc(NPT);
  bl_quad *q = bl_quad_alloc(200);
  size_t i, j;
  if (gl == NULL || q == NULL || bl_quad_set_rtol(q, 1e-3) != BL_SUCCESS)
    return 1;
  printf("# e+/e- radiative energy loss, method distorted, against Kim et al. "
         "1986 (from memory)\n");
  printf("# %3s %8s %9s %9s %9s\n", "Z", "T/MeV", "distorted", "Kim", "ratio");
  for (i = 0; i < sizeof Zs / sizeof Zs[0]; i++)
    for (j = 0; j < sizeof Ts / sizeof Ts[0]; j++) {
      double pos = loss("positron", Zs[i], Ts[j], q, gl);
      double ele = loss("electron", Zs[i], Ts[j], q, gl);
      double kim = kim1986_ratio(Zs[i], Ts[j]);
      printf("  %3d %8g %9.4f %9.4f %9.3f\n", Zs[i], Ts[j], pos / ele, kim,
             pos / ele / kim);
    }
  bl_quad_free(q);
  gsl_integration_glfixed_table_free(gl);
  return 0;
}
