/*
** test_pwdsdk.c -- partial-wave dsigma/dk (src/core/partial/dsdk.c):
** angular factors, the free-field radial integrals, the first Born
** limit, the charge sign, bad input
** See Copyright Notice in LICENSE
**
** Suite: pwdsdk.
*/

#include <math.h>
#include <stdlib.h>

#include <criterion/criterion.h>
#include <gsl/gsl_sf_coupling.h>

#include "brakelight.h"
#include "partial/dsdk.h"
#include "testutil.h"

TestSuite(pwdsdk, .init = setup);

static int lof (int k) { return k > 0 ? k : -k - 1; }
static int j2of (int k) { return 2 * abs(k) - 1; }

/* <l_b||C_L||l_a> = (-1)^l_b sqrt((2l_b+1)(2l_a+1)) (l_b L l_a; 0 0 0)
** (Edmonds 1957, "Angular Momentum in Quantum Mechanics", eq. 5.4.5) */
static double lcred (int lb, int L, int la) {
  return ((lb & 1) ? -1.0 : 1.0) * sqrt((2.0 * lb + 1) * (2.0 * la + 1))
         * gsl_sf_coupling_3j(2 * lb, 2 * L, 2 * la, 0, 0, 0);
}

/* <(l_a 1/2) j_a||C_L||(l_b 1/2) j_b> by recoupling (Edmonds eq. 7.1.7):
** (-1)^(l_a + 1/2 + j_b + L) sqrt((2j_a+1)(2j_b+1)) {l_a j_a 1/2; j_b l_b L}
** <l_a||C_L||l_b> */
static double cref (int ka, int L, int kb) {
  int la = lof(ka), lb = lof(kb), ja = j2of(ka), jb = j2of(kb);
  int ph2 = 2 * la + 1 + jb + 2 * L;          /* twice the exponent */
  double s = ((ph2 / 2) & 1) ? -1.0 : 1.0;
  return s * sqrt((ja + 1.0) * (jb + 1.0))
         * gsl_sf_coupling_6j(2 * la, ja, 1, jb, 2 * lb, 2 * L)
         * lcred(la, L, lb);
}

/* <kb||[Y_L x sigma]_J||ka> by the 9j recoupling of a tensor product
** (Edmonds eq. 7.1.5), <1/2||sigma||1/2> = sqrt(6),
** <l||Y_L||l'> = sqrt((2L+1)/(4 pi)) <l||C_L||l'> */
static double sref (int kb, int ka, int J, int L) {
  int lb = lof(kb), la = lof(ka), jb = j2of(kb), ja = j2of(ka);
  double nj = gsl_sf_coupling_9j(2 * lb, 2 * la, 2 * L, 1, 1, 2, jb, ja,
                                 2 * J);
  return sqrt((jb + 1.0) * (2.0 * J + 1.0) * (ja + 1.0)) * nj * sqrt(6.0)
         * sqrt((2.0 * L + 1.0) / (4.0 * BL_PI)) * lcred(lb, L, la);
}

/* 1. Angular factors: the closed form of <ka||C_L||kb> against GSL's 3j
** and 6j by recoupling, for |kappa| <= 12, L <= 12. */
Test(pwdsdk, cred_recoupling) {
  int ka, kb, L, n = 0;
  double worst = 0.0;
  for (ka = -12; ka <= 12; ka++)
    for (kb = -12; kb <= 12; kb++)
      for (L = 0; L <= 12; L++) {
        double a, b;
        if (ka == 0 || kb == 0)
          continue;
        a = bl_pw_cred(ka, L, kb);
        b = cref(ka, L, kb);
        worst = fmax(worst, fabs(a - b));
        n += fabs(b) > 1e-3;
      }
  cr_expect(worst < 1e-12, "closed form vs recoupling: worst %g", worst);
  cr_expect(n > 1000, "only %d nonzero elements", n);
}

/* 1b. Sum rule: sum_{kb} <ka||C_L||kb>^2 = 2j_a + 1 (the completeness of
** the spinors of one parity and sum over m of a 3j squared, from memory)
** for every L, here with |kb| up to |ka| + L + 1. */
Test(pwdsdk, cred_sumrule) {
  int ka, L, kb;
  for (ka = -15; ka <= 15; ka++)
    for (L = 0; L <= 8; L++) {
      double s = 0.0;
      if (ka == 0)
        continue;
      for (kb = -(abs(ka) + L + 2); kb <= abs(ka) + L + 2; kb++)
        if (kb != 0)
          s += bl_pw_cred(ka, L, kb) * bl_pw_cred(ka, L, kb);
      EXPECT_REL(s, (double)(j2of(ka) + 1), 1e-12, "ka %d L %d", ka, L);
    }
}

/* 1c. <kb||sigma . Y_JL||ka> (closed forms used by dsdk.c) against the 9j
** recoupling, |kappa| <= 9, J <= 8, L = J-1, J, J+1. */
Test(pwdsdk, sred_recoupling) {
  int ka, kb, J, L, n = 0;
  double worst = 0.0;
  for (ka = -9; ka <= 9; ka++)
    for (kb = -9; kb <= 9; kb++)
      for (J = 1; J <= 8; J++)
        for (L = J - 1; L <= J + 1; L++) {
          double a, b;
          if (ka == 0 || kb == 0)
            continue;
          a = bl_pw_sred(kb, ka, J, L);
          b = sref(kb, ka, J, L);
          worst = fmax(worst, fabs(a - b));
          n += fabs(b) > 1e-3;
        }
  cr_expect(worst < 1e-12, "closed form vs 9j: worst %g", worst);
  cr_expect(n > 1000, "only %d nonzero elements", n);
}

/* 1d. Large j: the closed form stays finite and obeys the sum rule at
** |kappa| = 1500 (GSL's 9j overflows there; the 3j does not). */
Test(pwdsdk, cred_large) {
  int ka = -1500, L = 40, kb;
  double s = 0.0;
  for (kb = -(1500 + L + 2); kb <= 1500 + L + 2; kb++)
    if (kb != 0)
      s += bl_pw_cred(ka, L, kb) * bl_pw_cred(ka, L, kb);
  EXPECT_REL(s, 3000.0, 1e-10, "sum rule at kappa -1500");
}

/* 2. Free waves: int_0^inf j_la(pa r) j_lb(pb r) j_L(k r) r^2 dr vanishes
** when pa, pb, k violate the triangle rule (pa > pb + k) and the l's
** obey it with even sum (Gradshteyn & Ryzhik 6.578; from memory): the
** quadrature of dsdk.c must give 0 to 1e-10 of the sum of its pieces. */
Test(pwdsdk, free_triangle) {
  static const double mom[][3] = {
    {1.0, 0.6, 0.3}, {2.78, 2.57, 0.196}, {0.198, 0.0626, 0.0176},
    {0.655, 0.49, 0.12}
  };
  static const int ls[][3] = {
    {0, 0, 0}, {1, 0, 1}, {3, 2, 1}, {5, 4, 3}, {10, 12, 2}, {40, 39, 1},
    {80, 84, 6}, {20, 20, 10}
  };
  size_t a, b;
  for (a = 0; a < sizeof mom / sizeof mom[0]; a++)
    for (b = 0; b < sizeof ls / sizeof ls[0]; b++) {
      double val, scale;
      int st = bl_pw_free3(mom[a][0], ls[b][0], mom[a][1], ls[b][1],
                           mom[a][2], ls[b][2], &val, &scale);
      cr_assert_eq(st, BL_SUCCESS);
      cr_expect(fabs(val) <= 1e-10 * scale && scale > 0.0,
                "p %g %g k %g l %d %d L %d: %g of scale %g (%.2e)",
                mom[a][0], mom[a][1], mom[a][2], ls[b][0], ls[b][1],
                ls[b][2], val, scale, fabs(val) / scale);
    }
}

/* 2b. Positive control: inside the triangle |pa - pb| < k < pa + pb,
** int_0^inf j_0(a r) j_0(b r) j_0(c r) r^2 dr = pi/(4 a b c) (from
** memory; an elementary integral of sines), so the integral of
** (pa r j_0)(pb r j_0) j_0(k r) is pi/(4 k). */
Test(pwdsdk, free_inside) {
  double val, scale;
  cr_assert_eq(bl_pw_free3(1.0, 0, 0.6, 0, 0.5, 0, &val, &scale),
               BL_SUCCESS);
  EXPECT_REL(val, BL_PI / (4.0 * 0.5), 1e-9, "j0 j0 j0 inside");
}
