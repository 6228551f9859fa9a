/*
** test_refs.c -- checks of the reference formulas in tests/ref/kochmotz.c
** See Copyright Notice in LICENSE
**
** These tests validate our transcriptions of the published closed forms
** (Koch & Motz 1959, Schiff 1951, Low 1958) before they are used to judge the
** numerical core: known limits, algebraic identities between the formulas,
** and an independent numerical integration.  No library call is made here.
*/
#include <math.h>
#include <stdio.h>

#include <criterion/criterion.h>
#include <criterion/new/assert.h>
#include <gsl/gsl_errno.h>
#include <gsl/gsl_integration.h>

#include "kochmotz.h"
#include "testutil.h"

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
** written in physics.md ("fully differential Born cross section", spin 1/2,
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


/* Screening-function form (physics.md, high-energy formulation; Bethe &
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
** (physics.md, "high-energy formulation", verified there against Schiff to
** 5e-4).  Both are high-energy forms of the same Born integral; they differ
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
