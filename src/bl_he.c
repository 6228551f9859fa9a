/*
** bl_he.c -- high-energy (small-angle) dsigma/dk from screening functions,
** Tsai's complete-screening formula, and the choice between methods
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
** The cache is a process-wide list guarded by a mutex; entries are never
** changed or freed once published, so readers hold plain pointers.
*/

#include <math.h>
#include <pthread.h>
#include <stdlib.h>
#include <string.h>
#include <strings.h>

#include <gsl/gsl_errno.h>

#include "bl_he.h"
#include "bl_internal.h"


#define STEP     0.125   /* grid step in u = ln Delta */
#define BELOW    14.0    /* grid from ln(b_min) - BELOW ... */
#define ABOVE    10.0    /* ... to ln(b_max) + ABOVE */
#define TPANEL   1.0     /* width of the Gauss-Legendre panels in t */
#define TREACH   12.0    /* integrate h up to Q = b_max e^TREACH */
/* "auto" takes the high-energy method where the final gamma = E/m is at
** least GFINAL_HE: there it agrees with the Born integral within 5.3e-4
** for e, mu and pi, Z = 1...100, every screening model, nucleus uniform
** (tests/test_he.c); the difference falls like 0.27/gamma. */
#define GFINAL_HE 500.0


/* 8-point Gauss-Legendre nodes and weights on [-1, 1] (half of them). */
static const double gl_x[4] = {
  0.1834346424956498, 0.5255324099163290, 0.7966664774136267,
  0.9602898564975363
};
static const double gl_w[4] = {
  0.3626837833783620, 0.3137066478872225, 0.2223810344533745,
  0.1012285362903763
};


enum { KIND_ELASTIC, KIND_ELECTRONS };

static void weights (double spin, double v, double *w1, double *w2);

struct bl_hetab {
  int kind;
  bl_yukawa y;            /* the key: representation tabulated */
  int n;
  double u0;              /* u of node 0; nodes at u0 + i STEP */
  double *H1, *D1, *H2, *D2;   /* values and d/du at the nodes */
  double maxerr;          /* worst midpoint interpolation error */
  struct bl_hetab *next;
};

#define NUC_NODES 13     /* nuclear-size nodes: delta = q_N 10^(-3 + j/4) */
#define NUC_X0    (-6.907755278982137)   /* grid in x = ln(m R / hbar c) */
#define NUC_DX    0.25                   /* from ln 1e-3 ... */
#define NUC_NX    80                     /* ... to ln 3.8e5 */
#define NUC_A     100.0  /* mass number of the probe nucleus of the grid */
#define NUC_TOP   1e-2   /* no node above this delta (small angles end) */
#define NUC_RTOL  1e-5   /* tolerance of the calibrating Born integrals */

struct bl_nuctab {
  double spin;            /* the key: spin and grid index of m R */
  int ix;
  int n;
  double lnd[NUC_NODES];  /* ln delta of the nodes, increasing */
  double N1[NUC_NODES], N2[NUC_NODES];
  struct bl_nuctab *next;
};

static pthread_mutex_t cache_lock = PTHREAD_MUTEX_INITIALIZER;
static bl_hetab *cache_head = NULL;
static bl_nuctab *nuc_head = NULL;


/*
** {======================================================
** Screening integrals
** =======================================================
*/

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
  if (kind == KIND_ELASTIC) {
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
static void lookup (const bl_hetab *t, double u, double *H1, double *H2) {
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
    lookup(t, u, &h1, &h2);
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
** The cached table of (kind, y), built on first use.  The lock is held
** while building, so two threads never build the same table twice; the
** entry is published complete.  NULL on allocation failure.
*/
static const bl_hetab *gettab (int kind, const bl_yukawa *y) {
  bl_hetab *t;
  pthread_mutex_lock(&cache_lock);
  for (t = cache_head; t != NULL; t = t->next)
    if (samekey(t, kind, y))
      break;
  if (t == NULL) {
    t = build(kind, y);
    if (t != NULL) {
      t->next = cache_head;
      cache_head = t;
    }
  }
  pthread_mutex_unlock(&cache_lock);
  return t;
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
** the method).
*/
static void tails (int kind, const bl_yukawa *y, double m, double out[4]) {
  double bmin, bmax, t0, t1;
  int np, p, j, s;
  yrange(y, &bmin, &bmax);
  t0 = fmin(log(bmin / m), 0.0) - 10.0;   /* (1 - k) ~ s^2 below m */
  t1 = fmax(log(bmax / m), 0.0) + TREACH;
  np = (int)ceil((t1 - t0) / TPANEL);
  out[0] = out[1] = out[2] = out[3] = 0.0;
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

/* }====================================================== */


/*
** {======================================================
** Nuclear size
** =======================================================
*/

/*
** A uniform nucleus of radius R cuts the momentum transfers beyond
** q_N = hbar c / R; for a projectile with m R > hbar c that is inside
** the range q ~ m where the small-angle kernels above are not exact (the
** constants 4 and 10/3 stand for it).  The correction N1, N2 to phi1, phi2
** is therefore taken from the exact Born integral itself, as the
** difference uniform - point of the bare nucleus (no screening: the two
** act at momenta 1e4 apart), at high energy where it depends only on
** delta = Delta/m, the spin and x = ln(m R / hbar c):
**   [Born_uniform - Born_point] k / norm = w1(v) N1(delta) - w2(v) N2(delta)
** at two v for spin 1/2 (0.5 and 0.1) and one for spin 0 (whose weights
** are proportional: only N1 - N2/3 enters; N2 = 0).  Per grid node of x
** (step 0.25, built on first use by a probe particle of the node's m R on
** a nucleus of A = 100): nodes at delta = q_N 10^(-3 + j/4) up to q_N and
** NUC_TOP, linear in ln delta between them, constant outside (below the
** first node the change is O(delta/q_N) < 1e-3 of N).  A case takes four
** grid nodes around its x with cubic Lagrange weights, so scans over
** masses and elements reuse them.  Below m R = 1e-3 hbar c (electrons
** on hydrogen are at 3e-3) the effect is below 1e-5 and left out.
*/
static int nucpoint (const bl_particle *p, double delta, double v,
                     bl_quad *q, double *diff) {
  bl_opts o = bl_opts_bare;
  bl_case cp, cu;
  bl_result rp, ru;
  double m = p->mass, gam = (1.0 - v) / (2.0 * delta);
  double gam0 = gam / v, k = (gam0 - gam) * m;   /* MeV */
  const bl_model *none = bl_model_get(BL_MODEL_NONE);
  int st;
  o.A = NUC_A;
  st = bl_case_setup(&cp, p, 50, none, NULL, (gam0 - 1.0) * m, &o);
  o.nucleus = BL_NUCLEUS_UNIFORM;
  if (st == BL_SUCCESS)
    st = bl_case_setup(&cu, p, 50, none, NULL, (gam0 - 1.0) * m, &o);
  if (st == BL_SUCCESS)
    st = bl_dcs_dk_e(&cp, k, q, &rp);
  if (st == BL_SUCCESS || st == GSL_EMAXITER || st == GSL_EROUND) {
    int st2 = bl_dcs_dk_e(&cu, k, q, &ru);
    if (st2 != GSL_EMAXITER && st2 != GSL_EROUND)
      st = st2;   /* success keeps a miss of the first; failure wins */
  }
  if (st != BL_SUCCESS && st != GSL_EMAXITER && st != GSL_EROUND)
    return st;
  *diff = (ru.val - rp.val) * k / cp.norm;
  return st;
}


/* Calibrate grid node t (spin and index set) with workspace q. */
static int nucbuild (bl_quad *q, bl_nuctab *t) {
  static const double vs[2] = {0.5, 0.1};
  double mR = exp(NUC_X0 + NUC_DX * t->ix), qN = 1.0 / mR;
  bl_particle probe = {"nuclear-size probe", 0.0, -1.0, 0.0, 0u};
  int j, st;
  probe.mass = mR * BL_HBARC_MEVFM / bl_nucleus_radius(NUC_A);
  probe.spin = t->spin;
  t->n = 0;
  for (j = 0; j < NUC_NODES; j++) {
    double delta = qN * pow(10.0, -3.0 + 0.25 * j), d[2], w1[2], w2[2];
    int i, nv = t->spin > 0.25 ? 2 : 1;
    if (delta > NUC_TOP && t->n > 0)
      break;
    if (delta > NUC_TOP)   /* q_N far above the small-angle range: one */
      delta = 1e-4;        /* node, N is flat there */
    for (i = 0; i < nv; i++) {
      st = nucpoint(&probe, delta, vs[i], q, &d[i]);
      if (st != BL_SUCCESS && st != GSL_EMAXITER && st != GSL_EROUND)
        return st;   /* a tolerance miss leaves an estimate: use it */
      weights(t->spin, vs[i], &w1[i], &w2[i]);
    }
    t->lnd[t->n] = log(delta);
    if (nv == 1) {
      t->N1[t->n] = d[0] / w1[0];
      t->N2[t->n] = 0.0;
    }
    else {   /* w1 N1 - w2 N2 = d at both v */
      double det = -w1[0] * w2[1] + w1[1] * w2[0];
      t->N1[t->n] = (-d[0] * w2[1] + d[1] * w2[0]) / det;
      t->N2[t->n] = (w1[0] * d[1] - w1[1] * d[0]) / det;
    }
    t->n++;
  }
  return BL_SUCCESS;
}


/* Grid node (spin, ix), calibrated on first use with q (lock held). */
static int nucnode (double spin, int ix, bl_quad *q, const bl_nuctab **out) {
  bl_nuctab *t;
  int st = BL_SUCCESS;
  for (t = nuc_head; t != NULL; t = t->next)
    if (t->spin == spin && t->ix == ix)
      break;
  if (t == NULL) {
    double rtol = bl_quad_rtol(q);
    t = calloc(1, sizeof *t);
    if (t == NULL)
      return BL_ENOMEM;
    t->spin = spin;
    t->ix = ix;
    bl_quad_set_rtol(q, NUC_RTOL);
    st = nucbuild(q, t);
    bl_quad_set_rtol(q, rtol);
    if (st != BL_SUCCESS) {
      free(t);
      return st;
    }
    t->next = nuc_head;
    nuc_head = t;
  }
  *out = t;
  return st;
}


/* The nodes and weights of case c into h (none below the grid). */
static int getnuc (const bl_case *c, bl_quad *q, bl_he *h) {
  double x = log(c->R * c->particle.mass / BL_HBARC_MEVFM);
  double u = (x - NUC_X0) / NUC_DX, s;
  int i0, i, st = BL_SUCCESS;
  h->nnuc = 0;
  if (!(u >= 0.0))
    return BL_SUCCESS;
  i0 = (int)floor(u) - 1;
  if (i0 < 0)
    i0 = 0;
  if (i0 > NUC_NX - 4)
    i0 = NUC_NX - 4;   /* beyond the grid: its last cubic (m R > 3.8e5) */
  s = u - i0;
  for (i = 0; i < 4; i++) {   /* Lagrange weights on nodes 0..3 at s */
    double w = 1.0;
    int j;
    for (j = 0; j < 4; j++)
      if (j != i)
        w *= (s - j) / (double)(i - j);
    h->nucw[i] = w;
  }
  pthread_mutex_lock(&cache_lock);
  for (i = 0; i < 4 && st == BL_SUCCESS; i++)
    st = nucnode(c->particle.spin > 0.25 ? 0.5 : 0.0, i0 + i, q, &h->nuc[i]);
  pthread_mutex_unlock(&cache_lock);
  if (st == BL_SUCCESS)
    h->nnuc = 4;
  return st;
}


/* N1, N2 at delta: linear in ln delta, constant outside the nodes. */
static void nucat (const bl_nuctab *t, double delta, double *N1,
                   double *N2) {
  double x = log(delta);
  int i;
  if (t->n == 1 || x <= t->lnd[0]) {
    *N1 = t->N1[0];
    *N2 = t->N2[0];
    return;
  }
  for (i = 1; i < t->n - 1 && x > t->lnd[i]; i++)
    ;
  if (x >= t->lnd[i]) {
    *N1 = t->N1[i];
    *N2 = t->N2[i];
    return;
  }
  x = (x - t->lnd[i - 1]) / (t->lnd[i] - t->lnd[i - 1]);
  *N1 = t->N1[i - 1] + x * (t->N1[i] - t->N1[i - 1]);
  *N2 = t->N2[i - 1] + x * (t->N2[i] - t->N2[i - 1]);
}

/* }====================================================== */


/*
** {======================================================
** Cases
** =======================================================
*/

/* 1 if the representation is a screened one (every b > 0). */
static int screened (const bl_yukawa *y) {
  int i;
  for (i = 0; i < y->n; i++)
    if (!(y->b[i] > 0.0) || !isfinite(y->b[i]))
      return 0;
  return y->n > 0;
}


int bl_he_prepare (const bl_case *c, bl_quad *q, bl_he *h) {
  bl_yukawa y;
  double m = c->particle.mass;
  int st;
  memset(h, 0, sizeof *h);
  st = c->screening->yukawa(c->Z, c->params, &y);
  if (st != BL_SUCCESS)
    return st;
  if (screened(&y)) {
    h->el = gettab(KIND_ELASTIC, &y);
    if (h->el == NULL)
      return BL_ENOMEM;
    tails(KIND_ELASTIC, &y, m, h->tail_el);
    h->maxerr = h->el->maxerr;
  }
  if (c->opts.electrons && c->screening->incoherent != NULL) {
    st = c->screening->incoherent(c->Z, c->params, &y);
    if (st != BL_SUCCESS)
      return st;
    if (!screened(&y))
      return BL_EMODEL;
    h->e = gettab(KIND_ELECTRONS, &y);
    if (h->e == NULL)
      return BL_ENOMEM;
    tails(KIND_ELECTRONS, &y, m, h->tail_e);
    h->maxerr = fmax(h->maxerr, h->e->maxerr);
  }
  if (c->R > 0.0) {
    if (q == NULL)
      return BL_EDOMAIN;
    st = getnuc(c, q, h);
    if (st != BL_SUCCESS)
      return st;
  }
  h->ready = 1;
  return BL_SUCCESS;
}


int bl_method_prepare (const bl_case *c, int method, bl_quad *q, bl_he *h) {
  memset(h, 0, sizeof *h);
  if (method == BL_METHOD_HIGH_ENERGY
      || (method == BL_METHOD_AUTO && 1.0 + c->t0 > GFINAL_HE))
    return bl_he_prepare(c, q, h);
  return BL_SUCCESS;
}


/*
** phi1 and phi2 at Delta (MeV) for a projectile of mass m from table t
** (NULL: unscreened) and its tail moments: the elementary g = 1 part
** minus H plus the part of H beyond m.
*/
static void phis (const bl_hetab *t, const double tail[4], double Delta,
                  double m, double *phi1, double *phi2) {
  double M = m / Delta, lnM = log(M);
  double U1 = lnM - 1.5 + 2.0 / M - 0.5 / (M * M);
  double U2 = lnM - 4.0 / 3.0 + 3.0 * lnM / (M * M) + 4.0 / (3.0 * M * M * M);
  double H1 = 0.0, H2 = 0.0;
  if (t != NULL) {
    lookup(t, log(Delta), &H1, &H2);
    H1 -= tail[0];
    H2 -= tail[1];
  }
  *phi1 = 4.0 + 4.0 * (U1 - H1);
  *phi2 = 10.0 / 3.0 + 4.0 * (U2 - H2);
}


/* The two spin weights of phi1 and phi2 at v = E/E0. */
static void weights (double spin, double v, double *w1, double *w2) {
  *w1 = spin > 0.25 ? 1.0 + v * v : 2.0 * v;
  *w2 = 2.0 * v / 3.0;
}


int bl_he_valid (const bl_case *c, double k) {
  double E = 1.0 + c->t0 - k / c->particle.mass;
  return E >= GFINAL_HE;
}


/* Kinematics of photon energy k (MeV) with the checks every method makes. */
static int kinematics (const bl_case *c, double k, bl_kin *kn) {
  if (!isfinite(k) || k <= 0.0 || k >= c->T)
    return BL_EDOMAIN;
  bl_kin_set(kn, c->t0, k / c->particle.mass, c->particle.spin);
  if (!(kn->p > 0.0))
    return BL_EDOMAIN;
  return BL_SUCCESS;
}


static void clearresult (bl_result *out, int method) {
  out->val = out->err = 0.0;
  out->warn = out->applied = 0;
  out->method = method;
}


/*
** Corrections shared by the two closed forms: the Elwert factor fe on the
** nuclear part (wanted as in the Born method) and whether the Coulomb
** correction is subtracted; sets the warnings and applied bits.
*/
static double corrections (const bl_case *c, const bl_kin *kn,
                           bl_result *out, int *coul) {
  double fe = 1.0;
  out->warn = bl_point_warn(c, kn);
  if (bl_wanted(c->opts.elwert, bl_elwert_valid(kn), BL_WARN_ELWERT,
                &out->warn)) {
    fe = bl_elwert(c, kn);
    out->applied |= BL_APPLIED_ELWERT;
  }
  *coul = bl_wanted(c->opts.coulomb, bl_coulomb_valid(c, kn), BL_WARN_COULOMB,
                    &out->warn);
  if (*coul)
    out->applied |= BL_APPLIED_COULOMB;
  return fe;
}


int bl_he_dk_e (const bl_case *c, const bl_he *h, double k, bl_result *out) {
  bl_kin kn;
  double m = c->particle.mass, v, Delta, p1, p2, e1 = 0.0, e2 = 0.0, w1, w2;
  double fe, f = 0.0, kmev;
  int st, coul, i;
  clearresult(out, BL_METHOD_HIGH_ENERGY);
  if (c == NULL || h == NULL || !h->ready)
    return BL_EDOMAIN;
  st = kinematics(c, k, &kn);
  if (st != BL_SUCCESS)
    return st;
  fe = corrections(c, &kn, out, &coul);
  if (!bl_he_valid(c, k))
    out->warn |= BL_WARN_METHOD;
  v = kn.E / kn.E0;
  Delta = m * kn.k / (2.0 * kn.E0 * kn.E);
  phis(h->el, h->tail_el, Delta, m, &p1, &p2);
  for (i = 0; i < h->nnuc; i++) {   /* nuclear size */
    double N1, N2;
    nucat(h->nuc[i], Delta / m, &N1, &N2);
    p1 += h->nucw[i] * N1;
    p2 += h->nucw[i] * N2;
  }
  if (coul)   /* subtracted after the Elwert factor, as in bl_dcs.c */
    f = 4.0 * bl_coulomb_f(c->particle.charge * c->Z * BL_ALPHA);
  if (h->e != NULL) {
    phis(h->e, h->tail_e, Delta, m, &e1, &e2);
    e1 /= c->Z;
    e2 /= c->Z;
  }
  weights(kn.spin, v, &w1, &w2);
  kmev = kn.k * m;
  out->val = c->norm / kmev * (w1 * (fe * p1 - f + e1)
                               - w2 * (fe * p2 - f + e2));
  out->err = c->norm / kmev * (w1 + w2) * 4.0 * h->maxerr   /* tables */
             * (fe + (h->e != NULL ? 1.0 / c->Z : 0.0));
  if (!isfinite(out->val) || !isfinite(out->err))
    return GSL_ERANGE;
  if (out->val <= 0.0) {   /* far outside the small-angle range, or the */
    out->val = 0.0;        /* Coulomb correction above the rest */
    out->warn |= BL_WARN_CLAMPED;
  }
  return BL_SUCCESS;
}

/* }====================================================== */


/*
** Complete screening needs small angles (as the high-energy method),
** Delta far below the screening momenta -- Tsai's screening variable
** gamma = 100 m_e k / (E0 E Z^1/3) = 200 Delta / (m_e Z^1/3) below 0.02,
** where the Thomas-Fermi form departs from its limit by about 0.5 % --
** and a nucleus that is point-like at q ~ m (m R < 0.1 hbar c): the
** formula has no nuclear size.
*/
static int complete_valid (const bl_case *c, const bl_kin *kn) {
  double m = c->particle.mass;
  double Delta = m * kn->k / (2.0 * kn->E0 * kn->E);
  return kn->E >= GFINAL_HE && 200.0 * Delta / (BL_ME_MEV * cbrt(c->Z)) <= 0.02
         && c->R * m / BL_HBARC_MEVFM <= 0.1;
}


/*
** Tsai (1974), Rev. Mod. Phys. 46, 815, eq. (3.83), complete screening:
**   dsigma/dk = (4 alpha r0^2 / k) { (4/3 - 4/3 y + y^2)
**               [Z^2 (L_rad - f) + Z L'_rad] + (1 - y)(Z^2 + Z)/9 },
** written as [(1 + v^2) - (2/3) v] X + (4/9) v (Z^2 + Z) with
** X = 4 [Z^2 (L_rad - f) + Z L'_rad], so that spin 0 is 1 + v^2 -> 2 v.
** Tsai's constants belong to m = m_e; for another mass the upper end of
** the screening integrals moves with m, which adds ln(m/m_e) to both.
** The electron terms follow `electrons`; f follows `coulomb`.
*/
int bl_complete_dk_e (const bl_case *c, double k, bl_result *out) {
  bl_kin kn;
  double m = c->particle.mass, Z = c->Z, v, w1, w2, L, Lp, shift, X, Y;
  double fe, f = 0.0;
  int st, coul;
  clearresult(out, BL_METHOD_COMPLETE);
  if (c == NULL)
    return BL_EDOMAIN;
  if (c->screening->id == BL_MODEL_NONE)
    return BL_EMODEL;   /* no screening, no complete-screening limit */
  st = kinematics(c, k, &kn);
  if (st != BL_SUCCESS)
    return st;
  fe = corrections(c, &kn, out, &coul);
  if (!complete_valid(c, &kn))
    out->warn |= BL_WARN_METHOD;
  if (coul)
    f = bl_coulomb_f(c->particle.charge * c->Z * BL_ALPHA);
  shift = log(m / BL_ME_MEV);
  L = bl_lrad(c->Z) + shift;
  Lp = bl_lrad_prime(c->Z) + shift;
  X = fe * (L - f);
  Y = 1.0;
  if (c->opts.electrons) {
    X += Lp / Z;
    Y += 1.0 / Z;
  }
  v = kn.E / kn.E0;
  weights(kn.spin, v, &w1, &w2);
  out->val = c->norm / (kn.k * m)   /* norm: z^4 Z^2 alpha r0^2 */
             * ((w1 - w2) * 4.0 * X + (4.0 / 9.0) * v * Y);
  if (!isfinite(out->val))
    return GSL_ERANGE;
  if (out->val <= 0.0) {
    out->val = 0.0;
    out->warn |= BL_WARN_CLAMPED;
  }
  return BL_SUCCESS;
}


/*
** The closed forms' error is that of their tables; where the value has
** nearly cancelled (a method forced far outside its range) it can exceed
** the requested tolerance, and then the result says so, as a Born point
** does (bl_dcs.c, tolcheck).
*/
static int closedform (int st, const bl_quad *q, bl_result *out) {
  if (st == BL_SUCCESS && q != NULL && !(out->warn & BL_WARN_CLAMPED)
      && out->err > bl_quad_rtol(q) * fabs(out->val))
    out->warn |= BL_WARN_TOLERANCE;
  return st;
}


int bl_method_dk_e (const bl_case *c, const bl_he *h, int method, double k,
                    bl_quad *q, bl_result *out) {
  switch (method) {
    case BL_METHOD_BORN:
      return bl_dcs_dk_e(c, k, q, out);
    case BL_METHOD_HIGH_ENERGY:
      return closedform(bl_he_dk_e(c, h, k, out), q, out);
    case BL_METHOD_COMPLETE:
      return closedform(bl_complete_dk_e(c, k, out), q, out);
    case BL_METHOD_AUTO:
      if (c != NULL && h != NULL && h->ready && bl_he_valid(c, k))
        return closedform(bl_he_dk_e(c, h, k, out), q, out);
      return bl_dcs_dk_e(c, k, q, out);
    default:
      clearresult(out, BL_METHOD_BORN);
      return BL_EDOMAIN;
  }
}


int bl_method_breaks (const bl_case *c, const bl_he *h, int method,
                      double *k, double *jump, int nmax) {
  double m = c->particle.mass, E0 = 1.0 + c->t0;
  double lambda = BL_HBARC_MEVFM / m;
  int n = 0;
  /* the Coulomb correction (a few per cent near the tip, up to 10 % on
  ** the heaviest atoms) stops where the final gamma falls below 10 */
  if (c->opts.coulomb == BL_APPLY_AUTO && E0 >= 100.0
      && lambda >= 10.0 * bl_nucleus_radius(c->opts.A) && n < nmax
      && method != BL_METHOD_HIGH_ENERGY && method != BL_METHOD_COMPLETE) {
    k[n] = (E0 - 10.0) * m;
    jump[n++] = 0.1;
  }
  /* "auto" changes method at the final gamma GFINAL_HE (within 1e-3) */
  if (method == BL_METHOD_AUTO && h != NULL && h->ready && E0 > GFINAL_HE
      && n < nmax) {
    k[n] = (E0 - GFINAL_HE) * m;
    jump[n++] = 1e-3;
  }
  return n;
}


static const char *const method_names[BL_METHOD_COUNT] = {
  "born", "high-energy", "complete", "auto"
};

const char *bl_method_name (int method) {
  return method >= 0 && method < BL_METHOD_COUNT ? method_names[method]
                                                 : NULL;
}

int bl_method_find (const char *name) {
  int i;
  if (name == NULL)
    return -1;
  for (i = 0; i < BL_METHOD_COUNT; i++)
    if (strcasecmp(name, method_names[i]) == 0)
      return i;
  return -1;
}
