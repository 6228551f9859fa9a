/*
** test_corrections.c -- the corrections room: the Elwert factor and the Coulomb
** correction, their closed forms and where they apply
** See Copyright Notice in LICENSE
**
** Suite: corrections.
*/

#include <math.h>

#include <criterion/criterion.h>
#include <gsl/gsl_errno.h>
#include <gsl/gsl_integration.h>

#include "brakelight.h"
#include "testutil.h"

/* ==================================================================
** the Elwert factor and the Coulomb correction (moved from the
** real-atoms suite)
** (formerly tests/test_target.c)
*/

TestSuite(corrections, .init = setup);

/* ---- Elwert factor ---- */

/* The published closed form (Elwert 1939; Koch & Motz 1959, section II),
** written out here independently of the core: for electrons
**   F_E = (beta0/beta) (1 - exp(-2 pi Z alpha/beta0))
**                      / (1 - exp(-2 pi Z alpha/beta)),
** and Z alpha -> -Z alpha for positrons. */
static double elwert_ref (double T, double k, int Z, double sign) {
  double m = BL_ME_MEV, g0 = 1.0 + T / m, g = 1.0 + (T - k) / m;
  double b0 = sqrt(1.0 - 1.0 / (g0 * g0)), b = sqrt(1.0 - 1.0 / (g * g));
  double a = sign * 2.0 * BL_PI * Z * BL_ALPHA;
  return (b0 / b) * (1.0 - exp(-a / b0)) / (1.0 - exp(-a / b));
}


Test(corrections, elwert_closed_form) {
  static const struct { const char *p; int Z; double T, y, sign; } pts[] = {
    {"electron", 13, 0.5, 0.5, 1.0},
    {"electron", 82, 1.5, 0.9, 1.0},
    {"positron", 29, 1.0, 0.7, -1.0}
  };
  size_t i;
  for (i = 0; i < sizeof pts / sizeof pts[0]; i++) {
    bl_opts on = bl_opts_bare, off = bl_opts_bare;
    bl_result r;
    double a, b;
    on.elwert = BL_APPLY_ON;
    a = dsdk_opts(pts[i].p, pts[i].Z, "exponential", pts[i].T, pts[i].y, &on,
             1e-9, &r);
    cr_expect(r.applied & BL_APPLIED_ELWERT);
    b = dsdk_opts(pts[i].p, pts[i].Z, "exponential", pts[i].T, pts[i].y, &off,
             1e-9, NULL);
    EXPECT_REL(a / b, elwert_ref(pts[i].T, pts[i].y * pts[i].T, pts[i].Z,
                                 pts[i].sign), 1e-7,
               "%s Z=%d T=%g y=%g", pts[i].p, pts[i].Z, pts[i].T, pts[i].y);
  }
}


/* ---- Coulomb correction ---- */

/* Davies, Bethe & Maximon (1954) in Tsai's form (Tsai 1974): the
** correction subtracts 4 f(Z alpha) from phi1 and phi2 of the nuclear part,
** i.e. (Z^2 alpha r0^2 / k) 4 f [(1 + v^2) - 2v/3]; f from Davies, Bethe &
** Maximon 1954 (Phys. Rev. 93, 788). */
Test(corrections, coulomb_difference) {
  bl_opts on = bl_opts_default, off = bl_opts_default;
  bl_result r;
  double T = 1e4, y = 0.3, k = y * T, v, a, b, fz, want;
  v = (T - k + BL_ME_MEV) / (T + BL_ME_MEV);
  on.coulomb = BL_APPLY_ON;
  off.coulomb = BL_APPLY_OFF;
  a = dsdk_opts("electron", 82, "exponential", T, y, &on, 1e-5, &r);
  cr_expect(r.applied & BL_APPLIED_COULOMB);
  cr_expect(!(r.warn & BL_WARN_COULOMB), "valid here: no warning");
  b = dsdk_opts("electron", 82, "exponential", T, y, &off, 1e-5, NULL);
  fz = 82 * BL_ALPHA;
  fz = fz * fz * (1.0 / (1.0 + fz * fz) + 0.20206 - 0.0369 * fz * fz
                  + 0.0083 * pow(fz, 4) - 0.002 * pow(fz, 6));
  want = 82.0 * 82.0 * BL_ALPHA * RE2_MB / k * 4.0 * fz
         * (1.0 + v * v - 2.0 * v / 3.0);
  EXPECT_REL(b - a, want, 1e-9, "Born minus corrected");
}


/* Where the default applies it (README, "Corrections"). */
Test(corrections, coulomb_validity) {
  bl_opts o = bl_opts_default;
  bl_result r;
  dsdk_opts("electron", 29, "exponential", 1e4, 0.5, &o, 1e-3, &r);
  cr_expect(r.applied & BL_APPLIED_COULOMB, "electron 10 GeV: applied");
  dsdk_opts("electron", 29, "exponential", 10.0, 0.5, &o, 1e-3, &r);
  cr_expect(!(r.applied & BL_APPLIED_COULOMB), "electron 10 MeV: not applied");
  dsdk_opts("muon", 29, "exponential", 1e5, 0.5, &o, 1e-3, &r);
  cr_expect(!(r.applied & BL_APPLIED_COULOMB), "muon: not applied");
  dsdk_opts("electron", 29, "exponential", 1e4, 0.9999, &o, 1e-3, &r);
  cr_expect(!(r.applied & BL_APPLIED_COULOMB), "slow final electron");
  o.coulomb = BL_APPLY_ON;
  dsdk_opts("electron", 29, "exponential", 10.0, 0.5, &o, 1e-3, &r);
  cr_expect((r.applied & BL_APPLIED_COULOMB) && (r.warn & BL_WARN_COULOMB),
            "forced at 10 MeV: applied with a warning");
  o = bl_opts_default;
  dsdk_opts("electron", 29, "exponential", 1.0, 0.5, &o, 1e-3, &r);
  cr_expect(r.applied & BL_APPLIED_ELWERT, "Elwert at 1 MeV");
  dsdk_opts("electron", 29, "exponential", 5.0, 0.5, &o, 1e-3, &r);
  cr_expect(!(r.applied & BL_APPLIED_ELWERT), "no Elwert at 5 MeV");
}
