/*
** dcs.c -- electron-target bremsstrahlung: the case, the fully differential
** cross section, the photon angular distribution and dsigma/dk
** See Copyright Notice in LICENSE
**
** d5sigma / (dk dOmega_k dOmega_s) = S / (4 m_e p0) k / (2 (2 pi)^3)
**                                   * p* / (16 pi^2 W) * <|M|^2>
**
** (amp.c; derivation in DEVELOPERS.md, "Electron-target bremsstrahlung").
** The photon direction (lab) and the projectile direction Omega_s in the
** rest frame of p3 + p4 are the variables: for fixed k and photon
** direction the final pair is a two-body state of fixed invariant mass W,
** so the end point is exact: W >= m + m_e, i.e.
** k <= T / (1 + E0 - p0 + p0 (1 - cos theta_k)) (units m_e).
**
** Maps.  Photon angle: sigma_k = ln(1 + h_k / h_kc), h_k = 1 - cos theta_k,
** h_kc = m^2 / (p0 (E0 + p0)) (the projectile's radiation cone).  Polar
** angle of Omega_s about the pair's momentum: sigma = ln(1 + h_s / h_sc),
** h_sc = T4min / (gamma beta p*), where T4min is the smallest recoil energy
** of the struck electron at this photon direction: the virtual photon's
** 1/t^2 = 1/(2 m_e T4)^2 peaks there (h_s = 0).  The range is split where the
** projectile (h_s of the photon) or the electron (the opposite direction)
** moves along the photon, the peaks of the emission propagators.  Azimuth:
** phi = pi (1 - cos(pi u)) / 2 on [0, pi] (the integrand is even in phi),
** which puts points towards phi = 0 and pi, where those peaks sit.
** Every level by bl_gk_adapt (base/quad.c), inner errors weighed into the
** outer estimate as in born/dcs.c.
*/

#include <math.h>
#include <string.h>

#include <gsl/gsl_errno.h>

#include "brakelight.h"
#include "base/internal.h"
#include "ebrems/internal.h"

/* Work budget of one dsigma/dk in integrand calls: past it the outer
** integral bisects no more and the result is flagged. */
#define CALL_BUDGET 4000000UL

/* The relative tolerance of an inner level as a share of the level above. */
#ifndef EPS_SHARE
#define EPS_SHARE 0.5
#endif

int bl_ebrems_init (bl_ebrems *c, const bl_particle *p, double T) {
  if (c == NULL || p == NULL || bl_particle_check(p) != BL_SUCCESS
      || !(T > 0.0 && T <= BL_EBREMS_T_MAX))
    return BL_EDOMAIN;
  memset(c, 0, sizeof *c);
  c->spin2 = p->spin == 0.5 ? 1 : 0;
  c->z = p->charge;
  c->m = p->mass / BL_ME_MEV;
  c->kind = BL_EBREMS_OTHER;
  if (c->spin2 == 1 && fabs(p->mass - BL_ME_MEV) <= 1e-12 * BL_ME_MEV
      && fabs(fabs(p->charge) - 1.0) <= 1e-12)
    c->kind = p->charge < 0 ? BL_EBREMS_ELECTRON : BL_EBREMS_POSITRON;
  if (c->kind != BL_EBREMS_OTHER) {
    c->m = 1.0;
    c->z = c->kind == BL_EBREMS_ELECTRON ? -1.0 : 1.0;
  }
  c->T = T;
  c->t0 = T / BL_ME_MEV;
  c->e0 = c->t0 + c->m;
  c->p0 = sqrt(c->t0 * (c->t0 + 2.0 * c->m));
  c->ymax = 1.0 / (1.0 + c->m * c->m / (c->e0 + c->p0));
  return BL_SUCCESS;
}

double bl_ebrems_kmax (const bl_ebrems *c) {
  return c->ymax * c->T;
}

int bl_ebrems_msq (const bl_ebrems *c, const double p3[4], const double p4[4],
                   const double k[4], double *msq) {
  double p[5][4];
  int i;
  *msq = 0.0;
  for (i = 0; i < 4; i++)
    if (!isfinite(p3[i]) || !isfinite(p4[i]) || !isfinite(k[i]))
      return BL_EDOMAIN;
  p[0][0] = c->e0; p[0][1] = 0.0; p[0][2] = 0.0; p[0][3] = c->p0;
  p[1][0] = 1.0; p[1][1] = 0.0; p[1][2] = 0.0; p[1][3] = 0.0;
  memcpy(p[2], p3, sizeof p[2]);
  memcpy(p[3], p4, sizeof p[3]);
  memcpy(p[4], k, sizeof p[4]);
  *msq = bl_eb_msq(c, (const double (*)[4])p);
  return isfinite(*msq) ? BL_SUCCESS : BL_ENONFINITE;
}

int bl_ebrems_point (const bl_ebrems *c, double k, double theta_k,
                     double theta_s, double phi_s, double *val) {
  bl_ebpoint x;
  double km = k / BL_ME_MEV;
  *val = 0.0;
  if (!(k > 0.0 && theta_k >= 0.0 && theta_k <= BL_PI && theta_s >= 0.0
        && theta_s <= BL_PI && isfinite(phi_s) && isfinite(k)))
    return BL_EDOMAIN;
  if (bl_eb_point_set(c, km, 2.0 * pow(sin(0.5 * theta_k), 2), sin(theta_k),
                      2.0 * pow(sin(0.5 * theta_s), 2), sin(theta_s), phi_s,
                      &x) != 0)
    return BL_SUCCESS;
  *val = bl_eb_d5(c, &x) * bl_eb_unit();
  return isfinite(*val) ? BL_SUCCESS : BL_ENONFINITE;
}

/* ---- the integrals -------------------------------------------------- */

typedef struct integ {
  const bl_ebrems *c;
  bl_quad *q;
  double k;            /* m_e */
  double hk, sk;       /* photon direction */
  double hs, ss;       /* current projectile polar direction (pair frame) */
  double hsc;          /* the map's scale in h_s */
  double hkc;          /* the map's scale in h_k */
  double eps;          /* relative tolerance of the azimuth */
  double eps_mid;      /* of the pair-frame polar angle, under dsigma/dk */
  int npt;
  int status;          /* worst status of an inner integral */
} integ;

static void note (integ *it, int st) {
  if (st != BL_SUCCESS && it->status == BL_SUCCESS)
    it->status = st;
}

/* Azimuth: phi = pi (1 - cos(pi u)) / 2, u in [0, 1]; 2 for the even half. */
static double phi_f (double u, void *par, double *err) {
  integ *it = par;
  bl_ebpoint x;
  double phi = 0.5 * BL_PI * (1.0 - cos(BL_PI * u));
  double dphi = 0.5 * BL_PI * BL_PI * sin(BL_PI * u);
  *err = 0.0;
  it->q->calls++;
  if (bl_eb_point_set(it->c, it->k, it->hk, it->sk, it->hs, it->ss, phi, &x)
      != 0)
    return 0.0;
  return 2.0 * dphi * bl_eb_d5(it->c, &x);
}

static double hs_f (double sg, void *par, double *err) {
  integ *it = par;
  double v, e, jac;
  it->hs = it->hsc * expm1(sg);
  if (it->hs > 2.0)
    it->hs = 2.0;
  it->ss = sqrt(it->hs * (2.0 - it->hs));
  jac = it->hs + it->hsc;
  /* an inner integral that misses its tolerance still reports its error,
  ** which the outer level weighs into its own: its status is not kept */
  (void)bl_gk_adapt(phi_f, it, 0.0, 1.0, 0.0, it->eps, it->q->limit, it->npt,
                    it->q->pan[2], &v, &e);
  *err = jac * e;
  return jac * v;
}

/* The pair-frame geometry at the current photon direction: the map scale
** and the split points (projectile or electron along the photon). */
static int pair_frame (integ *it, double *hsplit) {
  bl_ebpoint x;
  double Pv[3], Pn, w, g, gb, kpar, ck = 1.0 - it->hk, cks, t4;
  const bl_ebrems *c = it->c;
  if (bl_eb_point_set(c, it->k, it->hk, it->sk, 0.0, 0.0, 0.0, &x) != 0)
    return -1;
  Pv[0] = -it->k * it->sk;
  Pv[2] = c->p0 - it->k * ck;
  Pn = sqrt(Pv[0] * Pv[0] + Pv[2] * Pv[2]);
  w = x.w;
  g = (c->e0 + 1.0 - it->k) / w;
  gb = Pn / w;
  kpar = (Pv[0] * it->sk + Pv[2] * ck) / Pn;   /* cos(k, P) in the lab */
  cks = (g * kpar - gb) / (g - gb * kpar);      /* the same in the pair frame */
  if (cks > 1.0) cks = 1.0;
  if (cks < -1.0) cks = -1.0;
  hsplit[0] = 1.0 - cks;
  hsplit[1] = 1.0 + cks;
  t4 = x.p[3][0] - 1.0;
  it->hsc = fmax(t4 / (gb * x.pstar), 1e-15);
  return 0;
}

/* d2sigma/(dk dOmega_k) at the photon direction of it, units
** lambda_e^2/m_e per sr; *err its error. */
static double angular (integ *it, double eps, int outer, double *err) {
  double hsplit[2], cut[4], v = 0.0, e = 0.0;
  int n = 0, i;
  *err = 0.0;
  if (pair_frame(it, hsplit) != 0)
    return 0.0;
  cut[n++] = 0.0;
  for (i = 0; i < 2; i++) {
    double s = log1p(hsplit[i] / it->hsc);
    if (s > 0.0 && hsplit[i] < 2.0)
      cut[n++] = s;
  }
  if (n == 3 && cut[1] > cut[2]) {
    double t = cut[1];
    cut[1] = cut[2];
    cut[2] = t;
  }
  cut[n++] = log1p(2.0 / it->hsc);
  it->eps = EPS_SHARE * eps;
  for (i = 0; i + 1 < n; i++) {
    double pv, pe;
    int st;
    if (!(cut[i + 1] > cut[i]))
      continue;
    if (outer)
      st = bl_gk_adapt_budget(hs_f, it, cut[i], cut[i + 1], 0.0, eps,
                              it->q->limit, it->npt, it->q->pan[1],
                              &it->q->calls, it->q->calls + CALL_BUDGET,
                              &pv, &pe);
    else
      st = bl_gk_adapt(hs_f, it, cut[i], cut[i + 1], 0.0, eps, it->q->limit,
                       it->npt, it->q->pan[1], &pv, &pe);
    if (outer)
      note(it, st);
    v += pv;
    e += pe;
  }
  *err = e;
  return v;
}

static void fill (bl_result *out, double v, double e, int st) {
  double u = bl_eb_unit();
  memset(out, 0, sizeof *out);
  out->val = v * u;
  out->err = e * u;
  if (st != BL_SUCCESS)
    out->warn |= BL_WARN_TOLERANCE;
}

static int finish (bl_result *out, int st) {
  if (!isfinite(out->val) || !isfinite(out->err))
    return BL_ENONFINITE;
  if (st == BL_EINTR)
    return st;
  return st == BL_SUCCESS ? BL_SUCCESS : BL_ENOTCONV;
}

static void setup (integ *it, const bl_ebrems *c, double k, bl_quad *q) {
  memset(it, 0, sizeof *it);
  it->c = c;
  it->q = q;
  it->k = k / BL_ME_MEV;
  it->npt = q->rtol >= 1e-3 ? 15 : 21;
  it->hkc = c->m * c->m / (c->p0 * (c->e0 + c->p0));
}

int bl_ebrems_angular_e (const bl_ebrems *c, double k, double theta_k,
                         bl_quad *q, bl_result *out) {
  integ it;
  double v, e;
  memset(out, 0, sizeof *out);
  if (!(k > 0.0 && isfinite(k) && theta_k >= 0.0 && theta_k <= BL_PI))
    return BL_EDOMAIN;
  if (bl_quad_stopped(q))
    return BL_EINTR;
  setup(&it, c, k, q);
  it.hk = 2.0 * pow(sin(0.5 * theta_k), 2);
  it.sk = sin(theta_k);
  v = angular(&it, q->rtol, 1, &e);
  fill(out, v, e, it.status);
  return finish(out, it.status);
}

static double hk_f (double sg, void *par, double *err) {
  integ *it = par;
  double v, jac;
  it->hk = it->hkc * expm1(sg);
  if (it->hk > 2.0)
    it->hk = 2.0;
  it->sk = sqrt(it->hk * (2.0 - it->hk));
  jac = it->hk + it->hkc;
  v = angular(it, it->eps_mid, 0, err);
  *err *= 2.0 * BL_PI * jac;
  return 2.0 * BL_PI * jac * v;
}

int bl_ebrems_dk_e (const bl_ebrems *c, double k, bl_quad *q, bl_result *out) {
  integ it;
  double km, hmax, v = 0.0, e = 0.0;
  int st;
  memset(out, 0, sizeof *out);
  if (!(k > 0.0 && isfinite(k)))
    return BL_EDOMAIN;
  if (bl_quad_stopped(q))
    return BL_EINTR;
  km = k / BL_ME_MEV;
  /* the photon directions with W >= m + m_e: h_k <= (1/y - 1/y_max) / p0 */
  hmax = (c->t0 / km - 1.0 / c->ymax) / c->p0;
  if (!(hmax > 0.0))
    return BL_SUCCESS;
  if (hmax > 2.0)
    hmax = 2.0;
  setup(&it, c, k, q);
  it.eps_mid = EPS_SHARE * q->rtol;
  st = bl_gk_adapt_budget(hk_f, &it, 0.0, log1p(hmax / it.hkc), 0.0, q->rtol,
                          q->limit, it.npt, q->pan[0], &q->calls,
                          q->calls + CALL_BUDGET, &v, &e);
  note(&it, st);
  fill(out, v, e, it.status);
  return finish(out, it.status);
}
