/*
** $Id: lcalls.c $
** The library functions of the module at given photon energies:
** brakelight.dsdk, spectrum, angular, differential, methods, models.
** See Copyright Notice in LICENSE
*/

#include <errno.h>
#include <fcntl.h>
#include <float.h>
#include <math.h>
#include <stdarg.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <unistd.h>

#include "lbl_internal.h"


static const char *const dsdk_keys[] = {
  "particle", "target", "T", "k", "y", "screening", "rtol", "nucleus",
  "electrons", "coulomb", "elwert", "method", "suppression", NULL
};


static const char *const spectrum_keys[] = {
  "particle", "target", "T", "k", "y", "screening", "rtol", "nucleus",
  "electrons", "coulomb", "elwert", "method", "suppression", "threads", NULL
};


static const char *const angular_keys[] = {
  "particle", "target", "T", "k", "kmin", "kmax", "theta", "screening",
  "rtol", "nucleus", "electrons", "coulomb", "elwert", "method", NULL
};


static const char *const differential_keys[] = {
  "particle", "target", "T", "k", "theta_k", "theta_p", "phi", "screening",
  "nucleus", "electrons", "coulomb", "elwert", "method", NULL
};


/*
** brakelight.dsdk{particle =, target =, T =, k = or y =, ...}
**   -> dsigma/dk (mb/MeV per atom), its error estimate, warnings list
** (y = k/T, as in spectrum; exactly one of k and y)
*/
int l_dsdk (lua_State *L) {
  Opts o;
  bl_target *t;
  bl_result r;
  bl_quad *q;
  Warnings w;
  double k;
  char at[64];
  int hask, hasy;
  lbl_readopts(L, "dsdk", dsdk_keys, 1, &o);
  hask = (lua_getfield(L, 1, "k") != LUA_TNIL);
  hasy = (lua_getfield(L, 1, "y") != LUA_TNIL);
  lua_pop(L, 2);
  if (hask && hasy)
    lbl_argfail(L, o.fname, "give exactly one of fields 'k' (photon energy, "
                "MeV) and 'y' (fraction k/T), got both");
  if (hasy)
    k = lbl_optrange(L, &o, "y", "fraction k/T", 0, 1, 1, "(0, 1)") * o.T;
  else
    k = lbl_optk(L, &o);
  /* all checks done */
  q = lbl_getquad(L, &o);
  t = lbl_maketarget(L, &o, q);
  lbl_initwarn(&w, t);
  snprintf(at, sizeof at, "k = %.6g MeV", k);
  lbl_computepoint(L, &o, t, BL_TARGET_DK, k, 0.0, 0.0, 0.0, q, &w, at, &r);
  lua_pushnumber(L, r.val);
  lua_pushnumber(L, r.err);
  lbl_pushwarnings(L, &o, &w);
  lbl_pushinfo(L, &o, &r);
  return 4;
}


/*
** The finished points of an interrupted spectrum, kept in a new file of
** the current directory, spectrum-interrupted-PID[-N].csv: written as
** NAME.part, synced, then linked to the name (never over an existing
** file).  Fills `name` (or the reason it failed, *ok = 0).
*/
static void keep_spectrum (const Opts *o, lua_Integer n, const double *k,
                           const double *x, int hask, const bl_tresult *res,
                           const int *sts, lua_Integer done, char *name,
                           size_t size, int *ok) {
  char part[256];
  FILE *f;
  lua_Integer i;
  int fd, j, e;
  *ok = 0;
  snprintf(part, sizeof part, "spectrum-interrupted-%ld.csv.part",
           (long)getpid());
  fd = open(part, O_WRONLY | O_CREAT | O_EXCL | O_CLOEXEC, 0644);
  if (fd < 0 || (f = fdopen(fd, "w")) == NULL) {
    snprintf(name, size, "cannot create '%s': %s", part, strerror(errno));
    if (fd >= 0) {
      close(fd);
      unlink(part);   /* ours: created above */
    }
    return;
  }
  fprintf(f, "# brakelight %s: spectrum interrupted by signal %d, %lld of "
          "%lld points finished\n# %s on %s, T = %.17g MeV, method %s, "
          "rtol %g\n# units k MeV, y 1, dsdk mb/MeV, err mb/MeV\n"
          "k,y,dsdk,err\n", BL_VERSION, (int)*lbl_stopflag(),
          (long long)done, (long long)n, o->particle.name, o->target.name,
          o->T, bl_method_name(o->method), o->rtol);
  for (i = 0; i < n; i++)
    if (sts[i] != BL_EINTR)
      fprintf(f, "%.17g,%.17g,%.17g,%.17g\n", k[i], hask ? k[i] / o->T
              : x[i], res[i].r.val, res[i].r.err);
  e = fflush(f) != 0 || ferror(f) || fsync(fileno(f)) != 0 ? errno : 0;
  if (fclose(f) != 0 && e == 0)
    e = errno ? errno : EIO;
  if (e != 0) {
    snprintf(name, size, "cannot write '%s': %s", part, strerror(e));
    unlink(part);
    return;
  }
  for (j = 0; j < 100; j++) {
    if (j == 0)
      snprintf(name, size, "spectrum-interrupted-%ld.csv", (long)getpid());
    else
      snprintf(name, size, "spectrum-interrupted-%ld-%d.csv", (long)getpid(),
               j);
    if (link(part, name) == 0) {
      unlink(part);
      *ok = 1;
      return;
    }
    if (errno != EEXIST)
      break;
  }
  e = errno;
  snprintf(name, size, "kept in '%s' only: %s", part, strerror(e));
}


/* Raise the interrupt of a spectrum, its finished points kept. */
static void spectrum_stopped (lua_State *L, const Opts *o, lua_Integer n,
                              const double *k, const double *x, int hask,
                              const bl_tresult *res, const int *sts) {
  char name[512];
  lua_Integer i, done = 0;
  int ok = 0;
  for (i = 0; i < n; i++)
    done += sts[i] != BL_EINTR;
  if (done > 0)
    keep_spectrum(o, n, k, x, hask, res, sts, done, name, sizeof name, &ok);
  if (done == 0)
    lbl_fail(L, "%s: interrupted by signal %d before any point was finished "
             "(a target of several elements finishes its points with its "
             "last element; a scan, brakelight.scan, keeps every finished "
             "point)", o->fname, (int)*lbl_stopflag());
  lbl_fail(L, "%s: interrupted by signal %d; %lld of %lld points finished, "
           "%s%s%s (columns k, y, dsdk, err)", o->fname,
           (int)*lbl_stopflag(), (long long)done, (long long)n,
           ok ? "kept in '" : "not kept: ", name, ok ? "'" : "");
}


/*
** brakelight.spectrum{..., k = {...}} or {..., y = {...}}
**   -> {k, y, dsdk, err, coulomb_applied, elwert_applied, method, per_gram,
**       threads, units, settings, warnings}
*/
int l_spectrum (lua_State *L) {
  static const char *const units[] = {
    "k", "MeV", "y", "1", "dsdk", "mb/MeV", "err", "mb/MeV",
    "per_gram", "cm^2/g per mb", NULL
  };
  static const char *const names[] = {"k", "y", "dsdk", "err",
                                      "coulomb_applied", "elwert_applied",
                                      "method", NULL};
  Opts o;
  bl_target *t;
  bl_tresult *res;
  double *x, *k;
  bl_quad *q;
  Warnings w;
  char range[96], at[64];
  lua_Integer i, n;
  int hask, hasy, nthreads, st, *sts;
  lbl_readopts(L, "spectrum", spectrum_keys, 1, &o);
  nthreads = lbl_optthreads(L, &o);
  hask = (lua_getfield(L, 1, "k") != LUA_TNIL);
  hasy = (lua_getfield(L, 1, "y") != LUA_TNIL);
  lua_pop(L, 2);
  if (hask == hasy)
    lbl_argfail(L, o.fname, "give exactly one of fields 'k' (photon energies, "
            "MeV) and 'y' (fractions k/T), got %s", hask ? "both" : "neither");
  if (hask) {
    snprintf(range, sizeof range, "(0, T) = (0, %.14g) MeV", o.T);
    x = lbl_optarray(L, &o, "k", 0, o.T, 1, range, &n);   /* 2: the values */
  }
  else
    x = lbl_optarray(L, &o, "y", 0, 1, 1, "(0, 1)", &n);  /* 2: the values */
  lbl_checkwork(L, &o, hask ? "k" : "y", n, 1.0);
  /* all checks done */
  q = lbl_getquad(L, &o);
  t = lbl_maketarget(L, &o, q);                     /* 3: the target */
  lbl_initwarn(&w, t);
  k = (double *)lua_newuserdatauv(L, (size_t)n * sizeof *k, 0);  /* 4 */
  res = (bl_tresult *)lua_newuserdatauv(L, (size_t)n * sizeof *res,
                                        0);             /* 5: results */
  sts = (int *)lua_newuserdatauv(L, (size_t)n * sizeof *sts, 0);  /* 6 */
  for (i = 0; i < n; i++)
    k[i] = hask ? x[i] : x[i] * o.T;
  lbl_retol(&o, q);
  st = bl_target_spectrum_e(t, (size_t)n, k, nthreads, q, res, sts);
  if (st == BL_ENOMEM)
    lbl_fail(L, "%s: out of memory for %lld points", o.fname, (long long)n);
  if (st == BL_EINTR)
    spectrum_stopped(L, &o, n, k, x, hask, res, sts);
  if (st != BL_SUCCESS)               /* the point that failed */
    for (i = 0; i < n; i++)
      if (sts[i] != BL_SUCCESS && !bl_status_soft(sts[i])) {
        o.Z = res[i].Z;
        snprintf(at, sizeof at, "k = %.6g MeV", k[i]);
        lbl_checkresult(L, &o, sts[i], &res[i].fail, at);
      }
  for (i = 0; i < n; i++)
    lbl_addtarget(&o, &w, &res[i]);
  lua_createtable(L, (int)n, 0);      /* 7: k */
  lua_createtable(L, (int)n, 0);      /* 8: y */
  lua_createtable(L, (int)n, 0);      /* 9: dsdk */
  lua_createtable(L, (int)n, 0);      /* 10: err */
  lua_createtable(L, (int)n, 0);      /* 11: coulomb_applied */
  lua_createtable(L, (int)n, 0);      /* 12: elwert_applied */
  lua_createtable(L, (int)n, 0);      /* 13: method */
  for (i = 1; i <= n; i++) {
    const bl_result *r = &res[i - 1].r;
    double ki = k[i - 1];
    snprintf(at, sizeof at, "k = %.6g MeV", ki);
    lbl_addwarn(&w, r, ki, at);
    lua_pushnumber(L, ki);
    lua_rawseti(L, 7, i);
    lua_pushnumber(L, hask ? ki / o.T : x[i - 1]);   /* y as given */
    lua_rawseti(L, 8, i);
    lua_pushnumber(L, r->val);
    lua_rawseti(L, 9, i);
    lua_pushnumber(L, r->err);
    lua_rawseti(L, 10, i);
    lbl_setbool(L, 11, i, (r->applied & BL_APPLIED_COULOMB) != 0);
    lbl_setbool(L, 12, i, (r->applied & BL_APPLIED_ELWERT) != 0);
    lua_pushstring(L, bl_method_name(r->method));
    lua_rawseti(L, 13, i);
  }
  lua_createtable(L, 0, 12);          /* 14: result */
  lbl_setresult(L, 14, 7, names, units, &o, &w);
  lua_pushnumber(L, lbl_pergram(&o));
  lua_setfield(L, 14, "per_gram");
  if (nthreads == 0)                  /* the number used, as the core does */
    nthreads = bl_spectrum_threads_auto();
  if ((lua_Integer)nthreads > n)
    nthreads = (int)n;
  lua_pushinteger(L, nthreads);
  lua_setfield(L, 14, "threads");
  return 1;
}


/*
** brakelight.angular{..., k =, theta = {...}}
**   -> {k, y, theta, d2sigma, err, elwert_applied, per_gram, units,
**       settings, warnings}
** brakelight.angular{..., kmin =, kmax =, theta = {...}}
**   -> {kmin, kmax, theta, dsdomega, err, ...}: integrated over the window
*/
int l_angular (lua_State *L) {
  static const char *const units[] = {
    "k", "MeV", "y", "1", "theta", "rad", "d2sigma", "mb/(MeV sr)",
    "err", "mb/(MeV sr)", "per_gram", "cm^2/g per mb", NULL
  };
  static const char *const wunits[] = {
    "kmin", "MeV", "kmax", "MeV", "theta", "rad", "dsdomega", "mb/sr",
    "err", "mb/sr", "per_gram", "cm^2/g per mb", NULL
  };
  static const char *const names[] = {"theta", "d2sigma", "err", NULL};
  static const char *const wnames[] = {"theta", "dsdomega", "err", NULL};
  Opts o;
  bl_target *t;
  bl_quad *q;
  Warnings w;
  lua_Integer i, n;
  unsigned applied = 0;
  double k = 0.0, kmin = 0.0, kmax = 0.0, *theta;
  int hask, haswin;
  lbl_readopts(L, "angular", angular_keys, 1, &o);
  lbl_nocoulomb(L, &o);
  hask = lua_getfield(L, 1, "k") != LUA_TNIL;
  haswin = lua_getfield(L, 1, "kmin") != LUA_TNIL
           || lua_getfield(L, 1, "kmax") != LUA_TNIL;
  lua_settop(L, 1);
  if (hask == haswin)
    lbl_argfail(L, o.fname, "give either field 'k' (one photon energy, MeV) "
                "or fields 'kmin' and 'kmax' (a window, kmax = T by "
                "default), got %s", hask ? "both" : "neither");
  if (hask)
    k = lbl_optk(L, &o);
  else
    lbl_optwindow(L, &o, &kmin, &kmax);
  theta = lbl_optarray(L, &o, "theta", 0, BL_PI, 0, "[0, pi] rad", &n);  /* 2 */
  lbl_checkwork(L, &o, "theta", n, hask ? BL_WORK_ANGULAR
                                    : BL_WORK_ANGULAR * bl_work_kintegral(o.rtol));
  /* all checks done */
  t = lbl_kstart(L, &o, &q, &w);          /* 3: the target */
  lua_createtable(L, (int)n, 0);      /* 4: theta */
  lua_createtable(L, (int)n, 0);      /* 5: d2sigma or dsdomega */
  lua_createtable(L, (int)n, 0);      /* 6: err */
  for (i = 1; i <= n; i++) {
    bl_result r;
    double th = theta[i - 1];
    char at[64];
    if (hask) {
      snprintf(at, sizeof at, "k = %.6g MeV, theta = %.6g rad", k, th);
      lbl_computepoint(L, &o, t, BL_TARGET_ANGULAR, k, th, 0.0, 0.0, q, &w, at,
                   &r);
    }
    else
      lbl_kintegral(L, &o, t, BL_TARGET_ANGULAR, th, kmin, kmax, q, &w, &r,
                NULL);
    applied |= r.applied;
    lua_pushnumber(L, th);
    lua_rawseti(L, 4, i);
    lua_pushnumber(L, r.val);
    lua_rawseti(L, 5, i);
    lua_pushnumber(L, r.err);
    lua_rawseti(L, 6, i);
  }
  lua_createtable(L, 0, 10);          /* 7: result */
  lbl_setresult(L, 7, 4, hask ? names : wnames, hask ? units : wunits, &o, &w);
  if (hask) {
    lua_pushnumber(L, k);
    lua_setfield(L, 7, "k");
    lua_pushnumber(L, k / o.T);
    lua_setfield(L, 7, "y");
  }
  else {
    lbl_setnum(L, 7, "kmin", kmin);
    lbl_setnum(L, 7, "kmax", kmax);
  }
  lua_pushboolean(L, (applied & BL_APPLIED_ELWERT) != 0);
  lua_setfield(L, 7, "elwert_applied");
  lua_pushnumber(L, lbl_pergram(&o));
  lua_setfield(L, 7, "per_gram");
  return 1;
}


/*
** brakelight.differential{..., k =, theta_k =, theta_p =, phi =}
**   -> d3sigma/(dk dOmega_k dOmega_p) in mb/(MeV sr^2), warnings list,
**      info table
*/
int l_differential (lua_State *L) {
  Opts o;
  const bl_target *t;
  bl_result r;
  Warnings w;
  double k, theta_k, theta_p, phi;
  char at[128];
  lbl_readopts(L, "differential", differential_keys, 0, &o);
  lbl_nocoulomb(L, &o);
  k = lbl_optk(L, &o);
  theta_k = lbl_optrange(L, &o, "theta_k", "photon polar angle in rad", 0, BL_PI,
                     0, "[0, pi] rad");
  theta_p = lbl_optrange(L, &o, "theta_p", "final-particle polar angle in rad",
                     0, BL_PI, 0, "[0, pi] rad");
  phi = lbl_neednum(L, 1, o.fname, "", "phi", "azimuth between photon and "
                "particle in rad");
  if (!isfinite(phi))
    lbl_argfail(L, o.fname, "field 'phi' must be a finite angle in rad, got "
            "%.14g", phi);
  /* all checks done */
  t = lbl_maketarget(L, &o, NULL);
  lbl_initwarn(&w, t);
  snprintf(at, sizeof at, "k = %.6g MeV, theta_k = %.6g, theta_p = %.6g, "
           "phi = %.6g rad", k, theta_k, theta_p, phi);
  lbl_computepoint(L, &o, t, BL_TARGET_FULL, k, theta_k, theta_p, phi, NULL, &w,
               at, &r);
  lua_pushnumber(L, r.val);
  lbl_pushwarnings(L, &o, &w);
  lbl_pushinfo(L, &o, &r);
  return 3;
}


/* brakelight.methods() -> {"born", "high-energy", "complete", "auto",
** "distorted", "partial"} (in id order) */
int l_methods (lua_State *L) {
  int i;
  lua_createtable(L, BL_METHOD_COUNT, 0);
  for (i = 0; i < BL_METHOD_COUNT; i++) {
    lua_pushstring(L, bl_method_name(i));
    lua_rawseti(L, -2, i + 1);
  }
  return 1;
}


/*
** brakelight.models() -> list of {id, name, description,
**   references = {{key, citation, doi}...},
**   parameters = {{name, description, default, unit}...}}, in id order
*/
int l_models (lua_State *L) {
  int i, j;
  lua_newtable(L);
  for (i = 0; bl_models[i] != NULL; i++) {
    const bl_model *m = bl_models[i];
    lua_createtable(L, 0, 5);
    lua_pushinteger(L, m->id);
    lua_setfield(L, -2, "id");
    lua_pushstring(L, m->name);
    lua_setfield(L, -2, "name");
    lua_pushstring(L, m->description);
    lua_setfield(L, -2, "description");
    lua_newtable(L);  /* references */
    for (j = 0; j < BL_MAX_REFS && m->refs[j] != NULL; j++) {
      lua_createtable(L, 0, 3);
      lua_pushstring(L, m->refs[j]->key);
      lua_setfield(L, -2, "key");
      lua_pushstring(L, m->refs[j]->citation);
      lua_setfield(L, -2, "citation");
      if (m->refs[j]->doi != NULL) {
        lua_pushstring(L, m->refs[j]->doi);
        lua_setfield(L, -2, "doi");
      }
      lua_rawseti(L, -2, j + 1);
    }
    lua_setfield(L, -2, "references");
    lua_newtable(L);  /* parameters */
    for (j = 0; j < m->nparams; j++) {
      const bl_param *p = &m->params[j];
      lua_createtable(L, 0, 4);
      lua_pushstring(L, p->name);
      lua_setfield(L, -2, "name");
      lua_pushstring(L, p->description);
      lua_setfield(L, -2, "description");
      lua_pushnumber(L, p->value);
      lua_setfield(L, -2, "default");
      lua_pushstring(L, p->unit);
      lua_setfield(L, -2, "unit");
      lua_rawseti(L, -2, j + 1);
    }
    lua_setfield(L, -2, "parameters");
    lua_rawseti(L, -2, i + 1);
  }
  return 1;
}
