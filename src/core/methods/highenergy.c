/*
** highenergy.c -- high-energy (small-angle) dsigma/dk from the screening
** functions (Tsai 1974, Rev. Mod. Phys. 46, 815, section 3); see tables.c
** for the screening integrals and nucsize.c for the nuclear size
** See Copyright Notice in LICENSE
*/

#include <math.h>
#include <string.h>

#include <gsl/gsl_errno.h>

#include "methods/internal.h"


/* 1 if the representation is a screened one (every b > 0). */
static int screened (const bl_yukawa *y) {
  int i;
  for (i = 0; i < y->n; i++)
    if (!(y->b[i] > 0.0) || !isfinite(y->b[i]))
      return 0;
  return y->n > 0;
}


int bl_he_prepare (const bl_case *c, bl_quad *q, bl_he *h) {
  bl_yukawa y;
  double m;
  int st;
  if (h == NULL)
    return BL_EDOMAIN;
  memset(h, 0, sizeof *h);
  if (c == NULL)
    return BL_EDOMAIN;
  m = c->particle.mass;
  st = c->screening->yukawa(c->Z, c->params, &y);
  if (st != BL_SUCCESS)
    return st;
  if (screened(&y)) {
    h->el = bl_hetab_get(BL_HETAB_ELASTIC, &y);
    if (h->el == NULL)
      return BL_ENOMEM;
    bl_hetab_tails(h->el, m, h->tail_el);
    h->maxerr = bl_hetab_maxerr(h->el);
  }
  if (c->opts.electrons && c->screening->incoherent != NULL) {
    st = c->screening->incoherent(c->Z, c->params, &y);
    if (st == BL_SUCCESS && !screened(&y))
      st = BL_EMODEL;
    if (st == BL_SUCCESS && (h->e = bl_hetab_get(BL_HETAB_ELECTRONS, &y))
                            == NULL)
      st = BL_ENOMEM;
    if (st != BL_SUCCESS) {
      bl_he_release(h);   /* the references taken so far */
      return st;
    }
    bl_hetab_tails(h->e, m, h->tail_e);
    h->maxerr = fmax(h->maxerr, bl_hetab_maxerr(h->e));
  }
  (void)q;   /* the nuclear size is a table in the source (nucsize.c) */
  if (c->R > 0.0)
    bl_nucsize_get(c, h);
  h->ready = 1;
  return BL_SUCCESS;
}


void bl_he_release (bl_he *h) {
  if (h == NULL)
    return;
  bl_hetab_release(h->el);
  bl_hetab_release(h->e);
  memset(h, 0, sizeof *h);   /* the nuclear-size nodes are static data */
}


/*
** phi1 and phi2 at Delta (MeV) for a projectile of mass m from table t
** (NULL: unscreened) and its tail moments: the elementary g = 1 part
** minus H plus the part of H beyond m.
*/
static void phis (const bl_hetab *t, const double tail[4], double Delta,
                  double m, double *phi1, double *phi2) {
  double M = m / Delta, lnM = log(M);
  double U1 = lnM - 1.5 + 2.0 / M - 0.5 / (M * M);
  double U2 = lnM - 4.0 / 3.0 + 3.0 * lnM / (M * M) + 4.0 / (3.0 * M * M * M);
  double H1 = 0.0, H2 = 0.0;
  if (t != NULL) {
    bl_hetab_lookup(t, log(Delta), &H1, &H2);
    H1 -= tail[0];
    H2 -= tail[1];
  }
  *phi1 = 4.0 + 4.0 * (U1 - H1);
  *phi2 = 10.0 / 3.0 + 4.0 * (U2 - H2);
}


/*
** The small-angle form with the nuclear-size correction of nucsize.c is
** the gamma -> infinity limit; at finite gamma the nuclear size shifts it
** by about 2 (x / gamma^3)^(1/2), x = m R / hbar c, and beyond Delta ~
** hbar c / R (delta > 1/x) the table has no nodes.  Measured against Born
** (rtol 1e-6; Hartree-Fock screening, electrons, uniform nucleus; Fe and
** U; spin 0 and 1/2; y = 0.01 ... 0.99; worst over y): at gamma =
** max(500, 150 x^(1/3)) 1.0e-3 ... 1.5e-3 for masses 1 ... 100 GeV, at
** 250 x^(1/3) (BL_HE_GAMMA_MR3) 3.4e-4 ... 9.2e-4; the largest at y -> 1,
** spin 0, where delta x is largest: there gamma >= 3 x (BL_HE_GAMMA_MR,
** delta < x/6) is needed too (100 GeV on U at 2.5 x: 3e-2).  Beyond the
** table (x > BL_HE_MR_MAX) the correction is not known.
*/
double bl_he_gamma_min (const bl_case *c) {
  double mR, g = BL_HE_GAMMA_MIN;
  if (c == NULL)
    return HUGE_VAL;
  mR = c->R * c->particle.mass / BL_HBARC_MEVFM;
  if (mR > BL_HE_MR_MAX)
    return HUGE_VAL;
  if (mR > 0.0)
    g = fmax(g, fmax(BL_HE_GAMMA_MR * mR, BL_HE_GAMMA_MR3 * cbrt(mR)));
  return g;
}


int bl_he_valid (const bl_case *c, double k) {
  return c != NULL && 1.0 + c->t0 - k / c->particle.mass >= bl_he_gamma_min(c);
}


int bl_he_dk_e (const bl_case *c, const bl_he *h, double k, bl_result *out) {
  bl_kin kn;
  double m, v, Delta, p1, p2, e1 = 0.0, e2 = 0.0, w1, w2;
  double fe, f = 0.0, kmev;
  int st, coul, i;
  if (out == NULL)
    return BL_EDOMAIN;
  bl_method_clear(out, BL_METHOD_HIGH_ENERGY);
  if (c == NULL || h == NULL || !h->ready)
    return BL_EDOMAIN;   /* before any read of c: NULL is refused */
  m = c->particle.mass;
  st = bl_kin_case(c, k, &kn);
  if (st != BL_SUCCESS)
    return st;
  fe = bl_corrections_closed(c, &kn, out, &coul);
  if (!bl_he_valid(c, k))
    out->warn |= BL_WARN_METHOD;
  v = kn.E / kn.E0;
  Delta = m * kn.k / (2.0 * kn.E0 * kn.E);
  phis(h->el, h->tail_el, Delta, m, &p1, &p2);
  for (i = 0; i < h->nnuc; i++) {   /* nuclear size */
    double N1, N2;
    bl_nucsize_at(h->nuc[i], Delta / m, &N1, &N2);
    p1 += h->nucw[i] * N1;
    p2 += h->nucw[i] * N2;
  }
  if (coul)   /* subtracted after the Elwert factor, as in src/core/born/dcs.c */
    f = 4.0 * bl_coulomb_f(c->particle.charge * c->Z * BL_ALPHA)
        * bl_coulomb_share(c);
  if (h->e != NULL) {
    phis(h->e, h->tail_e, Delta, m, &e1, &e2);
    double re = bl_case_eratio(c, k) / c->Z;   /* bound electron term */
    e1 *= re;
    e2 *= re;
  }
  bl_spin_weights(kn.spin, v, &w1, &w2);
  kmev = kn.k * m;
  out->val = c->norm / kmev * (w1 * (fe * p1 - f + e1)
                               - w2 * (fe * p2 - f + e2));
  out->err = c->norm / kmev * (w1 + w2) * 4.0 * h->maxerr   /* tables */
             * (fe + (h->e != NULL ? 1.0 / c->Z : 0.0));
  if (!isfinite(out->val) || !isfinite(out->err))
    return GSL_ERANGE;
  if (out->val <= 0.0) {   /* far outside the small-angle range, or the */
    out->val = 0.0;        /* Coulomb correction above the rest */
    out->warn |= BL_WARN_CLAMPED;
  }
  return BL_SUCCESS;
}
