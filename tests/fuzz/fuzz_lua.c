/*
** fuzz_lua.c -- libFuzzer harness over the Lua API of the module brakelight
** See Copyright Notice in LICENSE
**
** Each input is decoded, byte by byte, into one call of a module function
** with an option table built from the bytes: particles (preset names,
** description tables, particle objects), targets (elements, Z, formulas,
** mixtures, standard names, raw strings), energies, photon energies and
** fractions, angles, screening models, nucleus/electrons/coulomb/elwert
** switches, tolerances, threads, the keys of newer options, and malformed
** types (nil, booleans, functions, tables with an __index metamethod that
** answers differently each time).  The keys of each function are learned
** from its own "allowed: ..." message, so new options are fuzzed as soon
** as the binding knows them.  Every call runs inside lua_pcall: a Lua error
** is a normal outcome; a crash, a sanitizer report, a leak or a NaN/Inf in
** a successful result is a finding (the harness aborts on NaN/Inf).
**
** Cost cap (in the harness, not in the library): arrays of abscissae have
** at most 4 elements and mixtures at most 4 parts; the library itself is
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

static const char *const strings[] = {
  "electron", "positron", "muon", "antimuon", "pion+", "pion-", "kaon+",
  "kaon-", "proton", "Electron", "tau",
  "Pb", "W", "H", "He", "U", "Fm", "Es", "lead", "aluminum", "CO", "Co",
  "H2O", "CaCO3", "Ca(OH)2", "[Co(NH3)6]Cl3", "CuSO4.5H2O", "CuSO4*5H2O",
  "Fe0.5Ni0.5", "(Cu1.5)Se", "YBa2Cu3O6.5", "C8H8", "H1000000000",
  "((((((((((((((((H))))))))))))))))", "Water, Liquid", "water, liquid",
  "Air, Dry (near sea level)", "Polyethylene", "Kapton Polyimide Film",
  "hartree-fock", "thomas-fermi", "exponential", "none", "HARTREE-FOCK",
  "uniform", "point", "auto", "born", "high-energy", "complete", "lpm",
  "mass", "atoms", "", " ", "%s%n", "x", "1", "1e3", "nan", "inf"
};
#define NSTRINGS (sizeof strings / sizeof strings[0])
#define FIRST_NAME 39   /* strings[FIRST_NAME...]: models, switches, methods */


/* Push a number: a listed one, raw bytes as a double, or an integer. */
static void gennumber (lua_State *L, Bytes *b) {
  unsigned c = pick(b, 8);
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
  if (pick(b, 4) != 0)
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


/* Push an array of 0..MAXARRAY numbers (mostly) or values. */
static void genarray (lua_State *L, Bytes *b, int depth) {
  unsigned n = pick(b, MAXARRAY + 1), i;
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
    case 1: {
      static const char *const f[] = {"mass", "charge", "spin", "name"};
      unsigned i;
      lua_newtable(L);
      for (i = 0; i < 4; i++)
        if (pick(b, 6) != 0) {
          if (i == 3 || pick(b, 5) == 0)
            genvalue(L, b, depth + 1);
          else
            gennumber(L, b);
          lua_setfield(L, -2, f[i]);
        }
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


/* Push a target: element, Z, formula, standard name, material, mixture. */
static void gentarget (lua_State *L, Bytes *b, int depth) {
  switch (pick(b, 6)) {
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
        }
        else
          genvalue(L, b, depth + 1);
        lua_rawseti(L, -2, (lua_Integer)i);
      }
      if (pick(b, 2)) {
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
      break;
    }
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
  if (strcmp(key, "particle") == 0)
    lua_pushstring(L, strings[pick(b, 9)]);   /* the presets */
  else if (strcmp(key, "target") == 0)
    lua_pushstring(L, strings[11 + pick(b, 13)]);   /* elements, formulas */
  else if (strcmp(key, "k") == 0)
    lua_pushnumber(L, T * fractions[pick(b, NFRAC)]);
  else if (strcmp(key, "y") == 0 || strcmp(key, "theta") == 0) {
    unsigned n = 1 + pick(b, MAXARRAY), i;
    lua_createtable(L, (int)n, 0);
    for (i = 1; i <= n; i++) {
      lua_pushnumber(L, fractions[pick(b, NFRAC)]);
      lua_rawseti(L, -2, (lua_Integer)i);
    }
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
           || strcmp(key, "kmax") == 0) {
    if (pick(b, 3) == 0)
      genarray(L, b, 1);
    else
      lua_pushnumber(L, T * numbers[pick(b, NNUMBERS)]);
  }
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
  else if (strcmp(key, "T") == 0)
    lua_pushnumber(L, T);   /* the T that k is scaled by */
  else if (strncmp(key, "theta", 5) == 0 || strcmp(key, "phi") == 0)
    lua_pushnumber(L, numbers[pick(b, NNUMBERS)]);
  else if (strcmp(key, "screening") == 0 || strcmp(key, "nucleus") == 0
           || strcmp(key, "method") == 0)
    lua_pushstring(L, strings[FIRST_NAME + pick(b, NSTRINGS - FIRST_NAME)]);
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
  /* fickle(list): a table whose absent keys read list[1], list[2], ... */
  "local function fickle(list)\n"
  "  local i = 0\n"
  "  return setmetatable({}, {__index = function(_, _)\n"
  "    if #list == 0 then return nil end\n"
  "    i = i % #list + 1; return list[i] end})\n"
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
  "ms[3] = bl.material('Water, Liquid')\n"
  "return fickle, function(...) local s = {} for i = 1, select('#', ...) do\n"
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
static void integralcap (lua_State *L, const char *fname, int t) {
  if (!lua_istable(L, t)
      || (strcmp(fname, "cross_section") != 0
          && strcmp(fname, "energy_loss") != 0
          && strcmp(fname, "photon_yield") != 0
          && strcmp(fname, "angular") != 0))
    return;
  if (lua_getfield(L, t, "rtol") == LUA_TNUMBER) {
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
      break;
  }
  integralcap(L, funcs[f], base + 1);
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
            st == LUA_OK ? "ok" : lua_tostring(L, -1));
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
  if (lua_pcall(L, 1, 5, 0) != LUA_OK) {
    fprintf(stderr, "fuzz_lua: helpers: %s\n", lua_tostring(L, -1));
    abort();
  }
  lua_setfield(L, LUA_REGISTRYINDEX, "fuzz.odd");
  lua_setfield(L, LUA_REGISTRYINDEX, "fuzz.materials");
  lua_setfield(L, LUA_REGISTRYINDEX, "fuzz.particles");
  lua_insert(L, 2);                                    /* 2: checker */
  lua_setfield(L, LUA_REGISTRYINDEX, "fuzz.fickle");
  b.p = data;
  b.n = size;
  ncalls = 1 + pick(&b, 3);   /* a few calls share one state */
  for (i = 0; i < ncalls && b.n > 0; i++)
    onecall(L, &b);
  lua_close(L);
  return 0;
}
