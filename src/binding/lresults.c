/*
** $Id: lresults.c $
** Computing and results of the Lua binding: the call's workspace and
** target (bl_target of the core), the collection of warnings over the
** points of a call and their texts, the settings and units tables.
** See Copyright Notice in LICENSE
*/

#include <float.h>
#include <math.h>
#include <stdarg.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include "lbl_internal.h"


/*
** The state's integration workspace (upvalue 1 of every library
** function), set to the tolerance of *o.
*/
bl_quad *lbl_getquad (lua_State *L, const Opts *o) {
  LQuad *lq = (LQuad *)luaL_testudata(L, lua_upvalueindex(1), QUADMETA);
  int st;
  if (lq == NULL || lq->q == NULL)
    luaL_error(L, "%s: the integration workspace of brakelight is closed",
               o->fname);
  bl_quad_set_stop(lq->q, lbl_stopflag());   /* lbl_interrupt stops it */
  st = bl_quad_set_rtol(lq->q, o->rtol);
  if (st != BL_SUCCESS)
    lbl_fail(L, "%s: the core refused rtol = %g: %s", o->fname, o->rtol,
         bl_strerror(st));
  return lq->q;
}


/*
** Set the shared workspace to this call's tolerance right before a core
** computation.  Between two computations the binding allocates Lua
** objects, and a collection may run a finalizer that calls this module
** again with another tolerance (the nested call is complete before this
** one resumes; the GSL workspaces are used inside core calls only).
*/
void lbl_retol (const Opts *o, bl_quad *q) {
  if (q != NULL)
    bl_quad_set_rtol(q, o->rtol);   /* checked by lbl_readopts: cannot fail */
}


/*
** The target of a call: a core bl_target (the cases of every element,
** the method's tables, the suppression) in a userdata, so that the
** collector releases it on any error.
*/
int lbl_target_gc (lua_State *L) {
  bl_target *t = (bl_target *)luaL_checkudata(L, 1, TARGETMETA);
  bl_target_release(t);
  return 0;
}


/* Push a new target for *o, set up and prepared with q (NULL: set up
** only); raises if the core refuses an element. */
bl_target *lbl_maketarget (lua_State *L, Opts *o, bl_quad *q) {
  bl_target *t = (bl_target *)lua_newuserdatauv(L, sizeof *t, 0);
  int st, Z;
  memset(t, 0, sizeof *t);
  luaL_setmetatable(L, TARGETMETA);
  st = bl_target_setup(t, &o->particle, &o->target, o->screening, NULL, o->T,
                       &o->bo, o->method, &o->sup, &Z);
  if (st != BL_SUCCESS)
    lbl_fail(L, "%s: cannot set up %s on Z = %d at T = %g MeV with "
             "screening '%s': %s", o->fname, o->particle.name, Z, o->T,
             o->screening->name, bl_strerror(st));
  if (q != NULL) {
    st = bl_target_prepare(t, q, &Z);
    if (st != BL_SUCCESS)
      lbl_fail(L, "%s: cannot prepare method '%s' for %s on Z = %d at "
               "T = %g MeV: %s", o->fname, bl_method_name(o->method),
               o->particle.name, Z, o->T, bl_strerror(st));
  }
  return t;
}


/*
** Accept a core result or raise: a soft status is a result with the
** tolerance warning (set by the core); any other failure, and any
** non-finite value or error, is a Lua error with the numbers.  `where`
** describes the point ("k = 5 MeV"); r is the estimate to report.
*/
void lbl_checkresult (lua_State *L, const Opts *o, int st,
                      const bl_result *r, const char *where) {
  if (st == BL_EINTR)
    lbl_fail(L, "%s: interrupted by signal %d (stopped at %s; the points of "
             "this call are not returned: a scan, brakelight.scan, keeps "
             "every finished point)", o->fname, (int)*lbl_stopflag(), where);
  if (st != BL_SUCCESS && st != BL_ENONFINITE && !bl_status_soft(st))
    lbl_fail(L, "%s: %s for %s on Z = %d at T = %g MeV, %s (estimate %g +- %g)",
         o->fname, bl_strerror(st), o->particle.name, o->Z, o->T, where,
         r->val, r->err);
  if (st == BL_ENONFINITE || !isfinite(r->val) || !isfinite(r->err))
    lbl_fail(L, "%s: non-finite result %g +- %g for %s on Z = %d at T = %g MeV, "
         "%s (please report this case)", o->fname, r->val, r->err,
         o->particle.name, o->Z, o->T, where);
}


/* Start a collection with the target's own warnings. */
void lbl_initwarn (Warnings *w, const bl_target *t) {
  memset(w, 0, sizeof *w);
  w->bits = t->warn;
  w->kborn = -1;
  w->minsup = 1.0;
  w->t = t;
}


/* Add one point's result, computed at photon energy k, described by `at`. */
void lbl_addwarn (Warnings *w, const bl_result *r, double k,
                  const char *at) {
  int i;
  w->npts++;
  w->bits |= r->warn;
  w->applied |= r->applied;
  if (r->warn & BL_WARN_TOLERANCE) {
    double rel = r->val != 0 ? r->err / fabs(r->val) : HUGE_VAL;
    w->ntol++;
    if (w->ntol == 1 || rel > w->worst) {
      w->worst = rel;
      snprintf(w->worstat, sizeof w->worstat, "%s", at);
    }
  }
  if ((r->warn & BL_WARN_BORN) && k > w->kborn)
    w->kborn = k;
  if (k > w->kseen)
    w->kseen = k;
  for (i = 0; i < BL_WARN_COUNT; i++)
    if ((r->warn & (1u << i)) && k > w->kbit[i])
      w->kbit[i] = k;
  if (r->warn & BL_WARN_CLAMPED) {
    if (w->nclamp++ == 0 || k < w->kclamp)
      w->kclamp = k;
  }
  if (r->val != 0.0 && r->sys / fabs(r->val) > w->sysrel) {
    w->sysrel = r->sys / fabs(r->val);
    snprintf(w->sysat, sizeof w->sysat, "%s", at);
  }
}


/*
** Take what a target result gathered over its elements into the call's
** record: the Born element, the smallest suppression factor, the methods
** used, and the element the messages name.
*/
void lbl_addtarget (Opts *o, Warnings *w, const bl_tresult *tr) {
  if (tr->zborn > w->zborn)
    w->zborn = tr->zborn;
  if (tr->supp < w->minsup)
    w->minsup = tr->supp;
  if (tr->eshare > w->eshare)
    w->eshare = tr->eshare;
  if (tr->eborn > w->eborn)
    w->eborn = tr->eborn;
  o->used |= tr->used;
  o->Z = tr->Z;
}


/*
** One point of the target (bl_target_point_e) with the call's record;
** raises on a hard failure.
*/
void lbl_computepoint (lua_State *L, Opts *o, const bl_target *t, int kind,
                       double k, double theta_k, double theta_p,
                       double phi, bl_quad *q, Warnings *w,
                       const char *at, bl_result *sum) {
  bl_tresult tr;
  int st;
  lbl_retol(o, q);
  st = bl_target_point_e(t, kind, k, theta_k, theta_p, phi, q, &tr);
  o->Z = tr.Z;
  if (st != BL_SUCCESS && !bl_status_soft(st))
    lbl_checkresult(L, o, st, &tr.fail, at);
  lbl_addtarget(o, w, &tr);
  *sum = tr.r;
  lbl_addwarn(w, sum, k, at);
}


/* Rtol of the exact-Born evaluations that size a warning: they say how
** large an effect is, to a per cent or so, not the value itself. */
#define SIZE_RTOL 1e-3

/*
** The photon energy at which a warning's size is measured: the middle of
** an integral's window, else the largest k of the points flagged (kflag,
** 0: none), else of all points, else T/2; below the tip, where the Born
** value vanishes.
*/
static double sizek (const Opts *o, const Warnings *w, double kflag) {
  double k = w->kwin[1] > w->kwin[0] ? 0.5 * (w->kwin[0] + w->kwin[1])
             : kflag > 0.0 ? kflag : w->kseen > 0.0 ? w->kseen : 0.5 * o->T;
  return fmin(k, 0.999 * o->T);
}


/* The largest k of the points flagged by warning bit `bit`; 0: none. */
static double kbit (const Warnings *w, unsigned bit) {
  int i = 0;
  while (i < BL_WARN_COUNT - 1 && (1u << i) != bit)
    i++;
  return w->kbit[i];
}


/*
** The exact-Born dsigma/dk of the call's target at k (bl_target_born_dk_e:
** plain, without corrections, or with them; with the projectile's form
** factor of `radius` fm if > 0) into *v; 0 when it cannot be had (no
** target, no memory, a failure): the caller then says "not estimated".
*/
static int bornat (const Warnings *w, double k, int plain, double radius,
                   double *v) {
  bl_quad *q;
  bl_tresult tr;
  int st;
  if (w->t == NULL || (q = bl_quad_alloc(QUAD_LIMIT)) == NULL)
    return 0;
  bl_quad_set_rtol(q, SIZE_RTOL);
  bl_quad_set_stop(q, lbl_stopflag());   /* interrupted: no size */
  st = bl_target_born_dk_e(w->t, k, plain, radius, q, &tr);
  bl_quad_free(q);
  *v = tr.r.val;
  return (st == BL_SUCCESS || bl_status_soft(st)) && isfinite(*v)
         && *v > 0.0;
}


/*
** How much the corrections applied change the exact-Born value at the
** largest k flagged by `bit` (the sizing k of sizek): into size, as a
** clause of the warning; "not estimated" when an evaluation failed.
*/
static void correctionsize (const Opts *o, const Warnings *w, unsigned bit,
                            char *size, size_t n) {
  double k = sizek(o, w, kbit(w, bit)), vc, vp;
  if (bornat(w, k, 0, 0.0, &vc) && bornat(w, k, 1, 0.0, &vp))
    snprintf(size, n, "here the corrections applied change the exact-Born "
             "dsigma/dk at k = %g MeV by %+.3g %%", k,
             100.0 * (vc / vp - 1.0));
  else
    snprintf(size, n, "its size here was not estimated (an evaluation "
             "failed)");
}


/*
** The relative change of dsigma/dk at k when the projectile's charge form
** factor is included (exact Born, without corrections): *rel; 0 when the
** radius is unknown or an evaluation failed.
*/
static int formfactorsize (const Opts *o, const Warnings *w, double k,
                           double *rel) {
  double r = bl_particle_radius(&o->particle), v0, v1;
  if (!(r > 0.0) || !bornat(w, k, 1, 0.0, &v0) || !bornat(w, k, 1, r, &v1))
    return 0;
  *rel = v1 / v0 - 1.0;
  return 1;
}


/*
** The relative change of the exact-Born dsigma/dk at k that the nucleus's
** incoherent part makes: the call's target against the same with the
** uniform nucleus alone; 0 when an evaluation failed or memory is short.
*/
static int incoherentsize (const Opts *o, const Warnings *w, double k,
                           double *rel) {
  bl_target *u = malloc(sizeof *u);
  bl_opts bo = o->bo;
  double v0, v1;
  int ok = 0, st;
  if (u == NULL)
    return 0;
  bo.nucleus = BL_NUCLEUS_UNIFORM;
  st = bl_target_setup(u, &o->particle, &o->target, o->screening, NULL, o->T,
                       &bo, BL_METHOD_BORN, &o->sup, NULL);
  if (st == BL_SUCCESS && bornat(w, k, 1, 0.0, &v1)) {
    Warnings wu = *w;
    wu.t = u;
    ok = bornat(&wu, k, 1, 0.0, &v0);
    if (ok)
      *rel = v1 / v0 - 1.0;
  }
  free(u);
  return ok;
}


/* Push the string for warning bit `bit`, with the numbers of this call;
** ffok and ffrel: formfactorsize's answer for the point-charge warning. */
static void pushwarning (lua_State *L, const Opts *o, const Warnings *w,
                         unsigned bit, int ffok, double ffrel) {
  char msg[MSGSIZE];
  const char *text = bl_warn_text(bit);
  const bl_particle *p = &o->particle;
  int zb = w->zborn > 0 ? w->zborn : o->Z;
  double g0 = 1.0 + o->T / p->mass;
  if (text == NULL)
    text = "warning";
  switch (bit) {
    case BL_WARN_TOLERANCE:
      snprintf(msg, sizeof msg, "%s: %d of %d points missed rtol = %g "
               "(worst relative error estimate %.3g at %s)", text, w->ntol,
               w->npts, o->rtol, w->worst, w->worstat);
      break;
    case BL_WARN_POINTLIKE: {
      double k = sizek(o, w, 0.0), rel = ffrel, r = bl_particle_radius(p);
      if (ffok)
        snprintf(msg, sizeof msg, "%s: with its charge form factor (a "
                 "monopole of radius %g fm) the exact-Born dsigma/dk of %s "
                 "on %s at T = %g MeV, k = %g MeV changes by %+.3g %% (the "
                 "form factor cuts the momentum transfers above about "
                 "hbar c/r = %.3g MeV, which a nucleus of radius R already "
                 "cuts above hbar c/R)%s (README, What is computed)", text, r,
                 p->name, o->target.name, o->T, k, 100.0 * rel,
                 BL_HBARC_MEVFM / r, p->spin > 0.25
                 ? "; its anomalous magnetic moment is not included either, "
                   "and its size is not estimated here" : "");
      else
        snprintf(msg, sizeof msg, "%s: %s (mass %g MeV, T = %g MeV) on %s: "
                 "%s, so the form factor's effect is not estimated; it cuts "
                 "the momentum transfers above about hbar c/r for a charge "
                 "radius r (README, What is computed)", text, p->name,
                 p->mass, o->T, o->target.name, r > 0.0
                 ? "the exact-Born evaluation that sizes it failed"
                 : "its charge radius is not known");
      break;
    }
    case BL_WARN_BORN: {  /* the core's criterion: bl_coulomb_effect */
      const char *corr =
          (w->applied & BL_APPLIED_COULOMB) && (w->applied & BL_APPLIED_ELWERT)
          ? "the Coulomb correction and the Elwert factor applied here "
            "contain the leading part of them"
          : (w->applied & BL_APPLIED_COULOMB)
          ? "the Coulomb correction applied here contains the leading part"
          : (w->applied & BL_APPLIED_ELWERT)
          ? "the Elwert factor applied here contains the leading part"
          : "neither correction holds here";
      double k = w->kborn > 0 && w->kborn < o->T ? w->kborn : 0.5 * o->T;
      if (w->kwin[1] > w->kwin[0])
        snprintf(msg, sizeof msg, "%s: Coulomb effects estimated at %.2g %% "
                 "of the integrand on average over k in (%g, %g) MeV (%s on "
                 "Z = %d, T = %g MeV); %s; method 'auto' (distorted waves) "
                 "contains them (README, Distorted waves)", text,
                 100.0 * lbl_coulomb_mean(o, zb, w->kwin[0], w->kwin[1]),
                 w->kwin[0], w->kwin[1], p->name, zb, o->T, corr);
      else
        snprintf(msg, sizeof msg, "%s: Coulomb effects estimated at %.2g %% "
                 "of the value at k = %g MeV (%s on Z = %d, T = %g MeV; 2 pi "
                 "|z| Z alpha/beta = %.3g after emission); %s; method 'auto' "
                 "(distorted waves) contains them (README, Distorted waves)",
                 text, 100.0 * bl_coulomb_effect(p->charge, zb, p->mass, o->T,
                                                  k),
                 k, p->name, zb, o->T,
                 bl_born_xi(p->charge, zb, o->T - k, p->mass), corr);
      break;
    }
    case BL_WARN_COULOMB: {
      char size[192];
      correctionsize(o, w, bit, size, sizeof size);
      snprintf(msg, sizeof msg, "%s: it holds for gamma >= %g before and "
               ">= %g after emission and hbar/(m c) >= %g nuclear radii; here "
               "gamma0 = %.4g, hbar/(m c) = %.3g fm (%s, target %s; for "
               "angular distributions it is not available at all); %s; "
               "coulomb = 'auto' applies it only where it holds, method "
               "'auto' (distorted waves) contains Coulomb effects at every "
               "energy", text, BL_COULOMB_GAMMA0_MIN, BL_COULOMB_GAMMA_MIN,
               BL_COULOMB_RADII, g0, BL_HBARC_MEVFM / p->mass, p->name,
               o->target.name, size);
      break;
    }
    case BL_WARN_ELWERT: {
      char size[192];
      correctionsize(o, w, bit, size, sizeof size);
      snprintf(msg, sizeof msg, "%s: it holds for gamma0 <= %.4g (T <= %g MeV "
               "for electrons); here gamma0 = %.4g (%s, T = %g MeV); %s; "
               "elwert = 'auto' applies it only where it holds, method "
               "'auto' (distorted waves) contains Coulomb effects at every "
               "energy", text, BL_ELWERT_GAMMA0_MAX, BL_ELWERT_T_ELECTRON, g0,
               p->name, o->T, size);
      break;
    }
    case BL_WARN_STATIC_E: {
      /* the size: Tsai's complete-screening share of the electron term
      ** (Tsai 1974, Rev. Mod. Phys. 46, 815: the complete-screening terms
      ** Z L'_rad against Z^2 L_rad) on the lightest element; the end
      ** point of a photon from a collision with a free electron at rest,
      ** from
      ** s = M^2 + m^2 + 2 m E0 and W >= M + m at theta_k = 0:
      ** k_max = m T / (E0 + m - p0) */
      int ze = o->target.n > 0 ? o->target.comp[0].Z : o->Z;
      double zz = (double)ze, lp = bl_lrad_prime(ze);
      double share = lp / (zz * bl_lrad(ze) + lp);
      double e0 = o->T + p->mass, p0 = sqrt(o->T * (o->T + 2.0 * p->mass));
      double ymax = BL_ME_MEV / (e0 - p0 + BL_ME_MEV);
      snprintf(msg, sizeof msg, "%s: the electron term, about %.3g %% of "
               "the value on Z = %d (Tsai's complete-screening share), is "
               "counted up to the tip, while a free electron at rest takes "
               "the recoil only up to y = k/T = %.4g (%s, mass %g MeV, "
               "T = %g MeV): above that y the value is too high by that "
               "share, below it the recoil is neglected; electrons = false "
               "leaves the nucleus only "
               "(README, What is computed)", text,
               100.0 * share, ze, ymax, p->name, p->mass, o->T);
      break;
    }
    case BL_WARN_NINCOH: {
      double k = sizek(o, w, 0.0), rel = 0.0;
      char size[160] = "its size here was not estimated (an evaluation "
                       "failed)";
      if (incoherentsize(o, w, k, &rel))
        snprintf(size, sizeof size, "here it changes the exact-Born "
                 "dsigma/dk at k = %g MeV by %+.3g %%", k, 100.0 * rel);
      snprintf(msg, sizeof msg, "%s: %s (nucleus = 'uniform+incoherent', "
               "%s on %s at T = %g MeV); Pauli blocking would cut it at "
               "transfers below 2 k_F ~ 500 MeV, by up to about a half at "
               "the 40-100 MeV that count for muons (a Fermi-gas estimate), "
               "and for projectiles heavier than the muon the transfers "
               "beyond hbar c/r_p ~ 235 MeV, which the proton's own size "
               "would cut, count too (README, What is computed)", text,
               size, p->name, o->target.name, o->T);
      break;
    }
    case BL_WARN_ESHAPE: {
      char size[128] = "its share of the values was not measured (an "
                       "integral over k)";
      if (w->eshare > 0.0)
        snprintf(size, sizeof size, "it carries up to %.3g %% of the "
                 "values flagged", 100.0 * w->eshare);
      snprintf(msg, sizeof msg, "%s, up to k = %g MeV (%s, T = %g MeV): "
               "%s; the electron part's own distribution (the struck "
               "electron's recoil and radiation) can differ from it by "
               "several times, most for muons' soft photons; angular and "
               "fully differential values have it exactly up to T = %g MeV "
               "for e-/e+ and %g MeV for other projectiles, dsigma/dk has "
               "its integral; "
               "electrons = false leaves the nucleus only (README, What "
               "is computed)", text, kbit(w, BL_WARN_ESHAPE), p->name,
               o->T, size, BL_EBREMS_T_MAX_E, BL_EBREMS_T_MAX);
      break;
    }
    case BL_WARN_METHOD: {
      double k = sizek(o, w, kbit(w, BL_WARN_METHOD)), vb;
      bl_tresult tr;
      bl_quad *q = bl_quad_alloc(QUAD_LIMIT);
      char size[160] = "its deviation from the exact Born value was not "
                       "estimated (an evaluation failed)";
      int st = BL_EDOMAIN;
      if (q != NULL) {   /* the method's own value at k, then Born's */
        bl_quad_set_rtol(q, SIZE_RTOL);
        bl_quad_set_stop(q, lbl_stopflag());   /* interrupted: no size */
        st = bl_target_dk_e(w->t, k, q, &tr);
        bl_quad_free(q);
      }
      if ((st == BL_SUCCESS || bl_status_soft(st))
          && bornat(w, k, 0, 0.0, &vb))
        snprintf(size, sizeof size, "at k = %g MeV it gives %+.3g %% of the "
                 "exact Born value (same corrections)", k,
                 100.0 * (tr.r.val / vb - 1.0));
      snprintf(msg, sizeof msg, "%s: %s; method '%s' holds for a final "
               "gamma = E/m >= %g and, with a uniform nucleus of radius R, "
               ">= %g m R / (hbar c) for m R <= %g hbar c (complete "
               "screening also needs Tsai's gamma <= %g and a point-like "
               "nucleus); here gamma0 = %.4g (%s, target %s); method 'born' "
               "or 'auto' is exact", text, size, bl_method_name(o->method),
               BL_HE_GAMMA_MIN, BL_HE_GAMMA_MR, BL_HE_MR_MAX,
               BL_COMPLETE_TSAI_GAMMA_MAX, g0, p->name, o->target.name);
      break;
    }
    case BL_WARN_SUPPRESS:
      snprintf(msg, sizeof msg, "%s (Stanev et al. fits, Klein 1999 review); "
               "E_LPM = %.4g MeV for %s in %s (X0 = %.4g cm)%s; smallest "
               "factor %.4g", text, o->sup.elpm, p->name, o->target.name,
               o->sup.X0cm, o->sup.mode == BL_SUPPRESS_DIELECTRIC
               ? ", with dielectric suppression" : "", w->minsup);
      break;
    case BL_WARN_DISTORTED:
      snprintf(msg, sizeof msg, "%s: up to %.2g %% at %s (%s, %s, T = %g "
               "MeV): the Sommerfeld-Maue functions drop terms of relative "
               "order (zZ alpha)^2 = %.3g, estimated here as (zZ alpha)^2 "
               "beta0^2/sqrt(gamma0), three times that for a repelled "
               "projectile, added to the uncertainty of the screening rule "
               "and, for a Compton wavelength not large against the "
               "nucleus (here %.3g fm against R = %.3g fm), to that of the "
               "point-charge distortion (README, Distorted waves)", text, 100.0 * w->sysrel,
               w->sysat, p->name, o->target.name, o->T,
               (p->charge * zb * BL_ALPHA) * (p->charge * zb * BL_ALPHA),
               BL_HBARC_MEVFM / p->mass, 1.2 * cbrt(round(bl_element_mass(zb))));
      break;
    case BL_WARN_EHELD: {
      double kh = 0.0;
      int i;
      for (i = 0; w->t != NULL && i < w->t->n; i++)
        kh = fmax(kh, bl_case_eheld_k(&w->t->c[i]));
      snprintf(msg, sizeof msg, "%s: below k = %g MeV (1e-4 of the end "
               "point on a free electron; %s, T = %g MeV, on %s) the "
               "electron part, there mostly the struck electron's own "
               "radiation, is taken at its value at that k while the true "
               "one keeps rising: measured, at 1e-5 of the end point it is "
               "3.1 times the held value for 10 GeV and 9.7 times for 1 TeV "
               "(1.00 at 100 MeV, where binding stops the rise; not measured "
               "between; flagged from 1 GeV); an integral over k that reaches "
               "below that k misses the rise (the energy loss of a 10 GeV "
               "muon on C takes 7.8 %% of its value from there); the nuclear "
               "part is not affected, electrons = false leaves it alone "
               "(README, What is computed)", text, kh, p->name, o->T,
               o->target.name);
      break;
    }
    case BL_WARN_SOFT:
      snprintf(msg, sizeof msg, "%s = %g MeV (%s on %s, T = %g MeV): the "
               "amplitudes' soft terms cancel beyond double precision below "
               "it; the ratio's change below that k is estimated from its "
               "change over the decade above, per decade, and is in sys "
               "(README, Distorted waves)", text, BL_DW_SOFT_Y * o->T,
               p->name, o->target.name, o->T);
      break;
    case BL_WARN_CLAMPED: {
      char where[256];
      double vb, kmax = kbit(w, BL_WARN_CLAMPED), ks = sizek(o, w, kmax);
      if (w->kwin[1] > w->kwin[0])
        snprintf(where, sizeof where, "at photon energies inside (%g, %g) "
                 "MeV, where the integrand is then 0", w->kwin[0], w->kwin[1]);
      else if (bornat(w, ks, 1, 0.0, &vb))
        snprintf(where, sizeof where, "at %d of %d points, k = %g to %g MeV, "
                 "where the true value is positive: the exact Born value "
                 "without corrections at k = %g MeV is %.3g mb/MeV",
                 w->nclamp, w->npts, w->kclamp, kmax, ks, vb);
      else
        snprintf(where, sizeof where, "at %d of %d points, k = %g to %g MeV",
                 w->nclamp, w->npts, w->kclamp, kmax);
      snprintf(msg, sizeof msg, "%s %s (%s on %s at T = %g MeV; coulomb = "
               "false gives the uncorrected value, method = 'born' or "
               "'auto' the exact one)", text, where, p->name,
               o->target.name, o->T);
      break;
    }
    case BL_WARN_ERANGE:
      snprintf(msg, sizeof msg, "%s: %s (mass %g MeV, T = %g MeV, T/m = "
               "%.3g) is outside the table of the bound electron term (mass "
               "%g ... %g MeV, T/m from %g, T up to 10 TeV). Above 10 TeV "
               "the term is held at its 10 TeV value (not measured beyond). "
               "Inside 10 TeV dsigma/dk and the angular values take the "
               "exact term, but the event sampler keeps the held ratio for "
               "its events on atomic electrons (measured on C: 7-13 %% too "
               "high at 30 GeV mass, 16-27 %% at 100 GeV, 32-49 %% at "
               "1 TeV) (README, What is computed)", text, p->name, p->mass,
               o->T, o->T / p->mass, BL_EBH_M_MIN, BL_EBH_M_MAX,
               BL_EBH_TAU_MIN);
      break;
    case BL_WARN_EBORN: {
      char size[160] = "its share of the values was not measured (an "
                       "integral over k; dsdk and spectrum give it)";
      if (w->eborn > 0.0)
        snprintf(size, sizeof size, "it carries up to %.3g %% of the "
                 "values", 100.0 * w->eborn);
      snprintf(msg, sizeof msg, "%s: Born with the electrons minus Born "
               "without them at the same k, as the distorted waves add it; "
               "%s (%s on %s, T = %g MeV); electrons = false leaves the "
               "exact nuclear and screened part alone (README, Methods)",
               text, size, p->name, o->target.name, o->T);
      break;
    }
    case BL_WARN_PWSOFT:
      snprintf(msg, sizeof msg, "%s (up to k = %g MeV; %s on %s, T = %g "
               "MeV): the partial waves' cost grows like T/k; the ratio "
               "tends to a constant as k -> 0 (Low's theorem), and its "
               "change from k = %g T, continued in ln k, is in sys (largest "
               "share %.2g %% at %s) (README, Methods)", text,
               kbit(w, BL_WARN_PWSOFT), p->name, o->target.name, o->T,
               BL_PARTIAL_SOFT_Y2, 100.0 * w->sysrel, w->sysat);
      break;
    default:
      snprintf(msg, sizeof msg, "%s (warning bit 0x%x)", text, bit);
      break;
  }
  lua_pushstring(L, msg);
}


/*
** The Coulomb effects the Born approximation leaves out (bl_coulomb_effect)
** averaged over the photon energies of an integral, (kmin, kmax), on a
** midpoint grid in k: the warning of an integral follows the average, not
** the tip, where a point's effect grows without bound but weighs little.
*/
double lbl_coulomb_mean (const Opts *o, int Z, double kmin, double kmax) {
  const bl_particle *p = &o->particle;
  double s = 0.0;
  int i;
  for (i = 0; i < 40; i++) {
    double k = kmin + (kmax - kmin) * (i + 0.5) / 40.0;
    double e = bl_coulomb_effect(p->charge, Z, p->mass, o->T, k);
    s += isfinite(e) ? e : 0.0;
  }
  return s / 40.0;
}


/*
** Push the list of warnings: one string per bit set, in bit order, so the
** list is deduplicated by construction; empty when none.  An integral's
** Born warning stands only where the average effect exceeds BL_SYS_WARN;
** the point-charge and suppression warnings only where their effect does.
*/
void lbl_pushwarnings (lua_State *L, const Opts *o, const Warnings *w) {
  unsigned i;
  int n = 0, ffok = 0;
  double ffrel = 0.0;
  int zb = w->zborn > 0 ? w->zborn : o->Z;
  lua_newtable(L);
  for (i = 0; i < 8 * sizeof w->bits; i++) {
    unsigned bit = 1u << i;
    if (bit == BL_WARN_BORN && w->kwin[1] > w->kwin[0]
        && lbl_coulomb_mean(o, zb, w->kwin[0], w->kwin[1]) <= BL_SYS_WARN)
      continue;
    if (bit == BL_WARN_POINTLIKE && (w->bits & bit)) {
      /* stands where the form factor's effect exceeds BL_SYS_WARN or is
      ** not known */
      ffok = formfactorsize(o, w, sizek(o, w, 0.0), &ffrel);
      if (ffok && fabs(ffrel) <= BL_SYS_WARN)
        continue;
    }
    if (bit == BL_WARN_SUPPRESS && 1.0 - w->minsup < BL_SYS_WARN)
      continue;   /* the approximate suppression changed nothing that
                  ** matters: below 1 % everywhere */
    if (w->bits & bit) {
      pushwarning(L, o, w, bit, ffok, ffrel);
      lua_rawseti(L, -2, ++n);
    }
  }
}


/* Push {name, mass, charge, spin} of particle p. */
static void pushparticletable (lua_State *L, const bl_particle *p) {
  lua_createtable(L, 0, 4);
  lua_pushstring(L, p->name);
  lua_setfield(L, -2, "name");
  lua_pushnumber(L, p->mass);
  lua_setfield(L, -2, "mass");
  lua_pushnumber(L, p->charge);
  lua_setfield(L, -2, "charge");
  lua_pushnumber(L, p->spin);
  lua_setfield(L, -2, "spin");
}


/* The factor from mb per formula unit to cm^2/g. */
double lbl_pergram (const Opts *o) {
  return bl_material_per_gram(&o->target);
}


/* The settings' 'electrons': false where the model has no electron field,
** 'projectile' for the projectile's radiation alone, else true. */
void lbl_pushelectrons (lua_State *L, const Opts *o) {
  if (o->bo.electrons && o->screening->incoherent != NULL
      && o->bo.eradiation == BL_ERAD_PROJECTILE)
    lua_pushliteral(L, "projectile");
  else
    lua_pushboolean(L, o->bo.electrons && o->screening->incoherent != NULL);
}


/* The settings' 'nucleus', as the user writes it. */
void lbl_pushnucleus (lua_State *L, const Opts *o) {
  lua_pushstring(L, o->bo.nucleus == BL_NUCLEUS_POINT ? "point"
                    : o->bo.nucleus == BL_NUCLEUS_INCOHERENT
                    ? "uniform+incoherent" : "uniform");
}


/* Push a correction switch as the user writes it: true, false, "auto". */
static void pushswitch (lua_State *L, int sw) {
  if (sw == BL_APPLY_AUTO)
    lua_pushliteral(L, "auto");
  else
    lua_pushboolean(L, sw == BL_APPLY_ON);
}


/*
** Push the method actually used: its name when every point used one
** method ("auto" when the points differ: see the result's per-point list),
** the requested one before any point was computed.
*/
static void pushmethod (lua_State *L, const Opts *o) {
  int i, n = 0, last = o->method;
  for (i = 0; i < BL_METHOD_COUNT; i++)
    if (o->used & (1u << i)) {
      n++;
      last = i;
    }
  lua_pushstring(L, bl_method_name(n > 1 ? BL_METHOD_AUTO : last));
}


/* Push the settings table: every option used, defaults filled in. */
static void pushsettings (lua_State *L, const Opts *o) {
  lua_createtable(L, 0, 8);
  pushparticletable(L, &o->particle);
  lua_setfield(L, -2, "particle");
  lua_createtable(L, 0, 4);
  lua_pushstring(L, o->target.name);
  lua_setfield(L, -2, "name");
  if (o->target.n == 1 && o->target.comp[0].atoms == 1.0) {  /* an element */
    lua_pushstring(L, bl_element_symbol(o->target.comp[0].Z));
    lua_setfield(L, -2, "symbol");
    lua_pushinteger(L, o->target.comp[0].Z);
    lua_setfield(L, -2, "Z");
  }
  lua_pushnumber(L, o->target.molar_mass);
  lua_setfield(L, -2, "molar_mass");
  lua_pushnumber(L, lbl_pergram(o));
  lua_setfield(L, -2, "per_gram");
  if (o->target.density > 0.0) {
    lua_pushnumber(L, o->target.density);
    lua_setfield(L, -2, "density");
  }
  {
    char d[MSGSIZE];
    lbl_describe(&o->target, d, sizeof d);
    lua_pushstring(L, d);
    lua_setfield(L, -2, "description");
  }
  lua_setfield(L, -2, "target");
  lua_pushnumber(L, o->T);
  lua_setfield(L, -2, "T");
  lua_pushstring(L, o->screening->name);
  lua_setfield(L, -2, "screening");
  if (o->userol) {
    lua_pushnumber(L, o->rtol);
    lua_setfield(L, -2, "rtol");
  }
  lbl_pushnucleus(L, o);
  lua_setfield(L, -2, "nucleus");
  lbl_pushelectrons(L, o);
  lua_setfield(L, -2, "electrons");
  pushswitch(L, o->bo.coulomb);
  lua_setfield(L, -2, "coulomb");
  pushswitch(L, o->bo.elwert);
  lua_setfield(L, -2, "elwert");
  pushmethod(L, o);
  lua_setfield(L, -2, "method");
  lua_pushstring(L, bl_method_name(o->method));
  lua_setfield(L, -2, "method_requested");
  lua_pushstring(L, bl_suppress_name(o->sup.mode));
  lua_setfield(L, -2, "suppression");
}


/*
** Push a table of units: pairs of (field, unit) strings, NULL-terminated.
*/
static void pushunits (lua_State *L, const char *const pairs[]) {
  int i;
  lua_newtable(L);
  for (i = 0; pairs[i] != NULL; i += 2) {
    lua_pushstring(L, pairs[i + 1]);
    lua_setfield(L, -2, pairs[i]);
  }
}


/*
** Finish a result table at absolute index t: t[names[i]] = the value at
** absolute index first + i, then units, settings and warnings.
*/
void lbl_setresult (lua_State *L, int t, int first,
                    const char *const names[], const char *const units[],
                    const Opts *o, const Warnings *w) {
  int i;
  for (i = 0; names[i] != NULL; i++) {
    lua_pushvalue(L, first + i);
    lua_setfield(L, t, names[i]);
  }
  pushunits(L, units);
  lua_setfield(L, t, "units");
  pushsettings(L, o);
  lua_setfield(L, t, "settings");
  lbl_pushwarnings(L, o, w);
  lua_setfield(L, t, "warnings");
}


/* Push the table of one point's extras: per_gram, corrections applied. */
void lbl_pushinfo (lua_State *L, const Opts *o, const bl_result *r) {
  lua_createtable(L, 0, 5);
  lua_pushnumber(L, lbl_pergram(o));
  lua_setfield(L, -2, "per_gram");
  lua_pushnumber(L, r->sys);
  lua_setfield(L, -2, "sys");
  lua_pushboolean(L, (r->applied & BL_APPLIED_COULOMB) != 0);
  lua_setfield(L, -2, "coulomb_applied");
  lua_pushboolean(L, (r->applied & BL_APPLIED_ELWERT) != 0);
  lua_setfield(L, -2, "elwert_applied");
  pushsettings(L, o);
  lua_setfield(L, -2, "settings");
}


/* Push a boolean array slot: t[i] = v. */
void lbl_setbool (lua_State *L, int t, lua_Integer i, int v) {
  lua_pushboolean(L, v);
  lua_rawseti(L, t, i);
}


/*
** An integral of the target over (kmin, kmax) (bl_target_kintegral_e):
** moment 0 into *r0 and, if r1 is not NULL, moment 1 into *r1; if r0 is
** NULL, moment 1 alone.  Raises on a hard failure, naming where.
*/
void lbl_kintegral (lua_State *L, Opts *o, const bl_target *t, int kind,
                    double theta, double kmin, double kmax, bl_quad *q,
                    Warnings *w, bl_result *r0, bl_result *r1) {
  bl_tresult t0, t1;
  const bl_tresult *any;
  char at[96];
  int st;
  memset(&t0, 0, sizeof t0);   /* the core fills them in any case */
  memset(&t1, 0, sizeof t1);
  any = r0 != NULL ? &t0 : &t1;
  lbl_retol(o, q);
  st = bl_target_kintegral_e(t, kind, theta, kmin, kmax, q,
                             r0 != NULL ? &t0 : NULL, r1 != NULL ? &t1 : NULL);
  lbl_addtarget(o, w, any);
  if (st != BL_SUCCESS && !bl_status_soft(st))   /* where it failed */
    snprintf(at, sizeof at, "the integral over k in (%.6g, %.6g) MeV, at "
             "k = %.6g MeV", kmin, kmax, any->k);
  else
    snprintf(at, sizeof at, "the integral over k in (%.6g, %.6g) MeV", kmin,
             kmax);
  w->kwin[0] = kmin;
  w->kwin[1] = kmax;
  if (r0 != NULL) {
    lbl_checkresult(L, o, st, &t0.r, at);
    *r0 = t0.r;
    lbl_addwarn(w, r0, kmax, at);
  }
  if (r1 != NULL) {
    lbl_checkresult(L, o, st, &t1.r, at);
    *r1 = t1.r;
    lbl_addwarn(w, r1, kmax, at);
  }
}


/* Set up the target, workspace and warnings of one integrating call. */
bl_target *lbl_kstart (lua_State *L, Opts *o, bl_quad **q, Warnings *w) {
  bl_target *t;
  *q = lbl_getquad(L, o);
  t = lbl_maketarget(L, o, *q);
  lbl_initwarn(w, t);
  return t;
}


/* t[key] = v for the table at absolute index t. */
void lbl_setnum (lua_State *L, int t, const char *key, double v) {
  lua_pushnumber(L, v);
  lua_setfield(L, t, key);
}
