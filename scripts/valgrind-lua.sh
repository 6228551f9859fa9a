#!/usr/bin/env bash
# valgrind-lua.sh -- the Lua-level tests under valgrind memcheck (make valgrind)
#
# Runs every tests/lua/*.lua with build/brakelight under memcheck through
# scripts/run-lua-tests.sh.  A test fails on any memory error (invalid
# read/write, use of uninitialised values, bad free) and on any leak that
# is "definitely" or "indirectly" lost; memory still reachable at exit
# (Lua states of scripts that end with os.exit, xraylib's and GSL's
# process-lifetime tables) is not a leak.  No suppression file is needed
# with Debian 12's Lua 5.4, GSL 2.7 and xraylib 4.0: if one becomes
# necessary, add it as scripts/valgrind.supp with a comment per entry saying
# whose memory it is.  Runner processes started by a test through the shell
# (scans with -j, shards) are not traced; the same code runs traced in the
# parent.  The files whose time goes to the physics (distorted waves of
# the default, long integrals, the sampler's histograms, the README's and
# the recipes' examples, the partial waves of test_partial.lua) are left
# out here (BL_TEST_SKIP): under memcheck
# they took minutes each, their C code runs under AddressSanitizer in the
# C suites and all of them under make test-lua-asan.  So is test_hosts.lua
# (a scan here and in the runner, compared byte for byte: the same binding
# calls as test_scan_outputs.lua, 90 s under memcheck).  BL_TEST_LIGHT=1
# tells the files that honour it to take the cheapest method where the
# method does not matter (test_bindsafety.lua: 160 s -> 11 s).  Without
# --track-origins (a third of the time): memcheck finds the same errors,
# only the report of an uninitialised value does not say where it came
# from; VALGRIND_ORIGINS=1 adds it back to hunt one down.  About 4 min of
# one core (make check runs it beside the other tests).
set -euo pipefail
cd "$(dirname "$0")/.."
command -v valgrind >/dev/null 2>&1 || {
  echo "valgrind-lua: valgrind not found (make deps installs it)" >&2
  exit 1
}
supp=()
[ -f scripts/valgrind.supp ] && supp=(--suppressions=scripts/valgrind.supp)
origins=
[ -n "${VALGRIND_ORIGINS:-}" ] && origins=--track-origins=yes
BL_TEST_LIGHT=1 \
BL_TEST_SKIP="test_integrated.lua test_physics.lua test_readme.lua \
test_recipes.lua test_sampler.lua test_demo.lua test_c_api.lua \
test_hosts.lua test_partial.lua" \
BL_TEST_WRAP="valgrind -q --error-exitcode=99 --leak-check=full \
--show-leak-kinds=definite,indirect --errors-for-leak-kinds=definite,indirect \
$origins ${supp[*]}" exec bash scripts/run-lua-tests.sh
