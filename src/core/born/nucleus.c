/*
** nucleus.c -- the charge form factor of a uniformly charged sphere and
** the rational form the angular integrals use
** See Copyright Notice in LICENSE
**
** F_N(x) = 3 (sin x - x cos x) / x^3, x = q R, R = 1.2 A^1/3 fm (common
** practice).  The closed-form azimuth needs G(q)/q^4 as a combination of
** products of simple poles 1/(pole + q^2), so F_N is replaced by
**
**   F_N(x) ~ sum_j c_j l_j / (l_j + x^2),   sum_j c_j = 1,
**   sum_j c_j / l_j = 1/10   (the same mean square radius, 3 R^2 / 5),
**
** with the poles fixed on the ladder l_j = 10.5 * 2^j, j = 0..3, and the c_j
** from a constrained linear least-squares fit to F_N on 1500 log-spaced
** points x in [0.01, 100].  Then (1 - F_N)/q^2 = sum_j c_j / (l_j + x^2) in
** units of R^-2, and the elastic factor (F_N - F/Z)/q^2 stays a sum of
** simple poles.  Measured (tests/test_born.c, born::nucleus_fit, checks
** both): |fit^2 - F_N^2| <= 0.0086 for every x, and the logarithmic moment
** int_0^inf (F_N^2 - fit^2) dx/x, which sets the nuclear-size term of the
** high-energy cross section, is 0.003.  Free poles fit better but collapse
** onto each other with coefficients of 1e3: cancellation, not accuracy.
*/

#include <math.h>

#include "born/internal.h"

const double bl_nucleus_pole[BL_NUCLEUS_NPOLE] = {10.5, 21.0, 42.0, 84.0};
const double bl_nucleus_coef[BL_NUCLEUS_NPOLE] = {
  -1.6516769215461076, 9.876532488600825, -10.66785901497968,
  3.4430034479249647
};


double bl_nucleus_ff2 (double x) {
  double f;
  if (fabs(x) < 1e-2) {
    double x2 = x * x;
    f = 1.0 - x2 / 10.0 + x2 * x2 / 280.0;
  }
  else
    f = 3.0 * (sin(x) - x * cos(x)) / (x * x * x);
  return f * f;
}


double bl_nucleus_ff2_fit (double x) {
  double f = 0.0, x2 = x * x;
  int j;
  for (j = 0; j < BL_NUCLEUS_NPOLE; j++)
    f += bl_nucleus_coef[j] * bl_nucleus_pole[j] / (bl_nucleus_pole[j] + x2);
  return f * f;
}


double bl_nucleus_radius (double A) {
  return 1.2 * cbrt(A);   /* fm */
}
