/*
** lbl_compat.h -- the Lua 5.4 C API of the binding on every Lua host
** (Lua 5.1, 5.2, 5.3, 5.4, LuaJIT 2.1), not public
** See Copyright Notice in LICENSE
**
** Include it instead of lua.h and lauxlib.h in the binding files (src/l*.c):
** the binding is written against Lua 5.4 and this header maps that API onto
** older hosts, so the call sites do not change.
**
** - Lua 5.1, LuaJIT 2.1, Lua 5.2: Debian's lua-compat53-dev (compat-5.3)
**   supplies the 5.3 API (lua_absindex, lua_tointegerx, lua_isinteger,
**   luaL_setfuncs, luaL_testudata, luaL_tolstring, lua_getfield and
**   lua_rawgeti returning the type, ...).  Debian installs compat-5.3.h into
**   /usr/include/lua5.1 and /usr/include/lua5.2 only; LuaJIT's include
**   directory has none, so its build finds the lua5.1 copy after LuaJIT's own
**   headers (-idirafter /usr/include/lua5.1, Makefile "Lua hosts"): the
**   header includes <lua.h> with angle brackets, which then still resolves
**   to LuaJIT's.  compat-5.3 is used in its default mode (every function
**   static in each file that includes it): nothing to link.
** - Lua 5.3: the API is 5.4's except for the user values below.
** - Lua 5.4: nothing changes.
**
** compat-5.3 stops at the 5.3 API, so what 5.4 added is shimmed here, with
** the 5.4 names and semantics:
**   lua_newuserdatauv, lua_getiuservalue, lua_setiuservalue  (5.1 - 5.3)
**   LUAMOD_API                                             (5.1, LuaJIT)
*/
#ifndef LBL_COMPAT_H
#define LBL_COMPAT_H

#include "lua.h"
#include "lauxlib.h"

#if LUA_VERSION_NUM < 503
#include "compat-5.3.h"
#endif

#ifndef LUAMOD_API
#define LUAMOD_API LUALIB_API
#endif


#if LUA_VERSION_NUM < 504
/*
** User values before 5.4.  A 5.3 userdata has one user value of any type,
** a 5.2 one a table or nil, a 5.1 one an environment that must be a table
** (and defaults to the globals).  So on every older host the nuv user
** values live in one table, the userdata's single user value (environment
** on 5.1; compat-5.3's lua_setuservalue/lua_getuservalue map to
** lua_setfenv/lua_getfenv there): t[i] is user value i, and
** t[LBL_NUVKEY] = nuv, which also tells the table from the globals a 5.1
** userdata without user values has as environment.  (A string key, not a
** light userdata of a static: the binding files each include this header
** and must agree on the key.)  Stack effects as in 5.4.
*/
#define LBL_NUVKEY "brakelight.nuv"

/* lua_newuserdatauv: a userdata of size bytes with nuv user values (nil). */
static inline void *lbl_newuserdatauv (lua_State *L, size_t size, int nuv) {
  void *p = lua_newuserdata(L, size);
  if (nuv > 0) {
    lua_createtable(L, nuv, 1);         /* the user-value table */
    lua_pushinteger(L, nuv);
    lua_setfield(L, -2, LBL_NUVKEY);    /* t[LBL_NUVKEY] = nuv */
    lua_setuservalue(L, -2);
  }
  return p;
}

/*
** If the value at idx is a userdata with at least n >= 1 user values, push
** its user-value table and return 1; else push nothing and return 0.
*/
static inline int lbl_uvtable (lua_State *L, int idx, int n) {
  lua_Integer nuv;
  if (lua_type(L, idx) != LUA_TUSERDATA || n < 1)
    return 0;
  lua_getuservalue(L, idx);
  if (lua_type(L, -1) != LUA_TTABLE) {
    lua_pop(L, 1);
    return 0;
  }
  lua_pushliteral(L, LBL_NUVKEY);
  lua_rawget(L, -2);
  nuv = lua_type(L, -1) == LUA_TNUMBER ? lua_tointeger(L, -1) : 0;
  lua_pop(L, nuv >= n ? 1 : 2);         /* keep the table only if ours */
  return nuv >= n;
}

/*
** lua_getiuservalue: push user value n of the userdata at idx and return
** its type; push nil and return LUA_TNONE when it has no value n.
*/
static inline int lbl_getiuservalue (lua_State *L, int idx, int n) {
  int tp;
  if (!lbl_uvtable(L, lua_absindex(L, idx), n)) {
    lua_pushnil(L);
    return LUA_TNONE;
  }
  lua_rawgeti(L, -1, n);
  tp = lua_type(L, -1);
  lua_remove(L, -2);                    /* drop the table */
  return tp;
}

/*
** lua_setiuservalue: pop a value into user value n of the userdata at idx;
** return 0 (and still pop) when it has no value n.
*/
static inline int lbl_setiuservalue (lua_State *L, int idx, int n) {
  if (!lbl_uvtable(L, lua_absindex(L, idx), n)) {
    lua_pop(L, 1);
    return 0;
  }
  lua_insert(L, -2);                    /* table below the value */
  lua_rawseti(L, -2, n);
  lua_pop(L, 1);
  return 1;
}

#define lua_newuserdatauv(L, s, nuv)  lbl_newuserdatauv((L), (s), (nuv))
#define lua_getiuservalue(L, i, n)    lbl_getiuservalue((L), (i), (n))
#define lua_setiuservalue(L, i, n)    lbl_setiuservalue((L), (i), (n))
#endif

#endif
