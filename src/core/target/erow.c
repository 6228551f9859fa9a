/*
** erow.c -- the exact bound electron term of a projectile outside the
** other-projectile table on a row of photon energies, once per integral
** See Copyright Notice in LICENSE
**
** Where the table of other projectiles is held (c->ebexact: mass above
** BL_EBH_M_MAX or T/m below BL_EBH_TAU_MIN), bl_method_dk_e adds Z times
** bl_ebrems_dk_e, a four-level integral, at every photon energy, and an
** integral over k took 12-240 s (DEVELOPERS.md, "Other projectiles").
** Here the integral over k computes that term once at nodes in x =
** ln(u / (1 - u)), u = k / k_max, and interpolates ln of it there
** (four-point Lagrange on the nodes around k).  Nodes: evenly spaced by
** about H0 over the part of (kmin, kmax) inside (BL_EROW_UMIN,
** BL_EROW_UMAX) k_max, then refined: the midpoint of each interval is
** computed and compared with the interpolation without it (less what the
** nodes' own error estimates explain); the intervals with the largest
** such errors weighted by their share of the electron part of the
** integral are split again (their midpoints tested in the next pass)
** until the sum, over EST_RATIO (the error left once the midpoint is a
** node), is at most tol; then the nodes whose own errors weigh most are
** computed again at BL_EROW_POLISH_RTOL while those add up to more than
** tol.  est is that sum over EST_RATIO.  Outside the row the per-point
** path stays.  Measurements: DEVELOPERS.md, "Other projectiles".
*/

#include <math.h>
#include <string.h>

#include "brakelight.h"
#include "target/erow.h"

#define BL_EROW_UMIN 1e-6        /* lowest node, u = k / k_max */
#define BL_EROW_UMAX (1.0 - 1e-4)  /* highest node */
#define BL_EROW_NODE_RTOL 1e-3   /* tolerance of each node */
#define BL_EROW_POLISH_RTOL 3e-4 /* of a node computed again */
#define H0 2.0                   /* first spacing in x */
/* The interpolation error measured at a midpoint before it is a node over
** the error that remains with it: 16 for a smooth function (four-point
** Lagrange, h^4); measured 4.7-12 (DEVELOPERS.md, "Other projectiles") */
#define EST_RATIO 4.0


static double logit (double u) {
  return log(u) - log1p(-u);
}


static double ulogit (double x) {
  return x >= 0.0 ? 1.0 / (1.0 + exp(-x)) : exp(x) / (1.0 + exp(x));
}


/* ln of the electron part at x into *y, its relative error into *rel
** (warnings into w->warn): status, or 1 where it is not positive. */
static int node (const bl_case *c, const bl_ebrems *e, bl_erow *w, double x,
                 bl_quad *q, double *y, double *rel) {
  bl_result r;
  int st;
  if (bl_quad_stopped(q))
    return BL_EINTR;
  st = bl_ebrems_dk_e(e, ulogit(x) * w->ekmax, q, &r);
  if (st != BL_SUCCESS && !bl_status_soft(st))
    return st;
  if (st != BL_SUCCESS)
    w->warn |= BL_WARN_TOLERANCE;
  if (!(r.val > 0.0) || !isfinite(r.val))
    return 1;
  *y = log(c->Z * r.val);
  *rel = r.err / r.val;
  return BL_SUCCESS;
}


/* The interval [xs[i], xs[i + 1]] of the n >= 2 increasing nodes that
** holds x (the first or last one outside). */
static int interval (const double *xs, int n, double x) {
  int i = 0;
  while (i < n - 2 && x > xs[i + 1])
    i++;
  return i;
}


/* Four-point Lagrange of y on the n >= 4 increasing nodes xs at x. */
static double lagrange (const double *xs, const double *ys, int n, double x) {
  double v = 0.0;
  int i = interval(xs, n, x), s, a, b;
  s = i - 1 < 0 ? 0 : i - 1 > n - 4 ? n - 4 : i - 1;
  for (a = 0; a < 4; a++) {
    double l = 1.0;
    for (b = 0; b < 4; b++)
      if (b != a)
        l *= (x - xs[s + b]) / (xs[s + a] - xs[s + b]);
    v += l * ys[s + a];
  }
  return v;
}


/* The integrand of moment m in x: E k^m dk/dx, E = exp(y). */
static double gofx (const bl_erow *w, double x, double y, int m) {
  double u = ulogit(x), k = u * w->ekmax;
  return exp(y) * (m ? k : 1.0) * w->ekmax * u * (1.0 - u);
}


int bl_erow_build (const bl_case *c, double kmin, double kmax, int moment,
                   double tol, bl_quad *q, bl_erow *w) {
  bl_ebrems e;
  double xs[BL_EROW_MAX], ys[BL_EROW_MAX], rs[BL_EROW_MAX], er[BL_EROW_MAX];
  double rq, ulo, uhi, xlo, xhi;
  int n, i, st = BL_SUCCESS, done[BL_EROW_MAX];
  memset(w, 0, sizeof *w);
  if (c == NULL || q == NULL || !(c->ebexact && c->ekmax > 0.0
                                  && c->opts.electrons))
    return BL_SUCCESS;
  w->ekmax = c->ekmax;
  ulo = fmax(kmin / c->ekmax, BL_EROW_UMIN);
  uhi = fmin(kmax / c->ekmax, BL_EROW_UMAX);
  if (!(ulo < uhi) || bl_method_eterm(c, &e) != BL_SUCCESS)
    return BL_SUCCESS;
  xlo = logit(ulo);
  xhi = logit(uhi);
  n = (int)ceil((xhi - xlo) / H0) + 1;
  if (n < 4)
    n = 4;
  rq = bl_quad_rtol(q);
  if (bl_quad_set_rtol(q, BL_EROW_NODE_RTOL) != BL_SUCCESS)
    return BL_EDOMAIN;
  for (i = 0; i < n && st == BL_SUCCESS; i++) {
    xs[i] = i == n - 1 ? xhi : xlo + (xhi - xlo) * i / (n - 1);
    st = node(c, &e, w, xs[i], q, &ys[i], &rs[i]);
    er[i] = -1.0;   /* not measured yet */
  }
  while (st == BL_SUCCESS && n < BL_EROW_MAX) {
    /* one pass: every interval not measured yet, else the largest
    ** weighted errors until the rest would meet tol */
    double nx[BL_EROW_MAX], ne[BL_EROW_MAX], nr[BL_EROW_MAX], nl[BL_EROW_MAX];
    double wt[BL_EROW_MAX], sum = 0.0, est = 0.0, got = 0.0;
    int pick[BL_EROW_MAX], m = 0, first = 0, j;
    for (i = 0; i < n - 1; i++) {
      wt[i] = 0.5 * (xs[i + 1] - xs[i])
              * (gofx(w, xs[i], ys[i], moment)
                 + gofx(w, xs[i + 1], ys[i + 1], moment));
      sum += wt[i];
      first |= er[i] < 0.0;
      est += fmax(er[i], 0.0) * wt[i];
      pick[i] = 0;
    }
    if (first)
      for (i = 0; i < n - 1; i++)
        m += pick[i] = er[i] < 0.0;
    else {
      if (!(sum > 0.0) || est <= EST_RATIO * tol * sum)
        break;
      while (got < est - 0.5 * EST_RATIO * tol * sum
             && n + m < BL_EROW_MAX) {
        int b = -1;
        for (i = 0; i < n - 1; i++)
          if (!pick[i] && (b < 0 || er[i] * wt[i] > er[b] * wt[b]))
            b = i;
        if (b < 0)
          break;
        pick[b] = 1;
        got += er[b] * wt[b];
        m++;
      }
    }
    for (i = 0, j = 0; i < n && st == BL_SUCCESS; i++) {
      nx[j] = xs[i];
      ne[j] = ys[i];
      nl[j] = rs[i];
      nr[j] = i < n - 1 ? er[i] : 0.0;
      j++;
      if (i < n - 1 && pick[i] && j < BL_EROW_MAX) {
        double xm = 0.5 * (xs[i] + xs[i + 1]), ym = 0.0, rm = 0.0, d;
        st = node(c, &e, w, xm, q, &ym, &rm);
        if (st != BL_SUCCESS)
          break;
        /* the interpolation without the midpoint, there, less what the
        ** nodes' own errors may explain (those are the points'): both
        ** halves */
        d = fabs(expm1(lagrange(xs, ys, n, xm) - ym))
            - rm - fmax(rs[i], rs[i + 1]);
        nr[j - 1] = nr[j] = fmax(d, 0.0);
        nx[j] = xm;
        nl[j] = rm;
        ne[j++] = ym;
      }
    }
    if (st != BL_SUCCESS || m == 0)
      break;
    n = j;
    memcpy(xs, nx, n * sizeof xs[0]);
    memcpy(ys, ne, n * sizeof ys[0]);
    memcpy(er, nr, n * sizeof er[0]);
    memcpy(rs, nl, n * sizeof rs[0]);
  }
  /* the nodes whose own errors weigh most, again at BL_EROW_POLISH_RTOL,
  ** while those errors weighted add up to more than tol */
  memset(done, 0, sizeof done);
  while (st == BL_SUCCESS && n >= 2) {
    double sh[BL_EROW_MAX], sum = 0.0, tot = 0.0;
    int b = -1;
    for (i = 0; i < n; i++) {
      sh[i] = 0.5 * ((i > 0 ? xs[i] - xs[i - 1] : 0.0)
                     + (i < n - 1 ? xs[i + 1] - xs[i] : 0.0))
              * gofx(w, xs[i], ys[i], moment);
      sum += sh[i];
    }
    for (i = 0; i < n; i++) {
      tot += rs[i] * sh[i];
      if (!done[i] && rs[i] > BL_EROW_POLISH_RTOL
          && (b < 0 || rs[i] * sh[i] > rs[b] * sh[b]))
        b = i;
    }
    if (b < 0 || !(tot > tol * sum))
      break;
    if (bl_quad_set_rtol(q, BL_EROW_POLISH_RTOL) != BL_SUCCESS)
      break;
    {
      double y0 = ys[b], r0 = rs[b];
      st = node(c, &e, w, xs[b], q, &ys[b], &rs[b]);
      done[b] = 1;
      if (st == BL_SUCCESS && rs[b] > r0) {   /* not better: the first */
        ys[b] = y0;
        rs[b] = r0;
      }
    }
  }
  bl_quad_set_rtol(q, rq);
  if (st == 1) {   /* a node not positive: no row, the per-point path */
    memset(w, 0, sizeof *w);
    return BL_SUCCESS;
  }
  if (st != BL_SUCCESS)
    return st;
  for (moment = 0; moment < 2; moment++) {
    /* the estimate: the intervals' last measured errors, weighted */
    double s = 0.0, se = 0.0;
    for (i = 0; i < n - 1; i++) {
      double wt = 0.5 * (xs[i + 1] - xs[i])
                  * (gofx(w, xs[i], ys[i], moment)
                     + gofx(w, xs[i + 1], ys[i + 1], moment));
      s += wt;
      se += (er[i] < 0.0 ? 1.0 : er[i]) * wt;   /* never measured: 100 % */
    }
    w->part[moment] = s;
    w->est[moment] = s > 0.0 ? se / s / EST_RATIO : 0.0;
  }
  w->n = n;
  memcpy(w->x, xs, n * sizeof xs[0]);
  memcpy(w->y, ys, n * sizeof ys[0]);
  memcpy(w->r, rs, n * sizeof rs[0]);
  return BL_SUCCESS;
}


int bl_erow_eval (const bl_erow *w, double k, double *val, double *err) {
  double u, x;
  int i;
  *val = *err = 0.0;
  if (w == NULL || w->n < 4 || !(k > 0.0 && k < w->ekmax))
    return 0;
  u = k / w->ekmax;
  x = logit(u);
  if (!(x >= w->x[0] && x <= w->x[w->n - 1]))
    return 0;
  *val = exp(lagrange(w->x, w->y, w->n, x));
  i = interval(w->x, w->n, x);
  *err = fmax(w->r[i], w->r[i + 1]) * *val;   /* the nodes' own errors */
  return 1;
}
