/*
** lhelpers.c -- the pure-Lua helpers as fields of the module table:
** brakelight.scan, .plot, .merge, .json load "brakelight.<name>" on first
** use, in every Lua host (before, only the runner set this up)
** See Copyright Notice in LICENSE
*/

#include <string.h>

#include "lbl_compat.h"

#include "brakelight/lbrakelight.h"
#include "lbl_internal.h"


/* the helper modules reachable as fields (lua/brakelight/<name>.lua) */
static const char *const helpers[] = {"events", "json", "merge", "plot", "scan",
                                      NULL};


/*
** __index of the module table (t, k): for a helper name, require
** "brakelight.<k>", store the result in t[k] (so later reads find it
** without the metamethod) and return it; nil for any other key.  An error
** of require (helper not on package.path, or failing) propagates.
*/
static int helper_index (lua_State *L) {
  const char *k = lua_type(L, 2) == LUA_TSTRING ? lua_tostring(L, 2) : NULL;
  int i;
  for (i = 0; k != NULL && helpers[i] != NULL; i++) {
    if (strcmp(k, helpers[i]) == 0) {
      lua_getglobal(L, "require");
      lua_pushfstring(L, BL_MODNAME ".%s", k);
      lua_call(L, 1, 1);                /* require("brakelight.<k>") */
      lua_pushvalue(L, 2);
      lua_pushvalue(L, -2);
      lua_rawset(L, 1);                 /* t[k] = the helper */
      return 1;
    }
  }
  lua_pushnil(L);
  return 1;
}


/*
** Give the module table at the top of the stack a metatable whose __index
** loads the helpers; nothing is loaded before a helper field is read.
*/
void lbl_helpers_open (lua_State *L) {
  lua_createtable(L, 0, 1);
  lua_pushcfunction(L, helper_index);
  lua_setfield(L, -2, "__index");
  lua_setmetatable(L, -2);
}
