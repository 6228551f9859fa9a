/*
** lbrakelight.h -- the Lua module entry point
** See Copyright Notice in LICENSE
*/
#ifndef LBRAKELIGHT_H
#define LBRAKELIGHT_H

#include <lua.h>

#define BL_MODNAME "brakelight"

int luaopen_brakelight (lua_State *L);

#endif
