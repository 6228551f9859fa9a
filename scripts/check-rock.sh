#!/usr/bin/env bash
# check-rock.sh -- `make test-rock`: `luarocks make` of the rockspec with
# Debian's luarocks into a scratch tree, offline (no rocks server is
# reachable: --only-server names an empty local directory), then load the
# installed module and a helper with the Lua that luarocks targets, from
# the installed files only, and compute one number, which must be the
# runner's; then remove the tree.
#   LUAROCKS="luarocks --lua-version 5.4" bash scripts/check-rock.sh
# checks another Lua that luarocks is set up for.
set -euo pipefail
cd "$(dirname "$0")/.."
test -x build/brakelight || { echo "test-rock: build/brakelight missing: run make" >&2; exit 1; }
# the rockspec is made by `make` from scripts/brakelight.rockspec.in with
# the version of include/brakelight/bl_version.h
version=$(sed -n 's/^#define BL_VERSION "\(.*\)".*/\1/p' include/brakelight/bl_version.h)
rockspec="build/brakelight-$version-1.rockspec"
test -f "$rockspec" || { echo "test-rock: $rockspec missing: run make" >&2; exit 1; }
read -r -a luarocks <<<"${LUAROCKS:-luarocks}"
tmp=$(mktemp -d)
trap 'rm -rf "$tmp"' EXIT
tree="$tmp/tree"
mkdir -p "$tmp/no-server"
if ! "${luarocks[@]}" make --tree "$tree" --only-server="$tmp/no-server" \
     "$rockspec" >"$tmp/log" 2>&1 </dev/null; then
  sed 's/^/  | /' "$tmp/log"
  echo "test-rock: luarocks make failed" >&2
  exit 1
fi
ver=$("${luarocks[@]}" config lua_version)
lua=$("${luarocks[@]}" config variables.LUA)
so="$tree/lib/lua/$ver/brakelight.so"
test -f "$so" || { echo "test-rock: $so missing" >&2; exit 1; }
if ldd "$so" | grep -q 'liblua'; then
  echo "test-rock: $so links liblua (a Lua C module must not)" >&2
  exit 1
fi
cd /tmp  # away from the source tree: only the installed files are found
"$lua" -e "
  package.cpath = '$tree/lib/lua/$ver/?.so'
  package.path = '$tree/share/lua/$ver/?.lua'
  local bl = require 'brakelight'
  assert(type(bl.dsdk) == 'function', 'not the C module')
  assert(type(bl.scan.run) == 'function' and bl.json.decode('[2]')[1] == 2)
  local v = bl.dsdk{ particle = 'electron', target = 'Pb', T = 10, k = 5, rtol = 1e-6 }
  assert(v > 0 and v < math.huge)
  print(string.format('%.17g', v))" >"$tmp/out" 2>&1 || {
  sed 's/^/  | /' "$tmp/out"; echo "test-rock: the installed module fails in $lua" >&2; exit 1; }
test -x "$tree/bin/brakelight"
# the same number as the runner (Lua 5.4) gives
here=$(cat "$tmp/out")
cd - >/dev/null
runner=$(build/brakelight -e "
  local bl = require 'brakelight'
  print(string.format('%.17g', bl.dsdk{ particle = 'electron', target = 'Pb', T = 10, k = 5, rtol = 1e-6 }))")
if [ "$here" != "$runner" ]; then
  echo "test-rock: $lua gives $here, the runner $runner" >&2
  exit 1
fi
echo "test-rock: luarocks make (Lua $ver) installs a module that $lua loads"
