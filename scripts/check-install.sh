#!/usr/bin/env bash
# check-install.sh -- `make test-install`: brakelight built and installed
# like a C library.
#
#  1. the shared library of the build tree: soname, symlinks, its own
#     dependencies (ldd), exported symbols (nm -D); the rockspec's version;
#  2. make install PREFIX=<scratch>: the files, the pkg-config file, a small
#     scan with the installed runner, the installed module and helpers in
#     the stock lua5.4, the man pages' version; brakelight(3): every
#     function of the public headers has its entry (named in SYNOPSIS and
#     as an item of the description), every object, type and constant is
#     named, groff and man render it without a warning, and its example
#     (between the markers example-begin and example-end) is
#     tests/capi/man_example.c;
#  3. tests/install/dsdk.c, an outside program, built with pkg-config
#     against the installed shared library and, with --static, against the
#     archive: both print the dsigma/dk of the build tree's runner; the
#     example of brakelight(3), extracted from the installed page, built
#     with pkg-config: its numbers are the Lua module's, and its output is
#     the one the page shows;
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
         share/man/man1/brakelight.1 share/man/man3/brakelight.3; do
  [ -f "$prefix/$f" ] || fail "make install: PREFIX/$f is missing"
done
[ "$(readlink "$prefix/lib/$soname")" = "$real" ] \
  && [ "$(readlink "$prefix/lib/libbrakelight.so")" = "$soname" ] \
  || fail "make install: the symlinks of $real are wrong"
for h in include/brakelight/*.h; do
  cmp -s "$h" "$prefix/$h" || fail "make install: $h differs or is missing"
done
for man in man1/brakelight.1 man3/brakelight.3; do
  grep -qF "\"brakelight $version\"" "$prefix/share/man/$man" \
    || fail "installed man page $man: no \"brakelight $version\" in its .TH line"
done
! grep -q '@[A-Z]*@' "$prefix/share/man/man1/brakelight.1" \
  "$prefix/share/man/man3/brakelight.3" \
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

# ---- 2b. brakelight(3), the man page of the C API
man3="$prefix/share/man/man3/brakelight.3"
bash scripts/check-man3.sh "$man3" || fail "$man3: see above"
# renders without a warning: groff with every warning, man-db at 80 columns
out=$(groff -man -ww -z "$man3" 2>&1) && [ -z "$out" ] \
  || fail "groff -man -ww -z $man3: $out"
out=$(MANWIDTH=80 man -l "$man3" 2>&1 >/dev/null) && [ -z "$out" ] \
  || fail "MANWIDTH=80 man -l $man3: $out"
# its example is tests/capi/man_example.c, text for text: the lines between
# the markers with the troff escapes \e (backslash), \- (minus), \(aq
# (quote) and \& (nothing) decoded; any other escape is an error
manex() {   # manex BEGIN END: the decoded lines between two markers
  awk -v b="$1" -v e="$2" '
    $0 == ".\\\" " e { on = 0 } on { print }
    $0 == ".\\\" " b { on = 1; n++ }
    END { if (n != 1) exit 1 }' "$man3" \
  | perl -pe 's/\\(\(aq|.)/$1 eq "e" ? "\\" : $1 eq "-" ? "-" : $1 eq "&" ? ""
               : $1 eq "(aq" ? "\x27" : die "unknown troff escape \\$1\n"/ge'
}
manex example-begin example-end >"$scratch/man_example.c" \
  || fail "$man3: no single example-begin ... example-end block"
diff -u tests/capi/man_example.c "$scratch/man_example.c" >"$scratch/ex.diff" \
  || fail "the example of brakelight(3) differs from tests/capi/man_example.c:
$(cat "$scratch/ex.diff")"
manex output-begin output-end >"$scratch/man_example.expected" \
  || fail "$man3: no single output-begin ... output-end block"
echo "test-install: brakelight(3): $(bash scripts/check-man3.sh --count "$man3")" \
  "documented, renders without warnings, its example is" \
  "tests/capi/man_example.c"

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

# the example of brakelight(3) as extracted from the installed page: built
# with pkg-config against the installed library, its numbers (17 digits)
# are those of the Lua module for the same calls, and its output is the
# page's (numbers within 1e-9 relative: another libm may move last digits)
# shellcheck disable=SC2046
cc $cflags $(pkg-config --cflags brakelight) -o "$scratch/man_example" \
  "$scratch/man_example.c" $(pkg-config --libs brakelight)
LD_LIBRARY_PATH="$prefix/lib" "$scratch/man_example" >"$scratch/man_example.out" \
  || fail "the example of brakelight(3) failed: $(cat "$scratch/man_example.out")"
got=$(awk '$1 == "dsdk" { print $1, $2, $4 }
           $1 == "photons" { print $1, $4, $6 }
           $1 == "energy_loss" || $1 == "dedx" { print $1, $2 }' \
      "$scratch/man_example.out")
want=$(build/brakelight -q -e '
  local bl = require "brakelight"
  local o = { particle = "electron", target = "PbWO4", T = 20 }
  local function with (t)
    local r = {}
    for key, v in pairs(o) do r[key] = v end
    for key, v in pairs(t) do r[key] = v end
    return r
  end
  local f = "%.17g"
  local v, e = bl.dsdk(with{ k = 5 })
  print("dsdk " .. f:format(v) .. " " .. f:format(e))
  local el = bl.energy_loss(o)
  print("energy_loss " .. f:format(el.per_unit))
  print("dedx " .. f:format(el.dedx))
  local y = bl.photon_yield(with{ thickness = 0.2, kmin = 1, bins = 2 })
  for i = 1, 2 do
    print("photons " .. f:format(y.photons[i]) .. " " .. f:format(y.err[i]))
  end')
[ "$got" = "$want" ] || fail "the example of brakelight(3) and the Lua module differ:
example:
$got
module:
$want"
lua5.4 - "$scratch/man_example.out" "$scratch/man_example.expected" \
  <<'LUA' || fail "the output of the example is not the one brakelight(3) shows"
  -- word by word: numbers within 1e-9 relative, other words the same
  local function lines (name)
    local t = {}
    for l in io.lines(name) do t[#t + 1] = l end
    return t
  end
  local got, want = lines(arg[1]), lines(arg[2])
  local function fail (i, why)
    io.stderr:write(("line %d: %s\n  page:    %s\n  program: %s\n")
      :format(i, why, tostring(want[i]), tostring(got[i])))
    os.exit(1)
  end
  if #got ~= #want then fail(math.max(#got, #want), "not as many lines") end
  for i = 1, #want do
    local g = {}
    for w in got[i]:gmatch("%S+") do g[#g + 1] = w end
    local j = 0
    for w in want[i]:gmatch("%S+") do
      j = j + 1
      local a, b = tonumber(w), tonumber(g[j])
      if a and b then
        if not (math.abs(a - b) <= 1e-9 * math.abs(a)) then
          fail(i, "number " .. j .. " differs")
        end
      elseif w ~= g[j] then
        fail(i, "word " .. j .. " differs")
      end
    end
    if j ~= #g then fail(i, "not as many words") end
  end
LUA
echo "test-install: the example of brakelight(3) (pkg-config) prints the" \
  "module's numbers and the output the page shows"

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
