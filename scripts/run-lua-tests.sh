#!/usr/bin/env bash
# run-lua-tests.sh -- run the Lua-level tests (called by `make test-lua`).
#
# Runs every tests/lua/*.lua with the runner build/brakelight, from the top
# of the source tree; a test passes when it exits with status 0.  Then checks
# that the module build/brakelight.so loads in the stock lua5.4 interpreter,
# and the runner's own behaviour (version line, error report and exit
# status, bad options, the 'arg' table against lua5.4, BRAKELIGHT_LUA_PATH).
# One line per check; the last line reads "N passed, M failed"; the exit
# status is non-zero when any check failed.  A failing check's output is
# shown, indented, under its line.
#
# With the environment variable BL_TEST_WRAP set (a command prefix, e.g.
# "valgrind --error-exitcode=99 ..."), each tests/lua/*.lua file runs under
# it and the other checks are skipped (scripts/valgrind-lua.sh uses this).
# BL_TEST_SKIP (file names, blank-separated) leaves those files out, with a
# "skip" line.
#
#   run-lua-tests.sh --lua INTERP --cpath DIR     (make test-lua-hosts)
# runs every tests/lua/*.lua with the stock interpreter INTERP (lua5.1,
# lua5.2, lua5.3, lua5.4, luajit) instead of the runner, with DIR/?.so
# (e.g. build/lua5.1) first on package.cpath and lua/?.lua first on
# package.path, then checks that require "brakelight" there gives the
# module and its helper fields; the runner's own checks are skipped (tests
# that start the runner as a program still need build/brakelight).
#
#   run-lua-tests.sh --build DIR                  (make test-lua-asan)
# takes the runner, the module and target_values from DIR (default build,
# or the environment variable BL_BUILD_DIR) instead of build/: DIR is
# exported as BL_BUILD_DIR, which the tests that start build/brakelight,
# build/target_values or load build/brakelight.so read, and, when DIR is
# not build, BRAKELIGHT_LUA_PATH (if unset) names lua/, since a runner in
# DIR does not find lua/ next to its directory.  A module in DIR linked
# with AddressSanitizer is loaded by the stock lua5.4 with libasan
# preloaded (a wrapper lua5.4 first on PATH, for this script's check and
# for test_stock_lua.lua alone, not for every command).
set -uo pipefail

cd "$(dirname "$0")/.."
build=${BL_BUILD_DIR:-build}
interp=
cpath=
while [ $# -gt 0 ]; do
  case "$1" in
    --lua) interp=${2:?--lua needs an interpreter}; shift 2 ;;
    --cpath) cpath=${2:?--cpath needs a directory}; shift 2 ;;
    --build) build=${2:?--build needs a directory}; shift 2 ;;
    *) echo "run-lua-tests: unknown option '$1' (allowed: --lua INTERP, --cpath DIR, --build DIR)" >&2
       exit 2 ;;
  esac
done
build=${build%/}
runner=$build/brakelight
export BL_BUILD_DIR=$build
if [ "$build" != build ] && [ -z "${BRAKELIGHT_LUA_PATH:-}" ]; then
  export BRAKELIGHT_LUA_PATH=$PWD/lua
fi
if [ -n "$interp" ] && [ -z "$cpath" ]; then
  echo "run-lua-tests: --lua needs --cpath DIR (the directory of that host's brakelight.so)" >&2
  exit 2
fi
passed=0
failed=0
log=$(mktemp)
tmp=$(mktemp -d)
trap 'rm -rf "$log" "$tmp"' EXIT

# a module built with AddressSanitizer needs its runtime loaded first in a
# stock (uninstrumented) interpreter: lua5.4 on PATH becomes a wrapper that
# preloads it (only lua5.4: preloading it into every shell command would
# report their leaks)
asanlib=
if [ -f "$build/brakelight.so" ]; then
  asanlib=$(ldd "$build/brakelight.so" | awk '$1 ~ /^libasan/ { print $3 }')
fi
if [ -n "$asanlib" ] && command -v lua5.4 >/dev/null 2>&1; then
  mkdir -p "$tmp/bin"
  printf '#!/bin/bash\nLD_PRELOAD=%s${LD_PRELOAD:+:$LD_PRELOAD} exec -a lua5.4 %s "$@"\n' \
    "$asanlib" "$(command -v lua5.4)" >"$tmp/bin/lua5.4"
  chmod +x "$tmp/bin/lua5.4"
  PATH=$tmp/bin:$PATH
fi

# record CHECK-NAME STATUS SECONDS: print the line, count it, show the log on failure
record() {
  if [ "$2" -eq 0 ]; then
    printf 'ok    %-40s %6.2fs\n' "$1" "$3"
    passed=$((passed + 1))
  else
    printf 'FAIL  %-40s %6.2fs  (exit status %d)\n' "$1" "$3" "$2"
    sed 's/^/      | /' "$log"
    failed=$((failed + 1))
  fi
}

# now: seconds since the epoch, with fractions
now() { date +%s.%N; }
elapsed() { awk -v a="$1" -v b="$(now)" 'BEGIN { printf "%.2f", b - a }'; }

if [ ! -x "$runner" ]; then
  echo "run-lua-tests: $runner is missing: run make first" >&2
  exit 1
fi

shopt -s nullglob
read -r -a wrap <<<"${BL_TEST_WRAP:-}"
# the command that runs one test file: the runner, or INTERP with the paths
if [ -n "$interp" ]; then
  if ! command -v "$interp" >/dev/null 2>&1; then
    echo "run-lua-tests: $interp not found (make deps installs it)" >&2
    exit 1
  fi
  if [ ! -f "$cpath/brakelight.so" ]; then
    echo "run-lua-tests: $cpath/brakelight.so is missing: run make lua-hosts first" >&2
    exit 1
  fi
  paths="package.path = '$PWD/lua/?.lua;' .. package.path; package.cpath = '$PWD/$cpath/?.so;' .. package.cpath"
  run=("$interp" -e "$paths")
  tag="$interp: "
else
  run=("$runner")
  tag=
fi
for t in tests/lua/*.lua; do
  case " ${BL_TEST_SKIP:-} " in
    *" $(basename "$t") "*) printf 'skip  %-40s (BL_TEST_SKIP)\n' "$tag$t"; continue ;;
  esac
  start=$(now)
  "${wrap[@]}" "${run[@]}" "$t" >"$log" 2>&1 </dev/null
  st=$?
  record "$tag$t" "$st" "$(elapsed "$start")"
done
if [ ${#wrap[@]} -gt 0 ]; then
  echo "$passed passed, $failed failed"
  [ "$failed" -eq 0 ]
  exit
fi

# a host: the module and its lazily loaded helpers, nothing loaded before
if [ -n "$interp" ]; then
  start=$(now)
  "${run[@]}" -e '
    local bl = require "brakelight"
    assert(type(bl.dsdk) == "function", "not the C module")
    assert(package.loaded["brakelight.scan"] == nil, "scan loaded too early")
    for _, k in ipairs{ "scan", "plot", "merge", "json" } do
      assert(bl[k] == require("brakelight." .. k), "brakelight." .. k)
      assert(rawget(bl, k) == bl[k], "brakelight." .. k .. " not kept")
    end
    assert(bl.nosuchfield == nil)' >"$log" 2>&1 </dev/null
  record "$interp: require \"brakelight\", helper fields" "$?" "$(elapsed "$start")"
  # every recipe but the demo (it prints its timing) in small mode: the
  # same printout and files as through the runner (the output directory,
  # and the files' tool, script and computation lines, which name the Lua
  # and the path and hash its bytecode, aside)
  # BL_RECIPES_RUNNER_DIR (make test-lua-hosts): a directory that keeps
  # the runner's printouts and files between the hosts, so that the runner
  # runs each recipe once for all of them (the caller empties it first)
  rdir=${BL_RECIPES_RUNNER_DIR:-$tmp/runner}
  recipes_same() {
    local r name st=0
    for r in lua/recipes/*.lua; do
      name=$(basename "$r" .lua)
      [ "$name" = demo ] && continue
      BRAKELIGHT_SMALL=1 "${run[@]}" "$r" "$tmp/host/$name" >"$tmp/host-$name.out" \
        2>/dev/null </dev/null || { echo "$name failed in $interp"; st=1; continue; }
      if [ ! -f "$rdir/$name.done" ]; then
        mkdir -p "$rdir"
        rm -rf "$rdir/$name" "$rdir/$name.out"
        BRAKELIGHT_SMALL=1 "$runner" -q "$r" "$rdir/$name" >"$rdir/$name.out" \
          2>/dev/null </dev/null || { echo "$name failed in the runner"; st=1; continue; }
        : >"$rdir/$name.done"
      fi
      diff <(sed "s#$tmp/host/#OUT/#g" "$tmp/host-$name.out") \
           <(sed "s#$rdir/#OUT/#g" "$rdir/$name.out") || st=1
      diff -r -I '^# tool: \|^# script: \|^# computation: \|"tool": \|"script": \|"computation": ' \
        "$tmp/host/$name" "$rdir/$name" || st=1
    done
    return $st
  }
  start=$(now)
  recipes_same >"$log" 2>&1
  record "$interp: recipes as through the runner" "$?" "$(elapsed "$start")"
  # a Lua C module takes the API from the interpreter that loads it
  start=$(now)
  { ldd "$cpath/brakelight.so"; ! ldd "$cpath/brakelight.so" | grep -q 'lua'; } \
    >"$log" 2>&1 </dev/null
  record "$interp: $cpath/brakelight.so links no liblua" "$?" "$(elapsed "$start")"
  echo "$passed passed, $failed failed"
  [ "$failed" -eq 0 ]
  exit
fi

# the module must load in the stock interpreter, outside the runner
start=$(now)
if command -v lua5.4 >/dev/null 2>&1; then
  lua5.4 -e 'package.cpath="'"$build"'/?.so;"..package.cpath; local b=require"brakelight"; assert(type(b.dsdk)=="function")' \
    >"$log" 2>&1 </dev/null
  st=$?
else
  echo "lua5.4 not found (install the Debian package lua5.4)" >"$log"
  st=127
fi
record "stock lua5.4: require \"brakelight\"" "$st" "$(elapsed "$start")"

# runner: run CHECK-NAME COMMAND...: the command's output goes to the log
check() {
  local name=$1 st
  shift
  start=$(now)
  ( "$@" ) >"$log" 2>&1 </dev/null
  st=$?
  record "$name" "$st" "$(elapsed "$start")"
}

version_line() {
  local v
  v=$(sed -n 's/^#define BL_VERSION "\(.*\)".*/\1/p' include/brakelight/bl_version.h)
  out=$("$runner" --version) || return 1
  echo "got: $out"
  [ "$out" = "brakelight $v (Lua 5.4)" ]
}

error_report() {
  printf 'local function f() error("planned failure") end\nf()\n' >"$tmp/err.lua"
  "$runner" "$tmp/err.lua" 2>"$tmp/stderr"
  st=$?
  cat "$tmp/stderr"
  [ "$st" -eq 1 ] && grep -q '^brakelight: .*planned failure' "$tmp/stderr" \
    && grep -q 'stack traceback' "$tmp/stderr"
}

bad_option() {
  "$runner" --no-such-option 2>"$tmp/stderr"
  st=$?
  cat "$tmp/stderr"
  # one line, pointing to --help (not the whole usage)
  [ "$st" -eq 1 ] && [ "$(wc -l <"$tmp/stderr")" -eq 1 ] \
    && grep -q "^brakelight: unrecognized option '--no-such-option' (try 'brakelight --help')$" "$tmp/stderr"
}

# the same command line through lua5.4 and the runner gives the same 'arg'
# (apart from the interpreter's own name)
arg_table() {
  printf 'for i = -3, #arg do io.write(i, "=", tostring(arg[i]), " ") end\nprint("|", ...)\n' \
    >"$tmp/args.lua"
  a=$(lua5.4 -e 'x = 1' "$tmp/args.lua" one two 2>&1 | sed 's/=lua5.4 /=INTERP /')
  b=$("$runner" -e 'x = 1' "$tmp/args.lua" one two 2>&1 | sed "s#=$runner #=INTERP #")
  echo "lua5.4: $a"
  echo "runner: $b"
  [ -n "$a" ] && [ "$a" = "$b" ]
}

lua_path_env() {
  mkdir -p "$tmp/luadir"
  echo 'return {answer = 42}' >"$tmp/luadir/bl_runner_probe.lua"
  BRAKELIGHT_LUA_PATH="$tmp/luadir" \
    "$runner" -e 'assert(require("bl_runner_probe").answer == 42)'
}

check "runner: --version" version_line
check "runner: error report, exit status 1" error_report
check "runner: unknown option" bad_option
check "runner: 'arg' as lua5.4 sets it" arg_table
check "runner: BRAKELIGHT_LUA_PATH" lua_path_env

echo "$passed passed, $failed failed"
[ "$failed" -eq 0 ]
