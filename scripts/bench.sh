#!/usr/bin/env bash
# bench.sh -- timing benchmark of dsigma/dk (`make bench`); never a test.
#
# 1. builds scripts/bench_dsdk.c against build/libbrakelight.a into build/
#    (same flags as the Makefile) and prints the median time per dsigma/dk
#    point for electrons on Pb, exponential screening, spin 0 and 1/2,
#    T = 1 MeV ... 1 TeV, at rtol 1e-4, against the 2 ms target; then real
#    atoms (Hartree-Fock and Thomas-Fermi screening with the atomic electrons
#    and the uniform nucleus) at 10 MeV and 10 GeV against the 3 ms target;
#    then the high-energy method's evaluations per second once cached
#    (scripts/bench_he.c, target 1e6/s) and energy_loss timings
#    (scripts/bench_integrated.lua: born at rtol 1e-3 within 50 ms, auto
#    within 5 ms);
# 2. if Debian's /usr/bin/python3 has SciPy, evaluates a few of the same
#    points with the independent SciPy integration (scripts/bench_scipy.py)
#    and prints the time ratio and the relative difference of the values.
#
# Missed targets are reported, never turned into a failing exit status.
set -uo pipefail

cd "$(dirname "$0")/.."
B=build
RTOL=${BENCH_RTOL:-1e-4}
POINTS=(1:0.1 1:0.5 10:0.5 100:0.5)   # T [MeV]:y for the SciPy comparison
PY=/usr/bin/python3

if [ ! -f "$B/libbrakelight.a" ]; then
  echo "bench: $B/libbrakelight.a is missing: run make first" >&2
  exit 1
fi

echo "== brakelight core (scripts/bench_dsdk.c)"
if ! ${CC:-cc} -std=c11 -O2 -Wall -Wextra -D_POSIX_C_SOURCE=200809L \
     -Iinclude -I/usr/include/xraylib -o "$B/bench_dsdk" scripts/bench_dsdk.c \
     "$B/libbrakelight.a" -lgsl -lgslcblas -lxrl -lm; then
  echo "bench: could not build $B/bench_dsdk" >&2
  exit 1
fi
"$B/bench_dsdk" -r "$RTOL" || echo "bench: bench_dsdk exited with status $?"
"$B/bench_dsdk" -r "$RTOL" -a || echo "bench: bench_dsdk -a exited with status $?"

echo
echo "== high-energy method (scripts/bench_he.c)"
if ${CC:-cc} -std=c11 -O2 -Wall -Wextra -D_POSIX_C_SOURCE=200809L \
     -Iinclude -I/usr/include/xraylib -o "$B/bench_he" scripts/bench_he.c \
     "$B/libbrakelight.a" -lgsl -lgslcblas -lxrl -lm -pthread; then
  "$B/bench_he" || echo "bench: bench_he exited with status $?"
else
  echo "bench: could not build $B/bench_he" >&2
fi

echo
echo "== energy_loss (scripts/bench_integrated.lua)"
"$B/brakelight" scripts/bench_integrated.lua \
  || echo "bench: bench_integrated.lua exited with status $?"

echo
echo "== independent SciPy integration (scripts/bench_scipy.py), spin 1/2, Pb"
if [ ! -x "$PY" ] || ! "$PY" -c 'import scipy' >/dev/null 2>&1; then
  echo "skipped: $PY cannot import scipy (Debian package python3-scipy;"
  echo "         bash scripts/install-deps.sh --bench installs it)"
  exit 0
fi

ours=$("$B/bench_dsdk" -r "$RTOL" -p "${POINTS[@]}") || true
theirs=$("$PY" scripts/bench_scipy.py --rtol "$RTOL" --Z 82 "${POINTS[@]}") || true
if [ -z "$ours" ] || [ -z "$theirs" ]; then
  echo "skipped: no output from one of the two programs"
  exit 0
fi

# join the two outputs line by line (same points, same order)
paste -d ' ' <(echo "$ours") <(echo "$theirs") | awk -v rtol="$RTOL" '
  BEGIN {
    printf "rtol %s; our time = median of repetitions, SciPy time = one run\n\n", rtol
    printf "%9s %5s %16s %16s %9s %10s %10s %9s\n", "T [MeV]", "y",
           "ours [mb/MeV]", "scipy [mb/MeV]", "rel.diff", "ours [ms]",
           "scipy [ms]", "ratio"
  }
  {
    # ours: T y dsdk err seconds calls status;  scipy: T y dsdk seconds
    T = $1; y = $2; v1 = $3; t1 = $5; v2 = $10; t2 = $11
    d = (v2 != 0) ? (v1 - v2) / v2 : 0
    r = (t1 > 0) ? t2 / t1 : 0
    printf "%9g %5.2f %16.9e %16.9e %9.1e %10.3f %10.1f %8.0fx\n",
           T, y, v1, v2, d, 1e3 * t1, 1e3 * t2, r
    if (d < 0) d = -d
    if (d > maxd) maxd = d
    if (r > 0) { lr += log(r); nr++ }
  }
  END {
    if (nr > 0)
      printf "\nSciPy/ours time ratio: geometric mean %.0fx; " \
             "largest relative difference %.1e (%s)\n", exp(lr / nr), maxd,
             (maxd <= 3 * rtol) ? "within 3 x rtol" : "LARGER than 3 x rtol"
  }'
exit 0
