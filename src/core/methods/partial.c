/*
** partial.c -- method "partial": dsigma/dk of a spin-1/2 projectile of
** the electron mass from the exact partial waves of the partial-wave room
** (partial/dsdk.h) in the case's screened field, plus the atomic
** electrons' part as the Born room gives it
** See Copyright Notice in LICENSE
**
** The field.  bl_pw_dsdk takes the potential of partial/internal.h:
** zza = z Z alpha times the nucleus (a uniform sphere of the case's
** radius c->R, or a point) screened by the case's model in its Yukawa
** form (c->screening->yukawa).  Its Fourier transform is the Born core's
** elastic charge (Z F_N - F)/q^2, so the partial waves replace the Born
** value of the elastic part (Z F_N - F)^2 and nothing else: to all
** orders in z Z alpha, first order in the photon field (Tseng & Pratt
** 1971, Phys. Rev. A 3, 100; DEVELOPERS.md, "Partial waves: dsigma/dk").
** Beyond the cut radius rc the field is dropped: its tail
** |zza| sum |a_i| E1(c_i rc) is at most PW_CUT |zza| (bl_pwpot_init).
**
** The atomic electrons.  Their own part (S(q), for e-/e+ scaled to the
** bound electron term by bl_case_eratio) is not a static field, and the
** partial waves do not hold it: it is added as Born with the electrons
** minus Born without them at the same k, the way the distorted-wave
** method adds it (distorted/dcs.c, screened()), and BL_WARN_EBORN says so.
** The incoherent nucleus (BL_NUCLEUS_INCOHERENT) is refused: it is no
** static field either, and below BL_PARTIAL_T_MAX its share is small
** (transfers of the nucleon scale are out of reach).
**
** Soft photons.  Below k = BL_PARTIAL_SOFT_Y T the partial waves' cost
** and memory grow like T/k; there the elastic part is its Born value
** times the partial-wave/Born ratio at that k (soft() below).
**
** No Elwert factor and no Coulomb correction: the waves hold the whole
** Coulomb field.  The switches of the case (opts.elwert, opts.coulomb)
** are ignored, as by the distorted waves.
*/

#include <math.h>
#include <stdarg.h>
#include <stdio.h>
#include <string.h>

#include "methods/internal.h"
#include "partial/dsdk.h"


/* The cut of the field, relative to |zza| (the choice of
** tests/test_pwdsdk.c).  Measured, e-/e+ on C and Cu at 10 keV, y = 0.5,
** rtol 1e-4: 1e-6 moves the value by up to 3e-8 relative, 1e-12 by below
** 1e-10 (print precision), at 10-25 % more time than 1e-6 (the waves are
** followed to rc). */
#define PW_CUT 1e-9

/* The electron part's Born integrals are asked this much tighter than the
** point: their difference is a share of the value and its error the sum
** of theirs. */
#define EPART_TIGHTEN 0.25

_Static_assert(sizeof(bl_pwpot) <= sizeof(((bl_he *)0)->pw),
               "bl_he.pw too small for bl_pwpot: raise BL_PW_FIELD_SIZE");


/* Write a message (printf style) when msg is not NULL; return code. */
static int refuse (char *msg, size_t size, const char *fmt, ...)
  __attribute__((format(printf, 3, 4)));

static int refuse (char *msg, size_t size, const char *fmt, ...) {
  va_list ap;
  if (msg != NULL && size > 0) {
    va_start(ap, fmt);
    vsnprintf(msg, size, fmt, ap);
    va_end(ap);
  }
  return BL_EDOMAIN;
}


int bl_partial_check (const bl_particle *p, int Z, double T,
                      const bl_opts *o, char *msg, size_t size) {
  const char *name;
  if (msg != NULL && size > 0)
    msg[0] = '\0';
  if (o == NULL)
    o = &bl_opts_bare;
  if (p == NULL)
    return refuse(msg, size, "particle is NULL");
  name = p->name != NULL ? p->name : "particle";
  if (p->spin != 0.5)
    return refuse(msg, size, "particle '%s' has spin %g; method 'partial' "
                  "takes spin-1/2 projectiles of the electron mass (e-, e+, "
                  "or a mass within %g MeV of %.11g MeV, any charge)", name,
                  p->spin, BL_PARTIAL_MASS_TOL, BL_ME_MEV);
  if (!(fabs(p->mass - BL_ME_MEV) <= BL_PARTIAL_MASS_TOL))
    return refuse(msg, size, "particle '%s' has mass %.11g MeV; method "
                  "'partial' takes spin-1/2 projectiles of the electron mass "
                  "(a mass within %g MeV of %.11g MeV, any charge)", name,
                  p->mass, BL_PARTIAL_MASS_TOL, BL_ME_MEV);
  if (!(p->charge != 0.0) || !isfinite(p->charge))
    return refuse(msg, size, "particle '%s' has charge %g; method 'partial' "
                  "takes a nonzero finite charge", name, p->charge);
  if (!(T > 0.0 && T <= BL_PARTIAL_T_MAX))
    return refuse(msg, size, "T = %.14g MeV; method 'partial' allows T in "
                  "(0, %g] MeV (its cost grows like T: seconds per point "
                  "at 1 MeV)", T, BL_PARTIAL_T_MAX);
  if (Z < 1 || Z > 100)
    return refuse(msg, size, "Z = %d; allowed 1..100", Z);
  if (o->nucleus == BL_NUCLEUS_INCOHERENT)
    return refuse(msg, size, "nucleus 'uniform+incoherent'; method "
                  "'partial' takes nucleus 'uniform' or 'point' (the "
                  "incoherent part is no static field)");
  if (o->nucleus == BL_NUCLEUS_POINT
      && !(fabs(p->charge * Z * BL_ALPHA) < 1.0))
    return refuse(msg, size, "|z Z alpha| = %.6g for '%s' on Z = %d with a "
                  "point nucleus; method 'partial' needs |z Z alpha| < 1 "
                  "there (the waves kappa = -+1); allowed: nucleus "
                  "'uniform'", fabs(p->charge * Z * BL_ALPHA), name, Z);
  return BL_SUCCESS;
}


/* The field of case c into v (partial/internal.h). */
static int field (const bl_case *c, bl_pwpot *v) {
  bl_yukawa y;
  double zza = c->particle.charge * c->Z * BL_ALPHA;
  int st;
  if (c->screening == NULL || c->screening->yukawa == NULL)
    return BL_EMODEL;
  st = c->screening->yukawa(c->Z, c->params, &y);
  if (st != BL_SUCCESS)
    return st;
  return bl_pwpot_init(v, zza, &y, c->particle.mass,
                       c->opts.nucleus == BL_NUCLEUS_POINT ? 0.0 : c->R,
                       PW_CUT * fabs(zza));
}


/*
** bl_method_prepare's part for "partial": the field of case c into h
** (h->pwready), if bl_partial_check takes the case; h is left as it is
** otherwise.  Status of the field's construction.
*/
int bl_partial_prepare (const bl_case *c, bl_he *h) {
  bl_pwpot v;
  int st;
  if (bl_partial_check(&c->particle, c->Z, c->T, &c->opts, NULL, 0)
      != BL_SUCCESS)
    return BL_SUCCESS;   /* refused point by point, with the message */
  st = field(c, &v);
  if (st != BL_SUCCESS)
    return st;
  memcpy(h->pw, &v, sizeof v);
  h->pwready = 1;
  return BL_SUCCESS;
}


/* A soft failure (a best estimate) is kept unless a hard one comes. */
static int worse (int st, int s2) {
  if (st == BL_SUCCESS || (s2 != BL_SUCCESS && !bl_status_soft(s2)))
    return s2 == BL_SUCCESS ? st : s2;
  return st;
}


int bl_partial_epart_e (const bl_case *c, double k, bl_quad *q,
                        bl_result *out) {
  bl_case ca, cn;
  bl_result ra, rn;
  double rtol;
  int st;
  if (out == NULL)
    return BL_EDOMAIN;
  bl_method_clear(out, BL_METHOD_BORN);
  bl_method_clear(&ra, BL_METHOD_BORN);
  bl_method_clear(&rn, BL_METHOD_BORN);
  if (c == NULL || q == NULL)
    return BL_EDOMAIN;
  if (!c->opts.electrons || !(bl_case_eratio(c, k) > 0.0))
    return BL_SUCCESS;
  st = bl_method_nuclear(c, &cn);
  if (st != BL_SUCCESS)
    return st;
  ca = *c;
  ca.opts.elwert = ca.opts.coulomb = BL_APPLY_OFF;
  cn.opts.elwert = cn.opts.coulomb = BL_APPLY_OFF;
  rtol = bl_quad_rtol(q);
  bl_quad_set_rtol(q, fmax(EPART_TIGHTEN * rtol, BL_QUAD_RTOL_MIN));
  st = bl_dcs_dk_e(&ca, k, q, &ra);
  if (st == BL_SUCCESS || bl_status_soft(st))
    st = worse(st, bl_dcs_dk_e(&cn, k, q, &rn));
  bl_quad_set_rtol(q, rtol);
  if (st != BL_SUCCESS && !bl_status_soft(st))
    return st;
  out->val = ra.val - rn.val;
  out->err = ra.err + rn.err;
  out->warn = (ra.warn | rn.warn) & BL_WARN_TOLERANCE;
  return st;
}


/* The elastic part by Born at k into r: case cn (the nucleus and the
** screened field alone, no Elwert factor or Coulomb correction). */
static int bornel (const bl_case *cn, double k, bl_quad *q, bl_result *r) {
  int st = bl_dcs_dk_e(cn, k, q, r);
  if ((st == BL_SUCCESS || bl_status_soft(st)) && !(r->val > 0.0))
    return BL_ENONFINITE;   /* no ratio to take */
  return st;
}


/*
** Below k_s = BL_PARTIAL_SOFT_Y T: the elastic part is B(k) R(k_s), B
** its Born value, R = PW/B the partial waves' ratio at k_s.  The cost of a
** partial-wave point grows like T/k (the radial grid reaches 4/q_min and
** the l sum p/q_min; measured, e- on C at 10 keV: 1.2 s at y = 0.05, 6 s
** and 40 MB at 0.01, 13 s and 75 MB at 0.005, 3.5 GB within 20 s at 1e-4),
** so small k are out of reach; by Low's theorem (Low 1958, Phys. Rev.
** 110, 974: the soft factor times an elastic cross section) R tends to a
** constant as k -> 0.  Measured PW/B of the elastic part, 10 keV: e- on C
** 1.062, 1.031, 1.020, 1.017 at y = 0.2, 0.1, 0.05, 0.02; e+ on Cu 0.507,
** 0.593, 0.621, 0.631.  The change of R from k_2 = BL_PARTIAL_SOFT_Y2 T to
** k_s, continued linearly in ln k down to k, is sys (an overestimate if
** R flattens, as it does above).  Into *val, *err, *sys; status.
*/
static int soft (const bl_case *c, const bl_case *cn, const bl_pwpot *v,
                 double k, double rtol, bl_quad *q, double *val, double *err,
                 double *sys) {
  bl_result bk, bs, b2;
  double ks = BL_PARTIAL_SOFT_Y * c->T, k2 = BL_PARTIAL_SOFT_Y2 * c->T;
  double vs = 0.0, es = 0.0, v2 = 0.0, e2 = 0.0, rs, r2;
  int st, s2;
  bl_method_clear(&bk, BL_METHOD_BORN);
  bl_method_clear(&bs, BL_METHOD_BORN);
  bl_method_clear(&b2, BL_METHOD_BORN);
  st = bl_pw_dsdk(v, c->particle.mass, c->particle.charge, c->T, ks, rtol,
                  &vs, &es);
  if (st != BL_SUCCESS && !bl_status_soft(st))
    return st;
  s2 = bl_pw_dsdk(v, c->particle.mass, c->particle.charge, c->T, k2, rtol,
                  &v2, &e2);
  st = worse(st, s2);
  if (st == BL_SUCCESS || bl_status_soft(st))
    st = worse(st, bornel(cn, ks, q, &bs));
  if (st == BL_SUCCESS || bl_status_soft(st))
    st = worse(st, bornel(cn, k2, q, &b2));
  if (st == BL_SUCCESS || bl_status_soft(st))
    st = worse(st, bornel(cn, k, q, &bk));
  if ((st != BL_SUCCESS && !bl_status_soft(st)) || !(bs.val > 0.0)
      || !(b2.val > 0.0))
    return st != BL_SUCCESS && !bl_status_soft(st) ? st : BL_ENONFINITE;
  rs = vs / bs.val;
  r2 = v2 / b2.val;
  *val = rs * bk.val;
  *err = rs * bk.err + bk.val * (es + rs * bs.err) / bs.val;
  *sys = bk.val * fabs(rs - r2) * log(ks / k) / log(k2 / ks);
  return st;
}


/*
** The partial-wave value of the elastic part (the field from h, or made
** here) at the workspace's tolerance clamped to the sums' range (below
** BL_PARTIAL_SOFT_Y T: soft()), plus the electron part
** (bl_partial_epart_e), flagged BL_WARN_EBORN where it is not 0.  The
** errors add; the tolerance warning where the sums did not converge
** (BL_ENOTCONV, the value kept) or the error exceeds q's rtol.
*/
int bl_partial_dk_e (const bl_case *c, const bl_he *h, double k,
                     bl_quad *q, bl_result *out) {
  bl_pwpot v;
  bl_result re;
  double rq, rtol, val = 0.0, err = 0.0, sys = 0.0;
  int st, se;
  if (out == NULL)
    return BL_EDOMAIN;
  bl_method_clear(out, BL_METHOD_PARTIAL);
  if (c == NULL || q == NULL || !(k > 0.0 && k < c->T))
    return BL_EDOMAIN;
  st = bl_partial_check(&c->particle, c->Z, c->T, &c->opts, NULL, 0);
  if (st != BL_SUCCESS)
    return st;
  if (h != NULL && h->pwready)
    memcpy(&v, h->pw, sizeof v);
  else if ((st = field(c, &v)) != BL_SUCCESS)
    return st;
  rq = bl_quad_rtol(q);
  rtol = fmin(fmax(rq, BL_PARTIAL_RTOL_MIN), BL_PARTIAL_RTOL_MAX);
  if (k < BL_PARTIAL_SOFT_Y * c->T) {
    bl_case cn;
    st = bl_method_nuclear(c, &cn);
    if (st != BL_SUCCESS)
      return st;
    cn.opts.elwert = cn.opts.coulomb = BL_APPLY_OFF;
    st = soft(c, &cn, &v, k, rtol, q, &val, &err, &sys);
    out->warn |= BL_WARN_PWSOFT;
  }
  else
    st = bl_pw_dsdk(&v, c->particle.mass, c->particle.charge, c->T, k, rtol,
                    &val, &err);
  if (st != BL_SUCCESS && !bl_status_soft(st)) {
    out->warn = 0;
    return st;
  }
  out->val = val;
  out->err = err;
  out->sys = sys;
  out->warn |= c->warn;
  if (st != BL_SUCCESS)
    out->warn |= BL_WARN_TOLERANCE;
  se = bl_partial_epart_e(c, k, q, &re);
  if (se != BL_SUCCESS && !bl_status_soft(se))
    return se;
  st = worse(st, se);
  if (re.val != 0.0)
    out->warn |= BL_WARN_EBORN | (re.warn & BL_WARN_TOLERANCE);
  out->val += re.val;
  out->err += re.err;
  if (out->err > rq * fabs(out->val))
    out->warn |= BL_WARN_TOLERANCE;
  if (!isfinite(out->val) || !isfinite(out->err) || !isfinite(out->sys))
    return BL_ENONFINITE;
  return st;
}
