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
** h_kc = m^2 / (p0 (E0 + p0)) (the projectile's radiation cone), with
** sigma_k = smax (2 v - v^2) against the square-root edge.  Omega_s: two
** channels split by weights, one about the pair axis (the 1/t^2 pole of
** the struck electron at h_s = 0, for e- e- the exchange pole at h_s = 2),
** one about the photon direction in the pair frame (projectile or electron
** along the photon); each half from its pole by ln(1 + d / scale), azimuth
** uniform on [0, pi] (DEVELOPERS.md, "Electron-target bremsstrahlung").
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
** integral bisects no more and the result is flagged.  (The fuzzing
** build lowers it, Makefile "fuzz": a call of bl_eb_d5 costs about 100
** Born integrand calls, and an integral over k of a projectile outside the
** other-projectile table takes one such dsigma/dk per point.) */
#ifndef EB_CALL_BUDGET
#define EB_CALL_BUDGET 4000000UL
#endif

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
  c->radiate = BL_EBREMS_RAD_BOTH;
  if (c->spin2 == 1 && fabs(p->mass - BL_ME_MEV) <= 1e-12 * BL_ME_MEV
      && fabs(fabs(p->charge) - 1.0) <= 1e-12)
    c->kind = p->charge < 0 ? BL_EBREMS_ELECTRON : BL_EBREMS_POSITRON;
  if (c->kind != BL_EBREMS_OTHER) {
    if (!(T <= BL_EBREMS_T_MAX_E))
      return BL_EDOMAIN;
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

int bl_ebrems_set_binding (bl_ebrems *c, int Z, const bl_model *model,
                           const double *params) {
  double p[16];
  bl_yukawa y;
  double sum = 0.0;
  int i;
  if (c == NULL || Z < 0 || Z > BL_ZMAX)
    return BL_EDOMAIN;
  if (Z == 0 || model == NULL) {
    c->Z = 0;
    memset(&c->inc, 0, sizeof c->inc);
    return BL_SUCCESS;
  }
  if (model->incoherent == NULL
      || model->nparams > (int)(sizeof p / sizeof p[0]))
    return BL_EMODEL;
  if (params != NULL)
    for (i = 0; i < model->nparams; i++)
      p[i] = params[i];
  else
    bl_model_defaults(model, p);
  memset(&y, 0, sizeof y);
  if (model->incoherent(Z, p, &y) != BL_SUCCESS)
    return BL_EMODEL;
  if (y.n < 1 || y.n > BL_YUKAWA_MAX)
    return BL_EMODEL;
  for (i = 0; i < y.n; i++) {
    if (!(isfinite(y.alpha[i]) && y.b[i] >= 0.0 && isfinite(y.b[i])))
      return BL_EMODEL;
    sum += y.alpha[i];
  }
  if (!(fabs(sum - 1.0) <= 1e-9))
    return BL_EMODEL;   /* S(q) -> Z at large q: the form's sum rule */
  c->Z = Z;
  c->inc = y;
  for (i = 0; i < y.n; i++)
    c->inc.b[i] = y.b[i] / BL_ME_MEV;
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

/*
** The lab direction n of the projectile (for e- the faster final
** electron) fixes its pair-frame direction up to the two branches of the
** boost.  With t the tangent of n's angle to the pair's axis ez, u = g^2
** t^2, zeta = gb E3* / (g p*) (the pair's speed over the projectile's
** there) and r = sqrt(1 + u (1 - zeta^2)):
**   cos theta* = (-u zeta + s r) / (1 + u),  s = +1, -1,
** without cancellation h = 1 - cos = u (1 + zeta)^2 / (1 + u (1 + zeta) + r)
** (s = +1) and 2 - h = u (1 - zeta)^2 / (1 + u (1 - zeta) + r) (s = -1).
** A branch counts where the projectile's lab momentum along ez, g p*
** (zeta + cos) ~ zeta + s r, has the sign of n's: one branch for zeta < 1,
** both forward (and none backward) for zeta > 1.  Its weight is
** dOmega_s / dOmega = p3^3 / (p*^3 g |1 + zeta cos|), 1 + zeta cos = r (r +
** s zeta) / (1 + u): infinite at the largest lab angle of zeta > 1 (r = 0).
*/
int bl_ebrems_full (const bl_ebrems *c, double k, double theta_k,
                    double theta_p, double phi, double *val) {
  bl_ebframe f;
  double km = k / BL_ME_MEV, n[3], a[3], nz, nx, ny, nt, u, zeta, r2, r;
  int b;
  *val = 0.0;
  if (!(k > 0.0 && isfinite(k) && theta_k >= 0.0 && theta_k <= BL_PI
        && theta_p >= 0.0 && theta_p <= BL_PI && isfinite(phi)))
    return BL_EDOMAIN;
  if (bl_eb_frame_set(c, km, 2.0 * pow(sin(0.5 * theta_k), 2), sin(theta_k),
                      &f) != 0)
    return BL_SUCCESS;   /* beyond the end point of this photon direction */
  n[0] = sin(theta_p) * cos(phi);
  n[1] = sin(theta_p) * sin(phi);
  n[2] = cos(theta_p);
  nz = n[0] * f.ez[0] + n[1] * f.ez[1] + n[2] * f.ez[2];
  nx = n[0] * f.ex[0] + n[1] * f.ex[1] + n[2] * f.ex[2];
  ny = n[0] * f.ey[0] + n[1] * f.ey[1] + n[2] * f.ey[2];
  a[0] = n[1] * f.ez[2] - n[2] * f.ez[1];   /* |n x ez|: no cancellation */
  a[1] = n[2] * f.ez[0] - n[0] * f.ez[2];   /* near the axis */
  a[2] = n[0] * f.ez[1] - n[1] * f.ez[0];
  nt = sqrt(a[0] * a[0] + a[1] * a[1] + a[2] * a[2]);
  zeta = f.gb * f.e3s / (f.g * f.ps);
  for (b = 0; b < 2; b++) {
    double sgn = b == 0 ? 1.0 : -1.0, hs, hs2, d, st, p3;
    bl_ebpoint x;
    if (nz == 0.0) {             /* n perpendicular to ez: cos* = -zeta */
      if (b == 1 || !(zeta < 1.0))
        continue;
      hs = 1.0 + zeta;
      hs2 = 1.0 - zeta;
      d = (1.0 - zeta) * (1.0 + zeta);
    }
    else {
      u = f.g * f.g * nt * nt / (nz * nz);
      r2 = 1.0 + u * (1.0 - zeta) * (1.0 + zeta);
      if (!(r2 > 0.0) || !isfinite(u))
        break;                   /* beyond the largest lab angle; at it
                                 ** the density is singular (integrably,
                                 ** ~ 1/sqrt of the distance): 0 there */
      r = sqrt(r2);
      if ((zeta + sgn * r) * nz <= 0.0)
        continue;                /* this branch points the other way */
      if (b == 0) {
        hs = u * (1.0 + zeta) * (1.0 + zeta) / (1.0 + u * (1.0 + zeta) + r);
        hs2 = (1.0 + u * (1.0 - zeta) + r) / (1.0 + u);
      }
      else {
        hs2 = u * (1.0 - zeta) * (1.0 - zeta) / (1.0 + u * (1.0 - zeta) + r);
        hs = 2.0 - hs2;
      }
      d = r * fabs(r + sgn * zeta) / (1.0 + u);
    }

    st = sqrt(fmax(hs * hs2, 0.0));
    bl_eb_point_at(c, &f, hs, hs2, nt > 0.0 ? st * nx / nt : 0.0,
                   nt > 0.0 ? st * ny / nt : 0.0, &x);
    if (c->kind == BL_EBREMS_ELECTRON && x.p[2][0] < x.p[3][0])
      continue;                  /* e-: the faster electron is the one at n */
    p3 = sqrt(x.p[2][1] * x.p[2][1] + x.p[2][2] * x.p[2][2]
              + x.p[2][3] * x.p[2][3]);
    /* bl_eb_d5 halves e- e- for the two electrons' phase space; here only
    ** the faster is at n */
    *val += bl_eb_d5(c, &x) * (c->kind == BL_EBREMS_ELECTRON ? 2.0 : 1.0)
            * p3 * p3 * p3 / (f.ps * f.ps * f.ps * f.g * d);
  }
  *val *= bl_eb_unit();
  return isfinite(*val) ? BL_SUCCESS : BL_ENONFINITE;
}

/* ---- the integrals -------------------------------------------------- */

typedef struct integ {
  const bl_ebrems *c;
  bl_quad *q;
  double k;            /* m_e */
  double hk, sk;       /* photon direction */
  bl_ebframe f;        /* its pair frame */
  int ch;              /* channel: 0 pair axis, 1 photon axis */
  int far;             /* 0: h in [0, 1] from the pole h = 0; 1: from h = 2 */
  double h, s;         /* current polar distance 1 - cos from the pole of
                       ** this half (far: the pole h = 2), its sine */
  double sc[2][2];     /* map scales [channel][pole] */
  double hkc;          /* the map's scale in h_k */
  double smax;         /* sigma_k at the end point */
  double eps;          /* relative tolerance of the azimuth */
  double eps_mid;      /* of the pair-frame polar angle, under dsigma/dk */
  int npt;
  int status;          /* worst status of an inner integral */
} integ;

static void note (integ *it, int st) {
  if (st != BL_SUCCESS && it->status == BL_SUCCESS)
    it->status = st;
}

/* 1 - cos of the angle between n (unit) and the axis whose cosine with n
** is cz, free of cancellation: (n_T^2) / (1 + cz) near the axis. */
static double vers (double tt2, double cz) {
  return cz > 0.0 ? tt2 / (1.0 + cz) : 1.0 - cz;
}

/* The channel weights: each a product of the two poles' peak shapes. */
static double gshape (const double sc[2], double h, double h2) {
  return 1.0 / ((h + sc[0]) * (h2 + sc[1]));
}

/* Azimuth phi = pi u about the channel's axis (the integrand is even in
** phi: the (P, k) plane is a plane of symmetry); 2 pi for the even half. */
static double phi_f (double u, void *par, double *err) {
  integ *it = par;
  const bl_ebframe *f = &it->f;
  bl_ebpoint x;
  double phi = BL_PI * u, cp = cos(phi), sp = sin(phi), hs, hs2, tx, ty, cz;
  double hk1, hk2, gp, gk, a, b, ca, sa;
  *err = 0.0;
  it->q->calls++;
  /* the polar variable about the channel's axis: (h, 2 - h) */
  a = it->far ? 2.0 - it->h : it->h;
  b = it->far ? it->h : 2.0 - it->h;
  ca = 1.0 - a;
  sa = it->s;
  if (it->ch == 0) {
    hs = a; hs2 = b; tx = sa * cp; ty = sa * sp; cz = ca;
    /* the photon axis k* = (sks, 0, cks) */
    {
      double ck = f->sks * tx + f->cks * cz, t1 = f->cks * tx - f->sks * cz;
      double tt = t1 * t1 + ty * ty;
      hk1 = vers(tt, ck);
      hk2 = vers(tt, -ck);
    }
  } else {
    double nx, nz, tt;
    hk1 = a; hk2 = b;
    nx = f->cks * sa * cp + f->sks * ca;
    ty = sa * sp;
    nz = -f->sks * sa * cp + f->cks * ca;
    tx = nx;
    tt = nx * nx + ty * ty;
    hs = vers(tt, nz);
    hs2 = vers(tt, -nz);
    cz = nz;
  }
  (void)cz;
  gp = gshape(it->sc[0], hs, hs2);
  gk = gshape(it->sc[1], hk1, hk2);
  bl_eb_point_at(it->c, f, hs, hs2, tx, ty, &x);
  return 2.0 * BL_PI * bl_eb_d5(it->c, &x) * (it->ch == 0 ? gp : gk)
         / (gp + gk);
}

/* Polar variable sigma = ln(1 + d / scale), d the distance (1 - cos) from
** the pole of this half. */
static double hs_f (double sg, void *par, double *err) {
  integ *it = par;
  double sc = it->sc[it->ch][it->far], d, v, e, jac;
  d = sc * expm1(sg);
  if (d > 1.0)
    d = 1.0;
  it->h = d;
  it->s = sqrt(d * (2.0 - d));
  jac = d + sc;
  /* an inner integral that misses its tolerance still reports its error,
  ** which the outer level weighs into its own: its status is not kept */
  (void)bl_gk_adapt(phi_f, it, 0.0, 1.0, 0.0, it->eps, it->q->limit, it->npt,
                    it->q->pan[2], &v, &e);
  *err = jac * e;
  return jac * v;
}

/* The pair-frame geometry at the current photon direction: the scales of
** the four poles.  Pair axis: hs = 0 (the struck electron's smallest
** recoil, 1/t^2), hs = 2 (for e- e-: the projectile's, the exchange
** channel's 1/u^2).  Photon axis: the projectile along k* (1/(p3.k)) and
** the electron along k* (1/(p4.k)). */
static int pair_frame (integ *it) {
  bl_ebframe *f = &it->f;
  const bl_ebrems *c = it->c;
  double gp;
  if (bl_eb_frame_set(c, it->k, it->hk, it->sk, f) != 0)
    return -1;
  gp = f->gb * f->ps;
  it->sc[0][0] = fmin(fmax(f->t4min / gp, 1e-300), 1.0);
  it->sc[0][1] = c->kind == BL_EBREMS_ELECTRON
                 ? fmin(fmax(f->t3min / gp, 1e-300), 1.0) : 1.0;
  if (c->Z > 0) {
    /* binding: S(q)/Z ~ q^2 / b^2 below the smallest screening momentum
    ** b, so the pole's peak widens to T4 = sqrt(1 + b^2) - 1 */
    double b = c->inc.b[0], tb;
    int i;
    for (i = 1; i < c->inc.n; i++)
      b = fmin(b, c->inc.b[i]);
    tb = b * b / (sqrt(1.0 + b * b) + 1.0);
    if ((tb - f->t4min) / gp > it->sc[0][0])
      it->sc[0][0] = fmin((tb - f->t4min) / gp, 1.0);
    if (c->kind == BL_EBREMS_ELECTRON && (tb - f->t3min) / gp > it->sc[0][1])
      it->sc[0][1] = fmin((tb - f->t3min) / gp, 1.0);
  }
  it->sc[1][0] = fmin(c->m * c->m / (f->ps * (f->e3s + f->ps)), 1.0);
  it->sc[1][1] = fmin(1.0 / (f->ps * (f->e4s + f->ps)), 1.0);
  return 0;
}

/* d2sigma/(dk dOmega_k) at the photon direction of it, units
** lambda_e^2/m_e per sr; *err its error: two channels, each two halves. */
static double angular (integ *it, double eps, int outer, double *err) {
  double v = 0.0, e = 0.0;
  *err = 0.0;
  if (pair_frame(it) != 0)
    return 0.0;
  it->eps = EPS_SHARE * eps;
  for (it->ch = 0; it->ch < 2; it->ch++)
    for (it->far = 0; it->far < 2; it->far++) {
      double pv, pe, top = log1p(1.0 / it->sc[it->ch][it->far]);
      int st;
      if (outer)
        st = bl_gk_adapt_budget(hs_f, it, 0.0, top, 0.0, eps, it->q->limit,
                                it->npt, it->q->pan[1], &it->q->calls,
                                it->q->calls + EB_CALL_BUDGET, &pv, &pe);
      else
        st = bl_gk_adapt(hs_f, it, 0.0, top, 0.0, eps, it->q->limit,
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

/* Photon angle: sigma_k = ln(1 + h_k / h_kc) = smax (2 v - v^2), v in
** [0, 1]: the square root of the closing phase space at the end point
** h_k = hmax (p* ~ sqrt(hmax - h_k)) becomes smooth in v. */
static double hk_f (double v, void *par, double *err) {
  integ *it = par;
  double sg = it->smax * v * (2.0 - v), val, jac;
  it->hk = it->hkc * expm1(sg);
  if (it->hk > 2.0)
    it->hk = 2.0;
  it->sk = sqrt(it->hk * (2.0 - it->hk));
  jac = (it->hk + it->hkc) * it->smax * 2.0 * (1.0 - v);
  val = angular(it, it->eps_mid, 0, err);
  *err *= 2.0 * BL_PI * jac;
  return 2.0 * BL_PI * jac * val;
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
  hmax = bl_eb_hkmax(c, km);   /* the directions with W >= m + m_e */
  if (!(hmax > 0.0))
    return BL_SUCCESS;
  if (hmax > 2.0)
    hmax = 2.0;
  setup(&it, c, k, q);
  it.eps_mid = EPS_SHARE * q->rtol;
  it.smax = log1p(hmax / it.hkc);
  st = bl_gk_adapt_budget(hk_f, &it, 0.0, 1.0, 0.0, q->rtol,
                          q->limit, it.npt, q->pan[0], &q->calls,
                          q->calls + EB_CALL_BUDGET, &v, &e);
  note(&it, st);
  fill(out, v, e, it.status);
  return finish(out, it.status);
}
