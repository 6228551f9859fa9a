/*
** dcs.c -- the distorted-wave cross sections: fully differential and
** dsigma/dk (first version: nested adaptive integrals)
** See Copyright Notice in LICENSE
**
**   d3sigma / (dk dOmega_k dOmega_p) = (norm / (4 pi^2)) (p / (p0 k)) W(q^2) B
**
** as the Born cross section (born/dcs.c), with the distorted-wave bracket
** B of amp.c for the point nucleus and the case's target factor
** W = G/(Z^2 q^4) taken at the same momentum transfer.  That is the
** screening rule: the Coulomb distortion computed for the point nucleus,
** screening, nuclear size and the atomic electrons as the factor
** G(q)/Z^2 of the momentum transfer (DEVELOPERS.md, "Distorted waves").
*/

#include <math.h>

#include <gsl/gsl_errno.h>
#include <gsl/gsl_integration.h>

#include "base/internal.h"
#include "distorted/internal.h"


#define U_MARGIN 1e-6   /* widen the table's range by this much in u */


/* The range of u = ln(1 - x) over every geometry of one photon energy:
** 1 - x = q^2 (p0 + p - k)(p0 + p + k) / (4 k^2 D D0), D = E - p cos theta,
** with delta <= q <= p0 + p + k, 1/(E + p) <= D <= E + p (and D0 alike). */
static void urange (const bl_kin *kn, double *umin, double *umax) {
  double p0 = kn->p0, p = kn->p, k = kn->k, s = p0 + p + k;
  double c = log(kn->delta + 2.0 * p) + log(s) - log(4.0 * k * k);
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
  return bl_dwhyp_init(&d->hyp, eta0, eta, umin - U_MARGIN, umax + U_MARGIN);
}


void bl_dwk_free (bl_dwk *d) {
  if (d != NULL)
    bl_dwhyp_free(&d->hyp);
}


/* The case's target factor W(x) = G/(Z^2 q^4) at q^2 = x, no Elwert
** factor (the distortion replaces it). */
static double target_w (const bl_case *c, double x) {
  double w[BL_POLE_MAX], W = 0.0;
  int i, t;
  for (i = 0; i < c->npole; i++) {
    w[i] = 1.0 / (c->pole[i] + x);
    W += (c->single_el[i] + c->single_e[i]) * w[i];
  }
  for (t = 0; t < c->nterm; t++)
    // cppcheck-suppress uninitvar ; every w[i], i < npole, is set above
    W += c->term[t].c * w[c->term[t].i] * w[c->term[t].j];
  return W;
}


static void clear (bl_result *out) {
  out->val = out->err = 0.0;
  out->warn = out->applied = 0;
  out->method = BL_METHOD_DISTORTED;
}


/*
** Beam-frame angles to the photon frame, as bl_dcs_full_e does
** (born/dcs.c): the final direction's polar angle to the photon and the
** azimuth around it, v = 1 - cos(phi_k), both without cancellation.
*/
static void beam_to_photon (double theta_k, double theta_p, double phi,
                            bl_polar *g, double *v) {
  double sd = sin(0.5 * (theta_k - theta_p)), sp = sin(0.5 * phi);
  double X, Y, rho;
  g->ridge = 0;
  g->h0 = 2.0 * sin(0.5 * theta_k) * sin(0.5 * theta_k);
  g->s0 = sin(theta_k);
  g->h = 2.0 * sd * sd + 2.0 * g->s0 * sin(theta_p) * sp * sp;
  X = sin(theta_k - theta_p) + 2.0 * cos(theta_k) * sin(theta_p) * sp * sp;
  Y = -sin(theta_p) * sin(phi);
  rho = hypot(X, Y);
  g->s = rho;
  if (rho == 0.0)
    *v = 0.0;
  else if (X > 0.0)
    *v = Y * Y / (rho * (rho + X));
  else
    *v = (rho - X) / rho;
}


int bl_dw_full_e (const bl_case *c, double k, double theta_k, double theta_p,
                  double phi, bl_result *out) {
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
  beam_to_photon(theta_k, theta_p, phi, &g, &v);
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


/* ---- dsigma/dk: three nested adaptive integrals -------------------------- */

#define LIMIT 200

typedef struct dwint {
  const bl_case *c;
  bl_dwk d;
  bl_polar g;
  double Q0, bq;           /* q^2 = Q0 + bq v at the current polar angles */
  double phiw;             /* azimuth map: phi = phiw tan(psi) */
  double rtol;
  int status;
  bl_quad *q;              /* counts the calls of the integrand */
  gsl_integration_workspace *w[3];
} dwint;


static void note (dwint *it, int st) {
  if (it->status == BL_SUCCESS && st != BL_SUCCESS)
    it->status = st;
}


static double f_psi (double psi, void *par) {
  dwint *it = par;
  double t = tan(psi), phi = it->phiw * t, sp = sin(0.5 * phi);
  double v = 2.0 * sp * sp, B, q2, jac = it->phiw * (1.0 + t * t);
  int st = bl_dw_bracket(&it->d, &it->g, v, &B, &q2);
  it->q->calls++;
  if (st != BL_SUCCESS) {
    note(it, st);
    return 0.0;
  }
  return B * target_w(it->c, q2) * jac;
}


static double f_sigma (double sg, void *par) {
  dwint *it = par;
  const bl_kin *kn = &it->d.kn;
  double h = kn->hc * expm1(sg), jac = h + kn->hc, qz, dt, val, err;
  gsl_function f;
  int st;
  if (h > 2.0)
    h = 2.0;
  it->g.h = h;
  it->g.s = sqrt(fmax(h * (2.0 - h), 0.0));
  qz = kn->delta - kn->p0 * it->g.h0 + kn->p * h;
  dt = kn->p0 * it->g.s0 - kn->p * it->g.s;
  it->Q0 = qz * qz + dt * dt;
  it->bq = 2.0 * kn->p0 * kn->p * it->g.s0 * it->g.s;
  it->phiw = it->bq > 0.0 ? sqrt(2.0 * it->Q0 / it->bq) : 1.0;
  if (it->phiw > 1.0 || !(it->phiw > 0.0))
    it->phiw = 1.0;
  f.function = f_psi;
  f.params = it;
  st = gsl_integration_qag(&f, 0.0, atan(BL_PI / it->phiw), 0.0,
                           0.1 * it->rtol, LIMIT, GSL_INTEG_GAUSS21, it->w[2],
                           &val, &err);
  note(it, st);
  return val * jac;
}


static double f_sigma0 (double sg0, void *par) {
  dwint *it = par;
  const bl_kin *kn = &it->d.kn;
  double h0 = kn->hc0 * expm1(sg0), jac = h0 + kn->hc0;
  double smax = log1p(2.0 / kn->hc), cuts[4], sum = 0.0, r;
  gsl_function f;
  int n = 0, i, st;
  if (h0 > 2.0)
    h0 = 2.0;
  it->g.h0 = h0;
  it->g.s0 = sqrt(fmax(h0 * (2.0 - h0), 0.0));
  it->g.ridge = 0;
  cuts[n++] = 0.0;
  r = kn->p0 * it->g.s0 / kn->p;   /* sin of the ridge angle */
  if (r < 1.0) {
    double c = sqrt((1.0 - r) * (1.0 + r));
    double hs[2] = { r * r / (1.0 + c), 1.0 + c };
    for (i = 0; i < 2; i++) {
      double s = log1p(hs[i] / kn->hc);
      if (s > cuts[n - 1] && s < smax)
        cuts[n++] = s;
    }
  }
  cuts[n++] = smax;
  f.function = f_sigma;
  f.params = it;
  for (i = 0; i + 1 < n; i++) {
    double val, err;
    st = gsl_integration_qag(&f, cuts[i], cuts[i + 1], 0.0, 0.3 * it->rtol,
                             LIMIT, GSL_INTEG_GAUSS21, it->w[1], &val, &err);
    note(it, st);
    sum += val;
  }
  return sum * jac;
}


/* Allocate the integration state of photon energy k; BL_SUCCESS or the
** failure (it->w and the table freed by done() in any case). */
static int start (dwint *it, const bl_case *c, double k, bl_quad *q) {
  int i, st;
  for (i = 0; i < 3; i++)
    it->w[i] = NULL;
  if (c == NULL || q == NULL) {
    it->d.hyp.neg.f = it->d.hyp.pos.f = NULL;
    return BL_EDOMAIN;
  }
  st = bl_dwk_init(&it->d, c, k, 0.0, 0.0);
  if (st != BL_SUCCESS)
    return st;
  it->c = c;
  it->q = q;
  it->rtol = bl_quad_rtol(q);
  it->status = BL_SUCCESS;
  for (i = 0; i < 3; i++) {
    it->w[i] = gsl_integration_workspace_alloc(LIMIT);
    if (it->w[i] == NULL)
      return BL_ENOMEM;
  }
  return BL_SUCCESS;
}


static void done (dwint *it) {
  int i;
  for (i = 0; i < 3; i++)
    gsl_integration_workspace_free(it->w[i]);
  bl_dwk_free(&it->d);
}


/* Fill out from the integral val +- err times scale (the inner integrals'
** share of the error added). */
static int finish (dwint *it, int st, double val, double err, double scale,
                   bl_result *out) {
  out->val = val * scale;
  out->err = (err + 0.4 * it->rtol * fabs(val)) * scale;
  out->warn = it->c->warn;
  if (st == BL_SUCCESS)
    st = it->status;
  if (st == BL_SUCCESS && !isfinite(out->val))
    st = BL_ENONFINITE;
  return st;
}


int bl_dw_dk_e (const bl_case *c, double k, bl_quad *q, bl_result *out) {
  dwint it;
  gsl_function f;
  double val = 0.0, err = 0.0, scale;
  int st;
  if (out == NULL)
    return BL_EDOMAIN;
  clear(out);
  st = start(&it, c, k, q);
  if (st != BL_SUCCESS) {
    done(&it);
    return st;
  }
  f.function = f_sigma0;
  f.params = &it;
  st = gsl_integration_qag(&f, 0.0, log1p(2.0 / it.d.kn.hc0), 0.0, it.rtol,
                           LIMIT, GSL_INTEG_GAUSS21, it.w[0], &val, &err);
  scale = c->norm * it.d.kn.p / (it.d.kn.p0 * it.d.kn.k) / BL_PI
          / c->particle.mass;
  st = finish(&it, st, val, err, scale, out);
  done(&it);
  return st;
}


/* d2sigma/(dk dOmega_k) = (norm/(2 pi^2)) (p/(p0 k)) int dh Phi(h0, h):
** the outer integrand of dsigma/dk at h0 = 1 - cos(theta_k), without its
** Jacobian. */
int bl_dw_angular_e (const bl_case *c, double k, double theta_k, bl_quad *q,
                     bl_result *out) {
  dwint it;
  double h0, sg0, val, scale;
  int st;
  if (out == NULL)
    return BL_EDOMAIN;
  clear(out);
  if (!(theta_k >= 0.0 && theta_k <= BL_PI))
    return BL_EDOMAIN;
  st = start(&it, c, k, q);
  if (st != BL_SUCCESS) {
    done(&it);
    return st;
  }
  h0 = 2.0 * sin(0.5 * theta_k) * sin(0.5 * theta_k);
  sg0 = log1p(h0 / it.d.kn.hc0);
  val = f_sigma0(sg0, &it) / (h0 + it.d.kn.hc0);
  scale = c->norm * it.d.kn.p / (it.d.kn.p0 * it.d.kn.k)
          / (2.0 * BL_PI * BL_PI) / c->particle.mass;
  st = finish(&it, BL_SUCCESS, val, 0.0, scale, out);
  done(&it);
  return st;
}
