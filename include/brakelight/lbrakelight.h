/*
** lbrakelight.h -- the Lua module entry point
** See Copyright Notice in LICENSE
*/
#ifndef LBRAKELIGHT_H
#define LBRAKELIGHT_H

#include <lua.h>

#define BL_MODNAME "brakelight"

int luaopen_brakelight (lua_State *L);

/*
** Ask every computation of the module to stop at its next dsigma/dk point
** (they raise "interrupted by signal SIG"); async-signal-safe, for a
** SIGINT/SIGTERM handler of the program that embeds Lua (the runner's
** does this).  The request stays for the rest of the process.
*/
void lbl_interrupt (int sig);

#endif
