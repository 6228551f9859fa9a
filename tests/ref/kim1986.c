/*
** kim1986.c -- the Kim, Pratt, Seltzer & Berger (1986) parametrization of
** the positron/electron radiative stopping-power ratio; for the tests only
** See Copyright Notice in LICENSE
**
** Phys. Rev. A 33 (1986) 3002.  The seven coefficients below are FROM
** MEMORY (not read from the paper); treat any use as +-10 %.  Consistency
** checks in tests/test_corrections.c (suite kim1986): ratio -> 0 as T -> 0
** (tau -> 0), -> 1 as T grows, monotonic in tau over 10 keV .. 50 MeV for
** Z = 6 .. 92, and Pb at 1, 2, 5, 10 MeV near the recalled 0.49, 0.58, 0.69,
** 0.77 (also from memory, so that check tests the transcription, not the
** memory).  The fit's own range of validity is not recalled.
*/
#include <math.h>

#include "kim1986.h"

#define KIM_ME_MEV 0.51099895    /* m_e c^2, CODATA 2018 */

/* a_1 .. a_7 (from memory) */
static const double kim_a[7] = {
  -1.2359e-1, 6.1274e-2, -3.1516e-2, 7.7446e-3, -1.0595e-3, 7.0568e-5,
  -1.8080e-6
};


double kim1986_tau (double Z, double t_mev) {
  if (!(Z > 0.0 && t_mev > 0.0 && isfinite(Z) && isfinite(t_mev)))
    return NAN;
  return log1p(1e6 * t_mev / (Z * Z * KIM_ME_MEV));
}


double kim1986_ratio (double Z, double t_mev) {
  double tau = kim1986_tau(Z, t_mev), s = 0.0;
  int i;
  if (isnan(tau))
    return NAN;
  for (i = 6; i >= 0; i--)          /* Horner: sum a_i tau^(i+1) */
    s = (s + kim_a[i]) * tau;
  return -expm1(s);
}
