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
**
** With -p TMAX it also computes the same ratio by the exact partial waves
** (src/core/partial/dsdk.c, rtol 1e-3) for T <= TMAX MeV, in the same
** field (the Yukawa form of the Hartree-Fock fit and the uniform nucleus of
** the case): about 10 minutes per atom at 1 MeV on Au.  -Z Z: that atom
** only (one of 6, 13, 29, 50, 79, 92).
*/

#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include <gsl/gsl_integration.h>

#include "brakelight.h"
#include "distorted/internal.h"
#include "partial/dsdk.h"
#include "kim1986.h"

#ifndef NPT
#define NPT 16
#endif

static double loss (const char *particle, int Z, double T, bl_quad *q,
                    const gsl_integration_glfixed_table *gl, int partial) {
  bl_opts o = bl_opts_default;
  bl_case c;
  double s = 0.0, serr = 0.0;
  int n;
  o.electrons = 0;
  o.elwert = o.coulomb = BL_APPLY_OFF;
  bl_yukawa yk;
  bl_pwpot v;
  if (bl_case_setup(&c, bl_particle_find(particle), Z,
                    bl_model_find("hartree-fock"), NULL, T, &o) != BL_SUCCESS)
    return NAN;
  if (partial) {
    double zza = c.particle.charge * Z * BL_ALPHA;
    if (c.screening->yukawa(Z, c.params, &yk) != BL_SUCCESS
        || bl_pwpot_init(&v, zza, &yk, c.particle.mass, c.R,
                         1e-9 * fabs(zza)) != BL_SUCCESS)
      return NAN;
  }
  for (n = 0; n < NPT; n++) {
    double x, w, y, jac, val, err;
    bl_result r;
    gsl_integration_glfixed_point(0.0, 1.0, (size_t)n, &x, &w, gl);
    y = 1.0 - (1.0 - x) * (1.0 - x);
    jac = 2.0 * (1.0 - x);
    if (partial) {
      /* BL_ENOTCONV: the sums stopped at their caps, value and error
      ** filled (the repelled positron near the tip, values far below the
      ** rest): the error is counted below */
      int st = bl_pw_dsdk(&v, c.particle.mass, c.particle.charge, T, y * T,
                          1e-3, &val, &err);
      if (st != BL_SUCCESS && st != BL_ENOTCONV)
        return NAN;
      serr += w * jac * y * T * err;
    } else {
      if (bl_dw_dk_e(&c, y * T, q, &r) != BL_SUCCESS && r.val == 0.0)
        return NAN;
      val = r.val;
    }
    s += w * jac * y * T * val;
  }
  if (serr > 1e-2 * s)   /* the partial waves' error: 1 % at most */
    return NAN;
  return s;
}

int main (int argc, char **argv) {
  static const int Zs[] = {6, 13, 29, 50, 79, 92};
  static const double Ts[] = {0.01, 0.1, 1.0, 10.0, 50.0};
  gsl_integration_glfixed_table *gl = gsl_integration_glfixed_table_alloc(NPT);
  bl_quad *q = bl_quad_alloc(200);
  double tpw = 0.0;
  size_t i, j;
  int zonly = 0, a;
  for (a = 1; a + 1 < argc; a += 2)
    if (strcmp(argv[a], "-p") == 0)
      tpw = atof(argv[a + 1]);
    else if (strcmp(argv[a], "-Z") == 0)
      zonly = atoi(argv[a + 1]);
    else
      break;
  if (a != argc || !(tpw >= 0.0) || zonly < 0 || zonly > 100) {
    fprintf(stderr, "usage: %s [-p TMAX_MEV (>= 0)] [-Z Z (1..100)]\n",
            argv[0]);
    return 2;
  }
  if (gl == NULL || q == NULL || bl_quad_set_rtol(q, 1e-3) != BL_SUCCESS)
    return 1;
  printf("# e+/e- radiative energy loss, method distorted, against Kim et al. "
         "1986 (from memory)\n");
  printf("# %3s %8s %9s %9s %9s %9s %9s\n", "Z", "T/MeV", "distorted",
         "Kim", "ratio", "partial", "ratio");
  for (i = 0; i < sizeof Zs / sizeof Zs[0]; i++)
    for (j = 0; j < sizeof Ts / sizeof Ts[0]; j++) {
      if (zonly != 0 && Zs[i] != zonly)
        continue;
      double pos = loss("positron", Zs[i], Ts[j], q, gl, 0);
      double ele = loss("electron", Zs[i], Ts[j], q, gl, 0);
      double kim = kim1986_ratio(Zs[i], Ts[j]);
      printf("  %3d %8g %9.4f %9.4f %9.3f", Zs[i], Ts[j], pos / ele, kim,
             pos / ele / kim);
      if (Ts[j] <= tpw) {
        double pp = loss("positron", Zs[i], Ts[j], q, gl, 1);
        double pe = loss("electron", Zs[i], Ts[j], q, gl, 1);
        printf(" %9.4f %9.3f", pp / pe, pp / pe / kim);
      }
      printf("\n");
      fflush(stdout);
    }
  bl_quad_free(q);
  gsl_integration_glfixed_table_free(gl);
  return 0;
}
