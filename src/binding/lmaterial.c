/*
** $Id: lmaterial.c $
** Lua binding of materials: brakelight.material, brakelight.materials,
** brakelight.radiation_length, the "brakelight.Material" object, the
** reader of `target =` options used by src/binding/loptions.c, the
** reader of thicknesses with units and the description of a material
** See Copyright Notice in LICENSE
**
** A material is named by
**   a string:  element symbol ("Pb", case as in the periodic table),
**              element name ("lead", any case), catalogue key or alias
**              ("water", "lead glass", any case), chemical formula
**              ("H2O") -- tried in that order (bl_material_lookup);
**   a number:  an integer Z in 1..100;
**   an object: a material from brakelight.material;
**   a table:   { spec, density =, name = }  (spec: any of the above), or a
**              mixture { {spec, fraction}, ..., by = "mass" | "atoms",
**              normalize =, density =, name = }  (spec: anything here,
**              including another mixture table).
** Every bad input raises "bad argument #1 to '<function>' (...)" naming the
** field, the value and what is allowed.  The C structures are plain data:
** a raise leaks nothing (the parts of a mixture live in a userdata).
*/

#include <math.h>
#include <stdarg.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include "lbl_compat.h"   /* lua.h, lauxlib.h and the 5.4 API on every host */

#include "brakelight.h"
#include "lbl_internal.h"


#define MSGSIZE   1024    /* longest message */
#define CTXSIZE   256     /* longest context prefix */
#define MAXPARTS  256     /* parts of one mixture */
#define MAXNEST   8       /* material tables inside material tables */
#define MAXSPECS  4096    /* specifications read for one material, in all */
#define NSUGGEST  3       /* names suggested for an unknown one */
#define SUMTOL    1e-6    /* as in src/core/materials/fill.c */
#define MB_CM2    1e-27   /* 1 mb in cm^2 */

#define ALLOWED "allowed: an element symbol (H..Fm) or name, a catalogue " \
  "key or alias from brakelight.materials() such as 'water' or 'bgo', a " \
  "chemical formula such as 'CaCO3', an integer Z in 1..100, a material " \
  "object, or a table {spec, density =, name =} or {{spec, fraction}, " \
  "..., by = 'mass'|'atoms'}"


/*
** {======================================================
** Reading material specifications
** =======================================================
*/

/* Where we are, for messages. */
typedef struct Reader {
  lua_State *L;
  const char *fname;    /* Lua name of the function */
  char ctx[CTXSIZE];    /* prefix: "field 'target': part #2 of ...: " */
  int depth;            /* material tables being read */
  int nspec;            /* specifications read so far (MAXSPECS) */
  const void *open[MAXNEST];   /* those tables, outermost first */
} Reader;


/* Raise "bad argument #1 to 'fname' (<ctx><message>)".  Never returns. */
LBL_RAISES(2) static int fail (Reader *r, const char *fmt, ...);

static int fail (Reader *r, const char *fmt, ...) {
  char msg[MSGSIZE];
  va_list ap;
  va_start(ap, fmt);
  vsnprintf(msg, sizeof msg, fmt, ap);
  va_end(ap);
  lbl_argfail(r->L, r->fname, "%s%s", r->ctx, msg);
}


/* Append to the context prefix; returns the old length for popctx. */
static size_t pushctx (Reader *r, const char *fmt, ...) {
  size_t len = strlen(r->ctx);
  va_list ap;
  va_start(ap, fmt);
  vsnprintf(r->ctx + len, sizeof r->ctx - len, fmt, ap);
  va_end(ap);
  return len;
}

static void popctx (Reader *r, size_t len) {
  r->ctx[len] = '\0';
}


static void readspec (Reader *r, int idx, bl_material *out);


/*
** A two-letter name with two readings ("PB": lead, or phosphorus and
** boron; bl_material_lookup returned BL_EAMBIGUOUS): offer both.
*/
static void ambiguous (Reader *r, const char *s) {
  char sym[3], f[5];
  int Z;
  sym[0] = (char)(s[0] >= 'a' && s[0] <= 'z' ? s[0] - 'a' + 'A' : s[0]);
  sym[1] = (char)(s[1] >= 'A' && s[1] <= 'Z' ? s[1] - 'A' + 'a' : s[1]);
  sym[2] = '\0';
  Z = bl_element_find(sym);
  f[0] = sym[0];
  f[1] = '1';
  f[2] = (char)(sym[1] - 'a' + 'A');
  f[3] = '1';
  f[4] = '\0';
  fail(r, "ambiguous material name '%s': did you mean %s (%s) or %c + %c? "
       "write '%s' for the element or '%s' for the formula", s, sym,
       bl_element_name(Z), f[0], f[2], sym, f);
}


/*
** A string: element, catalogue name or formula.  On failure say why each
** reading failed, with the parser's position (1-based, as string.sub
** counts) and the closest names: elements first, then catalogue keys.
*/
static void readstring (Reader *r, int idx, bl_material *out) {
  size_t len;
  const char *s = lua_tolstring(r->L, idx, &len);
  const char *near[NSUGGEST];
  char where[96], sugg[512], v[80];
  bl_parse_error e;
  int i, n, st;
  if (strlen(s) != len)   /* C would read it cut short */
    fail(r, "material name %s contains a NUL byte at byte %zu; allowed: "
         "text without NUL bytes", lbl_showval(r->L, idx, v, sizeof v),
         strlen(s) + 1);
  st = bl_material_lookup(out, s, &e);
  if (st == BL_SUCCESS)
    return;
  if (st == BL_EAMBIGUOUS)
    ambiguous(r, s);
  if (s[0] == '\0')
    fail(r, "material name is empty; %s", ALLOWED);
  if (e.reason == NULL)
    e.reason = "not a formula";
  if (s[e.pos] == '\0')
    snprintf(where, sizeof where, "at byte %zu (the end)", e.pos + 1);
  else
    snprintf(where, sizeof where, "at byte %zu ('%.12s')", e.pos + 1,
             s + e.pos);
  n = bl_material_suggest(s, near, NSUGGEST);
  sugg[0] = '\0';
  for (i = 0; i < n; i++) {
    size_t l = strlen(sugg);
    int Z = bl_element_lookup(near[i]);
    char what[40] = "";
    if (Z != 0 && strcmp(near[i], bl_element_symbol(Z)) == 0)
      snprintf(what, sizeof what, " (%s)", bl_element_name(Z));
    else if (Z != 0)
      snprintf(what, sizeof what, " (element %s)", bl_element_symbol(Z));
    snprintf(sugg + l, sizeof sugg - l, "%s'%s'%s",
             i == 0 ? "" : (i == n - 1 ? " or " : ", "), near[i], what);
  }
  fail(r, "unknown material %s: not an element symbol or name, nor a "
       "catalogue key or alias; as a formula, %s %s%s%s%s; %s",
       lbl_showval(r->L, idx, v, sizeof v), e.reason, where,
       n > 0 ? " (did you mean " : "", sugg, n > 0 ? "?)" : "", ALLOWED);
}


/* A number: an integer Z in 1..100. */
static void readnumber (Reader *r, int idx, bl_material *out) {
  char v[80];
  int isint;
  lua_Integer Z = lua_tointegerx(r->L, idx, &isint);  /* 82.0 is fine */
  if (!isint || Z < 1 || Z > BL_ZMAX)
    fail(r, "atomic number must be an integer Z in 1..%d, got %s", BL_ZMAX,
         lbl_showval(r->L, idx, v, sizeof v));
  bl_material_element(out, (int)Z);
}


/*
** Check that every key of the table at idx is an integer in 1..n or one
** of `names` (NULL-terminated).  `what` names the table in the message
** ("a material table"), `allowed` lists the keys.
*/
static void checkkeys (Reader *r, int idx, lua_Integer n,
                       const char *const names[], const char *what,
                       const char *allowed) {
  lua_State *L = r->L;
  char v[80];
  lua_pushnil(L);
  while (lua_next(L, idx) != 0) {  /* key at -2, value at -1 */
    int ok = 0, i;
    if (lua_type(L, -2) == LUA_TNUMBER && lua_isinteger(L, -2)) {
      lua_Integer k = lua_tointeger(L, -2);
      ok = (k >= 1 && k <= n);
    }
    else if (lua_type(L, -2) == LUA_TSTRING) {
      const char *key = lua_tostring(L, -2);
      for (i = 0; names[i] != NULL && !ok; i++)
        ok = (strcmp(key, names[i]) == 0);
    }
    if (!ok)
      fail(r, "unexpected key %s in %s; %s",
           lbl_showval(L, -2, v, sizeof v), what, allowed);
    lua_pop(L, 1);
  }
}


/* Fields density and name of the table at idx, applied to *m. */
static void readextras (Reader *r, int idx, bl_material *m) {
  lua_State *L = r->L;
  char v[80];
  switch (lua_getfield(L, idx, "density")) {
    case LUA_TNIL:
      break;
    case LUA_TNUMBER: {
      double rho = (double)lua_tonumber(L, -1);
      if (!(rho > 0 && isfinite(rho)))
        fail(r, "field 'density' must be > 0 g/cm^3 and finite, got %s",
             lbl_showval(L, -1, v, sizeof v));
      m->density = rho;
      break;
    }
    default:
      fail(r, "field 'density' must be a number > 0 (g/cm^3), got %s",
           lbl_showval(L, -1, v, sizeof v));
  }
  lua_pop(L, 1);
  switch (lua_getfield(L, idx, "name")) {
    case LUA_TNIL:
      break;
    case LUA_TSTRING: {
      size_t len;
      const char *s = lua_tolstring(L, -1, &len);
      if (len < 1 || len >= BL_MATERIAL_NAMELEN || strlen(s) != len)
        fail(r, "field 'name' must be a string of 1 to %d bytes without "
             "zeros, got %s (%zu bytes)", BL_MATERIAL_NAMELEN - 1,
             lbl_showval(L, -1, v, sizeof v), len);
      memcpy(m->name, s, len + 1);
      break;
    }
    default:
      fail(r, "field 'name' must be a string, got %s",
           lbl_showval(L, -1, v, sizeof v));
  }
  lua_pop(L, 1);
}


/* Name of a mixture made of the parts, "0.7 Cu + 0.3 Zn by mass"; part
** names with blanks in parentheses. */
static void mixname (char *buf, int n, const bl_material *parts,
                     const double *fr, const char *by) {
  char s[512];
  int i;
  s[0] = '\0';
  for (i = 0; i < n; i++) {
    size_t len = strlen(s);
    int paren = strchr(parts[i].name, ' ') != NULL;
    snprintf(s + len, sizeof s - len, "%s%.6g %s%s%s", i > 0 ? " + " : "",
             fr[i], paren ? "(" : "", parts[i].name, paren ? ")" : "");
  }
  if (strlen(s) + strlen(by) + 4 >= BL_MATERIAL_NAMELEN)
    snprintf(s, sizeof s, "mixture of %d parts by %s", n, by);
  else {
    size_t len = strlen(s);
    snprintf(s + len, sizeof s - len, " by %s", by);
  }
  snprintf(buf, BL_MATERIAL_NAMELEN, "%s", s);
}


static const char *const mix_keys[] = {
  "by", "normalize", "density", "name", NULL
};
static const char *const one_keys[] = { "density", "name", NULL };
static const char *const part_keys[] = { NULL };


/* A mixture table at idx (its element 1 is a table). */
static void readmixture (Reader *r, int idx, bl_material *out) {
  lua_State *L = r->L;
  char v[80];
  bl_material *parts;
  double *fr, sum = 0;
  lua_Integer n = (lua_Integer)lua_rawlen(L, idx), i;
  int bymass = 0, normalize = 0, bad, st;
  const char *by;
  checkkeys(r, idx, n, mix_keys, "a mixture table", "allowed in a "
            "mixture: parts [1..n] as {spec, fraction}, by, normalize, "
            "density, name");
  if (n > MAXPARTS)
    fail(r, "a mixture has at most %d parts, got %lld", MAXPARTS,
         (long long)n);
  switch (lua_getfield(L, idx, "by")) {
    case LUA_TNIL:
      fail(r, "missing field 'by' of a mixture; allowed: 'mass' (fractions "
           "by mass) or 'atoms' (numbers of atoms, or of molecules for a "
           "compound part)");
      break;
    case LUA_TSTRING:
      by = lua_tostring(L, -1);
      if (strlen(by) != lua_rawlen(L, -1))   /* C would read it cut short */
        fail(r, "field 'by' contains a NUL byte at byte %zu; allowed: "
             "'mass' or 'atoms'", strlen(by) + 1);
      if (strcmp(by, "mass") == 0)
        bymass = 1;
      else if (strcmp(by, "atoms") != 0)
        fail(r, "field 'by' must be 'mass' or 'atoms', got %s",
             lbl_showval(L, -1, v, sizeof v));
      break;
    default:
      fail(r, "field 'by' must be 'mass' or 'atoms', got %s",
           lbl_showval(L, -1, v, sizeof v));
  }
  lua_pop(L, 1);
  switch (lua_getfield(L, idx, "normalize")) {
    case LUA_TNIL: break;
    case LUA_TBOOLEAN: normalize = lua_toboolean(L, -1); break;
    default:
      fail(r, "field 'normalize' must be a boolean, got %s",
           lbl_showval(L, -1, v, sizeof v));
  }
  lua_pop(L, 1);
  /* the parts live in a userdata: a raise below frees them with it */
  parts = (bl_material *)lua_newuserdatauv(L, (size_t)n * (sizeof *parts
                                           + sizeof *fr), 0);
  fr = (double *)(void *)(parts + n);
  for (i = 1; i <= n; i++) {
    size_t old = pushctx(r, "part #%lld of the mixture: ", (long long)i);
    int t;
    if (lua_rawgeti(L, idx, i) != LUA_TTABLE)
      fail(r, "must be a table {spec, fraction}, got %s",
           lbl_showval(L, -1, v, sizeof v));
    t = lua_gettop(L);
    checkkeys(r, t, 2, part_keys, "a mixture part", "a part is {spec, "
              "fraction}");
    if (lua_rawgeti(L, t, 2) != LUA_TNUMBER)
      fail(r, "fraction (element 2) must be a number > 0, got %s",
           lbl_showval(L, -1, v, sizeof v));
    fr[i - 1] = (double)lua_tonumber(L, -1);
    if (!(fr[i - 1] > 0 && isfinite(fr[i - 1])))
      fail(r, "fraction (element 2) must be > 0 and finite, got %s",
           lbl_showval(L, -1, v, sizeof v));
    lua_pop(L, 1);
    lua_rawgeti(L, t, 1);
    readspec(r, lua_gettop(L), &parts[i - 1]);
    lua_pop(L, 2);  /* spec, part */
    sum += fr[i - 1];
    popctx(r, old);
  }
  if (!normalize && !(fabs(sum - 1) <= SUMTOL))
    fail(r, "fractions of the mixture sum to %.14g; allowed: a sum within "
         "%g of 1, or normalize = true", sum, SUMTOL);
  st = bl_material_mixture(out, (int)n, parts, fr, bymass, normalize, &bad);
  if (st != BL_SUCCESS) {  /* fractions and parts are checked: too big */
    if (bad >= 0)
      fail(r, "part #%d of the mixture brings it to more than %d different "
           "elements (allowed: at most %d)", bad + 1, BL_MATERIAL_MAXCOMP,
           BL_MATERIAL_MAXCOMP);
    fail(r, "the core refuses this mixture: %s", bl_strerror(st));
  }
  mixname(out->name, (int)n, parts, fr, bymass ? "mass" : "atoms");
  lua_pop(L, 1);  /* parts */
}


/* A table at idx: {spec, density =, name =} or a mixture. */
static void readtable (Reader *r, int idx, bl_material *out) {
  lua_State *L = r->L;
  int tp;
  if (r->depth >= MAXNEST)  /* no context: it would repeat MAXNEST times */
    lbl_argfail(L, r->fname, "material tables nested too deep (at most %d "
                "levels; does a table contain itself?)", MAXNEST);
  luaL_checkstack(L, 8, "material tables nested too deep");
  for (tp = 0; tp < r->depth; tp++)
    if (r->open[tp] == lua_topointer(L, idx))
      fail(r, "the table contains itself, so its material tables would be "
           "nested without end (material tables nested too deep (at most %d "
           "levels)); allowed: parts that are other tables or names",
           MAXNEST);
  r->open[r->depth++] = lua_topointer(L, idx);
  tp = lua_rawgeti(L, idx, 1);
  lua_pop(L, 1);
  if (tp == LUA_TNIL)
    fail(r, "empty material table (no element 1); %s", ALLOWED);
  if (tp == LUA_TTABLE)
    readmixture(r, idx, out);
  else {
    checkkeys(r, idx, 1, one_keys, "a material table", "allowed: {spec, "
              "density =, name =}, or a mixture {{spec, fraction}, ..., "
              "by =, normalize =, density =, name =}");
    lua_rawgeti(L, idx, 1);
    readspec(r, lua_gettop(L), out);
    lua_pop(L, 1);
  }
  readextras(r, idx, out);
  r->depth--;
}


/* Any specification at absolute index idx. */
static void readspec (Reader *r, int idx, bl_material *out) {
  char v[80];
  const bl_material *m;
  if (++r->nspec > MAXSPECS)  /* nested parts multiply: 256^n without it */
    fail(r, "the material has more than %d parts in all (a part used n "
         "times in a mixture counts n times; allowed: at most %d)", MAXSPECS,
         MAXSPECS);
  switch (lua_type(r->L, idx)) {
    case LUA_TSTRING:
      readstring(r, idx, out);
      break;
    case LUA_TNUMBER:
      readnumber(r, idx, out);
      break;
    case LUA_TTABLE:
      readtable(r, idx, out);
      break;
    default:
      m = (const bl_material *)luaL_testudata(r->L, idx, LBL_MATMETA);
      if (m == NULL)
        fail(r, "material expected, got %s; %s",
             lbl_showval(r->L, idx, v, sizeof v), ALLOWED);
      *out = *m;
      break;
  }
}


void lbl_totarget (lua_State *L, int idx, const char *fname,
                   const char *field, bl_material *out) {
  Reader r;
  idx = lua_absindex(L, idx);
  r.L = L;
  r.fname = fname;
  r.depth = r.nspec = 0;
  if (lua_isnoneornil(L, idx))
    lbl_argfail(L, fname, "missing required field '%s' (%s)", field,
                ALLOWED);
  snprintf(r.ctx, sizeof r.ctx, "field '%s': ", field);
  readspec(&r, idx, out);
}

/* }====================================================== */


/*
** {======================================================
** The description of a material, and thicknesses with units
** =======================================================
*/

/*
** What a material is and where its density comes from, in words, into
** buf (size n): the catalogue entry and its source, the formula that got
** a catalogue crystal's density, xraylib's element density, or none.
*/
void lbl_describe (const bl_material *m, char *buf, size_t n) {
  const bl_catalogue_entry *e = m->entry;
  bl_material el;
  if (e != NULL && m->density == e->density) {
    bl_material f;
    if (!(e->flags & BL_CATALOGUE_CRYSTAL) || strcmp(m->name, e->key) == 0
        || bl_material_formula(&f, m->name, NULL) != BL_SUCCESS)
      snprintf(buf, n, "%s (catalogue entry '%s'); composition %s; "
               "density %.6g g/cm^3; %s", e->description, e->key,
               e->composition, e->density, e->source);
    else
      snprintf(buf, n, "formula %s with the density of the catalogue "
               "entry '%s' (%s): %.6g g/cm^3; %s", m->name, e->key,
               e->description, e->density, e->source);
  }
  else if (e != NULL)
    snprintf(buf, n, "%s (catalogue entry '%s'); composition %s; density "
             "%.6g g/cm^3 as given (the catalogue has %.6g)",
             e->description, e->key, e->composition, m->density,
             e->density);
  else if (m->n == 1 && m->comp[0].atoms == 1.0
           && bl_material_element(&el, m->comp[0].Z) == BL_SUCCESS
           && m->comp[0].A == el.comp[0].A) {
    if (m->density > 0 && m->density == el.density)
      snprintf(buf, n, "element %s (%s); density %.6g g/cm^3 (xraylib's "
               "element density; gases at room temperature and 1 atm)",
               m->name, bl_element_name(m->comp[0].Z), m->density);
    else if (m->density > 0)
      snprintf(buf, n, "element %s (%s); density %.6g g/cm^3 as given",
               bl_element_symbol(m->comp[0].Z),
               bl_element_name(m->comp[0].Z), m->density);
    else
      snprintf(buf, n, "element %s (%s); density unknown",
               bl_element_symbol(m->comp[0].Z),
               bl_element_name(m->comp[0].Z));
  }
  else if (m->density > 0)
    snprintf(buf, n, "%s; density %.6g g/cm^3 as given", m->name,
             m->density);
  else
    snprintf(buf, n, "%s; density unknown (give {spec, density = "
             "<g/cm^3>})", m->name);
}


/* Units of a thickness: length in cm, mass thickness, radiation lengths. */
static const struct {
  const char *name;
  double cm;      /* cm per unit of length; 0: not a length */
  int kind;       /* 0 length, 1 g/cm^2, 2 radiation lengths */
} thickunits[] = {
  {"um", 1e-4, 0}, {"mm", 0.1, 0}, {"cm", 1.0, 0}, {"m", 100.0, 0},
  {"g/cm2", 0, 1}, {"g/cm^2", 0, 1}, {"X0", 0, 2}
};

#define THICKALLOWED "allowed: a number in (0, inf) (g/cm^2), or a " \
  "string '<number> <unit>' with the number in (0, inf) and the unit um, " \
  "mm, cm, m (a length: the target needs a density), g/cm2 or X0 " \
  "(radiation lengths), such as '2 mm'"


double lbl_tothickness (lua_State *L, int t, const char *fname,
                        const char *key, const bl_material *m) {
  char v[80], buf[64], *end;
  const char *s, *u;
  double x, X0;
  size_t i;
  int tp = lua_getfield(L, t, key);
  if (tp == LUA_TNUMBER) {
    x = (double)lua_tonumber(L, -1);
    if (!(x > 0 && isfinite(x)))
      lbl_argfail(L, fname, "field '%s' must be in (0, inf) g/cm^2, got "
                  "%.14g; %s", key, x, THICKALLOWED);
    lua_pop(L, 1);
    return x;
  }
  if (tp == LUA_TNIL)
    lbl_argfail(L, fname, "missing required field '%s' (the radiator "
                "thickness; %s)", key, THICKALLOWED);
  if (tp != LUA_TSTRING)
    lbl_argfail(L, fname, "field '%s' must be a number or a string, got "
                "%s; %s", key, lbl_showval(L, -1, v, sizeof v),
                THICKALLOWED);
  lua_pop(L, 1);
  s = lbl_getstr(L, t, fname, key, buf, sizeof buf);
  x = strtod(s, &end);
  for (u = end; *u == ' '; u++)
    ;
  for (i = 0; i < sizeof thickunits / sizeof thickunits[0]; i++) {
    size_t l = strlen(thickunits[i].name);
    const char *rest = u + l;
    if (strncmp(u, thickunits[i].name, l) != 0)
      continue;
    while (*rest == ' ')
      rest++;
    if (*rest == '\0')
      break;
  }
  if (end == s || i == sizeof thickunits / sizeof thickunits[0])
    lbl_argfail(L, fname, "field '%s' = '%s' is not '<number> <unit>'; %s",
                key, s, THICKALLOWED);
  if (!(x > 0 && isfinite(x)))
    lbl_argfail(L, fname, "field '%s' = '%s': the number must be in (0, "
                "inf), got %.14g; %s", key, s, x, THICKALLOWED);
  switch (thickunits[i].kind) {
    case 1:
      return x;
    case 2:
      X0 = bl_radiation_length(m);
      if (!(X0 > 0))
        lbl_argfail(L, fname, "field '%s' = '%s': target '%s' has no "
                    "radiation length", key, s, m->name);
      return x * X0;
    default:
      if (!(m->density > 0))
        lbl_argfail(L, fname, "field '%s' = '%s' is a length, but target "
                    "'%s' has no known density; give target = {'%s', "
                    "density = <g/cm^3>}, or the thickness in g/cm^2 or X0",
                    key, s, m->name, m->name);
      if (!(x * thickunits[i].cm * m->density < HUGE_VAL))
        lbl_argfail(L, fname, "field '%s' = '%s' is too large: %.6g cm at "
                    "%.6g g/cm^3 is not a finite g/cm^2", key, s,
                    x * thickunits[i].cm, m->density);
      return x * thickunits[i].cm * m->density;
  }
}

/* }====================================================== */


/*
** {======================================================
** Material objects (metatable "brakelight.Material")
** A full userdata holding a bl_material (plain data).  Read-only fields:
** name, density (g/cm^3, nil when unknown), molar_mass (g/mol per formula
** unit), components, per_gram (cm^2/g per mb), radiation_length (g/cm^2),
** radiation_length_cm (nil when the density is unknown), key (the
** catalogue entry it comes from, or nil), description.
** =======================================================
*/

static const char *const fields =
  "name, density, molar_mass, components, per_gram, radiation_length, "
  "radiation_length_cm, key, description";


/* Push a new material object holding a copy of *m. */
static void pushmaterial (lua_State *L, const bl_material *m) {
  bl_material *p = (bl_material *)lua_newuserdatauv(L, sizeof *p, 0);
  *p = *m;
  luaL_setmetatable(L, LBL_MATMETA);
}


/* Push the array of components {Z, symbol, A, atoms, mass_fraction}. */
static void pushcomponents (lua_State *L, const bl_material *m) {
  int i;
  lua_createtable(L, m->n, 0);
  for (i = 0; i < m->n; i++) {
    const bl_component *c = &m->comp[i];
    lua_createtable(L, 0, 5);
    lua_pushinteger(L, c->Z);
    lua_setfield(L, -2, "Z");
    lua_pushstring(L, bl_element_symbol(c->Z));
    lua_setfield(L, -2, "symbol");
    lua_pushnumber(L, c->A);
    lua_setfield(L, -2, "A");
    lua_pushnumber(L, c->atoms);
    lua_setfield(L, -2, "atoms");
    lua_pushnumber(L, c->mass_fraction);
    lua_setfield(L, -2, "mass_fraction");
    lua_rawseti(L, -2, i + 1);
  }
}


/* __index: the read-only fields; any other key raises. */
static int material_index (lua_State *L) {
  const bl_material *m = (const bl_material *)luaL_checkudata(L, 1,
                                                              LBL_MATMETA);
  const char *key = lua_type(L, 2) == LUA_TSTRING ? lua_tostring(L, 2) : "";
  char v[80];
  if (strcmp(key, "name") == 0)
    lua_pushstring(L, m->name);
  else if (strcmp(key, "density") == 0) {
    if (m->density > 0) lua_pushnumber(L, m->density);
    else lua_pushnil(L);
  }
  else if (strcmp(key, "molar_mass") == 0)
    lua_pushnumber(L, m->molar_mass);
  else if (strcmp(key, "components") == 0)
    pushcomponents(L, m);
  else if (strcmp(key, "per_gram") == 0)
    lua_pushnumber(L, BL_NA / m->molar_mass * MB_CM2);
  else if (strcmp(key, "radiation_length") == 0)
    lua_pushnumber(L, bl_radiation_length(m));
  else if (strcmp(key, "radiation_length_cm") == 0) {
    if (m->density > 0) lua_pushnumber(L, bl_radiation_length(m) / m->density);
    else lua_pushnil(L);
  }
  else if (strcmp(key, "key") == 0) {
    if (m->entry != NULL) lua_pushstring(L, m->entry->key);
    else lua_pushnil(L);
  }
  else if (strcmp(key, "description") == 0) {
    char buf[MSGSIZE];
    lbl_describe(m, buf, sizeof buf);
    lua_pushstring(L, buf);
  }
  else
    return luaL_error(L, "%s has no field %s; fields: %s", LBL_MATMETA,
                      lbl_showval(L, 2, v, sizeof v), fields);
  return 1;
}


/* __newindex: material objects are immutable. */
static int material_newindex (lua_State *L) {
  char v[80];
  luaL_checkudata(L, 1, LBL_MATMETA);
  return luaL_error(L, "%s objects are read-only (field %s); make a new one "
                    "with brakelight.material{...}", LBL_MATMETA,
                    lbl_showval(L, 2, v, sizeof v));
}


/*
** __tostring: "brakelight.Material: H2O (H 2, O 1 per formula unit;
** 18.015 g/mol; density unknown)".
*/
static int material_tostring (lua_State *L) {
  const bl_material *m = (const bl_material *)luaL_checkudata(L, 1,
                                                              LBL_MATMETA);
  char buf[MSGSIZE];
  size_t len;
  int i;
  snprintf(buf, sizeof buf, "%s: %s (", LBL_MATMETA, m->name);
  for (i = 0; i < m->n; i++) {
    len = strlen(buf);
    snprintf(buf + len, sizeof buf - len, "%s%s %.6g", i > 0 ? ", " : "",
             bl_element_symbol(m->comp[i].Z), m->comp[i].atoms);
  }
  len = strlen(buf);
  if (m->density > 0)
    snprintf(buf + len, sizeof buf - len, " per formula unit; %.8g g/mol; "
             "%.6g g/cm^3)", m->molar_mass, m->density);
  else
    snprintf(buf + len, sizeof buf - len, " per formula unit; %.8g g/mol; "
             "density unknown)", m->molar_mass);
  lua_pushstring(L, buf);
  return 1;
}


static const luaL_Reg material_meta[] = {
  {"__index", material_index},
  {"__newindex", material_newindex},
  {"__tostring", material_tostring},
  {NULL, NULL}
};

/* }====================================================== */


/*
** {======================================================
** Library functions
** =======================================================
*/

/*
** brakelight.material(spec) -> a material object; spec as described at
** the top of this file (a material object comes back as it is).
*/
static int l_material (lua_State *L) {
  Reader r;
  bl_material m;
  lua_settop(L, 1);
  if (luaL_testudata(L, 1, LBL_MATMETA) != NULL)
    return 1;  /* already a material */
  if (lua_isnil(L, 1))
    return lbl_argfail(L, "material", "material expected, got nil; %s",
                       ALLOWED);
  r.L = L;
  r.fname = "material";
  r.ctx[0] = '\0';
  r.depth = r.nspec = 0;
  readspec(&r, 1, &m);
  pushmaterial(L, &m);
  return 1;
}


/* Set field k of the table on top to the string v (nothing if NULL). */
static void setstr (lua_State *L, const char *k, const char *v) {
  if (v != NULL) {
    lua_pushstring(L, v);
    lua_setfield(L, -2, k);
  }
}


/*
** brakelight.materials() -> the catalogue in the order of its keys: an
** array of {key, aliases = {...}, description, formula (or nil),
** composition, density (g/cm^3), source, crystal = true|nil,
** effective = true|nil}.
*/
static int l_materials (lua_State *L) {
  int i, j, n = bl_material_catalogue_count();
  lua_createtable(L, n, 0);
  for (i = 0; i < n; i++) {
    const bl_catalogue_entry *e = bl_material_catalogue_entry(i);
    lua_createtable(L, 0, 9);
    setstr(L, "key", e->key);
    lua_createtable(L, BL_CATALOGUE_MAXALIAS, 0);
    for (j = 0; j < BL_CATALOGUE_MAXALIAS && e->aliases[j] != NULL; j++) {
      lua_pushstring(L, e->aliases[j]);
      lua_rawseti(L, -2, j + 1);
    }
    lua_setfield(L, -2, "aliases");
    setstr(L, "description", e->description);
    setstr(L, "formula", e->formula);
    setstr(L, "composition", e->composition);
    lua_pushnumber(L, e->density);
    lua_setfield(L, -2, "density");
    setstr(L, "source", e->source);
    if (e->flags & BL_CATALOGUE_CRYSTAL) {
      lua_pushboolean(L, 1);
      lua_setfield(L, -2, "crystal");
    }
    if (e->flags & BL_CATALOGUE_EFFECTIVE) {
      lua_pushboolean(L, 1);
      lua_setfield(L, -2, "effective");
    }
    lua_rawseti(L, -2, i + 1);
  }
  return 1;
}


/*
** brakelight.radiation_length(target) or {target = ...}
**   -> {value = X0 (g/cm^2), cm = X0/density or nil, units, target = name,
**       formula = "Tsai"}
*/
static int l_radiation_length (lua_State *L) {
  Reader r;
  bl_material m;
  double x0;
  lua_settop(L, 1);
  r.L = L;
  r.fname = "radiation_length";
  r.ctx[0] = '\0';
  r.depth = r.nspec = 0;
  if (lua_type(L, 1) == LUA_TTABLE
      && lua_getfield(L, 1, "target") != LUA_TNIL) {  /* option table */
    static const char *const keys[] = { "target", NULL };
    lua_pop(L, 1);
    checkkeys(&r, 1, 0, keys, "the option table", "allowed: target");
    lua_getfield(L, 1, "target");
    lbl_totarget(L, 2, "radiation_length", "target", &m);
  }
  else {
    lua_settop(L, 1);
    if (lua_isnil(L, 1))
      return lbl_argfail(L, r.fname, "material expected, got nil; %s",
                         ALLOWED);
    readspec(&r, 1, &m);
  }
  x0 = bl_radiation_length(&m);
  lua_createtable(L, 0, 5);
  lua_pushnumber(L, x0);
  lua_setfield(L, -2, "value");
  if (m.density > 0) {
    lua_pushnumber(L, x0 / m.density);
    lua_setfield(L, -2, "cm");
  }
  lua_createtable(L, 0, 2);
  lua_pushliteral(L, "g/cm^2");
  lua_setfield(L, -2, "value");
  lua_pushliteral(L, "cm");
  lua_setfield(L, -2, "cm");
  lua_setfield(L, -2, "units");
  lua_pushstring(L, m.name);
  lua_setfield(L, -2, "target");
  lua_pushliteral(L, "Tsai");
  lua_setfield(L, -2, "formula");
  return 1;
}


static const luaL_Reg material_funcs[] = {
  {"material", l_material},
  {"materials", l_materials},
  {"radiation_length", l_radiation_length},
  {NULL, NULL}
};


void lbl_material_open (lua_State *L) {
  luaL_newmetatable(L, LBL_MATMETA);      /* metatable for materials */
  luaL_setfuncs(L, material_meta, 0);
  lua_pop(L, 1);
  luaL_setfuncs(L, material_funcs, 0);    /* into the module table */
}

/* }====================================================== */
