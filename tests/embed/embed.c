/*
** embed.c -- a C program that embeds Lua 5.4 and loads brakelight the way
** an application would: package.cpath reaches build/brakelight.so, the
** pure-Lua helpers come from lua/.  Runs a small scan in memory and checks
** it against a direct call.  Exit status 0 on success.
** Usage: build/embed ROOT   (ROOT: the source tree, with a trailing slash)
** See Copyright Notice in LICENSE
*/

#include <stdio.h>
#include <stdlib.h>

#include <lua.h>
#include <lauxlib.h>
#include <lualib.h>

static const char chunk[] =
  "local root = ...\n"
  "package.cpath = root .. 'build/?.so;' .. package.cpath\n"
  "package.path = root .. 'lua/?.lua;' .. package.path\n"
  "local bl = require 'brakelight'\n"
  "local scan = require 'brakelight.scan'\n"
  "assert(package.loaded['brakelight.session'] == nil, 'not the runner')\n"
  "local recs, info = scan.run{ quiet = true,\n"
  "  axes = { { 'target', { 'C', 'Pb' } }, { 'T', { 10, 100 } } },\n"
  "  fixed = { particle = 'electron', rtol = 1e-3 },\n"
  "  each = function(pt) return { dsdk = bl.dsdk(pt:with{ k = pt.T / 2 }) } end }\n"
  "assert(#recs == 4 and info.total == 4 and info.computed == 4)\n"
  "local v = bl.dsdk{ particle = 'electron', target = 'Pb', T = 100, k = 50,\n"
  "                   rtol = 1e-3 }\n"
  "assert(recs[4].target == 'Pb' and recs[4].T == 100 and recs[4].dsdk == v,\n"
  "       'scan record differs from the direct call')\n"
  "return bl._VERSION\n";

int main (int argc, char **argv) {
  lua_State *L = luaL_newstate();
  int st;
  if (L == NULL || argc < 2) {
    fprintf(stderr, "embed: usage: embed ROOT/\n");
    return EXIT_FAILURE;
  }
  luaL_openlibs(L);
  st = luaL_loadstring(L, chunk);
  if (st == LUA_OK) {
    lua_pushstring(L, argv[1]);
    st = lua_pcall(L, 1, 1, 0);
  }
  if (st != LUA_OK) {
    fprintf(stderr, "embed: %s\n", lua_tostring(L, -1));
    lua_close(L);
    return EXIT_FAILURE;
  }
  printf("embedded brakelight %s: ok\n", lua_tostring(L, -1));
  lua_close(L);
  return EXIT_SUCCESS;
}
