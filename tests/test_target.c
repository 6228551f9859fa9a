/*
** test_target.c -- real atoms: nuclear size, atomic electrons, Coulomb and
** Elwert corrections, and the complete-screening limit
** See Copyright Notice in LICENSE
*/

#include <math.h>

#include <criterion/criterion.h>
#include <gsl/gsl_errno.h>
#include <gsl/gsl_integration.h>

#include "brakelight.h"
#include "testutil.h"

TestSuite(target, .init = setup);

#define RE2_MB (BL_RE_FM * BL_RE_FM / BL_FM2_PER_MB)   /* r_e^2 in mb */


/* dsigma/dk (mb/MeV) with options o; asserts success. */
static double dsdk (const char *particle, int Z, const char *model, double T,
                    double y, const bl_opts *o, double rtol, bl_result *out) {
  bl_quad *q = bl_quad_alloc(1000);
  bl_case c;
  bl_result r;
  int st;
  cr_assert(q != NULL);
  cr_assert_eq(bl_quad_set_rtol(q, rtol), BL_SUCCESS);
  cr_assert_eq(bl_case_setup(&c, bl_particle_find(particle), Z,
                             bl_model_find(model), NULL, T, o), BL_SUCCESS,
               "case %s Z=%d %s T=%g", particle, Z, model, T);
  st = bl_dcs_dk_e(&c, y * T, q, &r);
  cr_assert_eq(st, BL_SUCCESS, "%s Z=%d %s T=%g y=%g: status %d", particle, Z,
               model, T, y, st);
  bl_quad_free(q);
  if (out != NULL)
    *out = r;
  return r.val;
}


/* ---- the uniform-sphere fit (src/core/born/nucleus.c) ---- */

static double logmoment_f (double x, void *p) {
  (void)p;
  return (bl_nucleus_ff2(x) - bl_nucleus_ff2_fit(x)) / x;
}


/* Source: the form factor of a uniformly charged sphere, 3 (sin x - x cos x)
** / x^3 (common practice, R = 1.2 A^1/3 fm).  Bounds: the errors measured
** when the fit was made (src/core/born/nucleus.c header), rounded up. */
Test(target, nucleus_fit) {
  gsl_integration_workspace *w = gsl_integration_workspace_alloc(2000);
  gsl_function f = {logmoment_f, NULL};
  double worst = 0.0, a, b, e;
  int i;
  for (i = 0; i <= 20000; i++) {
    double x = 100.0 * i / 20000.0;
    double d = fabs(bl_nucleus_ff2_fit(x) - bl_nucleus_ff2(x));
    if (d > worst)
      worst = d;
  }
  cr_expect(worst < 0.009, "max |fit^2 - F_N^2| = %g", worst);
  EXPECT_REL(bl_nucleus_ff2_fit(0.0), 1.0, 1e-12, "F_N(0)^2");
  /* the same mean square radius: F_N^2 = 1 - x^2/5 + ... */
  EXPECT_REL((1.0 - bl_nucleus_ff2_fit(1e-3)) / 1e-6, 0.2, 1e-4, "slope");
  gsl_integration_qag(&f, 1e-8, 100.0, 0.0, 1e-10, 2000, GSL_INTEG_GAUSS61, w,
                      &a, &e);
  gsl_integration_qagiu(&f, 100.0, 0.0, 1e-10, 2000, w, &b, &e);
  cr_expect(fabs(a + b) < 0.004, "log moment of the fit error %g", a + b);
  gsl_integration_workspace_free(w);
}


/* ---- nuclear size: where it matters and where it does not ---- */

/* Source: physics.md (F_N matters for muons and heavier projectiles at
** high energy); the checks.  Measured: muon 1 TeV on Pb, y = 0.5:
** uniform / point = 0.78; electron 100 MeV on Pb, y = 0.5, Born:
** 1 - 9.7e-4 (y = 0.1: 1 - 1.05e-3), from the large-angle hard
** scatterings, q > hbar c / R, that the exact Born integral keeps.  The
** comparison is made without the Coulomb correction, which is a
** point-nucleus quantity subtracted from both: with it the same absolute
** change is 1.06e-3 of the smaller corrected value. */
Test(target, nuclear_size) {
  bl_opts p = bl_opts_default, u = bl_opts_default;
  double a, b;
  p.coulomb = u.coulomb = BL_APPLY_OFF;
  p.nucleus = BL_NUCLEUS_POINT;
  a = dsdk("muon", 82, "thomas-fermi", 1e6, 0.5, &p, 1e-6, NULL);
  b = dsdk("muon", 82, "thomas-fermi", 1e6, 0.5, &u, 1e-6, NULL);
  cr_expect(b < 0.9 * a, "muon 1 TeV Pb: uniform %g vs point %g", b, a);
  a = dsdk("electron", 82, "thomas-fermi", 100.0, 0.5, &p, 1e-7, NULL);
  b = dsdk("electron", 82, "thomas-fermi", 100.0, 0.5, &u, 1e-7, NULL);
  cr_expect(fabs(b / a - 1.0) < 1e-3, "electron 100 MeV Pb: uniform/point "
            "- 1 = %g", b / a - 1.0);
}


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


Test(target, elwert_closed_form) {
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
    a = dsdk(pts[i].p, pts[i].Z, "exponential", pts[i].T, pts[i].y, &on,
             1e-9, &r);
    cr_expect(r.applied & BL_APPLIED_ELWERT);
    b = dsdk(pts[i].p, pts[i].Z, "exponential", pts[i].T, pts[i].y, &off,
             1e-9, NULL);
    EXPECT_REL(a / b, elwert_ref(pts[i].T, pts[i].y * pts[i].T, pts[i].Z,
                                 pts[i].sign), 1e-7,
               "%s Z=%d T=%g y=%g", pts[i].p, pts[i].Z, pts[i].T, pts[i].y);
  }
}


/* ---- Coulomb correction ---- */

/* Davies, Bethe & Maximon (1954) in Tsai's form (Tsai 1974): the
** correction subtracts 4 f(Z alpha) from phi1 and phi2 of the nuclear part,
** i.e. (Z^2 alpha r0^2 / k) 4 f [(1 + v^2) - 2v/3]; f from physics.md. */
Test(target, coulomb_difference) {
  bl_opts on = bl_opts_default, off = bl_opts_default;
  bl_result r;
  double T = 1e4, y = 0.3, k = y * T, v, a, b, fz, want;
  v = (T - k + BL_ME_MEV) / (T + BL_ME_MEV);
  on.coulomb = BL_APPLY_ON;
  off.coulomb = BL_APPLY_OFF;
  a = dsdk("electron", 82, "exponential", T, y, &on, 1e-5, &r);
  cr_expect(r.applied & BL_APPLIED_COULOMB);
  cr_expect(!(r.warn & BL_WARN_COULOMB), "valid here: no warning");
  b = dsdk("electron", 82, "exponential", T, y, &off, 1e-5, NULL);
  fz = 82 * BL_ALPHA;
  fz = fz * fz * (1.0 / (1.0 + fz * fz) + 0.20206 - 0.0369 * fz * fz
                  + 0.0083 * pow(fz, 4) - 0.002 * pow(fz, 6));
  want = 82.0 * 82.0 * BL_ALPHA * RE2_MB / k * 4.0 * fz
         * (1.0 + v * v - 2.0 * v / 3.0);
  EXPECT_REL(b - a, want, 1e-9, "Born minus corrected");
}


/* Where the default applies it (README, "Corrections"). */
Test(target, coulomb_validity) {
  bl_opts o = bl_opts_default;
  bl_result r;
  dsdk("electron", 29, "exponential", 1e4, 0.5, &o, 1e-3, &r);
  cr_expect(r.applied & BL_APPLIED_COULOMB, "electron 10 GeV: applied");
  dsdk("electron", 29, "exponential", 10.0, 0.5, &o, 1e-3, &r);
  cr_expect(!(r.applied & BL_APPLIED_COULOMB), "electron 10 MeV: not applied");
  dsdk("muon", 29, "exponential", 1e5, 0.5, &o, 1e-3, &r);
  cr_expect(!(r.applied & BL_APPLIED_COULOMB), "muon: not applied");
  dsdk("electron", 29, "exponential", 1e4, 0.9999, &o, 1e-3, &r);
  cr_expect(!(r.applied & BL_APPLIED_COULOMB), "slow final electron");
  o.coulomb = BL_APPLY_ON;
  dsdk("electron", 29, "exponential", 10.0, 0.5, &o, 1e-3, &r);
  cr_expect((r.applied & BL_APPLIED_COULOMB) && (r.warn & BL_WARN_COULOMB),
            "forced at 10 MeV: applied with a warning");
  o = bl_opts_default;
  dsdk("electron", 29, "exponential", 1.0, 0.5, &o, 1e-3, &r);
  cr_expect(r.applied & BL_APPLIED_ELWERT, "Elwert at 1 MeV");
  dsdk("electron", 29, "exponential", 5.0, 0.5, &o, 1e-3, &r);
  cr_expect(!(r.applied & BL_APPLIED_ELWERT), "no Elwert at 5 MeV");
}


/* ---- complete screening (Tsai 1974) ---- */

/* Tsai's complete-screening dsigma/dk (Tsai 1974, Rev. Mod. Phys. 46, 815;
** physics.md), with or without the atomic electrons and f. */
static double tsai (int Z, double T, double y, int electrons, int coulomb) {
  double k = y * T, f = coulomb ? bl_coulomb_f(Z * BL_ALPHA) : 0.0;
  double el = electrons ? Z * bl_lrad_prime(Z) : 0.0;
  double zz = electrons ? (double)Z * Z + Z : (double)Z * Z;
  return 4.0 * BL_ALPHA * RE2_MB / k
         * ((4.0 / 3.0 - 4.0 / 3.0 * y + y * y)
            * ((double)Z * Z * (bl_lrad(Z) - f) + el) + (1.0 - y) * zz / 9.0);
}


/* The check: exact Born with Thomas-Fermi screening, atomic
** electrons and the Coulomb correction at T = 100 GeV against Tsai's
** formula, within 1 %. */
Test(target, tsai_complete_screening, .timeout = 120) {
  static const int Zs[] = {6, 29, 82};
  static const double ys[] = {0.1, 0.5, 0.9};
  size_t i, j;
  for (i = 0; i < 3; i++)
    for (j = 0; j < 3; j++) {
      bl_opts o = bl_opts_default;
      bl_result r;
      double v = dsdk("electron", Zs[i], "thomas-fermi", 1e5, ys[j], &o, 1e-5,
                      &r);
      cr_expect(r.applied & BL_APPLIED_COULOMB);
      EXPECT_REL(v, tsai(Zs[i], 1e5, ys[j], 1, 1), 0.01, "Z=%d y=%g", Zs[i],
                 ys[j]);
    }
}


/* The electron part alone: with the inelastic radius fixed by L'_rad
** (src/core/models/exponential.c, src/core/models/thomas_fermi.c), electrons on minus off
** is Tsai's Z L'_rad term at complete screening, within 1 %. */
Test(target, electron_part_complete_screening) {
  static const char *const models[] = {"exponential", "thomas-fermi"};
  static const int Zs[] = {1, 6, 82};
  size_t i, j;
  for (i = 0; i < 2; i++)
    for (j = 0; j < 3; j++) {
      bl_opts on = bl_opts_bare, off = bl_opts_bare;
      double a, b, want;
      on.electrons = 1;
      a = dsdk("electron", Zs[j], models[i], 1e5, 0.5, &on, 1e-6, NULL);
      b = dsdk("electron", Zs[j], models[i], 1e5, 0.5, &off, 1e-6, NULL);
      want = tsai(Zs[j], 1e5, 0.5, 1, 0) - tsai(Zs[j], 1e5, 0.5, 0, 0);
      EXPECT_REL(a - b, want, 0.01, "%s Z=%d", models[i], Zs[j]);
    }
}


/* Hartree-Fock against Thomas-Fermi (the README table).  Bound 3 %: the
** models' complete-screening constants differ by up to 1.8 % in L_rad and
** 9 % in L'_rad (xraylib's atoms against Tsai's values, measured in
** tests/test_screening.c), the latter weighted by about 1/(Z + 1) in
** dsigma/dk; at partial screening the spread is smaller.  Measured: at
** most 1.27 % (C, 100 MeV, y = 0.1). */
Test(target, hartree_fock_near_thomas_fermi, .timeout = 120) {
  static const int Zs[] = {6, 29, 82};
  static const double Ts[] = {1.0, 10.0, 100.0}, ys[] = {0.1, 0.5, 0.9};
  size_t i, j, l;
  for (i = 0; i < 3; i++)
    for (j = 0; j < 3; j++)
      for (l = 0; l < 3; l++) {
        double hf = dsdk("electron", Zs[i], "hartree-fock", Ts[j], ys[l],
                         &bl_opts_default, 1e-5, NULL);
        double tf = dsdk("electron", Zs[i], "thomas-fermi", Ts[j], ys[l],
                         &bl_opts_default, 1e-5, NULL);
        EXPECT_REL(hf, tf, 0.03, "HF vs TF, Z=%d T=%g y=%g", Zs[i], Ts[j],
                   ys[l]);
      }
}
