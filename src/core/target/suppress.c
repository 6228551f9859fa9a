/*
** suppress.c -- Landau-Pomeranchuk-Migdal and dielectric suppression
** See Copyright Notice in LICENSE
**
** Migdal (1956) in the form reviewed by Klein (1999, Rev. Mod. Phys. 71,
** 1501, section II): with s = sqrt(E_LPM k / (8 E0 (E0 - k) xi(s))),
**   dsigma_LPM/dk = (4 alpha r^2 / 3k) xi(s) {y^2 G(s)
**                   + 2 [1 + (1 - y)^2] phi(s)} Z^2 ln(184 Z^-1/3),
** which is the complete-screening Bethe-Heitler form at G = phi = xi = 1.
** The factor applied to any method's dsigma/dk is the ratio of the two;
** Migdal's xi phi slightly exceeds 1 near s ~ 0.5, where the ratio is
** held at 1 (common practice).  Dielectric suppression (Ter-Mikaelian):
** the medium's polarisation shortens the formation length by
** Gamma = 1 + (k_p/k)^2, k_p = gamma hbar omega_p, so s -> s Gamma and the
** rate is divided by Gamma; without LPM this is k^2/(k^2 + k_p^2).
** G and phi are the fits of Stanev et al. (1982, Phys. Rev. D 25, 1291),
** with their large-s forms phi = 1 - 0.012/s^4 (s >= 1.549) and
** G = 1 - 0.0230/s^4 (s >= 1.9516), quoted from Klein's review (from
** memory: the tests check their limits, not their digits).
*/

#include <math.h>
#include <strings.h>

#include "brakelight/bl_const.h"
#include "brakelight/bl_element.h"
#include "brakelight/bl_errno.h"
#include "brakelight/bl_suppress.h"


#define HBARC_MEVCM  (BL_HBARC_MEVFM * 1e-13)
#define PLASMA_EV    28.816   /* hbar omega_p = 28.816 eV sqrt(rho <Z/A>)
                              ** (Review of Particle Physics, passage of
                              ** particles through matter; from memory) */


double bl_migdal_phi (double s) {
  if (s <= 0.0)
    return 0.0;
  if (s >= 1.549)   /* the large-s form, joined where the two meet */
    return 1.0 - 0.012 / (s * s * s * s);
  return -expm1(-6.0 * s * (1.0 + (3.0 - BL_PI) * s)
                + s * s * s / (0.623 + 0.796 * s + 0.658 * s * s));
}


static double migdal_psi (double s) {
  return -expm1(-4.0 * s - 8.0 * s * s / (1.0 + 3.96 * s + 4.97 * s * s
                                          - 0.05 * s * s * s
                                          + 7.5 * s * s * s * s));
}


double bl_migdal_G (double s) {
  if (s <= 0.0)
    return 0.0;
  if (s >= 1.9516)
    return 1.0 - 0.0230 / (s * s * s * s);
  return 3.0 * migdal_psi(s) - 2.0 * bl_migdal_phi(s);
}


double bl_migdal_xi (double s, double s1) {
  if (s < s1)
    return 2.0;
  if (s < 1.0)
    return 1.0 + log(s) / log(s1);
  return 1.0;
}


int bl_suppress_init (bl_suppress *s, int mode, const bl_material *m,
                      const bl_particle *p) {
  double zoa = 0.0, wsum = 0.0, z3 = 0.0, X0, r;
  int i;
  if (s == NULL)
    return BL_EDOMAIN;
  s->mode = BL_SUPPRESS_NONE;
  s->elpm = s->plasma = s->X0cm = 0.0;
  s->s1 = 1e-4;
  s->mass = p != NULL ? p->mass : 0.0;
  if (mode == BL_SUPPRESS_NONE)
    return BL_SUCCESS;
  if ((mode != BL_SUPPRESS_LPM && mode != BL_SUPPRESS_DIELECTRIC)
      || m == NULL || p == NULL || !(m->density > 0.0) || m->n < 1
      || !(p->mass > 0.0) || !(p->charge != 0.0))
    return BL_EDOMAIN;
  X0 = bl_radiation_length(m);
  if (!(X0 > 0.0))
    return BL_EDOMAIN;
  for (i = 0; i < m->n; i++) {   /* Z^1/3 weighted by the share of 1/X0 */
    const bl_component *c = &m->comp[i];
    double Z = c->Z;
    double w = c->atoms * (Z * Z * (bl_lrad(c->Z)
                                    - bl_coulomb_f(Z * BL_ALPHA))
                           + Z * bl_lrad_prime(c->Z));
    zoa += c->mass_fraction * Z / c->A;
    z3 += w * cbrt(Z);
    wsum += w;
  }
  s->mode = mode;
  s->X0cm = X0 / m->density;
  r = p->mass / BL_ME_MEV;
  s->elpm = BL_ME_MEV * BL_ME_MEV * BL_ALPHA * s->X0cm
            / (4.0 * BL_PI * HBARC_MEVCM) * r * r * r * r
            / (p->charge * p->charge);
  s->plasma = PLASMA_EV * 1e-6 * sqrt(m->density * zoa);
  s->s1 = pow(z3 / wsum / 184.15, 2.0);
  return BL_SUCCESS;
}


double bl_suppress_factor (const bl_suppress *s, double E0, double k) {
  double y, gam2 = 1.0, s0, sv, xi = 1.0, f, bh;
  int i;
  if (s == NULL || s->mode == BL_SUPPRESS_NONE || !(k > 0.0) || !(k < E0))
    return 1.0;
  if (s->mode == BL_SUPPRESS_DIELECTRIC) {
    double kp = E0 / s->mass * s->plasma;
    gam2 = 1.0 + (kp / k) * (kp / k);
  }
  s0 = sqrt(s->elpm * k / (8.0 * E0 * (E0 - k))) * gam2;
  sv = s0;
  for (i = 0; i < 30; i++) {   /* s = s0 / sqrt(xi(s)): a contraction */
    double next;
    xi = bl_migdal_xi(sv, s->s1);
    next = s0 / sqrt(xi);
    if (fabs(next - sv) <= 1e-12 * sv) {
      sv = next;
      break;
    }
    sv = next;
  }
  xi = bl_migdal_xi(sv, s->s1);
  y = k / E0;
  bh = y * y + 2.0 * (1.0 + (1.0 - y) * (1.0 - y));
  f = xi * (y * y * bl_migdal_G(sv) + 2.0 * (1.0 + (1.0 - y) * (1.0 - y))
            * bl_migdal_phi(sv)) / bh;
  if (f > 1.0)
    f = 1.0;
  if (f < 0.0)
    f = 0.0;
  return f / gam2;
}


static const char *const names[] = {"none", "lpm", "lpm+dielectric"};

const char *bl_suppress_name (int mode) {
  return mode >= 0 && mode <= 2 ? names[mode] : NULL;
}

int bl_suppress_find (const char *name) {
  int i;
  for (i = 0; name != NULL && i <= 2; i++)
    if (strcasecmp(name, names[i]) == 0)
      return i;
  return -1;
}
