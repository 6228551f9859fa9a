/*
** $Id: lparticle.c $
** Particle objects of the Lua binding (metatable "brakelight.Particle")
** and the particle description tables {mass =, charge =, spin =, name =}.
** See Copyright Notice in LICENSE
*/

#include <float.h>
#include <math.h>
#include <stdarg.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include "lbl_internal.h"


/* Names of the particle presets, ", "-separated. */
const char *lbl_particlenames (char *buf, size_t n) {
  int i;
  buf[0] = '\0';
  for (i = 0; bl_particles[i] != NULL; i++)
    lbl_addname(buf, n, bl_particles[i]->name);
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
void lbl_tabparticle (lua_State *L, int t, const char *fname,
                      const char *prefix, bl_particle *p, char *namebuf) {
  char v[80], what[64];
  size_t len;
  lbl_checkkeys(L, t, fname, "particle field", particle_keys);
  p->mass = lbl_neednum(L, t, fname, prefix, "mass", "particle mass in MeV");
  p->charge = lbl_neednum(L, t, fname, prefix, "charge",
                      "particle charge in units of e");
  p->spin = lbl_neednum(L, t, fname, prefix, "spin", "particle spin, 0 or 0.5");
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
int l_particle (lua_State *L) {
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
                lbl_particlenames(names, sizeof names));
      pushparticle(L, pre);
      return 1;
    case LUA_TTABLE:
      lua_settop(L, 1);
      lbl_tabparticle(L, 1, "particle", "", &p, name);
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


const luaL_Reg lbl_particle_meta[] = {
  {"__eq", particle_eq},
  {"__index", particle_index},
  {"__newindex", particle_newindex},
  {"__tostring", particle_tostring},
  {NULL, NULL}
};
