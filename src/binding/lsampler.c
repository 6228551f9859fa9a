/*
** $Id: lsampler.c $
** brakelight.sampler: events drawn from the fully differential cross
** section (src/core/sampler/), as a userdata with :events(n), :iter(n),
** :info() and :stats()
** See Copyright Notice in LICENSE
*/

#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include "lbl_internal.h"

#define SAMPLERMETA "brakelight.Sampler"
/* events made per core call by the iterator and :events */
#define CHUNK 8192
/* atomic mass unit, MeV (CODATA 2018) */
#define AMU_MEV 931.49410242

typedef struct LSampler {
  bl_sampler *s;          /* NULL when closed */
  int mode, nthreads;
  uint64_t total, lo, hi, next;   /* run size, this shard's range, next id */
  bl_sample_stats st;     /* of the events made so far */
  double E0, p0, mass;    /* the beam, MeV */
} LSampler;


static const char *const sampler_keys[] = {
  "particle", "target", "T", "kmin", "kmax", "screening", "nucleus",
  "electrons", "coulomb", "elwert", "method", "seed", "events", "mode",
  "threads", "shard", "setup", "coulomb_factor", NULL
};


/* An integer field key >= lo of the options, or def when absent (def < 0:
** required). */
static lua_Integer optint (lua_State *L, const char *fname, const char *key,
                           lua_Integer lo, lua_Integer hi, lua_Integer def,
                           const char *meaning) {
  char v[80];
  int isint;
  lua_Integer x;
  if (lua_getfield(L, 1, key) == LUA_TNIL) {
    lua_pop(L, 1);
    if (def < 0)
      lbl_argfail(L, fname, "field '%s' (%s) is required", key, meaning);
    return def;
  }
  x = lua_tointegerx(L, -1, &isint);
  if (!isint || x < lo || x > hi)
    lbl_argfail(L, fname, "field '%s' (%s) must be an integer in [%lld, "
                "%lld], got %s", key, meaning, (long long)lo, (long long)hi,
                lbl_showval(L, -1, v, sizeof v));
  lua_pop(L, 1);
  return x;
}


static const char *const setup_keys[] = {
  "iterations", "points", "cells", "cellpoints", "safety", NULL
};


/* The proposal's settings from the table field `setup` (absent: the
** defaults); ranges as bl_sampler_new checks them. */
static void getconf (lua_State *L, const char *fname, bl_sampler_conf *c) {
  char v[80];
  int d;
  bl_sampler_conf_default(c);
  if (lua_getfield(L, 1, "setup") == LUA_TNIL) {
    lua_pop(L, 1);
    return;
  }
  if (!lua_istable(L, -1))
    lbl_argfail(L, fname, "field 'setup' must be a table {iterations =, "
                "points =, cells = {4 integers}, cellpoints =, safety =}, "
                "got %s", lbl_showval(L, -1, v, sizeof v));
  lbl_checkkeys(L, lua_gettop(L), fname, "setup", setup_keys);
  lua_replace(L, 1);   /* read the fields from this table */
  c->iterations = (int)optint(L, fname, "iterations", 0, 100, c->iterations,
                              "grid training passes");
  c->points = (int)optint(L, fname, "points", 100, 10000000, c->points,
                          "points per pass and element");
  c->cellpoints = (int)optint(L, fname, "cellpoints", 2, 100000,
                              c->cellpoints, "trial points per cell");
  if (lua_getfield(L, 1, "safety") != LUA_TNIL) {
    double x = lua_tonumber(L, -1);
    if (!lua_isnumber(L, -1) || !(x >= 1.0 && x <= 100.0))
      lbl_argfail(L, fname, "field 'setup.safety' must be a number in "
                  "[1, 100], got %s", lbl_showval(L, -1, v, sizeof v));
    c->safety = x;
  }
  lua_pop(L, 1);
  if (lua_getfield(L, 1, "cells") != LUA_TNIL) {
    long n = 1;
    if (!lua_istable(L, -1))
      lbl_argfail(L, fname, "field 'setup.cells' must be 4 integers in "
                  "[1, 64] (k, photon angle, particle angle, azimuth)");
    for (d = 0; d < 4; d++) {
      int isint;
      lua_Integer x;
      lua_rawgeti(L, -1, d + 1);
      x = lua_tointegerx(L, -1, &isint);
      if (!isint || x < 1 || x > 64)
        lbl_argfail(L, fname, "field 'setup.cells' must be 4 integers in "
                    "[1, 64] (k, photon angle, particle angle, azimuth), "
                    "element %d is %s", d + 1, lbl_showval(L, -1, v,
                                                           sizeof v));
      c->cells[d] = (int)x;
      n *= x;
      lua_pop(L, 1);
    }
    if (n > 100000)
      lbl_argfail(L, fname, "field 'setup.cells': at most 100000 cells, got "
                  "%ld", n);
  }
  lua_pop(L, 1);
}


static int sampler_gc (lua_State *L) {
  LSampler *ls = (LSampler *)luaL_checkudata(L, 1, SAMPLERMETA);
  bl_sampler_free(ls->s);
  ls->s = NULL;
  return 0;
}


static LSampler *checksampler (lua_State *L) {
  LSampler *ls = (LSampler *)luaL_checkudata(L, 1, SAMPLERMETA);
  if (ls->s == NULL)
    luaL_error(L, "attempt to use a closed sampler");
  return ls;
}


/* The shard {i, n}: the option, else the runner's session, else {1, 1}. */
static void getshard (lua_State *L, const char *fname, lua_Integer *i,
                      lua_Integer *n) {
  *i = *n = 1;
  if (lua_getfield(L, 1, "shard") != LUA_TNIL) {
    int ok1, ok2;
    lua_Integer a, b;
    lua_rawgeti(L, -1, 1);
    lua_rawgeti(L, -2, 2);
    a = lua_tointegerx(L, -2, &ok1);
    b = lua_tointegerx(L, -1, &ok2);
    if (!lua_istable(L, -3) || !ok1 || !ok2 || b < 1 || a < 1 || a > b)
      lbl_argfail(L, fname, "field 'shard' must be {i, n} with 1 <= i <= n");
    *i = a;
    *n = b;
    lua_pop(L, 3);
    return;
  }
  lua_pop(L, 1);
  luaL_getsubtable(L, LUA_REGISTRYINDEX, "_LOADED");
  if (lua_getfield(L, -1, "brakelight.session") == LUA_TTABLE) {
    int ok1, ok2;
    lua_Integer a, b;
    lua_getfield(L, -1, "shard");
    lua_getfield(L, -2, "shards");
    a = lua_tointegerx(L, -2, &ok1);
    b = lua_tointegerx(L, -1, &ok2);
    if (ok1 && ok2 && b >= 1 && a >= 1 && a <= b) {
      *i = a;
      *n = b;
    }
    lua_pop(L, 2);
  }
  lua_pop(L, 2);
}


/*
** Append to the warnings list on the top the approximations of the
** events: the static field (the recoil energy q^2/2M at q = m and at the
** largest momentum transfer 2 p0), and where the call's options ask for
** the Coulomb correction (coulomb = "auto" where it holds), that the
** events leave it out, with its size: the largest relative change of
** dsigma/dk at five photon energies of the window.
*/
static void pushnotes (lua_State *L, const bl_target *t, bl_quad *q,
                       double kmin, double kmax, double p0, int factor) {
  double m = t->particle.mass;
  char buf[MSGSIZE];
  double mmin = HUGE_VAL, worst = 0.0;
  int e, i, n = (int)lua_rawlen(L, -1), want = 0;
  for (e = 0; e < t->n; e++) {
    double M = bl_element_mass(t->c[e].Z) * AMU_MEV;
    if (M < mmin)
      mmin = M;
    want |= t->c[e].opts.coulomb == BL_APPLY_AUTO;
  }
  snprintf(buf, sizeof buf, "events: static field: the atom takes the "
           "momentum q and no energy (its recoil energy q^2/2M is "
           "neglected: %.2g MeV at the typical q = m c, %.3g MeV at the "
           "largest, 2 p0; each event carries q)", m * m / (2.0 * mmin),
           2.0 * p0 * p0 / mmin);
  lua_pushstring(L, buf);
  lua_rawseti(L, -2, ++n);
  for (e = 0; e < t->n && (bl_method_eexact(&t->c[e])
                            || !bl_method_eshape(&t->c[e],
                                                 0.5 * t->c[e].ekmax));
       e++)
    ;
  if (e < t->n) {
    lua_pushstring(L, "events on atomic electrons beyond the exact term's "
                   "range (bl_method_eexact: e-/e+ above 1 TeV, others "
                   "above 10 TeV): the same static kinematics (no electron "
                   "recoil), with the bound electron term's dsigma/dk but "
                   "the static term's photon angles (README, What is "
                   "computed)");
    lua_rawseti(L, -2, ++n);
  }
  for (e = 0; e < t->n && !bl_method_eexact(&t->c[e]); e++)
    ;
  if (e < t->n) {
    lua_pushstring(L, "events on atomic electrons (recoil = true): the "
                   "exact process on a free electron at rest, its recoil "
                   "in the event (q its momentum, E0 + m_e = k + E + E_e); "
                   "the binding weighs the rate (S(q)) but not the "
                   "kinematics: the electron's binding energy and motion "
                   "(up to about 100 keV, inner shells of heavy atoms) are "
                   "neglected (README, Events)");
    lua_rawseti(L, -2, ++n);
  }
  if (want) {
    bl_target *off = (bl_target *)malloc(sizeof *off);
    if (off != NULL) {
      *off = *t;   /* shares t's tables: never released */
      for (e = 0; e < off->n; e++)
        off->c[e].opts.coulomb = BL_APPLY_OFF;
      for (i = 0; i < 5; i++) {
        double k = kmin * pow(kmax / kmin, (i + 0.5) / 5.0);
        bl_tresult a, b;
        if (bl_target_dk_e(t, k, q, &a) == BL_SUCCESS
            && bl_target_dk_e(off, k, q, &b) == BL_SUCCESS && b.r.val > 0.0
            && fabs(a.r.val / b.r.val - 1.0) > worst)
          worst = fabs(a.r.val / b.r.val - 1.0);
      }
      free(off);
    }
    if (worst > 1e-4 && factor) {
      snprintf(buf, sizeof buf, "events: the Coulomb correction (known for "
               "dsigma/dk only) is a factor of k on the nuclear part: it "
               "keeps dsigma/dk (up to %.2g %% in this window) but its "
               "angular shape is that of the Born value, an approximation",
               100.0 * worst);
      lua_pushstring(L, buf);
      lua_rawseti(L, -2, ++n);
    }
    else if (worst > 1e-4) {
      snprintf(buf, sizeof buf, "events: no Coulomb correction (known for "
               "dsigma/dk only): their sigma is that of coulomb = false; "
               "the correction would change dsigma/dk by up to %.2g %% in "
               "this window (coulomb_factor = true applies it as a factor "
               "of k)", 100.0 * worst);
      lua_pushstring(L, buf);
      lua_rawseti(L, -2, ++n);
    }
  }
}


/*
** brakelight.sampler{particle =, target =, T =, kmin =, kmax =, seed =,
**   events =, mode =, threads =, shard =, ...} -> a sampler
*/
int l_sampler (lua_State *L) {
  Opts o;
  bl_target *t;
  bl_quad *q;
  LSampler *ls;
  bl_sampler_info info;
  double kmin, kmax;
  lua_Integer seed, total, si, sn, nb;
  int mode = BL_SAMPLE_UNWEIGHTED, st, e, nthreads;
  bl_sampler_conf conf;
  char buf[OPTSTRLEN];
  lbl_readopts(L, "sampler", sampler_keys, 0, &o);
  lbl_nocoulomb(L, &o);
  lbl_optwindow(L, &o, &kmin, &kmax);
  if (!(kmin > 0.0))
    lbl_argfail(L, o.fname, "field 'kmin' must be above 0 (the number of "
                "photons diverges at k = 0), got %.14g", kmin);
  seed = optint(L, o.fname, "seed", 0, (lua_Integer)9007199254740992.0, -1,
                "the seed of the random streams");
  total = optint(L, o.fname, "events", 1, (lua_Integer)1e15, -1,
                 "events of the whole run, all shards");
  if (lbl_getstr(L, 1, o.fname, "mode", buf, sizeof buf) != NULL) {
    if (strcmp(buf, "weighted") == 0)
      mode = BL_SAMPLE_WEIGHTED;
    else if (strcmp(buf, "unweighted") != 0)
      lbl_argfail(L, o.fname, "field 'mode' must be 'unweighted' or "
                  "'weighted', got '%s'", buf);
  }
  getshard(L, o.fname, &si, &sn);
  nthreads = lbl_optthreads(L, &o);
  lua_pushvalue(L, 1);                          /* keep the options */
  getconf(L, o.fname, &conf);
  lua_replace(L, 1);                            /* the options again */
  if (lua_getfield(L, 1, "coulomb_factor") != LUA_TNIL) {
    char v[80];
    if (!lua_isboolean(L, -1))
      lbl_argfail(L, o.fname, "field 'coulomb_factor' must be true or false, "
                  "got %s", lbl_showval(L, -1, v, sizeof v));
    conf.coulomb = lua_toboolean(L, -1);
    if (conf.coulomb && o.bo.coulomb == BL_APPLY_OFF)
      lbl_argfail(L, o.fname, "field 'coulomb_factor' is true, but "
                  "'coulomb' is false: the factor applies the correction "
                  "where coulomb = 'auto' would");
    if (conf.coulomb && o.method == BL_METHOD_DISTORTED)
      lbl_argfail(L, o.fname, "field 'coulomb_factor' is true, but method "
                  "'distorted' has no Coulomb correction (its waves hold "
                  "the Coulomb field)");
  }
  lua_pop(L, 1);
  /* all checks done */
  q = lbl_getquad(L, &o);
  t = lbl_maketarget(L, &o, q);                 /* the call's target */
  ls = (LSampler *)lua_newuserdatauv(L, sizeof *ls, 1);
  memset(ls, 0, sizeof *ls);
  luaL_setmetatable(L, SAMPLERMETA);
  st = bl_sampler_new(t, kmin, kmax, (uint64_t)seed, &conf, &ls->s);
  if (st != BL_SUCCESS)
    lbl_fail(L, "sampler: cannot set up the events of %s on %s at T = %g "
             "MeV: %s", o.particle.name, o.target.name, o.T,
             bl_strerror(st));
  ls->mode = mode;
  ls->nthreads = nthreads;
  ls->total = (uint64_t)total;
  nb = (total + BL_SAMPLER_BLOCK - 1) / BL_SAMPLER_BLOCK;
  ls->lo = (uint64_t)((nb * (si - 1)) / sn) * BL_SAMPLER_BLOCK;
  ls->hi = (uint64_t)((nb * si) / sn) * BL_SAMPLER_BLOCK;
  if (ls->hi > ls->total)
    ls->hi = ls->total;
  if (ls->lo > ls->hi)
    ls->lo = ls->hi;
  ls->next = ls->lo;
  ls->mass = o.particle.mass;
  ls->E0 = o.T + o.particle.mass;
  ls->p0 = sqrt(o.T * (o.T + 2.0 * o.particle.mass));
  bl_sampler_info_get(ls->s, &info);
  /* the info table, kept as the user value */
  lua_createtable(L, 0, 24);
  lua_pushstring(L, o.particle.name);
  lua_setfield(L, -2, "particle");
  lua_pushnumber(L, o.particle.mass);
  lua_setfield(L, -2, "mass");
  lua_pushnumber(L, o.particle.charge);
  lua_setfield(L, -2, "charge");
  lua_pushnumber(L, o.particle.spin);
  lua_setfield(L, -2, "spin");
  lua_pushstring(L, o.target.name);
  lua_setfield(L, -2, "target");
  lbl_setnum(L, lua_gettop(L), "T", o.T);
  lbl_setnum(L, lua_gettop(L), "E0", ls->E0);
  lbl_setnum(L, lua_gettop(L), "p0", ls->p0);
  lbl_setnum(L, lua_gettop(L), "kmin", kmin);
  lbl_setnum(L, lua_gettop(L), "kmax", kmax);
  lbl_setnum(L, lua_gettop(L), "sigma", info.sigma);
  lbl_setnum(L, lua_gettop(L), "err", info.err);
  lbl_setnum(L, lua_gettop(L), "envelope", info.envelope);
  lbl_setnum(L, lua_gettop(L), "efficiency", info.sigma / info.envelope);
  lua_pushinteger(L, seed);
  lua_setfield(L, -2, "seed");
  lua_pushinteger(L, total);
  lua_setfield(L, -2, "events");
  lua_pushinteger(L, (lua_Integer)ls->lo);
  lua_setfield(L, -2, "first");
  lua_pushinteger(L, (lua_Integer)ls->hi);
  lua_setfield(L, -2, "last");
  lua_createtable(L, 2, 0);
  lua_pushinteger(L, si);
  lua_rawseti(L, -2, 1);
  lua_pushinteger(L, sn);
  lua_rawseti(L, -2, 2);
  lua_setfield(L, -2, "shard");
  lua_pushstring(L, mode == BL_SAMPLE_WEIGHTED ? "weighted" : "unweighted");
  lua_setfield(L, -2, "mode");
  lua_pushstring(L, bl_method_name(info.method));
  lua_setfield(L, -2, "method");
  lua_pushstring(L, o.screening->name);
  lua_setfield(L, -2, "screening");
  lua_pushboolean(L, conf.coulomb);
  lua_setfield(L, -2, "coulomb_factor");
  lbl_pushelectrons(L, &o);
  lua_setfield(L, -2, "electrons");
  lbl_pushnucleus(L, &o);
  lua_setfield(L, -2, "nucleus");
  lua_pushinteger(L, (lua_Integer)info.evaluations);
  lua_setfield(L, -2, "setup_evaluations");
  lua_createtable(L, t->n, 0);                 /* elements */
  for (e = 0; e < t->n; e++) {
    int Z = t->c[e].Z;
    lua_createtable(L, 0, 5);
    lua_pushinteger(L, Z);
    lua_setfield(L, -2, "Z");
    lua_pushstring(L, bl_element_symbol(Z));
    lua_setfield(L, -2, "symbol");
    lua_pushinteger(L, (lua_Integer)floor(bl_element_mass(Z) + 0.5));
    lua_setfield(L, -2, "A");
    lbl_setnum(L, lua_gettop(L), "mass", bl_element_mass(Z) * AMU_MEV);
    lbl_setnum(L, lua_gettop(L), "share", info.share[e]);
    lbl_setnum(L, lua_gettop(L), "atoms", t->atoms[e]);
    lua_rawseti(L, -2, e + 1);
  }
  lua_setfield(L, -2, "elements");
  {
    Warnings w;
    lbl_initwarn(&w, t);
    w.bits |= info.warn;
    lbl_pushwarnings(L, &o, &w);
    pushnotes(L, t, q, kmin, kmax, ls->p0, conf.coulomb);
    lua_setfield(L, -2, "warnings");
  }
  lua_setiuservalue(L, -2, 1);
  return 1;
}


static void pushvec (lua_State *L, const double *v, int n) {
  int i;
  lua_createtable(L, n, 0);
  for (i = 0; i < n; i++) {
    lua_pushnumber(L, v[i]);
    lua_rawseti(L, -2, i + 1);
  }
}


/* One event as a table {id, weight, Z, element, hit, recoil, k, p, q}. */
static void pushevent (lua_State *L, const bl_event *e) {
  lua_createtable(L, 0, 9);
  lua_pushinteger(L, (lua_Integer)e->id);
  lua_setfield(L, -2, "id");
  lua_pushnumber(L, e->weight);
  lua_setfield(L, -2, "weight");
  lua_pushinteger(L, e->Z);
  lua_setfield(L, -2, "Z");
  lua_pushinteger(L, e->elem + 1);
  lua_setfield(L, -2, "element");
  lua_pushstring(L, e->hit == BL_HIT_ELECTRON ? "electron" : "nucleus");
  lua_setfield(L, -2, "hit");
  lua_pushboolean(L, e->recoil);
  lua_setfield(L, -2, "recoil");
  pushvec(L, e->k, 4);
  lua_setfield(L, -2, "k");
  pushvec(L, e->p, 4);
  lua_setfield(L, -2, "p");
  pushvec(L, e->q, 3);
  lua_setfield(L, -2, "q");
}


/* Make up to n events from ls->next into a new table on the stack. */
static lua_Integer makeevents (lua_State *L, LSampler *ls, lua_Integer n) {
  bl_event *ev;
  bl_sample_stats st, st0 = ls->st;
  lua_Integer i, done = 0;
  int status;
  if ((uint64_t)n > ls->hi - ls->next)
    n = (lua_Integer)(ls->hi - ls->next);
  lua_createtable(L, (int)(n < CHUNK ? n : CHUNK), 0);
  if (n == 0)
    return 0;
  ev = (bl_event *)lua_newuserdatauv(L, sizeof *ev * CHUNK, 0);  /* scratch */
  while (done < n) {
    lua_Integer m = n - done < CHUNK ? n - done : CHUNK;
    if (*lbl_stopflag()) {
      /* events are numbered: rewind, so that a retry gets these again */
      ls->next -= (uint64_t)done;
      ls->st = st0;
      lbl_fail(L, "sampler: interrupted by signal %d after %lld of %lld "
               "events (not returned; the sampler stands at event %llu "
               "again, and s:iter(n) makes them %d at a time)",
               (int)*lbl_stopflag(), (long long)done, (long long)n,
               (unsigned long long)ls->next, CHUNK);
    }
    status = bl_sampler_events(ls->s, ls->mode, ls->next, (size_t)m,
                               ls->total, ls->nthreads, ev, &st);
    if (status != BL_SUCCESS)
      luaL_error(L, "sampler: %s", bl_strerror(status));
    bl_sample_stats_add(&ls->st, &st);
    ls->next += (uint64_t)m;
    for (i = 0; i < m; i++) {
      pushevent(L, &ev[i]);
      lua_rawseti(L, -3, done + i + 1);
    }
    done += m;
  }
  lua_pop(L, 1);   /* scratch */
  return n;
}


/* s:events(n) -> the next n events of this shard (fewer at its end). */
static int sampler_events (lua_State *L) {
  LSampler *ls = checksampler(L);
  lua_Integer n = luaL_checkinteger(L, 2);
  luaL_argcheck(L, n >= 0 && n <= BL_SAMPLER_MAXCALL, 2,
                "the number of events must be in [0, 1e8]");
  makeevents(L, ls, n);
  return 1;
}


/* The iterator of s:iter(n): upvalues the sampler, the events left, the
** buffered table and its position. */
static int iter_next (lua_State *L) {
  LSampler *ls = (LSampler *)lua_touserdata(L, lua_upvalueindex(1));
  lua_Integer left = lua_tointeger(L, lua_upvalueindex(2));
  lua_Integer pos = lua_tointeger(L, lua_upvalueindex(4));
  if (ls == NULL || ls->s == NULL)
    return luaL_error(L, "attempt to use a closed sampler");
  if (lua_type(L, lua_upvalueindex(3)) != LUA_TTABLE
      || pos > (lua_Integer)lua_rawlen(L, lua_upvalueindex(3))) {
    lua_Integer got;
    if (left <= 0)
      return 0;
    got = makeevents(L, ls, left < CHUNK ? left : CHUNK);
    if (got == 0)
      return 0;
    lua_replace(L, lua_upvalueindex(3));
    lua_pushinteger(L, left - got);
    lua_replace(L, lua_upvalueindex(2));
    pos = 1;
  }
  lua_rawgeti(L, lua_upvalueindex(3), pos);
  lua_pushinteger(L, pos + 1);
  lua_replace(L, lua_upvalueindex(4));
  return 1;
}


/* s:iter([n]) -> an iterator over the next n events (default: the rest of
** this shard), made CHUNK at a time. */
static int sampler_iter (lua_State *L) {
  LSampler *ls = checksampler(L);
  lua_Integer n = luaL_optinteger(L, 2, (lua_Integer)(ls->hi - ls->next));
  luaL_argcheck(L, n >= 0, 2, "the number of events must be >= 0");
  lua_pushvalue(L, 1);
  lua_pushinteger(L, n);
  lua_pushnil(L);
  lua_pushinteger(L, 1);
  lua_pushcclosure(L, iter_next, 4);
  return 1;
}


/* s:info() -> the settings and setup results (a fresh copy). */
static int sampler_info (lua_State *L) {
  checksampler(L);
  lua_getiuservalue(L, 1, 1);
  return 1;
}


/* s:stats() -> {trials, events, efficiency, overweights, excess,
** nonfinite, sigma, err, next, remaining} of the events made so far. */
static int sampler_stats (lua_State *L) {
  LSampler *ls = checksampler(L);
  double sg, er;
  bl_sampler_sigma(ls->s, ls->mode, &ls->st,
                   ls->mode == BL_SAMPLE_WEIGHTED ? ls->total : 0, &sg, &er);
  lua_createtable(L, 0, 10);
  lua_pushinteger(L, (lua_Integer)ls->st.trials);
  lua_setfield(L, -2, "trials");
  lua_pushinteger(L, (lua_Integer)ls->st.events);
  lua_setfield(L, -2, "events");
  lbl_setnum(L, lua_gettop(L), "efficiency", ls->st.trials > 0
             ? (double)ls->st.events / (double)ls->st.trials : 0.0);
  lua_pushinteger(L, (lua_Integer)ls->st.overweights);
  lua_setfield(L, -2, "overweights");
  lbl_setnum(L, lua_gettop(L), "excess", ls->st.excess);
  lua_pushinteger(L, (lua_Integer)ls->st.nonfinite);
  lua_setfield(L, -2, "nonfinite");
  lbl_setnum(L, lua_gettop(L), "sigma", sg);
  lbl_setnum(L, lua_gettop(L), "err", er);
  lua_pushinteger(L, (lua_Integer)ls->next);
  lua_setfield(L, -2, "next");
  lua_pushinteger(L, (lua_Integer)(ls->hi - ls->next));
  lua_setfield(L, -2, "remaining");
  return 1;
}


static int sampler_tostring (lua_State *L) {
  LSampler *ls = (LSampler *)luaL_checkudata(L, 1, SAMPLERMETA);
  if (ls->s == NULL)
    lua_pushliteral(L, "brakelight.Sampler (closed)");
  else
    lua_pushfstring(L, "brakelight.Sampler (%p)", (void *)ls);
  return 1;
}


static const luaL_Reg sampler_meth[] = {
  {"events", sampler_events},
  {"iter", sampler_iter},
  {"info", sampler_info},
  {"stats", sampler_stats},
  {"close", sampler_gc},
  {NULL, NULL}
};


static const luaL_Reg sampler_meta[] = {
  {"__index", NULL},  /* placeholder */
  {"__gc", sampler_gc},
  {"__close", sampler_gc},
  {"__tostring", sampler_tostring},
  {NULL, NULL}
};


void lbl_sampler_open (lua_State *L) {
  luaL_newmetatable(L, SAMPLERMETA);
  luaL_setfuncs(L, sampler_meta, 0);
  luaL_newlibtable(L, sampler_meth);
  luaL_setfuncs(L, sampler_meth, 0);
  lbl_guardfield(L, "events");            /* long: SIGINT stops it */
  lua_setfield(L, -2, "__index");
  lua_pop(L, 1);
}
