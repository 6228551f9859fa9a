/*
** test_born.c -- the born room: the Born cross sections against closed forms,
** the observables integrated into each other, the reference formulas
** themselves, the nucleus and the complete-screening limit
** See Copyright Notice in LICENSE
**
** Suites: dcs, integration, refs, born.
*/

#include <math.h>
#include <stdio.h>

#include <criterion/criterion.h>
#include <criterion/new/assert.h>
#include <criterion/parameterized.h>
#include <gsl/gsl_errno.h>
#include <gsl/gsl_integration.h>

#include "brakelight.h"
#include "testutil.h"
#include "kochmotz.h"
#include "born/internal.h"   /* bl_target_w: the form factor's identity */

/* ==================================================================
** the Born cross sections of the core against closed forms
**
** Each physics check names its source.  Reference formulas are the
** independent transcriptions in tests/ref/kochmotz.c (validated by
** the refs suite below).  Units: the core returns mb/MeV (dsigma/dk) and
** mb/(MeV sr^2) (fully differential); the references return multiples of
** Z^2 alpha r0^2 per unit k in m c^2 (see kochmotz.h), converted here with
** r0 = alpha hbar c/(m c^2) computed from the CODATA constants in bl_const.h
** (not from bl_case.norm, so the normalisation is checked too).
** (formerly tests/test_dcs.c)
*/

TestSuite(dcs, .init = setup);


/* z^4 alpha r0^2 / m in mb/MeV, r0 = alpha hbar c / (m c^2): the factor that
** turns a km_* value (per Z^2) into mb/MeV (mb/(MeV sr^2)). */
static double unit_mb (const bl_particle *p) {
  double r0 = BL_ALPHA * BL_HBARC_MEVFM / p->mass;    /* fm */
  double z2 = p->charge * p->charge;
  return z2 * z2 * BL_ALPHA * r0 * r0 / BL_FM2_PER_MB / p->mass;
}

/* A case for particle p on element Z with the named screening model at
** kinetic energy T (MeV); aborts the test if it cannot be made. */
static bl_case make_case (const bl_particle *p, int Z, const char *model,
                          double T) {
  bl_case c;
  const bl_model *m = bl_model_find(model);
  int st;
  cr_assert(m != NULL, "screening model '%s' not found", model);
  st = bl_case_init(&c, p, Z, m, NULL, T);
  cr_assert(st == BL_SUCCESS, "bl_case_init(%s, Z=%d, %s, T=%g): %s",
            p->name, Z, model, T, bl_strerror(st));
  return c;
}

/* Preset particle by name; aborts the test if missing. */
static const bl_particle *preset (const char *name) {
  const bl_particle *p = bl_particle_find(name);
  cr_assert(p != NULL, "particle preset '%s' not found", name);
  return p;
}

/* A spin-0 particle with the electron's mass and charge (for Low and the
** mass scaling of spin 0). */
static const bl_particle scalar_e = { "scalar-e", BL_ME_MEV, -1.0, 0.0, 0 };


/*
** Spin 1/2, no screening: dsigma/dk of the core equals Koch & Motz (1959)
** formula 3BN (Bethe-Heitler, Born, point nucleus) to 1e-4 relative
** (issue section 6).  Grid: 8 energies T/m = 0.01 ... 1e5 (one test each)
** x 6 values of y = k/T from 0.01 to 0.99 = 48 points; electrons on Pb.
** The integration is asked for rtol = 2e-5 so that a 1e-4 comparison is
** meaningful, and its own error estimate must be honest in size:
** err <= 5 rtol val ("a few" rtol: nested rules add their errors).
*/
#define BN_RTOL 2e-5

ParameterizedTestParameters(dcs, bn_grid) {
  static double t0s[] = { 0.01, 0.1, 1.0, 10.0, 100.0, 1e3, 1e4, 1e5 };
  return cr_make_param_array(double, t0s, sizeof t0s / sizeof t0s[0]);
}

ParameterizedTest(double *t0p, dcs, bn_grid) {
  static const double ys[] = { 0.01, 0.1, 0.3, 0.6, 0.9, 0.99 };
  const bl_particle *e = preset("electron");
  double t0 = *t0p, T = t0 * e->mass;
  bl_case c = make_case(e, 82, "none", T);
  bl_quad *q = bl_quad_alloc(200);
  size_t j;
  cr_assert(q != NULL, "bl_quad_alloc(200) failed");
  cr_assert(bl_quad_set_rtol(q, BN_RTOL) == BL_SUCCESS, "bl_quad_set_rtol");
  for (j = 0; j < sizeof ys / sizeof ys[0]; j++) {
    double k = ys[j] * T;
    double want = 82.0 * 82.0 * unit_mb(e) * km_3bn(t0, ys[j] * t0);
    bl_result r;
    int st = bl_dcs_dk_e(&c, k, q, &r);
    cr_expect(st == BL_SUCCESS, "bl_dcs_dk_e T/m=%g y=%g: status %d (%s)",
              t0, ys[j], st, bl_strerror(st));
    /* Koch & Motz 1959, formula 3BN */
    EXPECT_REL(r.val, want, 1e-4, "dsigma/dk vs 3BN at T/m=%g y=%g", t0, ys[j]);
    cr_expect(r.err >= 0.0 && r.err <= 5.0 * BN_RTOL * fabs(r.val),
              "error estimate at T/m=%g y=%g: err %.3e, val %.6e, "
              "err/val %.3e > 5 rtol = %.1e", t0, ys[j], r.err, r.val,
              r.err / r.val, 5.0 * BN_RTOL);
  }
  bl_quad_free(q);
}


/*
** The same comparison made strict and wider: asked for rtol 1e-7, the core
** must agree with 3BN (Koch & Motz 1959) to 1e-6 (10 rtol: the contract of
** a relative tolerance), out to T/m = 1e-4 and 1e6 and y = 1e-4 and 0.9999
** (measured: an independent integration reached the same 1e-6).
** 7 energies x 5 y = 35 more points.
*/
ParameterizedTestParameters(dcs, bn_strict) {
  static double t0s[] = { 1e-4, 1e-3, 0.01, 1.0, 100.0, 1e4, 1e6 };
  return cr_make_param_array(double, t0s, sizeof t0s / sizeof t0s[0]);
}

ParameterizedTest(double *t0p, dcs, bn_strict) {
  static const double ys[] = { 1e-4, 0.01, 0.5, 0.99, 0.9999 };
  const bl_particle *e = preset("electron");
  double t0 = *t0p, T = t0 * e->mass;
  bl_case c = make_case(e, 13, "none", T);
  bl_quad *q = bl_quad_alloc(200);
  size_t j;
  cr_assert(q != NULL);
  cr_assert(bl_quad_set_rtol(q, 1e-7) == BL_SUCCESS);
  for (j = 0; j < sizeof ys / sizeof ys[0]; j++) {
    double want = 13.0 * 13.0 * unit_mb(e) * km_3bn(t0, ys[j] * t0);
    bl_result r;
    int st = bl_dcs_dk_e(&c, ys[j] * T, q, &r);
    /* GSL_EROUND (rounding limits the last digits) is acceptable here */
    cr_expect(st == BL_SUCCESS || st == GSL_EROUND,
              "T/m=%g y=%g: status %d (%s)", t0, ys[j], st, bl_strerror(st));
    /* Koch & Motz 1959, formula 3BN */
    EXPECT_REL(r.val, want, 1e-6, "dsigma/dk (rtol 1e-7) vs 3BN at T/m=%g y=%g",
               t0, ys[j]);
  }
  bl_quad_free(q);
}


/*
** Spin 0 at high energy, no screening.  Reference: the screening-function
** form (Tsai 1974, Rev. Mod. Phys. 46, 815, section 3) with (1 + v^2) -> 2v for spin
** 0 and phi1 = phi2 = 4 ln(1/delta) - 2 unscreened, i.e.
**   dsigma/dk = (16/3) (Z^2 alpha r0^2/k) v [ln(2 E0 E/k) - 1/2],  v = E/E0:
** 3BN(b) (Koch & Motz 1959) without its y^2 = (1-v)^2 helicity-flip term.
** Source: project physics notes (verified there against the exact spin-0
** Born integral); no literature formula was checked for this one.  Like
** 3BN(b) it drops O(1/E^2) terms: at T/m >= 1e4 and y <= 0.9 (E >= 1e3)
** that is <~ 1e-6.  rtol 1e-8, tolerance 2e-6.
*/
Test(dcs, spin_zero_extreme_relativistic) {
  static const double t0s[] = { 1e4, 1e5 };
  static const double ys[] = { 0.01, 0.1, 0.5, 0.9 };
  bl_quad *q = bl_quad_alloc(200);
  size_t i, j;
  cr_assert(q != NULL);
  cr_assert(bl_quad_set_rtol(q, 1e-8) == BL_SUCCESS);
  for (i = 0; i < 2; i++)
    for (j = 0; j < 4; j++) {
      double t0 = t0s[i], T = t0 * scalar_e.mass, y = ys[j];
      double E0 = 1.0 + t0, k = y * t0, E = E0 - k, v = E / E0;
      double want = 82.0 * 82.0 * unit_mb(&scalar_e)
                    * 16.0 / 3.0 * v / k * (log(2.0 * E0 * E / k) - 0.5);
      bl_case c = make_case(&scalar_e, 82, "none", T);
      bl_result r;
      int st = bl_dcs_dk_e(&c, y * T, q, &r);
      cr_expect(st == BL_SUCCESS || st == GSL_EROUND, "status %d", st);
      EXPECT_REL(r.val, want, 2e-6, "spin 0 vs ER form at T/m=%g y=%g", t0, y);
    }
  bl_quad_free(q);
}


/*
** Exponential screening equals Schiff's formula (Schiff 1951; Koch & Motz
** 1959 formula 3BS(e)) to 1e-3 for electrons at T >= 100 MeV (issue
** section 6), Pb, a = 111 Z^-1/3 hbar/(m_e c).  Schiff's formula is a
** high-energy approximation of the same Born integral: its unscreened limit
** 3BN(b) differs from the exact 3BN by 2.4e-4 at T = 100 MeV, y = 0.5, but
** by 3e-3 at y = 0.9 and 4e-2 at y = 0.99 (Koch & Motz formulas compared in
** our evaluation).  So the points below are those where that difference is
** <= 2.4e-4, leaving room for Schiff's own neglect of O(1/a^2) terms (~4e-4;
** an earlier measurement found 5e-4 between the two; the current core gives 1.3e-4 ...
** 5.2e-4 at these points, and -3.4e-3 ... -1e-2 at 10 MeV, y <= 0.5, where
** Schiff's formula is not meant to hold).
*/
Test(dcs, exponential_is_schiff) {
  static const struct { double T, y; } pts[] = {
    { 100.0, 0.1 }, { 100.0, 0.5 },
    { 1e3, 0.1 }, { 1e3, 0.5 }, { 1e3, 0.9 },
    { 1e4, 0.1 }, { 1e4, 0.5 }, { 1e4, 0.9 }, { 1e4, 0.99 },
    { 1e6, 0.5 }, { 1e6, 0.99 },
  };
  const bl_particle *e = preset("electron");
  bl_quad *q = bl_quad_alloc(200);
  double a = km_schiff_radius(82, 1.0);
  size_t i;
  cr_assert(q != NULL);
  cr_assert(bl_quad_set_rtol(q, 1e-5) == BL_SUCCESS);
  for (i = 0; i < sizeof pts / sizeof pts[0]; i++) {
    double T = pts[i].T, t0 = T / e->mass, k = pts[i].y * T;
    bl_case c = make_case(e, 82, "exponential", T);
    double want = 82.0 * 82.0 * unit_mb(e) * km_3bse(t0, k / e->mass, a);
    bl_result r;
    int st = bl_dcs_dk_e(&c, k, q, &r);
    cr_expect(st == BL_SUCCESS, "status %d (%s) at T=%g y=%g", st,
              bl_strerror(st), T, pts[i].y);
    /* Schiff 1951 = Koch & Motz 1959, formula 3BS(e) */
    EXPECT_REL(r.val, want, 1e-3, "exponential vs 3BS(e) at T=%g MeV y=%g",
               T, pts[i].y);
  }
  bl_quad_free(q);
}


/*
** Soft-photon limit (Low 1958): as k -> 0 the fully differential Born cross
** section of either spin tends to the elastic Born cross section (Rutherford
** for spin 0, Mott for spin 1/2) times (alpha/(4 pi^2 k)) |u - u0|^2 (see
** km_low).  The difference is O(k) relative.  Its size was measured with an
** independent evaluation (Python) of the exact Born formula (Bethe & Heitler 1934) at
** these angle sets: (0.5 ... 6.1) x k/T for T/m = 0.1 ... 1000.  Tolerance
** 10 k/T, at k/T = 1e-4 and at 1e-5, so the test also shows the approach
** is linear in k.  Angles: beam frame (theta_k, theta_p, phi); one set
** scales with 1/E0 to probe the forward peak.  Screening "none" (Low's
** elastic factor is for a point charge).
*/
static void low_check (const bl_particle *p, double t0) {
  static const double ang[][3] = {
    { 0.3, 0.5, 1.0 }, { 1.0, 0.4, 2.5 }, { 0.2, 1.2, 0.0 },
    { 2.0, 0.7, 3.0 }, { 0.05, 0.3, 1.5 }, { 0.0, 0.0, 0.0 } /* scaled */
  };
  static const double yk[] = { 1e-4, 1e-5 };
  double T = t0 * p->mass, E0 = 1.0 + t0;
  bl_case c = make_case(p, 29, "none", T);
  size_t i, j;
  for (j = 0; j < 2; j++)
    for (i = 0; i < sizeof ang / sizeof ang[0]; i++) {
      double tk = ang[i][0], tp = ang[i][1], ph = ang[i][2];
      double k = yk[j] * T, want;
      bl_result r;
      int st;
      if (i == 5) { tk = 0.1 / E0; tp = 0.5 / E0; ph = 1.0; }
      want = 29.0 * 29.0 * unit_mb(p)
             * km_low(p->spin, t0, yk[j] * t0, tk, tp, ph);
      st = bl_dcs_full_e(&c, k, tk, tp, ph, &r);
      cr_expect(st == BL_SUCCESS, "bl_dcs_full_e status %d (%s)", st,
                bl_strerror(st));
      /* Low 1958 soft-photon theorem with Born elastic cross sections */
      EXPECT_REL(r.val, want, 10.0 * yk[j],
                 "%s full dcs vs Low at T/m=%g k/T=%g angles (%g, %g, %g)",
                 p->name, t0, yk[j], tk, tp, ph);
    }
}

Test(dcs, soft_photon_low_spin_half) {
  low_check(preset("electron"), 1.0);
  low_check(preset("electron"), 1000.0);
  low_check(preset("muon"), 0.1);
}

Test(dcs, soft_photon_low_spin_zero) {
  low_check(&scalar_e, 1.0);
  low_check(&scalar_e, 1000.0);
  low_check(preset("pion+"), 0.1);
}


/* dsigma/dk of particle p at T = t0 m, y, for a scaling comparison. */
static double dsdk (const bl_particle *p, int Z, const char *model, double t0,
                    double y, bl_quad *q) {
  double T = t0 * p->mass;
  bl_case c = make_case(p, Z, model, T);
  bl_result r;
  int st = bl_dcs_dk_e(&c, y * T, q, &r);
  cr_expect(st == BL_SUCCESS, "%s T/m=%g y=%g: status %d (%s)", p->name, t0,
            y, st, bl_strerror(st));
  return r.val;
}


/*
** Charge scaling: the Born cross section is proportional to z^4 (the photon
** couples with z e, the nucleus with z Z e^2: amplitude ~ z^2;
** Koch & Motz 1959 give Z^2 r0^2 for z = 1).  Charge 2 vs
** charge 1, same mass and spin: ratio 16; and the sign does not matter in
** the first Born approximation (positron = electron).  Same integration
** path, so the ratio is exact up to rounding: tolerance 1e-6.  Exponential
** screening (the target factor does not depend on z), both spins.
*/
Test(dcs, charge_scaling) {
  static const double ys[] = { 0.2, 0.8 };
  const bl_particle *e = preset("electron");
  bl_particle e2 = { "charge-2 lepton", BL_ME_MEV, 2.0, 0.5, 0 };
  bl_particle s1 = { "charge-1 scalar", BL_ME_MEV, 1.0, 0.0, 0 };
  bl_particle s2 = { "charge-2 scalar", BL_ME_MEV, 2.0, 0.0, 0 };
  bl_quad *q = bl_quad_alloc(200);
  size_t j;
  cr_assert(q != NULL);
  for (j = 0; j < 2; j++) {
    double t0 = 10.0, y = ys[j];
    double ve = dsdk(e, 29, "exponential", t0, y, q);
    EXPECT_REL(dsdk(&e2, 29, "exponential", t0, y, q), 16.0 * ve, 1e-6,
               "spin 1/2 charge 2 vs 16 x charge 1, y=%g", y);
    EXPECT_REL(dsdk(preset("positron"), 29, "exponential", t0, y, q), ve,
               1e-6, "positron vs electron (Born), y=%g", y);
    EXPECT_REL(dsdk(&s2, 29, "exponential", t0, y, q),
               16.0 * dsdk(&s1, 29, "exponential", t0, y, q), 1e-6,
               "spin 0 charge 2 vs 16 x charge 1, y=%g", y);
  }
  bl_quad_free(q);
}


/*
** Mass scaling at the same Lorentz factor (same T/m and y): without
** screening the Born cross section in units of r0^2 = (alpha hbar/(m c))^2
** depends on energies in units of m only, so sigma ~ (m_e/m)^2 (Koch &
** Motz 1959, in units of m c^2) and dsigma/dk [per MeV] ~
** (m_e/m)^3.  Muon vs electron (spin 1/2), pion+ vs an electron-mass scalar
** (spin 0).  Same integration path in units of m: tolerance 1e-6.  Also
** Z^2 for a point nucleus (3BN is proportional to Z^2): Z = 82 vs Z = 1.
*/
Test(dcs, mass_and_Z_scaling) {
  static const double ys[] = { 0.2, 0.8 };
  const bl_particle *e = preset("electron"), *mu = preset("muon");
  const bl_particle *pi = preset("pion+");
  bl_quad *q = bl_quad_alloc(200);
  size_t j;
  cr_assert(q != NULL);
  for (j = 0; j < 2; j++) {
    double t0 = 10.0, y = ys[j];
    double rm = e->mass / mu->mass, rp = e->mass / pi->mass;
    double ve = dsdk(e, 82, "none", t0, y, q);
    EXPECT_REL(dsdk(mu, 82, "none", t0, y, q), rm * rm * rm * ve, 1e-6,
               "muon vs (m_e/m_mu)^3 electron, y=%g", y);
    EXPECT_REL(dsdk(pi, 82, "none", t0, y, q),
               rp * rp * rp * dsdk(&scalar_e, 82, "none", t0, y, q), 1e-6,
               "pion+ vs (m_e/m_pi)^3 scalar of electron mass, y=%g", y);
    EXPECT_REL(dsdk(e, 1, "none", t0, y, q) * 82.0 * 82.0, ve, 1e-6,
               "Z^2 scaling, Z=1 vs Z=82, y=%g", y);
  }
  bl_quad_free(q);
}


/* Error cases of bl_case_init (bl_dcs.h contract). */
Test(dcs, case_init_domain) {
  const bl_particle *e = preset("electron");
  const bl_model *m = bl_model_find("exponential");
  bl_particle bad = { "massless", 0.0, 1.0, 0.5, 0 };
  bl_case c;
  cr_assert(m != NULL);
  cr_expect(bl_case_init(&c, e, 0, m, NULL, 10.0) == BL_EDOMAIN, "Z = 0");
  cr_expect(bl_case_init(&c, e, 101, m, NULL, 10.0) == BL_EDOMAIN, "Z = 101");
  cr_expect(bl_case_init(&c, e, -5, m, NULL, 10.0) == BL_EDOMAIN, "Z = -5");
  cr_expect(bl_case_init(&c, e, 82, m, NULL, 0.0) == BL_EDOMAIN, "T = 0");
  cr_expect(bl_case_init(&c, e, 82, m, NULL, -1.0) == BL_EDOMAIN, "T = -1");
  cr_expect(bl_case_init(&c, e, 82, m, NULL, NAN) == BL_EDOMAIN, "T = NaN");
  cr_expect(bl_case_init(&c, e, 82, m, NULL, INFINITY) == BL_EDOMAIN,
            "T = inf");
  cr_expect(bl_case_init(&c, &bad, 82, m, NULL, 10.0) == BL_EDOMAIN,
            "particle of mass 0");
  cr_expect(bl_case_init(&c, e, 1, m, NULL, 10.0) == BL_SUCCESS, "Z = 1");
  cr_expect(bl_case_init(&c, e, 100, m, NULL, 10.0) == BL_SUCCESS, "Z = 100");
}


/* Error cases of bl_dcs_dk_e and bl_dcs_full_e (bl_dcs.h contract). */
Test(dcs, dk_and_full_domain) {
  const bl_particle *e = preset("electron");
  bl_case c = make_case(e, 82, "exponential", 10.0);
  bl_quad *q = bl_quad_alloc(100);
  bl_result r;
  static const double badk[] = { 0.0, -1.0, 10.0, 11.0, NAN, INFINITY };
  size_t i;
  cr_assert(q != NULL);
  for (i = 0; i < sizeof badk / sizeof badk[0]; i++) {
    cr_expect(bl_dcs_dk_e(&c, badk[i], q, &r) == BL_EDOMAIN,
              "bl_dcs_dk_e must reject k = %g (T = 10)", badk[i]);
    cr_expect(bl_dcs_full_e(&c, badk[i], 0.1, 0.2, 1.0, &r) == BL_EDOMAIN,
              "bl_dcs_full_e must reject k = %g (T = 10)", badk[i]);
  }
  cr_expect(bl_dcs_full_e(&c, 5.0, -0.1, 0.2, 1.0, &r) == BL_EDOMAIN,
            "theta_k = -0.1");
  cr_expect(bl_dcs_full_e(&c, 5.0, 3.2, 0.2, 1.0, &r) == BL_EDOMAIN,
            "theta_k = 3.2");
  cr_expect(bl_dcs_full_e(&c, 5.0, 0.1, NAN, 1.0, &r) == BL_EDOMAIN,
            "theta_p = NaN");
  cr_expect(bl_dcs_full_e(&c, 5.0, 0.1, 0.2, NAN, &r) == BL_EDOMAIN,
            "phi = NaN");
  cr_expect(bl_quad_set_rtol(q, 0.0) == BL_EDOMAIN, "rtol = 0");
  cr_expect(bl_quad_set_rtol(q, 1e-13) == BL_EDOMAIN, "rtol = 1e-13");
  cr_expect(bl_quad_set_rtol(q, 0.6) == BL_EDOMAIN, "rtol = 0.6");
  cr_expect(bl_quad_set_rtol(q, NAN) == BL_EDOMAIN, "rtol = NaN");
  cr_expect(bl_quad_set_rtol(q, 1e-3) == BL_SUCCESS, "rtol = 1e-3");
  cr_expect(bl_quad_rtol(q) == 1e-3, "bl_quad_rtol: %g", bl_quad_rtol(q));
  bl_quad_free(q);
  bl_quad_free(NULL);   /* documented no-op */
}


/*
** Forced non-convergence: GSL's integration tests force a failure with a tiny
** subinterval limit.  Here the smallest workspace (8 subintervals per level)
** with the tightest tolerance the API accepts (1e-12).  With the current core
** 8 subintervals already reach 1e-10 (measured: identical to a 1000-
** subinterval result), so rtol 1e-12 is needed; the core reported
** GSL_EMAXITER at y = 1e-4 for every T tried, and at y = 0.3 for
** T = 0.01 MeV (none) and 1e5 MeV (both models).  Since the inner map
** follows the minimum of q^2 near the kink (dcs.c, ridge_width and
** zpeak_at) all of those converge with 8 subintervals (and agree with the
** 1000-subinterval value); the unscreened field at T = 1e4 MeV, y = 3e-3
** and 1e5 MeV, y = 0.03 still end with GSL_EROUND there (with 1000
** subintervals the second converges, the first ends with GSL_EROUND too,
** at the rounding limit of the unscreened field).
** For every case: either the status says the tolerance was not reached,
** and the result still holds a finite positive best estimate with finite
** error and BL_WARN_TOLERANCE; or it claims success, and then the value must
** agree with a 1000-subinterval result to 1e-10.  At least one case must
** take the failure path, so that path is exercised.  The unconverged
** estimate must lie within its own error estimate of the converged one
** (measured: off by up to 8e-3 relative at T = 0.01 MeV, y = 1e-4, with
** err/val ~ 2, so the estimate is honest though pessimistic).
*/
Test(dcs, forced_nonconvergence) {
  static const struct { const char *model; double T, y; } cs[] = {
    { "none", 0.01, 0.3 }, { "none", 1e5, 0.3 }, { "exponential", 1e5, 0.3 },
    { "exponential", 10.0, 0.3 }, { "exponential", 10.0, 1e-4 },
    { "none", 1.0, 1e-4 }, { "none", 0.01, 1e-4 }, { "none", 1e4, 3e-3 },
    { "none", 1e5, 0.03 },
  };
  const bl_particle *e = preset("electron");
  bl_quad *q8 = bl_quad_alloc(8), *qr = bl_quad_alloc(1000);
  int nfail = 0;
  size_t i;
  cr_assert(q8 != NULL && qr != NULL);
  cr_assert(bl_quad_set_rtol(q8, 1e-12) == BL_SUCCESS);
  cr_assert(bl_quad_set_rtol(qr, 1e-12) == BL_SUCCESS);
  for (i = 0; i < sizeof cs / sizeof cs[0]; i++) {
    bl_case c = make_case(e, 82, cs[i].model, cs[i].T);
    bl_result r, ref;
    int st = bl_dcs_dk_e(&c, cs[i].y * cs[i].T, q8, &r);
    int sr = bl_dcs_dk_e(&c, cs[i].y * cs[i].T, qr, &ref);
    cr_expect(isfinite(ref.val) && ref.val > 0.0,
              "reference (limit 1000) status %d value %g", sr, ref.val);
    if (st == BL_SUCCESS) {
      EXPECT_REL(r.val, ref.val, 1e-10,
                 "limit 8 claims success (%s, T=%g, y=%g)", cs[i].model,
                 cs[i].T, cs[i].y);
      continue;
    }
    nfail++;
    cr_expect(bl_strerror(st) != NULL && bl_strerror(st)[0] != '\0',
              "bl_strerror(%d) empty", st);
    cr_expect(isfinite(r.val) && r.val > 0.0, "estimate %g (status %d)",
              r.val, st);
    cr_expect(isfinite(r.err) && r.err >= 0.0, "error %g", r.err);
    cr_expect(r.warn & BL_WARN_TOLERANCE,
              "status %d but warn bits 0x%x lack BL_WARN_TOLERANCE", st, r.warn);
    /* bl_result.h: BL_WARN_TOLERANCE means "err says how far" */
    cr_expect(fabs(r.val - ref.val) <= r.err,
              "unconverged estimate (%s, T=%g, y=%g): got %.12g, converged "
              "%.12g, |diff| %.3e exceeds its error estimate %.3e",
              cs[i].model, cs[i].T, cs[i].y, r.val, ref.val,
              fabs(r.val - ref.val), r.err);
  }
  cr_expect(nfail > 0, "no case failed to converge with limit 8, rtol 1e-12: "
            "the failure path was not exercised");
  bl_quad_free(q8);
  bl_quad_free(qr);
}


/*
** Integrand calls (GSL's integration tests count evaluations the same way):
** a dsigma/dk point must call the integrand, the count must reset, and a
** tighter tolerance must cost more calls on the same rules (1e-5 and 1e-6,
** both below RULE15_RTOL of born/dcs.c; across a change of rules it need
** not: the nested rules at 1e-6 took 2,325 calls at T = 1 MeV, the fixed
** 10/21 and 7/15 rules 1e-4 had then 3,270; 1e-4 is nested too since,
** 3 -> 63 inner against 10 -> 87 below RULE15_RTOL).  Upper bound:
** measured on the core of the time at rtol 1e-4, Pb, exponential screening, y = 0.3:
** 4.6e3 calls (T = 1 MeV), 5.6e3 (100 MeV), 2.2e4 (100 GeV); the bound is
** 1e5, about 5x the largest, so a regression in the peak mapping shows.
*/
#define CALLS_MAX 100000UL

Test(dcs, integrand_calls) {
  const bl_particle *e = preset("electron");
  static const double Ts[] = { 1.0, 100.0, 1e5 };
  bl_quad *q = bl_quad_alloc(200);
  size_t i;
  cr_assert(q != NULL);
  for (i = 0; i < 3; i++) {
    bl_case c = make_case(e, 82, "exponential", Ts[i]);
    bl_result r;
    unsigned long n4, n5, n6;
    bl_quad_set_rtol(q, 1e-4);
    bl_quad_reset_calls(q);
    cr_expect(bl_quad_calls(q) == 0, "calls after reset: %lu", bl_quad_calls(q));
    bl_dcs_dk_e(&c, 0.3 * Ts[i], q, &r);
    n4 = bl_quad_calls(q);
    bl_quad_set_rtol(q, 1e-5);
    bl_quad_reset_calls(q);
    bl_dcs_dk_e(&c, 0.3 * Ts[i], q, &r);
    n5 = bl_quad_calls(q);
    bl_quad_set_rtol(q, 1e-6);
    bl_quad_reset_calls(q);
    bl_dcs_dk_e(&c, 0.3 * Ts[i], q, &r);
    n6 = bl_quad_calls(q);
    cr_log_info("T=%g MeV: %lu calls at rtol 1e-4, %lu at 1e-5, %lu at "
                "1e-6", Ts[i], n4, n5, n6);
    cr_expect(n4 > 0 && n4 <= CALLS_MAX, "T=%g: %lu calls at rtol 1e-4 "
              "(bound %lu)", Ts[i], n4, CALLS_MAX);
    cr_expect(n6 > n5, "T=%g: rtol 1e-6 took %lu calls, 1e-5 took %lu",
              Ts[i], n6, n5);
  }
  bl_quad_free(q);
}


/* Numerical angular integrals of the core's own outputs (GSL qag): the
** parameters, and the first non-success status met on the way. */
typedef struct {
  const bl_case *c;
  bl_quad *q;
  double k, theta_k, theta_p;
  int status;
  gsl_integration_workspace *w;   /* for the inner (phi) integral */
} ang_par;

/* 2 pi sin(theta) theta d2sigma/(dk dOmega_k) at theta = exp(s). */
static double ang_integrand (double s, void *vp) {
  ang_par *ap = vp;
  double th = exp(s);
  bl_result r;
  int st = bl_dcs_angular_e(ap->c, ap->k, th, ap->q, &r);
  if (st != BL_SUCCESS && ap->status == BL_SUCCESS)
    ap->status = st;
  return 2.0 * BL_PI * sin(th) * th * r.val;   /* dOmega = 2 pi sin th dth */
}

/* int_a^b f to relative tolerance rtol (GAUSS21); aborts the test on
** failure, since a failed test quadrature would judge nothing. */
static double gsl_qag (double (*f) (double, void *), void *par, double a,
                       double b, double rtol, gsl_integration_workspace *w) {
  gsl_function F = { f, par };
  double res = 0.0, err = 0.0;
  int st = gsl_integration_qag(&F, a, b, 0.0, rtol, 1000, GSL_INTEG_GAUSS21,
                               w, &res, &err);
  cr_assert(st == GSL_SUCCESS, "test quadrature: %s", gsl_strerror(st));
  return res;
}


/*
** Consistency of two public paths: d2sigma/(dk dOmega_k) integrated over the
** photon direction (here, with GSL in ln theta_k, which resolves the 1/E0
** forward peak; below theta = 1e-6/E0 the density is flat and contributes
** < 1e-12) equals dsigma/dk.  Definition of the angular density
** (bl_dcs.h); no external source.  rtol 1e-8 in the core, 1e-7 here:
** tolerance 1e-6.
*/
Test(dcs, angular_integrates_to_dk) {
  static const double Ts[] = { 1.0, 100.0, 1e4 };
  const bl_particle *e = preset("electron");
  bl_quad *q = bl_quad_alloc(200);
  gsl_integration_workspace *w = gsl_integration_workspace_alloc(1000);
  size_t i;
  cr_assert(q != NULL && w != NULL);
  cr_assert(bl_quad_set_rtol(q, 1e-8) == BL_SUCCESS);
  for (i = 0; i < 3; i++) {
    double T = Ts[i], E0 = 1.0 + T / e->mass, k = 0.4 * T;
    bl_case c = make_case(e, 82, "exponential", T);
    ang_par ap = { &c, q, k, 0.0, 0.0, BL_SUCCESS, NULL };
    bl_result r;
    double integ = gsl_qag(ang_integrand, &ap, log(1e-6 / E0), log(BL_PI),
                           1e-7, w);
    int st = bl_dcs_dk_e(&c, k, q, &r);
    cr_expect(ap.status == BL_SUCCESS || ap.status == GSL_EROUND,
              "angular status %d", ap.status);
    cr_expect(st == BL_SUCCESS || st == GSL_EROUND, "dk status %d", st);
    EXPECT_REL(integ, r.val, 1e-6, "int dOmega_k angular vs dk at T=%g MeV",
               T);
  }
  gsl_integration_workspace_free(w);
  bl_quad_free(q);
}


/* Fully differential density at azimuth phi (theta_k, theta_p in vp). */
static double full_phi (double phi, void *vp) {
  ang_par *ap = vp;
  bl_result r;
  int st = bl_dcs_full_e(ap->c, ap->k, ap->theta_k, ap->theta_p, phi, &r);
  if (st != BL_SUCCESS && ap->status == BL_SUCCESS)
    ap->status = st;
  return r.val;
}

/* sin(theta_p) int_0^{2 pi} dphi of the fully differential density. */
static double full_theta (double thp, void *vp) {
  ang_par *ap = vp;
  ap->theta_p = thp;
  return sin(thp) * gsl_qag(full_phi, ap, 0.0, 2.0 * BL_PI, 1e-9, ap->w);
}


/*
** Consistency of the fully differential and the angular densities: the
** former integrated over the final-particle direction (GSL, theta_p and phi
** over the whole sphere) equals the latter.  At T/m = 1 nothing is sharply
** peaked, so plain adaptive rules do.  Definitions (bl_dcs.h); no external
** source.  Both spins, several photon angles; rtol 1e-9 in the core's
** angular integral, 1e-8/1e-9 here: tolerance 1e-6.
*/
Test(dcs, full_integrates_to_angular) {
  static const double tks[] = { 0.1, 0.5, 2.0 };
  const bl_particle *ps[] = { preset("electron"), &scalar_e };
  bl_quad *q = bl_quad_alloc(200);
  gsl_integration_workspace *w = gsl_integration_workspace_alloc(1000);
  gsl_integration_workspace *wi = gsl_integration_workspace_alloc(1000);
  size_t i, j;
  cr_assert(q != NULL && w != NULL && wi != NULL);
  cr_assert(bl_quad_set_rtol(q, 1e-9) == BL_SUCCESS);
  for (j = 0; j < 2; j++)
    for (i = 0; i < 3; i++) {
      double T = ps[j]->mass, k = 0.5 * T;
      bl_case c = make_case(ps[j], 29, "none", T);
      ang_par ap = { &c, q, k, tks[i], 0.0, BL_SUCCESS, wi };
      bl_result r;
      double integ = gsl_qag(full_theta, &ap, 0.0, BL_PI, 1e-8, w);
      int st = bl_dcs_angular_e(&c, k, tks[i], q, &r);
      cr_expect(ap.status == BL_SUCCESS, "full status %d", ap.status);
      cr_expect(st == BL_SUCCESS || st == GSL_EROUND, "angular status %d", st);
      EXPECT_REL(integ, r.val, 1e-6,
                 "%s: int dOmega_p full vs angular at theta_k=%g",
                 ps[j]->name, tks[i]);
    }
  gsl_integration_workspace_free(wi);
  gsl_integration_workspace_free(w);
  bl_quad_free(q);
}


/* ==================================================================
** the three observables integrate into each other
**
** Internal consistency, no outside source: the fully differential cross
** section (point kernel, beam-frame angles, phi by brute force) integrated
** over the final particle must equal the angular distribution (closed-form
** azimuth, mapped quadrature in the photon frame), and that integrated over
** the photon direction must equal dsigma/dk.  A fault in the frame change,
** the azimuthal closed forms or the maps breaks one of these equalities.
** The dcs suite above checks the same at T/m = 1 and in ln(theta_k) up to 10 GeV;
** here both spins go through both steps, and at 1 GeV through the peaked
** forward cone in the beam frame.
** (formerly tests/test_integration.c)
*/

TestSuite(integration, .init = setup);

typedef struct brute {
  bl_case c;
  double k, theta_k, theta_p;
  gsl_integration_workspace *w1, *w2;
  bl_quad *q;
} brute;


static double f_phi (double phi, void *p) {
  brute *b = p;
  bl_result r;
  bl_dcs_full_e(&b->c, b->k, b->theta_k, b->theta_p, phi, &r);
  return r.val;
}


static double f_thetap (double tp, void *p) {
  brute *b = p;
  gsl_function f = {f_phi, b};
  double v, e;
  b->theta_p = tp;
  gsl_integration_qag(&f, 0.0, BL_PI, 0.0, 1e-9, 1000, GSL_INTEG_GAUSS61,
                      b->w1, &v, &e);
  return 2.0 * v * sin(tp);   /* phi over [0, 2 pi] */
}


/* d2sigma/(dk dOmega_k) by brute force over theta_p, with break points. */
static double brute_angular (brute *b, const double *pts, size_t n) {
  gsl_function f = {f_thetap, b};
  double v, e;
  gsl_integration_qagp(&f, (double *)pts, n, 0.0, 1e-8, 1000, b->w2, &v, &e);
  return v;
}


static double f_thetak (double tk, void *p) {
  brute *b = p;
  bl_result r;
  bl_dcs_angular_e(&b->c, b->k, tk, b->q, &r);
  return 2.0 * BL_PI * sin(tk) * r.val;
}


static void check_case (const bl_particle *pt, const char *model, double T,
                        double k, const double *tks, int ntk,
                        double theta_scale, const bl_opts *o) {
  brute b;
  gsl_function f = {f_thetak, &b};
  gsl_integration_workspace *w3 = gsl_integration_workspace_alloc(1000);
  bl_result r;
  double v, e;
  int i;
  b.w1 = gsl_integration_workspace_alloc(1000);
  b.w2 = gsl_integration_workspace_alloc(1000);
  b.q = bl_quad_alloc(200);
  b.k = k;
  cr_assert_eq(bl_quad_set_rtol(b.q, 1e-8), BL_SUCCESS);
  cr_assert_eq(bl_case_setup(&b.c, pt, 82, bl_model_find(model), NULL, T, o),
               BL_SUCCESS);
  for (i = 0; i < ntk; i++) {
    double tp[5];
    size_t n = 0;
    b.theta_k = tks[i];
    tp[n++] = 0.0;
    if (tks[i] > 0.0)
      tp[n++] = tks[i];   /* the particle peaks near the photon direction */
    if (10.0 * theta_scale > tp[n - 1] && 10.0 * theta_scale < BL_PI)
      tp[n++] = 10.0 * theta_scale;
    tp[n++] = BL_PI;
    cr_assert_eq(bl_dcs_angular_e(&b.c, k, tks[i], b.q, &r), BL_SUCCESS);
    v = brute_angular(&b, tp, n);
    cr_expect(fabs(r.val / v - 1.0) < 1e-6,
              "%s spin %g T=%g theta_k=%g: angular %.10e, brute %.10e",
              model, pt->spin, T, tks[i], r.val, v);
  }
  gsl_integration_qag(&f, 0.0, BL_PI, 0.0, 1e-7, 1000, GSL_INTEG_GAUSS61, w3,
                      &v, &e);
  if (theta_scale < 0.1) {   /* resolve the forward cone explicitly */
    double a, ea, c2, ec;
    gsl_integration_qag(&f, 0.0, 30.0 * theta_scale, 0.0, 1e-8, 1000,
                        GSL_INTEG_GAUSS61, w3, &a, &ea);
    gsl_integration_qag(&f, 30.0 * theta_scale, BL_PI, 0.0, 1e-8, 1000,
                        GSL_INTEG_GAUSS61, w3, &c2, &ec);
    v = a + c2;
  }
  cr_assert_eq(bl_dcs_dk_e(&b.c, k, b.q, &r), BL_SUCCESS);
  cr_expect(fabs(r.val / v - 1.0) < 1e-6,
            "%s spin %g T=%g: dsdk %.10e, integral of angular %.10e",
            model, pt->spin, T, r.val, v);
  gsl_integration_workspace_free(w3);
  gsl_integration_workspace_free(b.w1);
  gsl_integration_workspace_free(b.w2);
  bl_quad_free(b.q);
}


/* The full target factor: atomic electrons (pole pairs with q^-2), the
** uniform nucleus (poles split into singles for light projectiles) and the
** Elwert factor, through the same two steps. */
Test(integration, full_target_factor) {
  const double tks[] = {0.0, 0.3, 1.0, 2.5};
  const double tkm[] = {0.0, 0.05, 0.3, 1.5};
  bl_opts o = bl_opts_default;
  check_case(bl_particle_find("electron"), "exponential", 1.0, 0.4, tks, 4, 1,
             &o);
  check_case(bl_particle_find("muon"), "exponential", 1000.0, 400.0, tkm, 4,
             0.1, &o);
}


Test(integration, low_energy_both_spins) {
  bl_particle s0 = *bl_particle_find("electron");
  const double tks[] = {0.0, 0.3, 1.0, 2.5};
  s0.spin = 0.0;
  check_case(bl_particle_find("electron"), "exponential", 1.0, 0.4, tks, 4, 1,
             NULL);
  check_case(&s0, "exponential", 1.0, 0.4, tks, 4, 1, NULL);
  check_case(bl_particle_find("electron"), "none", 0.05, 0.01, tks, 4, 1,
             NULL);
}


Test(integration, high_energy_both_spins) {
  bl_particle s0 = *bl_particle_find("electron");
  const double tks[] = {2e-4, 5e-4, 3e-3};
  double gamma = 1.0 + 1000.0 / BL_ME_MEV;
  s0.spin = 0.0;
  check_case(bl_particle_find("electron"), "exponential", 1000.0, 300.0, tks,
             3, 1.0 / gamma, NULL);
  check_case(&s0, "exponential", 1000.0, 300.0, tks, 3, 1.0 / gamma, NULL);
}


/*
** Far corners of the parameter space (beyond the 1e6 m of the accuracy
** claim too): every dsigma/dk is finite and positive with a finite error;
** a point that misses the tolerance says so; none runs away (the call
** budget of src/core/born/dcs.c bounds the work).  Inside T/m <= 1e6 with screening,
** the tolerance is met.  Regression: h rounded below 0 once gave NaN here.
*/
Test(integration, corners_finite) {
  static const char *const parts[] = {"electron", "muon", "proton"};
  static const char *const models[] = {"none", "exponential"};
  static const double T[] = {1e-3, 1.0, 1e3, 1e6, 1e9};
  static const double y[] = {1e-6, 0.3, 1.0 - 1e-6};
  bl_quad *q = bl_quad_alloc(1000);
  size_t a, b, i, j;
  for (a = 0; a < 3; a++)
    for (b = 0; b < 2; b++)
      for (i = 0; i < 5; i++)
        for (j = 0; j < 3; j++) {
          const bl_particle *p = bl_particle_find(parts[a]);
          bl_case c;
          bl_result r;
          int st;
          cr_assert_eq(bl_case_init(&c, p, 82, bl_model_find(models[b]), NULL,
                                    T[i]), BL_SUCCESS);
          bl_quad_reset_calls(q);
          st = bl_dcs_dk_e(&c, y[j] * T[i], q, &r);
          cr_expect(isfinite(r.val) && r.val > 0.0 && isfinite(r.err)
                    && r.err >= 0.0,
                    "%s %s T=%g y=%g: %g +- %g (status %d)", parts[a],
                    models[b], T[i], y[j], r.val, r.err, st);
          cr_expect(st == BL_SUCCESS || (r.warn & BL_WARN_TOLERANCE),
                    "%s %s T=%g y=%g: status %d without tolerance warning",
                    parts[a], models[b], T[i], y[j], st);
          cr_expect(bl_quad_calls(q) < 8000000UL, "%s %s T=%g y=%g: %lu calls",
                    parts[a], models[b], T[i], y[j], bl_quad_calls(q));
          if (b == 1 && T[i] / p->mass <= 1e6)
            cr_expect(st == BL_SUCCESS && r.err <= 1e-4 * r.val,
                      "%s exponential T=%g y=%g: status %d, err/val %.2g",
                      parts[a], T[i], y[j], st, r.err / r.val);
        }
  bl_quad_free(q);
}


/*
** Internal consistency (issue 14, item 5): the call budget of one dsigma/dk
** (CALL_BUDGET = 5e6 in src/core/born/dcs.c) holds for every combination.
** A heavy projectile (100 GeV) on a bare uniform nucleus at T = m is the
** worst found: its elastic field at q >> 1/R is a cancellation of poles
** far below their rounding, and the outer integral went on bisecting
** after the budget had switched the inner ones to single panels (7.66e6
** calls before, 5.01e6 now).  Such points return their best estimate,
** finite and positive, with the tolerance warning and a soft status.
*/
Test(integration, budget_holds_heavy_bare_uniform, .timeout = 60) {
  static const double ys[] = {0.7, 0.99};
  static const double spins[] = {0.5, 0.0};
  bl_quad *q = bl_quad_alloc(1000);
  size_t i;
  cr_assert_eq(bl_quad_set_rtol(q, 1e-4), BL_SUCCESS);
  for (i = 0; i < 2; i++) {
    bl_particle p = {"heavy", 1e5, -1.0, 0.0, 0u};
    bl_opts o = bl_opts_bare;
    bl_case c;
    bl_result r;
    int st;
    p.spin = spins[i];
    o.nucleus = BL_NUCLEUS_UNIFORM;
    cr_assert_eq(bl_case_setup(&c, &p, 82, bl_model_find("none"), NULL,
                               1e5, &o), BL_SUCCESS);
    bl_quad_reset_calls(q);
    st = bl_dcs_dk_e(&c, ys[i] * c.T, q, &r);
    cr_expect(bl_quad_calls(q) <= 5000000UL + 50000UL,
              "spin %g y=%g: %lu calls", p.spin, ys[i], bl_quad_calls(q));
    cr_expect(isfinite(r.val) && r.val > 0.0 && isfinite(r.err),
              "spin %g y=%g: %g +- %g", p.spin, ys[i], r.val, r.err);
    cr_expect(st == BL_SUCCESS || (bl_status_soft(st)
                                   && (r.warn & BL_WARN_TOLERANCE)),
              "spin %g y=%g: status %d, warn 0x%x", p.spin, ys[i], st,
              r.warn);
  }
  bl_quad_free(q);
}


/* ==================================================================
** checks of the reference formulas in tests/ref/kochmotz.c
**
** These tests validate our transcriptions of the published closed forms
** (Koch & Motz 1959, Schiff 1951, Low 1958) before they are used to judge the
** numerical core: known limits, algebraic identities between the formulas,
** and an independent numerical integration.  No library call is made here.
** (formerly tests/test_refs.c)
*/

TestSuite(refs, .init = setup);

static const double ys[] = { 0.01, 0.1, 0.3, 0.5, 0.7, 0.9, 0.99 };
#define NY (sizeof ys / sizeof ys[0])


/*
** 3BN -> 3BN(a) (Koch & Motz 1959, 3BN(a) is the non-relativistic limit of
** 3BN).  The neglected terms are O(beta^2) = O(T/m) relative: expanding 3BN
** in p0, p gives 3BN(a) (1 + c T/m) with c ~ 1 (our evaluation: 1.1e-4 at
** T/m = 1e-4, 1.1e-5 at 1e-5).  Tolerance 10 T/m at two energies, so the
** check also shows the approach is linear in T/m.
*/
Test(refs, bn_nonrelativistic_limit) {
  static const double t0s[] = { 1e-4, 1e-6 };
  size_t i, j;
  for (i = 0; i < 2; i++)
    for (j = 0; j < NY; j++) {
      double t0 = t0s[i], k = ys[j] * t0;
      EXPECT_REL(km_3bn(t0, k), km_3bn_nr(t0, k), 10.0 * t0,
                 "3BN vs 3BN(a) at T/m=%g y=%g", t0, ys[j]);
    }
}


/*
** 3BN -> 3BN(b) (Koch & Motz 1959, 3BN(b) is the extreme-relativistic limit
** of 3BN).  3BN(b) keeps the constant -1/2 beside ln(2 E0 E/k), so what it
** drops is not O(1/ln) but powers: expanding 3BN for E0, E >> 1 the first
** neglected terms are O((E0/E) ln(E)/E^2) relative.  With E >= 1e3
** (T/m = 1e5, y <= 0.99) that is <~ 1e-5; at T/m = 1e7 (E >= 1e5) <~ 1e-8.
*/
Test(refs, bn_extreme_relativistic_limit) {
  static const double t0s[] = { 1e5, 1e7 };
  static const double tol[] = { 1e-5, 1e-8 };
  size_t i, j;
  for (i = 0; i < 2; i++)
    for (j = 0; j < NY; j++) {
      double t0 = t0s[i], k = ys[j] * t0;
      EXPECT_REL(km_3bn(t0, k), km_3bn_er(t0, k), tol[i],
                 "3BN vs 3BN(b) at T/m=%g y=%g", t0, ys[j]);
    }
}


/*
** 3BN at intermediate energies, where neither limit applies.  Reference
** values: an independent numerical integration (SciPy quad, epsrel 1e-10,
** 200-point Gauss-Legendre in the azimuth) of the Bethe-Heitler (1934)
** triply differential Born cross section for a point nucleus, in the form
** of Bethe & Heitler 1934 (Koch & Motz 1959, 2BN; spin 1/2,
** G = Z^2), over both photon and electron directions, in units of
** Z^2 alpha r0^2 / m.  Integration accuracy ~1e-10; tolerance 1e-9.
*/
Test(refs, bn_against_numerical_integration) {
  static const struct { double t0, y, want; } pts[] = {
    { 1.0,  0.5, 17.06499466800008 },
    { 1.0,  0.1, 231.9815871576975 },
    { 1.0,  0.9, 2.5949242227868132 },
    { 4.0,  0.3, 10.354022718576166 },
    { 0.1,  0.5, 982.5259050679384 },
    { 30.0, 0.2, 3.742818999370855 },
  };
  size_t i;
  for (i = 0; i < sizeof pts / sizeof pts[0]; i++)
    EXPECT_REL(km_3bn(pts[i].t0, pts[i].y * pts[i].t0), pts[i].want, 1e-9,
               "3BN vs numerical BH integral at T/m=%g y=%g",
               pts[i].t0, pts[i].y);
}


/*
** 3BS(e) without screening (a -> infinity, b -> 0): Schiff's formula turns
** into 3BN(b) exactly (algebraic identity of the two printed formulas, Koch &
** Motz 1959).  a = INFINITY takes b = 0; a = 1e15 goes through the small-b
** series of the second bracket.  Rounding only: 1e-12.
*/
Test(refs, schiff_unscreened_is_3bn_b) {
  static const double t0s[] = { 10.0, 1e3, 1e5 };
  size_t i, j;
  for (i = 0; i < 3; i++)
    for (j = 0; j < NY; j++) {
      double t0 = t0s[i], k = ys[j] * t0;
      EXPECT_REL(km_3bse(t0, k, INFINITY), km_3bn_er(t0, k), 1e-12,
                 "3BS(e) a=inf vs 3BN(b) at T/m=%g y=%g", t0, ys[j]);
      EXPECT_REL(km_3bse(t0, k, 1e15), km_3bn_er(t0, k), 1e-12,
                 "3BS(e) a=1e15 vs 3BN(b) at T/m=%g y=%g", t0, ys[j]);
    }
}


/*
** 3BS(e) with complete screening (b = 2 E0 E/(k a) -> infinity) equals Koch &
** Motz 3BS(a):  4 (1/k) {(1 + v^2 - 2v/3) ln(183 Z^-1/3) + v/9},  v = E/E0.
** Schiff's limit has ln(111 Z^-1/3) + 1/2 = ln(183.006 Z^-1/3): Koch & Motz
** round 111 e^(1/2) to 183, a 4e-5 shift of a log of ~4, plus the finite-b
** term 2 atan(b)/b ~ pi/b (b >= 1e6 here).  Tolerance 1e-4.
*/
Test(refs, schiff_complete_screening_is_3bs_a) {
  static const int Zs[] = { 6, 29, 82 };
  static const double yc[] = { 1e-4, 1e-3, 1e-2 };
  size_t i, j;
  for (i = 0; i < 3; i++)
    for (j = 0; j < 3; j++) {
      double t0 = 1e9, k = yc[j] * t0, v = (1.0 + t0 - k) / (1.0 + t0);
      double a = km_schiff_radius(Zs[i], 1.0);
      double want = 4.0 / k * ((1.0 + v * v - 2.0 / 3.0 * v)
                               * log(183.0 * pow(Zs[i], -1.0 / 3.0)) + v / 9.0);
      EXPECT_REL(km_3bse(t0, k, a), want, 1e-4,
                 "3BS(e) vs 3BS(a) at Z=%d y=%g", Zs[i], yc[j]);
    }
}


/*
** Continuity of 3BS(e) across b = 0.5, where our evaluation of the second
** bracket switches from its power series to the closed form.  Both sides of
** the switch must agree to rounding (1e-12).
*/
Test(refs, schiff_series_switch_is_continuous) {
  double t0 = 1e4, k = 0.5 * t0, E0 = 1.0 + t0, E = E0 - k;
  double r = 2.0 * E0 * E / k;
  double lo = km_3bse(t0, k, r / (0.5 * (1.0 - 1e-13)));
  double hi = km_3bse(t0, k, r / (0.5 * (1.0 + 1e-13)));
  EXPECT_REL(lo, hi, 1e-12, "3BS(e) across b = 0.5 (T/m=%g)", t0);
}


/* Screening-function form (the high-energy formulation of Bethe &
** Heitler 1934, Tsai 1974 Rev. Mod. Phys. 46, 815 sec. 3) for exponential
** screening (1 - F/Z)^2 = (qa)^4/(1 + (qa)^2)^2, integrated in s = ln q. */
typedef struct { double delta, a; int which; } phi_par;

static double phi_integrand (double s, void *vp) {
  const phi_par *pp = vp;
  double q = exp(s), d = pp->delta, qa2 = q * q * pp->a * pp->a;
  double sc = qa2 / (1.0 + qa2);
  double f;
  sc *= sc;
  if (pp->which == 1)
    f = (q - d) * (q - d) / (q * q * q);
  else
    f = (q * q * q - 6.0 * d * d * q * log(q / d) + 3.0 * d * d * q
         - 4.0 * d * d * d) / (q * q * q * q);
  return f * sc * q;   /* dq = q ds */
}

static double phi_screen (int which, double delta, double a) {
  gsl_integration_workspace *w = gsl_integration_workspace_alloc(500);
  phi_par pp = { delta, a, which };
  gsl_function F = { phi_integrand, &pp };
  double res = 0.0, err = 0.0;
  int st = gsl_integration_qag(&F, log(delta), 0.0, 0.0, 1e-11, 500,
                               GSL_INTEG_GAUSS61, w, &res, &err);
  gsl_integration_workspace_free(w);
  cr_assert(st == GSL_SUCCESS, "phi%d integral: %s", which, gsl_strerror(st));
  return (which == 1 ? 4.0 : 10.0 / 3.0) + 4.0 * res;
}


/*
** 3BS(e) at intermediate screening (b from 2e4 down to 0.2) against the
** screening-function form of the Born cross section,
**   dsigma/dk = (1/k) [(1 + v^2) phi1(delta) - (2/3) v phi2(delta)],
**   delta = k/(2 E0 E)
** (Tsai 1974, Rev. Mod. Phys. 46, 815, section 3; measured against
** Schiff: 5e-4).  Both are high-energy forms of the same Born integral; they differ
** by terms O(delta) (upper limit q = 1 of the phi integrals) and O(1/a^2).
** With T/m = 2e7, delta <= 2.5e-4, and a >= 2e3: our evaluation agrees to
** <= 7e-5 (SciPy check of the same pair); tolerance 2e-4.
*/
Test(refs, schiff_against_screening_functions) {
  static const double as[] = { 2e3, 2e4 };
  static const double yv[] = { 0.5, 0.9, 0.99, 0.999, 0.9999 };
  size_t i, j;
  for (i = 0; i < 2; i++)
    for (j = 0; j < 5; j++) {
      double t0 = 2e7, k = yv[j] * t0, E0 = 1.0 + t0, E = E0 - k;
      double v = E / E0, delta = k / (2.0 * E0 * E);
      double want = ((1.0 + v * v) * phi_screen(1, delta, as[i])
                     - 2.0 / 3.0 * v * phi_screen(2, delta, as[i])) / k;
      EXPECT_REL(km_3bse(t0, k, as[i]), want, 2e-4,
                 "3BS(e) vs phi1/phi2 at a=%g y=%g (b=%.3g)", as[i], yv[j],
                 2.0 * E0 * E / (k * as[i]));
    }
}


/*
** Low's formula, internal consistency: (a) spin 0 and spin 1/2 differ only by
** the Mott factor (4 E0^2 - q^2)/(4 E0^2) (Mott vs Rutherford elastic Born
** cross sections inserted in Low 1958); with q taken at its elastic value
** 2 p0 sin(theta_p/2) the ratio is exact up to O(k): tolerance 1e-3 at
** k/T = 1e-4.  (b) Mirror symmetry: the configuration at azimuth -phi is the
** reflection of the one at phi, so the cross section is the same (rounding).
*/
Test(refs, low_spin_ratio_and_mirror_symmetry) {
  double t0 = 1.0, k = 1e-4;
  double tk = 0.3, tp = 0.5, ph = 1.0;
  double s0 = km_low(0.0, t0, k, tk, tp, ph), s1 = km_low(0.5, t0, k, tk, tp, ph);
  double E0 = 1.0 + t0, p0 = sqrt(t0 * (t0 + 2.0));
  double qel = 2.0 * p0 * sin(0.5 * tp);
  double mott = 1.0 - qel * qel / (4.0 * E0 * E0);
  EXPECT_REL(s1 / s0, mott, 1e-3,
             "Low spin 1/2 / spin 0 vs Mott factor (k/T=%g)", k / t0);
  EXPECT_REL(km_low(0.5, t0, k, tk, tp, -ph), s1, 1e-12,
             "Low at -phi vs phi (phi=%g)", ph);
  EXPECT_REL(km_low(0.0, t0, k, tk, tp, 2.0 * 3.14159265358979323846 - ph),
             s0, 1e-12, "Low at 2pi-phi vs phi (phi=%g)", ph);
}


/* ==================================================================
** the uniform-sphere nucleus and the complete-screening limit of the
** Born integral (moved from the real-atoms suite)
** (formerly tests/test_target.c)
*/

TestSuite(born, .init = setup);

/* ---- the uniform-sphere fit (src/core/born/nucleus.c) ---- */

static double logmoment_f (double x, void *p) {
  (void)p;
  return (bl_nucleus_ff2(x) - bl_nucleus_ff2_fit(x)) / x;
}


/* Source: the form factor of a uniformly charged sphere, 3 (sin x - x cos x)
** / x^3 (common practice, R = 1.2 A^1/3 fm).  Bounds: the errors measured
** when the fit was made (src/core/born/nucleus.c header), rounded up. */
Test(born, nucleus_fit) {
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

/* Source: Tsai 1974 (Rev. Mod. Phys. 46, 815: F_N matters once q ~ hbar
** c/R is reached, for muons and heavier projectiles at high energy); the checks.  Measured: muon 1 TeV on Pb, y = 0.5:
** uniform / point = 0.78; electron 100 MeV on Pb, y = 0.5, Born:
** 1 - 9.7e-4 (y = 0.1: 1 - 1.05e-3), from the large-angle hard
** scatterings, q > hbar c / R, that the exact Born integral keeps.  The
** comparison is made without the Coulomb correction, which is a
** point-nucleus quantity subtracted from both: with it the same absolute
** change is 1.06e-3 of the smaller corrected value. */
Test(born, nuclear_size) {
  bl_opts p = bl_opts_default, u = bl_opts_default;
  double a, b;
  p.coulomb = u.coulomb = BL_APPLY_OFF;
  p.nucleus = BL_NUCLEUS_POINT;
  a = dsdk_opts("muon", 82, "thomas-fermi", 1e6, 0.5, &p, 1e-6, NULL);
  b = dsdk_opts("muon", 82, "thomas-fermi", 1e6, 0.5, &u, 1e-6, NULL);
  cr_expect(b < 0.9 * a, "muon 1 TeV Pb: uniform %g vs point %g", b, a);
  a = dsdk_opts("electron", 82, "thomas-fermi", 100.0, 0.5, &p, 1e-7, NULL);
  b = dsdk_opts("electron", 82, "thomas-fermi", 100.0, 0.5, &u, 1e-7, NULL);
  cr_expect(fabs(b / a - 1.0) < 1e-3, "electron 100 MeV Pb: uniform/point "
            "- 1 = %g", b / a - 1.0);
}


/* The nuclear (elastic) and electron parts of case c's target factor W at
** q^2 = x (units of the projectile mass). */
static void wparts (const bl_case *c, double x, double *el, double *e) {
  *el = bl_target_w(x, c->npole, c->pole, c->single_el, c->nelastic,
                    c->term);
  *e = bl_target_w(x, c->npole, c->pole, c->single_e, c->nterm - c->nelastic,
                   c->term + c->nelastic);
}


/* ---- the nucleus's incoherent part (BL_NUCLEUS_INCOHERENT) ---- */

/*
** The target factor with the incoherent part is the uniform nucleus's plus
** Z (1 - F_N^2) / (Z^2 q^4) in its nuclear (elastic) part, F_N the fit of
** nucleus.c, times F_p^2 with the projectile's form factor; the electron
** part is unchanged.  Source: the closure sum over the excited states of
** Z uncorrelated protons, sum_f |<f| sum_p e^{iqr_p} |0>|^2 = Z (1 - F_N^2)
** (common practice; the form behind Kelner, Kokoulin & Petrukhin's
** D_n^(1 - 1/Z), from memory): the partial fractions of case.c checked as
** an identity from far below the nuclear scale to the case's largest
** transfer.
*/
Test(born, nucleus_incoherent_target_factor) {
  static const char *const names[] = {"muon", "pion+", "proton"};
  static const int Zs[] = {2, 11, 26, 82};
  size_t i, j;
  int ff;
  for (i = 0; i < 3; i++)
    for (j = 0; j < 4; j++)
      for (ff = 0; ff < 2; ff++) {
        const bl_particle *p = bl_particle_find(names[i]);
        bl_opts o = bl_opts_default;
        bl_case u, n;
        double rm, lam = 0.0, lx, r = bl_particle_radius(p);
        if (ff && !(r > 0.0))
          continue;
        cr_assert_eq(bl_case_setup(&u, p, Zs[j], bl_model_find("hartree-fock"),
                                   NULL, 1e4, &o), BL_SUCCESS);
        o.nucleus = BL_NUCLEUS_INCOHERENT;
        cr_assert_eq(bl_case_setup(&n, p, Zs[j], bl_model_find("hartree-fock"),
                                   NULL, 1e4, &o), BL_SUCCESS);
        if (ff) {
          cr_assert_eq(bl_case_set_formfactor(&u, r), BL_SUCCESS);
          cr_assert_eq(bl_case_set_formfactor(&n, r), BL_SUCCESS);
          rm = r * p->mass / BL_HBARC_MEVFM;
          lam = 6.0 / (rm * rm);
        }
        rm = n.R * p->mass / BL_HBARC_MEVFM;   /* R in units of 1/m */
        for (lx = -10.0; lx <= 6.0; lx += 0.125) {
          double x = pow(10.0, lx) / (rm * rm);   /* q^2, units of m^2 */
          double fp = lam > 0.0 ? lam / (lam + x) : 1.0;
          double inc = fp * fp * (1.0 - bl_nucleus_ff2_fit(sqrt(x) * rm))
                       / (Zs[j] * x * x);
          double eu, en, iu, in;
          wparts(&u, x, &eu, &iu);
          wparts(&n, x, &en, &in);
          if (x > n.qmax2)
            break;
          /* with F_p, rounding relative to the point-charge size, as in
          ** formfactor::target_factor_times_ff2 */
          cr_expect(fabs(en - eu - inc) <= 1e-6 * inc + 1e-5 * inc / (fp * fp)
                                           * ff + 1e-9 * fabs(eu),
                    "%s Z=%d ff %d q R = %g: incoherent %.12g against %.12g "
                    "(elastic %.6g)", names[i], Zs[j], ff, sqrt(x) * rm,
                    en - eu, inc, eu);
          cr_expect(fabs(in - iu) <= 1e-12 * fabs(iu), "%s Z=%d: the "
                    "electron part moved", names[i], Zs[j]);
        }
      }
}


/*
** Consequence used by the high-energy method (src/core/methods/nucsize.c)
** and the KKP form's D_n^(1 - 1/Z): since F/Z of the atom is ~ 0 where
** 1 - F_N is not, Born with the incoherent part is (1 - 1/Z) times the
** uniform nucleus's plus 1/Z times the point nucleus's (screened, no
** electrons).  Internal identity, no outside source; measured at rtol
** 1e-9: at most 2e-8 (4.5e-8 for the pion on Pb, three integrals' errors).
*/
Test(born, nucleus_incoherent_is_closure_mix, .timeout = 120) {
  static const struct { const char *name; int Z; double T, y; } pts[] = {
    {"muon", 26, 1e4, 0.1}, {"muon", 26, 1e4, 0.9}, {"muon", 11, 1e3, 0.5},
    {"pion-", 82, 1e5, 0.5}, {"proton", 6, 2e3, 0.3},
    {"electron", 82, 100.0, 0.5}
  };
  size_t i;
  for (i = 0; i < sizeof pts / sizeof pts[0]; i++) {
    bl_opts o = bl_opts_bare;
    double a, b, n, Z = pts[i].Z;
    o.nucleus = BL_NUCLEUS_UNIFORM;
    a = dsdk_opts(pts[i].name, pts[i].Z, "hartree-fock", pts[i].T, pts[i].y,
                  &o, 1e-9, NULL);
    o.nucleus = BL_NUCLEUS_POINT;
    b = dsdk_opts(pts[i].name, pts[i].Z, "hartree-fock", pts[i].T, pts[i].y,
                  &o, 1e-9, NULL);
    o.nucleus = BL_NUCLEUS_INCOHERENT;
    n = dsdk_opts(pts[i].name, pts[i].Z, "hartree-fock", pts[i].T, pts[i].y,
                  &o, 1e-9, NULL);
    cr_expect(fabs(n / ((1.0 - 1.0 / Z) * a + b / Z) - 1.0) <= 2e-7,
              "%s Z=%d T=%g y=%g: incoherent %.12g, mix %.12g (uniform %.8g, "
              "point %.8g)", pts[i].name, pts[i].Z, pts[i].T, pts[i].y, n,
              (1.0 - 1.0 / Z) * a + b / Z, a, b);
    cr_log_info("%s Z=%d T=%g y=%g: incoherent/uniform %.6f, identity %.2g",
                pts[i].name, pts[i].Z, pts[i].T, pts[i].y, n / a,
                n / ((1.0 - 1.0 / Z) * a + b / Z) - 1.0);
  }
}


/* ---- complete screening (Tsai 1974) ---- */

/* Tsai's complete-screening dsigma/dk (Tsai 1974, Rev. Mod. Phys. 46, 815,
** eq. 3.83), with or without the atomic electrons and f. */
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
Test(born, tsai_complete_screening, .timeout = 120) {
  static const int Zs[] = {6, 29, 82};
  static const double ys[] = {0.1, 0.5, 0.9};
  size_t i, j;
  for (i = 0; i < 3; i++)
    for (j = 0; j < 3; j++) {
      bl_opts o = bl_opts_default;
      bl_result r;
      double v = dsdk_opts("electron", Zs[i], "thomas-fermi", 1e5, ys[j], &o, 1e-5,
                      &r);
      cr_expect(r.applied & BL_APPLIED_COULOMB);
      EXPECT_REL(v, tsai(Zs[i], 1e5, ys[j], 1, 1), 0.01, "Z=%d y=%g", Zs[i],
                 ys[j]);
    }
}


/* The electron part alone: with the inelastic radius fixed by L'_rad
** (src/core/models/exponential.c, src/core/models/thomas_fermi.c), electrons on minus off
** is Tsai's Z L'_rad term at complete screening, within 1 %. */
Test(born, electron_part_complete_screening) {
  static const char *const models[] = {"exponential", "thomas-fermi"};
  static const int Zs[] = {1, 6, 82};
  size_t i, j;
  for (i = 0; i < 2; i++)
    for (j = 0; j < 3; j++) {
      bl_opts on = bl_opts_bare, off = bl_opts_bare;
      double a, b, want;
      on.electrons = 1;
      a = dsdk_opts("electron", Zs[j], models[i], 1e5, 0.5, &on, 1e-6, NULL);
      b = dsdk_opts("electron", Zs[j], models[i], 1e5, 0.5, &off, 1e-6, NULL);
      want = tsai(Zs[j], 1e5, 0.5, 1, 0) - tsai(Zs[j], 1e5, 0.5, 0, 0);
      EXPECT_REL(a - b, want, 0.01, "%s Z=%d", models[i], Zs[j]);
    }
}


/*
** The projectile's charge form factor (bl_case_set_formfactor): the target
** factor rebuilt with it is F_p^2 times the point-charge one, elastic and
** electron parts alike, F_p = lam/(lam + q^2), lam = 6/r^2 (a monopole of
** mean square radius r^2) -- the partial fractions of src/core/born/case.c
** checked as an identity at momentum transfers from far below the atomic
** scale up to the largest of the case (qmax2), to 1e-5 of the point-charge
** factor: where F_p^2 is small the rebuilt factor is a difference of terms
** of the point-charge size, so its rounding is relative to that (measured
** at most 4.4e-6, at q^2 > 17 lam where F_p^2 < 0.003).
*/
Test(formfactor, target_factor_times_ff2) {
  static const char *const names[] = {"pion+", "kaon-", "proton"};
  static const int Zs[] = {1, 6, 29, 82};
  size_t i, j;
  for (i = 0; i < 3; i++)
    for (j = 0; j < 4; j++) {
      const bl_particle *p = bl_particle_find(names[i]);
      bl_opts o = bl_opts_default;
      bl_case pt, ff;
      double r = bl_particle_radius(p), rm, lam, lx;
      cr_assert(r > 0.0, "%s has a radius", names[i]);
      cr_assert_eq(bl_case_setup(&pt, p, Zs[j], bl_model_find("hartree-fock"),
                                 NULL, 1e3, &o), BL_SUCCESS);
      ff = pt;
      cr_assert_eq(bl_case_set_formfactor(&ff, r), BL_SUCCESS);
      rm = r * p->mass / BL_HBARC_MEVFM;
      lam = 6.0 / (rm * rm);
      for (lx = -12.0; lx <= 4.0; lx += 0.25) {
        double x = pow(10.0, lx) * lam, f = lam / (lam + x);
        double e0, e1, i0, i1;
        wparts(&pt, x, &e0, &i0);
        wparts(&ff, x, &e1, &i1);
        if (x > pt.qmax2)
          break;
        cr_expect(fabs(e1 - f * f * e0) <= 1e-5 * fabs(e0),
                  "%s Z=%d elastic x/lam=%g: %.15g against %.15g (F^2 %g)",
                  names[i], Zs[j], x / lam, e1, f * f * e0, f * f);
        cr_expect(fabs(i1 - f * f * i0) <= 1e-5 * fabs(i0),
                  "%s Z=%d electrons x/lam=%g: %.15g against %.15g (F^2 %g)",
                  names[i], Zs[j], x / lam, i1, f * f * i0, f * f);
      }
    }
}


/* The size the point-charge warning reports: it vanishes with the radius
** (1e-4 fm: below 1e-6 of the value), is negative (the form factor only
** removes momentum transfers), and bad radii are refused. */
Test(formfactor, effect_limits) {
  const bl_particle *p = bl_particle_find("proton");
  bl_material m;
  bl_target t;
  bl_quad *q = bl_quad_alloc(1000);
  bl_tresult a, b, c;
  bl_case cs;
  cr_assert_eq(bl_material_element(&m, 82), BL_SUCCESS);
  cr_assert_eq(bl_target_setup(&t, p, &m, bl_model_find("hartree-fock"), NULL,
                               1e3, &bl_opts_default, BL_METHOD_BORN, NULL,
                               NULL), BL_SUCCESS);
  cr_assert_eq(bl_target_prepare(&t, q, NULL), BL_SUCCESS);
  bl_quad_set_rtol(q, 1e-8);
  cr_assert_eq(bl_target_born_dk_e(&t, 300.0, 1, 0.0, q, &a), BL_SUCCESS);
  cr_assert_eq(bl_target_born_dk_e(&t, 300.0, 1, 1e-4, q, &b), BL_SUCCESS);
  EXPECT_REL(b.r.val, a.r.val, 1e-6, "radius 1e-4 fm");
  bl_quad_set_rtol(q, 1e-4);
  cr_assert_eq(bl_target_born_dk_e(&t, 300.0, 1, bl_particle_radius(p), q,
                                   &c), BL_SUCCESS);
  cr_expect(c.r.val < a.r.val && c.r.val > 0.0, "%g vs %g", c.r.val, a.r.val);
  cr_expect_eq(bl_target_born_dk_e(&t, 300.0, 1, -1.0, q, &c), BL_EDOMAIN);
  cs = t.c[0];
  cr_expect_eq(bl_case_set_formfactor(&cs, 0.0), BL_EDOMAIN);
  cr_expect_eq(bl_case_set_formfactor(&cs, NAN), BL_EDOMAIN);
  cr_expect_eq(bl_particle_radius(bl_particle_find("muon")), 0.0);
  bl_target_release(&t);
  bl_quad_free(q);
}


/*
** The loose tolerance rtol 1e-2, where the forward outer range is
** integrated in s = hc0/(h0 + hc0) (src/core/born/dcs.c, outer_s): from
** 10 keV to 100 TeV (hc0 from ~10 down to ~1e-17, where a map through
** 1 - s would lose every digit), with and without screening, both spins,
** y from the bottom to the tip; each value within rtol of the same point
** at rtol 1e-8, with an error estimate within rtol too and no tolerance
** warning.  (make error-sweep: 99.98 % of its 9,672 points within 1e-2.)
*/
Test(integration, loose_rtol_forward_map) {
  static const double Ts[] = { 0.01, 1.0, 100.0, 1e5, 1e8 };
  static const double ys[] = { 1e-3, 0.5, 0.99 };
  static const char *const models[] = { "none", "exponential" };
  bl_particle s0 = *preset("electron");
  const bl_particle *pts[3];
  bl_quad *q2 = bl_quad_alloc(200), *q8 = bl_quad_alloc(200);
  size_t i, j, m, p;
  int ncmp = 0;
  s0.spin = 0.0;
  pts[0] = preset("electron");
  pts[1] = &s0;
  pts[2] = preset("muon");
  cr_assert(q2 != NULL && q8 != NULL);
  cr_assert(bl_quad_set_rtol(q2, 1e-2) == BL_SUCCESS);
  cr_assert(bl_quad_set_rtol(q8, 1e-8) == BL_SUCCESS);
  for (p = 0; p < 3; p++)
    for (m = 0; m < 2; m++)
      for (i = 0; i < sizeof Ts / sizeof Ts[0]; i++) {
        bl_case c = make_case(pts[p], 82, models[m], Ts[i]);
        for (j = 0; j < sizeof ys / sizeof ys[0]; j++) {
          bl_result r, ref;
          int st = bl_dcs_dk_e(&c, ys[j] * Ts[i], q2, &r);
          int sr = bl_dcs_dk_e(&c, ys[j] * Ts[i], q8, &ref);
          if (sr != BL_SUCCESS || (ref.warn & BL_WARN_TOLERANCE))
            continue;   /* no reference (unscreened far corner) */
          ncmp++;
          cr_expect(st == BL_SUCCESS && !(r.warn & BL_WARN_TOLERANCE),
                    "%s spin %g %s T=%g y=%g: status %d warn 0x%x",
                    pts[p]->name, pts[p]->spin, models[m], Ts[i], ys[j], st,
                    r.warn);
          cr_expect(fabs(r.val / ref.val - 1.0) <= 1e-2
                    && r.err <= 1e-2 * fabs(r.val),
                    "%s spin %g %s T=%g y=%g: %.8e (err %.2e), rtol 1e-8 "
                    "%.8e", pts[p]->name, pts[p]->spin, models[m], Ts[i],
                    ys[j], r.val, r.err, ref.val);
        }
      }
  cr_expect(ncmp >= 80, "only %d of 90 points had a reference", ncmp);
  bl_quad_free(q2);
  bl_quad_free(q8);
}


/* ==================================================================
** the lanes of the inner panels (kin.c, issue 14)
**
** Internal consistency, no outside source: the exp and expm1 of the
** inner maps against libm's, and the panel kernels (the brackets and the
** closed-form azimuths of up to 21 nodes at once, in lanes) against the
** one-node functions, for every node count of a panel.
*/

TestSuite(lanes);

/* A deterministic spread of points in [0, 1) (golden-ratio steps). */
static double spread (int k) {
  double u = 0.6180339887498949 * k;
  return u - floor(u);
}


Test(lanes, exp_expm1_to_rounding) {
  double x[BL_NODE_MAX], y[BL_NODE_MAX];
  const double far[4] = {-800.0, -745.0, 710.0, 0.0};
  int n, i, r, k = 1;
  for (r = 0; r < 100; r++)
    for (n = 1; n <= 21; n++) {
      for (i = 0; i < n; i++)   /* the range of the maps, and beyond */
        x[i] = -40.0 + 749.0 * spread(k++);
      bl_exp_n(x, n, y);
      for (i = 0; i < n; i++)
        cr_expect(fabs(y[i] - exp(x[i])) <= 4.0 * DBL_EPSILON * exp(x[i]),
                  "exp(%.17g): %.17g, libm %.17g", x[i], y[i], exp(x[i]));
      for (i = 0; i < n; i++) {  /* the series (|x| < 1/2) and exp - 1 */
        double u = spread(k++);
        x[i] = i % 2 ? u - 0.5 : (u < 0.5 ? -1.0 : 1.0) * (0.5 + 79.0 * u);
      }
      bl_expm1_n(x, n, y);
      for (i = 0; i < n; i++)
        cr_expect(fabs(y[i] - expm1(x[i]))
                  <= 4.0 * DBL_EPSILON * fabs(expm1(x[i])),
                  "expm1(%.17g): %.17g, libm %.17g", x[i], y[i],
                  expm1(x[i]));
    }
  bl_exp_n(far, 4, y);   /* past the reduction: libm's own */
  for (i = 0; i < 4; i++)
    cr_expect(y[i] == exp(far[i]), "exp(%g): %g, libm %g", far[i], y[i],
              exp(far[i]));
}


/* The brackets and azimuths of n nodes at h0 (ridge or not) against the
** one-node functions; returns the largest azimuth difference relative to
** the panel's largest value (what the rule's sum feels). */
static double panel_vs_nodes (const bl_case *c, const bl_kin *kn,
                              const bl_wpoles *wp, double h0, int ridge,
                              int n) {
  bl_polar g = {0};
  bl_brackets bn;
  double h[BL_NODE_MAX], dh[BL_NODE_MAX], out[BL_NODE_MAX], worst = 0.0;
  double smax = log1p(2.0 / kn->hc), v[BL_NODE_MAX], vmax = 0.0;
  int i, nl = (n + 3) / 4 * 4;
  (void)c;
  g.h0 = h0;
  g.s0 = sqrt(h0 * (2.0 - h0));
  if (ridge) {   /* as dcs.c sets a ridge up */
    double r = kn->p0 * g.s0 / kn->p, cs = sqrt((1.0 - r) * (1.0 + r));
    cr_assert(r < 1.0);
    g.ridge = 1;
    g.hs = r * r / (1.0 + cs);
    g.ss = r;
    g.qzs = kn->delta - kn->p0 * h0 + kn->p * g.hs;
  }
  for (i = 0; i < nl; i++) {   /* the lanes past n too */
    h[i] = kn->hc * expm1(smax * (i + 0.5) / nl);
    dh[i] = h[i] - g.hs;
  }
  bl_bracket_set_n(kn, &g, n, h, dh, &bn);
  bl_bracket_azimuth_n(&bn, n, wp, out);
  for (i = 0; i < n; i++) {
    bl_bracket b1;
    g.h = h[i];
    g.s = sqrt(h[i] * (2.0 - h[i]));
    g.dh = dh[i];
    bl_bracket_set(kn, &g, &b1);
    cr_expect(b1.L0 == bn.L0[i] && b1.L1 == bn.L1[i] && b1.M0 == bn.M0[i]
              && b1.M1 == bn.M1[i] && b1.Q0 == bn.Q0[i] && b1.b == bn.b[i],
              "node %d of %d (h0 %g, ridge %d): another bracket", i, n, h0,
              ridge);
    v[i] = bl_bracket_azimuth(&b1, wp);
    vmax = fmax(vmax, fabs(v[i]));
    cr_expect(isfinite(out[i]), "node %d: %g", i, out[i]);
  }
  for (i = 0; i < n; i++)   /* relative to the panel's largest value */
    worst = fmax(worst, fabs(out[i] - v[i]) / vmax);
  return worst;
}


Test(lanes, panel_kernel_is_node_kernel) {
  const bl_particle *el = bl_particle_find("electron");
  int cs, n, k;
  for (cs = 0; cs < 2; cs++) {
    bl_case c;
    bl_kin kn;
    bl_wpoles wp;
    double single[BL_POLE_MAX], worst = 0.0;
    int i;
    if (cs == 0)   /* one pole: exponential screening, point nucleus */
      cr_assert_eq(bl_case_init(&c, el, 82, bl_model_find("exponential"),
                                NULL, 10.0), BL_SUCCESS);
    else           /* 13: the defaults (Hartree-Fock, electrons, uniform) */
      cr_assert_eq(bl_case_setup(&c, el, 82, bl_model_find("hartree-fock"),
                                 NULL, 1e4, &bl_opts_default), BL_SUCCESS);
    bl_kin_set(&kn, c.t0, 0.5 * c.t0, c.particle.spin);
    for (i = 0; i < c.npole; i++)
      single[i] = c.single_el[i] + c.single_e[i];
    bl_wpoles_set(&wp, c.npole, c.pole, single, c.nterm, c.term);
    for (n = 1; n <= 21; n++)
      for (k = 0; k < 4; k++) {
        double h0 = kn.hc0 * expm1(log1p(2.0 / kn.hc0) * (k + 0.5) / 8.0);
        double d = panel_vs_nodes(&c, &kn, &wp, h0, 0, n);
        double e = panel_vs_nodes(&c, &kn, &wp, h0, 1, n);
        worst = fmax(worst, fmax(d, e));
      }
    /* one pole: the same operations in the same order; more: the sums
    ** in another order, rounding only (measured 1.4e-15 of the panel's
    ** largest value with 13 poles; node by node up to 1e-8 relative at
    ** the largest angles, where the closed form cancels) */
    if (c.npole < 4)
      cr_expect(worst == 0.0, "%d poles: %.3g", c.npole, worst);
    else
      cr_expect(worst < 1e-12, "%d poles: %.3g", c.npole, worst);
    cr_log_info("lanes: %d poles, largest difference %.3g of the panel's "
                "largest value", c.npole, worst);
  }
}
