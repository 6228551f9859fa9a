/*
** thomas_fermi.c -- Thomas-Fermi atom in Moliere's three-term fit
** See Copyright Notice in LICENSE
**
** Nucleus screened by the Thomas-Fermi electron cloud, in the three Yukawa
** terms Moliere fitted to it (Moliere 1947):
**
**   F(q)/Z = sum_i alpha_i b_i^2 / (b_i^2 + q^2),
**   alpha = (0.10, 0.55, 0.35),  beta = (6.0, 1.20, 0.30),
**   b_i = beta_i hbar / a_TF,    a_TF = 0.88534 a_B Z^(-1/3),
**
** so 1 - F/Z = sum_i alpha_i q^2/(b_i^2 + q^2), the core's Yukawa form.
**
** Field of the atomic electrons.  S = Z [1 - (F/Z)^2] is not used: its
** complete-screening constant exceeds Tsai's by 3 % (C) to 25 % (Pb)
** (measured by quadrature of that S), because the inelastic screening radius scales like
** Z^(-2/3), not Z^(-1/3).  Instead the same three-term shape, linear,
**
**   S(q)/Z = sum_i alpha_i q^2 / (c_i^2 + q^2),   c_i = beta_i hbar / a',
**
** with one radius a' per element, chosen so that its complete-screening
** constant is Tsai's L'_rad (Tsai 1974; bl_lrad_prime: ln(1194 Z^-2/3) for
** Z >= 5, his Hartree-Fock and exact values for Z = 1..4).  For an electron
** projectile (q in units of m_e c, delta -> 0) that constant is
**
**   L' = 1 + int_0^1 (S/Z) dq/q = 1 + sum_i alpha_i int_0^1 q/(c_i^2+q^2) dq
**      = 1 + (1/2) sum_i alpha_i ln(1 + 1/c_i^2),
**
** using int_0^X q/(c^2+q^2) dq = (1/2) ln(1 + X^2/c^2).  With A = a' m_e c /
** hbar (a' in electron Compton wavelengths), c_i = beta_i / A, and
**   g(s) = 1 + (1/2) sum_i alpha_i ln(1 + e^(2s)/beta_i^2) - L',  s = ln A,
** is increasing (g' = sum_i alpha_i A^2/(beta_i^2 + A^2) in (0, 1)) and
** convex (g'' > 0), with g -> 1 - L' < 0 as s -> -inf (L' > 4 for every Z).
** For large A, g ~ 1 + s - sum_i alpha_i ln beta_i - L', so
**   s0 = L' - 1 + sum_i alpha_i ln beta_i
** is the large-A root; since (1/2) ln(1 + u^2) > ln u, g(s0) > 0 and s0
** lies right of the root.  Newton's method on a convex increasing function
** started right of its root decreases monotonically to it: iterate until the
** step is below 1e-15 (1 + |s|), i.e. to rounding.  A is 149 for
** hydrogen (a' = 0.57 A), 20.1 for lead, 17.6 for Z = 100.
**
** Validity: the Thomas-Fermi atom is a statistical model, fair for medium
** and heavy atoms and poor for the lightest; its elastic constant
** L_rad = 1 + int_0^1 (1 - F/Z)^2 dq/q agrees with Tsai's ln(184.15 Z^-1/3)
** to 0.26 % for Z = 6..92, 0.254 % at worst (Z = 92; tests/test_models.c,
** suite screening).
*/

#include <math.h>

#include "models/internal.h"

static const double tf_alpha[3] = {0.10, 0.55, 0.35};   /* Moliere 1947 */
static const double tf_beta[3] = {6.0, 1.20, 0.30};

#define TF_NEWTON_MAX 60


/* Moliere's momenta b_i = beta_i hbar c / a_TF in MeV; a_TF in fm. */
static void tf_momenta (int Z, double *b) {
  double a = 0.88534 * BL_BOHR_FM / cbrt((double)Z);
  int i;
  for (i = 0; i < 3; i++)
    b[i] = tf_beta[i] * BL_HBARC_MEVFM / a;
}


/*
** F(q)/Z of Moliere's fit, q in MeV.  Z outside 1..BL_ZMAX gives NaN
** (callers check Z through the yukawa kernel first).
*/
static double tf_ff (double q, int Z, const double *p) {
  double b[3], s = 0.0;
  int i;
  (void)p;
  if (Z < 1 || Z > BL_ZMAX)
    return NAN;
  tf_momenta(Z, b);
  for (i = 0; i < 3; i++)
    s += tf_alpha[i] * b[i] * b[i] / (b[i] * b[i] + q * q);
  return s;
}


static int tf_yukawa (int Z, const double *p, bl_yukawa *out) {
  int i;
  (void)p;
  if (Z < 1 || Z > BL_ZMAX)
    return BL_EDOMAIN;
  out->n = 3;
  tf_momenta(Z, out->b);
  for (i = 0; i < 3; i++)
    out->alpha[i] = tf_alpha[i];
  return BL_SUCCESS;
}


/*
** ln A of the electron field: the root of g(s) = 0 (header), by Newton's
** method from the large-A root.
*/
static double tf_inelastic_log_radius (int Z) {
  double L = bl_lrad_prime(Z), s = L - 1.0;
  int i, it;
  for (i = 0; i < 3; i++)
    s += tf_alpha[i] * log(tf_beta[i]);
  for (it = 0; it < TF_NEWTON_MAX; it++) {
    double g = 1.0 - L, dg = 0.0, step, A2 = exp(2.0 * s);
    for (i = 0; i < 3; i++) {
      double b2 = tf_beta[i] * tf_beta[i];
      g += 0.5 * tf_alpha[i] * log1p(A2 / b2);
      dg += tf_alpha[i] * A2 / (b2 + A2);
    }
    step = g / dg;
    s -= step;
    if (fabs(step) <= 1e-15 * (1.0 + fabs(s)))
      break;
  }
  return s;
}


/* S/Z = sum_i alpha_i q^2/(c_i^2 + q^2), c_i = beta_i m_e c / A in MeV. */
static int tf_incoherent (int Z, const double *p, bl_yukawa *out) {
  double A;
  int i;
  (void)p;
  if (Z < 1 || Z > BL_ZMAX)
    return BL_EDOMAIN;
  A = exp(tf_inelastic_log_radius(Z));
  out->n = 3;
  for (i = 0; i < 3; i++) {
    out->alpha[i] = tf_alpha[i];
    out->b[i] = tf_beta[i] * BL_ME_MEV / A;
  }
  return BL_SUCCESS;
}

const bl_model bl_model_thomas_fermi = {
  BL_MODEL_THOMAS_FERMI, "thomas-fermi",
  "Thomas-Fermi atom in Moliere's three Yukawa terms; electron field of the "
  "same shape, matched to Tsai's L'_rad",
  {&bl_ref_Moliere1947, &bl_ref_Tsai1974, NULL, NULL},
  0, NULL, tf_ff, tf_yukawa, tf_incoherent
};
