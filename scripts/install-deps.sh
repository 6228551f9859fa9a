#!/usr/bin/env bash
# install-deps.sh -- install the Debian packages brakelight needs, if missing.
#
#   bash scripts/install-deps.sh           build and test packages
#   bash scripts/install-deps.sh --bench   also python3-scipy (for make bench)
#   bash scripts/install-deps.sh --plot    also gnuplot-nox (optional plots)
#   bash scripts/install-deps.sh --slurm   also Slurm and munge (make test-slurm)
#
# Called by `make deps`, which `make demo` and `make check` run first, so a
# fresh Debian machine needs nothing else.  Idempotent: when every package is
# present it prints nothing and runs no apt command.  Uses sudo only when not
# root.  Never reads standard input.
set -euo pipefail

# clang and its libFuzzer runtime (libclang-rt-dev): make fuzz-smoke;
# valgrind: make valgrind; cppcheck: make lint; pkgconf (Debian 12's
# pkg-config is a transitional package for it): make test-install;
# libtsan2 (gcc's ThreadSanitizer runtime, usually pulled in by gcc
# already): make test-tsan; groff-base and man-db: make test-install
# renders brakelight(3) (groff -ww, man -l) (all part of make check)
pkgs=(liblua5.4-dev lua5.4 libgsl-dev libcriterion-dev libxrl-dev clang
      libclang-rt-dev valgrind libtsan2 pkgconf cppcheck groff-base man-db)
# the other Lua hosts (make lua-hosts, test-lua-hosts): headers and stock
# interpreters of Lua 5.1, 5.2, 5.3 and LuaJIT 2.1, compat-5.3 for the
# binding (src/binding/lbl_compat.h), and luarocks (make test-rock)
# libhepmc3-dev and g++: make test-hepmc3 (HepMC3 reads our files back)
pkgs+=(libhepmc3-dev g++)
pkgs+=(liblua5.1-0-dev lua5.1 liblua5.2-dev lua5.2 liblua5.3-dev lua5.3
       libluajit-5.1-dev luajit lua-compat53-dev luarocks)

for opt in "$@"; do
  case "$opt" in
    --bench) pkgs+=(python3-scipy) ;;
    --plot)  pkgs+=(gnuplot-nox) ;;
    # a single-node cluster for scripts/check-slurm.sh: the controller, the
    # node daemon, sbatch/squeue/scancel, and munge for their authentication
    --slurm) pkgs+=(slurmctld slurmd slurm-client munge) ;;
    -h|--help) sed -n '2,12p' "$0" | sed 's/^# \{0,1\}//'; exit 0 ;;
    *) echo "install-deps: unknown option '$opt' (allowed: --bench, --plot, --slurm, --help)" >&2
       exit 2 ;;
  esac
done

# the tools that run the build itself: absent from minimal Debian images
command -v make >/dev/null 2>&1 || pkgs+=(make)
command -v cc >/dev/null 2>&1 || pkgs+=(gcc libc6-dev)

# installed: dpkg knows the package and its state is "installed"
installed() {
  [ "$(dpkg-query -W -f='${db:Status-Status}' "$1" 2>/dev/null)" = installed ]
}

missing=()
for p in "${pkgs[@]}"; do
  installed "$p" || missing+=("$p")
done
[ ${#missing[@]} -eq 0 ] && exit 0

if ! command -v apt-get >/dev/null 2>&1; then
  echo "install-deps: apt-get not found; install these by hand: ${missing[*]}" >&2
  exit 1
fi

sudo=()
if [ "$(id -u)" -ne 0 ]; then
  if command -v sudo >/dev/null 2>&1; then
    sudo=(sudo)
  else
    echo "install-deps: not root and no sudo; install these by hand: ${missing[*]}" >&2
    exit 1
  fi
fi

echo "install-deps: installing ${missing[*]}"
export DEBIAN_FRONTEND=noninteractive
"${sudo[@]}" env DEBIAN_FRONTEND=noninteractive apt-get update -qq </dev/null
"${sudo[@]}" env DEBIAN_FRONTEND=noninteractive \
  apt-get install -y -qq --no-install-recommends "${missing[@]}" </dev/null
echo "install-deps: done"
