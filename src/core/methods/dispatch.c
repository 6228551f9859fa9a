/*
** dispatch.c -- the methods of dsigma/dk by name and id, the choice of
** method "auto", and the photon energies where a result jumps
** See Copyright Notice in LICENSE
*/

#include <math.h>
#include <string.h>
#include <strings.h>

#include "ebrems/table.h"
#include "methods/internal.h"


int bl_method_prepare (const bl_case *c, int method, bl_quad *q, bl_he *h) {
  if (h == NULL)
    return BL_EDOMAIN;
  memset(h, 0, sizeof *h);
  if (c == NULL)
    return BL_EDOMAIN;
  if (method == BL_METHOD_HIGH_ENERGY
      || (method == BL_METHOD_AUTO && 1.0 + c->t0 > bl_he_gamma_min(c)))
    return bl_he_prepare(c, q, h);
  if (method == BL_METHOD_PARTIAL)
    return bl_partial_prepare(c, h);
  return BL_SUCCESS;
}


void bl_method_cache_clear (void) {
  bl_hetab_clear();
}


size_t bl_method_cache_count (void) {
  return bl_hetab_count();
}


/*
** The closed forms' error is that of their tables; where the value has
** nearly cancelled (a method forced far outside its range) it can exceed
** the requested tolerance, and then the result says so, as a Born point
** does (src/core/born/dcs.c, tolcheck).
*/
static int closedform (int st, const bl_quad *q, bl_result *out) {
  if (st == BL_SUCCESS && q != NULL && !(out->warn & BL_WARN_CLAMPED)
      && out->err > bl_quad_rtol(q) * fabs(out->val))
    out->warn |= BL_WARN_TOLERANCE;
  return st;
}


static int dk_exact (const bl_case *c, const bl_he *h, int method, double k,
                     bl_quad *q, bl_result *out);

int bl_method_dk_e (const bl_case *c, const bl_he *h, int method, double k,
                    bl_quad *q, bl_result *out) {
  if (out == NULL)
    return BL_EDOMAIN;
  if (bl_quad_stopped(q)) {      /* interrupted: nothing computed */
    bl_method_clear(out, BL_METHOD_BORN);
    return BL_EINTR;
  }
  if (c != NULL && c->ebexact && c->ekmax > 0.0 && c->opts.electrons
      && q != NULL)
    return dk_exact(c, h, method, k, q, out);
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
      return bl_dw_dk_e(c, k, q, out);
    case BL_METHOD_DISTORTED:
      return bl_dw_dk_e(c, k, q, out);
    case BL_METHOD_PARTIAL:
      return bl_partial_dk_e(c, h, k, q, out);
    default:
      bl_method_clear(out, BL_METHOD_BORN);
      return BL_EDOMAIN;
  }
}


int bl_method_eexact (const bl_case *c) {
  double tmax;
  if (c == NULL || c->ebt == 0 || !c->opts.electrons)
    return 0;
  tmax = c->ebt - 1 < BL_EBT_MUON ? BL_EBREMS_T_MAX_E : BL_EBREMS_T_MAX;
  return c->T <= tmax;
}


int bl_method_nuclear (const bl_case *c, bl_case *cn) {
  bl_opts o;
  if (c == NULL || cn == NULL)
    return BL_EDOMAIN;
  o = c->opts;
  o.electrons = 0;
  return bl_case_setup(cn, &c->particle, c->Z, c->screening, c->params, c->T,
                       &o);
}


int bl_method_eshape (const bl_case *c, double k) {
  double r;
  if (c == NULL || c->ebt == 0 || !c->opts.electrons)
    return 0;
  r = bl_case_eratio(c, k);
  return r > 0.0 && fabs(r - 1.0) > BL_ESHAPE_R;
}


/* The angular distribution by the method alone, the electron part as the
** case has it: "auto" is the distorted waves there, "partial" has none
** (BL_EDOMAIN), every other method gives Born's. */
int bl_method_angular_scaled_e (const bl_case *c, int method, double k,
                                double theta_k, bl_quad *q, bl_result *out) {
  if (method == BL_METHOD_PARTIAL) {   /* dsigma/dk only */
    if (out != NULL)
      bl_method_clear(out, method);
    return BL_EDOMAIN;
  }
  if (method == BL_METHOD_DISTORTED || method == BL_METHOD_AUTO)
    return bl_dw_angular_e(c, k, theta_k, q, out);
  return bl_dcs_angular_e(c, k, theta_k, q, out);
}


/* The more serious of two statuses: a hard failure before a soft one
** before success. */
static int worse (int a, int b) {
  if (a != BL_SUCCESS && !bl_status_soft(a))
    return a;
  if (b != BL_SUCCESS && !bl_status_soft(b))
    return b;
  return a != BL_SUCCESS ? a : b;
}


int bl_method_eterm (const bl_case *c, bl_ebrems *e) {
  if (bl_ebrems_init(e, &c->particle, c->T) != BL_SUCCESS
      || bl_ebrems_set_binding(e, c->Z, c->screening, c->params)
         != BL_SUCCESS)
    return BL_EDOMAIN;   /* bl_method_eexact and the case's model vouch */
  if (c->opts.eradiation == BL_ERAD_PROJECTILE)
    e->radiate = BL_EBREMS_RAD_PROJECTILE;   /* set up refuses it for e+- */
  return BL_SUCCESS;
}



/* Z times the exact bound electron term of case c at photon energy k,
** its angular distribution at *theta_k or (theta_k NULL) dsigma/dk, at the
** relative tolerance rtol into re (q's own tolerance restored). */
static int eterm (const bl_case *c, double k, const double *theta_k,
                  double rtol, bl_quad *q, bl_result *re) {
  bl_ebrems e;
  double rq = bl_quad_rtol(q);
  int st;
  memset(re, 0, sizeof *re);
  if (bl_method_eterm(c, &e) != BL_SUCCESS)
    return BL_EDOMAIN;
  st = bl_quad_set_rtol(q, rtol);
  if (st == BL_SUCCESS)
    st = theta_k != NULL ? bl_ebrems_angular_e(&e, k, *theta_k, q, re)
                         : bl_ebrems_dk_e(&e, k, q, re);
  bl_quad_set_rtol(q, rq);
  re->val *= c->Z;
  re->err *= c->Z;
  return st;
}


/* The loosest tolerance asked of the electron part (its share of the
** value sets it below that). */
#define ERTOL_MAX 1e-2

/*
** Add the exact electron part (eterm) to the nuclear part in out (status
** st), at photon energy k, angle *theta_k (NULL: dsigma/dk).  rs (status
** ss) is the value with the electron part as the table or the static
** shape has it: the share's first estimate, which sets the electron
** part's tolerance (rtol / share, at most ERTOL_MAX); where its error then
** exceeds what rtol of the sum leaves (the estimate put less of it here),
** it is computed once more at what its measured share needs.
*/
static int addexact (const bl_case *c, double k, const double *theta_k,
                     bl_quad *q, int st, int ss, const bl_result *rs,
                     bl_result *out) {
  bl_result re;
  double rtol = bl_quad_rtol(q), share, et, room;
  int se;
  share = (ss == BL_SUCCESS || bl_status_soft(ss)) && rs->val > 0.0
          ? fmax(1.0 - out->val / rs->val, 0.0) : 1.0;
  et = share > rtol / ERTOL_MAX ? fmax(rtol, rtol / share) : ERTOL_MAX;
  se = eterm(c, k, theta_k, et, q, &re);
  if (se != BL_SUCCESS && !bl_status_soft(se))
    return se;
  room = rtol * fabs(out->val + re.val) - out->err;
  if (et > rtol && re.val > 0.0 && re.err > room)
    se = eterm(c, k, theta_k, fmax(rtol, 0.8 * room / re.val), q, &re);
  st = worse(st, se);
  if (st != BL_SUCCESS && !bl_status_soft(st))
    return st;
  out->val += re.val;
  out->err += re.err;
  out->warn |= re.warn & BL_WARN_TOLERANCE;
  return st;
}


/*
** Where the bound electron term is wired (bl_method_eexact): the nuclear
** part by the method (the case set up again without the electrons), the
** electron part exact, Z times d2sigma/(dk dOmega_k) of the projectile on
** one bound electron of Z (bl_ebrems_angular_e, all diagrams, binding by
** the case's own S(q)/Z): its angular shape is the process's own, not the
** static term's scaled by R(k) (which, for a muon's soft photons, put 8 to
** 67 times too much of it along the beam).  Its integral over the photon
** direction is bl_ebrems_dk_e, which the table of R reproduces to its
** interpolation error (DEVELOPERS.md, "Wired in").  0 from the end point
** k_max on.  The electron part is asked for rtol only relative to the
** whole value: its share, first estimated from the static shape (the
** case's own value, R(k) times the static term), sets its tolerance (at
** most ERTOL_MAX); where the errors then exceed rtol of the sum, it is
** computed again at the tolerance its measured share needs.
*/
int bl_method_angular_e (const bl_case *c, int method, double k,
                         double theta_k, bl_quad *q, bl_result *out) {
  bl_case cn;
  bl_result rs;
  int st, ss;
  if (!bl_method_eexact(c) || q == NULL || method == BL_METHOD_PARTIAL)
    return bl_method_angular_scaled_e(c, method, k, theta_k, q, out);
  st = bl_method_nuclear(c, &cn);
  if (st != BL_SUCCESS)
    return st;
  st = bl_method_angular_scaled_e(&cn, method, k, theta_k, q, out);
  if ((st != BL_SUCCESS && !bl_status_soft(st)) || !(k < c->ekmax))
    return st;
  /* the static shape: the share's first estimate */
  ss = bl_method_angular_scaled_e(c, method, k, theta_k, q, &rs);
  return addexact(c, k, &theta_k, q, st, ss, &rs, out);
}


/*
** dsigma/dk where the table of other projectiles is held (c->ebexact:
** mass above BL_EBH_M_MAX or T/m below BL_EBH_TAU_MIN): the method's value
** with the electron part off (the case with k_max = 0, where every method
** scales that part by bl_case_eratio = 0), plus Z times bl_ebrems_dk_e at
** the tolerance its share needs (the held value's share first).  The held
** ratio was 7-49 % high for masses of 30 GeV - 1 TeV on carbon, where the
** struck electron's radiation is 10^6-10^12 times the static term
** (DEVELOPERS.md, "Other projectiles").
*/
static int dk_exact (const bl_case *c, const bl_he *h, int method, double k,
                     bl_quad *q, bl_result *out) {
  bl_case cn = *c;
  bl_result rs;
  int st, ss;
  cn.ekmax = 0.0;
  st = bl_method_dk_e(&cn, h, method, k, q, out);
  if ((st != BL_SUCCESS && !bl_status_soft(st)) || !(k < c->ekmax))
    return st;
  cn.ebexact = 0;
  cn.ekmax = c->ekmax;   /* the held table: the share's first estimate */
  ss = bl_method_dk_e(&cn, h, method, k, q, &rs);
  return addexact(c, k, NULL, q, st, ss, &rs, out);
}


int bl_method_full_scaled_e (const bl_case *c, int method, double k,
                             double theta_k, double theta_p, double phi,
                             bl_result *out) {
  if (method == BL_METHOD_PARTIAL) {   /* dsigma/dk only */
    if (out != NULL)
      bl_method_clear(out, method);
    return BL_EDOMAIN;
  }
  if (method == BL_METHOD_DISTORTED || method == BL_METHOD_AUTO)
    return bl_dw_full_e(c, k, theta_k, theta_p, phi, out);
  return bl_dcs_full_e(c, k, theta_k, theta_p, phi, out);
}


/*
** Where the bound electron term is wired (bl_method_eexact): the nuclear
** part by the method (the case without its electrons) plus Z times the
** exact term's own fully differential value at the same photon and the
** same projectile direction (bl_ebrems_full: the projectile's energy and
** the struck electron's momentum from conservation; for e- the faster
** electron at theta_p), 0 from the end point k_max on.  Its integral over
** the projectile's direction is the exact angular distribution.
*/
int bl_method_full_e (const bl_case *c, int method, double k, double theta_k,
                      double theta_p, double phi, bl_result *out) {
  bl_case cn;
  bl_ebrems e;
  double v;
  int st, se;
  if (c == NULL || !bl_method_eexact(c) || method == BL_METHOD_PARTIAL)
    return bl_method_full_scaled_e(c, method, k, theta_k, theta_p, phi, out);
  st = bl_method_nuclear(c, &cn);
  if (st != BL_SUCCESS) {
    bl_method_clear(out, method);
    return st;
  }
  st = bl_method_full_scaled_e(&cn, method, k, theta_k, theta_p, phi, out);
  if (st != BL_SUCCESS && !bl_status_soft(st))
    return st;
  if (!(k < c->ekmax))
    return st;
  se = bl_method_eterm(c, &e);
  if (se == BL_SUCCESS)
    se = bl_ebrems_full(&e, k, theta_k, theta_p, phi, &v);
  if (se != BL_SUCCESS)
    return se;
  out->val += c->Z * v;
  return st;
}


int bl_method_breaks (const bl_case *c, const bl_he *h, int method,
                      double *k, double *jump, int nmax) {
  double m, E0;
  int n = 0;
  if (c == NULL || k == NULL || jump == NULL)
    return 0;
  m = c->particle.mass;
  E0 = 1.0 + c->t0;
  /* the Coulomb correction (a few per cent near the tip, up to 10 % on
  ** the heaviest atoms) stops where the final gamma falls below
  ** BL_COULOMB_GAMMA_MIN */
  if (c->opts.coulomb == BL_APPLY_AUTO && bl_coulomb_case_auto(c)
      && n < nmax && method == BL_METHOD_BORN) {
    k[n] = bl_coulomb_kend(c);
    jump[n++] = 0.1;
  }
  /* the bound electron term of e-/e+/mu-/mu+ (bl_case_eratio) falls to 0
  ** between the last node of its table and the end point on a free
  ** electron (src/core/ebrems/table.c, tip(), tip_mu()): two kinks, of at
  ** most the electron share 1/(Z + 1) there */
  if (c->ebt != 0 && c->ekmax < c->T && n + 2 <= nmax) {
    k[n] = c->ekmax;
    jump[n++] = 1.0 / (c->Z + 1.0);
    k[n] = c->ekmax * bl_ebt_ulast(c->ebt - 1);
    jump[n++] = 1.0 / (c->Z + 1.0);
  }
  /* "auto" changes method at the final gamma bl_he_gamma_min (within 1e-3) */
  if (method == BL_METHOD_AUTO && h != NULL && h->ready
      && E0 > bl_he_gamma_min(c) && n < nmax) {
    k[n] = (E0 - bl_he_gamma_min(c)) * m;
    jump[n++] = 1e-3;
  }
  return n;
}


static const char *const method_names[BL_METHOD_COUNT] = {
  "born", "high-energy", "complete", "auto", "distorted", "partial"
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


void bl_method_clear (bl_result *out, int method) {
  out->val = out->err = out->sys = 0.0;
  out->warn = out->applied = 0;
  out->method = method;
}
