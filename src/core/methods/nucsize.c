/*
** nucsize.c -- nuclear-size correction of the high-energy method,
** calibrated on the exact Born integral, cached under its own lock
** See Copyright Notice in LICENSE
*/

#include <math.h>
#include <pthread.h>
#include <stdlib.h>

#include <gsl/gsl_errno.h>

#include "methods/internal.h"


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
  int refs;               /* bl_he holding it (under nuc_lock) */
  struct bl_nuctab *next;
};

/* Its own lock: calibrating a node runs Born integrals (up to a second),
** which must not hold up the screening tables of tables.c. */
static pthread_mutex_t nuc_lock = PTHREAD_MUTEX_INITIALIZER;
static bl_nuctab *nuc_head = NULL;


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
** Returns BL_SUCCESS or a tolerance miss (GSL_EMAXITER, GSL_EROUND) with
** *diff set, or a failure with *diff untouched: a failed case setup
** returns at once, so *diff never comes from an unset result (found by
** the clang static analyzer, make lint-clang).
*/
static int miss (int st) {
  return st == GSL_EMAXITER || st == GSL_EROUND;
}

static int nucpoint (const bl_particle *p, double delta, double v,
                     bl_quad *q, double *diff) {
  bl_opts o = bl_opts_bare;
  bl_case cp, cu;
  bl_result rp, ru;
  double m = p->mass, gam = (1.0 - v) / (2.0 * delta);
  double gam0 = gam / v, k = (gam0 - gam) * m;   /* MeV */
  const bl_model *none = bl_model_get(BL_MODEL_NONE);
  int st, st2;
  o.A = NUC_A;
  st = bl_case_setup(&cp, p, 50, none, NULL, (gam0 - 1.0) * m, &o);
  if (st != BL_SUCCESS)
    return miss(st) ? BL_EDOMAIN : st;   /* a failed setup is never a miss */
  o.nucleus = BL_NUCLEUS_UNIFORM;
  st = bl_case_setup(&cu, p, 50, none, NULL, (gam0 - 1.0) * m, &o);
  if (st != BL_SUCCESS)
    return miss(st) ? BL_EDOMAIN : st;   /* a failed setup is never a miss */
  st = bl_dcs_dk_e(&cp, k, q, &rp);
  if (st != BL_SUCCESS && !miss(st))
    return st;
  st2 = bl_dcs_dk_e(&cu, k, q, &ru);
  if (st2 != BL_SUCCESS && !miss(st2))
    return st2;   /* failure wins */
  *diff = (ru.val - rp.val) * k / cp.norm;
  return miss(st2) ? st : st2;   /* success keeps a miss of the first */
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
      bl_spin_weights(t->spin, vs[i], &w1[i], &w2[i]);
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


/* Grid node (spin, ix), calibrated on first use with q, with one
** reference for the caller (lock held). */
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
  t->refs++;
  *out = t;
  return st;
}


/* The nodes and weights of case c into h (none below the grid). */
int bl_nucsize_get (const bl_case *c, bl_quad *q, bl_he *h) {
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
  pthread_mutex_lock(&nuc_lock);
  for (i = 0; i < 4 && st == BL_SUCCESS; i++)
    st = nucnode(c->particle.spin > 0.25 ? 0.5 : 0.0, i0 + i, q, &h->nuc[i]);
  pthread_mutex_unlock(&nuc_lock);
  if (st == BL_SUCCESS)
    h->nnuc = 4;
  return st;
}


void bl_nucsize_release (const bl_nuctab *ct) {
  bl_nuctab *t;
  if (ct == NULL)
    return;
  pthread_mutex_lock(&nuc_lock);
  for (t = nuc_head; t != NULL && t != ct; t = t->next)
    ;
  if (t != NULL && t->refs > 0)
    t->refs--;
  pthread_mutex_unlock(&nuc_lock);
}


size_t bl_nucsize_clear (void) {
  bl_nuctab **p;
  size_t n = 0;
  pthread_mutex_lock(&nuc_lock);
  for (p = &nuc_head; *p != NULL;) {
    bl_nuctab *t = *p;
    if (t->refs == 0) {
      *p = t->next;
      free(t);
    }
    else {
      p = &t->next;
      n++;
    }
  }
  pthread_mutex_unlock(&nuc_lock);
  return n;
}


size_t bl_nucsize_count (void) {
  const bl_nuctab *t;
  size_t n = 0;
  pthread_mutex_lock(&nuc_lock);
  for (t = nuc_head; t != NULL; t = t->next)
    n++;
  pthread_mutex_unlock(&nuc_lock);
  return n;
}


/* N1, N2 at delta: linear in ln delta, constant outside the nodes. */
void bl_nucsize_at (const bl_nuctab *t, double delta, double *N1,
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
