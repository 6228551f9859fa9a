#!/usr/bin/env bash
# check-install.sh -- `make test-install`: install into a scratch prefix
# under build/, run a small scan with the installed runner, load the
# installed module and helpers in the stock lua5.4, check the man page and
# headers, then remove the prefix.
set -euo pipefail
cd "$(dirname "$0")/.."
prefix="$PWD/build/inst-test"
rm -rf "$prefix"
trap 'rm -rf "$prefix"' EXIT
make --no-print-directory install PREFIX="$prefix" >/dev/null
"$prefix/bin/brakelight" -q -e '
  local bl = require "brakelight"
  local r = bl.scan.run{ axes = { { "T", { 10, 20 } } }, each = function(p)
    return { v = bl.dsdk{ particle = "muon", target = "C", T = p.T, k = 1,
                          rtol = 1e-3 } } end }
  assert(#r == 2 and r[2].v > 0)
  assert(package.searchpath("brakelight.scan", package.path):find("inst-test", 1, true))'
cd /tmp  # away from the source tree: only the installed files are found
lua5.4 -e "
  package.cpath = '$prefix/lib/lua/5.4/?.so;' .. package.cpath
  package.path = '$prefix/share/lua/5.4/?.lua;' .. package.path
  local bl = require 'brakelight'
  local plot = require 'brakelight.plot'
  assert(bl._VERSION and plot.draw)
  assert(package.searchpath('brakelight', package.cpath):find('inst-test', 1, true))"
test -f "$prefix/share/man/man1/brakelight.1"
test -f "$prefix/include/brakelight/bl_spectrum.h" -a -f "$prefix/lib/libbrakelight.a"
test -f "$prefix/share/brakelight/lua/recipes/sharded_scan.lua"
echo "test-install: make install PREFIX=... gives a working runner and module"
