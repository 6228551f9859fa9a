#!/bin/sh
# bench_erow.sh -- scripts/bench_erow.lua with a BASE runner and this
# tree's, case by case alternating, in one run (never in parallel: the two
# would share the cores).  Never a test.
# usage: scripts/bench_erow.sh [BASE_RUNNER]
#   BASE_RUNNER: a brakelight runner built from the base commit (default:
#   build/base/<43edcdf>/build/brakelight, built there as `make
#   compare-points` does when missing)
# See Copyright Notice in LICENSE
set -e
cd "$(dirname "$0")/.."
base=$1
if [ -z "$base" ]; then
  rev=$(git rev-parse --verify -q '43edcdf^{commit}')
  wt=build/base/$rev
  if [ ! -x "$wt/build/brakelight" ]; then
    mkdir -p build/base
    [ -e "$wt/.git" ] || { git worktree prune; \
                           git worktree add -q --detach -f "$wt" "$rev"; }
    make --no-print-directory -C "$wt" B=build SAN_FLAGS= -j2 all \
      >build/base/bench_erow-build.log 2>&1
  fi
  base=$wt/build/brakelight
fi
for i in 1 2 3; do
  "$base" scripts/bench_erow.lua base $i
  ./build/brakelight scripts/bench_erow.lua here $i
done
