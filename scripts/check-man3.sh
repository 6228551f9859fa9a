#!/usr/bin/env bash
# check-man3.sh -- is every name of the public C API documented in
# brakelight(3)?  Run by scripts/check-install.sh (make test-install) on the
# installed page; works as well on scripts/brakelight.3.in or
# build/brakelight.3.
#
#   bash scripts/check-man3.sh PAGE           silent on success; else the
#                                              undocumented names, exit 1
#   bash scripts/check-man3.sh --count PAGE   also prints the counts
#
# The names come from include/brakelight/bl_*.h and lbrakelight.h with the
# comments removed:
#   functions  every NAME ( of bl_* or luaopen_* (the prototypes): each must
#              be in the SYNOPSIS as \fBNAME\fP( and be an item of the page
#              (named on the line after a .TP or .TQ);
#   objects    extern declarations (bl_particles, bl_opts_default, ...),
#   types      typedef struct bl_* and function-pointer typedefs,
#   constants  #define BL_* (not the include guards) and enum BL_* = ...:
#              each must be named somewhere in the page (as a whole word).
set -euo pipefail
cd "$(dirname "$0")/.."

count=0
if [ "${1:-}" = "--count" ]; then count=1; shift; fi
[ $# -eq 1 ] || { echo "usage: check-man3.sh [--count] PAGE" >&2; exit 2; }
page=$1
[ -f "$page" ] || { echo "check-man3: no file '$page'" >&2; exit 2; }

headers=(include/brakelight/bl_*.h include/brakelight/lbrakelight.h)
code=$(perl -0777 -pe 's{/\*.*?\*/}{}gs' "${headers[@]}")
funcs=$(grep -o '\b\(bl\|luaopen\)_[A-Za-z0-9_]* *(' <<<"$code" | tr -d ' (' \
        | sort -u)
objects=$(sed -n 's/^extern .*\b\(bl_[A-Za-z0-9_]*\)\(\[\]\)\{0,1\};.*/\1/p' \
          <<<"$code" | sort -u)
types=$( { grep -o 'typedef struct bl_[A-Za-z0-9_]*' <<<"$code" \
             | awk '{ print $3 }'
           grep -o '(\*bl_[A-Za-z0-9_]*)' <<<"$code" | tr -d '(*)'; } \
         | sort -u)
consts=$( { sed -n 's/^#define \(BL_[A-Z0-9_]*\).*/\1/p' <<<"$code" \
              | grep -v '_H$'
            grep -o '\bBL_[A-Z0-9_]* *=' <<<"$code" | tr -d ' ='; } | sort -u)
[ -n "$funcs" ] && [ -n "$consts" ] || { echo "check-man3: no names found" >&2
                                         exit 2; }

# the items: the line after each .TP or .TQ
items=$(awk 'tag { print } { tag = ($0 ~ /^\.T[PQ]$/) }' "$page" \
        | grep -o '\b\(bl\|luaopen\)_[A-Za-z0-9_]*' | sort -u || true)
bad=0
for f in $funcs; do
  grep -qF "\\fB$f\\fP(" "$page" \
    || { echo "check-man3: $page: function $f is not in the SYNOPSIS"; bad=1; }
  grep -qx "$f" <<<"$items" \
    || { echo "check-man3: $page: function $f has no entry (.TP item)"; bad=1; }
done
for n in $objects $types $consts; do
  grep -qw -- "$n" "$page" || { echo "check-man3: $page: $n is not named"; bad=1; }
done
[ $bad = 0 ] || exit 1
if [ $count = 1 ]; then
  echo "$(wc -w <<<"$funcs") functions, $(wc -w <<<"$objects") objects," \
    "$(wc -w <<<"$types") types, $(wc -w <<<"$consts") constants"
fi
