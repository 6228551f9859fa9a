#!/usr/bin/env bash
# check-install.sh -- `make test-install`: brakelight built and installed
# like a C library.
#
#  1. the shared library of the build tree: soname, symlinks, its own
#     dependencies (ldd), exported symbols (nm -D); the rockspec's version;
#  2. make install PREFIX=<scratch>: the files, the pkg-config file, a small
#     scan with the installed runner, the installed module and helpers in
#     the stock lua5.4, the man page's version;
#  3. tests/install/dsdk.c, an outside program, built with pkg-config
#     against the installed shared library and, with --static, against the
#     archive: both print the dsigma/dk of the build tree's runner;
#  4. make uninstall leaves the prefix as it was (a foreign file in a shared
#     directory stays, nothing of ours does);
#  5. make install DESTDIR=<stage> PREFIX=/opt/...: the same files under the
#     stage, the real prefix in brakelight.pc, no ldconfig; make uninstall
#     empties the stage.
# Everything happens under build/inst-test, removed at the end.  Prints one
# line per part; a failure names what differs and exits non-zero.
set -euo pipefail
cd "$(dirname "$0")/.."
root="$PWD"
scratch="$root/build/inst-test"
prefix="$scratch/prefix"
stage="$scratch/stage"
rm -rf "$scratch"
trap 'rm -rf "$scratch"' EXIT
mkdir -p "$scratch"

fail() { echo "test-install: $*" >&2; exit 1; }

vh=include/brakelight/bl_version.h
version=$(sed -n 's/^#define BL_VERSION "\(.*\)".*/\1/p' "$vh")
major=$(sed -n 's/^#define BL_VERSION_MAJOR \([0-9]*\).*/\1/p' "$vh")
[ -n "$version" ] && [ -n "$major" ] || fail "no version in $vh"
real="libbrakelight.so.$version"
soname="libbrakelight.so.$major"

# ---- 1. the shared library of the build tree
so="build/$real"
[ -f "$so" ] || fail "$so is missing"
[ "$(readlink "build/$soname")" = "$real" ] \
  || fail "build/$soname does not point to $real"
[ "$(readlink build/libbrakelight.so)" = "$soname" ] \
  || fail "build/libbrakelight.so does not point to $soname"
dyn=$(readelf -d "$so")
grep -qF "Library soname: [$soname]" <<<"$dyn" \
  || fail "$so: soname is not $soname: $(grep -i soname <<<"$dyn")"
# (grep reads from a variable: grep -q on a pipe would stop the writer and
# pipefail turn that into a failure)
deps=$(ldd "$so")
for dep in libgsl.so libgslcblas.so libxrl.so libm.so; do
  grep -qF "$dep" <<<"$deps" || fail "$so: ldd does not show $dep"
done
! grep -q 'not found' <<<"$deps" || fail "$so: ldd: a dependency is not found"
nm -D --defined-only "$so" | awk '{ print $NF }' | sort >"$scratch/dynsym"
nm -g --defined-only build/libbrakelight.a | awk 'NF == 3 { print $3 }' \
  | sort >"$scratch/globals"
bad=$(grep -v '^bl_' "$scratch/dynsym" || true)
[ -z "$bad" ] || fail "$so exports names outside bl_*: $(echo $bad)"
cmp -s "$scratch/dynsym" "$scratch/globals" \
  || fail "$so exports other symbols than the archive's globals:
$(diff "$scratch/globals" "$scratch/dynsym")"
# every function and object declared in the public headers is exported
{ grep -ho '\bbl_[A-Za-z0-9_]* *(' include/brakelight/bl_*.h | tr -d ' ('
  sed -n 's/^extern .*\b\(bl_[A-Za-z0-9_]*\)\(\[\]\)\{0,1\};.*/\1/p' \
    include/brakelight/bl_*.h; } | sort -u >"$scratch/api"
missing=$(comm -23 "$scratch/api" "$scratch/dynsym")
[ -z "$missing" ] || fail "$so does not export: $(echo $missing)"
internal=$(comm -13 "$scratch/api" "$scratch/dynsym" | wc -l)
echo "test-install: $so: soname $soname, needs gsl, xraylib, libm;" \
  "$(wc -l <"$scratch/dynsym") symbols, all bl_* ($internal not in the public" \
  "headers)"

# the rockspec made from scripts/brakelight.rockspec.in: its name and its
# version field carry bl_version.h's version
rock="build/brakelight-$version-1.rockspec"
[ -f "$rock" ] || fail "$rock is missing"
lua5.4 -e "
  local t = {}
  assert(loadfile('$rock', 't', t))()
  assert(t.package == 'brakelight' and t.version == '$version-1',
         '$rock: version ' .. tostring(t.version))
  assert(t.build.install_target == 'rock-install-host')" \
  || fail "$rock is not the rockspec of version $version"

# ---- 2. make install PREFIX=...
mkdir -p "$prefix/share/man/man1"
echo "not ours" >"$prefix/share/man/man1/other.1"
make --no-print-directory install PREFIX="$prefix" \
  LDCONFIG="touch $scratch/ldconfig-ran" >/dev/null
[ -f "$scratch/ldconfig-ran" ] || fail "install without DESTDIR: no ldconfig"
for f in bin/brakelight lib/libbrakelight.a "lib/$real" \
         lib/pkgconfig/brakelight.pc lib/lua/5.4/brakelight.so \
         include/brakelight.h include/brakelight/bl_version.h \
         include/brakelight/bl_spectrum.h include/brakelight/lbrakelight.h \
         share/lua/5.4/brakelight/scan.lua \
         share/brakelight/lua/recipes/sharded_scan.lua \
         share/man/man1/brakelight.1; do
  [ -f "$prefix/$f" ] || fail "make install: PREFIX/$f is missing"
done
[ "$(readlink "$prefix/lib/$soname")" = "$real" ] \
  && [ "$(readlink "$prefix/lib/libbrakelight.so")" = "$soname" ] \
  || fail "make install: the symlinks of $real are wrong"
for h in include/brakelight/*.h; do
  cmp -s "$h" "$prefix/$h" || fail "make install: $h differs or is missing"
done
grep -qF "\"brakelight $version\"" "$prefix/share/man/man1/brakelight.1" \
  || fail "installed man page: no \"brakelight $version\" in its .TH line"
! grep -q '@[A-Z]*@' "$prefix/share/man/man1/brakelight.1" \
  "$prefix/lib/pkgconfig/brakelight.pc" || fail "a @...@ marker was left"
(cd "$prefix" && find . ! -type d | sort) | grep -vxF ./share/man/man1/other.1 \
  >"$scratch/files-prefix"

"$prefix/bin/brakelight" -q -e '
  local bl = require "brakelight"
  local r = bl.scan.run{ axes = { { "T", { 10, 20 } } }, each = function(p)
    return { v = bl.dsdk{ particle = "muon", target = "C", T = p.T, k = 1,
                          rtol = 1e-3 } } end }
  assert(#r == 2 and r[2].v > 0)
  assert(package.searchpath("brakelight.scan", package.path):find("inst-test", 1, true))'
(cd /tmp  # away from the source tree: only the installed files are found
 lua5.4 -e "
  package.cpath = '$prefix/lib/lua/5.4/?.so;' .. package.cpath
  package.path = '$prefix/share/lua/5.4/?.lua;' .. package.path
  local bl = require 'brakelight'
  local plot = require 'brakelight.plot'
  assert(bl._VERSION == '$version' and plot.draw)
  assert(package.searchpath('brakelight', package.cpath):find('inst-test', 1, true))")
echo "test-install: make install PREFIX=... gives a working runner and module"

# ---- 3. an outside C program, built with pkg-config
export PKG_CONFIG_PATH="$prefix/lib/pkgconfig"
[ "$(pkg-config --modversion brakelight)" = "$version" ] \
  || fail "pkg-config --modversion brakelight: $(pkg-config --modversion brakelight)"
[ "$(pkg-config --variable=prefix brakelight)" = "$prefix" ] \
  || fail "brakelight.pc: prefix is $(pkg-config --variable=prefix brakelight)"
cflags="-std=c11 -O2 -Wall -Wextra -Wpedantic -Werror"
prog=tests/install/dsdk.c
# shellcheck disable=SC2046  # pkg-config output is a list of words
cc $cflags $(pkg-config --cflags brakelight) -o "$scratch/dsdk-shared" \
  "$prog" $(pkg-config --libs brakelight)
libs=$(pkg-config --libs --static brakelight)
case " $libs " in *" -lbrakelight "*) ;; *) fail "--static --libs: $libs" ;; esac
# both libraries are installed: name the archive, or ld takes the .so
# shellcheck disable=SC2086
cc $cflags $(pkg-config --cflags --static brakelight) -o "$scratch/dsdk-static" \
  "$prog" ${libs/-lbrakelight/-l:libbrakelight.a}
deps=$(LD_LIBRARY_PATH="$prefix/lib" ldd "$scratch/dsdk-shared")
grep -qF "$soname => $prefix/lib/$soname" <<<"$deps" \
  || fail "dsdk-shared does not load $prefix/lib/$soname"
deps=$(ldd "$scratch/dsdk-static")
! grep -q libbrakelight <<<"$deps" || fail "dsdk-static needs a shared libbrakelight"
shared=$(LD_LIBRARY_PATH="$prefix/lib" "$scratch/dsdk-shared")
static=$("$scratch/dsdk-static")
tree=$(build/brakelight -q -e '
  local bl = require "brakelight"
  local v, e = bl.dsdk{ particle = "muon", target = "C", T = 10, k = 1,
                        method = "born" }
  print(string.format("%.17g %.17g", v, e))')
[ "$shared" = "$tree" ] && [ "$static" = "$tree" ] \
  || fail "dsigma/dk (value, error) differs: shared '$shared', static" \
          "'$static', build tree '$tree'"
echo "test-install: an outside program (pkg-config, shared and --static)" \
  "prints the build tree's dsigma/dk: $tree mb/MeV"

# ---- 4. make uninstall
make --no-print-directory uninstall PREFIX="$prefix" >/dev/null
left=$(cd "$prefix" && find . -mindepth 1 | sort | tr '\n' ' ')
[ "$left" = "./share ./share/man ./share/man/man1 ./share/man/man1/other.1 " ] \
  || fail "make uninstall left (or removed) in PREFIX: $left"
echo "test-install: make uninstall leaves only what was there before"

# ---- 5. DESTDIR
dprefix=/opt/brakelight-inst-test
mkdir -p "$stage$dprefix"
rm -f "$scratch/ldconfig-ran"
make --no-print-directory install DESTDIR="$stage" PREFIX="$dprefix" \
  LDCONFIG="touch $scratch/ldconfig-ran" >/dev/null
[ ! -e "$scratch/ldconfig-ran" ] || fail "install with DESTDIR ran ldconfig"
outside=$(cd "$stage" && find . ! -type d ! -path ".$dprefix/*")
[ -z "$outside" ] || fail "DESTDIR install wrote outside DESTDIR/PREFIX: $outside"
(cd "$stage$dprefix" && find . ! -type d | sort) >"$scratch/files-stage"
cmp -s "$scratch/files-prefix" "$scratch/files-stage" \
  || fail "DESTDIR install differs from the PREFIX one:
$(diff "$scratch/files-prefix" "$scratch/files-stage")"
grep -qx "prefix=$dprefix" "$stage$dprefix/lib/pkgconfig/brakelight.pc" \
  || fail "DESTDIR install: brakelight.pc does not say prefix=$dprefix"
! grep -qF "$stage" "$stage$dprefix/lib/pkgconfig/brakelight.pc" \
  || fail "DESTDIR install: brakelight.pc names DESTDIR"
make --no-print-directory uninstall DESTDIR="$stage" PREFIX="$dprefix" >/dev/null
left=$(cd "$stage" && find . -mindepth 1 | sort | tr '\n' ' ')
[ "$left" = "./opt .$dprefix " ] || fail "make uninstall DESTDIR=... left: $left"
echo "test-install: DESTDIR install: $(wc -l <"$scratch/files-stage") files" \
  "under DESTDIR/PREFIX, brakelight.pc with the real prefix, uninstall" \
  "removes them all"
