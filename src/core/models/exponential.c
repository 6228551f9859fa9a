/*
** exponential.c -- exponentially screened Coulomb potential (Schiff)
** See Copyright Notice in LICENSE
*/

#include <math.h>

#include "models/internal.h"

/*
** V(r) = -(Z e^2 / r) exp(-r / a),  a = C Z^(-1/3) hbar / (m_e c), C = 111
** (Schiff 1951; Koch & Motz 1959, formula 3BS(e)).  Its atomic form factor is
**   F(q)/Z = 1 / (1 + (q a)^2),   i.e.   1 - F/Z = q^2 / (b^2 + q^2),
** b = 1/a = m_e c Z^(1/3) / C, a single Yukawa term.  Valid where the
** Thomas-Fermi atom is: Z not too small; the electrons' own field is not
** included here: see exponential_incoherent.
*/
static const bl_param exponential_params[] = {
  {"radius_constant", "C in a = C Z^-1/3 hbar/(m_e c)", 111.0, "1"}
};


static double screening_momentum (int Z, const double *p) {
  return BL_ME_MEV * cbrt((double)Z) / p[0];  /* MeV */
}


static double exponential_ff (double q, int Z, const double *p) {
  double x = q / screening_momentum(Z, p);
  return 1.0 / (1.0 + x * x);
}


static int exponential_yukawa (int Z, const double *p, bl_yukawa *out) {
  if (Z < 1 || Z > BL_ZMAX || !(p[0] > 0.0))
    return BL_EDOMAIN;
  out->n = 1;
  out->alpha[0] = 1.0;
  out->b[0] = screening_momentum(Z, p);
  return BL_SUCCESS;
}

/*
** The field of the atomic electrons in the same one-term form,
**   S/Z = q^2 / (c^2 + q^2),
** with c fixed by Tsai's complete-screening constant L'_rad(Z) (not by the
** elastic radius: the inelastic screening radius scales like Z^-2/3).  For
** an electron projectile (q in units of m_e) that constant is
**   1 + int_0^1 (S/Z) dq/q = 1 + (1/2) ln(1 + 1/c^2) = L'_rad,
** so c = m_e / sqrt(exp(2 (L'_rad - 1)) - 1), exactly.
*/
static int exponential_incoherent (int Z, const double *p, bl_yukawa *out) {
  (void)p;
  if (Z < 1 || Z > BL_ZMAX)
    return BL_EDOMAIN;
  out->n = 1;
  out->alpha[0] = 1.0;
  out->b[0] = BL_ME_MEV / sqrt(expm1(2.0 * (bl_lrad_prime(Z) - 1.0)));
  return BL_SUCCESS;
}

const bl_model bl_model_exponential = {
  BL_MODEL_EXPONENTIAL, "exponential",
  "exponentially screened nucleus, a = 111 Z^-1/3 hbar/(m_e c) (Schiff)",
  {&bl_ref_Schiff1951, &bl_ref_KochMotz1959, NULL, NULL},
  1, exponential_params, exponential_ff, exponential_yukawa,
  exponential_incoherent
};
