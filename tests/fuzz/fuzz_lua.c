/*
** fuzz_lua.c -- libFuzzer harness over the Lua API of the module brakelight
** See Copyright Notice in LICENSE
**
** Each input is decoded, byte by byte, into one call of a module function
** with an option table built from the bytes: particles (preset names,
** description tables, particle objects), targets (elements, Z, formulas,
** mixtures, catalogue names, raw strings), energies, photon energies and
** fractions, angles, screening models, nucleus/electrons/coulomb/elwert
** switches, tolerances, threads, the keys of newer options, and malformed
** types (nil, booleans, functions, tables with an __index metamethod that
** answers differently each time).  Shapes of tables and values:
**   - option tables, particle descriptions, material and mixture tables and
**     the arrays k/y/theta behind a metatable (wrap): __index a table (or a
**     chain of two), or a function that answers differently per call,
**     raises (a string, a table or nil) at the n-th access, re-enters the
**     module (dsdk, spectrum at another rtol, material, particle) at its
**     first accesses, or gives strings held nowhere else after a full
**     collection; integer keys mostly stay raw; __len (odd lengths, or
**     raising) and __pairs (raising or bogus) on top;
**   - strings with embedded NUL bytes (particle, target, model, method and
**     nucleus names, mixture 'by');
**   - arrays with holes, non-integer, zero and negative keys, and long
**     arrays (up to MAXLONG elements, always with one bad element, so that
**     they cost only their check);
**   - tables that contain themselves (a mixture whose part is the mixture,
**     {spec} whose spec is itself, an array holding itself, a particle
**     named by itself);
**   - extreme numbers (+-1e300, +-DBL_MAX, subnormals, -0.0, +-inf, NaN) in
**     masses, charges, T, k, kmin/kmax, thickness and fractions.
** The keys of each function are learned
** from its own "allowed: ..." message, so new options are fuzzed as soon
** as the binding knows them.  Every call runs inside lua_pcall: a Lua error
** is a normal outcome; a crash, a sanitizer report, a leak or a NaN/Inf in
** a successful result is a finding (the harness aborts on NaN/Inf).
**
** Cost cap (in the harness, not in the library): arrays of abscissae have
** at most 4 elements (a long array always holds a bad element), mixtures
** at most 4 parts, a wrapped table re-enters the module at most 6 times,
** with cheap calls (rtol >= 1e-6); the library itself is
** built with a lower call budget per integral (Makefile, FUZZ_CFLAGS), so
** a slow but legitimate point stays well below the per-input timeout.
*/

#include <math.h>
#include <stdint.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include "lua.h"
#include "lauxlib.h"
#include "lualib.h"

#include "brakelight/lbrakelight.h"

#define MAXARRAY 4     /* abscissae per call */
#define MAXPARTS 4     /* parts of a mixture */
#define MAXDEPTH 3     /* tables inside tables */
#define MAXKEYS  48    /* keys learned per function */
#define MAXFIELDS 8    /* fields set per option table, besides the keys */
#define MAXLONG 4096   /* elements of a long array (each with a bad one) */


/* The input, consumed from the front; zeros once it is used up. */
typedef struct Bytes {
  const uint8_t *p;
  size_t n;
} Bytes;

static unsigned byte (Bytes *b) {
  if (b->n == 0)
    return 0;
  b->n--;
  return *b->p++;
}

/* A choice among n (n >= 1). */
static unsigned pick (Bytes *b, unsigned n) {
  return byte(b) % n;
}


/* Functions of the module worth calling; missing ones are skipped. */
static const char *const funcs[] = {
  "dsdk", "spectrum", "angular", "differential", "particle", "material",
  "radiation_length", "models", "materials", "cross_section", "energy_loss",
  "photon_yield", "methods", "info"
};
#define NFUNCS (sizeof funcs / sizeof funcs[0])

/* Keys learned per function (harness state, not library state). */
static char *keys[NFUNCS][MAXKEYS];
static int nkeys[NFUNCS];
static int learned;
static int verbose;

static const char *const extra_keys[] = {
  "bogus", "Particle", "t", "K", "Y", "theta", "screening", "method",
  "rtol", "threads", "by", "normalize", "density", "name"
};

static const double numbers[] = {
  0.0, -0.0, 1.0, -1.0, 0.5, 2.0, 1e-300, 1e-12, 1e-9, 1e-6, 1e-4, 1e-3,
  0.01, 0.1, 0.3, 0.7, 0.9, 0.999999, 1.0 - 1e-12, 3.0, 5.0, 20.0, 100.0,
  101.0, 300.0, 1e3, 1e6, 1e9, 1e12, 1e300, 0.51099895, 105.658, 938.272,
  4.9e-324, 3.141592653589793, 3.2, 1.5, 7.0, 82.0, 256.0, 257.0
};
#define NNUMBERS (sizeof numbers / sizeof numbers[0])

/* Extreme values: huge, subnormal, signed zero, infinities, NaN. */
static const double extremes[] = {
  1e300, -1e300, 1.7976931348623157e308, -1.7976931348623157e308,
  4.9e-324, -4.9e-324, 1e-310, 2.2250738585072014e-308,
  2.2250738585072009e-308, -0.0, HUGE_VAL, -HUGE_VAL, NAN, 1e-300, 1e200,
  9007199254740993.0
};
#define NEXTREMES (sizeof extremes / sizeof extremes[0])

/* Strings with embedded NUL bytes: a known name cut short, or not. */
typedef struct Lstr {
  const char *s;
  size_t n;
} Lstr;
#define LSTR(x) {x, sizeof x - 1}
static const Lstr nulstrings[] = {
  LSTR("electron\0"), LSTR("elec\0tron"), LSTR("muon\0x"), LSTR("\0"),
  LSTR("Pb\0"), LSTR("Pb\0Cu"), LSTR("H2O\0junk"), LSTR("water\0"),
  LSTR("Cu\0\0"), LSTR("82\0"), LSTR("hartree-fock\0"),
  LSTR("exponential\0x"), LSTR("none\0"), LSTR("born\0"),
  LSTR("high-energy\0"), LSTR("auto\0"), LSTR("uniform\0"), LSTR("point\0x"),
  LSTR("mass\0"), LSTR("atoms\0"), LSTR("custom\0name"), LSTR("lpm\0")
};
#define NNULS (sizeof nulstrings / sizeof nulstrings[0])

static void pushnul (lua_State *L, Bytes *b) {
  const Lstr *l = &nulstrings[byte(b) % NNULS];
  lua_pushlstring(L, l->s, l->n);
}

/* The method names leave out "distorted" (fuzzed as the default "auto")
** and "partial": a partial-wave point costs 0.05-30 s (up to T = 3 MeV,
** minutes under the sanitizers), past the per-input timeout; its
** refusals and points are tested in tests/test_methods.c (partial_method)
** and tests/lua/test_partial.lua. */
static const char *const strings[] = {
  "electron", "positron", "muon", "antimuon", "pion+", "pion-", "kaon+",
  "kaon-", "proton", "Electron", "tau",
  "Pb", "W", "H", "He", "U", "Fm", "Es", "lead", "aluminum", "CO", "Co",
  "H2O", "CaCO3", "Ca(OH)2", "[Co(NH3)6]Cl3", "CuSO4.5H2O", "CuSO4*5H2O",
  "Fe0.5Ni0.5", "(Cu1.5)Se", "YBa2Cu3O6.5", "C8H8", "H1000000000",
  "((((((((((((((((H))))))))))))))))", "water", "Lead Glass",
  "standard_rock", "PB", "PbWO4",
  "hartree-fock", "thomas-fermi", "exponential", "none", "HARTREE-FOCK",
  "uniform", "point", "auto", "born", "high-energy", "complete", "lpm",
  "mass", "atoms", "", " ", "%s%n", "x", "1", "1e3", "nan", "inf"
};
#define NSTRINGS (sizeof strings / sizeof strings[0])
#define FIRST_NAME 39   /* strings[FIRST_NAME...]: models, switches, methods */


/* Push a number: a listed one, raw bytes as a double, or an integer. */
static void gennumber (lua_State *L, Bytes *b) {
  unsigned c = pick(b, 9);
  if (c == 8) {
    lua_pushnumber(L, extremes[pick(b, NEXTREMES)]);
    return;
  }
  if (c < 5)
    lua_pushnumber(L, numbers[pick(b, NNUMBERS)]);
  else if (c == 5) {
    uint64_t u = 0;
    double d;
    int i;
    for (i = 0; i < 8; i++)
      u = (u << 8) | byte(b);
    memcpy(&d, &u, sizeof d);
    lua_pushnumber(L, d);
  }
  else if (c == 6) {
    static const double odd[] = {NAN, HUGE_VAL, -HUGE_VAL, -1e-300};
    lua_pushnumber(L, odd[pick(b, 4)]);
  }
  else {
    static const lua_Integer ints[] = {0, 1, 2, 3, 8, 26, 74, 82, 92, 100,
                                       101, -1, 1000000, LUA_MININTEGER,
                                       LUA_MAXINTEGER};
    lua_pushinteger(L, ints[pick(b, sizeof ints / sizeof ints[0])]);
  }
}


/* Push a string: a listed one or up to 63 raw bytes. */
static void genstring (lua_State *L, Bytes *b) {
  unsigned c = pick(b, 8);
  if (c == 7)
    pushnul(L, b);
  else if (c != 0)
    lua_pushstring(L, strings[pick(b, NSTRINGS)]);
  else {
    char s[64];
    size_t n = pick(b, 64), i;
    for (i = 0; i < n; i++)
      s[i] = (char)byte(b);
    lua_pushlstring(L, s, n);
  }
}

static void genvalue (lua_State *L, Bytes *b, int depth);


/*
** Replace the table on top of the stack by a proxy with a metatable
** (helper wrap, see `helpers`): mode 0 __index a table, 1 an __index
** answering differently per call, 2 raising at access `arg`, 3 re-entering
** the module, 4 fresh strings after a full collection; `extra` are the
** other answers of mode 1; __len and __pairs by two codes.
*/
static void genwrap (lua_State *L, Bytes *b, int depth) {
  int t = lua_gettop(L);
  unsigned mode = pick(b, 5), arg = 1 + pick(b, 6), lenc = pick(b, 10),
           pairsc = pick(b, 4), n = pick(b, 3), i;
  lua_getfield(L, LUA_REGISTRYINDEX, "fuzz.wrap");
  lua_pushvalue(L, t);
  lua_pushinteger(L, (lua_Integer)mode);
  lua_pushinteger(L, (lua_Integer)arg);
  lua_createtable(L, (int)n, 0);
  for (i = 1; i <= n; i++) {
    genvalue(L, b, depth + 1);
    lua_rawseti(L, -2, (lua_Integer)i);
  }
  lua_pushinteger(L, (lua_Integer)lenc);
  lua_pushinteger(L, (lua_Integer)pairsc);
  lua_call(L, 6, 1);
  lua_replace(L, t);
}

/* Wrap the table on top with probability 1/n (never once the input is
** used up: new shapes take non-zero bytes, so old seeds keep theirs). */
static void maybewrap (lua_State *L, Bytes *b, int depth, unsigned n) {
  if (lua_istable(L, -1) && pick(b, n) == n - 1)
    genwrap(L, b, depth);
}


/* An element of a malformed array: mostly x, sometimes anything. */
static void pushelem (lua_State *L, Bytes *b, double x) {
  if (pick(b, 6) != 0)
    lua_pushnumber(L, x);
  else
    gennumber(L, b);
}

/*
** Push a malformed array of numbers near x: holes, non-integer, zero or
** negative keys, a long array (MAXLONG at most) with one bad element,
** an array that holds itself, or a wrapped one.
*/
static void genbadarray (lua_State *L, Bytes *b, int depth, double x) {
  unsigned c = pick(b, 6), i, n;
  lua_newtable(L);
  switch (c) {
    case 0:  /* holes: {[1]=x, [3]=y}, {[2]=x} */
      if (pick(b, 2)) {
        pushelem(L, b, x);
        lua_rawseti(L, -2, 1);
      }
      pushelem(L, b, x);
      lua_rawseti(L, -2, 2 + (lua_Integer)pick(b, 3));
      break;
    case 1:  /* non-integer keys beside 1..n */
      n = pick(b, 3);
      for (i = 1; i <= n; i++) {
        pushelem(L, b, x);
        lua_rawseti(L, -2, (lua_Integer)i);
      }
      switch (pick(b, 4)) {
        case 0: lua_pushnumber(L, 1.5); break;
        case 1: lua_pushliteral(L, "name"); break;
        case 2: lua_pushnumber(L, 9007199254740992.0); break;
        default: lua_pushboolean(L, 1); break;
      }
      pushelem(L, b, x);
      lua_rawset(L, -3);
      break;
    case 2:  /* zero and negative keys */
      pushelem(L, b, x);
      lua_rawseti(L, -2, -(lua_Integer)pick(b, 3));
      n = pick(b, 3);
      for (i = 1; i <= n; i++) {
        pushelem(L, b, x);
        lua_rawseti(L, -2, (lua_Integer)i);
      }
      break;
    case 3: {  /* long, with one bad element (a hole, NaN, a string...) */
      unsigned bad;
      n = 5 + (byte(b) << 8 | byte(b)) % (MAXLONG - 4);
      bad = pick(b, 2) ? n : 1 + (byte(b) << 8 | byte(b)) % n;
      for (i = 1; i <= n; i++) {
        lua_pushnumber(L, x);
        lua_rawseti(L, -2, (lua_Integer)i);
      }
      switch (pick(b, 4)) {
        case 0: lua_pushnumber(L, NAN); break;
        case 1: lua_pushnumber(L, -x); break;
        case 2: lua_pushliteral(L, "x"); break;
        default: lua_pushnil(L); break;  /* a hole, or a shorter array */
      }
      lua_rawseti(L, -2, (lua_Integer)bad);
      break;
    }
    case 4:  /* holds itself */
      pushelem(L, b, x);
      lua_rawseti(L, -2, 1);
      lua_pushvalue(L, -1);
      lua_rawseti(L, -2, 1 + (lua_Integer)pick(b, 2));
      break;
    default:  /* a good array behind a metatable */
      n = 1 + pick(b, MAXARRAY);
      for (i = 1; i <= n; i++) {
        pushelem(L, b, x);
        lua_rawseti(L, -2, (lua_Integer)i);
      }
      genwrap(L, b, depth);
      break;
  }
}


/* Push an array of 0..MAXARRAY numbers (mostly) or values. */
static void genarray (lua_State *L, Bytes *b, int depth) {
  unsigned n = pick(b, MAXARRAY + 1), i;
  if (pick(b, 4) == 3) {
    genbadarray(L, b, depth, numbers[pick(b, NNUMBERS)]);
    return;
  }
  lua_createtable(L, (int)n, 0);
  for (i = 1; i <= n; i++) {
    if (pick(b, 8) != 0)
      gennumber(L, b);
    else
      genvalue(L, b, depth + 1);
    lua_rawseti(L, -2, (lua_Integer)i);
  }
}


/* Push a particle: preset name, description table or particle object. */
static void genparticle (lua_State *L, Bytes *b, int depth) {
  switch (pick(b, 4)) {
    case 0:
      lua_pushstring(L, strings[pick(b, 11)]);
      break;
    case 1: {  /* a description table, maybe wrapped */
      static const char *const f[] = {"mass", "charge", "spin", "name"};
      unsigned i;
      lua_newtable(L);
      for (i = 0; i < 4; i++)
        if (pick(b, 6) != 0) {
          unsigned c = pick(b, 8);
          if (i == 3 && c == 7)
            pushnul(L, b);
          else if (i == 3 && c == 6)
            lua_pushvalue(L, -1);   /* named by itself */
          else if (i < 2 && c >= 6)
            lua_pushnumber(L, extremes[pick(b, NEXTREMES)]);
          else if (i == 3 || c == 5)
            genvalue(L, b, depth + 1);
          else
            gennumber(L, b);
          lua_setfield(L, -2, f[i]);
        }
      maybewrap(L, b, depth, 3);
      break;
    }
    case 2:  /* an object, from a preset or from a table */
      lua_getfield(L, LUA_REGISTRYINDEX, "fuzz.particles");
      lua_rawgeti(L, -1, (lua_Integer)(1 + pick(b, 3)));
      lua_remove(L, -2);
      break;
    default:
      genvalue(L, b, depth + 1);
      break;
  }
}


/* Push a target: element, Z, formula, catalogue name, material, mixture. */
static void gentarget (lua_State *L, Bytes *b, int depth) {
  switch (pick(b, 8)) {
    case 0: case 1:
      genstring(L, b);
      break;
    case 2:
      gennumber(L, b);
      break;
    case 3: {  /* mixture */
      unsigned n = pick(b, MAXPARTS + 1), i;
      lua_newtable(L);
      for (i = 1; i <= n; i++) {
        if (depth < MAXDEPTH && pick(b, 4) != 0) {
          lua_createtable(L, 2, 0);
          gentarget(L, b, depth + 1);
          lua_rawseti(L, -2, 1);
          gennumber(L, b);
          lua_rawseti(L, -2, 2);
          maybewrap(L, b, depth, 8);
        }
        else
          genvalue(L, b, depth + 1);
        lua_rawseti(L, -2, (lua_Integer)i);
      }
      if (pick(b, 2)) {
        if (pick(b, 8) == 7)
          pushnul(L, b);
        else
          lua_pushstring(L, pick(b, 4) ? (pick(b, 2) ? "mass" : "atoms")
                                       : strings[pick(b, NSTRINGS)]);
        lua_setfield(L, -2, "by");
      }
      if (pick(b, 3) == 0) {
        genvalue(L, b, depth + 1);
        lua_setfield(L, -2, "normalize");
      }
      if (pick(b, 3) == 0) {
        gennumber(L, b);
        lua_setfield(L, -2, "density");
      }
      maybewrap(L, b, depth, 4);
      break;
    }
    case 6: {  /* a mixture whose part is itself, or {spec} with spec itself */
      unsigned n = pick(b, MAXPARTS), i;
      lua_newtable(L);
      if (pick(b, 3) == 0) {
        lua_pushvalue(L, -1);
        lua_rawseti(L, -2, 1);
        break;
      }
      for (i = 1; i <= n; i++) {
        lua_createtable(L, 2, 0);
        lua_pushstring(L, strings[11 + pick(b, 13)]);
        lua_rawseti(L, -2, 1);
        lua_pushnumber(L, 1.0 / (n + 1));
        lua_rawseti(L, -2, 2);
        lua_rawseti(L, -2, (lua_Integer)i);
      }
      lua_createtable(L, 2, 0);   /* {mixture, fraction} */
      lua_pushvalue(L, -2);
      lua_rawseti(L, -2, 1);
      lua_pushnumber(L, 1.0 / (n + 1));
      lua_rawseti(L, -2, 2);
      lua_rawseti(L, -2, (lua_Integer)n + 1);
      lua_pushstring(L, pick(b, 2) ? "mass" : "atoms");
      lua_setfield(L, -2, "by");
      maybewrap(L, b, depth, 4);
      break;
    }
    case 7:  /* a name with a NUL byte, bare or in {spec, name =} */
      pushnul(L, b);
      if (pick(b, 2)) {
        lua_createtable(L, 1, 1);
        lua_insert(L, -2);
        lua_rawseti(L, -2, 1);
        pushnul(L, b);
        lua_setfield(L, -2, "name");
      }
      break;
    case 4:  /* {spec, density =, name =} */
      lua_newtable(L);
      if (depth < MAXDEPTH) {
        gentarget(L, b, depth + 1);
        lua_rawseti(L, -2, 1);
      }
      if (pick(b, 2)) {
        gennumber(L, b);
        lua_setfield(L, -2, "density");
      }
      if (pick(b, 2)) {
        genvalue(L, b, depth + 1);
        lua_setfield(L, -2, "name");
      }
      maybewrap(L, b, depth, 4);
      break;
    default:  /* a material object (or the error's nil) */
      lua_getfield(L, LUA_REGISTRYINDEX, "fuzz.materials");
      lua_rawgeti(L, -1, (lua_Integer)(1 + pick(b, 3)));
      lua_remove(L, -2);
      break;
  }
}


/* Push a table with a metatable whose __index answers from a list, a
** different value on every access. */
static void genfickle (lua_State *L, Bytes *b, int depth) {
  unsigned n = 1 + pick(b, 4), i;
  lua_getfield(L, LUA_REGISTRYINDEX, "fuzz.fickle");  /* maker */
  lua_createtable(L, (int)n, 0);
  for (i = 1; i <= n; i++) {
    genvalue(L, b, depth + 1);
    lua_rawseti(L, -2, (lua_Integer)i);
  }
  lua_call(L, 1, 1);
}


/* Push any value, by a byte. */
static void genvalue (lua_State *L, Bytes *b, int depth) {
  unsigned c = pick(b, depth >= MAXDEPTH ? 10 : 16);
  switch (c) {
    case 0: case 1: case 2: case 3:
      gennumber(L, b);
      break;
    case 4: case 5: case 6: case 7:
      genstring(L, b);
      break;
    case 8:
      lua_pushboolean(L, (int)pick(b, 2));
      break;
    case 9:
      lua_pushnil(L);
      break;
    case 10: case 11:
      genarray(L, b, depth);
      break;
    case 12:
      genparticle(L, b, depth);
      break;
    case 13:
      gentarget(L, b, depth);
      break;
    case 14:
      genfickle(L, b, depth);
      break;
    default:
      lua_getfield(L, LUA_REGISTRYINDEX, "fuzz.odd");  /* function, etc. */
      lua_rawgeti(L, -1, (lua_Integer)(1 + pick(b, 3)));
      lua_remove(L, -2);
      break;
  }
}


/* Fractions in (0, 1): photon energies k/T, angles in rad. */
static const double fractions[] = {1e-6, 1e-3, 0.01, 0.1, 0.3, 0.5, 0.7,
                                   0.9, 0.99, 0.999999};
#define NFRAC (sizeof fractions / sizeof fractions[0])

/*
** Push a valid value for one of the options every computation needs, so
** that a good share of the calls gets past the checks into the core;
** returns 0 (nothing pushed) for other keys.
*/
static int genvalid (lua_State *L, Bytes *b, const char *key, double T) {
  if (strcmp(key, "particle") == 0) {
    if (pick(b, 4) != 3)
      lua_pushstring(L, strings[pick(b, 9)]);   /* the presets */
    else {   /* a good description, often behind a metatable */
      static const double m[] = {0.51099895, 105.658, 938.272, 3727.379};
      lua_createtable(L, 0, 4);
      lua_pushnumber(L, m[pick(b, 4)]);
      lua_setfield(L, -2, "mass");
      lua_pushnumber(L, pick(b, 2) ? 1.0 : -1.0);
      lua_setfield(L, -2, "charge");
      lua_pushnumber(L, pick(b, 2) ? 0.5 : 0.0);
      lua_setfield(L, -2, "spin");
      lua_pushfstring(L, "fuzzy%d", (int)byte(b));
      lua_setfield(L, -2, "name");
      maybewrap(L, b, 2, 2);
    }
  }
  else if (strcmp(key, "target") == 0) {
    lua_pushstring(L, strings[11 + pick(b, 13)]);   /* elements, formulas */
    if (pick(b, 4) == 3) {   /* {spec, density =}, often behind a metatable */
      lua_createtable(L, 1, 1);
      lua_insert(L, -2);
      lua_rawseti(L, -2, 1);
      lua_pushnumber(L, 1.0 + pick(b, 20));
      lua_setfield(L, -2, "density");
      maybewrap(L, b, 2, 2);
    }
  }
  else if (strcmp(key, "k") == 0)
    lua_pushnumber(L, T * fractions[pick(b, NFRAC)]);
  else if (strcmp(key, "y") == 0 || strcmp(key, "theta") == 0) {
    unsigned n = 1 + pick(b, MAXARRAY), i;
    lua_createtable(L, (int)n, 0);
    for (i = 1; i <= n; i++) {
      lua_pushnumber(L, fractions[pick(b, NFRAC)]);
      lua_rawseti(L, -2, (lua_Integer)i);
    }
    maybewrap(L, b, 2, 8);
  }
  else if (strncmp(key, "theta", 5) == 0 || strcmp(key, "phi") == 0)
    lua_pushnumber(L, 3.0 * fractions[pick(b, NFRAC)]);
  else
    return 0;
  return 1;
}


/* Push a value meant for option `key` (mostly of the right kind); valid:
** the options every computation needs are valid. */
static void genoption (lua_State *L, Bytes *b, const char *key, double T,
                       int valid) {
  if (valid && genvalid(L, b, key, T))
    return;
  if (pick(b, 8) == 0) {
    genvalue(L, b, 1);
    return;
  }
  if (strcmp(key, "particle") == 0)
    genparticle(L, b, 1);
  else if (strcmp(key, "target") == 0)
    gentarget(L, b, 1);
  else if (strcmp(key, "k") == 0 || strcmp(key, "kmin") == 0
           || strcmp(key, "kmax") == 0 || strcmp(key, "thickness") == 0) {
    unsigned c = pick(b, 8);
    if (c < 2)
      genarray(L, b, 1);
    else if (c == 6)
      genbadarray(L, b, 1, T * fractions[pick(b, NFRAC)]);
    else if (c == 7)
      lua_pushnumber(L, extremes[pick(b, NEXTREMES)]);
    else
      lua_pushnumber(L, T * numbers[pick(b, NNUMBERS)]);
  }
  else if ((strcmp(key, "y") == 0 || strcmp(key, "theta") == 0)
           && pick(b, 4) == 3)
    genbadarray(L, b, 1, fractions[pick(b, NFRAC)]);
  else if (strcmp(key, "y") == 0 || strcmp(key, "theta") == 0) {
    unsigned n = 1 + pick(b, MAXARRAY), i;
    lua_createtable(L, (int)n, 0);
    for (i = 1; i <= n; i++) {
      if (pick(b, 8) == 0)
        gennumber(L, b);
      else
        lua_pushnumber(L, numbers[pick(b, NNUMBERS)]);
      lua_rawseti(L, -2, (lua_Integer)i);
    }
  }
  else if (strcmp(key, "rtol") == 0) {
    static const double r[] = {1e-2, 1e-3, 1e-4, 0.5, 0.3, 1e-6, 1e-12,
                               1e-13, 0.6, 0.0, -1e-3, NAN};
    lua_pushnumber(L, r[pick(b, sizeof r / sizeof r[0])]);
  }
  else if (strcmp(key, "threads") == 0)
    lua_pushinteger(L, (lua_Integer)pick(b, 4) - 1 + (pick(b, 16) == 0) * 300);
  else if (strcmp(key, "electrons") == 0 || strcmp(key, "coulomb") == 0
           || strcmp(key, "elwert") == 0) {
    unsigned c = pick(b, 4);
    if (c < 2)
      lua_pushboolean(L, (int)c);
    else if (c == 2)
      lua_pushliteral(L, "auto");
    else
      genvalue(L, b, 1);
  }
  else if (strcmp(key, "T") == 0)   /* the T that k is scaled by */
    lua_pushnumber(L, pick(b, 8) != 7 ? T : extremes[pick(b, NEXTREMES)]);
  else if (strncmp(key, "theta", 5) == 0 || strcmp(key, "phi") == 0)
    lua_pushnumber(L, numbers[pick(b, NNUMBERS)]);
  else if (strcmp(key, "screening") == 0 || strcmp(key, "nucleus") == 0
           || strcmp(key, "method") == 0) {
    if (pick(b, 6) == 5)
      pushnul(L, b);
    else
      lua_pushstring(L, strings[FIRST_NAME + pick(b, NSTRINGS - FIRST_NAME)]);
  }
  else if (pick(b, 2))   /* any other key: a number or a string */
    gennumber(L, b);
  else
    genstring(L, b);
}


/* Options a computation cannot do without: present more often. */
static int required (const char *key) {
  static const char *const req[] = {"particle", "target", "T", "k", "y",
                                    "theta", "theta_k", "theta_p", "phi",
                                    NULL};
  int i;
  for (i = 0; req[i] != NULL; i++)
    if (strcmp(key, req[i]) == 0)
      return 1;
  return 0;
}


/* Lua helpers run once per state: result checker and odd values. */
static const char helpers[] =
  "local bl = ...\n"
  /* cap(k, v): the cost cap on rtol for answers of metamethods */
  "local function cap(k, v)\n"
  "  if k == 'rtol' and type(v) == 'number' and v > 0 and v < 1e-6 then\n"
  "    return 1e-6 end\n"
  "  return v\n"
  "end\n"
  /* fickle(list): a table whose absent keys read list[1], list[2], ... */
  "local function fickle(list)\n"
  "  local i = 0\n"
  "  return setmetatable({}, {__index = function(_, k)\n"
  "    if #list == 0 then return nil end\n"
  "    i = i % #list + 1; return cap(k, list[i]) end})\n"
  "end\n"
  /* reenter(n): a cheap call of the module from inside a metamethod */
  "local rtols = {0.5, 1e-2, 1e-3, 1e-6, 0, -1}\n"
  "local calls = {\n"
  "  function(r) return bl.dsdk{particle = 'electron', target = 'Pb',\n"
  "    T = 10, k = 5, rtol = r} end,\n"
  "  function(r) return bl.spectrum{particle = 'muon', target = 'H2O',\n"
  "    T = 1000, y = {0.5, 0.9}, rtol = r} end,\n"
  "  function(r) return bl.material{{'Cu', 0.5}, {'Zn', r}, by = 'mass',\n"
  "    normalize = true} end,\n"
  "  function(r) return bl.particle{mass = 2, charge = -1, spin = 0.5,\n"
  "    name = 're' .. tostring(r)} end,\n"
  "}\n"
  "local function reenter(n)\n"
  "  pcall(calls[1 + n % #calls], rtols[1 + (n // #calls) % #rtols])\n"
  "end\n"
  /* wrap(base, mode, arg, extra, lenc, pairsc): a proxy of base; integer
  ** keys stay raw (but when arg is 5), other keys come from __index:
  ** mode 0 a table (arg odd: a chain of two), 1 base or extra in turn,
  ** 2 raises at access arg (a string, a table or nil), 3 re-enters the
  ** module at the first arg accesses, 4 strings that only the answer
  ** holds, after a full collection; lenc: __len, pairsc: __pairs */
  "local lens = {-1, 0, 1, 3, 1e9, math.huge, 'x'}\n"
  "fuzz_proxies = setmetatable({}, {__mode = 'k'})\n"
  "local function wrap(base, mode, arg, extra, lenc, pairsc)\n"
  "  local proxy, mt, n = {}, {}, 0\n"
  "  if arg ~= 5 then\n"
  "    for k, v in next, base do\n"
  "      if math.type(k) == 'integer' then proxy[k] = v end end\n"
  "  end\n"
  "  if mode == 0 then\n"
  "    mt.__index = arg % 2 == 0 and base\n"
  "      or setmetatable({}, {__index = base})\n"
  "  elseif mode == 1 then\n"
  "    mt.__index = function(_, k)\n"
  "      n = n + 1\n"
  "      if #extra > 0 and n % (1 + arg % 3) == 0 then\n"
  "        return cap(k, extra[1 + n % #extra]) end\n"
  "      return cap(k, base[k])\n"
  "    end\n"
  "  elseif mode == 2 then\n"
  "    mt.__index = function(_, k)\n"
  "      n = n + 1\n"
  "      if n >= arg then\n"
  "        if arg % 3 == 0 then error({}) elseif arg % 3 == 1 then error() end\n"
  "        error('fuzz: __index raised at access ' .. n .. ' of '\n"
  "              .. tostring(k))\n"
  "      end\n"
  "      return cap(k, base[k])\n"
  "    end\n"
  "  elseif mode == 3 then\n"
  "    mt.__index = function(_, k)\n"
  "      n = n + 1\n"
  "      if n <= arg then reenter(n + arg) end\n"
  "      return cap(k, base[k])\n"
  "    end\n"
  "  else\n"
  "    local rev = {}\n"
  "    for k, v in next, base do\n"
  "      rev[k] = type(v) == 'string' and v:reverse() or v end\n"
  "    mt.__index = function(_, k)\n"
  "      collectgarbage()\n"
  "      local v = rev[k]\n"
  "      if type(v) == 'string' then return v:reverse() end\n"
  "      return cap(k, v)\n"
  "    end\n"
  "  end\n"
  "  if lenc >= 1 and lenc <= #lens then\n"
  "    mt.__len = function() return lens[lenc] end\n"
  "  elseif lenc == 0 then mt.__len = function() error('fuzz: __len') end end\n"
  "  if pairsc == 1 then mt.__pairs = function() error('fuzz: __pairs') end\n"
  "  elseif pairsc == 2 then\n"
  "    mt.__pairs = function()\n"
  "      local i = 0\n"
  "      return function() i = i + 1; if i < 4 then return 'bogus' .. i, i end end\n"
  "    end\n"
  "  end\n"
  "  fuzz_proxies[proxy] = ({'index-table', 'fickle', 'raises', 're-enters',\n"
  "                          'fresh-strings'})[mode + 1]\n"
  "  return setmetatable(proxy, mt)\n"
  "end\n"
  /* check(v): raise 'FUZZ-NONFINITE' for NaN/Inf anywhere in a result */
  "local function check(v, depth, seen)\n"
  "  if type(v) == 'number' then\n"
  "    if v ~= v or v == math.huge or v == -math.huge then\n"
  "      error('FUZZ-NONFINITE', 0) end\n"
  "  elseif type(v) == 'table' and depth < 6 and not seen[v] then\n"
  "    seen[v] = true\n"
  "    for k, x in next, v do\n"
  "      if k ~= 'settings' then check(x, depth + 1, seen) end end\n"
  "  end\n"
  "end\n"
  /* dump(v): the value as text, for FUZZ_LUA_VERBOSE */
  "function fuzz_dump(v, d)\n"
  "  d = d or 0\n"
  "  if type(v) == 'string' then return string.format('%q', v) end\n"
  "  if type(v) == 'number' then return string.format('%.17g', v) end\n"
  "  if type(v) ~= 'table' or d > 4 then return tostring(v) end\n"
  "  local t = {}\n"
  "  if fuzz_proxies[v] then t[1] = '<' .. fuzz_proxies[v] .. '>' end\n"
  "  for k, x in next, v do\n"
  "    t[#t + 1] = '[' .. fuzz_dump(k, d + 1) .. ']=' .. fuzz_dump(x, d + 1) end\n"
  "  return '{' .. table.concat(t, ', ') .. '}'\n"
  "end\n"
  "local ps = {}\n"
  "ps[1] = bl.particle('muon')\n"
  "ps[2] = bl.particle{mass = 300, charge = 2, spin = 0, name = 'X'}\n"
  "ps[3] = bl.particle('proton')\n"
  "local ms = {}\n"
  "ms[1] = bl.material('H2O')\n"
  "ms[2] = bl.material{{'Cu', 0.7}, {'Zn', 0.3}, by = 'mass', density = 8.5}\n"
  "ms[3] = bl.material('water')\n"
  "return wrap, fickle, function(...) local s = {} for i = 1, select('#', ...) do\n"
  "  check(select(i, ...), 0, s) end end, ps, ms,\n"
  "  {print, io and io.stdout or 1, coroutine.create(print)}\n";


/* Learn the keys of function i from its "allowed: a, b, c" message. */
static void learnkeys (lua_State *L, int i) {
  const char *msg, *a;
  lua_getfield(L, -1, funcs[i]);
  if (!lua_isfunction(L, -1)) {
    lua_pop(L, 1);
    return;
  }
  lua_createtable(L, 0, 1);
  lua_pushboolean(L, 1);
  lua_setfield(L, -2, "\x01probe");
  if (lua_pcall(L, 1, 0, 0) == LUA_OK)
    return;
  msg = lua_tostring(L, -1);
  a = msg ? strstr(msg, "allowed: ") : NULL;
  if (a != NULL) {
    a += strlen("allowed: ");
    while (*a && nkeys[i] < MAXKEYS) {
      size_t n = strcspn(a, ",)");
      char *k = malloc(n + 1);
      if (k == NULL)
        abort();
      memcpy(k, a, n);
      k[n] = '\0';
      keys[i][nkeys[i]++] = k;
      a += n;
      if (*a != ',')
        break;
      a += strspn(a, ", ");
    }
  }
  lua_pop(L, 1);
}


/*
** A cost cap of the harness, not of the module: an integral over k (the
** integrated functions, and angular with a window) takes 15 to 3000
** dsigma/dk points, each at half its rtol, so at rtol 1e-12 one call may
** legitimately run for seconds, and under the sanitizers past the
** per-input timeout.  For those calls an rtol below 1e-6 becomes 1e-6;
** the refusal of bad rtol values (0, negative, NaN, > 0.5) is still
** fuzzed.  The option table is at index t.
*/
/*
** A projectile of mass m >= 100 MeV above the other-projectile table's 10
** GeV or below its T/m = 0.01 takes the exact bound electron term at each
** photon energy (bl_method_dk_e: about 0.3 s a point in the normal build
** for a 0.1 keV pion); a many-point call of it (an energy_loss of a pion
** at T = 1e-4 MeV: 15 s normally, 192 s under the sanitizers) exceeds the
** per-input timeout.  For those calls the atomic electrons are turned off
** (electrons = false); the exact term per point is still fuzzed through
** dsdk and differential.  The particle is resolved by the module itself
** (bl.particle, protected); one that it refuses is left as it is.
*/
static void heavycap (lua_State *L, int t) {
  double m = 0.0, T = 0.0;
  int top = lua_gettop(L);
  if (lua_getfield(L, t, "T") == LUA_TNUMBER)
    T = lua_tonumber(L, -1);
  lua_getfield(L, 1, "particle");                 /* bl.particle */
  lua_getfield(L, t, "particle");
  if (lua_isfunction(L, -2) && !lua_isnil(L, -1)
      && lua_pcall(L, 1, 1, 0) == LUA_OK
      && (lua_istable(L, -1) || lua_isuserdata(L, -1))) {
    lua_getfield(L, -1, "mass");   /* a particle object's field */
    if (lua_type(L, -1) == LUA_TNUMBER)
      m = lua_tonumber(L, -1);
  }
  lua_settop(L, top);
  if (m >= 100.0 && (m > 1e4 || !(T >= 0.01 * m))) {
    lua_pushboolean(L, 0);
    lua_setfield(L, t, "electrons");
  }
}


static void integralcap (lua_State *L, const char *fname, int t) {
  int many;
  if (!lua_istable(L, t))
    return;
  /* many points: an integral, a spectrum, an angular distribution.  Their method is the
  ** Born integral: by the distorted waves (the default "auto", about 50
  ** Born points each) one such call under ASan runs for minutes; the
  ** distorted waves are fuzzed through dsdk and differential. */
  many = strcmp(fname, "cross_section") == 0
         || strcmp(fname, "energy_loss") == 0
         || strcmp(fname, "photon_yield") == 0
         || strcmp(fname, "spectrum") == 0
         || strcmp(fname, "angular") == 0;
  if (many) {
    int ty = lua_getfield(L, t, "method");
    const char *m = ty == LUA_TSTRING ? lua_tostring(L, -1) : NULL;
    lua_pop(L, 1);
    if (ty == LUA_TNIL || (m != NULL && (strcmp(m, "auto") == 0
                                         || strcmp(m, "distorted") == 0))) {
      lua_pushliteral(L, "born");
      lua_setfield(L, t, "method");
    }
  }
  if (!many)
    return;
  heavycap(L, t);
  if (lua_getfield(L, t, "rtol") == LUA_TNUMBER) {   /* t has no metatable */
    double r = lua_tonumber(L, -1);
    if (r > 0.0 && r < 1e-6) {
      lua_pushnumber(L, 1e-6);
      lua_setfield(L, t, "rtol");
    }
  }
  lua_pop(L, 1);
}


/*
** Build one call from the bytes and run it: module at index 1, checker
** at index 2.  Returns nothing; aborts on a non-finite result.
*/
static void onecall (lua_State *L, Bytes *b) {
  unsigned f = pick(b, NFUNCS), i, nf, valid = pick(b, 2);
  double T = numbers[pick(b, NNUMBERS)];
  int base, nargs = 1, st;
  lua_getfield(L, 1, funcs[f]);
  if (!lua_isfunction(L, -1)) {
    lua_pop(L, 1);
    return;
  }
  base = lua_gettop(L);
  switch (pick(b, 16)) {
    case 0:  /* not a table */
      genvalue(L, b, 1);
      break;
    case 1:
      genfickle(L, b, 1);
      break;
    default:
      lua_newtable(L);
      if (pick(b, 4) != 0) {
        lua_pushnumber(L, T);
        lua_setfield(L, -2, "T");
      }
      for (i = 0; i < (unsigned)nkeys[f]; i++)
        if ((valid && required(keys[f][i]))
            || pick(b, required(keys[f][i]) ? 16 : 3) != 0) {
          genoption(L, b, keys[f][i], T, valid);
          lua_setfield(L, -2, keys[f][i]);
        }
      nf = pick(b, MAXFIELDS) == 0 ? pick(b, MAXFIELDS) : 0;
      for (i = 0; i < nf; i++) {
        if (pick(b, 2))
          genvalue(L, b, 1);  /* key */
        else
          lua_pushstring(L, extra_keys[pick(b, sizeof extra_keys
                                               / sizeof extra_keys[0])]);
        if (lua_isnil(L, -1) || (lua_type(L, -1) == LUA_TNUMBER
                                 && lua_tonumber(L, -1) != lua_tonumber(L, -1))) {
          lua_pop(L, 1);
          continue;
        }
        genvalue(L, b, 1);
        lua_rawset(L, -3);
      }
      integralcap(L, funcs[f], base + 1);
      if (pick(b, 6) == 5)   /* the options behind a metatable */
        genwrap(L, b, 1);
      break;
  }
  if (pick(b, 16) == 0) {  /* an extra argument */
    genvalue(L, b, 1);
    nargs = 2;
  }
  if (verbose) {
    lua_getglobal(L, "fuzz_dump");
    lua_pushvalue(L, base + 1);
    lua_call(L, 1, 1);
    fprintf(stderr, "fuzz_lua: %s%s\n", funcs[f], lua_tostring(L, -1));
    lua_pop(L, 1);
  }
  st = lua_pcall(L, nargs, LUA_MULTRET, 0);
  if (verbose)   /* FUZZ_LUA_VERBOSE=1: what each call did */
    fprintf(stderr, "fuzz_lua: %s -> %s\n", funcs[f],
            st == LUA_OK ? "ok" : lua_tostring(L, -1) != NULL
                                  ? lua_tostring(L, -1) : "(error object)");
  if (st == LUA_OK) {
    int nres = lua_gettop(L) - base + 1;
    lua_pushvalue(L, 2);  /* checker */
    lua_insert(L, base);
    if (lua_pcall(L, nres, 0, 0) != LUA_OK) {
      fprintf(stderr, "fuzz_lua: non-finite number in the result of '%s'\n",
              funcs[f]);
      abort();
    }
  }
  lua_settop(L, 2);
}


int LLVMFuzzerTestOneInput (const uint8_t *data, size_t size) {
  lua_State *L = luaL_newstate();
  Bytes b;
  unsigned ncalls, i;
  if (L == NULL)
    return 0;
  luaL_openlibs(L);
  luaL_requiref(L, "brakelight", luaopen_brakelight, 0);  /* 1: module */
  if (!learned) {
    for (i = 0; i < NFUNCS; i++)
      learnkeys(L, (int)i);
    learned = 1;
    verbose = getenv("FUZZ_LUA_VERBOSE") != NULL;
  }
  if (luaL_loadstring(L, helpers) != LUA_OK) {
    fprintf(stderr, "fuzz_lua: %s\n", lua_tostring(L, -1));
    abort();
  }
  lua_pushvalue(L, 1);
  if (lua_pcall(L, 1, 6, 0) != LUA_OK) {
    fprintf(stderr, "fuzz_lua: helpers: %s\n", lua_tostring(L, -1));
    abort();
  }
  lua_setfield(L, LUA_REGISTRYINDEX, "fuzz.odd");
  lua_setfield(L, LUA_REGISTRYINDEX, "fuzz.materials");
  lua_setfield(L, LUA_REGISTRYINDEX, "fuzz.particles");
  lua_insert(L, 2);                                    /* 2: checker */
  lua_setfield(L, LUA_REGISTRYINDEX, "fuzz.fickle");
  lua_setfield(L, LUA_REGISTRYINDEX, "fuzz.wrap");
  b.p = data;
  b.n = size;
  ncalls = 1 + pick(&b, 3);   /* a few calls share one state */
  for (i = 0; i < ncalls && b.n > 0; i++)
    onecall(L, &b);
  lua_close(L);
  return 0;
}
