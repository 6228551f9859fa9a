/*
** $Id: lbrakelight.c $
** Lua binding of the brakelight core: the module `brakelight`
** See Copyright Notice in LICENSE
**
** Arguments in, tables out: the physics is the core's (bl_target.h).
** Every library function takes one option table (argument #1), checks all
** of it before computing, and reports bad input as "bad argument #1 to '<name>' (...)" naming the
** field, the value given and what is allowed.  Per-state data (the
** integration workspace) is a userdata upvalue, never a C static.
*/

#include <float.h>
#include <math.h>
#include <stdarg.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include <gsl/gsl_errno.h>

#include "lbl_compat.h"   /* lua.h, lauxlib.h and the 5.4 API on every host */

#include "brakelight.h"
#include "brakelight/lbrakelight.h"
#include "lbl_internal.h"


#define QUADMETA  "brakelight.Quad"       /* integration workspace */
#define PARTMETA  "brakelight.Particle"   /* particle object */
#define TARGETMETA "brakelight.Target"    /* a call's target (internal) */

#define QUAD_LIMIT   1000     /* subintervals per nesting level */
#define MSGSIZE      1024     /* longest error or warning message */
#define NAMESIZE     512      /* longest "allowed: ..." list */
#define OPTSTRLEN    256      /* longest string option (a name) + 1 */

#define RTOL_DEFAULT BL_QUAD_RTOL_DEFAULT
#define RTOL_MIN     BL_QUAD_RTOL_MIN
#define RTOL_MAX     BL_QUAD_RTOL_MAX
#define SCREENING_DEFAULT "hartree-fock"
#define METHOD_DEFAULT    BL_METHOD_AUTO
#define CUSTOM_NAME       "custom"   /* name of a particle made without one */


/*
** {======================================================
** Messages
** =======================================================
*/

/*
** Raise a Lua error with a printf-style message (formatted by C, so %g
** works, unlike lua_pushfstring).  Never returns.
*/
int lbl_fail (lua_State *L, const char *fmt, ...) {
  char msg[MSGSIZE];
  va_list ap;
  va_start(ap, fmt);
  vsnprintf(msg, sizeof msg, fmt, ap);
  va_end(ap);
  luaL_error(L, "%s", msg);
  LBL_UNREACHABLE();
}


/*
** Raise "bad argument #1 to 'fname' (msg)", the message of luaL_argerror,
** with a fixed function name so that it reads the same however the
** function was reached (brakelight.dsdk{...} or pcall(brakelight.dsdk, t)).
** Every library function takes its options as argument #1.  Never returns.
*/
int lbl_argfail (lua_State *L, const char *fname, const char *fmt, ...) {
  char msg[MSGSIZE];
  va_list ap;
  va_start(ap, fmt);
  vsnprintf(msg, sizeof msg, fmt, ap);
  va_end(ap);
  luaL_error(L, "bad argument #1 to '%s' (%s)", fname, msg);
  LBL_UNREACHABLE();
}


/*
** Describe the Lua value at idx for a message, into buf: numbers as
** written, strings quoted, booleans by value, anything else by type name.
** Touches no stack slot.
*/
void lbl_checktext (lua_State *L, int idx, const char *fname,
                    const char *what) {
  char v[80];
  size_t len;
  const char *s = lua_tolstring(L, idx, &len);
  size_t at = strlen(s);
  if (at != len)
    lbl_argfail(L, fname, "%s contains a NUL byte at byte %zu; allowed: text "
                "without NUL bytes, got %s (%zu bytes)", what, at + 1,
                lbl_showval(L, idx, v, sizeof v), len);
}


const char *lbl_showval (lua_State *L, int idx, char *buf, size_t n) {
  switch (lua_type(L, idx)) {
    case LUA_TNUMBER:
      if (lua_isinteger(L, idx))
        snprintf(buf, n, "%lld", (long long)lua_tointeger(L, idx));
      else
        snprintf(buf, n, "%.14g", (double)lua_tonumber(L, idx));
      break;
    case LUA_TSTRING:
      snprintf(buf, n, "'%.60s'", lua_tostring(L, idx));
      break;
    case LUA_TBOOLEAN:
      snprintf(buf, n, "%s", lua_toboolean(L, idx) ? "true" : "false");
      break;
    case LUA_TNONE:
      snprintf(buf, n, "no value");
      break;
    default:
      snprintf(buf, n, "%s", luaL_typename(L, idx));
      break;
  }
  return buf;
}


/*
** Append s to the ", "-separated list in buf (size n), truncating safely.
*/
static void addname (char *buf, size_t n, const char *s) {
  size_t len = strlen(buf);
  if (len + 1 < n)
    snprintf(buf + len, n - len, "%s%s", len > 0 ? ", " : "", s);
}


/* Names of the registered screening models, ", "-separated. */
static const char *modelnames (char *buf, size_t n) {
  int i;
  buf[0] = '\0';
  for (i = 0; bl_models[i] != NULL; i++)
    addname(buf, n, bl_models[i]->name);
  return buf;
}


/* Names of the particle presets, ", "-separated. */
static const char *particlenames (char *buf, size_t n) {
  int i;
  buf[0] = '\0';
  for (i = 0; bl_particles[i] != NULL; i++)
    addname(buf, n, bl_particles[i]->name);
  return buf;
}


/* Names of a NULL-terminated key list, ", "-separated. */
static const char *keynames (const char *const keys[], char *buf, size_t n) {
  int i;
  buf[0] = '\0';
  for (i = 0; keys[i] != NULL; i++)
    addname(buf, n, keys[i]);
  return buf;
}

/* }====================================================== */


/*
** {======================================================
** Reading option tables
** =======================================================
*/

/*
** Check that every key of the table at absolute index t is one of `keys`
** (NULL-terminated).  `what` names the kind of key in the message
** ("option", "particle field").  Raises on the first stranger, so that a
** typo in a scan never passes silently.
*/
static void checkkeys (lua_State *L, int t, const char *fname,
                       const char *what, const char *const keys[]) {
  char names[NAMESIZE], v[80];
  lua_pushnil(L);  /* first key */
  while (lua_next(L, t) != 0) {  /* key at -2, value at -1 */
    int i, known = 0;
    if (lua_type(L, -2) == LUA_TSTRING) {
      const char *key = lua_tostring(L, -2);  /* a string: no conversion */
      for (i = 0; keys[i] != NULL && !known; i++)
        known = (strcmp(key, keys[i]) == 0);
      if (!known)
        lbl_argfail(L, fname, "unknown %s '%.60s'; allowed: %s", what, key,
                keynames(keys, names, sizeof names));
    }
    else
      lbl_argfail(L, fname, "%s names must be strings, got key %s; allowed: %s",
              what, lbl_showval(L, -2, v, sizeof v),
              keynames(keys, names, sizeof names));
    lua_pop(L, 1);  /* remove value, keep key for lua_next */
  }
}


/*
** Read field `key` of the table at absolute index t as a number into *x.
** Returns 0 (and leaves *x) if the field is nil, 1 if it was read; raises
** if it holds something else.  `prefix` ("" or "particle.") qualifies the
** field name in messages.  Stack unchanged.
*/
static int getnum (lua_State *L, int t, const char *fname,
                   const char *prefix, const char *key, double *x) {
  char v[80];
  int tp = lua_getfield(L, t, key);
  if (tp == LUA_TNIL) {
    lua_pop(L, 1);
    return 0;
  }
  if (tp != LUA_TNUMBER)
    lbl_argfail(L, fname, "field '%s%s' must be a number, got %s", prefix, key,
            lbl_showval(L, -1, v, sizeof v));
  *x = (double)lua_tonumber(L, -1);
  lua_pop(L, 1);
  return 1;
}


/*
** As getnum, but the field is required: `meaning` says what it is in the
** message for a missing field.
*/
static double neednum (lua_State *L, int t, const char *fname,
                       const char *prefix, const char *key,
                       const char *meaning) {
  double x = 0;
  if (!getnum(L, t, fname, prefix, key, &x))
    lbl_argfail(L, fname, "missing required field '%s%s' (%s)", prefix, key,
            meaning);
  return x;
}


/*
** Read field `key` of the table at absolute index t as a string into buf
** (size n, so that it outlives the Lua value: an __index function may
** answer with a string nothing else holds); returns NULL if nil, raises
** if it holds something else, a NUL byte, or n bytes or more.  Stack
** unchanged.
*/
static const char *getstr (lua_State *L, int t, const char *fname,
                           const char *key, char *buf, size_t n) {
  char v[80], what[64];
  const char *s;
  size_t len;
  int tp = lua_getfield(L, t, key);
  if (tp == LUA_TNIL) {
    lua_pop(L, 1);
    return NULL;
  }
  if (tp != LUA_TSTRING)
    lbl_argfail(L, fname, "field '%s' must be a string, got %s", key,
            lbl_showval(L, -1, v, sizeof v));
  snprintf(what, sizeof what, "field '%s'", key);
  lbl_checktext(L, -1, fname, what);
  s = lua_tolstring(L, -1, &len);
  if (len >= n)
    lbl_argfail(L, fname, "field '%s' is %zu bytes long; allowed: at most "
                "%zu bytes, got %s", key, len, n - 1,
                lbl_showval(L, -1, v, sizeof v));
  memcpy(buf, s, len + 1);
  lua_pop(L, 1);
  return buf;
}


/* Fields of a particle description table. */
static const char *const particle_keys[] = {
  "name", "mass", "charge", "spin", NULL
};

/*
** Fill *p from the particle description at absolute index t,
** {mass = MeV, charge = z, spin = 0 or 0.5, name = "..."}; mass, charge
** and spin are required, the name defaults to "custom".  `prefix`
** qualifies field names in messages.  The name is copied into namebuf
** (OPTSTRLEN bytes), where p->name points: an __index function may answer
** with a string that nothing else holds.
*/
static void tabparticle (lua_State *L, int t, const char *fname,
                         const char *prefix, bl_particle *p, char *namebuf) {
  char v[80], what[64];
  size_t len;
  checkkeys(L, t, fname, "particle field", particle_keys);
  p->mass = neednum(L, t, fname, prefix, "mass", "particle mass in MeV");
  p->charge = neednum(L, t, fname, prefix, "charge",
                      "particle charge in units of e");
  p->spin = neednum(L, t, fname, prefix, "spin", "particle spin, 0 or 0.5");
  p->flags = 0;
  if (!(p->mass > 0 && isfinite(p->mass)))
    lbl_argfail(L, fname, "field '%smass' must be > 0 MeV and finite, got %.14g",
            prefix, p->mass);
  if (!(p->charge != 0 && isfinite(p->charge)))
    lbl_argfail(L, fname, "field '%scharge' must be a finite non-zero charge "
            "in units of e, got %.14g", prefix, p->charge);
  if (!(p->spin == 0 || p->spin == 0.5))
    lbl_argfail(L, fname, "field '%sspin' must be 0 or 0.5, got %.14g",
            prefix, p->spin);
  if (lua_getfield(L, t, "name") == LUA_TNIL)
    snprintf(namebuf, OPTSTRLEN, "%s", CUSTOM_NAME);
  else if (lua_type(L, -1) == LUA_TSTRING) {
    snprintf(what, sizeof what, "field '%sname'", prefix);
    lbl_checktext(L, -1, fname, what);
    (void)lua_tolstring(L, -1, &len);
    if (len >= OPTSTRLEN)
      lbl_argfail(L, fname, "field '%sname' is %zu bytes long; allowed: at "
                  "most %d bytes", prefix, len, OPTSTRLEN - 1);
    memcpy(namebuf, lua_tostring(L, -1), len + 1);
  }
  else
    lbl_argfail(L, fname, "field '%sname' must be a string, got %s", prefix,
            lbl_showval(L, -1, v, sizeof v));
  lua_pop(L, 1);
  p->name = namebuf;
  if (bl_particle_check(p) != BL_SUCCESS)  /* the core's own view */
    lbl_argfail(L, fname, "particle '%.60s' rejected by the core: %s", p->name,
            bl_strerror(bl_particle_check(p)));
}


/* Everything a computation needs besides its abscissae. */
typedef struct Opts {
  const char *fname;          /* Lua name of the function, for messages */
  bl_particle particle;
  bl_material target;
  int Z;                      /* the component being computed (messages) */
  const bl_model *screening;
  bl_opts bo;                 /* electrons, nucleus, corrections */
  double T;                   /* kinetic energy, MeV */
  double rtol;                /* relative tolerance (integrals only) */
  int userol;                 /* rtol is an option of this function */
  int method;                 /* BL_METHOD_* requested */
  unsigned used;              /* bit 1 << BL_METHOD_* of each method used */
  bl_suppress sup;            /* LPM / dielectric suppression */
  char pname[OPTSTRLEN];      /* the particle's name, owned here */
} Opts;


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
                particlenames(names, sizeof names));
      o->particle = *pre;
      break;
    case LUA_TTABLE:
      tabparticle(L, lua_gettop(L), o->fname, "particle.", &o->particle,
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


/*
** Read options 'method' (default "auto") and 'suppression' (default
** "none"; needs a target with a density).  Functions that do not take
** them have already refused the keys.
*/
static void optmethod (lua_State *L, Opts *o) {
  char buf[OPTSTRLEN];
  const char *s = getstr(L, 1, o->fname, "method", buf, sizeof buf);
  int st, mode;
  o->method = s == NULL ? METHOD_DEFAULT : bl_method_find(s);
  if (o->method < 0)
    lbl_argfail(L, o->fname, "unknown method '%.60s' in field 'method'; "
                "allowed: 'auto' (default), 'born', 'high-energy', "
                "'complete'", s);
  if (o->method == BL_METHOD_COMPLETE
      && o->screening->id == BL_MODEL_NONE)
    lbl_argfail(L, o->fname, "field 'method' is 'complete', but screening "
                "'none' has no complete-screening limit; allowed with "
                "'none': 'auto', 'born', 'high-energy'");
  s = getstr(L, 1, o->fname, "suppression", buf, sizeof buf);
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
static void readopts (lua_State *L, const char *fname,
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
  checkkeys(L, 1, fname, "option", keys);
  optparticle(L, o);
  opttarget(L, o);
  o->T = neednum(L, 1, fname, "", "T", "kinetic energy in MeV");
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
  s = getstr(L, 1, fname, "screening", sbuf, sizeof sbuf);
  o->screening = bl_model_find(s ? s : SCREENING_DEFAULT);
  if (o->screening == NULL)
    lbl_argfail(L, fname, "unknown screening model '%.60s' in field 'screening'; "
            "allowed: %s", s ? s : SCREENING_DEFAULT,
            modelnames(names, sizeof names));
  o->rtol = RTOL_DEFAULT;
  if (userol && getnum(L, 1, fname, "", "rtol", &o->rtol)
      && !(o->rtol >= RTOL_MIN && o->rtol <= RTOL_MAX))
    lbl_argfail(L, fname, "field 'rtol' must be a relative tolerance in "
            "[%g, %g], got %.14g", RTOL_MIN, RTOL_MAX, o->rtol);
  o->bo = bl_opts_default;
  s = getstr(L, 1, fname, "nucleus", sbuf, sizeof sbuf);
  if (s == NULL || strcmp(s, "uniform") == 0)
    o->bo.nucleus = BL_NUCLEUS_UNIFORM;
  else if (strcmp(s, "point") == 0)
    o->bo.nucleus = BL_NUCLEUS_POINT;
  else
    lbl_argfail(L, fname, "unknown nucleus model '%.60s' in field 'nucleus'; "
            "allowed: 'uniform' (default), 'point'", s);
  switch (lua_getfield(L, 1, "electrons")) {
    case LUA_TNIL: break;
    case LUA_TBOOLEAN:
      o->bo.electrons = lua_toboolean(L, -1);
      break;
    default:
      lbl_argfail(L, fname, "field 'electrons' must be a boolean (true: "
              "default, false), got %s", lbl_showval(L, -1, v, sizeof v));
  }
  lua_pop(L, 1);
  o->bo.coulomb = optswitch(L, fname, "coulomb");
  o->bo.elwert = optswitch(L, fname, "elwert");
  optmethod(L, o);
}


/*
** Read the required scalar option `key`, which must lie in (lo, hi)
** (open = 1) or [lo, hi] (open = 0); `range` describes the interval
** in the message ("(0, T) = (0, 20) MeV").  NaN and infinities fail.
*/
static double optrange (lua_State *L, const Opts *o, const char *key,
                        const char *meaning, double lo, double hi, int open,
                        const char *range) {
  double x = neednum(L, 1, o->fname, "", key, meaning);
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
static double *optarray (lua_State *L, const Opts *o, const char *key,
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

/* }====================================================== */


/*
** {======================================================
** Computing: workspace, case, results, warnings
** =======================================================
*/

typedef struct LQuad {
  bl_quad *q;   /* NULL when closed */
} LQuad;


/*
** The state's integration workspace (upvalue 1 of every library
** function), set to the tolerance of *o.
*/
static bl_quad *getquad (lua_State *L, const Opts *o) {
  LQuad *lq = (LQuad *)luaL_testudata(L, lua_upvalueindex(1), QUADMETA);
  int st;
  if (lq == NULL || lq->q == NULL)
    luaL_error(L, "%s: the integration workspace of brakelight is closed",
               o->fname);
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
static void retol (const Opts *o, bl_quad *q) {
  if (q != NULL)
    bl_quad_set_rtol(q, o->rtol);   /* checked by readopts: cannot fail */
}


/*
** The target of a call: a core bl_target (the cases of every element,
** the method's tables, the suppression) in a userdata, so that the
** collector releases it on any error.
*/
static int target_gc (lua_State *L) {
  bl_target *t = (bl_target *)luaL_checkudata(L, 1, TARGETMETA);
  bl_target_release(t);
  return 0;
}


/* Push a new target for *o, set up and prepared with q (NULL: set up
** only); raises if the core refuses an element. */
static bl_target *maketarget (lua_State *L, Opts *o, bl_quad *q) {
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
static void checkresult (lua_State *L, const Opts *o, int st,
                         const bl_result *r, const char *where) {
  if (st != BL_SUCCESS && st != BL_ENONFINITE && !bl_status_soft(st))
    lbl_fail(L, "%s: %s for %s on Z = %d at T = %g MeV, %s (estimate %g +- %g)",
         o->fname, bl_strerror(st), o->particle.name, o->Z, o->T, where,
         r->val, r->err);
  if (st == BL_ENONFINITE || !isfinite(r->val) || !isfinite(r->err))
    lbl_fail(L, "%s: non-finite result %g +- %g for %s on Z = %d at T = %g MeV, "
         "%s (please report this case)", o->fname, r->val, r->err,
         o->particle.name, o->Z, o->T, where);
}


/* Warnings gathered over the points of one call. */
typedef struct Warnings {
  unsigned bits;       /* union of BL_WARN_* over all points and the case */
  int npts, ntol;      /* points computed / points short of the tolerance */
  double worst;        /* worst relative error estimate among the latter */
  char worstat[64];    /* where it was ("k = 5 MeV") */
  double kborn;        /* largest k flagged BL_WARN_BORN; < 0: none */
  int zborn;           /* largest Z flagged BL_WARN_BORN */
  unsigned applied;    /* union of BL_APPLIED_* over all points */
  double minsup;       /* smallest suppression factor applied */
} Warnings;


/* Start a collection with the target's own warnings. */
static void initwarn (Warnings *w, const bl_target *t) {
  memset(w, 0, sizeof *w);
  w->bits = t->warn;
  w->kborn = -1;
  w->minsup = 1.0;
}


/* Add one point's result, computed at photon energy k, described by `at`. */
static void addwarn (Warnings *w, const bl_result *r, double k,
                     const char *at) {
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
}


/*
** Take what a target result gathered over its elements into the call's
** record: the Born element, the smallest suppression factor, the methods
** used, and the element the messages name.
*/
static void addtarget (Opts *o, Warnings *w, const bl_tresult *tr) {
  if (tr->zborn > w->zborn)
    w->zborn = tr->zborn;
  if (tr->supp < w->minsup)
    w->minsup = tr->supp;
  o->used |= tr->used;
  o->Z = tr->Z;
}


/*
** One point of the target (bl_target_point_e) with the call's record;
** raises on a hard failure.
*/
static void computepoint (lua_State *L, Opts *o, const bl_target *t, int kind,
                          double k, double theta_k, double theta_p,
                          double phi, bl_quad *q, Warnings *w,
                          const char *at, bl_result *sum) {
  bl_tresult tr;
  int st;
  retol(o, q);
  st = bl_target_point_e(t, kind, k, theta_k, theta_p, phi, q, &tr);
  o->Z = tr.Z;
  if (st != BL_SUCCESS && !bl_status_soft(st))
    checkresult(L, o, st, &tr.fail, at);
  addtarget(o, w, &tr);
  *sum = tr.r;
  addwarn(w, sum, k, at);
}


/* Push the string for warning bit `bit`, with the numbers of this call. */
static void pushwarning (lua_State *L, const Opts *o, const Warnings *w,
                         unsigned bit) {
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
    case BL_WARN_POINTLIKE:
      snprintf(msg, sizeof msg, "%s: %s (mass %g MeV) treated as point-like",
               text, p->name, p->mass);
      break;
    case BL_WARN_BORN: {  /* the core's criterion: 2 pi |z| Z alpha / beta */
      const char *corr =
          (w->applied & BL_APPLIED_COULOMB) && (w->applied & BL_APPLIED_ELWERT)
          ? "the Coulomb correction and the Elwert factor were applied"
          : (w->applied & BL_APPLIED_COULOMB)
          ? "the Coulomb correction was applied"
          : (w->applied & BL_APPLIED_ELWERT)
          ? "the Elwert factor was applied"
          : "no correction holds here (README, Corrections)";
      if (w->kborn > 0 && w->kborn < o->T)
        snprintf(msg, sizeof msg, "%s (2 pi |z| Z alpha/beta = %.3g before "
                 "emission, %.3g after emitting k = %g MeV; z = %g, Z = %d, "
                 "T = %g MeV); %s", text,
                 bl_born_xi(p->charge, zb, o->T, p->mass),
                 bl_born_xi(p->charge, zb, o->T - w->kborn, p->mass),
                 w->kborn, p->charge,
                 zb, o->T, corr);
      else
        snprintf(msg, sizeof msg, "%s (2 pi |z| Z alpha/beta = %.3g; z = %g, "
                 "Z = %d, T = %g MeV); %s", text,
                 bl_born_xi(p->charge, zb, o->T, p->mass),
                 p->charge, zb, o->T, corr);
      break;
    }
    case BL_WARN_VALIDITY:
      snprintf(msg, sizeof msg, "%s (screening '%s', %s, target %s, "
               "T = %g MeV)", text, o->screening->name, p->name,
               o->target.name, o->T);
      break;
    case BL_WARN_COULOMB:
      snprintf(msg, sizeof msg, "%s: it holds for gamma >= %g before and "
               ">= %g after emission and hbar/(m c) >= %g nuclear radii; here "
               "gamma0 = %.4g, hbar/(m c) = %.3g fm (%s, target %s; for "
               "angular distributions it is not available at all)", text,
               BL_COULOMB_GAMMA0_MIN, BL_COULOMB_GAMMA_MIN, BL_COULOMB_RADII,
               g0, BL_HBARC_MEVFM / p->mass, p->name, o->target.name);
      break;
    case BL_WARN_ELWERT:
      snprintf(msg, sizeof msg, "%s: it holds for gamma0 <= %.4g (T <= %g MeV "
               "for electrons); here gamma0 = %.4g (%s, T = %g MeV)", text,
               BL_ELWERT_GAMMA0_MAX, BL_ELWERT_T_ELECTRON, g0, p->name, o->T);
      break;
    case BL_WARN_STATIC_E:
      snprintf(msg, sizeof msg, "%s (%s, mass %g MeV; electrons = false "
               "leaves the nucleus only)", text, p->name, p->mass);
      break;
    case BL_WARN_METHOD:
      snprintf(msg, sizeof msg, "%s: method '%s' holds for a final gamma = "
               "E/m >= %g (complete screening also needs Tsai's gamma <= "
               "%g and a point-like nucleus); here gamma0 = %.4g (%s, "
               "target %s); method 'born' or 'auto' is exact", text,
               bl_method_name(o->method), BL_HE_GAMMA_MIN,
               BL_COMPLETE_TSAI_GAMMA_MAX, g0, p->name, o->target.name);
      break;
    case BL_WARN_SUPPRESS:
      snprintf(msg, sizeof msg, "%s (Stanev et al. fits, Klein 1999 review); "
               "E_LPM = %.4g MeV for %s in %s (X0 = %.4g cm)%s; smallest "
               "factor %.4g", text, o->sup.elpm, p->name, o->target.name,
               o->sup.X0cm, o->sup.mode == BL_SUPPRESS_DIELECTRIC
               ? ", with dielectric suppression" : "", w->minsup);
      break;
    case BL_WARN_CLAMPED:
      snprintf(msg, sizeof msg, "%s (%s on %s at T = %g MeV, near the tip of "
               "the spectrum; coulomb = false gives the uncorrected value, "
               "method = 'born' the exact integral)", text, p->name,
               o->target.name, o->T);
      break;
    default:
      snprintf(msg, sizeof msg, "%s (warning bit 0x%x)", text, bit);
      break;
  }
  lua_pushstring(L, msg);
}


/*
** Push the list of warnings: one string per bit set, in bit order, so the
** list is deduplicated by construction; empty when none.
*/
static void pushwarnings (lua_State *L, const Opts *o, const Warnings *w) {
  unsigned i;
  int n = 0;
  lua_newtable(L);
  for (i = 0; i < 8 * sizeof w->bits; i++) {
    unsigned bit = 1u << i;
    if (w->bits & bit) {
      pushwarning(L, o, w, bit);
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
static double pergram (const Opts *o) {
  return bl_material_per_gram(&o->target);
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
  lua_pushnumber(L, pergram(o));
  lua_setfield(L, -2, "per_gram");
  lua_setfield(L, -2, "target");
  lua_pushnumber(L, o->T);
  lua_setfield(L, -2, "T");
  lua_pushstring(L, o->screening->name);
  lua_setfield(L, -2, "screening");
  if (o->userol) {
    lua_pushnumber(L, o->rtol);
    lua_setfield(L, -2, "rtol");
  }
  lua_pushstring(L, o->bo.nucleus == BL_NUCLEUS_UNIFORM ? "uniform" : "point");
  lua_setfield(L, -2, "nucleus");
  lua_pushboolean(L, o->bo.electrons && o->screening->incoherent != NULL);
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
static void setresult (lua_State *L, int t, int first,
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
  pushwarnings(L, o, w);
  lua_setfield(L, t, "warnings");
}

/* }====================================================== */


/*
** {======================================================
** Limits on the work of one call
** A call computes all its points before it returns, and the runner sees
** Ctrl-C only between Lua instructions, so a request that would run for
** hours is refused up front (scans, lua/brakelight/scan.lua, save every
** point and stop at Ctrl-C).  Estimated integrand calls per dsigma/dk
** point, mean over electrons and muons on Pb, T = 1 MeV..100 GeV,
** y = 0.01..0.99, default options (measured on the core, issue 6):
** 7.4e3 at rtol 1e-2, 9.8e3 at 1e-4, 2.6e4 at 1e-8, 9.1e4 at 1e-12,
** about 4.5e3 * 10^(0.11 log10(1/rtol)); the largest single points cost
** 3 to 4 times the mean.  An angular point costs about 1/60 of that.
** At roughly 0.4 microseconds per call, WORK_MAX is about an hour.
** =======================================================
*/

/*
** Refuse n points of array option `key` (each costing `share` of a
** dsigma/dk point per element of the target) when the estimate exceeds
** WORK_MAX, saying how many points this rtol allows.
*/
static void checkwork (lua_State *L, const Opts *o, const char *key,
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

/* }====================================================== */


/*
** {======================================================
** Library functions
** =======================================================
*/

/* Option names of each function, in the order the messages list them. */
static const char *const dsdk_keys[] = {
  "particle", "target", "T", "k", "screening", "rtol", "nucleus",
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
static const char *const cross_section_keys[] = {
  "particle", "target", "T", "kmin", "kmax", "screening", "rtol", "nucleus",
  "electrons", "coulomb", "elwert", "method", "suppression", NULL
};
static const char *const energy_loss_keys[] = {
  "particle", "target", "T", "screening", "rtol", "nucleus", "electrons",
  "coulomb", "elwert", "method", "suppression", NULL
};
static const char *const photon_yield_keys[] = {
  "particle", "target", "T", "thickness", "kmin", "kmax", "bins", "spacing",
  "screening", "rtol", "nucleus", "electrons", "coulomb", "elwert", "method",
  "suppression", NULL
};


/*
** Refuse coulomb = true where the correction is not defined, and a method
** other than the Born integral for angular distributions ("auto" means
** born there).
*/
static void nocoulomb (lua_State *L, Opts *o) {
  if (o->bo.coulomb == BL_APPLY_ON)
    lbl_argfail(L, o->fname, "field 'coulomb' is true, but the Coulomb "
                "correction is known for dsigma/dk only (spectrum, dsdk); "
                "allowed here: false or 'auto' (not applied)");
  if (o->method != BL_METHOD_BORN && o->method != BL_METHOD_AUTO)
    lbl_argfail(L, o->fname, "field 'method' is '%s', but angular "
                "distributions come from the Born integral only; allowed "
                "here: 'auto' (default) or 'born'", bl_method_name(o->method));
  o->method = BL_METHOD_BORN;
}


/* Push the table of one point's extras: per_gram, corrections applied. */
static void pushinfo (lua_State *L, const Opts *o, const bl_result *r) {
  lua_createtable(L, 0, 4);
  lua_pushnumber(L, pergram(o));
  lua_setfield(L, -2, "per_gram");
  lua_pushboolean(L, (r->applied & BL_APPLIED_COULOMB) != 0);
  lua_setfield(L, -2, "coulomb_applied");
  lua_pushboolean(L, (r->applied & BL_APPLIED_ELWERT) != 0);
  lua_setfield(L, -2, "elwert_applied");
  pushsettings(L, o);
  lua_setfield(L, -2, "settings");
}


/* Read option 'k', required, in (0, T). */
static double optk (lua_State *L, const Opts *o) {
  char range[96];
  snprintf(range, sizeof range, "(0, T) = (0, %.14g) MeV", o->T);
  return optrange(L, o, "k", "photon energy in MeV", 0, o->T, 1, range);
}


/*
** brakelight.dsdk{particle =, target =, T =, k =, ...}
**   -> dsigma/dk (mb/MeV per atom), its error estimate, warnings list
*/
static int l_dsdk (lua_State *L) {
  Opts o;
  bl_target *t;
  bl_result r;
  bl_quad *q;
  Warnings w;
  double k;
  char at[64];
  readopts(L, "dsdk", dsdk_keys, 1, &o);
  k = optk(L, &o);
  /* all checks done */
  q = getquad(L, &o);
  t = maketarget(L, &o, q);
  initwarn(&w, t);
  snprintf(at, sizeof at, "k = %.6g MeV", k);
  computepoint(L, &o, t, BL_TARGET_DK, k, 0.0, 0.0, 0.0, q, &w, at, &r);
  lua_pushnumber(L, r.val);
  lua_pushnumber(L, r.err);
  pushwarnings(L, &o, &w);
  pushinfo(L, &o, &r);
  return 4;
}


/* Push a boolean array slot: t[i] = v. */
static void setbool (lua_State *L, int t, lua_Integer i, int v) {
  lua_pushboolean(L, v);
  lua_rawseti(L, t, i);
}


/*
** Threads for one spectrum: option 'threads' (integer >= 0, 0: one per
** processor), else the environment variable BRAKELIGHT_THREADS, else 1
** (scans and the runner's -j already keep the cores busy).
*/
static int optthreads (lua_State *L, const Opts *o) {
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


/*
** brakelight.spectrum{..., k = {...}} or {..., y = {...}}
**   -> {k, y, dsdk, err, coulomb_applied, elwert_applied, method, per_gram,
**       threads, units, settings, warnings}
*/
static int l_spectrum (lua_State *L) {
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
  readopts(L, "spectrum", spectrum_keys, 1, &o);
  nthreads = optthreads(L, &o);
  hask = (lua_getfield(L, 1, "k") != LUA_TNIL);
  hasy = (lua_getfield(L, 1, "y") != LUA_TNIL);
  lua_pop(L, 2);
  if (hask == hasy)
    lbl_argfail(L, o.fname, "give exactly one of fields 'k' (photon energies, "
            "MeV) and 'y' (fractions k/T), got %s", hask ? "both" : "neither");
  if (hask) {
    snprintf(range, sizeof range, "(0, T) = (0, %.14g) MeV", o.T);
    x = optarray(L, &o, "k", 0, o.T, 1, range, &n);   /* 2: the values */
  }
  else
    x = optarray(L, &o, "y", 0, 1, 1, "(0, 1)", &n);  /* 2: the values */
  checkwork(L, &o, hask ? "k" : "y", n, 1.0);
  /* all checks done */
  q = getquad(L, &o);
  t = maketarget(L, &o, q);                     /* 3: the target */
  initwarn(&w, t);
  k = (double *)lua_newuserdatauv(L, (size_t)n * sizeof *k, 0);  /* 4 */
  res = (bl_tresult *)lua_newuserdatauv(L, (size_t)n * sizeof *res, 0);
  for (i = 0; i < n; i++)                       /* 5: results */
    k[i] = hask ? x[i] : x[i] * o.T;
  sts = (int *)lua_newuserdatauv(L, (size_t)n * sizeof *sts, 0);  /* 6 */
  retol(&o, q);
  st = bl_target_spectrum_e(t, (size_t)n, k, nthreads, q, res, sts);
  if (st == BL_ENOMEM)
    lbl_fail(L, "%s: out of memory for %lld points", o.fname, (long long)n);
  if (st != BL_SUCCESS)               /* the point that failed */
    for (i = 0; i < n; i++)
      if (sts[i] != BL_SUCCESS && !bl_status_soft(sts[i])) {
        o.Z = res[i].Z;
        snprintf(at, sizeof at, "k = %.6g MeV", k[i]);
        checkresult(L, &o, sts[i], &res[i].fail, at);
      }
  for (i = 0; i < n; i++)
    addtarget(&o, &w, &res[i]);
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
    addwarn(&w, r, ki, at);
    lua_pushnumber(L, ki);
    lua_rawseti(L, 7, i);
    lua_pushnumber(L, hask ? ki / o.T : x[i - 1]);   /* y as given */
    lua_rawseti(L, 8, i);
    lua_pushnumber(L, r->val);
    lua_rawseti(L, 9, i);
    lua_pushnumber(L, r->err);
    lua_rawseti(L, 10, i);
    setbool(L, 11, i, (r->applied & BL_APPLIED_COULOMB) != 0);
    setbool(L, 12, i, (r->applied & BL_APPLIED_ELWERT) != 0);
    lua_pushstring(L, bl_method_name(r->method));
    lua_rawseti(L, 13, i);
  }
  lua_createtable(L, 0, 12);          /* 14: result */
  setresult(L, 14, 7, names, units, &o, &w);
  lua_pushnumber(L, pergram(&o));
  lua_setfield(L, 14, "per_gram");
  lua_pushinteger(L, nthreads);
  lua_setfield(L, 14, "threads");
  return 1;
}


/*
** {======================================================
** Integrals over the photon energy
** =======================================================
*/

/*
** An integral of the target over (kmin, kmax) (bl_target_kintegral_e):
** moment 0 into *r0 and, if r1 is not NULL, moment 1 into *r1; if r0 is
** NULL, moment 1 alone.  Raises on a hard failure, naming where.
*/
static void kintegral (lua_State *L, Opts *o, const bl_target *t, int kind,
                       double theta, double kmin, double kmax, bl_quad *q,
                       Warnings *w, bl_result *r0, bl_result *r1) {
  bl_tresult t0, t1;
  const bl_tresult *any = r0 != NULL ? &t0 : &t1;
  char at[96];
  int st;
  retol(o, q);
  st = bl_target_kintegral_e(t, kind, theta, kmin, kmax, q,
                             r0 != NULL ? &t0 : NULL, r1 != NULL ? &t1 : NULL);
  addtarget(o, w, any);
  if (st != BL_SUCCESS && !bl_status_soft(st))   /* where it failed */
    snprintf(at, sizeof at, "the integral over k in (%.6g, %.6g) MeV, at "
             "k = %.6g MeV", kmin, kmax, any->k);
  else
    snprintf(at, sizeof at, "the integral over k in (%.6g, %.6g) MeV", kmin,
             kmax);
  if (r0 != NULL) {
    checkresult(L, o, st, &t0.r, at);
    *r0 = t0.r;
    addwarn(w, r0, kmax, at);
  }
  if (r1 != NULL) {
    checkresult(L, o, st, &t1.r, at);
    *r1 = t1.r;
    addwarn(w, r1, kmax, at);
  }
}


/* Read kmin (required, in (0, T)) and kmax (default T, in (kmin, T]). */
static void optwindow (lua_State *L, const Opts *o, double *kmin,
                       double *kmax) {
  char range[128];
  snprintf(range, sizeof range, "(0, T) = (0, %.14g) MeV", o->T);
  *kmin = optrange(L, o, "kmin", "lowest photon energy in MeV", 0, o->T, 1,
                   range);
  *kmax = o->T;
  if (lua_getfield(L, 1, "kmax") != LUA_TNIL) {
    double x = neednum(L, 1, o->fname, "", "kmax",
                       "highest photon energy in MeV");
    if (!(x > *kmin && x <= o->T))
      lbl_argfail(L, o->fname, "field 'kmax' must be in (kmin, T] = "
                  "(%.14g, %.14g] MeV, got %.14g", *kmin, o->T, x);
    *kmax = x;
  }
  lua_pop(L, 1);
}


/* Set up the target, workspace and warnings of one integrating call. */
static bl_target *kstart (lua_State *L, Opts *o, bl_quad **q, Warnings *w) {
  bl_target *t;
  *q = getquad(L, o);
  t = maketarget(L, o, *q);
  initwarn(w, t);
  return t;
}


/* t[key] = v for the table at absolute index t. */
static void setnum (lua_State *L, int t, const char *key, double v) {
  lua_pushnumber(L, v);
  lua_setfield(L, t, key);
}


/*
** brakelight.cross_section{..., kmin =, kmax =}
**   -> {sigma, err, mean_k, mean_k_err, kmin, kmax, per_gram, units,
**       settings, warnings}: photons emitted with kmin < k < kmax
*/
static int l_cross_section (lua_State *L) {
  static const char *const units[] = {
    "sigma", "mb", "err", "mb", "mean_k", "MeV", "mean_k_err", "MeV",
    "kmin", "MeV", "kmax", "MeV", "per_gram", "cm^2/g per mb", NULL
  };
  static const char *const none[] = {NULL};
  Opts o;
  bl_target *t;
  bl_quad *q;
  Warnings w;
  bl_result r0, r1;
  double kmin, kmax, mean, meanerr;
  readopts(L, "cross_section", cross_section_keys, 1, &o);
  optwindow(L, &o, &kmin, &kmax);
  /* all checks done */
  t = kstart(L, &o, &q, &w);             /* 2: the target */
  kintegral(L, &o, t, BL_TARGET_DK, 0.0, kmin, kmax, q, &w, &r0, &r1);
  bl_target_mean_k(&r0, &r1, kmin, kmax, &mean, &meanerr);
  lua_createtable(L, 0, 12);             /* 3: result */
  setnum(L, 3, "sigma", r0.val);
  setnum(L, 3, "err", r0.err);
  setnum(L, 3, "mean_k", mean);
  setnum(L, 3, "mean_k_err", meanerr);
  setnum(L, 3, "kmin", kmin);
  setnum(L, 3, "kmax", kmax);
  setnum(L, 3, "per_gram", pergram(&o));
  setresult(L, 3, 4, none, units, &o, &w);
  return 1;
}


/*
** brakelight.energy_loss{particle =, target =, T =, ...}
**   -> {dedx, err, per_unit, radiation_length, E_over_X0, units, settings,
**       warnings}: the radiative stopping power int_0^T k dsigma/dk dk
*/
static int l_energy_loss (lua_State *L) {
  static const char *const units[] = {
    "dedx", "MeV cm^2/g", "err", "MeV cm^2/g", "per_unit",
    "MeV mb per formula unit", "radiation_length", "g/cm^2",
    "E_over_X0", "MeV cm^2/g", NULL
  };
  static const char *const none[] = {NULL};
  Opts o;
  bl_target *t;
  bl_quad *q;
  Warnings w;
  bl_result r1;
  double X0;
  readopts(L, "energy_loss", energy_loss_keys, 1, &o);
  /* all checks done */
  t = kstart(L, &o, &q, &w);             /* 2: the target */
  kintegral(L, &o, t, BL_TARGET_DK, 0.0, 0.0, o.T, q, &w, NULL, &r1);
  X0 = bl_radiation_length(&o.target);
  lua_createtable(L, 0, 10);             /* 3: result */
  setnum(L, 3, "dedx", r1.val * pergram(&o));
  setnum(L, 3, "err", r1.err * pergram(&o));
  setnum(L, 3, "per_unit", r1.val);
  setnum(L, 3, "radiation_length", X0);
  setnum(L, 3, "E_over_X0", X0 > 0.0 ? (o.T + o.particle.mass) / X0 : 0.0);
  setresult(L, 3, 4, none, units, &o, &w);
  return 1;
}


/*
** brakelight.photon_yield{particle =, target =, T =, thickness =, kmin =,
**   kmax =, bins =, spacing =}
**   -> {edges, k_low, k_high, photons, err, total, thickness,
**       thickness_X0, radiation_length, note, units, settings, warnings}:
**   photons per incident particle in each bin of a thin radiator
*/
static int l_photon_yield (lua_State *L) {
  static const char *const units[] = {
    "edges", "MeV", "k_low", "MeV", "k_high", "MeV", "photons",
    "per incident particle", "err", "per incident particle", "total",
    "per incident particle", "thickness", "g/cm^2", "thickness_X0", "1",
    "radiation_length", "g/cm^2", NULL
  };
  static const char *const none[] = {NULL};
  static const char *const note = "thin radiator: the projectile's energy "
    "loss and deflection inside it, photon absorption and multiple "
    "emission are neglected";
  char v[80], at[96];
  Opts o;
  bl_target *t;
  bl_quad *q;
  Warnings w;
  bl_tresult *res;
  double kmin, kmax, th, X0, total = 0.0, *edges;
  lua_Integer nb = 1, i;
  int logsp = 0, isint, st, failbin;
  const char *sp;
  char spbuf[OPTSTRLEN];
  readopts(L, "photon_yield", photon_yield_keys, 1, &o);
  th = optrange(L, &o, "thickness", "radiator thickness in g/cm^2", 0,
                HUGE_VAL, 1, "(0, inf) g/cm^2");
  optwindow(L, &o, &kmin, &kmax);
  if (lua_getfield(L, 1, "bins") != LUA_TNIL) {
    nb = lua_tointegerx(L, -1, &isint);
    if (!isint || nb < 1 || nb > BL_YIELD_MAXBINS)
      lbl_argfail(L, o.fname, "field 'bins' must be an integer in 1..%d, "
                  "got %s", BL_YIELD_MAXBINS, lbl_showval(L, -1, v, sizeof v));
  }
  lua_pop(L, 1);
  checkwork(L, &o, "bins", nb, BL_WORK_KINTEGRAL);
  sp = getstr(L, 1, o.fname, "spacing", spbuf, sizeof spbuf);
  if (sp != NULL && strcmp(sp, "log") == 0)
    logsp = 1;
  else if (sp != NULL && strcmp(sp, "linear") != 0)
    lbl_argfail(L, o.fname, "unknown spacing '%.60s' in field 'spacing'; "
                "allowed: 'linear' (default), 'log'", sp);
  /* all checks done */
  t = kstart(L, &o, &q, &w);             /* 2: the target */
  X0 = bl_radiation_length(&o.target);
  edges = (double *)lua_newuserdatauv(L, (size_t)(nb + 1) * sizeof *edges,
                                      0);            /* 3 */
  res = (bl_tresult *)lua_newuserdatauv(L, (size_t)nb * sizeof *res, 0);
  retol(&o, q);
  st = bl_target_photon_yield_e(t, th, kmin, kmax, (int)nb,
                                logsp ? BL_SPACING_LOG : BL_SPACING_LINEAR, q,
                                edges, res, &failbin);   /* 4: results */
  for (i = 0; i < nb && (failbin < 0 || i <= failbin); i++) {
    int sti = i == failbin ? st : BL_SUCCESS;
    addtarget(&o, &w, &res[i]);
    if (sti != BL_SUCCESS)
      snprintf(at, sizeof at, "the integral over k in (%.6g, %.6g) MeV, at "
               "k = %.6g MeV", edges[i], edges[i + 1], res[i].k);
    else
      snprintf(at, sizeof at, "the integral over k in (%.6g, %.6g) MeV",
               edges[i], edges[i + 1]);
    checkresult(L, &o, sti, &res[i].r, at);
    addwarn(&w, &res[i].r, edges[i + 1], at);
  }
  lua_createtable(L, (int)nb + 1, 0);    /* 5: edges */
  lua_createtable(L, (int)nb, 0);        /* 6: k_low */
  lua_createtable(L, (int)nb, 0);        /* 7: k_high */
  lua_createtable(L, (int)nb, 0);        /* 8: photons */
  lua_createtable(L, (int)nb, 0);        /* 9: err */
  for (i = 0; i <= nb; i++) {
    lua_pushnumber(L, edges[i]);
    lua_rawseti(L, 5, i + 1);
  }
  for (i = 1; i <= nb; i++) {
    total += res[i - 1].r.val;
    lua_pushnumber(L, edges[i - 1]);
    lua_rawseti(L, 6, i);
    lua_pushnumber(L, edges[i]);
    lua_rawseti(L, 7, i);
    lua_pushnumber(L, res[i - 1].r.val);
    lua_rawseti(L, 8, i);
    lua_pushnumber(L, res[i - 1].r.err);
    lua_rawseti(L, 9, i);
  }
  lua_createtable(L, 0, 16);             /* 10: result */
  setresult(L, 10, 5, none, units, &o, &w);
  lua_pushvalue(L, 5);
  lua_setfield(L, 10, "edges");
  lua_pushvalue(L, 6);
  lua_setfield(L, 10, "k_low");
  lua_pushvalue(L, 7);
  lua_setfield(L, 10, "k_high");
  lua_pushvalue(L, 8);
  lua_setfield(L, 10, "photons");
  lua_pushvalue(L, 9);
  lua_setfield(L, 10, "err");
  setnum(L, 10, "total", total);
  setnum(L, 10, "thickness", th);
  setnum(L, 10, "radiation_length", X0);
  setnum(L, 10, "thickness_X0", X0 > 0.0 ? th / X0 : 0.0);
  lua_pushstring(L, note);
  lua_setfield(L, 10, "note");
  if (X0 > 0.0 && th > BL_YIELD_THIN_X0 * X0) {   /* one more warning */
    char msg[MSGSIZE];
    snprintf(msg, sizeof msg, "the radiator is %.4g radiation lengths "
             "thick, beyond the thin-radiator range (<= %g X0): %s", th / X0,
             BL_YIELD_THIN_X0, note);
    lua_getfield(L, 10, "warnings");
    lua_pushstring(L, msg);
    lua_rawseti(L, -2, (lua_Integer)lua_rawlen(L, -2) + 1);
    lua_pop(L, 1);
  }
  return 1;
}

/* }====================================================== */


/*
** brakelight.angular{..., k =, theta = {...}}
**   -> {k, y, theta, d2sigma, err, elwert_applied, per_gram, units,
**       settings, warnings}
** brakelight.angular{..., kmin =, kmax =, theta = {...}}
**   -> {kmin, kmax, theta, dsdomega, err, ...}: integrated over the window
*/
static int l_angular (lua_State *L) {
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
  readopts(L, "angular", angular_keys, 1, &o);
  nocoulomb(L, &o);
  hask = lua_getfield(L, 1, "k") != LUA_TNIL;
  haswin = lua_getfield(L, 1, "kmin") != LUA_TNIL
           || lua_getfield(L, 1, "kmax") != LUA_TNIL;
  lua_settop(L, 1);
  if (hask == haswin)
    lbl_argfail(L, o.fname, "give either field 'k' (one photon energy, MeV) "
                "or fields 'kmin' and 'kmax' (a window, kmax = T by "
                "default), got %s", hask ? "both" : "neither");
  if (hask)
    k = optk(L, &o);
  else
    optwindow(L, &o, &kmin, &kmax);
  theta = optarray(L, &o, "theta", 0, BL_PI, 0, "[0, pi] rad", &n);  /* 2 */
  checkwork(L, &o, "theta", n, hask ? BL_WORK_ANGULAR
                                    : BL_WORK_ANGULAR * BL_WORK_KINTEGRAL);
  /* all checks done */
  t = kstart(L, &o, &q, &w);          /* 3: the target */
  lua_createtable(L, (int)n, 0);      /* 4: theta */
  lua_createtable(L, (int)n, 0);      /* 5: d2sigma or dsdomega */
  lua_createtable(L, (int)n, 0);      /* 6: err */
  for (i = 1; i <= n; i++) {
    bl_result r;
    double th = theta[i - 1];
    char at[64];
    if (hask) {
      snprintf(at, sizeof at, "k = %.6g MeV, theta = %.6g rad", k, th);
      computepoint(L, &o, t, BL_TARGET_ANGULAR, k, th, 0.0, 0.0, q, &w, at,
                   &r);
    }
    else
      kintegral(L, &o, t, BL_TARGET_ANGULAR, th, kmin, kmax, q, &w, &r,
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
  setresult(L, 7, 4, hask ? names : wnames, hask ? units : wunits, &o, &w);
  if (hask) {
    lua_pushnumber(L, k);
    lua_setfield(L, 7, "k");
    lua_pushnumber(L, k / o.T);
    lua_setfield(L, 7, "y");
  }
  else {
    setnum(L, 7, "kmin", kmin);
    setnum(L, 7, "kmax", kmax);
  }
  lua_pushboolean(L, (applied & BL_APPLIED_ELWERT) != 0);
  lua_setfield(L, 7, "elwert_applied");
  lua_pushnumber(L, pergram(&o));
  lua_setfield(L, 7, "per_gram");
  return 1;
}


/*
** brakelight.differential{..., k =, theta_k =, theta_p =, phi =}
**   -> d3sigma/(dk dOmega_k dOmega_p) in mb/(MeV sr^2), warnings list,
**      info table
*/
static int l_differential (lua_State *L) {
  Opts o;
  const bl_target *t;
  bl_result r;
  Warnings w;
  double k, theta_k, theta_p, phi;
  char at[128];
  readopts(L, "differential", differential_keys, 0, &o);
  nocoulomb(L, &o);
  k = optk(L, &o);
  theta_k = optrange(L, &o, "theta_k", "photon polar angle in rad", 0, BL_PI,
                     0, "[0, pi] rad");
  theta_p = optrange(L, &o, "theta_p", "final-particle polar angle in rad",
                     0, BL_PI, 0, "[0, pi] rad");
  phi = neednum(L, 1, o.fname, "", "phi", "azimuth between photon and "
                "particle in rad");
  if (!isfinite(phi))
    lbl_argfail(L, o.fname, "field 'phi' must be a finite angle in rad, got "
            "%.14g", phi);
  /* all checks done */
  t = maketarget(L, &o, NULL);
  initwarn(&w, t);
  snprintf(at, sizeof at, "k = %.6g MeV, theta_k = %.6g, theta_p = %.6g, "
           "phi = %.6g rad", k, theta_k, theta_p, phi);
  computepoint(L, &o, t, BL_TARGET_FULL, k, theta_k, theta_p, phi, NULL, &w,
               at, &r);
  lua_pushnumber(L, r.val);
  pushwarnings(L, &o, &w);
  pushinfo(L, &o, &r);
  return 3;
}


/* brakelight.methods() -> {"born", "high-energy", "complete", "auto"} */
static int l_methods (lua_State *L) {
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
static int l_models (lua_State *L) {
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

/* }====================================================== */


/*
** {======================================================
** Particle objects (metatable "brakelight.Particle")
** A full userdata holding a bl_particle; its name string is the user
** value, so the borrowed name pointer lives as long as the object.
** Read-only fields: name, mass (MeV), charge (e), spin, composite.
** =======================================================
*/

/* Push a new particle object holding a copy of *src (name copied too). */
static void pushparticle (lua_State *L, const bl_particle *src) {
  bl_particle *p = (bl_particle *)lua_newuserdatauv(L, sizeof *p, 1);
  *p = *src;
  lua_pushstring(L, src->name);     /* the object's own copy of the name */
  p->name = lua_tostring(L, -1);
  lua_setiuservalue(L, -2, 1);      /* keep it alive */
  luaL_setmetatable(L, PARTMETA);
}


/*
** brakelight.particle(name) -> a preset particle object;
** brakelight.particle{mass =, charge =, spin =, name =} -> a new one
*/
static int l_particle (lua_State *L) {
  char names[NAMESIZE], v[80], name[OPTSTRLEN];
  bl_particle p;
  const bl_particle *pre;
  switch (lua_type(L, 1)) {
    case LUA_TSTRING:
      lbl_checktext(L, 1, "particle", "the particle name");
      pre = bl_particle_find(lua_tostring(L, 1));
      if (pre == NULL)
        lbl_argfail(L, "particle", "unknown particle %s; allowed: %s, or a "
                "table {mass =, charge =, spin =, name =}",
                lbl_showval(L, 1, v, sizeof v),
                particlenames(names, sizeof names));
      pushparticle(L, pre);
      return 1;
    case LUA_TTABLE:
      lua_settop(L, 1);
      tabparticle(L, 1, "particle", "", &p, name);
      pushparticle(L, &p);
      return 1;
    default:
      return lbl_argfail(L, "particle", "particle name (string) or description "
                     "(table) expected, got %s", lbl_showval(L, 1, v, sizeof v));
  }
}


/* __index: the read-only fields; nil for any other key. */
static int particle_index (lua_State *L) {
  const bl_particle *p = (const bl_particle *)luaL_checkudata(L, 1, PARTMETA);
  const char *key = lua_tostring(L, 2);  /* NULL for non-string keys */
  if (key == NULL || lua_type(L, 2) != LUA_TSTRING)
    lua_pushnil(L);
  else if (strcmp(key, "name") == 0)
    lua_pushstring(L, p->name);
  else if (strcmp(key, "mass") == 0)
    lua_pushnumber(L, p->mass);
  else if (strcmp(key, "charge") == 0)
    lua_pushnumber(L, p->charge);
  else if (strcmp(key, "spin") == 0)
    lua_pushnumber(L, p->spin);
  else if (strcmp(key, "composite") == 0)
    lua_pushboolean(L, (p->flags & BL_PARTICLE_COMPOSITE) != 0);
  else
    lua_pushnil(L);
  return 1;
}


/* __newindex: particle objects are immutable. */
static int particle_newindex (lua_State *L) {
  luaL_checkudata(L, 1, PARTMETA);
  return luaL_error(L, "particle objects are read-only (field '%s'); make a "
                    "new one with brakelight.particle{...}",
                    luaL_tolstring(L, 2, NULL));
}


/* __tostring: "brakelight.Particle: muon (mass ... MeV, charge -1, spin 1/2)". */
static int particle_tostring (lua_State *L) {
  const bl_particle *p = (const bl_particle *)luaL_checkudata(L, 1, PARTMETA);
  char buf[MSGSIZE];
  snprintf(buf, sizeof buf, "%s: %s (mass %.10g MeV, charge %g, spin %s%s)",
           PARTMETA, p->name, p->mass, p->charge,
           p->spin == 0 ? "0" : "1/2",
           (p->flags & BL_PARTICLE_COMPOSITE) ? ", composite" : "");
  lua_pushstring(L, buf);
  return 1;
}


/* Two particle objects are equal when every field is. */
static int particle_eq (lua_State *L) {
  const bl_particle *a = (const bl_particle *)luaL_checkudata(L, 1, PARTMETA);
  const bl_particle *b = (const bl_particle *)luaL_checkudata(L, 2, PARTMETA);
  lua_pushboolean(L, a->mass == b->mass && a->charge == b->charge
                     && a->spin == b->spin && a->flags == b->flags
                     && strcmp(a->name, b->name) == 0);
  return 1;
}


static const luaL_Reg particle_meta[] = {
  {"__eq", particle_eq},
  {"__index", particle_index},
  {"__newindex", particle_newindex},
  {"__tostring", particle_tostring},
  {NULL, NULL}
};

/* }====================================================== */


/*
** {======================================================
** Workspace objects (metatable "brakelight.Quad")
** =======================================================
*/

/* Free the workspace; serves __gc, __close and :close(); idempotent. */
static int quad_gc (lua_State *L) {
  LQuad *lq = (LQuad *)luaL_checkudata(L, 1, QUADMETA);
  bl_quad_free(lq->q);  /* NULL is a no-op */
  lq->q = NULL;         /* mark as closed */
  return 0;
}


/* __tostring: "brakelight.Quad (0x...)" or "brakelight.Quad (closed)". */
static int quad_tostring (lua_State *L) {
  LQuad *lq = (LQuad *)luaL_checkudata(L, 1, QUADMETA);
  if (lq->q == NULL)
    lua_pushliteral(L, QUADMETA " (closed)");
  else
    lua_pushfstring(L, QUADMETA " (%p)", (void *)lq->q);
  return 1;
}


static const luaL_Reg quad_meth[] = {
  {"close", quad_gc},
  {NULL, NULL}
};

static const luaL_Reg quad_meta[] = {
  {"__index", NULL},  /* placeholder */
  {"__gc", quad_gc},
  {"__close", quad_gc},
  {"__tostring", quad_tostring},
  {NULL, NULL}
};


/* Create the metatables of the module's userdata. */
static void createmeta (lua_State *L) {
  luaL_newmetatable(L, QUADMETA);        /* metatable for workspaces */
  luaL_setfuncs(L, quad_meta, 0);        /* add metamethods */
  luaL_newlibtable(L, quad_meth);        /* method table */
  luaL_setfuncs(L, quad_meth, 0);
  lua_setfield(L, -2, "__index");        /* metatable.__index = methods */
  lua_pop(L, 1);
  luaL_newmetatable(L, PARTMETA);        /* metatable for particles */
  luaL_setfuncs(L, particle_meta, 0);
  lua_pop(L, 1);
  luaL_newmetatable(L, TARGETMETA);      /* metatable for call targets */
  lua_pushcfunction(L, target_gc);
  lua_setfield(L, -2, "__gc");
  lua_pop(L, 1);
}


/*
** Push a new workspace object: created closed (q = NULL) with its
** metatable before the allocation, so a failure leaves nothing to leak.
*/
static void newquad (lua_State *L) {
  LQuad *lq = (LQuad *)lua_newuserdatauv(L, sizeof *lq, 0);
  lq->q = NULL;
  luaL_setmetatable(L, QUADMETA);
  lq->q = bl_quad_alloc(QUAD_LIMIT);
  if (lq->q == NULL)
    luaL_error(L, "brakelight: cannot allocate the integration workspace");
}

/* }====================================================== */


static const luaL_Reg brakelight_funcs[] = {
  {"angular", l_angular},
  {"cross_section", l_cross_section},
  {"differential", l_differential},
  {"dsdk", l_dsdk},
  {"energy_loss", l_energy_loss},
  {"methods", l_methods},
  {"models", l_models},
  {"photon_yield", l_photon_yield},
  {"particle", l_particle},
  {"spectrum", l_spectrum},
  {NULL, NULL}
};


/*
** Open the module: the GSL error handler is switched off (process-wide:
** GSL's default handler aborts), and the library functions share one
** integration workspace as upvalue 1; the pure-Lua helpers are fields
** loaded on first use (src/lhelpers.c).  Returns the module table.
*/
LUAMOD_API int luaopen_brakelight (lua_State *L) {
  gsl_set_error_handler_off();
  luaL_checkversion(L);
  createmeta(L);
  luaL_newlibtable(L, brakelight_funcs);  /* module table */
  newquad(L);                             /* shared workspace */
  luaL_setfuncs(L, brakelight_funcs, 1);  /* functions with upvalue */
  lua_pushliteral(L, BL_VERSION);
  lua_setfield(L, -2, "_VERSION");
  lbl_material_open(L);                   /* material functions */
  lbl_helpers_open(L);                    /* brakelight.scan, .plot, ... */
  return 1;
}
