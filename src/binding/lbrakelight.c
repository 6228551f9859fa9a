/*
** $Id: lbrakelight.c $
** Lua binding of the brakelight core: the module `brakelight`, its entry
** point and the integration-workspace object
** See Copyright Notice in LICENSE
**
** Arguments in, tables out: the physics is the core's (bl_target.h).
** Every library function takes one option table (argument #1), checks all
** of it before computing, and reports bad input as "bad argument #1 to
** '<name>' (...)" naming the field, the value given and what is allowed.
** Per-state data (the integration workspace) is a userdata upvalue, never
** a C static.  The files of the binding, each using only those before it:
** lfields.c (raising, messages, field readers), lmaterial.c and
** lparticle.c, loptions.c, lresults.c (the call's target, warnings,
** tables), lcalls.c and lintegrals.c (the library functions), lhelpers.c
** and this file.
*/

#include <gsl/gsl_errno.h>

#include "lbl_internal.h"


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
  luaL_setfuncs(L, lbl_particle_meta, 0);
  lua_pop(L, 1);
  luaL_newmetatable(L, TARGETMETA);      /* metatable for call targets */
  lua_pushcfunction(L, lbl_target_gc);
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
  {"sampler", l_sampler},
  {"spectrum", l_spectrum},
  {NULL, NULL}
};


/*
** The functions that compute (a call may be long) run guarded, so that
** SIGINT and SIGTERM stop them at their next point in any host
** (lbl_guardfield); the module table is on top.
*/
static void guard (lua_State *L) {
  static const char *const computing[] = {
    "angular", "cross_section", "differential", "dsdk", "energy_loss",
    "photon_yield", "sampler", "spectrum", NULL
  };
  const char *const *name;
  for (name = computing; *name != NULL; name++)
    lbl_guardfield(L, *name);
}


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
  lbl_sampler_open(L);
  luaL_newlibtable(L, brakelight_funcs);  /* module table */
  newquad(L);                             /* shared workspace */
  luaL_setfuncs(L, brakelight_funcs, 1);  /* functions with upvalue */
  guard(L);
  lua_pushliteral(L, BL_VERSION);
  lua_setfield(L, -2, "_VERSION");
  lbl_material_open(L);                   /* material functions */
  lbl_helpers_open(L);                    /* brakelight.scan, .plot, ... */
  lbl_sys_open(L);                        /* require "brakelight.sys" */
  return 1;
}
