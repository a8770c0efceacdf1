#!/bin/sh
# The udunits2 database is loaded at the first quantity a run reads
# (plumb_units_alloc_deferred, DEVELOPERS.md "The shared library and its
# version"): a profile refused before any (its YAML, a key) is refused the
# same without a database, and a run that needs one and cannot load it is
# told so as when the database was loaded first, in one line (exit 2: the
# installation's input is missing, README.md "Exit status"), with nothing
# written. UDUNITS2_XML_PATH names the database (udunits2's ut_read_xml).
#
#   sh tests/cli/units_database.sh PLUMB
#
# Ends with one line `cli: N passed, N failed, N skipped`.
. "$(dirname "$0")/lib/setup.sh"

tmp=$(mktemp -d "${TMPDIR:-/tmp}/plumb-units-db.XXXXXX") || exit 2
trap 'rm -rf "$tmp"' EXIT
trap 'exit 2' INT TERM

pass=0; fail=0
ok() { pass=$((pass + 1)); }
bad() { fail=$((fail + 1)); echo "FAIL: $*"; }

nodb=/nonexistent/plumb/udunits2.xml
told='plumb: cannot load the udunits2 unit database: cannot open the database named by UDUNITS2_XML_PATH'

# no_database NAME ARGS...: plumb ARGS -o FILE without a database: exit 2,
# the one line $told, nothing on standard output, no file.
no_database() {
  name=$1; shift
  rm -rf "$tmp/out"; mkdir "$tmp/out"
  UDUNITS2_XML_PATH=$nodb "$bin" "$@" -o "$tmp/out/r" >"$tmp/stdout" 2>"$tmp/stderr"
  rc=$?
  if [ $rc -eq 2 ] && [ "$(cat "$tmp/stderr")" = "$told" ] && [ ! -s "$tmp/stdout" ] &&
     [ -z "$(ls -A "$tmp/out")" ]; then ok
  else bad "$name without a database: exit $rc, stderr '$(head -c 300 "$tmp/stderr")'," \
    "left: $(ls -A "$tmp/out")"; fi
}

prof=tests/cli/profiles/canopy.yaml
no_database "fall" fall "$prof"
no_database "sweep" sweep "$prof" --vary release.height=40m:90m:25m
no_database "limit" limit tests/cli/profiles/light.yaml --find payload.mass --energy-max 40J
no_database "zone" zone "$prof" --samples 20 --threads 1
no_database "air" air --alt 0ft:3000ft:1000ft
no_database "lint" lint "$prof" tests/bad/tab-indent.yaml
no_database "a --set" fall "$prof" --set release.height=31.6m

# same_without NAME ARGS...: the same exit status and standard error with
# and without a database: the run refuses its input before reading a unit.
same_without() {
  name=$1; shift
  "$bin" "$@" >"$tmp/out1" 2>"$tmp/err1"; rc1=$?
  UDUNITS2_XML_PATH=$nodb "$bin" "$@" >"$tmp/out2" 2>"$tmp/err2"; rc2=$?
  if [ $rc1 -eq 2 ] && [ $rc2 -eq 2 ] && cmp -s "$tmp/err1" "$tmp/err2" &&
     cmp -s "$tmp/out1" "$tmp/out2" && [ -s "$tmp/err1" ]; then ok
  else bad "$name: exit $rc1 with the database, $rc2 without;" \
    "stderr '$(head -c 200 "$tmp/err1")' against '$(head -c 200 "$tmp/err2")'"; fi
}

same_without "a tab in the indentation" fall tests/bad/tab-indent.yaml
same_without "lint of a tab in the indentation" lint tests/bad/tab-indent.yaml
same_without "a misspelt --set key" fall profiles/payloads/torque-wrench.yaml \
  --set release.hieght=30m
same_without "an --alt without its STEP" air --alt 0m:1km

echo "cli: $pass passed, $fail failed, 0 skipped"
[ "$fail" -eq 0 ]
