#!/bin/sh
# The layers of libplumb (DEVELOPERS.md, "Layers"), lowest first. A file
# in src/<layer>/ may include the headers of its own layer and of the
# layers below it, never of one above: physics knows no file format, the
# library knows nothing of the command line. A public header's layer is
# the layer of the source file of the same name (include/plumb/x.h and
# src/*/x.c), or is named in the table below. Also: below the report
# writers the library prints nothing and never exits.
#
#   sh scripts/check-layers.sh [ROOT]   prints `cli: N passed, N failed`
#   (ROOT: the tree to check, default this one)
set -u
cd "${1:-$(dirname "$0")/..}" || exit 2
layers="core physics io criteria uq solve study report cli"

rank() { # layer name -> its place in $layers, or nothing
  i=0
  for l in $layers; do
    [ "$l" = "$1" ] && { echo $i; return; }
    i=$((i + 1))
  done
}

# public headers whose layer is not that of a same-named source file
header_layer() {
  case $1 in
    error|version) echo core ;;
    constants) echo physics ;;
    dispersion) echo uq ;;
    plumb) echo cli ;;   # the umbrella header: for programs, not the library
    *) f=$(find src -path 'src/cli' -prune -o -name "$1.c" -print | head -n 1)
       [ -n "$f" ] && basename "$(dirname "$f")" ;;
  esac
}

pass=0; fail=0
for f in $(find src -name '*.[ch]' | sort); do
  layer=$(basename "$(dirname "$f")")
  me=$(rank "$layer")
  if [ -z "$me" ]; then echo "FAIL: $f: folder '$layer' is not a layer ($layers)"; fail=$((fail + 1)); continue; fi
  for inc in $(sed -n 's/^[[:space:]]*#[[:space:]]*include[[:space:]]*"\([^"]*\)".*/\1/p' "$f"); do
    case $inc in
      plumb/*.h) h=${inc#plumb/}; to=$(header_layer "${h%.h}") ;;
      */*) to=${inc%%/*} ;;
      *) to=$layer ;;  # a header beside the file
    esac
    them=$(rank "${to:-?}")
    if [ -z "$them" ]; then
      echo "FAIL: $f includes $inc, whose layer is unknown"; fail=$((fail + 1))
    elif [ "$them" -gt "$me" ]; then
      echo "FAIL: $f ($layer) includes $inc ($to), a higher layer"; fail=$((fail + 1))
    else
      pass=$((pass + 1))
    fi
  done
done
# public headers include only lower-or-equal public headers
for f in include/plumb/*.h; do
  h=$(basename "$f" .h); layer=$(header_layer "$h"); me=$(rank "${layer:-?}")
  if [ -z "$me" ]; then echo "FAIL: $f has no layer"; fail=$((fail + 1)); continue; fi
  for inc in $(sed -n 's/^[[:space:]]*#[[:space:]]*include[[:space:]]*"plumb\/\([^"]*\)\.h".*/\1/p' "$f"); do
    to=$(header_layer "$inc"); them=$(rank "${to:-?}")
    if [ -z "$them" ] || [ "$them" -gt "$me" ]; then
      echo "FAIL: $f ($layer) includes plumb/$inc.h (${to:-unknown}), a higher layer"; fail=$((fail + 1))
    else
      pass=$((pass + 1))
    fi
  done
done
# below the writers: no printing, no exit
for f in $(find src -name '*.[ch]' ! -path 'src/report/*' ! -path 'src/cli/*' | sort); do
  if grep -nE '(^|[^a-z_])(printf|fprintf|puts|fputs|putchar|perror|exit|abort)[[:space:]]*\(' "$f" |
     grep -vE '^[0-9]+:[[:space:]]*(/?\*|//)'; then
    echo "FAIL: $f prints or exits (the library only returns a status)"; fail=$((fail + 1))
  else
    pass=$((pass + 1))
  fi
done
echo "cli: $pass passed, $fail failed"
[ "$fail" -eq 0 ]
