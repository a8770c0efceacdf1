#!/bin/sh
# The layers of libplumb (DEVELOPERS.md, "Layers"), lowest first. A file
# in src/<layer>/ may include the headers of its own layer and of the
# layers below it, never of one above: physics knows no file format, the
# library knows nothing of the command line. A public header's layer is
# the layer of the source file of the same name (include/plumb/x.h and
# src/*/x.c), or is named in the awk program below. Also: below the report
# writers the library prints nothing and never exits.
#
#   sh scripts/check-layers.sh [ROOT]   prints `cli: N passed, N failed`
#   (ROOT: the tree to check, default this one)
set -u
cd "${1:-$(dirname "$0")/..}" || exit 2
layers="core physics io criteria uq solve study report cli"

# One awk pass over every file (a shell loop with a find per include took
# some 15 s, most of `make check`'s wall time on two cores).
# The source files, the public headers, and the library's .c files that
# name a public header's layer (src/<layer>/<name>.c, cli excluded).
SRCS=$(find src -name '*.[ch]' | sort)
LIBC=$(find src -path src/cli -prune -o -name '*.c' -print | sort)
export SRCS LIBC
# shellcheck disable=SC2086
awk -v layers="$layers" '
  BEGIN {
    n = split(layers, L, " ")
    for (i = 1; i <= n; i++) rank[L[i]] = i - 1
    m = split(ENVIRON["LIBC"], C, "\n")
    for (i = 1; i <= m; i++) {       # src/<layer>/<name>.c: the first one wins
      k = split(C[i], parts, "/"); name = parts[k]; sub(/\.c$/, "", name)
      if (!(name in owner)) owner[name] = parts[k - 1]
    }
    # public headers whose layer is not that of a same-named source file
    owner["error"] = "core"; owner["version"] = "core"; owner["constants"] = "physics"
    owner["dispersion"] = "uq"; owner["plumb"] = "cli"  # the umbrella header: for programs
    # every source file sits in the folder of a layer (checked here, so an
    # empty file counts too); each library file below the writers passes
    # the printing check unless a line of it prints
    m = split(ENVIRON["SRCS"], S, "\n")
    for (i = 1; i <= m; i++) {
      l = layer_of(S[i])
      if (!(l in rank)) { fail_(S[i] ": folder '\''" l "'\'' is not a layer (" layers ")"); bad[S[i]] = 1 }
      else if (S[i] !~ /^src\/report\// && S[i] !~ /^src\/cli\//) passes++
    }
  }
  function fail_(msg) { print "FAIL: " msg; fails++ }
  function layer_of(path,   k, parts) { k = split(path, parts, "/"); return parts[k - 1] }
  function hname(path,   k, parts) { k = split(path, parts, "/"); sub(/\.h$/, "", parts[k]); return parts[k] }
  function finish_file() {
    if (cur != "" && lib_file && printed != "") {
      printf "%s", printed; passes--
      fail_(cur " prints or exits (the library only returns a status)")
    }
  }
  FNR == 1 {
    finish_file()
    cur = FILENAME; printed = ""; skip = 0
    if (cur ~ /^include\/plumb\//) {
      pub = 1; lib_file = 0; me_layer = owner[hname(cur)]
      if (!(me_layer in rank)) { fail_(cur " has no layer"); skip = 1 }
    } else {
      pub = 0; me_layer = layer_of(cur)
      lib_file = (cur !~ /^src\/report\// && cur !~ /^src\/cli\//)
      if (cur in bad) { skip = 1; lib_file = 0 }
    }
  }
  skip { next }
  # below the writers: no printing, no exit (comment lines aside)
  lib_file && /(^|[^a-z_])(printf|fprintf|puts|fputs|putchar|perror|exit|abort)[[:space:]]*\(/ &&
  !/^[[:space:]]*(\/?\*|\/\/)/ { printed = printed FNR ":" $0 "\n" }
  /^[[:space:]]*#[[:space:]]*include[[:space:]]*"/ {
    inc = $0; sub(/^[^"]*"/, "", inc); sub(/".*$/, "", inc)
    if (pub) {
      if (inc !~ /^plumb\/.*\.h$/) next
      h = inc; sub(/^plumb\//, "", h); sub(/\.h$/, "", h); to = owner[h]
      if (!(to in rank) || rank[to] > rank[me_layer]) {
        fail_(cur " (" me_layer ") includes plumb/" h ".h (" (to == "" ? "unknown" : to) "), a higher layer")
      } else passes++
      next
    }
    if (inc ~ /^plumb\/.*\.h$/) { h = inc; sub(/^plumb\//, "", h); sub(/\.h$/, "", h); to = owner[h] }
    else if (inc ~ /\//) { to = inc; sub(/\/.*$/, "", to) }
    else to = me_layer             # a header beside the file
    if (!(to in rank)) fail_(cur " includes " inc ", whose layer is unknown")
    else if (rank[to] > rank[me_layer]) fail_(cur " (" me_layer ") includes " inc " (" to "), a higher layer")
    else passes++
  }
  END {
    finish_file()
    printf "cli: %d passed, %d failed\n", passes, fails
    exit fails > 0
  }
' $SRCS include/plumb/*.h
