/*
** $Id: loptions.c $
** Options of the Lua binding: the raising helpers, the checks of every
** option table (particle, target, energies, models, switches, method,
** suppression, arrays, tolerances, threads, photon windows) and the work
** limit of one call; every value is read once into C.
** See Copyright Notice in LICENSE
*/

#include <float.h>
#include <math.h>
#include <stdarg.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include "lbl_internal.h"


/* Names of the registered screening models, ", "-separated. */
static const char *modelnames (char *buf, size_t n) {
  int i;
  buf[0] = '\0';
  for (i = 0; bl_models[i] != NULL; i++)
    lbl_addname(buf, n, bl_models[i]->name);
  return buf;
}


/*
** Read option 'particle': a preset name, a particle object or a
** particle description table.
*/
static void optparticle (lua_State *L, Opts *o) {
  char names[NAMESIZE], v[80];
  const bl_particle *pre;
  int tp = lua_getfield(L, 1, "particle");
  switch (tp) {
    case LUA_TNIL:
      lbl_argfail(L, o->fname, "missing required field 'particle' (a preset "
              "name such as 'electron', or a particle object)");
      break;
    case LUA_TSTRING:
      lbl_checktext(L, -1, o->fname, "field 'particle'");
      pre = bl_particle_find(lua_tostring(L, -1));
      if (pre == NULL)
        lbl_argfail(L, o->fname, "unknown particle %s in field 'particle'; "
                "allowed: %s, or a particle object from brakelight.particle",
                lbl_showval(L, -1, v, sizeof v),
                lbl_particlenames(names, sizeof names));
      o->particle = *pre;
      break;
    case LUA_TTABLE:
      lbl_tabparticle(L, lua_gettop(L), o->fname, "particle.", &o->particle,
                  o->pname);
      break;
    default: {
      bl_particle *p = (bl_particle *)luaL_testudata(L, -1, PARTMETA);
      if (p == NULL)
        lbl_argfail(L, o->fname, "field 'particle' must be a preset name or a "
                "particle object, got %s", lbl_showval(L, -1, v, sizeof v));
      o->particle = *p;
      break;
    }
  }
  if (o->particle.name != o->pname) {   /* own the name: the object (or a */
    snprintf(o->pname, sizeof o->pname, "%s", o->particle.name);
    o->particle.name = o->pname;        /* string) may not outlive this */
  }
  lua_pop(L, 1);
}


/* Read option 'target': anything brakelight.material accepts, or Z. */
static void opttarget (lua_State *L, Opts *o) {
  lua_getfield(L, 1, "target");
  lbl_totarget(L, -1, o->fname, "target", &o->target);
  lua_pop(L, 1);
  o->Z = o->target.comp[0].Z;
}


/*
** Read a correction switch: nil (apply where valid), true or false.
*/
static int optswitch (lua_State *L, const char *fname, const char *key) {
  char v[80], what[64];
  int r = BL_APPLY_AUTO;
  switch (lua_getfield(L, 1, key)) {
    case LUA_TNIL: break;
    case LUA_TBOOLEAN:
      r = lua_toboolean(L, -1) ? BL_APPLY_ON : BL_APPLY_OFF;
      break;
    case LUA_TSTRING:
      snprintf(what, sizeof what, "field '%s'", key);
      lbl_checktext(L, -1, fname, what);
      if (strcmp(lua_tostring(L, -1), "auto") == 0)
        break;
      /* FALLTHROUGH */
    default:
      lbl_argfail(L, fname, "field '%s' must be true, false or 'auto' (the "
                  "default: apply where valid), got %s", key,
                  lbl_showval(L, -1, v, sizeof v));
  }
  lua_pop(L, 1);
  return r;
}


/* The method names, quoted, ", "-separated, the default marked. */
const char *lbl_methodnames (char *buf, size_t n) {
  int i;
  char one[48];
  snprintf(buf, n, "'%s' (default)", bl_method_name(METHOD_DEFAULT));
  for (i = 0; i < BL_METHOD_COUNT; i++)
    if (i != METHOD_DEFAULT) {
      snprintf(one, sizeof one, "'%s'", bl_method_name(i));
      lbl_addname(buf, n, one);
    }
  return buf;
}


/* 1 for the functions with angles: their methods are checked by
** lbl_nocoulomb, which refuses "partial" with its own message. */
static int hasangles (const char *fname) {
  return strcmp(fname, "angular") == 0 || strcmp(fname, "differential") == 0
         || strcmp(fname, "sampler") == 0;
}


/*
** Method "partial": the projectile, T and nucleus it takes, for every
** element of the target (bl_partial_check: the message names the
** parameter, its value and the range); the functions with angles are
** left to lbl_nocoulomb.
*/
static void optpartial (lua_State *L, const Opts *o) {
  char msg[MSGSIZE];
  int i;
  if (hasangles(o->fname))
    return;
  for (i = 0; i < o->target.n; i++)
    if (bl_partial_check(&o->particle, o->target.comp[i].Z, o->T, &o->bo,
                         msg, sizeof msg) != BL_SUCCESS)
      lbl_argfail(L, o->fname, "field 'method' is 'partial', but %s", msg);
}


/*
** Read options 'method' (default "auto") and 'suppression' (default
** "none"; needs a target with a density).  Functions that do not take
** them have already refused the keys.
*/
static void optmethod (lua_State *L, Opts *o) {
  char buf[OPTSTRLEN], names[NAMESIZE];
  const char *s = lbl_getstr(L, 1, o->fname, "method", buf, sizeof buf);
  int st, mode;
  o->method = s == NULL ? METHOD_DEFAULT : bl_method_find(s);
  if (o->method < 0)
    lbl_argfail(L, o->fname, "unknown method '%.60s' in field 'method'; "
                "allowed: %s", s, lbl_methodnames(names, sizeof names));
  if (o->method == BL_METHOD_PARTIAL)
    optpartial(L, o);
  if (o->method == BL_METHOD_COMPLETE
      && o->screening->id == BL_MODEL_NONE)
    lbl_argfail(L, o->fname, "field 'method' is 'complete', but screening "
                "'none' has no complete-screening limit; allowed with "
                "'none': 'auto', 'born', 'high-energy'");
  s = lbl_getstr(L, 1, o->fname, "suppression", buf, sizeof buf);
  mode = s == NULL ? BL_SUPPRESS_NONE : bl_suppress_find(s);
  if (mode < 0)
    lbl_argfail(L, o->fname, "unknown suppression '%.60s' in field "
                "'suppression'; allowed: 'none' (default), 'lpm', "
                "'lpm+dielectric'", s);
  if (mode != BL_SUPPRESS_NONE && !(o->target.density > 0.0))
    lbl_argfail(L, o->fname, "field 'suppression' is '%s', which needs the "
                "density of the medium, but target '%s' has none; give "
                "target = {'%s', density = <g/cm^3>}", s, o->target.name,
                o->target.name);
  st = bl_suppress_init(&o->sup, mode, &o->target, &o->particle);
  if (st != BL_SUCCESS)
    lbl_fail(L, "%s: cannot set up suppression '%s' for target %s: %s",
             o->fname, s, o->target.name, bl_strerror(st));
}


/*
** Read the options shared by every computation (particle, target, T,
** screening, rtol, nucleus, electrons) from the table at index 1, after
** checking its keys against `keys`.
*/
void lbl_readopts (lua_State *L, const char *fname,
                   const char *const keys[], int userol, Opts *o) {
  char names[NAMESIZE], v[80], sbuf[OPTSTRLEN];
  const char *s;
  int i;
  memset(o, 0, sizeof *o);
  o->fname = fname;
  o->userol = userol;
  if (lua_type(L, 1) != LUA_TTABLE)
    lbl_argfail(L, fname, "option table expected, got %s",
            lbl_showval(L, 1, v, sizeof v));
  lua_settop(L, 1);  /* ignore extra arguments; the stack is ours */
  lbl_checkkeys(L, 1, fname, "option", keys);
  optparticle(L, o);
  opttarget(L, o);
  o->T = lbl_neednum(L, 1, fname, "", "T", "kinetic energy in MeV");
  if (!(o->T > 0 && isfinite(o->T)))
    lbl_argfail(L, fname, "field 'T' must be > 0 MeV and finite, got %.14g",
            o->T);
  for (i = 0; i < o->target.n; i++) {   /* bl_case_setup's scale */
    int Z = o->target.comp[i].Z;
    double norm = bl_case_norm(&o->particle, Z);
    if (!(norm >= DBL_MIN && norm <= DBL_MAX))
      lbl_argfail(L, fname, "field 'particle' (%s, mass %.14g MeV, charge "
                  "%.14g) gives the cross-section scale z^4 Z^2 alpha r0^2 = "
                  "%g mb on Z = %d; allowed: a mass and charge for which it "
                  "lies in [%g, %g] mb", o->particle.name, o->particle.mass,
                  o->particle.charge, norm, Z, DBL_MIN, DBL_MAX);
  }
  if (o->T > BL_T0_MAX * o->particle.mass)   /* bl_case_setup's limit */
    lbl_argfail(L, fname, "field 'T' must be at most %g times the particle "
                "mass (%.14g MeV for %s), got %.14g", BL_T0_MAX,
                BL_T0_MAX * o->particle.mass, o->particle.name, o->T);
  s = lbl_getstr(L, 1, fname, "screening", sbuf, sizeof sbuf);
  o->screening = bl_model_find(s ? s : SCREENING_DEFAULT);
  if (o->screening == NULL)
    lbl_argfail(L, fname, "unknown screening model '%.60s' in field 'screening'; "
            "allowed: %s", s ? s : SCREENING_DEFAULT,
            modelnames(names, sizeof names));
  o->rtol = RTOL_DEFAULT;
  if (userol && lbl_getnum(L, 1, fname, "", "rtol", &o->rtol)
      && !(o->rtol >= RTOL_MIN && o->rtol <= RTOL_MAX))
    lbl_argfail(L, fname, "field 'rtol' must be a relative tolerance in "
            "[%g, %g], got %.14g", RTOL_MIN, RTOL_MAX, o->rtol);
  o->bo = bl_opts_default;
  s = lbl_getstr(L, 1, fname, "nucleus", sbuf, sizeof sbuf);
  if (s == NULL || strcmp(s, "uniform") == 0)
    o->bo.nucleus = BL_NUCLEUS_UNIFORM;
  else if (strcmp(s, "point") == 0)
    o->bo.nucleus = BL_NUCLEUS_POINT;
  else if (strcmp(s, "uniform+incoherent") == 0)
    o->bo.nucleus = BL_NUCLEUS_INCOHERENT;
  else
    lbl_argfail(L, fname, "unknown nucleus model '%.60s' in field 'nucleus'; "
            "allowed: 'uniform' (default), 'point', 'uniform+incoherent'", s);
  switch (lua_getfield(L, 1, "electrons")) {
    case LUA_TNIL: break;
    case LUA_TBOOLEAN:
      o->bo.electrons = lua_toboolean(L, -1);
      break;
    case LUA_TSTRING:
      if (strcmp(lua_tostring(L, -1), "projectile") == 0) {
        o->bo.eradiation = BL_ERAD_PROJECTILE;
        break;
      }
      /* fall through */
    default:
      lbl_argfail(L, fname, "field 'electrons' must be true (default), "
              "false or 'projectile', got %s",
              lbl_showval(L, -1, v, sizeof v));
  }
  lua_pop(L, 1);
  if (o->bo.eradiation == BL_ERAD_PROJECTILE && o->particle.spin == 0.5
      && fabs(o->particle.mass - BL_ME_MEV) <= 1e-12 * BL_ME_MEV
      && fabs(fabs(o->particle.charge) - 1.0) <= 1e-12)
    lbl_argfail(L, fname, "field 'electrons' = 'projectile' (the "
            "projectile's radiation alone) is not defined for %s: exchange "
            "(e-) and annihilation (e+) mix the radiation of the two "
            "electrons; allowed for e-/e+: true, false", o->particle.name);
  o->bo.coulomb = optswitch(L, fname, "coulomb");
  o->bo.elwert = optswitch(L, fname, "elwert");
  optmethod(L, o);
}


/*
** Read the required scalar option `key`, which must lie in (lo, hi)
** (open = 1) or [lo, hi] (open = 0); `range` describes the interval
** in the message ("(0, T) = (0, 20) MeV").  NaN and infinities fail.
*/
double lbl_optrange (lua_State *L, const Opts *o, const char *key,
                     const char *meaning, double lo, double hi, int open,
                     const char *range) {
  double x = lbl_neednum(L, 1, o->fname, "", key, meaning);
  int ok = open ? (x > lo && x < hi) : (x >= lo && x <= hi);
  if (!ok || !isfinite(x))
    lbl_argfail(L, o->fname, "field '%s' must be in %s, got %.14g", key, range,
            x);
  return x;
}


/*
** Read the array option `key` (must be present) once into C: a non-empty
** sequence of numbers each in (lo, hi) (open = 1) or [lo, hi] (open = 0),
** `range` describing the interval in the message; a key that is not one
** of 1..n (a hole, a name) is refused, never skipped.  The values go into a
** new userdata pushed on the stack (collected with it on any error); *n
** receives the count.
*/
double *lbl_optarray (lua_State *L, const Opts *o, const char *key,
                      double lo, double hi, int open, const char *range,
                      lua_Integer *n) {
  char v[80];
  lua_Integer i, len, count = 0;
  double *x;
  if (lua_getfield(L, 1, key) != LUA_TTABLE)
    lbl_argfail(L, o->fname, "field '%s' must be an array of numbers, got %s",
            key, lbl_showval(L, -1, v, sizeof v));
  len = (lua_Integer)lua_rawlen(L, -1);
  if (len < 1)
    lbl_argfail(L, o->fname, "field '%s' must be a non-empty array of numbers, "
            "got an empty table", key);
  lua_pushnil(L);
  while (lua_next(L, -2) != 0) {      /* every key must be one of 1..len */
    int isint = 0;
    lua_Integer ki = lua_type(L, -2) == LUA_TNUMBER
                     ? lua_tointegerx(L, -2, &isint) : 0;
    if (!isint || ki < 1 || ki > len)
      lbl_argfail(L, o->fname, "field '%s' must be an array (keys 1..%lld "
                  "without holes), got key %s", key, (long long)len,
                  lbl_showval(L, -2, v, sizeof v));
    count++;
    lua_pop(L, 1);
  }
  if (count != len)
    lbl_argfail(L, o->fname, "field '%s' must be an array without holes, "
                "got %lld values for length %lld", key, (long long)count,
                (long long)len);
  if ((size_t)len > ((size_t)-1) / sizeof *x)
    lbl_argfail(L, o->fname, "field '%s' has too many elements (%lld)", key,
                (long long)len);
  x = (double *)lua_newuserdatauv(L, (size_t)len * sizeof *x, 0);
  lua_insert(L, -2);                  /* values below the table */
  for (i = 1; i <= len; i++) {
    int ok;
    if (lua_rawgeti(L, -1, i) != LUA_TNUMBER)
      lbl_argfail(L, o->fname, "element #%lld of '%s' is not a number, got %s",
              (long long)i, key, lbl_showval(L, -1, v, sizeof v));
    x[i - 1] = (double)lua_tonumber(L, -1);
    ok = open ? (x[i - 1] > lo && x[i - 1] < hi)
              : (x[i - 1] >= lo && x[i - 1] <= hi);
    if (!ok || !isfinite(x[i - 1]))
      lbl_argfail(L, o->fname, "element #%lld of '%s' must be in %s, got %.14g",
              (long long)i, key, range, x[i - 1]);
    lua_pop(L, 1);
  }
  lua_pop(L, 1);                      /* the table; the values stay */
  *n = len;
  return x;
}


/*
** Refuse n points of array option `key` (each costing `share` of a
** dsigma/dk point per element of the target) when the estimate exceeds
** WORK_MAX, saying how many points this rtol allows.
*/
void lbl_checkwork (lua_State *L, const Opts *o, const char *key,
                    lua_Integer n, double share) {
  double per = bl_work_estimate(o->rtol, o->target.n, 1.0, share);
  double work = per * (double)n;
  if (work > BL_WORK_MAX)
    lbl_argfail(L, o->fname, "field '%s' has %lld points: at rtol = %g on "
                "%d element(s) that is about %.2g integrand calls (roughly "
                "%.2g h on one core), more than one call may plan (%.0e); "
                "allowed: at most %.0f points at this rtol; split them over "
                "several calls or a scan (brakelight.scan), which saves "
                "every point and can be interrupted and resumed", key,
                (long long)n, o->rtol, o->target.n, work,
                work * BL_WORK_NS_PER_CALL * 1e-9 / 3600.0, BL_WORK_MAX,
                floor(BL_WORK_MAX / per));
}


/*
** Refuse one integral over k (cross_section, energy_loss) whose estimate
** exceeds BL_WORK_INTEGRAL_MAX, naming rtol and the range this target
** allows.
*/
void lbl_checkintegral (lua_State *L, const Opts *o) {
  double work = bl_work_estimate(o->rtol, o->target.n, 1.0,
                                 bl_work_kintegral(o->rtol));
  double lo = o->rtol;
  if (work <= BL_WORK_INTEGRAL_MAX)
    return;
  while (lo < BL_QUAD_RTOL_MAX && bl_work_estimate(lo, o->target.n, 1.0,
                                   bl_work_kintegral(lo)) > BL_WORK_INTEGRAL_MAX)
    lo *= 1.25;
  lbl_argfail(L, o->fname, "field 'rtol' = %g on %d element(s): one integral "
              "over k is about %.2g integrand calls (roughly %.0f s on one "
              "core), more than one integral may plan (%.2g); allowed for "
              "this target: rtol in [%.2g, %g]", o->rtol, o->target.n, work,
              work * BL_WORK_NS_PER_CALL * 1e-9, BL_WORK_INTEGRAL_MAX, lo,
              BL_QUAD_RTOL_MAX);
}


/*
** Refuse coulomb = true where the correction is not defined, and a method
** without angles for angular distributions: the Born integral or the
** distorted waves ("auto" means the distorted waves there).
*/
void lbl_nocoulomb (lua_State *L, Opts *o) {
  if (o->bo.coulomb == BL_APPLY_ON)
    lbl_argfail(L, o->fname, "field 'coulomb' is true, but the Coulomb "
                "correction is known for dsigma/dk only (spectrum, dsdk); "
                "allowed here: false or 'auto' (not applied)");
  if (o->method == BL_METHOD_PARTIAL)
    lbl_argfail(L, o->fname, "field 'method' is 'partial', but partial "
                "gives dsigma/dk, spectra and integrals over k (dsdk, "
                "spectrum, cross_section, energy_loss, photon_yield), no "
                "angles; allowed here: 'auto' (default), 'born' or "
                "'distorted'");
  if (o->method != BL_METHOD_BORN && o->method != BL_METHOD_AUTO
      && o->method != BL_METHOD_DISTORTED)
    lbl_argfail(L, o->fname, "field 'method' is '%s', but angular "
                "distributions come from the Born integral or the distorted "
                "waves only; allowed here: 'auto' (default), 'born' or "
                "'distorted'", bl_method_name(o->method));
}


/* Read option 'k', required, in (0, T). */
double lbl_optk (lua_State *L, const Opts *o) {
  char range[96];
  snprintf(range, sizeof range, "(0, T) = (0, %.14g) MeV", o->T);
  return lbl_optrange(L, o, "k", "photon energy in MeV", 0, o->T, 1, range);
}


/*
** Threads for one spectrum: option 'threads' (integer >= 0, 0: one per
** processor), else the environment variable BRAKELIGHT_THREADS, else 1
** (scans and the runner's -j already keep the cores busy).
*/
int lbl_optthreads (lua_State *L, const Opts *o) {
  char v[80];
  const char *env;
  int isint;
  lua_Integer t;
  if (lua_getfield(L, 1, "threads") != LUA_TNIL) {
    t = lua_tointegerx(L, -1, &isint);
    if (!isint || t < 0 || t > BL_SPECTRUM_MAX_THREADS)
      lbl_argfail(L, o->fname, "field 'threads' must be an integer in 0..%d "
                  "(0: one per processor), got %s", BL_SPECTRUM_MAX_THREADS,
                  lbl_showval(L, -1, v, sizeof v));
    lua_pop(L, 1);
    return (int)t;
  }
  lua_pop(L, 1);
  env = getenv("BRAKELIGHT_THREADS");
  if (env != NULL && *env != '\0') {
    char *end;
    long e = strtol(env, &end, 10);
    if (*end != '\0' || e < 0 || e > BL_SPECTRUM_MAX_THREADS)
      lbl_fail(L, "%s: environment variable BRAKELIGHT_THREADS must be an "
               "integer in 0..%d (0: one per processor), got '%.40s'",
               o->fname, BL_SPECTRUM_MAX_THREADS, env);
    return (int)e;
  }
  return 1;
}


/* Read kmin (required, in (0, T)) and kmax (default T, in (kmin, T]). */
void lbl_optwindow (lua_State *L, const Opts *o, double *kmin,
                    double *kmax) {
  char range[128];
  snprintf(range, sizeof range, "(0, T) = (0, %.14g) MeV", o->T);
  *kmin = lbl_optrange(L, o, "kmin", "lowest photon energy in MeV", 0, o->T, 1,
                   range);
  *kmax = o->T;
  if (lua_getfield(L, 1, "kmax") != LUA_TNIL) {
    double x = lbl_neednum(L, 1, o->fname, "", "kmax",
                       "highest photon energy in MeV");
    if (!(x > *kmin && x <= o->T))
      lbl_argfail(L, o->fname, "field 'kmax' must be in (kmin, T] = "
                  "(%.14g, %.14g] MeV, got %.14g", *kmin, o->T, x);
    *kmax = x;
  }
  lua_pop(L, 1);
}
