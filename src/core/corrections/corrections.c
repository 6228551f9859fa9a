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
** include/brakelight/bl_corrections.h (README, "Corrections").  The
** Coulomb correction's rule has a part that holds for the whole case
** (gamma0 and the projectile's Compton wavelength against the nuclear
** radius) and the final gamma of the point.
*/
int bl_elwert_valid (const bl_kin *kn) {
  return kn->E0 <= BL_ELWERT_GAMMA0_MAX;
}


int bl_coulomb_case_valid (const bl_case *c) {
  double lambda = BL_HBARC_MEVFM / c->particle.mass;          /* fm */
  return 1.0 + c->t0 >= BL_COULOMB_GAMMA0_MIN
         && lambda >= BL_COULOMB_RADII * bl_nucleus_radius(c->opts.A);
}


int bl_coulomb_valid (const bl_case *c, const bl_kin *kn) {
  double lambda = BL_HBARC_MEVFM / c->particle.mass;          /* fm */
  return kn->E0 >= BL_COULOMB_GAMMA0_MIN && kn->E >= BL_COULOMB_GAMMA_MIN
         && lambda >= BL_COULOMB_RADII * bl_nucleus_radius(c->opts.A);
}


double bl_coulomb_kend (const bl_case *c) {
  return (1.0 + c->t0 - BL_COULOMB_GAMMA_MIN) * c->particle.mass;
}


/* The case's warnings and the Born warning of the point (Koch & Motz 1959
** require 2 pi z Z alpha / beta << 1 for both velocities; we warn once it
** exceeds 1 after emission, the slower side). */
unsigned bl_point_warn (const bl_case *c, const bl_kin *kn) {
  double xi = 2.0 * BL_PI * fabs(c->particle.charge) * c->Z * BL_ALPHA
              * kn->E / kn->p;
  return c->warn | (xi > BL_BORN_XI_MAX ? BL_WARN_BORN : 0u);
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
** v = E/E0.  The spin-0 form assumes the correction, an eikonal phase at
** leading order, is the same for both spins.  A correction larger than the
** Born value leaves 0 and a warning.
*/
void bl_coulomb_subtract (const bl_case *c, const bl_kin *kn, bl_result *out) {
  double v = kn->E / kn->E0;
  double f = bl_coulomb_f(c->particle.charge * c->Z * BL_ALPHA);
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
  *coul = bl_wanted(c->opts.coulomb, bl_coulomb_valid(c, kn), BL_WARN_COULOMB,
                    &out->warn);
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
