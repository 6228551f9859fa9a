/*
** integral.c -- integrals over the photon energy
** See Copyright Notice in LICENSE
**
** dsigma/dk behaves like 1/k at small k (times a logarithm without
** screening, like k^-1/2 under LPM suppression) and may fall to zero like
** sqrt(T - k) at the tip.  Each range is mapped so that the integrand is
** smooth for Gauss-Kronrod rules:
**   from k = 0 (moment 1 only): k = kmax sin^2(pi u / 2), u in (0, 1), so
**               k f(k) -> const (or a logarithm) is integrated exactly,
**               never cut, and a square-root edge at kmax = T becomes
**               linear in u; one piece, 15 points when the integrand is
**               smooth;
**   otherwise the range is cut at T/2: below, k = e^x; above,
**               T - k = s^2 (the tip edge becomes linear in s), leaving
**               out the last 1e-12 T below T, where dsigma/dk is finite.
** Evaluations are remembered by k, so two moments over one range share
** their points when the rules pick the same ones.
**
** The memo is an open-addressing table (linear probing, at most half
** full, so a probe always ends at an empty slot; the loop is bounded by
** the table size anyway).  It starts with MEMO_MIN slots in the caller's
** stack frame (12 KB: no allocation at all for the usual integral of a few
** hundred points) and doubles on the heap only when an integral needs
** more, up to MEMO_MAX slots (1.5 MB, for 16384 points: each one is a
** dsigma/dk, so the table never dominates the cost).  Chosen over
** caller-owned storage because it keeps the public calls as they are and
** costs nothing unless used.  When the table is at MEMO_MAX and half full,
** or a larger one cannot be allocated, a new point is computed without
** being remembered (a later request for it computes it again): the
** integral still ends, with the same values.  Every point an integral
** remembered before (the old fixed 8192-slot table) is remembered now,
** so the points, their order and the results are unchanged.
*/

#include <math.h>
#include <stdlib.h>
#include <string.h>

#include <gsl/gsl_errno.h>

#include "brakelight/bl_const.h"
#include "brakelight/bl_errno.h"
#include "brakelight/bl_integral.h"

#include "base/internal.h"
#include "target/kint.h"


#define LIMIT     200     /* subintervals per piece */
#define MEMO_MIN  256     /* slots of the first memo, on the stack */
#define MEMO_MAX  32768   /* most slots (powers of 2); half may be used */
#define TIP_GAP   1e-12   /* relative gap left below T */
#define TAIL_SHARE 0.25   /* second piece: absolute share of the first */
#define PT_SHARE  0.1     /* most of the points' budget one segment asks */
#define PT_CAP    1e-2    /* loosest tolerance a point is asked at */
#define PT_NPT    7       /* rule of a segment whose points are loosened */

enum { MAP_LOG, MAP_TIP, MAP_SINE };

typedef struct memo {
  double k, tol;      /* tol: the tolerance the point was asked at */
  bl_result r;
  int st, used;
} memo;

typedef struct kint {
  bl_kfunc f;
  bl_ktolfunc settol; /* the points' tolerance, or NULL (public calls) */
  void *ud;
  double base;        /* the points' usual tolerance (weighted: rtol/2) */
  double ptol, cur;   /* tolerance of the next points; the one set last */
  double pa, pb, pG;  /* the panel being computed, int of its prior shape */
  double ppv, pst;    /* its budget/value (0: no point loosened), its tol */
  int pn;             /* its points */
  double T, a;        /* the map: k = a sin^2(pi u/2) (MAP_SINE) */
  int map, moment;
  int hard;           /* first hard failure, or BL_SUCCESS */
  int soft;           /* a point short of its tolerance */
  unsigned warn, applied;
  int method;         /* method of the points, -1 when they differ, -2 none */
  double relerr;      /* worst relative error of a point */
  double relsys;      /* largest relative model uncertainty of a point */
  memo *memo;         /* cap slots, count used, at most cap/2 */
  size_t cap, count;
  memo *heap;         /* memo once grown onto the heap (freed by caller) */
  memo spare;         /* a point computed without memo (memo full) */
} kint;


static int softstatus (int st) {
  return st == GSL_EMAXITER || st == GSL_EROUND || st == GSL_ESING
      || st == GSL_ETOL || st == GSL_EDIVERGE || st == BL_ENOTCONV;
}


/* Add a usable point to the integral's warnings, methods and error. */
static void account (kint *ki, const memo *e) {
  if (e->st != BL_SUCCESS)
    ki->soft = 1;   /* a point that did not converge: flagged at the end */
  /* a point's own tolerance warning is not the integral's: its error is
  ** in relerr, and the integral decides from its total error */
  ki->warn |= e->r.warn & ~(unsigned)BL_WARN_TOLERANCE;
  ki->applied |= e->r.applied;
  if (ki->method == -2)
    ki->method = e->r.method;
  else if (ki->method != e->r.method)
    ki->method = -1;
  if (e->r.val != 0.0 && e->r.err / fabs(e->r.val) > ki->relerr)
    ki->relerr = e->r.err / fabs(e->r.val);
  if (e->r.val != 0.0 && e->r.sys / fabs(e->r.val) > ki->relsys)
    ki->relsys = e->r.sys / fabs(e->r.val);
}


/*
** The slot of k in memo m of cap slots: its entry, or the empty slot
** where it belongs; NULL only if the table has no empty slot (never
** while it is at most half full).
*/
static memo *slot (memo *m, size_t cap, double k) {
  unsigned long long bits;
  size_t i, n;
  memcpy(&bits, &k, sizeof bits);
  i = (size_t)((bits ^ (bits >> 29)) * 0x9E3779B97F4A7C15ull >> 40)
      & (cap - 1);
  for (n = 0; n < cap; n++, i = (i + 1) & (cap - 1)) {   /* linear probing */
    memo *e = &m[i];
    if (!e->used || e->k == k)
      return e;
  }
  return NULL;
}


/* Room for one more entry: doubles the memo when it is half full, up to
** MEMO_MAX slots.  0 when full and it cannot (or may not) grow. */
static int room (kint *ki) {
  memo *m;
  size_t cap = 2 * ki->cap, i;
  if (2 * (ki->count + 1) <= ki->cap)
    return 1;
  if (cap > MEMO_MAX || (m = calloc(cap, sizeof *m)) == NULL)
    return 0;
  for (i = 0; i < ki->cap; i++)   /* rehash: every entry finds a slot */
    if (ki->memo[i].used)
      *slot(m, cap, ki->memo[i].k) = ki->memo[i];
  free(ki->heap);
  ki->heap = ki->memo = m;
  ki->cap = cap;
  return 1;
}


/* f at k through the memo: NULL result pointer on a hard failure. */
static const bl_result *evaluate (kint *ki, double k) {
  memo *e = slot(ki->memo, ki->cap, k);
  int st, fresh = 0;
  if (e != NULL && e->used && e->tol <= ki->ptol) {
    /* remembered at this tolerance or a tighter one: counted again */
    if (e->st != BL_SUCCESS && !softstatus(e->st))
      return NULL;
    account(ki, e);
    return &e->r;
  }
  if (e == NULL || !e->used) {   /* new (else: asked tighter, in place) */
    e = room(ki) ? slot(ki->memo, ki->cap, k) : NULL;   /* may have moved */
    if (e == NULL)
      e = &ki->spare;   /* full: computed, not remembered */
    fresh = e != &ki->spare;
  }
  if (ki->settol != NULL && ki->ptol != ki->cur) {
    ki->settol(ki->ud, ki->ptol);
    ki->cur = ki->ptol;
  }
  st = ki->f(ki->ud, k, &e->r);
  if (st == BL_SUCCESS || softstatus(st))
    if (!isfinite(e->r.val) || !isfinite(e->r.err))
      st = GSL_ERANGE;   /* a non-finite point is a failure, never a 0 */
  e->k = k;
  e->st = st;
  e->tol = ki->ptol;
  if (fresh) {
    e->used = 1;
    ki->count++;
  }
  if (st != BL_SUCCESS && !softstatus(st)) {
    if (ki->hard == BL_SUCCESS)
      ki->hard = st;
    return NULL;
  }
  account(ki, e);
  return &e->r;
}


/* k at x of the current map. */
static double kofx (const kint *ki, double x) {
  double sn;
  switch (ki->map) {
    case MAP_LOG:
      return exp(x);
    case MAP_SINE:
      sn = sin(0.5 * BL_PI * x);
      return ki->a * sn * sn;
    default:
      return ki->T - x * x;
  }
}


/*
** The tolerance of the point x (k, dk/dx jac) of the panel being computed:
** its share of the panel from its weight, about (pi/n) sqrt(1 - xi^2) of
** the half-width for the n-point Kronrod rule (within 20 %), and the prior
** shape of a flat k dsigma/dk, so that each of the n points carries at
** most 1/n of the segment's PT_SHARE of the budget; never tighter than
** the segment's tolerance, never looser than PT_CAP.
*/
static double pointtol (const kint *ki, double x, double k, double jac) {
  double hw = 0.5 * (ki->pb - ki->pa), xi = (x - ki->pa) / hw - 1.0;
  double w = BL_PI / ki->pn * sqrt(fmax(0.0, 1.0 - xi * xi)) * fabs(hw);
  double share = w * fabs(jac) / (ki->moment ? 1.0 : k) / ki->pG;
  double t = share > 0.0 && isfinite(share)
             ? PT_SHARE * ki->ppv / (ki->pn * share) : PT_CAP;
  return fmin(PT_CAP, fmax(ki->pst, t));
}


/* The mapped integrand: k^moment f(k) dk/dx, and in *err the point's
** error mapped alike. */
static double integrand (double x, void *params, double *err) {
  kint *ki = params;
  const bl_result *r;
  double k, jac;
  *err = 0.0;
  if (ki->hard != BL_SUCCESS)
    return 0.0;
  switch (ki->map) {
    case MAP_LOG:
      k = exp(x);
      jac = k;
      break;
    case MAP_SINE: {
      double sn = sin(0.5 * BL_PI * x);
      k = ki->a * sn * sn;
      jac = 0.5 * BL_PI * ki->a * sin(BL_PI * x);
      break;
    }
    default:
      k = ki->T - x * x;
      jac = 2.0 * x;
      break;
  }
  if (!(k > 0.0) || !(k < ki->T))
    return 0.0;   /* only at a rounded end: measure zero */
  if (ki->ppv > 0.0)
    ki->ptol = pointtol(ki, x, k, jac);
  r = evaluate(ki, k);
  if (r == NULL)
    return 0.0;   /* a hard failure: the integral stops with it */
  *err = (ki->moment ? k : 1.0) * r->err * fabs(jac);
  return (ki->moment ? k : 1.0) * r->val * jac;
}


/* A segment: its panel's value, error |K - G| and the error its points
** carry (their errors summed with the rule's weights), the tolerance its
** points were asked at and the points of its rule. */
typedef struct seg {
  double a, b, val, err, perr, tol;
  double pv;   /* the budget over the value its tolerances were chosen by */
  int npt;
  int pw;      /* 1: points loosened by their weight (pointtol) */
} seg;


/*
** The Kronrod value of segment g (15 points, or 7 where its points are
** loosened; bl_gk_panel of base/quad.c, the one Gauss-Kronrod rule of the
** core) with |K - G| as its error: the error of the Gauss rule, so a
** generous bound for the Kronrod one on a smooth integrand (a sharper
** model would bisect integrands whose points carry their own small
** quadrature noise), and the points' errors summed with the weights.
** With a hook, the points are asked at g's tolerance or, g->pw, each by
** its own share (pointtol).
*/
static void panel (kint *ki, seg *g) {
  bl_gkpanel p;
  if (ki->settol != NULL) {
    double ka = kofx(ki, g->a), kb = kofx(ki, g->b);
    ki->ptol = ki->pst = g->tol;
    ki->pa = g->a;
    ki->pb = g->b;
    ki->pn = g->npt;
    ki->pG = fabs(ki->moment ? kb - ka : log(kb / ka));
    ki->ppv = g->pw && ki->pG > 0.0 && isfinite(ki->pG) ? g->pv : 0.0;
  }
  bl_gk_panel(integrand, ki, g->a, g->b, g->npt, &p);
  ki->ppv = 0.0;
  g->val = p.val;
  g->err = p.d;
  g->perr = p.ierr;
}


/*
** The tolerance for the points of a segment whose value is about 1/pv of
** the points' budget of its piece: the loosest at which they carry at
** most PT_SHARE of it, between the usual ki->base and PT_CAP.
*/
static double segtol (const kint *ki, double pv) {
  return fmin(PT_CAP, fmax(ki->base, PT_SHARE * pv));
}


/* The budget P over the value v (HUGE_VAL for v = 0). */
static double ratio (double P, double v) {
  return v != 0.0 ? P / fabs(v) : HUGE_VAL;
}


/*
** The share of [a, b] in the piece [x0, x1] before anything is known: that
** of a flat k dsigma/dk (Bethe-Heitler's varies by 4/3 over the spectrum),
** the share of k (moment 1) or of ln k (moment 0).  Only the first
** tolerance of an initial segment rests on it: its measured value decides
** after (piece).
*/
static double prior (const kint *ki, double a, double b, double x0,
                     double x1) {
  double ka = kofx(ki, a), kb = kofx(ki, b), k0 = kofx(ki, x0);
  double k1 = kofx(ki, x1), s;
  if (ki->moment)
    s = (kb - ka) / (k1 - k0);
  else
    s = log(kb / ka) / log(k1 / k0);
  return isfinite(s) ? fabs(s) : 1.0;
}


/* A segment's rule: PT_NPT points when its points are loosened, else 15. */
static int segnpt (const kint *ki, double tol) {
  return tol > ki->base ? PT_NPT : 15;
}


/*
** Adaptive integral over [x0, x1] cut first at the interior points bx[]
** (increasing), bisecting the segment of largest error until the total
** error is at most max(epsabs, rtol |total|).  GSL_SUCCESS, or
** GSL_EMAXITER when LIMIT segments do not suffice (best estimate kept).
** With a tolerance hook (ki->settol) the points' errors are summed with
** the rules' weights over the segments (*perr) and must meet the same
** bound.  Each initial segment's points are first asked by its prior share
** (segtol, pointtol), a half by half its parent's value; a segment whose
** measured value allows less than half the budget/value ratio it was asked
** by is computed again by its measured one; while the points' sum is over
** its bound the segment that carries the most of it is asked at its
** segment tolerance for every point, then ten times tighter, down to
** ki->base (none left: run() judges the total).
*/
static int piece (kint *ki, int map, double x0, double x1, const double *bx,
                  int nb, double epsabs, double rtol, seg *sg, double *val,
                  double *err, double *perr) {
  int n = 0, i, hook = ki->settol != NULL;
  double lo = x0;
  ki->map = map;
  *val = *err = *perr = 0.0;
  if (!(x1 > x0))
    return GSL_SUCCESS;
  for (i = 0; i <= nb; i++) {   /* initial segments at the breakpoints */
    double hi = i < nb ? bx[i] : x1;
    if (hi > lo && hi <= x1) {
      sg[n].a = lo;
      sg[n].b = hi;
      n++;
      lo = hi;
    }
  }
  for (i = 0; i < n; i++) {
    sg[i].pv = !hook || n == 1 ? rtol
             : ratio(rtol, prior(ki, sg[i].a, sg[i].b, x0, x1));
    sg[i].tol = !hook ? 0.0 : segtol(ki, sg[i].pv);
    sg[i].npt = !hook ? 15 : segnpt(ki, sg[i].tol);
    sg[i].pw = hook;
    panel(ki, &sg[i]);
  }
  for (;;) {
    int worst = 0, redo = -1;
    double v = 0.0, e = 0.0, pe = 0.0, tol;
    for (i = 0; i < n; i++) {
      v += sg[i].val;
      e += sg[i].err;
      pe += sg[i].perr;
      if (sg[i].err > sg[worst].err)
        worst = i;
    }
    *val = v;
    *err = e;
    *perr = pe;
    tol = fmax(epsabs, rtol * fabs(v));
    if (ki->hard != BL_SUCCESS)
      return GSL_SUCCESS;
    if (hook)   /* a segment asked looser than its value allows */
      for (i = 0; i < n && redo < 0; i++)
        if (sg[i].pv > 2.0 * ratio(tol, sg[i].val)
            && (sg[i].pw || sg[i].tol > segtol(ki, ratio(tol, sg[i].val))))
          redo = i;
    if (redo >= 0) {
      sg[redo].pv = ratio(tol, sg[redo].val);
      sg[redo].tol = fmin(sg[redo].tol, segtol(ki, sg[redo].pv));
    }
    else if (e <= tol) {
      if (!hook || pe <= tol)
        return GSL_SUCCESS;
      for (i = 0; i < n; i++)   /* the points over their bound */
        if ((sg[i].pw || sg[i].tol > ki->base)
            && (redo < 0 || sg[i].perr > sg[redo].perr))
          redo = i;
      if (redo < 0)
        return GSL_SUCCESS;   /* at ki->base already: run() judges */
      if (sg[redo].pw)
        sg[redo].pw = 0;      /* first: each point at the segment's */
      else
        sg[redo].tol = fmax(ki->base, 0.1 * sg[redo].tol);
    }
    if (redo >= 0) {
      panel(ki, &sg[redo]);
      continue;
    }
    if (n == LIMIT
        || sg[worst].b - sg[worst].a <= 1e-13 * fabs(x1 - x0))
      return GSL_EMAXITER;
    sg[n].a = 0.5 * (sg[worst].a + sg[worst].b);
    sg[n].b = sg[worst].b;
    sg[worst].b = sg[n].a;
    if (hook) {   /* each half: about half the parent's value */
      sg[worst].pv = ratio(tol, 0.5 * sg[worst].val);
      sg[worst].tol = segtol(ki, sg[worst].pv);
      sg[worst].npt = segnpt(ki, sg[worst].tol);
    }
    sg[n].pv = sg[worst].pv;
    sg[n].tol = sg[worst].tol;
    sg[n].npt = sg[worst].npt;
    sg[n].pw = sg[worst].pw;
    panel(ki, &sg[worst]);
    panel(ki, &sg[n++]);
  }
}


/* The breakpoints of (kmin, kmax) mapped by x = map(k), increasing. */
static int mapbreaks (const kint *ki, int map, const double *kb, int nkb,
                      double kmin, double kmax, double *bx) {
  int i, j, n = 0;
  for (i = 0; i < nkb; i++) {
    double k = kb[i], x;
    if (!(k > kmin && k < kmax))
      continue;
    x = map == MAP_SINE ? asin(sqrt(k / ki->a)) / (0.5 * BL_PI)
      : map == MAP_LOG ? log(k) : sqrt(ki->T - k);
    for (j = n; j > 0 && bx[j - 1] > x; j--)   /* insertion sort */
      bx[j] = bx[j - 1];
    bx[j] = x;
    n++;
  }
  return n;
}


static int run (kint *ki, double kmin, double kmax, double rtol,
                const double *kb, int nkb, seg *sg, bl_result *out) {
  double half = 0.5 * ki->T, v1 = 0.0, e1 = 0.0, v2 = 0.0, e2 = 0.0;
  double p1 = 0.0, p2 = 0.0;
  double bx[BL_KINT_MAXBREAK];
  int st1 = GSL_SUCCESS, st2 = GSL_SUCCESS, nb;
  if (kmin == 0.0) {   /* one piece: both ends mapped at once */
    ki->a = kmax;
    nb = mapbreaks(ki, MAP_SINE, kb, nkb, kmin, kmax, bx);
    st1 = piece(ki, MAP_SINE, 0.0, 1.0, bx, nb, 0.0, 0.5 * rtol, sg, &v1,
                &e1, &p1);
  }
  else if (kmin < half) {   /* the lower piece */
    double top = fmin(kmax, half);
    nb = mapbreaks(ki, MAP_LOG, kb, nkb, kmin, top, bx);
    st1 = piece(ki, MAP_LOG, log(kmin), log(top), bx, nb, 0.0, 0.5 * rtol,
                sg, &v1, &e1, &p1);
  }
  if (kmin > 0.0 && kmax > half && ki->hard == BL_SUCCESS) {   /* upper */
    double lo = fmax(kmin, half), gap = TIP_GAP * ki->T;
    double s0 = sqrt(fmax(ki->T - kmax, gap)), s1 = sqrt(ki->T - lo);
    double rev[BL_KINT_MAXBREAK];
    int i;
    nb = mapbreaks(ki, MAP_TIP, kb, nkb, lo, kmax, rev);
    for (i = 0; i < nb; i++)   /* s falls as k rises: reverse */
      bx[i] = rev[i];
    st2 = piece(ki, MAP_TIP, s0, s1, bx, nb, TAIL_SHARE * rtol * fabs(v1),
                0.5 * rtol, sg, &v2, &e2, &p2);
  }
  out->val = v1 + v2;
  /* the points' errors: summed with the rules' weights (hook), else the
  ** worst relative error of a point times the value */
  out->err = e1 + e2 + (ki->settol != NULL ? p1 + p2
                                           : ki->relerr * fabs(out->val));
  /* a bound: no point is more uncertain than the most uncertain one */
  out->sys = ki->relsys * fabs(out->val);
  out->warn = ki->warn;
  out->applied = ki->applied;
  out->method = ki->method;
  if (ki->hard != BL_SUCCESS)
    return ki->hard;
  if (st1 != GSL_SUCCESS || st2 != GSL_SUCCESS || ki->soft
      || !isfinite(out->val) || out->err > rtol * fabs(out->val)) {
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


static void kint_init (kint *ki, bl_kfunc f, bl_ktolfunc settol, void *ud,
                       double T, double rtol, memo *m, size_t cap) {
  memset(ki, 0, sizeof *ki);
  ki->f = f;
  ki->settol = settol;
  ki->ud = ud;
  ki->base = settol != NULL ? 0.5 * rtol : 0.0;
  ki->ptol = ki->base;
  ki->cur = -1.0;   /* none set yet */
  ki->T = T;
  ki->hard = BL_SUCCESS;
  ki->method = -2;
  ki->memo = m;
  ki->cap = cap;
}


/*
** The moment m0 of f into out0 and, when out1 is not NULL, moment 1 into
** out1 on the remembered points.  The quadrature aims at rtol/2: the
** points' own errors (asked at rtol/2 by the callers) take the rest.
*/
static int integrate (bl_kfunc f, bl_ktolfunc settol, void *ud, double kmin,
                      double kmax, double T, double rtol, const double *kb,
                      int nkb, int m0, bl_result *out0, bl_result *out1) {
  seg *sg;
  memo m[MEMO_MIN];   /* the first memo; grows on the heap if needed */
  kint ki;
  int st0, st1 = BL_SUCCESS;
  if (out0 == NULL)
    return BL_EDOMAIN;
  memset(out0, 0, sizeof *out0);
  if (out1 != NULL)
    memset(out1, 0, sizeof *out1);
  if (checkargs(f, kmin, kmax, T, rtol) != BL_SUCCESS
      || (kmin == 0.0 && (m0 == 0 || out1 != NULL))
      || nkb < 0 || nkb > BL_KINT_MAXBREAK || (nkb > 0 && kb == NULL))
    return BL_EDOMAIN;   /* also: int f dk from 0 diverges like ln k */
  sg = malloc(LIMIT * sizeof *sg);
  if (sg == NULL)
    return BL_ENOMEM;
  memset(m, 0, sizeof m);
  kint_init(&ki, f, settol, ud, T, rtol, m, MEMO_MIN);
  ki.moment = m0;
  st0 = run(&ki, kmin, kmax, rtol, kb, nkb, sg, out0);
  if (out1 != NULL && ki.hard == BL_SUCCESS) {
    ki.moment = 1;
    ki.relerr = 0.0;
    ki.relsys = 0.0;
    ki.soft = 0;
    st1 = run(&ki, kmin, kmax, rtol, kb, nkb, sg, out1);
  }
  free(sg);
  free(ki.heap);
  if (st0 != BL_SUCCESS && st0 != BL_ENOTCONV)
    return st0;
  return st0 != BL_SUCCESS ? st0 : st1;
}


int bl_kintegral2_e (bl_kfunc f, void *ud, double kmin, double kmax, double T,
                     const double *kbreak, int nbreak, double rtol,
                     bl_result *out0, bl_result *out1) {
  return integrate(f, NULL, ud, kmin, kmax, T, rtol, kbreak, nbreak, 0, out0,
                   out1);
}


int bl_kintegral_e (bl_kfunc f, void *ud, double kmin, double kmax, double T,
                    const double *kbreak, int nbreak, int moment, double rtol,
                    bl_result *out) {
  if (moment != 0 && moment != 1) {
    if (out != NULL)
      memset(out, 0, sizeof *out);
    return BL_EDOMAIN;
  }
  return integrate(f, NULL, ud, kmin, kmax, T, rtol, kbreak, nbreak, moment,
                   out, NULL);
}


int bl_kintegral_tol_e (bl_kfunc f, bl_ktolfunc settol, void *ud, double kmin,
                        double kmax, double T, const double *kbreak,
                        int nbreak, int moment, double rtol, bl_result *out0,
                        bl_result *out1) {
  if (settol == NULL || (moment != 0 && moment != 1)
      || (out1 != NULL && moment != 0)) {
    if (out0 != NULL)
      memset(out0, 0, sizeof *out0);
    if (out1 != NULL)
      memset(out1, 0, sizeof *out1);
    return BL_EDOMAIN;
  }
  return integrate(f, settol, ud, kmin, kmax, T, rtol, kbreak, nbreak, moment,
                   out0, out1);
}
