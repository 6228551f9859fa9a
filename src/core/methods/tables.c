/*
** tables.c -- the screening integrals H1, H2 of the high-energy method,
** tabulated once per Yukawa representation, and their tails beyond q = m
** See Copyright Notice in LICENSE
**
** For E0 >> m the angular integrals of the Born cross section reduce to
** one-dimensional screening functions (Tsai 1974, Rev. Mod. Phys. 46, 815,
** section 3).  With Delta = k m^2 / (2 E0 E) the smallest momentum transfer
** (MeV), v = E/E0 and g(Q) the target factor per unit charge squared,
**
**   phi1 = 4 + 4 int_Delta^m (Q - Delta)^2/Q^3 g(Q) dQ,
**   phi2 = 10/3 + 4 int_Delta^m [Q^3 - 6 Delta^2 Q ln(Q/Delta)
**                                + 3 Delta^2 Q - 4 Delta^3]/Q^4 g(Q) dQ,
**   dsigma/dk = (z^4 Z^2 alpha r0^2 / k) [(1 + v^2) phi1 - (2/3) v phi2]
**
** for spin 1/2; spin 0 lacks the helicity-flip term, 1 + v^2 -> 2 v.  The
** nuclear part takes g = (1 - F/Z)^2, the atomic electrons g = S/Z with a
** weight 1/Z (Tsai's psi functions).
**
** Writing g = 1 - h, the g = 1 part is elementary and h falls off beyond
** the screening momenta, so what depends on the atom is
**
**   H1(Delta) = int_Delta^inf (Q - Delta)^2/Q^3 h(Q) dQ
**             = int_0^inf (1 - e^-t)^2 h(Delta e^t) dt,
**   H2(Delta) = int_0^inf [1 - 6 t e^-2t + 3 e^-2t - 4 e^-3t] h(Delta e^t) dt,
**
** functions of Delta alone, whatever the projectile.  They are tabulated
** once per Yukawa representation (element and model) on a grid in
** u = ln Delta, with their exact u-derivatives, and read by cubic Hermite
** interpolation; the table records the worst error it measured at the
** midpoints against direct integration.  The part of H beyond Q = m (a
** tail of a few 1e-3) is subtracted with four moments per case.
**
** The cache is a process-wide list guarded by a mutex.  An entry is
** immutable once published; each bl_he that points to it holds one
** reference (bl_hetab_get takes it, bl_hetab_release drops it), so a
** table is never freed while in use and readers need no lock.  Entries
** without references stay for reuse, at most BL_METHOD_CACHE_IDLE of them:
** beyond that the one released longest ago is freed (a scan over a model
** parameter makes a new key per value).  bl_hetab_clear frees every
** unreferenced entry.
*/

#include <math.h>
#include <pthread.h>
#include <stdlib.h>
#include <string.h>

#include "methods/internal.h"


#define STEP     0.125   /* grid step in u = ln Delta */
#define BELOW    14.0    /* grid from ln(b_min) - BELOW ... */
#define ABOVE    10.0    /* ... to ln(b_max) + ABOVE */
#define TPANEL   1.0     /* width of the Gauss-Legendre panels in t */
#define TREACH   12.0    /* integrate h up to Q = b_max e^TREACH */
#define TAIL_MEMO 8      /* masses whose tails a table keeps */


/* 8-point Gauss-Legendre nodes and weights on [-1, 1] (half of them). */
static const double gl_x[4] = {
  0.1834346424956498, 0.5255324099163290, 0.7966664774136267,
  0.9602898564975363
};
static const double gl_w[4] = {
  0.3626837833783620, 0.3137066478872225, 0.2223810344533745,
  0.1012285362903763
};


struct bl_hetab {
  int kind;
  bl_yukawa y;            /* the key: representation tabulated */
  int n;
  double u0;              /* u of node 0; nodes at u0 + i STEP */
  double *H1, *D1, *H2, *D2;   /* values and d/du at the nodes */
  double maxerr;          /* worst midpoint interpolation error */
  int refs;               /* bl_he holding it (under cache_lock) */
  unsigned long stamp;    /* when it last became unreferenced */
  /* the tails of the latest projectile masses (bl_hetab_tails), under
  ** cache_lock: a re-prepare of the same case reads them */
  int ntail, tailnext;
  double tailm[TAIL_MEMO], tail[TAIL_MEMO][2];
  struct bl_hetab *next;
};

static pthread_mutex_t cache_lock = PTHREAD_MUTEX_INITIALIZER;
static bl_hetab *cache_head = NULL;   /* newest first */
static size_t cache_idle = 0;         /* entries with refs == 0 */
static unsigned long cache_clock = 0; /* stamps of the idle entries */


/*
** h = 1 - g at momentum Q (MeV) and its derivative dh/dlnQ.  Elastic:
** f = F/Z = sum a_i/(1 + x_i), x_i = Q^2/b_i^2, h = f (2 - f).  Electrons:
** h = 1 - S/Z = sum a_i/(1 + x_i).  Both fall off like 1/Q^2.
*/
static void hfun (int kind, const bl_yukawa *y, double Q, double *h,
                  double *dh) {
  double f = 0.0, df = 0.0;
  int i;
  for (i = 0; i < y->n; i++) {
    double x = Q / y->b[i], w;
    x *= x;
    w = 1.0 / (1.0 + x);
    f += y->alpha[i] * w;
    df -= 2.0 * y->alpha[i] * x * w * w;
  }
  if (kind == BL_HETAB_ELASTIC) {
    *h = f * (2.0 - f);
    *dh = 2.0 * (1.0 - f) * df;
  }
  else {
    *h = f;
    *dh = df;
  }
}


/* The two kernels of H1 and H2 at t >= 0 (both vanish like t^2 at 0). */
static double kern1 (double t) {
  double e = -expm1(-t);
  return e * e;
}


static double kern2 (double t) {
  double e2 = exp(-2.0 * t);
  return 1.0 - 6.0 * t * e2 + 3.0 * e2 - 4.0 * e2 * exp(-t);
}


/*
** H1, H2 and their u-derivatives at Delta = e^u, by Gauss-Legendre panels
** in t up to where h is negligible (Q = b_max e^TREACH).
*/
static void integrals (int kind, const bl_yukawa *y, double u, double bmax,
                       double out[4]) {
  double tmax = log(bmax / exp(u)) + TREACH;
  int np, p, j, s;
  out[0] = out[1] = out[2] = out[3] = 0.0;
  if (tmax < TREACH)
    tmax = TREACH;   /* Delta beyond the screening: a short, small tail */
  np = (int)ceil(tmax / TPANEL);
  for (p = 0; p < np; p++) {
    double mid = (p + 0.5) * TPANEL, half = 0.5 * TPANEL;
    for (j = 0; j < 4; j++)
      for (s = -1; s <= 1; s += 2) {
        double t = mid + s * half * gl_x[j], w = half * gl_w[j];
        double h, dh, k1 = kern1(t), k2 = kern2(t);
        hfun(kind, y, exp(u + t), &h, &dh);
        out[0] += w * k1 * h;
        out[1] += w * k1 * dh;
        out[2] += w * k2 * h;
        out[3] += w * k2 * dh;
      }
  }
}


/* Cubic Hermite interpolation on [0, 1] of values f0, f1 and derivatives
** d0, d1 (per unit of the interval) at s. */
static double hermite (double f0, double d0, double f1, double d1, double s) {
  double s2 = s * s, s3 = s2 * s;
  return (2 * s3 - 3 * s2 + 1) * f0 + (s3 - 2 * s2 + s) * d0
         + (-2 * s3 + 3 * s2) * f1 + (s3 - s2) * d1;
}


/*
** H1 and H2 of table t at u = ln Delta.  Below the grid the functions are
** linear in u up to O(Delta/b) (complete screening, e^-BELOW ~ 1e-6);
** above it they fall off like Delta^-2.
*/
void bl_hetab_lookup (const bl_hetab *t, double u, double *H1, double *H2) {
  double x = (u - t->u0) / STEP;
  int i;
  if (x <= 0.0) {
    *H1 = t->H1[0] + t->D1[0] * (u - t->u0);
    *H2 = t->H2[0] + t->D2[0] * (u - t->u0);
    return;
  }
  if (x >= t->n - 1) {
    double f = exp(-2.0 * (u - t->u0 - (t->n - 1) * STEP));
    *H1 = t->H1[t->n - 1] * f;
    *H2 = t->H2[t->n - 1] * f;
    return;
  }
  i = (int)x;
  x -= i;
  *H1 = hermite(t->H1[i], t->D1[i] * STEP, t->H1[i + 1], t->D1[i + 1] * STEP,
                x);
  *H2 = hermite(t->H2[i], t->D2[i] * STEP, t->H2[i + 1], t->D2[i + 1] * STEP,
                x);
}


static void yrange (const bl_yukawa *y, double *bmin, double *bmax) {
  int i;
  *bmin = HUGE_VAL;
  *bmax = 0.0;
  for (i = 0; i < y->n; i++) {
    if (y->b[i] < *bmin)
      *bmin = y->b[i];
    if (y->b[i] > *bmax)
      *bmax = y->b[i];
  }
}


/* Build a table for (kind, y), y with every b > 0.  NULL on allocation
** failure. */
static bl_hetab *build (int kind, const bl_yukawa *y) {
  bl_hetab *t = calloc(1, sizeof *t);
  double bmin, bmax, v[4], h1, h2;
  int i;
  if (t == NULL)
    return NULL;
  t->kind = kind;
  t->y = *y;
  yrange(y, &bmin, &bmax);
  t->u0 = log(bmin) - BELOW;
  t->n = (int)ceil((log(bmax) + ABOVE - t->u0) / STEP) + 1;
  t->H1 = malloc(4 * (size_t)t->n * sizeof(double));
  if (t->H1 == NULL) {
    free(t);
    return NULL;
  }
  t->D1 = t->H1 + t->n;
  t->H2 = t->D1 + t->n;
  t->D2 = t->H2 + t->n;
  for (i = 0; i < t->n; i++) {
    integrals(kind, y, t->u0 + i * STEP, bmax, v);
    t->H1[i] = v[0];
    t->D1[i] = v[1];
    t->H2[i] = v[2];
    t->D2[i] = v[3];
  }
  t->maxerr = 0.0;
  for (i = 0; i + 1 < t->n; i++) {   /* measured error at the midpoints */
    double u = t->u0 + (i + 0.5) * STEP;
    integrals(kind, y, u, bmax, v);
    bl_hetab_lookup(t, u, &h1, &h2);
    if (fabs(h1 - v[0]) > t->maxerr)
      t->maxerr = fabs(h1 - v[0]);
    if (fabs(h2 - v[2]) > t->maxerr)
      t->maxerr = fabs(h2 - v[2]);
  }
  return t;
}


/* Same representation: compare the used part of the Yukawa form. */
static int samekey (const bl_hetab *t, int kind, const bl_yukawa *y) {
  return t->kind == kind && t->y.n == y->n
         && memcmp(t->y.alpha, y->alpha, (size_t)y->n * sizeof(double)) == 0
         && memcmp(t->y.b, y->b, (size_t)y->n * sizeof(double)) == 0;
}


/*
** The cached table of (kind, y), built on first use, with one reference
** taken for the caller.  The lock is held while building, so two threads
** never build the same table twice; the entry is published complete.
** NULL on allocation failure.
*/
const bl_hetab *bl_hetab_get (int kind, const bl_yukawa *y) {
  bl_hetab *t;
  pthread_mutex_lock(&cache_lock);
  for (t = cache_head; t != NULL; t = t->next)
    if (samekey(t, kind, y))
      break;
  if (t != NULL) {
    if (t->refs++ == 0)
      cache_idle--;
  }
  else {
    t = build(kind, y);
    if (t != NULL) {
      t->refs = 1;
      t->next = cache_head;
      cache_head = t;
    }
  }
  pthread_mutex_unlock(&cache_lock);
  return t;
}


static void destroy (bl_hetab *t) {
  free(t->H1);   /* H1, D1, H2, D2 are one block */
  free(t);
}


/* Unlink and free the unreferenced entry released longest ago (lock
** held; there is one). */
static void evict_oldest (void) {
  bl_hetab **p, **old = NULL;
  for (p = &cache_head; *p != NULL; p = &(*p)->next)
    if ((*p)->refs == 0 && (old == NULL || (*p)->stamp < (*old)->stamp))
      old = p;
  if (old != NULL) {
    bl_hetab *t = *old;
    *old = t->next;
    destroy(t);
    cache_idle--;
  }
}


/*
** Drop one reference to t (NULL: nothing).  An entry left without
** references stays for reuse; past BL_METHOD_CACHE_IDLE such entries the
** oldest one is freed.  A pointer not in the cache is ignored.
*/
void bl_hetab_release (const bl_hetab *ct) {
  bl_hetab *t;
  if (ct == NULL)
    return;
  pthread_mutex_lock(&cache_lock);
  for (t = cache_head; t != NULL && t != ct; t = t->next)
    ;
  if (t != NULL && t->refs > 0 && --t->refs == 0) {
    t->stamp = ++cache_clock;
    if (++cache_idle > BL_METHOD_CACHE_IDLE)
      evict_oldest();
  }
  pthread_mutex_unlock(&cache_lock);
}


/* Free every unreferenced entry; the number of entries left. */
size_t bl_hetab_clear (void) {
  bl_hetab **p;
  size_t n = 0;
  pthread_mutex_lock(&cache_lock);
  for (p = &cache_head; *p != NULL;) {
    bl_hetab *t = *p;
    if (t->refs == 0) {
      *p = t->next;
      destroy(t);
    }
    else {
      p = &t->next;
      n++;
    }
  }
  cache_idle = 0;
  pthread_mutex_unlock(&cache_lock);
  return n;
}


/* Entries in the cache, referenced or not. */
size_t bl_hetab_count (void) {
  const bl_hetab *t;
  size_t n = 0;
  pthread_mutex_lock(&cache_lock);
  for (t = cache_head; t != NULL; t = t->next)
    n++;
  pthread_mutex_unlock(&cache_lock);
  return n;
}


/*
** I(s) = int_0^1 dx / (1 + x (1 - x) s^2), and 1 - I(s) without
** cancellation (series for small s).
*/
static double one_minus_I (double s) {
  double s2 = s * s;
  if (s < 0.1)   /* sum_n (-1)^(n+1) s^2n (n!)^2/(2n+1)! */
    return s2 * (1.0 / 6.0 - s2 * (1.0 / 30.0 - s2 * (1.0 / 140.0
                 - s2 / 630.0)));
  {   /* (w + 1)/(w - 1) = (w + 1)^2 s^2 / 4: no w - 1 at large s */
    double w = sqrt(1.0 + 4.0 / s2);
    return 1.0 - 4.0 / (s2 * w) * log(0.5 * (w + 1.0) * s);
  }
}


/*
** The exact small-angle kernels at q ~ m.  In impact-parameter form the
** emission amplitude carries 1 - exp(i y q.r) against the light-cone
** wave function of the projectile and photon; integrating over r (or in
** momentum space with a Feynman parameter) gives, with s = q/m,
**   non-flip (weight 1 + v^2, and spin 0):  J1(s) = pi [(s^2 + 2) I(s) - 2]
**   helicity flip (weight (1 - v)^2):       J0(s) = 2 pi [1 - I(s)],
** J1 -> (2/3) pi s^2 and J0 -> pi s^2 / 3 for s -> 0.  The screening
** integrals above weight dq/q by 1 below m and 0 above; the exact weights
** are kX(s) = J1/((2/3) pi s^2) and kY(s) = J0/(pi s^2/3), both 1 at
** s -> 0, for X = phi1 - phi2/3 and Y = phi2/3.  So phi1 = X + Y takes
** (2/3) kX + (1/3) kY and phi2 = 3 Y takes kY.
*/
static void kernels (double s, double *k1, double *k2) {
  double omi = one_minus_I(s), s2 = s * s, kx, ky;
  if (s < 0.1) {   /* (s^2 + 2) I - 2 = s^2 - (s^2 + 2)(1 - I) */
    kx = 1.5 * (1.0 - (s2 + 2.0) * omi / s2);
  }
  else
    kx = 1.5 * ((s2 + 2.0) * (1.0 - omi) - 2.0) / s2;
  ky = 6.0 * omi / s2;
  *k1 = (2.0 * kx + ky) / 3.0;
  *k2 = ky;
}


/*
** The correction of the screening integrals for their upper end:
** out[0] = int_0^inf h(q) [1 - k1(q/m)] dq/q (phi1), out[1] the same with
** k2 (phi2), replacing the step at q = m by the exact weights.  Terms of
** order Delta/m in it are dropped (below 1e-5 of phi where "auto" uses
** the method).  About 25 us, so the table keeps the tails of its latest
** TAIL_MEMO masses (under the cache lock; a Lua call prepares its case
** anew each time).
*/
static void tails (int kind, const bl_yukawa *y, double m, double out[2]) {
  double bmin, bmax, t0, t1;
  int np, p, j, s;
  yrange(y, &bmin, &bmax);
  t0 = fmin(log(bmin / m), 0.0) - 10.0;   /* (1 - k) ~ s^2 below m */
  t1 = fmax(log(bmax / m), 0.0) + TREACH;
  np = (int)ceil((t1 - t0) / TPANEL);
  out[0] = out[1] = 0.0;
  for (p = 0; p < np; p++) {
    double mid = t0 + (p + 0.5) * TPANEL, half = 0.5 * TPANEL;
    for (j = 0; j < 4; j++)
      for (s = -1; s <= 1; s += 2) {
        double t = mid + s * half * gl_x[j], w = half * gl_w[j], h, dh, k1,
               k2;
        hfun(kind, y, m * exp(t), &h, &dh);
        kernels(exp(t), &k1, &k2);
        out[0] += w * h * (1.0 - k1);
        out[1] += w * h * (1.0 - k2);
      }
  }
}


void bl_hetab_tails (const bl_hetab *ct, double m, double out[4]) {
  bl_hetab *t = (bl_hetab *)ct;   /* the memo is ours, under the lock */
  int i;
  out[2] = out[3] = 0.0;
  pthread_mutex_lock(&cache_lock);
  for (i = 0; i < t->ntail && t->tailm[i] != m; i++)
    ;
  if (i == t->ntail) {   /* new mass: compute, replace the oldest */
    i = t->tailnext;
    t->tailnext = (i + 1) % TAIL_MEMO;
    if (t->ntail < TAIL_MEMO)
      t->ntail++;
    tails(t->kind, &t->y, m, t->tail[i]);
    t->tailm[i] = m;
  }
  out[0] = t->tail[i][0];
  out[1] = t->tail[i][1];
  pthread_mutex_unlock(&cache_lock);
}


double bl_hetab_maxerr (const bl_hetab *t) {
  return t->maxerr;
}
