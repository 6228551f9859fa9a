/*
** target.c -- a material as a target: the weighted sum over its elements
** of every observable, the suppression of the medium, the integrals over
** the photon energy with their tolerance policy, and the work estimate
** See Copyright Notice in LICENSE
**
** Sums.  The value of a material per formula unit is sum_i atoms_i
** value_i over its elements, the error sum_i atoms_i err_i (a bound:
** the elements' errors are not independent), the warnings and applied
** corrections the union.  Elements are added in the order of the material
** (increasing Z), the same for every observable and every thread count,
** so results do not depend on how they were computed.
**
** Suppression (LPM, dielectric) is a property of the medium, not of one
** atom: it multiplies the material's dsigma/dk (target/suppress.c).
**
** Tolerance of the integrals over k: the quadrature aims at rtol/2 and
** the points' errors, summed with the rule's weights, at the other half;
** the integrator sets each point's tolerance (bl_kintegral_tol_e of
** target/kint.h, through ktol on the workspace): rtol/2 where the point
** carries a large share, up to 1e-2 where it carries little.  Breakpoints
** of bl_method_breaks are dropped, smallest first, while the bounds of the
** error a straddled jump may leave add up to at most a quarter of rtol; those
** bounds are added to the integral's error (breaks()).
*/

#include <math.h>
#include <stdlib.h>
#include <string.h>

#include "brakelight.h"
#include "brakelight/bl_target.h"
#include "ebrems/table.h"
#include "target/erow.h"
#include "target/kint.h"


/* Share of rtol the bounds of the dropped breakpoints may add up to. */
#define BREAK_SHARE 0.25

/* Most distinct breakpoints gathered over the elements. */
#define BREAK_CAND (4 * BL_KINT_MAXBREAK)


static void clear (bl_tresult *out) {
  memset(out, 0, sizeof *out);
  out->supp = 1.0;
}


/* 1 if element i's angular values take the exact electron part
** (bl_method_eexact, unless the target keeps the static shape). */
static int eexact (const bl_target *t, int i) {
  return !t->estatic && bl_method_eexact(&t->c[i]);
}


/* Element i's angular distribution (case c: the element's own, or its
** nucleus alone) with the electron part exact or scaled, as t says. */
static int angularof (const bl_target *t, int i, const bl_case *c, double k,
                      double theta_k, bl_quad *q, bl_result *r) {
  return eexact(t, i)
         ? bl_method_angular_e(c, t->method, k, theta_k, q, r)
         : bl_method_angular_scaled_e(c, t->method, k, theta_k, q, r);
}


int bl_target_setup (bl_target *t, const bl_particle *p,
                     const bl_material *m, const bl_model *screening,
                     const double *params, double T, const bl_opts *o,
                     int method, const bl_suppress *sup, int *failZ) {
  int i;
  if (failZ != NULL)
    *failZ = 0;
  if (t == NULL || p == NULL || m == NULL || screening == NULL)
    return BL_EDOMAIN;
  memset(t, 0, sizeof *t);
  if (m->n < 1 || m->n > BL_MATERIAL_MAXCOMP || method < 0
      || method >= BL_METHOD_COUNT)
    return BL_EDOMAIN;
  t->particle = *p;
  t->material = *m;
  t->T = T;
  t->method = method;
  if (sup != NULL)
    t->sup = *sup;
  else
    t->sup.mode = BL_SUPPRESS_NONE;
  t->n = m->n;
  for (i = 0; i < t->n; i++) {
    int st = bl_case_setup(&t->c[i], p, m->comp[i].Z, screening, params, T,
                           o);
    if (st != BL_SUCCESS) {
      if (failZ != NULL)
        *failZ = m->comp[i].Z;
      t->n = 0;
      return st;
    }
    t->atoms[i] = m->comp[i].atoms;
    t->warn |= t->c[i].warn;
  }
  if (p->flags & BL_PARTICLE_COMPOSITE)
    t->warn |= BL_WARN_POINTLIKE;
  return BL_SUCCESS;
}


int bl_target_prepare (bl_target *t, bl_quad *q, int *failZ) {
  int i;
  if (failZ != NULL)
    *failZ = 0;
  if (t == NULL)
    return BL_EDOMAIN;
  for (i = 0; i < t->n; i++) {
    int st = bl_method_prepare(&t->c[i], t->method, q, &t->he[i]);
    if (st != BL_SUCCESS) {
      if (failZ != NULL)
        *failZ = t->c[i].Z;
      bl_target_release(t);   /* hold nothing after a failure */
      return st;
    }
  }
  return BL_SUCCESS;
}


void bl_target_release (bl_target *t) {
  int i;
  if (t == NULL)
    return;
  for (i = 0; i < BL_MATERIAL_MAXCOMP; i++)   /* a cleared he: no-op */
    bl_he_release(&t->he[i]);
}


/*
** Add element i's result r to the sum: weight, errors, warnings, applied
** corrections, the method; note the Born element and the method used in
** the record rec.
*/
static void addelement (const bl_target *t, int i, const bl_result *r,
                        bl_result *sum, bl_tresult *rec) {
  if ((r->warn & BL_WARN_BORN) && t->c[i].Z > rec->zborn)
    rec->zborn = t->c[i].Z;
  sum->val += t->atoms[i] * r->val;
  sum->err += t->atoms[i] * r->err;
  sum->sys += t->atoms[i] * r->sys;
  sum->warn |= r->warn;
  sum->applied |= r->applied;
  sum->method = r->method;
  rec->used |= 1u << r->method;
}


/* The medium's suppression of the material's dsigma/dk at k; the record
** keeps the smallest factor. */
static void suppress (const bl_target *t, double k, bl_result *sum,
                      bl_tresult *rec) {
  double f;
  if (t->sup.mode == BL_SUPPRESS_NONE)
    return;
  f = bl_suppress_factor(&t->sup, t->T + t->particle.mass, k);
  sum->val *= f;
  sum->err *= f;
  sum->sys *= f;
  sum->warn |= BL_WARN_SUPPRESS;
  if (f < rec->supp)
    rec->supp = f;
}


/*
** Check element i's status st and result r at k: a soft status becomes
** the tolerance warning; a hard failure or a non-finite value is noted in
** out and returned; a muon's electron term held below its table
** (bl_case_eheld) is flagged, except in an angular distribution (kind)
** whose electron part is the exact one (bl_method_eexact).
*/
static int checkelement (const bl_target *t, int i, int st, bl_result *r,
                         double k, int kind, bl_tresult *out) {
  if (st != BL_SUCCESS) {
    if (bl_status_soft(st))
      r->warn |= BL_WARN_TOLERANCE;
    else
      goto fail;
  }
  if (!isfinite(r->val) || !isfinite(r->err)) {
    st = BL_ENONFINITE;
    goto fail;
  }
  if (bl_case_eheld(&t->c[i], k)
      && !(kind == BL_TARGET_ANGULAR && eexact(t, i)))
    r->warn |= BL_WARN_EHELD;   /* a muon's electron term below its table */
  return BL_SUCCESS;
fail:
  out->Z = t->c[i].Z;
  out->k = k;
  out->fail = *r;
  return st;
}


/*
** Take element i's status st and result r at k into the sum out: a soft
** status is kept in *soft (the last one is returned by the caller); a hard
** failure is returned (checkelement).
*/
static int take (const bl_target *t, int i, int st, bl_result *r, double k,
                 int kind, bl_tresult *out, int *soft) {
  out->Z = t->c[i].Z;
  if (st != BL_SUCCESS && bl_status_soft(st))
    *soft = st;
  st = checkelement(t, i, st, r, k, kind, out);
  if (st == BL_SUCCESS)
    addelement(t, i, r, &out->r, out);
  return st;
}


/*
** Element i's value of kind (BL_TARGET_*) at one point into r, computed
** with case cn when not NULL (the nuclear part alone, bl_method_nuclear)
** instead of the element's own.
*/
static int pointof (const bl_target *t, int i, const bl_case *cn, int kind,
                    double k, double theta_k, double theta_p, double phi,
                    bl_quad *q, bl_result *r) {
  const bl_case *c = cn != NULL ? cn : &t->c[i];
  switch (kind) {
    case BL_TARGET_DK:
      return bl_method_dk_e(c, &t->he[i], t->method, k, q, r);
    case BL_TARGET_ANGULAR:
      return angularof(t, i, c, k, theta_k, q, r);
    case BL_TARGET_FULL:
      return eexact(t, i)
             ? bl_method_full_e(c, t->method, k, theta_k, theta_p, phi, r)
             : bl_method_full_scaled_e(c, t->method, k, theta_k, theta_p,
                                       phi, r);
    default:
      return BL_EDOMAIN;
  }
}


/*
** An angular or fully differential value of element i that keeps the
** static term's angular shape for its bound electron part
** (bl_method_eshape, where its electron part is not the exact one): flag r and put the nuclear part alone in
** *nuc (the value of the case without its electrons); otherwise *nuc =
** r->val.  Where that second value fails, the whole value counts as the
** electrons'.
*/
static void eshape (const bl_target *t, int i, int kind, double k,
                    double theta_k, double theta_p, double phi, bl_quad *q,
                    bl_result *r, double *nuc) {
  const bl_case *c = &t->c[i];
  bl_case cn;
  bl_result rn;
  int st;
  *nuc = r->val;
  if (kind == BL_TARGET_DK || !bl_method_eshape(c, k) || eexact(t, i))
    return;
  r->warn |= BL_WARN_ESHAPE;
  *nuc = 0.0;
  if (bl_method_nuclear(c, &cn) != BL_SUCCESS)
    return;
  st = pointof(t, i, &cn, kind, k, theta_k, theta_p, phi, q, &rn);
  if ((st == BL_SUCCESS || bl_status_soft(st)) && isfinite(rn.val))
    *nuc = rn.val;
}


/*
** With BL_WARN_EBORN (method "partial"): the share of out's dsigma/dk at
** k that the electron parts added as Born carry (bl_partial_epart_e, the
** same integrals at the same tolerance as in the point: the same values),
** into out->eborn; before the suppression, which scales both alike.
*/
static void eborn (const bl_target *t, double k, bl_quad *q,
                   bl_tresult *out) {
  double e = 0.0;
  int i;
  if (!(out->r.warn & BL_WARN_EBORN) || !(out->r.val > 0.0) || q == NULL)
    return;
  for (i = 0; i < t->n; i++) {
    bl_result re;
    int st = bl_partial_epart_e(&t->c[i], k, q, &re);
    if (st == BL_SUCCESS || bl_status_soft(st))
      e += t->atoms[i] * re.val;
  }
  out->eborn = fmin(fmax(e / out->r.val, 0.0), 1.0);
}


int bl_target_point_e (const bl_target *t, int kind, double k, double theta_k,
                       double theta_p, double phi, bl_quad *q,
                       bl_tresult *out) {
  int i, soft = BL_SUCCESS;
  double nucsum = 0.0;
  if (out == NULL)
    return BL_EDOMAIN;
  clear(out);
  if (t == NULL || t->n < 1 || (q == NULL && kind != BL_TARGET_FULL)
      || kind < BL_TARGET_DK || kind > BL_TARGET_FULL)
    return BL_EDOMAIN;
  out->k = k;
  for (i = 0; i < t->n; i++) {
    bl_result r;
    double nuc;
    int st = pointof(t, i, NULL, kind, k, theta_k, theta_p, phi, q, &r);
    if (st == BL_SUCCESS || bl_status_soft(st)) {
      eshape(t, i, kind, k, theta_k, theta_p, phi, q, &r, &nuc);
      nucsum += t->atoms[i] * nuc;
    }
    st = take(t, i, st, &r, k, kind, out, &soft);
    if (st != BL_SUCCESS)
      return st;
  }
  if ((out->r.warn & BL_WARN_ESHAPE) && out->r.val > 0.0)
    out->eshare = fmin(fmax(1.0 - nucsum / out->r.val, 0.0), 1.0);
  if (kind == BL_TARGET_DK) {
    eborn(t, k, q, out);
    suppress(t, k, &out->r, out);
  }
  return soft;
}


int bl_target_dk_e (const bl_target *t, double k, bl_quad *q,
                    bl_tresult *out) {
  return bl_target_point_e(t, BL_TARGET_DK, k, 0.0, 0.0, 0.0, q, out);
}


/*
** The exact-Born dsigma/dk of the target at k, the reference the size of
** a warning is measured against: each element by the Born integral with
** its corrections (plain = 0) or without them (plain = 1), the projectile
** a point charge (radius 0) or with its charge form factor of that radius
** (bl_case_set_formfactor); the medium's suppression as bl_target_dk_e.
*/
int bl_target_born_dk_e (const bl_target *t, double k, int plain,
                         double radius, bl_quad *q, bl_tresult *out) {
  int i, soft = BL_SUCCESS;
  if (out == NULL)
    return BL_EDOMAIN;
  clear(out);
  if (t == NULL || t->n < 1 || q == NULL || radius < 0.0)
    return BL_EDOMAIN;
  out->k = k;
  for (i = 0; i < t->n; i++) {
    bl_case c = t->c[i];
    bl_result r;
    int st = BL_SUCCESS;
    if (plain)
      c.opts.coulomb = c.opts.elwert = BL_APPLY_OFF;
    if (radius > 0.0)
      st = bl_case_set_formfactor(&c, radius);
    if (st == BL_SUCCESS)
      st = bl_method_dk_e(&c, NULL, BL_METHOD_BORN, k, q, &r);
    else
      memset(&r, 0, sizeof r);
    st = take(t, i, st, &r, k, BL_TARGET_DK, out, &soft);
    if (st != BL_SUCCESS)
      return st;
  }
  suppress(t, k, &out->r, out);
  return soft;
}


/*
** A spectrum interrupted during element j (its stop flag set): a point is
** finished when every element has been added, so only when j is the last
** element and the point's own evaluation ran (status not BL_EINTR); those
** get the element and the suppression, every other point status
** BL_EINTR.  Returns BL_EINTR.
*/
static int interrupted (const bl_target *t, int j, size_t n, const double *k,
                        bl_result *r, const int *st, bl_tresult *out,
                        int *status) {
  size_t i;
  for (i = 0; i < n; i++) {
    int s = st[i];
    if (j == t->n - 1 && s != BL_EINTR) {
      out[i].Z = t->c[j].Z;
      s = checkelement(t, j, s, &r[i], k[i], BL_TARGET_DK, &out[i]);
      if (s == BL_SUCCESS) {
        if (status != NULL && st[i] != BL_SUCCESS)
          status[i] = st[i];    /* a soft failure: a best estimate */
        addelement(t, j, &r[i], &out[i].r, &out[i]);
        suppress(t, k[i], &out[i].r, &out[i]);
        continue;
      }
    }
    if (status != NULL)
      status[i] = BL_EINTR;
  }
  return BL_EINTR;
}


int bl_target_spectrum_e (const bl_target *t, size_t n, const double *k,
                          int nthreads, bl_quad *q, bl_tresult *out,
                          int *status) {
  bl_result *r;
  int *st, ret = BL_SUCCESS;
  size_t i;
  int j;
  if (t == NULL || t->n < 1 || (n > 0 && (k == NULL || out == NULL
                                           || q == NULL)) || nthreads < 0)
    return BL_EDOMAIN;
  for (i = 0; i < n; i++) {
    clear(&out[i]);
    out[i].k = k[i];
    if (status != NULL)
      status[i] = BL_SUCCESS;
  }
  if (n == 0)
    return BL_SUCCESS;
  r = malloc(n * sizeof *r);
  st = malloc(n * sizeof *st);
  if (r == NULL || st == NULL) {
    free(r);
    free(st);
    return BL_ENOMEM;
  }
  for (j = 0; j < t->n && ret == BL_SUCCESS; j++) {   /* element by element */
    bl_spectrum_method_e(&t->c[j], &t->he[j], t->method, n, k, nthreads, q,
                         r, st);
    if (bl_quad_stopped(q)) {   /* interrupted: keep the finished points */
      ret = interrupted(t, j, n, k, r, st, out, status);
      break;
    }
    for (i = 0; i < n; i++) {
      int s = st[i];
      out[i].Z = t->c[j].Z;
      if (s != BL_SUCCESS && bl_status_soft(s) && status != NULL)
        status[i] = s;
      s = checkelement(t, j, s, &r[i], k[i], BL_TARGET_DK, &out[i]);
      if (s != BL_SUCCESS) {
        if (status != NULL)
          status[i] = s;
        ret = s;
        break;
      }
      addelement(t, j, &r[i], &out[i].r, &out[i]);
    }
  }
  free(r);
  free(st);
  if (ret != BL_SUCCESS)
    return ret;
  for (i = 0; i < n; i++) {
    eborn(t, k[i], q, &out[i]);
    suppress(t, k[i], &out[i].r, &out[i]);
  }
  return BL_SUCCESS;
}


/* What one integrand evaluation of an integral over k needs. */
typedef struct kctx {
  const bl_target *t;
  bl_quad *q;
  int kind;
  double theta;
  const bl_erow *row; /* per element (dsigma/dk), or NULL: erows() */
  bl_tresult acc;    /* zborn, supp, used over every point; failure */
} kctx;


/*
** Element i's dsigma/dk at k where its electron part comes from its row
** (the exact term interpolated, target/erow.c): the method's value with
** the electron part off (the case with k_max = 0, as bl_method_dk_e does
** it per point) plus the row's value; elsewhere the element's own.
*/
static int dkrow (const kctx *x, int i, double k, bl_result *r) {
  const bl_target *t = x->t;
  double ev, ee;
  bl_case cn;
  int st;
  if (x->row == NULL || !bl_erow_eval(&x->row[i], k, &ev, &ee))
    return bl_method_dk_e(&t->c[i], &t->he[i], t->method, k, x->q, r);
  cn = t->c[i];
  cn.ekmax = 0.0;
  st = bl_method_dk_e(&cn, &t->he[i], t->method, k, x->q, r);
  if (st != BL_SUCCESS && !bl_status_soft(st))
    return st;
  r->val += ev;
  r->err += ee;
  r->warn |= x->row[i].warn;
  return st;
}


/*
** The target's dsigma/dk (or d2sigma/(dk dOmega) at theta) at k for the
** integrator; a hard failure is returned with its element noted.
*/
static int kpoint (void *ud, double k, bl_result *out) {
  kctx *x = ud;
  const bl_target *t = x->t;
  int i, soft = 0;
  memset(out, 0, sizeof *out);
  out->method = BL_METHOD_BORN;
  if (bl_quad_stopped(x->q)) {       /* interrupted: stop the integral */
    x->acc.Z = t->c[0].Z;
    x->acc.k = k;
    memset(&x->acc.fail, 0, sizeof x->acc.fail);
    return BL_EINTR;
  }
  for (i = 0; i < t->n; i++) {
    const bl_case *c = &t->c[i];
    bl_result r;
    int st = x->kind == BL_TARGET_DK ? dkrow(x, i, k, &r)
             : angularof(t, i, c, k, x->theta, x->q, &r);
    if (st != BL_SUCCESS && !bl_status_soft(st)) {
      x->acc.Z = c->Z;
      x->acc.k = k;
      x->acc.fail = r;
      return st;
    }
    soft |= st != BL_SUCCESS;
    if (x->kind == BL_TARGET_ANGULAR && !eexact(t, i)
        && bl_method_eshape(c, k))
      r.warn |= BL_WARN_ESHAPE;   /* its share is not measured here */
    addelement(t, i, &r, out, &x->acc);
  }
  if (x->kind == BL_TARGET_DK)
    suppress(t, k, out, &x->acc);
  return soft ? BL_ENOTCONV : BL_SUCCESS;
}


/* The integrator's choice of the points' tolerance: the workspace's. */
static void ktol (void *ud, double rtol) {
  kctx *x = ud;
  bl_quad_set_rtol(x->q, fmin(BL_QUAD_RTOL_MAX, fmax(rtol, BL_QUAD_RTOL_MIN)));
}


/*
** The share of (kb, kmax) in (kmin, kmax) for moment m, that of a flat
** k dsigma/dk (Bethe-Heitler's falls to 3/4 of its k -> 0 value at the
** tip, so this overestimates the share of a tip; measured on the grid of
** DEVELOPERS.md, the true straddling errors stay 10-100 times below).
*/
static double above (double kb, double kmin, double kmax, int m) {
  return m ? (kmax - kb) / (kmax - kmin) : log(kmax / kb) / log(kmax / kmin);
}


/*
** The breakpoints of the method over the elements inside (kmin, kmax),
** without those whose jump in the material cannot matter at rtol; *drop0
** and *drop1 get the relative error the dropped ones may leave in moment 0
** and 1.  bl_method_breaks gives a jump relative to the element's own
** dsigma/dk; in the material it is weighted by the element's share,
** estimated as atoms Z (Z + 1) over the sum (complete screening; the
** Coulomb correction and the screening logarithms move the shares by
** about 10 %), and the jumps of the elements at one k (the projectile's
** electron end point is the same on every element) are added.  A rule
** that straddles a jump J at kb errs by at most about J times the part of
** the integral above kb (the step's own integral; a Gauss rule's error on
** a step is below it), taken here as J above(): a break is dropped while
** these bounds add up to at most BREAK_SHARE rtol, the smallest first, and
** the integral's error includes them.
*/
static int breaks (const bl_target *t, double rtol, double kmin,
                   double kmax, double *kb, double *drop0, double *drop1) {
  double ck[BREAK_CAND], cj[BREAK_CAND], b0[BREAK_CAND], b1[BREAK_CAND];
  double wsum = 0.0, used = 0.0;
  int nc = 0, nb = 0, i, j, l, keep[BREAK_CAND];
  *drop0 = *drop1 = 0.0;
  for (i = 0; i < t->n; i++)
    wsum += t->atoms[i] * t->c[i].Z * (t->c[i].Z + 1.0);
  for (i = 0; i < t->n; i++) {
    double k[BL_KINT_MAXBREAK], jump[BL_KINT_MAXBREAK];
    double w = wsum > 0.0 ? t->atoms[i] * t->c[i].Z * (t->c[i].Z + 1.0)
                            / wsum : 1.0;
    int n = bl_method_breaks(&t->c[i], &t->he[i], t->method, k, jump,
                             BL_KINT_MAXBREAK);
    for (j = 0; j < n; j++) {
      if (!(k[j] > kmin && k[j] < kmax))
        continue;   /* not in the range: never straddled */
      for (l = 0; l < nc && !(fabs(ck[l] - k[j]) <= 1e-12 * t->T); l++)
        ;
      if (l == nc) {
        if (nc == BREAK_CAND)
          continue;   /* not cut there: the rule still integrates it */
        ck[nc] = k[j];
        cj[nc++] = 0.0;
      }
      cj[l] += w * jump[j];
    }
  }
  for (j = 0; j < nc; j++) {   /* the bound of each: moment 0 and 1 */
    b1[j] = cj[j] * above(ck[j], kmin, kmax, 1);
    b0[j] = kmin > 0.0 ? cj[j] * above(ck[j], kmin, kmax, 0) : 0.0;
    cj[j] = fmax(b0[j], b1[j]);
    keep[j] = 1;
  }
  for (;;) {   /* drop the smallest bound while the sum allows */
    int s = -1;
    for (j = 0; j < nc; j++)
      if (keep[j] && (s < 0 || cj[j] < cj[s]))
        s = j;
    if (s < 0 || used + cj[s] > BREAK_SHARE * rtol)
      break;
    keep[s] = 0;
    used += cj[s];
  }
  for (j = 0; j < nc; j++)
    if (keep[j] && nb < BL_KINT_MAXBREAK)
      kb[nb++] = ck[j];
    else {   /* dropped (or no room left): straddled, its bound counted */
      *drop0 += b0[j];
      *drop1 += b1[j];
    }
  return nb;
}


/* The interpolation asked of a row (target/erow.c): this share of the
** integral's rtol, never below EROW_TOL_MIN (at 5e-5 the row of a 0.1 keV
** pion on water took 2.2 s against 1.6 s at 1e-4, where its integral kept
** its rtol 1e-4: DEVELOPERS.md, "Other projectiles"). */
#define EROW_SHARE 0.5
#define EROW_TOL_MIN 1e-4


/*
** The rows of the elements that take the exact electron term per point
** (c->ebexact) for the moment of dsigma/dk over (kmin, kmax): *rows NULL
** when no element does, else t->n rows (freed by the caller).  A hard
** failure of a node is returned with its element noted in x.
*/
static int erows (kctx *x, double kmin, double kmax, int moment,
                  double rtol, bl_erow **rows) {
  const bl_target *t = x->t;
  int i, need = 0;
  *rows = NULL;
  for (i = 0; i < t->n; i++)
    need |= t->c[i].ebexact && t->c[i].ekmax > 0.0
            && t->c[i].opts.electrons;
  if (!need)
    return BL_SUCCESS;
  *rows = malloc(t->n * sizeof **rows);
  if (*rows == NULL)
    return BL_ENOMEM;
  for (i = 0; i < t->n; i++) {
    int st = bl_erow_build(&t->c[i], kmin, kmax, moment,
                           fmax(EROW_SHARE * rtol, EROW_TOL_MIN), x->q,
                           &(*rows)[i]);
    if (st != BL_SUCCESS) {
      x->acc.Z = t->c[i].Z;
      x->acc.k = kmin;
      free(*rows);
      *rows = NULL;
      return st;
    }
  }
  return BL_SUCCESS;
}


/* The rows' part of the error of moment m: their interpolation's
** estimate weighted by the electron parts (the nodes' own errors are in
** the points', bl_erow_eval). */
static double erowerr (const bl_target *t, const bl_erow *rows, int m) {
  double e = 0.0;
  int i;
  for (i = 0; rows != NULL && i < t->n; i++)
    if (rows[i].n > 0)
      e += t->atoms[i] * rows[i].est[m] * rows[i].part[m];
  return e;
}


/* Copy the integral's result and what its points gathered into *out. */
static void kresult (const kctx *x, int st, const bl_result *r,
                     bl_tresult *out) {
  if (out == NULL)
    return;
  *out = x->acc;
  out->r = *r;
  if (st != BL_SUCCESS && bl_status_soft(st))
    out->r.warn |= BL_WARN_TOLERANCE;
}


int bl_target_kintegral_e (const bl_target *t, int kind, double theta_k,
                           double kmin, double kmax, bl_quad *q,
                           bl_tresult *r0, bl_tresult *r1) {
  kctx x;
  bl_result v0, v1;
  bl_erow *rows = NULL;
  double kb[BL_KINT_MAXBREAK], rtol, drop0 = 0.0, drop1 = 0.0;
  int st, nb = 0;
  if (r0 != NULL)
    clear(r0);
  if (r1 != NULL)
    clear(r1);
  if (t == NULL || t->n < 1 || q == NULL || (r0 == NULL && r1 == NULL)
      || (kind != BL_TARGET_DK && kind != BL_TARGET_ANGULAR))
    return BL_EDOMAIN;
  memset(&v0, 0, sizeof v0);
  memset(&v1, 0, sizeof v1);
  x.t = t;
  x.q = q;
  x.kind = kind;
  x.theta = kind == BL_TARGET_ANGULAR ? theta_k : 0.0;
  x.row = NULL;
  clear(&x.acc);
  x.acc.Z = t->c[0].Z;
  x.acc.k = kmin;
  rtol = bl_quad_rtol(q);
  st = bl_quad_set_rtol(q, fmax(rtol / 2.0, BL_QUAD_RTOL_MIN));
  if (st == BL_SUCCESS && kind == BL_TARGET_DK) {
    st = erows(&x, kmin, kmax, r0 == NULL, rtol, &rows);
    x.row = rows;
  }
  if (st == BL_SUCCESS) {
    if (kind == BL_TARGET_DK)
      nb = breaks(t, rtol, kmin, kmax, kb, &drop0, &drop1);
    else if (t->n > 0 && t->c[0].ebt != 0 && t->c[0].ekmax < t->T) {
      /* the end point of the bound electron term, the same on every
      ** element: the projectile's; and the kink of its table
      ** (bl_method_breaks) where the angular distribution takes it */
      kb[nb++] = t->c[0].ekmax;
      if (!eexact(t, 0))
        kb[nb++] = t->c[0].ekmax * bl_ebt_ulast(t->c[0].ebt - 1);
    }
    st = r0 == NULL
         ? bl_kintegral_tol_e(kpoint, ktol, &x, kmin, kmax, t->T, kb, nb, 1,
                              rtol, &v1, NULL)
         : bl_kintegral_tol_e(kpoint, ktol, &x, kmin, kmax, t->T, kb, nb, 0,
                              rtol, &v0, r1 == NULL ? NULL : &v1);
    if (st == BL_SUCCESS || bl_status_soft(st)) {   /* the dropped breaks */
      v0.err += drop0 * fabs(v0.val);
      v1.err += drop1 * fabs(v1.val);
      if (r0 != NULL)   /* the moments computed: r0 NULL is moment 1 */
        v0.err += erowerr(t, rows, 0);
      if (r0 == NULL || r1 != NULL)
        v1.err += erowerr(t, rows, 1);
      if (st == BL_SUCCESS && (v0.err > rtol * fabs(v0.val)
                               || v1.err > rtol * fabs(v1.val))) {
        st = BL_ENOTCONV;   /* kresult adds the tolerance warning */
      }
    }
  }
  bl_quad_set_rtol(q, rtol);
  free(rows);
  {   /* a window reaching below a muon's held electron term is flagged
      ** even where no point of the rule fell there (not in an angular
      ** distribution whose electron part is the exact one) */
    int i;
    for (i = 0; i < t->n; i++)
      if (kmin < bl_case_eheld_k(&t->c[i])
          && !(kind == BL_TARGET_ANGULAR && eexact(t, i))) {
        v0.warn |= BL_WARN_EHELD;
        v1.warn |= BL_WARN_EHELD;
      }
  }
  kresult(&x, st, &v0, r0);
  kresult(&x, st, &v1, r1);
  return st;
}


int bl_target_cross_section_e (const bl_target *t, double kmin, double kmax,
                               bl_quad *q, bl_tresult *sigma,
                               bl_tresult *moment1) {
  return bl_target_kintegral_e(t, BL_TARGET_DK, 0.0, kmin, kmax, q, sigma,
                               moment1);
}


void bl_target_mean_k (const bl_result *sigma, const bl_result *moment1,
                       double kmin, double kmax, double *mean, double *err) {
  double m = sigma->val > 0.0 ? moment1->val / sigma->val
                              : 0.5 * (kmin + kmax);
  *mean = m;
  *err = sigma->val > 0.0 && moment1->val > 0.0
         ? m * (sigma->err / sigma->val + moment1->err / moment1->val) : 0.0;
}


int bl_target_energy_loss_e (const bl_target *t, bl_quad *q,
                             bl_tresult *out) {
  if (t == NULL)
    return BL_EDOMAIN;
  return bl_target_kintegral_e(t, BL_TARGET_DK, 0.0, 0.0, t->T, q, NULL,
                               out);
}


int bl_target_dsdomega_e (const bl_target *t, double kmin, double kmax,
                          double theta_k, bl_quad *q, bl_tresult *out) {
  return bl_target_kintegral_e(t, BL_TARGET_ANGULAR, theta_k, kmin, kmax, q,
                               out, NULL);
}


int bl_target_photon_yield_e (const bl_target *t, double thickness,
                              double kmin, double kmax, int nbins,
                              int spacing, bl_quad *q, double *edges,
                              bl_tresult *out, int *failbin) {
  double perunit;
  int i;
  if (failbin != NULL)
    *failbin = -1;
  if (t == NULL || edges == NULL || out == NULL || nbins < 1
      || nbins > BL_YIELD_MAXBINS || !(thickness > 0.0)
      || (spacing != BL_SPACING_LINEAR && spacing != BL_SPACING_LOG)
      || (spacing == BL_SPACING_LOG && !(kmin > 0.0)))
    return BL_EDOMAIN;
  perunit = bl_material_per_gram(&t->material) * thickness;  /* per mb */
  for (i = 0; i <= nbins; i++) {
    double e = spacing == BL_SPACING_LOG
               ? kmin * pow(kmax / kmin, (double)i / nbins)
               : kmin + (kmax - kmin) * i / nbins;
    if (i == nbins)
      e = kmax;   /* exact ends */
    edges[i] = e;
  }
  for (i = 0; i < nbins; i++) {
    int st = bl_target_kintegral_e(t, BL_TARGET_DK, 0.0, edges[i],
                                   edges[i + 1], q, &out[i], NULL);
    out[i].r.val *= perunit;
    out[i].r.err *= perunit;
    out[i].r.sys *= perunit;
    if (st != BL_SUCCESS && !bl_status_soft(st)) {
      if (failbin != NULL)
        *failbin = i;
      return st;
    }
  }
  return BL_SUCCESS;
}


double bl_work_estimate (double rtol, int nelem, double n, double share) {
  /* integrand calls of one dsigma/dk point at tolerance rtol: measured
  ** mean over electrons and muons on Pb, T = 1 MeV..100 GeV, y =
  ** 0.01..0.99, default options: 7.4e3 at rtol 1e-2, 9.8e3 at 1e-4,
  ** 2.6e4 at 1e-8, 9.1e4 at 1e-12 */
  double point = 4.5e3 * pow(10.0, 0.11 * -log10(rtol));
  return share * point * nelem * n;
}


double bl_work_kintegral (double rtol) {
  /* energy_loss of electrons on Pb at T = 100 MeV, method born, one core:
  ** 0.041 s at rtol 1e-3, 0.086 s at 1e-5, 0.29 s at 1e-7; divided by the
  ** cost of a point above (x 2.75 from 1e-3 to 1e-7) that is 2.6 times
  ** the points at 1e-7: 10^0.1 per decade */
  double dec = rtol > 0.0 ? -log10(rtol) - 3.0 : 0.0;
  return BL_WORK_KINTEGRAL * pow(10.0, 0.1 * (dec > 0.0 ? dec : 0.0));
}
