/*
** dcs.c -- the distorted-wave cross sections: fully differential, photon
** angular distribution and dsigma/dk
** See Copyright Notice in LICENSE
**
** On the bare point nucleus
**
**   d3sigma / (dk dOmega_k dOmega_p) = (norm / (4 pi^2)) (p / (p0 k)) B / q^4
**
** as the Born cross section (born/dcs.c) with the distorted-wave bracket
** B of amp.c; its integrals use the Born room's polar maps with the
** azimuth integrated here (bl_azimuth hook).  Screening, nuclear size
** and the atomic electrons come in by the rule of screened() below
** (DEVELOPERS.md, "Distorted waves"): the screened Born value times the
** Elwert factor plus the rest of the point nucleus's distortion, added at
** high energy and scaled like the screened/unscreened Born ratio for slow
** projectiles; every value carries its estimated model uncertainty (sys).
*/

#include <math.h>

#include <gsl/gsl_errno.h>

#include "base/internal.h"
#include "distorted/internal.h"


#define U_MARGIN 1e-6   /* widen the table's range by this much in u */


/* The range of u = ln(1 - x) over every geometry of one photon energy:
** 1 - x = q^2 (p0 + p - k)(p0 + p + k) / (4 k^2 D D0), D = E - p cos theta,
** with delta <= q <= p0 + p + k, 1/(E + p) <= D <= E + p (and D0 alike). */
static void urange (const bl_kin *kn, double *umin, double *umax) {
  double p0 = kn->p0, p = kn->p, k = kn->k, s = p0 + p + k;
  double c = log(kn->delta + 2.0 * p) + log(s) - log(4.0) - 2.0 * log(k);
  double lD = log(kn->E + p), lD0 = log(kn->E0 + p0);
  *umin = 2.0 * log(kn->delta) + c - lD - lD0 - U_MARGIN;
  *umax = 2.0 * log(s) + c + lD + lD0 + U_MARGIN;
}


int bl_dwk_init (bl_dwk *d, const bl_case *c, double k, double umin,
                 double umax) {
  double eta0, eta;
  int st;
  if (d == NULL)
    return BL_EDOMAIN;
  d->hyp.neg.f = d->hyp.pos.f = NULL;
  d->hyp.neg.n = d->hyp.pos.n = 0;
  if (c == NULL)
    return BL_EDOMAIN;
  st = bl_kin_case(c, k, &d->kn);
  if (st != BL_SUCCESS)
    return st;
  d->zeta = -c->particle.charge * c->Z * BL_ALPHA;
  if (d->zeta == 0.0)
    return BL_EDOMAIN;
  if (umin == 0.0 && umax == 0.0)
    urange(&d->kn, &umin, &umax);
  eta0 = d->zeta * d->kn.E0 / d->kn.p0;
  eta = d->zeta * d->kn.E / d->kn.p;
  d->lnscale = bl_dw_lnscale(&d->kn, d->zeta);
  d->scale = exp(d->lnscale);
  return bl_dwhyp_init(&d->hyp, eta0, eta, umin - U_MARGIN, umax + U_MARGIN);
}


void bl_dwk_free (bl_dwk *d) {
  if (d != NULL)
    bl_dwhyp_free(&d->hyp);
}


/* The case's target factor W(x) = G/(Z^2 q^4) at q^2 = x, no Elwert
** factor (the distortion replaces it): born/kin.c with the case's lists. */
static double target_w (const bl_case *c, double x) {
  double single[BL_POLE_MAX];
  int i;
  for (i = 0; i < c->npole; i++)
    single[i] = c->single_el[i] + c->single_e[i];
  return bl_target_w(x, c->npole, c->pole, single, c->nterm, c->term);
}


static void clear (bl_result *out) {
  out->val = out->err = out->sys = 0.0;
  out->warn = out->applied = 0;
  out->method = BL_METHOD_DISTORTED;
}


/* The fully differential value on case c itself (q-factor rule: the
** bracket of the point nucleus times c's target factor). */
static int full_point (const bl_case *c, double k, double theta_k,
                       double theta_p, double phi, bl_result *out) {
  bl_dwk d;
  bl_polar g;
  double v, u, q2, B;
  int st;
  if (out == NULL)
    return BL_EDOMAIN;
  clear(out);
  if (c == NULL || !(theta_k >= 0.0 && theta_k <= BL_PI)
      || !(theta_p >= 0.0 && theta_p <= BL_PI) || !isfinite(phi))
    return BL_EDOMAIN;
  st = bl_kin_case(c, k, &d.kn);
  if (st != BL_SUCCESS)
    return st;
  bl_polar_beam(theta_k, theta_p, phi, &g, &v);
  u = bl_dw_u(&d.kn, &g, v, &q2);
  st = bl_dwk_init(&d, c, k, u, u);
  if (st == BL_SUCCESS)
    st = bl_dw_bracket(&d, &g, v, &B, &q2);
  bl_dwk_free(&d);
  if (st != BL_SUCCESS)
    return st;
  out->val = B * target_w(c, q2) * c->norm * d.kn.p / (d.kn.p0 * d.kn.k)
             / (4.0 * BL_PI * BL_PI) / c->particle.mass;
  out->warn = c->warn;
  return isfinite(out->val) ? BL_SUCCESS : BL_ENONFINITE;
}


/* ---- dsigma/dk and the angular distribution ------------------------------
**
** The polar integrals are the Born room's (born/dcs.c: the maps of the
** forward peak and of the ridges, the error model); the azimuth, no longer
** in closed form, is integrated here for each pair of polar angles.  Its
** integrand peaks at phi = 0 when q^2 = Q0 + b (1 - cos phi) is smallest
** there (Q0 << b): width phi_w = sqrt(2 Q0 / b).  The variable
** u = ln(1 + phi/phi_w) makes that peak (W ~ 1/(Q0 + b phi^2/2)^2) and the
** slow tail beyond it smooth, as sigma = ln(1 + h/hc) does for the polar
** angles.
*/

#define AZ_LIMIT 64   /* panels of one azimuthal integral */
#ifndef AZ_NPT
#define AZ_NPT 15
#endif
#ifndef AZ_SHARE
#define AZ_SHARE 1.0  /* its relative tolerance, as a share of rtol */
#endif

typedef struct dwaz {
  const bl_case *c;
  bl_dwk d;
  bl_quad *q;
  bl_dwpolar pg;       /* the polar geometry of the current azimuth */
  double phiw;
  int status;          /* first failure of the bracket */
  double single[BL_POLE_MAX];   /* the target factor's lists (target_w) */
} dwaz;


static double az_f (double u, void *par, double *err) {
  dwaz *x = par;
  double phi = x->phiw * expm1(u), sp = sin(0.5 * phi), cp = cos(0.5 * phi);
  double B, q2;
  int st = bl_dw_bracket_at(&x->d, &x->pg, 2.0 * sp * sp, 2.0 * sp * cp, &B,
                            &q2);
  *err = 0.0;
  x->q->calls++;
  if (st != BL_SUCCESS) {
    if (x->status == BL_SUCCESS)
      x->status = st;
    return 0.0;
  }
  return B * bl_target_w(q2, x->c->npole, x->c->pole, x->single,
                         x->c->nterm, x->c->term) * (phi + x->phiw);
}


static double az_phi (void *ctx, const bl_polar *g, const bl_bracket *br,
                      double *err) {
  dwaz *x = ctx;
  double val, umax;
  bl_dw_polar_set(&x->d, g, &x->pg);
  x->phiw = br->b > 0.0 ? sqrt(2.0 * br->Q0 / br->b) : BL_PI;
  if (!(x->phiw > 1e-300))
    x->phiw = 1e-300;
  umax = log1p(BL_PI / x->phiw);
  bl_gk_adapt(az_f, x, 0.0, umax, 0.0, AZ_SHARE * bl_quad_rtol(x->q),
              x->q->limit < AZ_LIMIT ? x->q->limit : AZ_LIMIT, AZ_NPT,
              x->q->pan[2], &val, err);
  return val;
}


/* The table of V for photon energy k, the hook; out cleared. */
static int start (dwaz *x, bl_azimuth *az, const bl_case *c, double k,
                  bl_quad *q, bl_result *out) {
  int i;
  x->d.hyp.neg.f = x->d.hyp.pos.f = NULL;
  x->d.hyp.neg.n = x->d.hyp.pos.n = 0;
  if (out == NULL)
    return BL_EDOMAIN;
  clear(out);
  if (c == NULL || q == NULL)
    return BL_EDOMAIN;
  x->c = c;
  x->q = q;
  x->status = BL_SUCCESS;
  for (i = 0; i < c->npole; i++)
    x->single[i] = c->single_el[i] + c->single_e[i];
  az->phi = az_phi;
  az->ctx = x;
  return bl_dwk_init(&x->d, c, k, 0.0, 0.0);
}


static int finish (dwaz *x, int st, bl_result *out) {
  bl_dwk_free(&x->d);
  out->method = BL_METHOD_DISTORTED;
  if (st == BL_SUCCESS && x->status != BL_SUCCESS)
    st = x->status;
  if (st == BL_SUCCESS && !isfinite(out->val))
    st = BL_ENONFINITE;
  return st;
}


/* Which observable: dsigma/dk, the angular distribution at theta_k, or
** the fully differential value at (theta_k, theta_p, phi). */
enum { OBS_DK, OBS_ANGULAR, OBS_FULL };
typedef struct obs {
  int kind;
  double k, theta_k, theta_p, phi;
} obs;


/* The distorted-wave value on case c (on the bare point nucleus it is the
** whole answer). */
static int dw_point (const bl_case *c, const obs *b, bl_quad *q,
                     bl_result *out) {
  dwaz x;
  bl_azimuth az;
  int st;
  if (b->kind == OBS_FULL)
    return full_point(c, b->k, b->theta_k, b->theta_p, b->phi, out);
  st = start(&x, &az, c, b->k, q, out);
  if (st == BL_SUCCESS)
    st = b->kind == OBS_DK
         ? bl_dcs_dk_az_e(c, b->k, q, &az, out)
         : bl_dcs_angular_az_e(c, b->k, b->theta_k, q, &az, out);
  return finish(&x, st, out);
}


/* The same observable by the Born integral of case c. */
static int born (const bl_case *c, const obs *b, bl_quad *q, bl_result *out) {
  switch (b->kind) {
    case OBS_DK:
      return bl_dcs_dk_e(c, b->k, q, out);
    case OBS_ANGULAR:
      return bl_dcs_angular_e(c, b->k, b->theta_k, q, out);
    default:
      return bl_dcs_full_e(c, b->k, b->theta_k, b->theta_p, b->phi, out);
  }
}


/*
** The estimated relative error of the Sommerfeld-Maue functions
** themselves: the terms they drop are of relative order (zZ alpha)^2
** (Sommerfeld & Maue 1935); they vanish in the non-relativistic limit
** (where the functions become the exact Coulomb waves: tests
** sommerfeld_nonrelativistic) and fade at high energy (Bethe-Maximon:
** tests bethe_maximon_coulomb), hence the factor beta0^2/sqrt(gamma0).
** For a repelled projectile three times that: the positron/electron
** ratio of the radiative stopping power measured against Kim et al.
** (1986) is off by up to 0.62 (Z = 92, 1 MeV) where this estimate gives
** 0.23 (DEVELOPERS.md, "Distorted waves").  An estimate of the size, not
** a measured error.
*/
double bl_dw_sm_estimate (const bl_case *c, const bl_kin *kn) {
  double zza = c->particle.charge * c->Z * BL_ALPHA;
  double b2 = (kn->p0 / kn->E0) * (kn->p0 / kn->E0);
  double e = zza * zza * b2 / sqrt(kn->E0);
  return zza > 0.0 ? 3.0 * e : e;   /* zZ > 0: repelled */
}


/* The model uncertainty: the screening rule's, the functions' own and
** the point-charge distortion left out for the nuclear size (nuc).  Added in quadrature; the warning
** where the sum exceeds BL_SYS_WARN. */
static void model_sys (const bl_case *c, const bl_kin *kn, double rule,
                       double nuc, bl_result *out) {
  double sm = bl_dw_sm_estimate(c, kn) * fabs(out->val);
  out->sys = sqrt(rule * rule + sm * sm + nuc * nuc);
  if (out->sys > BL_SYS_WARN * fabs(out->val))
    out->warn |= BL_WARN_DISTORTED;
}


static int bare (const bl_case *c) {
  return c->screening->id == BL_MODEL_NONE
         && c->opts.nucleus == BL_NUCLEUS_POINT && !c->opts.electrons;
}


/* A soft failure (a best estimate) is kept unless a hard one comes. */
static int worse (int st, int s2) {
  if (st == BL_SUCCESS || (s2 != BL_SUCCESS && !bl_status_soft(s2)))
    return s2 == BL_SUCCESS ? st : s2;
  return st;
}


/*
** The screening rule of the integrated values (DEVELOPERS.md, "Distorted
** waves"), with D the distorted-wave and B the Born values, "pt" the bare
** point nucleus, "n" the case's nucleus (screening, nuclear size), "e"
** its atomic electrons, F_E the Elwert factor (the ratio of the final to
** the initial Sommerfeld factor) and Delta = D_pt - F_E B_pt the
** distortion beyond that normalisation:
**
**   dsigma = F_E B_n + B_e + Delta (w + (1 - w) B_n / B_pt),  w = beta0^2,
**
** Delta times bl_coulomb_share (corrections.c) for a uniform nucleus.
**
** w = 1 is Olsen, Maximon & Wergeland's (1957) result for high energies:
** the Coulomb correction, from distances ~ hbar/(m c), does not depend on
** screening, and is added.  w = 0 is the ratio rule of slow projectiles,
** D_pt B_n / B_pt, whose distortion acts where screening does and scales
** with it.  The difference of the two rules, |Delta| (1 - B_n / B_pt),
** weighted by 1 - w, is the rule's uncertainty, *rule (absolute).
*/
static int screened (const bl_case *c, const obs *b, bl_quad *q,
                     bl_result *out, double *rule) {
  bl_case cp, cn, ca;
  bl_opts o;
  bl_result dp, bp, bn, ba;
  bl_kin kn;
  double fe, w, delta, be = 0.0, sn, ns, nuc;
  int st;
  *rule = 0.0;
  if (out == NULL)
    return BL_EDOMAIN;
  clear(out);
  if (c == NULL || (q == NULL && b->kind != OBS_FULL))
    return BL_EDOMAIN;
  st = bl_kin_case(c, b->k, &kn);
  if (st != BL_SUCCESS)
    return st;
  if (bare(c)) {
    st = dw_point(c, b, q, out);
    model_sys(c, &kn, 0.0, 0.0, out);
    return st;
  }
  st = bl_case_setup(&cp, &c->particle, c->Z, bl_model_get(BL_MODEL_NONE),
                     NULL, c->T, &bl_opts_bare);
  o = c->opts;
  o.elwert = o.coulomb = BL_APPLY_OFF;
  o.electrons = 0;
  if (st == BL_SUCCESS)
    st = bl_case_setup(&cn, &c->particle, c->Z, c->screening, c->params,
                       c->T, &o);
  if (st != BL_SUCCESS)
    return st;
  st = dw_point(&cp, b, q, &dp);
  if (st != BL_SUCCESS && !bl_status_soft(st))
    return st;
  st = worse(st, born(&cp, b, q, &bp));
  st = worse(st, born(&cn, b, q, &bn));
  out->warn = c->warn | ((dp.warn | bp.warn | bn.warn) & BL_WARN_TOLERANCE);
  /* the electron part B_e (Born; for e-/e+ the bound term, 0 above its
  ** end point, where the difference would only add the noise of two
  ** integrals of the same nuclear part) */
  if (c->opts.electrons && bl_case_eratio(c, b->k) > 0.0) {
    o.electrons = 1;
    st = worse(st, bl_case_setup(&ca, &c->particle, c->Z, c->screening,
                                 c->params, c->T, &o));
    if (st == BL_SUCCESS || bl_status_soft(st)) {
      st = worse(st, born(&ca, b, q, &ba));
      be = ba.val - bn.val;
      out->err += ba.err + bn.err;
      out->warn |= ba.warn & BL_WARN_TOLERANCE;
    }
  }
  if (st != BL_SUCCESS && !bl_status_soft(st))
    return st;
  fe = bl_elwert(c, &kn);
  w = (kn.p0 / kn.E0) * (kn.p0 / kn.E0);
  ns = bl_coulomb_share(c);   /* corrections.c: the same share */
  delta = dp.val - fe * bp.val;
  sn = bp.val > 0.0 ? bn.val / bp.val : 1.0;
  /* At one geometry (the fully differential value) the additive rule
  ** holds where screening does not reach the point's momentum transfer
  ** (sn -> 1); where it does, the distortion of that q is screened too
  ** and the ratio rule holds: weight w sn.  Measured: with weight w, 10 keV
  ** electrons on Z = 99 at 3 mrad gave fe bn + w Delta < 0 (Delta ~
  ** -fe bp, bp >> bn). */
  if (b->kind == OBS_FULL && sn < 1.0)
    w *= sn;
  /* the part left out: the point charge's relative distortion |Delta| /
  ** B_pt applied to this value (its real size for the extended nucleus
  ** is not known here) */
  nuc = (1.0 - ns) * fabs(delta) * sn;
  delta *= ns;
  /* fe bn + be + ns Delta (w + (1 - w) sn) written without the
  ** cancellation of fe bn against Delta (1 - w) sn for slow projectiles,
  ** where dp << fe bp */
  out->val = fe * bn.val * (1.0 - ns) + be
             + ns * (w * (dp.val + fe * (bn.val - bp.val))
                     + (1.0 - w) * dp.val * sn);
  /* the three integrals' errors as they enter the value (sn = bn/bp):
  ** the point-charge parts dp and bp weigh ns, which vanishes for heavy
  ** projectiles on an extended nucleus, where bp >> bn and their errors
  ** alone used to exceed the value (a proton on Fe at y = 0.99: 9.5 %
  ** reported, 4e-5 true) */
  {
    double r = bp.val > 0.0 ? dp.val / bp.val : 0.0;
    out->err += ns * fabs(w + (1.0 - w) * sn) * dp.err
                + ns * fabs(w * fe + (1.0 - w) * r * sn) * bp.err
                + fabs(fe * (1.0 - ns) + ns * (w * fe + (1.0 - w) * r))
                  * bn.err;
  }
  /* the two rules' difference; the additive one is never below 0 */
  *rule = (1.0 - w) * fabs(fmax(fe * bn.val + be + delta, 0.0)
                           - (fe * bn.val + be + delta * sn));
  if (out->val < 0.0) {
    out->val = 0.0;
    out->warn |= BL_WARN_CLAMPED;
  }
  /* the sum's error against the tolerance, as every integral says it (a
  ** value that nearly cancels, or one below the smallest double, has an
  ** error above rtol times itself) */
  if (q != NULL && !(out->warn & BL_WARN_CLAMPED)
      && out->err > bl_quad_rtol(q) * fabs(out->val))
    out->warn |= BL_WARN_TOLERANCE;
  model_sys(c, &kn, *rule, nuc, out);
  if (!isfinite(out->val))
    return BL_ENONFINITE;
  return st;
}


/*
** Soft photons.  Below k = BL_DW_SOFT_Y T the amplitudes' leading soft
** terms (of order 1/k, from emission before and after the scattering)
** cancel to the last digits of a double: at T = 10 keV and 10 MeV the
** error estimate of dsigma/dk grows from 4e-4 at k = 1e-12 T to 7-15 %
** at 1e-13-1e-14 T and the value goes wild below (DEVELOPERS.md,
** "Distorted waves").  There the value is the Born value times the ratio
** R = D/B the distorted waves give at k_s = BL_DW_SOFT_Y T: by Low's
** theorem both approach (classical soft factor) x (elastic cross
** section), so R tends to the ratio of the elastic cross sections.  How
** much R still changes below k_s is not computed: the change of R over
** the decade (k_s, 10 k_s) times the number of decades below k_s is added
** to sys, and BL_WARN_SOFT says so.
*/
static int soft (const bl_case *c, const obs *b, bl_quad *q,
                 bl_result *out) {
  obs bs = *b, b10 = *b;
  bl_result ds, d10, bs_born, b10_born, bk;
  double rule, r, r10, dec;
  int st;
  clear(&ds);
  clear(&d10);
  clear(&bs_born);
  clear(&b10_born);
  clear(&bk);
  bs.k = BL_DW_SOFT_Y * c->T;
  b10.k = 10.0 * bs.k;
  st = screened(c, &bs, q, &ds, &rule);
  if (st == BL_SUCCESS || bl_status_soft(st))
    st = worse(st, screened(c, &b10, q, &d10, &rule));
  if (st == BL_SUCCESS || bl_status_soft(st))
    st = worse(st, born(c, &b10, q, &b10_born));
  if (st == BL_SUCCESS || bl_status_soft(st))
    st = worse(st, born(c, &bs, q, &bs_born));
  if (st == BL_SUCCESS || bl_status_soft(st))
    st = worse(st, born(c, b, q, &bk));
  clear(out);
  if (st != BL_SUCCESS && !bl_status_soft(st))
    return st;
  out->method = BL_METHOD_DISTORTED;
  if (!(bs_born.val > 0.0) || !(b10_born.val > 0.0) || !(bk.val > 0.0)) {
    out->val = 0.0;
    out->err = bk.err;
    out->warn = bk.warn | BL_WARN_SOFT;
    return st;
  }
  r = ds.val / bs_born.val;
  r10 = d10.val / b10_born.val;
  dec = log10(bs.k / b->k);
  out->val = r * bk.val;
  out->err = r * bk.err + bk.val * (ds.err / bs_born.val
                                    + r * bs_born.err / bs_born.val);
  out->sys = bk.val * hypot(ds.sys / bs_born.val, fabs(r - r10) * dec);
  out->warn = (ds.warn | bk.warn | BL_WARN_SOFT)
              & ~(unsigned)BL_WARN_DISTORTED;
  if (out->sys > BL_SYS_WARN * out->val)
    out->warn |= BL_WARN_DISTORTED;
  if (!isfinite(out->val) || !isfinite(out->err) || !isfinite(out->sys))
    return BL_ENONFINITE;
  return st;
}


static int dispatch (const bl_case *c, const obs *b, bl_quad *q,
                     bl_result *out) {
  double rule;
  if (c != NULL && out != NULL && b->k > 0.0
      && b->k < BL_DW_SOFT_Y * c->T)
    return soft(c, b, q, out);
  return screened(c, b, q, out, &rule);
}


int bl_dw_dk_e (const bl_case *c, double k, bl_quad *q, bl_result *out) {
  obs b = { OBS_DK, k, 0.0, 0.0, 0.0 };
  return dispatch(c, &b, q, out);
}


int bl_dw_dk_direct_e (const bl_case *c, double k, bl_quad *q,
                       bl_result *out) {
  obs b = { OBS_DK, k, 0.0, 0.0, 0.0 };
  double rule;
  return screened(c, &b, q, out, &rule);
}


int bl_dw_angular_e (const bl_case *c, double k, double theta_k, bl_quad *q,
                     bl_result *out) {
  obs b = { OBS_ANGULAR, k, theta_k, 0.0, 0.0 };
  if (!(theta_k >= 0.0 && theta_k <= BL_PI)) {
    if (out != NULL)
      clear(out);
    return BL_EDOMAIN;
  }
  return dispatch(c, &b, q, out);
}


int bl_dw_full_e (const bl_case *c, double k, double theta_k, double theta_p,
                  double phi, bl_result *out) {
  obs b = { OBS_FULL, k, theta_k, theta_p, phi };
  if (out == NULL)
    return BL_EDOMAIN;
  clear(out);
  if (!(theta_k >= 0.0 && theta_k <= BL_PI)
      || !(theta_p >= 0.0 && theta_p <= BL_PI) || !isfinite(phi))
    return BL_EDOMAIN;
  return dispatch(c, &b, NULL, out);
}
