-- LuaRocks package of brakelight.  From the top of the source tree:
--   luarocks make scripts/brakelight-0.1.0-1.rockspec
-- builds with the project's Makefile ("make" build type) and installs the
-- module brakelight.so for the Lua that luarocks targets (Lua 5.1, 5.2,
-- 5.3, 5.4 or LuaJIT 2.1; Debian 12's luarocks targets 5.1, `luarocks
-- --lua-version 5.4 make ...` another), the pure-Lua helpers
-- (brakelight.scan, .plot, ...) and the runner (a Lua 5.4 program).  Needs
-- the Debian packages of scripts/install-deps.sh (GSL, xraylib, the Lua
-- headers, lua-compat53-dev).  Nothing is downloaded: the source is this
-- tree and the only dependency is the Lua luarocks runs for.
rockspec_format = "3.0"
package = "brakelight"
version = "0.1.0-1"
source = {
  url = "git+file://.",
}
description = {
  summary = "Bremsstrahlung of charged projectiles in screened atomic fields",
  detailed = [[
    A C library with a Lua module (Lua 5.1 to 5.4, LuaJIT): Born
    bremsstrahlung of spin-0 and spin-1/2 projectiles of any mass on
    screened atoms, spectra and angular distributions with error
    estimates; parameter scans, shards, plots.
  ]],
  license = "MIT",
}
dependencies = {
  "lua >= 5.1",
}
external_dependencies = {
  GSL = { header = "gsl/gsl_integration.h" },
  XRL = { header = "xraylib/xraylib.h" },
}
build = {
  type = "make",
  -- the module for luarocks' Lua (LUA_INCDIR) in build/rock-<dir>/, and
  -- the runner; CFLAGS is left to the Makefile (-std=c11 -pthread ...)
  build_target = "rock-build",
  build_variables = {
    LUA_INCDIR = "$(LUA_INCDIR)",
    XRL_INCDIR = "$(XRL_INCDIR)",
  },
  install_target = "rock-install-host",
  install_variables = {
    LUA_INCDIR = "$(LUA_INCDIR)",
    XRL_INCDIR = "$(XRL_INCDIR)",
    INST_LIBDIR = "$(LIBDIR)",
    INST_LUADIR = "$(LUADIR)",
    INST_BINDIR = "$(BINDIR)",
  },
}
