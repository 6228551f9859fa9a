/*
** quad.c -- integration workspace and the adaptive Gauss-Kronrod rule of
** the Born integrals
** See Copyright Notice in LICENSE
*/

#include <float.h>
#include <math.h>
#include <pthread.h>
#include <stdlib.h>

#include <gsl/gsl_errno.h>

#include "brakelight/bl_errno.h"
#include "base/internal.h"


/*
** GSL's default error handler prints and aborts; the core reads status
** codes only.  The first bl_quad_alloc of the process switches the
** handler off when, and only when, GSL's default is in place: a handler
** of the application's own is put back untouched.  luaopen_brakelight and
** the runner switch it off themselves; this covers a program that links
** libbrakelight.a and does not (tests/test_base.c, suite gsl_errors).
*/
static pthread_once_t gsl_once = PTHREAD_ONCE_INIT;

static void gsl_quiet (void) {
  gsl_error_handler_t *prev = gsl_set_error_handler_off();
  if (prev != NULL)   /* NULL: the default, which aborts */
    gsl_set_error_handler(prev);
}


bl_quad *bl_quad_alloc (size_t limit) {
  bl_quad *q;
  int i;
  pthread_once(&gsl_once, gsl_quiet);
  if (limit < 8)
    return NULL;
  q = calloc(1, sizeof *q);
  if (q == NULL)
    return NULL;
  for (i = 0; i < BL_QUAD_LEVELS; i++) {
    q->pan[i] = malloc(limit * sizeof *q->pan[i]);
    if (q->pan[i] == NULL) {
      bl_quad_free(q);
      return NULL;
    }
  }
  q->limit = limit;
  q->rtol = BL_QUAD_RTOL_DEFAULT;
  return q;
}


void bl_quad_free (bl_quad *q) {
  int i;
  if (q == NULL)
    return;
  for (i = 0; i < BL_QUAD_LEVELS; i++)
    free(q->pan[i]);
  free(q);
}


int bl_quad_set_rtol (bl_quad *q, double rtol) {
  if (q == NULL || !(rtol >= BL_QUAD_RTOL_MIN && rtol <= BL_QUAD_RTOL_MAX))
    return BL_EDOMAIN;
  q->rtol = rtol;
  return BL_SUCCESS;
}


double bl_quad_rtol (const bl_quad *q) {
  return q != NULL ? q->rtol : 0.0;
}


unsigned long bl_quad_calls (const bl_quad *q) {
  return q != NULL ? q->calls : 0;
}


void bl_quad_reset_calls (bl_quad *q) {
  if (q != NULL)
    q->calls = 0;
}


/*
** The 21-point Gauss-Kronrod rule and its embedded 10-point Gauss rule
** (Kronrod 1965; the abscissae and weights of QUADPACK's qk21, Piessens et
** al. 1983).  xgk[1], xgk[3], ... xgk[9] are the Gauss nodes.
*/
static const double xgk[11] = {
  0.995657163025808080735527280689003, 0.973906528517171720077964012084452,
  0.930157491355708226001207180059508, 0.865063366688984510732096688423493,
  0.780817726586416897063717578345042, 0.679409568299024406234327365114874,
  0.562757134668604683339000099272694, 0.433395394129247190799265943165784,
  0.294392862701460198131126603103866, 0.148874338981631210884826001129720,
  0.0
};
static const double wg[5] = {
  0.066671344308688137593568809893332, 0.149451349150580593145776339657697,
  0.219086362515982043995534934228163, 0.269266719309996355091226921569469,
  0.295524224714752870173892994651338
};
static const double wgk[11] = {
  0.011694638867371874278064396062192, 0.032558162307964727478818972459390,
  0.054755896574351996031381300244580, 0.075039674810919952767043140916190,
  0.093125454583697605535065465083366, 0.109387158802297641899210590325805,
  0.123491976262065851077600525478581, 0.134709217311473325928054001771707,
  0.142775938577060080797094273138717, 0.147739104901338491374841515972068,
  0.149445554002916905664936468389821
};


/*
** Error model of one panel.  d = |K21 - G10| measures the error of the
** Gauss value, not of the Kronrod value returned: for an integrand
** analytic near the panel the two errors go like rho^-20 and rho^-32
** (degrees 19 and 31), and over test integrands with poles, branch points
** and exponentials the Kronrod error is A (d/A)^g with g between 1.5 and
** 2.5 (A = int |f|).  The panel reports err = A (d/A)^1.5 (the cautious
** end; never less than GK_FLOOR A, the rounding of the sum).  This model
** holds only where the integrand is smooth on the scale of the panel; a
** kink or a peak narrower than the panel leaves the Kronrod value no
** better than the Gauss one, true error ~ d.  So the model decides only
** for a panel it has been checked on: a panel made by bisection compares
** its parent's value with the sum of the two halves (the parent's true
** error, to the halves' accuracy); within GK_CHECK times the parent's
** model the halves are `checked` and their model errors count, else they
** are `raw` and d itself counts, for them and all panels below them.  A
** panel never bisected (the first of a range) is accepted only when d
** meets the tolerance.  QUADPACK's form, A' min(1, (200 d/A')^1.5) with
** A' = int |f - mean|, exceeds d itself for d/A' > 1e-7: the 10^6
** pessimism of the old integrator (issue 14).
*/
#define GK_POWER 1.5
#define GK_FLOOR (50.0 * DBL_EPSILON)
#define GK_CHECK 10.0
/* A panel whose d did not halve over GK_NOISY successive bisections is
** rounding noise of the integrand (cancelling poles: a uniform nucleus
** without electrons): it keeps its error but is bisected no further, and
** the integral ends with GSL_EROUND if the tolerance is then not met. */
#define GK_NOISY 8

/* x^GK_POWER; at 1.5 as x sqrt(x) (libm's pow was 6-8 % of a screened
** point-nucleus point; the estimate moves by rounding). */
static double gk_pow (double x) {
  return GK_POWER == 1.5 ? x * sqrt(x) : pow(x, GK_POWER);
}

static void gkerr (bl_gkpanel *p) {
  if (p->raw || !(p->A > 0.0) || p->d >= p->A)
    p->err = p->d;
  else
    p->err = p->A * gk_pow(p->d / p->A);
  if (p->err < GK_FLOOR * p->A)
    p->err = GK_FLOOR * p->A;
  /* what the adaptation compares with the tolerance */
  p->acc = p->checked || p->raw ? p->err : fmax(p->err, p->d);
  if (p->noisy >= GK_NOISY)
    p->acc = 0.0;   /* rounding noise: bisecting it further is futile */
}


/* The 15-point rule and its 7-point Gauss rule (QUADPACK's qk15):
** xgk15[1], [3], [5] and the centre are the Gauss nodes. */
static const double xgk15[8] = {
  0.991455371120812639206854697526329, 0.949107912342758524526189684047851,
  0.864864423359769072789712788640926, 0.741531185599394439863864773280788,
  0.586087235467691130294144845693013, 0.405845151377397166906606412076961,
  0.207784955007898467600689403773245, 0.0
};
static const double wg7[4] = {
  0.129484966168869693270611432679082, 0.279705391489276667901467771423780,
  0.381830050505118944950369775488975, 0.417959183673469387755102040816327
};
static const double wgk15[8] = {
  0.022935322010529224963732008058970, 0.063092092629978553290700663189204,
  0.104790010322250183839876322541518, 0.140653259715525918745189590510238,
  0.169004726639267902826583426598550, 0.190350578064785409913256402421014,
  0.204432940075298892414161999234649, 0.209482141084727828012999174891714
};

/* The 7-point Kronrod extension of the 3-point Gauss rule (Kronrod 1965;
** checked when written: exact for x^k up to k = 11, not for 12):
** xgk7[1] and the centre are the Gauss nodes. */
static const double xgk7[4] = {
  0.960491268708020283423507092516930, 0.774596669241483377035853079956480,
  0.434243749346802558002071502868439, 0.0
};
static const double wg3[2] = {
  0.555555555555555555555555555555556, 0.888888888888888888888888888888889
};
static const double wgk7[4] = {
  0.104656226026467265193823857117106, 0.268488089868333440728569223901040,
  0.401397414775962222905051818618433, 0.450916538658474142345110087045571
};

/* The 11-point Kronrod extension of the 5-point Gauss rule (Kronrod
** 1965; computed for this file with 50-digit arithmetic from the
** Stieltjes polynomial E6 orthogonal to P5 x^k, k = 0..5, and checked:
** exact for x^k up to k = 17, not for 18): xgk11[1], [3] and the centre
** are the Gauss nodes. */
static const double xgk11[6] = {
  0.984085360094842464496172934636139, 0.906179845938663992797626878299393,
  0.754166726570849220440817166946116, 0.538469310105683091036314420700209,
  0.279630413161783193413466522748977, 0.0
};
static const double wg5[3] = {
  0.236926885056189087514264040719917, 0.478628670499366468041291514835638,
  0.568888888888888888888888888888889
};
static const double wgk11[6] = {
  0.0425820367510818328645094508476701, 0.115233316622473394024626845880574,
  0.186800796556492657467800026878486, 0.241040339228647586699942611223262,
  0.272849801912558922340993264484456, 0.282987417857491213204255601371106
};

typedef struct gkrule {
  int n;                 /* node pairs; the centre is node n */
  const double *x, *wk, *wg;
  int gcentre;           /* 1: the centre is a Gauss node (odd Gauss rule) */
} gkrule;

static const gkrule rule7 = {3, xgk7, wgk7, wg3, 1};
static const gkrule rule11 = {5, xgk11, wgk11, wg5, 1};
static const gkrule rule15 = {7, xgk15, wgk15, wg7, 1};
static const gkrule rule21 = {10, xgk, wgk, wg, 0};


/* An integrand of n nodes at once (bl_gk_adapt_v) behind the scalar
** signature: gk recognizes gk_one and hands it the whole panel. */
typedef struct gkvec {
  bl_gkvfun fv;
  void *par;
} gkvec;

static double gk_one (double x, void *par, double *err) {
  const gkvec *v = par;
  double f;
  v->fv(&x, 1, v->par, &f, err);
  return f;
}


/* One panel [a, b]: value, d, A, ierr and the errors (gkerr).  The nodes
** are evaluated first, in the order c, c - dx_j, c + dx_j (one call of a
** vector integrand, or one call per node), then summed. */
static void gk (const gkrule *r, bl_gkfun f, void *par, double a, double b,
                int raw, int checked, bl_gkpanel *p) {
  double c = 0.5 * (a + b), hl = 0.5 * (b - a);
  double x[BL_GK_NODES], fx[BL_GK_NODES], ex[BL_GK_NODES];
  double resk, resabs, resg, ie;
  int j, m = 2 * r->n + 1;
  x[0] = c;
  for (j = 0; j < r->n; j++) {
    double dx = hl * r->x[j];
    x[2 * j + 1] = c - dx;
    x[2 * j + 2] = c + dx;
  }
  if (f == gk_one) {
    const gkvec *v = par;
    v->fv(x, m, v->par, fx, ex);
  }
  else
    for (j = 0; j < m; j++)
      fx[j] = f(x[j], par, &ex[j]);
  resk = fx[0] * r->wk[r->n];
  resabs = fabs(fx[0]) * r->wk[r->n];
  resg = r->gcentre ? fx[0] * r->wg[r->n / 2] : 0.0;
  ie = fabs(ex[0]) * r->wk[r->n];
  for (j = 0; j < r->n; j++) {
    double f1 = fx[2 * j + 1], f2 = fx[2 * j + 2];
    double e1 = ex[2 * j + 1], e2 = ex[2 * j + 2];
    resk += r->wk[j] * (f1 + f2);
    resabs += r->wk[j] * (fabs(f1) + fabs(f2));
    ie += r->wk[j] * (fabs(e1) + fabs(e2));
    if (j & 1)
      resg += r->wg[j / 2] * (f1 + f2);
  }
  p->a = a;
  p->b = b;
  p->val = resk * hl;
  p->d = fabs((resk - resg) * hl);
  p->A = fabs(hl) * resabs;
  p->ierr = fabs(hl) * ie;
  p->raw = raw;
  p->checked = checked;
  p->noisy = 0;
  gkerr(p);
}


/* The rule of npt points (7, 11, 15, else 21). */
static const gkrule *rule_of (int npt) {
  return npt == 7 ? &rule7 : npt == 11 ? &rule11 : npt == 15 ? &rule15
         : &rule21;
}


void bl_gk_panel (bl_gkfun f, void *par, double a, double b, int npt,
                  bl_gkpanel *p) {
  gk(rule_of(npt), f, par, a, b, 0, 0, p);
}


int bl_gk_adapt (bl_gkfun f, void *par, double a, double b, double epsabs,
                 double epsrel, size_t limit, int npt, bl_gkpanel *w,
                 double *val, double *err) {
  return bl_gk_adapt_budget(f, par, a, b, epsabs, epsrel, limit, npt, w,
                            NULL, 0, val, err);
}


int bl_gk_adapt_v (bl_gkvfun fv, void *par, double a, double b,
                   double epsabs, double epsrel, size_t limit, int npt,
                   bl_gkpanel *w, double *val, double *err) {
  gkvec v;
  v.fv = fv;
  v.par = par;
  return bl_gk_adapt_budget(gk_one, &v, a, b, epsabs, epsrel, limit, npt, w,
                            NULL, 0, val, err);
}


int bl_gk_adapt_budget (bl_gkfun f, void *par, double a, double b,
                        double epsabs, double epsrel, size_t limit, int npt,
                        bl_gkpanel *w, const unsigned long *calls,
                        unsigned long stop, double *val, double *err) {
  const gkrule *r = rule_of(npt);
  double V, E, IE;
  size_t n = 1, i;
  int st = 0;   /* BL_SUCCESS */
  gk(r, f, par, a, b, 0, 0, &w[0]);
  V = w[0].val;
  E = w[0].acc;
  IE = w[0].ierr;
  for (;;) {
    double tol = fmax(epsabs, epsrel * fabs(V)), rt, m, a1, b1, c1;
    bl_gkpanel *p, parent;
    size_t k = 0;
    /* bisection cannot lower the integrand's own error: the rule gets
    ** what that leaves, and at least half the tolerance */
    rt = tol - IE > 0.5 * tol ? tol - IE : 0.5 * tol;
    if (E <= rt || !isfinite(V) || !isfinite(E))
      break;
    if (n >= limit || (calls != NULL && *calls >= stop)) {
      st = GSL_EMAXITER;
      break;
    }
    for (i = 1, m = w[0].acc; i < n; i++)
      if (w[i].acc > m) {
        m = w[i].acc;
        k = i;
      }
    p = &w[k];
    a1 = p->a;
    b1 = p->b;
    c1 = 0.5 * (a1 + b1);
    if (!(fabs(b1 - a1) > 4.0 * DBL_EPSILON * fmax(fabs(a1), fabs(b1)))) {
      st = GSL_EROUND;
      break;
    }
    parent = *p;
    V -= p->val;
    E -= p->acc;
    IE -= p->ierr;
    gk(r, f, par, a1, c1, parent.raw, 1, p);
    gk(r, f, par, c1, b1, parent.raw, 1, &w[n]);
    if (!parent.raw && fabs(parent.val - (p->val + w[n].val))
                       > GK_CHECK * parent.err)
      p->raw = w[n].raw = 1;   /* the model failed: d counts below it */
    if (p->d + w[n].d > 0.5 * parent.d)
      p->noisy = w[n].noisy = parent.noisy + 1;
    gkerr(p);
    gkerr(&w[n]);
    V += p->val + w[n].val;
    E += p->acc + w[n].acc;
    IE += p->ierr + w[n].ierr;
    n++;
  }
  /* the sums again, without the drift of the updates; the reported error
  ** is the model's (or d where the model failed) */
  V = E = IE = 0.0;
  for (i = 0; i < n; i++) {
    V += w[i].val;
    E += w[i].err;
    IE += w[i].ierr;
  }
  if (st == 0 && E + IE > fmax(epsabs, epsrel * fabs(V)))
    st = GSL_EROUND;   /* only noisy panels are left above the tolerance */
  *val = V;
  *err = E + IE;
  return st;
}


void bl_quad_set_stop (bl_quad *q, const volatile sig_atomic_t *flag) {
  if (q != NULL)
    q->stop = flag;
}


int bl_quad_stopped (const bl_quad *q) {
  return q != NULL && q->stop != NULL && *q->stop != 0;
}
