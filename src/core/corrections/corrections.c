/*
** corrections.c -- the corrections beyond the first Born approximation
** (Elwert factor, Davies-Bethe-Maximon Coulomb correction), where each
** holds, the Born-validity warning, and the spin weights of the
** screening-function form; each rule written once
** See Copyright Notice in LICENSE
*/

#include <math.h>

#include "corrections/internal.h"


/* Elwert factor (Elwert 1939; Koch & Motz 1959, section II) for a
** projectile of charge z in the field of charge Z:
**   F_E = (beta0/beta) (1 - exp(-2 pi eta/beta0)) / (1 - exp(-2 pi eta/beta)),
** eta = -z Z alpha (> 0 when attracted: electrons).  For eta < 0 the
** exponentials are rewritten so that nothing overflows at beta -> 0. */
double bl_elwert (const bl_case *c, const bl_kin *kn) {
  double b0 = kn->p0 / kn->E0, b = kn->p / kn->E;
  double eta = -c->particle.charge * c->Z * BL_ALPHA;
  double a = 2.0 * BL_PI * fabs(eta);
  if (eta > 0.0)
    return (b0 / b) * expm1(-a / b0) / expm1(-a / b);
  return (b0 / b) * exp(a / b0 - a / b) * expm1(-a / b0) / expm1(-a / b);
}


/*
** Where the corrections hold: the bounds and their reasons are in
** include/brakelight/bl_corrections.h (README, "Where the Born
** approximation holds, and the corrections").  The Coulomb correction's
** rule has a part that holds for the whole case
** (gamma0 and the projectile's Compton wavelength against the nuclear
** radius) and the final gamma of the point.
*/
int bl_elwert_valid (const bl_kin *kn) {
  return kn->E0 <= BL_ELWERT_GAMMA0_MAX;
}


/*
** The share of the point-charge Coulomb correction kept for a projectile
** of Compton wavelength lambda = hbar/(m c) on a uniform nucleus of radius
** R: x^4 / (1 + x^4), x = lambda / (BL_COULOMB_RADII R).  The correction
** comes from distances ~ lambda (Davies, Bethe & Maximon 1954); inside
** the nucleus the field is not a point charge's.  Electrons on Pb keep
** 0.9989, muons 5e-7; the rule "lambda >= BL_COULOMB_RADII R" is share
** >= 1/2.  The same share weighs the distortion of the distorted-wave
** method (distorted/dcs.c), so the two join without a step.  A point
** nucleus keeps 1; the incoherent part of BL_NUCLEUS_INCOHERENT counts as
** the uniform nucleus (its share of the value is 1/Z of the difference
** point - uniform, where the correction is small anyway).
*/
double bl_coulomb_share (const bl_case *c) {
  double x;
  if (c->opts.nucleus == BL_NUCLEUS_POINT)
    return 1.0;
  x = BL_HBARC_MEVFM / c->particle.mass
      / (BL_COULOMB_RADII * bl_nucleus_radius(c->opts.A));
  x *= x;
  x *= x;
  return x / (1.0 + x);
}


int bl_coulomb_case_valid (const bl_case *c) {
  return 1.0 + c->t0 >= BL_COULOMB_GAMMA0_MIN && bl_coulomb_share(c) >= 0.5;
}


int bl_coulomb_valid (const bl_case *c, const bl_kin *kn) {
  return bl_coulomb_case_valid(c) && kn->E >= BL_COULOMB_GAMMA_MIN;
}


/* Where "auto" subtracts it: the gamma bounds, and a share of at least
** COULOMB_SHARE_MIN (below, at most 1e-3 of a correction of a few per
** cent is left out). */
#define COULOMB_SHARE_MIN 1e-3

int bl_coulomb_case_auto (const bl_case *c) {
  return 1.0 + c->t0 >= BL_COULOMB_GAMMA0_MIN
         && bl_coulomb_share(c) >= COULOMB_SHARE_MIN;
}


int bl_coulomb_wanted (const bl_case *c, const bl_kin *kn, unsigned *warn) {
  if (c->opts.coulomb == BL_APPLY_ON) {
    if (!bl_coulomb_valid(c, kn))
      *warn |= BL_WARN_COULOMB;
    return 1;
  }
  return c->opts.coulomb == BL_APPLY_AUTO && bl_coulomb_case_auto(c)
         && kn->E >= BL_COULOMB_GAMMA_MIN;
}


double bl_coulomb_kend (const bl_case *c) {
  return (1.0 + c->t0 - BL_COULOMB_GAMMA_MIN) * c->particle.mass;
}


/*
** The size of the Coulomb effects the first Born approximation leaves
** out, relative: the larger of the low-energy one, the Elwert factor's
** departure from 1 (Elwert 1939: the ratio of the final to the initial
** Sommerfeld factor), and the high-energy one, the Davies-Bethe-Maximon
** correction relative to the unscreened logarithm, f(zZ alpha) /
** (ln(2 E0 E / k) - 1/2) (Bethe & Maximon 1954; at least 1 in the
** denominator).  An estimate of the size, measured against the distorted
** waves within a factor of about 2 (README, Distorted waves).
*/
double bl_coulomb_effect (double z, int Z, double m, double T, double k) {
  double t0, kk, E0, E, p0, p, eta, a, b, fe, L;
  if (!(m > 0.0) || !(T > 0.0) || !(k > 0.0) || !(k < T) || Z < 1)
    return 0.0;
  t0 = T / m;
  kk = k / m;
  E0 = 1.0 + t0;
  E = E0 - kk;
  p0 = sqrt(t0 * (t0 + 2.0));
  p = sqrt((t0 - kk) * (t0 - kk + 2.0));
  eta = -z * Z * BL_ALPHA;
  a = 2.0 * BL_PI * fabs(eta) * E0 / p0;
  b = 2.0 * BL_PI * fabs(eta) * E / p;
  if (!(p > 0.0))
    return HUGE_VAL;
  fe = eta > 0.0 ? (p0 * E / (E0 * p)) * expm1(-a) / expm1(-b)
                 : (p0 * E / (E0 * p)) * exp(a - b) * expm1(-a) / expm1(-b);
  L = log(2.0 * E0 * E / kk) - 0.5;
  return fmax(fabs(fe - 1.0), bl_coulomb_f(z * Z * BL_ALPHA) / fmax(L, 1.0));
}


/* The case's warnings and the Born warning of the point: where the
** Coulomb effects Born leaves out (bl_coulomb_effect) exceed BL_SYS_WARN
** of the value. */
unsigned bl_point_warn (const bl_case *c, const bl_kin *kn) {
  double e = bl_coulomb_effect(c->particle.charge, c->Z, c->particle.mass,
                               c->T, kn->k * c->particle.mass);
  return c->warn | (e > BL_SYS_WARN ? BL_WARN_BORN : 0u);
}


int bl_wanted (int opt, int valid, unsigned bit, unsigned *warn) {
  if (opt == BL_APPLY_ON && !valid)
    *warn |= bit;
  return opt == BL_APPLY_ON || (opt == BL_APPLY_AUTO && valid);
}


/*
** Subtract the Coulomb correction of Davies, Bethe & Maximon (1954) from
** dsigma/dk: in the screening-function form (Tsai 1974) it lowers phi1 and
** phi2 of the nuclear part by 4 f(z Z alpha), i.e. by
**   (norm / k) 4 f [(1 + v^2) - (2/3) v]   (spin 1/2),
**   (norm / k) 4 f [2 v - (2/3) v]         (spin 0: 1 + v^2 -> 2 v),
** v = E/E0, times the nuclear-size share bl_coulomb_share.  The spin-0
** form assumes the correction, an eikonal phase at leading order, is the
** same for both spins.  A correction larger than the Born value leaves 0
** and a warning.
*/
void bl_coulomb_subtract (const bl_case *c, const bl_kin *kn, bl_result *out) {
  double v = kn->E / kn->E0;
  double f = bl_coulomb_f(c->particle.charge * c->Z * BL_ALPHA)
             * bl_coulomb_share(c);
  double shape = kn->spin > 0.25 ? 1.0 + v * v - 2.0 * v / 3.0
                                 : 4.0 * v / 3.0;
  out->val -= c->norm / (kn->k * c->particle.mass) * 4.0 * f * shape;
  out->applied |= BL_APPLIED_COULOMB;
  if (out->val < 0.0) {
    out->val = 0.0;
    out->warn |= BL_WARN_CLAMPED;
  }
}


/* The two spin weights of phi1 and phi2 at v = E/E0: w1 = 1 + v^2 for
** spin 1/2 (2 v for spin 0), w2 = 2 v / 3 (Tsai 1974, eq. 3.80). */
void bl_spin_weights (double spin, double v, double *w1, double *w2) {
  *w1 = spin > 0.25 ? 1.0 + v * v : 2.0 * v;
  *w2 = 2.0 * v / 3.0;
}


double bl_corrections_closed (const bl_case *c, const bl_kin *kn,
                              bl_result *out, int *coul) {
  double fe = 1.0;
  out->warn = bl_point_warn(c, kn);
  if (bl_wanted(c->opts.elwert, bl_elwert_valid(kn), BL_WARN_ELWERT,
                &out->warn)) {
    fe = bl_elwert(c, kn);
    out->applied |= BL_APPLIED_ELWERT;
  }
  *coul = bl_coulomb_wanted(c, kn, &out->warn);
  if (*coul)
    out->applied |= BL_APPLIED_COULOMB;
  return fe;
}


double bl_born_xi (double z, int Z, double T, double m) {
  double x = T / m;
  double beta = sqrt(x * (x + 2)) / (x + 1);
  double xi = 2 * BL_PI * fabs(z) * Z * BL_ALPHA;
  return xi / beta;
}
