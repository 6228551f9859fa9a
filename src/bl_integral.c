/*
** bl_integral.c -- integrals over the photon energy
** See Copyright Notice in LICENSE
**
** dsigma/dk behaves like 1/k at small k (times a logarithm without
** screening, like k^-1/2 under LPM suppression) and may fall to zero like
** sqrt(T - k) at the tip.  The range is cut at T/2 and each part mapped
** so that the integrand is smooth for Gauss-Kronrod rules:
**   below T/2:  k = e^x (kmin > 0), or k = a w^2 from k = 0, where
**               k f(k) -> const (or a logarithm) is integrated exactly;
**   above T/2:  T - k = s^2 (the tip edge becomes linear in s); the last
**               1e-12 T below T, where dsigma/dk is finite, is left out.
** Evaluations are remembered by k, so two moments over one range share
** their points when the rules pick the same ones.
*/

#include <math.h>
#include <stdlib.h>
#include <string.h>

#include <gsl/gsl_errno.h>
#include <gsl/gsl_integration.h>

#include "bl_errno.h"
#include "bl_integral.h"


#define LIMIT     200     /* subintervals per piece */
#define MEMO_SIZE 8192    /* remembered evaluations (power of 2) */
#define TIP_GAP   1e-12   /* relative gap left below T */
#define TAIL_SHARE 0.5    /* second piece: absolute share of the first */

enum { MAP_SQUARE, MAP_LOG, MAP_TIP };

typedef struct memo {
  double k;
  bl_result r;
  int st, used;
} memo;

typedef struct kint {
  bl_kfunc f;
  void *ud;
  double T, a;        /* the map: k = a w^2 (MAP_SQUARE) */
  int map, moment;
  int hard;           /* first hard failure, or BL_SUCCESS */
  int soft;           /* a point short of its tolerance */
  unsigned warn, applied;
  int method;         /* method of the points, -1 when they differ, -2 none */
  double relerr;      /* worst relative error of a point */
  memo *memo;
} kint;


static int softstatus (int st) {
  return st == GSL_EMAXITER || st == GSL_EROUND || st == GSL_ESING
      || st == GSL_ETOL || st == GSL_EDIVERGE || st == BL_ENOTCONV;
}


/* f at k through the memo: NULL result pointer on a hard failure. */
static const bl_result *evaluate (kint *ki, double k) {
  unsigned long long bits;
  size_t i;
  memo *e;
  int st;
  memcpy(&bits, &k, sizeof bits);
  i = (size_t)((bits ^ (bits >> 29)) * 0x9E3779B97F4A7C15ull >> 40)
      & (MEMO_SIZE - 1);
  for (;; i = (i + 1) & (MEMO_SIZE - 1)) {   /* linear probing */
    e = &ki->memo[i];
    if (!e->used || e->k == k)
      break;
  }
  if (e->used)
    return e->st == BL_SUCCESS || softstatus(e->st) ? &e->r : NULL;
  st = ki->f(ki->ud, k, &e->r);
  e->k = k;
  e->st = st;
  e->used = 1;
  if (st != BL_SUCCESS && !softstatus(st)) {
    if (ki->hard == BL_SUCCESS)
      ki->hard = st;
    return NULL;
  }
  if (st != BL_SUCCESS || !isfinite(e->r.val) || !isfinite(e->r.err)) {
    ki->soft = 1;
    e->r.warn |= BL_WARN_TOLERANCE;
  }
  ki->warn |= e->r.warn;
  ki->applied |= e->r.applied;
  if (ki->method == -2)
    ki->method = e->r.method;
  else if (ki->method != e->r.method)
    ki->method = -1;
  if (e->r.val != 0.0 && e->r.err / fabs(e->r.val) > ki->relerr)
    ki->relerr = e->r.err / fabs(e->r.val);
  return &e->r;
}


/* The mapped integrand: k^moment f(k) dk/dx. */
static double integrand (double x, void *params) {
  kint *ki = params;
  const bl_result *r;
  double k, jac;
  if (ki->hard != BL_SUCCESS)
    return 0.0;
  switch (ki->map) {
    case MAP_SQUARE:
      k = ki->a * x * x;
      jac = 2.0 * ki->a * x;
      break;
    case MAP_LOG:
      k = exp(x);
      jac = k;
      break;
    default:
      k = ki->T - x * x;
      jac = 2.0 * x;
      break;
  }
  if (!(k > 0.0) || !(k < ki->T))
    return 0.0;   /* only at a rounded end: measure zero */
  r = evaluate(ki, k);
  if (r == NULL || !isfinite(r->val))
    return 0.0;
  return (ki->moment ? k : 1.0) * r->val * jac;
}


/* One piece in variable x from x0 to x1 with map `map`. */
static int piece (kint *ki, gsl_integration_workspace *ws, int map,
                  double x0, double x1, double epsabs, double rtol,
                  double *val, double *err) {
  gsl_function fn;
  int st;
  ki->map = map;
  fn.function = integrand;
  fn.params = ki;
  *val = *err = 0.0;
  if (!(x1 > x0))
    return GSL_SUCCESS;
  st = gsl_integration_qag(&fn, x0, x1, epsabs, rtol, LIMIT,
                           GSL_INTEG_GAUSS21, ws, val, err);
  return st;
}


static int run (kint *ki, double kmin, double kmax, double rtol,
                gsl_integration_workspace *ws, bl_result *out) {
  double half = 0.5 * ki->T, v1 = 0.0, e1 = 0.0, v2 = 0.0, e2 = 0.0;
  int st1 = GSL_SUCCESS, st2 = GSL_SUCCESS;
  if (kmin < half) {   /* the lower piece */
    double top = fmin(kmax, half);
    if (kmin == 0.0) {
      ki->a = top;
      st1 = piece(ki, ws, MAP_SQUARE, 0.0, 1.0, 0.0, rtol, &v1, &e1);
    }
    else
      st1 = piece(ki, ws, MAP_LOG, log(kmin), log(top), 0.0, rtol, &v1, &e1);
  }
  if (kmax > half && ki->hard == BL_SUCCESS) {   /* the upper piece */
    double lo = fmax(kmin, half), gap = TIP_GAP * ki->T;
    double s0 = sqrt(fmax(ki->T - kmax, gap)), s1 = sqrt(ki->T - lo);
    st2 = piece(ki, ws, MAP_TIP, s0, s1, TAIL_SHARE * rtol * fabs(v1), rtol,
                &v2, &e2);
  }
  out->val = v1 + v2;
  out->err = e1 + e2 + ki->relerr * fabs(out->val);
  out->warn = ki->warn;
  out->applied = ki->applied;
  out->method = ki->method;
  if (ki->hard != BL_SUCCESS)
    return ki->hard;
  if (st1 != GSL_SUCCESS || st2 != GSL_SUCCESS || ki->soft
      || !isfinite(out->val)) {
    out->warn |= BL_WARN_TOLERANCE;
    return BL_ENOTCONV;
  }
  return BL_SUCCESS;
}


static int checkargs (bl_kfunc f, double kmin, double kmax, double T,
                      double rtol) {
  if (f == NULL || !isfinite(T) || !(T > 0.0) || !(kmin >= 0.0)
      || !(kmax > kmin) || !(kmax <= T) || !(rtol >= 1e-12 && rtol <= 0.5))
    return BL_EDOMAIN;
  return BL_SUCCESS;
}


static void kint_init (kint *ki, bl_kfunc f, void *ud, double T,
                       memo *m) {
  memset(ki, 0, sizeof *ki);
  ki->f = f;
  ki->ud = ud;
  ki->T = T;
  ki->hard = BL_SUCCESS;
  ki->method = -2;
  ki->memo = m;
}


/*
** The moment m0 of f into out0 and, when out1 is not NULL, moment 1 into
** out1 on the remembered points.
*/
static int integrate (bl_kfunc f, void *ud, double kmin, double kmax,
                      double T, double rtol, int m0, bl_result *out0,
                      bl_result *out1) {
  gsl_integration_workspace *ws;
  memo *m;
  kint ki;
  int st0, st1 = BL_SUCCESS;
  memset(out0, 0, sizeof *out0);
  if (out1 != NULL)
    memset(out1, 0, sizeof *out1);
  if (checkargs(f, kmin, kmax, T, rtol) != BL_SUCCESS
      || (kmin == 0.0 && (m0 == 0 || out1 != NULL)))
    return BL_EDOMAIN;   /* int f dk from 0 diverges like ln k */
  ws = gsl_integration_workspace_alloc(LIMIT);
  m = calloc(MEMO_SIZE, sizeof *m);
  if (ws == NULL || m == NULL) {
    gsl_integration_workspace_free(ws);
    free(m);
    return BL_ENOMEM;
  }
  kint_init(&ki, f, ud, T, m);
  ki.moment = m0;
  st0 = run(&ki, kmin, kmax, rtol, ws, out0);
  if (out1 != NULL && ki.hard == BL_SUCCESS) {
    ki.moment = 1;
    ki.relerr = 0.0;
    ki.soft = 0;
    st1 = run(&ki, kmin, kmax, rtol, ws, out1);
  }
  gsl_integration_workspace_free(ws);
  free(m);
  if (st0 != BL_SUCCESS && st0 != BL_ENOTCONV)
    return st0;
  return st0 != BL_SUCCESS ? st0 : st1;
}


int bl_kintegral2_e (bl_kfunc f, void *ud, double kmin, double kmax, double T,
                     double rtol, bl_result *out0, bl_result *out1) {
  return integrate(f, ud, kmin, kmax, T, rtol, 0, out0, out1);
}


int bl_kintegral_e (bl_kfunc f, void *ud, double kmin, double kmax, double T,
                    int moment, double rtol, bl_result *out) {
  if (moment != 0 && moment != 1) {
    memset(out, 0, sizeof *out);
    return BL_EDOMAIN;
  }
  return integrate(f, ud, kmin, kmax, T, rtol, moment, out, NULL);
}
