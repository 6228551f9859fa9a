-- LuaRocks package of brakelight.  From the top of the source tree:
--   luarocks make scripts/brakelight-0.1.0-1.rockspec
-- builds with the project's Makefile ("make" build type) and installs the
-- module brakelight.so, the pure-Lua helpers (brakelight.scan, .plot, ...)
-- and the runner.  Needs the Debian packages of scripts/install-deps.sh
-- (GSL, xraylib; Lua 5.4 headers).
rockspec_format = "3.0"
package = "brakelight"
version = "0.1.0-1"
source = {
  url = "git+file://.",
}
description = {
  summary = "Bremsstrahlung of charged projectiles in screened atomic fields",
  detailed = [[
    A C library with a Lua 5.4 module: Born bremsstrahlung of spin-0 and
    spin-1/2 projectiles of any mass on screened atoms, spectra and angular
    distributions with error estimates; parameter scans, shards, plots.
  ]],
  license = "MIT",
}
dependencies = {
  "lua >= 5.4, < 5.5",
}
external_dependencies = {
  GSL = { header = "gsl/gsl_integration.h" },
  XRL = { header = "xraylib/xraylib.h" },
}
build = {
  type = "make",
  build_target = "all",
  -- CFLAGS is left to the Makefile (it adds -std=c11 -pthread ...)
  build_variables = {
    CPPFLAGS = "-Iinclude -I$(LUA_INCDIR) -I$(XRL_INCDIR)/xraylib",
  },
  install_target = "rock-install",
  install_variables = {
    INST_LIBDIR = "$(LIBDIR)",
    INST_LUADIR = "$(LUADIR)",
    INST_BINDIR = "$(BINDIR)",
  },
}
