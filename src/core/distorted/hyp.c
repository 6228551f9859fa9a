/*
** hyp.c -- V(x) = 2F1(i eta0, i eta; 1; x) for real x < 1, the Gauss
** function of the Sommerfeld-Maue matrix element (Elwert & Haug 1969)
** See Copyright Notice in LICENSE
**
** For |x| <= x1 the hypergeometric series; x1 is small enough that the
** terms fall from the first one on, so no digit cancels however large
** eta0, eta.  Elsewhere V solves, in u = ln(1 - x),
**
**   x V_uu = (1 - x) a b V + (1 - (a + b) x) V_u,   a = i eta0, b = i eta
**
** (the hypergeometric equation x(1-x)V'' + (1 - (a+b+1)x)V' - ab V = 0
** rewritten with d/du = -(1 - x) d/dx).  Both directions away from x = 0
** are stable: for u -> +infinity (x -> -infinity) the two solutions are
** the pure phases (1 - x)^(-a), (1 - x)^(-b); for u -> -infinity
** (x -> 1) one is constant and the other, (1 - x)^(1-a-b), decays.  The
** equation is integrated once per photon energy (GSL's rk8pd with a
** relative tolerance of 1e-12) through the nodes of a table, and read by
** quintic Hermite interpolation in tau (see internal.h), whose error at
** the node spacing DTAU is about DTAU^6/46080 relative: 3e-10.
*/

#include <math.h>
#include <stdlib.h>

#include <gsl/gsl_errno.h>
#include <gsl/gsl_odeiv2.h>

#include "distorted/internal.h"


#define DTAU      0.15      /* node spacing in tau */
#define X1_MAX    0.25      /* largest |x| of the series region */
#define NODE_MAX  4000000   /* refuse tables larger than this (64 MB) */
#define ODE_RTOL  1e-12


/* The series and its derivative at |x| <= x1, both times exp(-scale). */
static void series (const bl_dwhyp *h, double x, double complex *V,
                    double complex *Vx) {
  double complex a = h->a, b = h->b;
  double complex t = exp(-h->scale), s = a * b * t;
  double complex sv = t, sd = s;
  int n;
  for (n = 0; n < 200; n++) {
    t *= (a + n) * (b + n) / ((n + 1.0) * (n + 1.0)) * x;
    s *= (a + 1.0 + n) * (b + 1.0 + n) / ((n + 1.0) * (n + 2.0)) * x;
    sv += t;
    sd += s;
    if (cabs(t) <= 1e-17 * cabs(sv) && cabs(s) <= 1e-17 * cabs(sd))
      break;
  }
  *V = sv;
  *Vx = sd;
}


/* tau(u) and its inverse, with du/dtau and d2u/dtau2. */
static double tau_of (const bl_dwhyp *h, double u) {
  double r = 2.0 * sqrt(h->ab * fabs(u));
  return h->w * u + (u < 0.0 ? -r : r);
}


static double u_of (const bl_dwhyp *h, double tau, double *du, double *d2u) {
  double at = fabs(tau), sab = sqrt(h->ab);
  double s = at / (sab + sqrt(h->ab + h->w * at));   /* sqrt(|u|) */
  double u = tau < 0.0 ? -s * s : s * s;
  double g = h->w + (s > 0.0 ? sab / s : 0.0);        /* dtau/du */
  double g1 = s > 0.0 ? -0.5 * sab / (s * s * s) : 0.0;
  if (u < 0.0)
    g1 = -g1;
  *du = 1.0 / g;
  *d2u = -g1 / (g * g * g);
  return u;
}


/* The equation in u for y = (Re V, Im V, Re V_u, Im V_u). */
static int rhs (double u, const double y[], double dy[], void *params) {
  const bl_dwhyp *h = params;
  double x = -expm1(u), omx = exp(u);
  double complex F = y[0] + I * y[1], Fu = y[2] + I * y[3];
  double complex Fuu = (omx * h->a * h->b * F
                        + (1.0 - (h->a + h->b) * x) * Fu) / x;
  dy[0] = y[2];
  dy[1] = y[3];
  dy[2] = creal(Fuu);
  dy[3] = cimag(Fuu);
  return GSL_SUCCESS;
}


static double complex vuu (const bl_dwhyp *h, double u, double complex F,
                           double complex Fu) {
  double x = -expm1(u), omx = exp(u);
  return (omx * h->a * h->b * F + (1.0 - (h->a + h->b) * x) * Fu) / x;
}


/*
** The quintic Hermite polynomial of each interval from the values, first
** and second tau-derivatives at its nodes (6 per node in f, the last 3
** free), in place: interval j's coefficients c0 ... c5 in t = (tau -
** tau_j) / dt replace node j, which no later interval reads.
*/
static void coefficients (double complex *f, long n, double dt) {
  long j;
  for (j = 0; j + 1 < n; j++) {
    double complex *f0 = f + 6 * j, *f1 = f0 + 6;
    double complex d0 = f0[1] * dt, d1 = f1[1] * dt;
    double complex s0 = f0[2] * dt * dt, s1 = f1[2] * dt * dt;
    double complex D = f1[0] - f0[0];
    f0[1] = d0;
    f0[2] = 0.5 * s0;
    f0[3] = 10.0 * D - 6.0 * d0 - 4.0 * d1 - 0.5 * (3.0 * s0 - s1);
    f0[4] = -15.0 * D + 8.0 * d0 + 7.0 * d1 + 0.5 * (3.0 * s0 - 2.0 * s1);
    f0[5] = 6.0 * D - 3.0 * (d0 + d1) - 0.5 * (s0 - s1);
  }
}


/* Fill one side: from the series edge x = xb (u = ub) out to uend. */
static int side (bl_dwhyp *h, bl_dwside *sd, double xb, double uend) {
  double ub = log1p(-xb), dir = uend < ub ? -1.0 : 1.0;
  double tend = tau_of(h, uend), du, d2u, u, span;
  double complex V, Vx, Vu, Vuu;
  double y[4];
  gsl_odeiv2_system sys;
  gsl_odeiv2_driver *drv;
  long n, j;
  int st = BL_SUCCESS;
  sd->n = 0;
  sd->f = NULL;
  sd->tau0 = tau_of(h, ub);
  span = fabs(tend - sd->tau0) / h->dtau;
  if (!(span < NODE_MAX))   /* also a span that is not finite */
    return BL_EDOMAIN;
  n = (long)ceil(span) + 2;
  sd->f = malloc(6 * (size_t)n * sizeof *sd->f);
  if (sd->f == NULL)
    return BL_ENOMEM;
  series(h, xb, &V, &Vx);
  Vu = -exp(ub) * Vx;
  y[0] = creal(V); y[1] = cimag(V); y[2] = creal(Vu); y[3] = cimag(Vu);
  sys.function = rhs;
  sys.jacobian = NULL;
  sys.dimension = 4;
  sys.params = h;
  drv = gsl_odeiv2_driver_alloc_standard_new(&sys, gsl_odeiv2_step_rk8pd,
            dir * 1e-3 * fabs(ub), 1e-14 * exp(-h->scale), ODE_RTOL, 1.0, 0.0);
  if (drv == NULL) {
    free(sd->f);
    sd->f = NULL;
    return BL_ENOMEM;
  }
  u = ub;
  for (j = 0; j < n; j++) {
    double t = sd->tau0 + dir * (double)j * h->dtau, uj;
    uj = j == 0 ? ub : u_of(h, t, &du, &d2u);
    if (j > 0 && gsl_odeiv2_driver_apply(drv, &u, uj, y) != GSL_SUCCESS) {
      st = BL_ENOTCONV;
      break;
    }
    u_of(h, t, &du, &d2u);
    V = y[0] + I * y[1];
    Vu = y[2] + I * y[3];
    Vuu = vuu(h, uj, V, Vu);
    sd->f[6 * j] = V;
    sd->f[6 * j + 1] = Vu * du;
    sd->f[6 * j + 2] = Vuu * du * du + Vu * d2u;
    if (!isfinite(creal(V)) || !isfinite(cimag(V))) {
      st = BL_ENONFINITE;
      break;
    }
  }
  gsl_odeiv2_driver_free(drv);
  if (st == BL_SUCCESS)
    coefficients(sd->f, n, dir * h->dtau);
  if (st != BL_SUCCESS) {
    free(sd->f);
    sd->f = NULL;
    return st;
  }
  sd->n = (int)n;
  return BL_SUCCESS;
}


int bl_dwhyp_init (bl_dwhyp *h, double eta0, double eta, double umin,
                   double umax) {
  int st;
  if (h == NULL)
    return BL_EDOMAIN;
  h->neg.n = h->pos.n = 0;
  h->neg.f = h->pos.f = NULL;
  if (!isfinite(eta0) || !isfinite(eta) || !(umin <= umax))
    return BL_EDOMAIN;
  h->a = I * eta0;
  h->b = I * eta;
  h->scale = BL_PI * fabs(eta0);
  h->ab = fabs(eta0 * eta);
  h->sab = sqrt(h->ab);
  h->w = fabs(eta0) + fabs(eta) + 1.0;
  h->x1 = X1_MAX / (1.0 + h->ab + fabs(eta0) + fabs(eta));
  if (h->x1 > X1_MAX)
    h->x1 = X1_MAX;
  h->dtau = DTAU;
  if (umin < log1p(-h->x1)) {
    st = side(h, &h->neg, h->x1, umin);
    if (st != BL_SUCCESS)
      return st;
  }
  if (umax > log1p(h->x1)) {
    st = side(h, &h->pos, -h->x1, umax);
    if (st != BL_SUCCESS) {
      bl_dwhyp_free(h);
      return st;
    }
  }
  return BL_SUCCESS;
}


void bl_dwhyp_free (bl_dwhyp *h) {
  if (h == NULL)
    return;
  free(h->neg.f);
  free(h->pos.f);
  h->neg.f = h->pos.f = NULL;
  h->neg.n = h->pos.n = 0;
}


int bl_dwhyp_eval (const bl_dwhyp *h, double x, double u, double complex *V,
                   double complex *Vx) {
  const bl_dwside *sd;
  const double complex *c;
  double tau, r, t, dt, sq, g, omx;
  double complex P, dP;
  long j;
  if (fabs(x) <= h->x1) {
    series(h, x, V, Vx);
    return 0;
  }
  sd = u < 0.0 ? &h->neg : &h->pos;
  /* tau_of and dtau/du (u_of) with one square root: sqrt(|u|) > 0 here */
  sq = sqrt(fabs(u));
  tau = h->w * u + (u < 0.0 ? -2.0 : 2.0) * h->sab * sq;
  g = h->w + h->sab / sq;
  r = fabs(tau - sd->tau0) / h->dtau;
  j = (long)r;
  if (sd->f == NULL || j < 0 || j + 1 >= sd->n)
    return -1;
  t = r - (double)j;
  dt = (u < 0.0 ? -1.0 : 1.0) * h->dtau;   /* tau step from node j to j+1 */
  c = sd->f + 6 * j;
  P = c[0] + t * (c[1] + t * (c[2] + t * (c[3] + t * (c[4] + t * c[5]))));
  dP = c[1] + t * (2.0 * c[2] + t * (3.0 * c[3] + t * (4.0 * c[4]
                                                     + t * 5.0 * c[5])));
  /* 1 - x: exact from x where x < 1/2, else from u (x -> 1) */
  omx = x < 0.5 ? 1.0 - x : exp(u);
  *V = P;
  /* dV/dx = -(dV/du) / (1 - x), dV/du = (dP/dt / dt) dtau/du */
  *Vx = -(dP / dt) * g / omx;
  return 0;
}
