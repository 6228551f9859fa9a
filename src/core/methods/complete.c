/*
** complete.c -- Tsai's complete-screening dsigma/dk
** See Copyright Notice in LICENSE
*/

#include <math.h>

#include <gsl/gsl_errno.h>

#include "methods/internal.h"


/*
** Complete screening needs small angles (as the high-energy method),
** Delta far below the screening momenta -- Tsai's screening variable
** gamma = 100 m_e k / (E0 E Z^1/3) = 200 Delta / (m_e Z^1/3) below 0.02,
** where the Thomas-Fermi form departs from its limit by about 0.5 % --
** and a nucleus that is point-like at q ~ m (m R < 0.1 hbar c): the
** formula has no nuclear size.
*/
static int complete_valid (const bl_case *c, const bl_kin *kn) {
  double m = c->particle.mass;
  double Delta = m * kn->k / (2.0 * kn->E0 * kn->E);
  return kn->E >= BL_HE_GAMMA_MIN
         && 200.0 * Delta / (BL_ME_MEV * cbrt(c->Z)) <= BL_COMPLETE_TSAI_GAMMA_MAX
         && c->R * m / BL_HBARC_MEVFM <= BL_COMPLETE_MR_MAX;
}


/*
** Tsai (1974), Rev. Mod. Phys. 46, 815, eq. (3.83), complete screening:
**   dsigma/dk = (4 alpha r0^2 / k) { (4/3 - 4/3 y + y^2)
**               [Z^2 (L_rad - f) + Z L'_rad] + (1 - y)(Z^2 + Z)/9 },
** written as [(1 + v^2) - (2/3) v] X + (4/9) v (Z^2 + Z) with
** X = 4 [Z^2 (L_rad - f) + Z L'_rad], so that spin 0 is 1 + v^2 -> 2 v.
** Tsai's constants belong to m = m_e; for another mass the upper end of
** the screening integrals moves with m, which adds ln(m/m_e) to both.
** The electron terms follow `electrons`; f follows `coulomb`.
*/
int bl_complete_dk_e (const bl_case *c, double k, bl_result *out) {
  bl_kin kn;
  double m, Z, v, w1, w2, L, Lp, shift, X, Y;
  double fe, f = 0.0;
  int st, coul;
  if (out == NULL)
    return BL_EDOMAIN;
  bl_method_clear(out, BL_METHOD_COMPLETE);
  if (c == NULL)
    return BL_EDOMAIN;   /* before any read of c: NULL is refused */
  m = c->particle.mass;
  Z = c->Z;
  if (c->screening->id == BL_MODEL_NONE)
    return BL_EMODEL;   /* no screening, no complete-screening limit */
  st = bl_kin_case(c, k, &kn);
  if (st != BL_SUCCESS)
    return st;
  fe = bl_corrections_closed(c, &kn, out, &coul);
  if (!complete_valid(c, &kn))
    out->warn |= BL_WARN_METHOD;
  if (coul)
    f = bl_coulomb_f(c->particle.charge * c->Z * BL_ALPHA);
  shift = log(m / BL_ME_MEV);
  L = bl_lrad(c->Z) + shift;
  Lp = bl_lrad_prime(c->Z) + shift;
  X = fe * (L - f);
  Y = 1.0;
  if (c->opts.electrons) {   /* scaled to the bound electron term */
    double re = bl_case_eratio(c, k);
    X += re * Lp / Z;
    Y += re / Z;
  }
  v = kn.E / kn.E0;
  bl_spin_weights(kn.spin, v, &w1, &w2);
  out->val = c->norm / (kn.k * m)   /* norm: z^4 Z^2 alpha r0^2 */
             * ((w1 - w2) * 4.0 * X + (4.0 / 9.0) * v * Y);
  if (!isfinite(out->val))
    return GSL_ERANGE;
  if (out->val <= 0.0) {
    out->val = 0.0;
    out->warn |= BL_WARN_CLAMPED;
  }
  return BL_SUCCESS;
}
