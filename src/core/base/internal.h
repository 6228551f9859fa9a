/*
** base/internal.h -- layout of the integration workspace and the adaptive
** Gauss-Kronrod rule of the Born integrals (core only)
** See Copyright Notice in LICENSE
*/
#ifndef BL_BASE_INTERNAL_H
#define BL_BASE_INTERNAL_H

#include <signal.h>
#include <stddef.h>

#include "brakelight/bl_quad.h"

#define BL_QUAD_LEVELS 3   /* photon angle, particle angle, azimuth */

/* One panel [a, b] of bl_gk_adapt: its 21-point Kronrod value, the error
** estimate of that value, and the error its integrand values carry (the
** integrand's own err, summed with the rule's weights). */
typedef struct bl_gkpanel {
  double a, b, val, err, ierr;
  double d, A;   /* |K21 - G10| and int |f| over the panel */
  double acc;    /* the error the adaptation compares: err once checked */
  int raw;       /* 1: err is d itself (the model failed above) */
  int checked;   /* 1: made by a bisection whose check passed */
  int noisy;     /* successive bisections that did not halve d */
  int lev;       /* nested rules (quad.c, gkseq): the rule of val */
  double d1;     /* nested rules: d of the panel's first rule pair */
  double *fx;    /* nested rules: the panel's values, then their errors
                 ** (2 BL_GK_STORE places; set by bl_quad_alloc, NULL
                 ** elsewhere, where only the fixed rules may be used) */
} bl_gkpanel;

/* Integrand values one panel of the nested rules keeps (87 points). */
#define BL_GK_STORE 87

struct bl_quad {
  bl_gkpanel *pan[BL_QUAD_LEVELS];   /* `limit` panels per level */
  double *store[BL_QUAD_LEVELS];     /* their fx: 2 BL_GK_STORE each */
  size_t limit;
  double rtol;
  unsigned long calls;     /* innermost integrand evaluations */
  const volatile sig_atomic_t *stop;   /* stop flag, or NULL */
};

/* An integrand that reports the error of its value (a nested integral), or
** leaves *err at 0. */
typedef double (*bl_gkfun) (double x, void *par, double *err);

/* The same integrand at n nodes at once (n <= BL_GK_NODES, the nodes of
** one panel): f[i] and err[i] at x[i], the values bl_gkfun would give one
** by one, so that independent nodes overlap (bl_gk_adapt_v). */
#define BL_GK_NODES 24
typedef void (*bl_gkvfun) (const double *x, int n, void *par, double *f,
                           double *err);

/*
** int_a^b f by Gauss-Kronrod panels (npt = 7: 3/7 points, 11: 5/11,
** 15: 7/15, else 10/21; or nested rules, extended on a panel before it is
** bisected: npt = -15, -31, -63: 3 -> 7 -> 15 (-> 31 -> 63), -21, -43,
** -87: 10 -> 21 (-> 43 -> 87), Patterson 1968; only with the panels of
** bl_quad_alloc, whose fx is set), bisecting the panel with
** the largest error until the total error (rule plus integrand errors)
** is at most max(epsabs, epsrel |val|).  Panels come from w (limit of
** them).  Returns BL_SUCCESS, GSL_EMAXITER (limit panels used) or
** GSL_EROUND (a panel too narrow to bisect); *val and *err are filled in
** every case.  The error model is explained in quad.c.
*/
int bl_gk_adapt (bl_gkfun f, void *par, double a, double b, double epsabs,
                 double epsrel, size_t limit, int npt, bl_gkpanel *w,
                 double *val, double *err);

/* bl_gk_adapt with a vector integrand: each panel's nodes in one call,
** the same panels, values and errors. */
int bl_gk_adapt_v (bl_gkvfun fv, void *par, double a, double b,
                   double epsabs, double epsrel, size_t limit, int npt,
                   bl_gkpanel *w, double *val, double *err);

/* One panel [a, b] of the npt-point rule (as bl_gk_adapt): p->val the
** Kronrod value, p->d = |K - G|, p->A = int |f|, p->err its error model.
** The one Gauss-Kronrod implementation of the core: the k integrals of
** target/integral.c take their panels from it too.  A nested sequence
** (npt < 0, see bl_gk_adapt) is run to its last rule, d against the rule
** before it; p->fx is then left NULL. */
void bl_gk_panel (bl_gkfun f, void *par, double a, double b, int npt,
                  bl_gkpanel *p);

/* The same, also stopping (GSL_EMAXITER) before a bisection once the call
** counter *calls has reached stop (calls NULL: no such bound): a work
** budget that holds whatever the integrand's own cost. */
int bl_gk_adapt_budget (bl_gkfun f, void *par, double a, double b,
                        double epsabs, double epsrel, size_t limit, int npt,
                        bl_gkpanel *w, const unsigned long *calls,
                        unsigned long stop, double *val, double *err);

#endif
