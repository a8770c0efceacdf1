#!/bin/sh
# Outputs that are not plain files, and outputs that cannot be written.
#
# - `-o` and `--samples-out` onto something that exists and is not a
#   regular file (a FIFO, a character device) write into it in place: the
#   node is still there, of the same kind, afterwards. (A rename over it
#   would replace the node; as root, over /dev/null, that breaks the
#   machine.) The devices are our own nodes made with mknod(1) in TMPDIR
#   (the major/minor numbers of null and full, Linux
#   Documentation/admin-guide/devices.txt), never /dev/null itself.
# - A report that cannot be written (no such directory, a file where a
#   directory should be, a device that is full, the file size limit of
#   setrlimit(RLIMIT_FSIZE)) is a failure of the machine, not of the
#   input: exit 3 with a message naming the file and the reason, nothing
#   left behind.
#
#   sh tests/cli/failures.sh PLUMB
#
# Ends with one line `cli: N passed, N failed, N skipped`.
. "$(dirname "$0")/lib/setup.sh"
prof=tests/cli/profiles/canopy.yaml

tmp=$(mktemp -d "${TMPDIR:-/tmp}/plumb-failures.XXXXXX") || exit 2
trap 'rm -rf "$tmp"' EXIT
trap 'exit 2' INT TERM

pass=0; fail=0; skip=0
ok() { pass=$((pass + 1)); }
bad() { fail=$((fail + 1)); echo "FAIL: $*"; }
skipped() { skip=$((skip + 1)); echo "skip: $1: $2"; }
check() { # check NAME COMMAND...: the command must succeed
  name=$1; shift
  if "$@"; then ok; else bad "$name"; fi
}

"$bin" fall "$prof" --format json >"$tmp/want.json" 2>/dev/null ||
  { echo "FAIL: plumb fall does not run"; echo "cli: 0 passed, 1 failed, 0 skipped"; exit 1; }

# ---- in place: a FIFO --------------------------------------------------------
# A reader that gives up after 30 s: a FIFO renamed away never feeds it.
mkfifo "$tmp/fifo" || { echo "FAIL: mkfifo"; echo "cli: 0 passed, 1 failed, 0 skipped"; exit 1; }
timeout 30 cat "$tmp/fifo" >"$tmp/got.json" &
reader=$!
"$bin" fall "$prof" --format json -o "$tmp/fifo" 2>"$tmp/err"
rc=$?
wait $reader
check "-o FIFO exits 0 (exit $rc: $(cat "$tmp/err"))" test $rc -eq 0
check "-o FIFO: the reader got the whole report" cmp -s "$tmp/want.json" "$tmp/got.json"
check "-o FIFO: still a FIFO" test -p "$tmp/fifo"
check "-o FIFO: no temporary file beside it" sh -c "! ls -A '$tmp' | grep -q '^\\.fifo'"

timeout 30 cat "$tmp/fifo" >"$tmp/samples.csv" &
reader=$!
"$bin" zone "$prof" --samples 2000 --seed 5 --threads 1 --quiet --format json \
  -o "$tmp/zone.json" --samples-out "$tmp/fifo" 2>"$tmp/err"
rc=$?
wait $reader
check "--samples-out FIFO exits 0 (exit $rc: $(cat "$tmp/err"))" test $rc -eq 0
# 2000 samples, one pass: one row each after the comments and the header.
rows=$(grep -cv '^#' "$tmp/samples.csv")
check "--samples-out FIFO: the reader got 2000 rows and the header, found $rows lines" \
  test "$rows" -eq 2001
check "--samples-out FIFO: still a FIFO" test -p "$tmp/fifo"
rm -f "$tmp/zone.json"

# ---- in place: character devices (our own nodes) ----------------------------
if mknod "$tmp/null" c 1 3 2>/dev/null && mknod "$tmp/full" c 1 7 2>/dev/null &&
   (echo probe >"$tmp/null") 2>/dev/null; then
  "$bin" fall "$prof" -o "$tmp/null" 2>"$tmp/err"
  rc=$?
  check "-o a null device exits 0 (exit $rc: $(cat "$tmp/err"))" test $rc -eq 0
  check "-o a null device: still a character device" test -c "$tmp/null"
  "$bin" fall "$prof" -o "$tmp/full" 2>"$tmp/err"
  rc=$?
  check "-o a full device exits 3, found $rc" test $rc -eq 3
  check "-o a full device: the message names the file and the reason ($(cat "$tmp/err"))" \
    grep -q "$tmp/full: cannot write the report: No space left on device" "$tmp/err"
  check "-o a full device: still a character device" test -c "$tmp/full"
  "$bin" zone "$prof" --samples 2000 --seed 5 --threads 1 --quiet -o "$tmp/zone.txt" \
    --samples-out "$tmp/full" 2>"$tmp/err"
  rc=$?
  check "--samples-out a full device exits 3, found $rc" test $rc -eq 3
  check "--samples-out a full device: the message names the file and the reason ($(cat "$tmp/err"))" \
    grep -q "$tmp/full: cannot write the samples: No space left on device" "$tmp/err"
  check "--samples-out a full device: no report written" test ! -e "$tmp/zone.txt"
  check "--samples-out a full device: still a character device" test -c "$tmp/full"
  "$bin" zone "$prof" --samples 2000 --seed 5 --threads 1 --quiet -o "$tmp/full" \
    --samples-out "$tmp/null" 2>"$tmp/err"
  rc=$?
  check "zone -o a full device exits 3, found $rc" test $rc -eq 3
  check "zone -o a full device: the samples' device is still there" test -c "$tmp/null"
  rm -f "$tmp/null" "$tmp/full"
else
  rm -f "$tmp/null" "$tmp/full"
  skipped device-nodes "cannot make or open device nodes in TMPDIR (not root, or a nodev mount)"
fi

# ---- write errors: exit 3, a message, nothing left ---------------------------
# fails NAME WANT-IN-MESSAGE ARGS...: plumb ARGS exits 3, says WANT on
# standard error, writes nothing on standard output, leaves no file in $tmp/out.
fails() {
  name=$1; want=$2; shift 2
  rm -rf "$tmp/out"; mkdir "$tmp/out"
  "$bin" "$@" >"$tmp/stdout" 2>"$tmp/stderr"
  rc=$?
  if [ $rc -ne 3 ]; then bad "$name: exit $rc, want 3 ($(cat "$tmp/stderr"))"
  elif ! grep -q "$want" "$tmp/stderr"; then bad "$name: the message lacks '$want': $(cat "$tmp/stderr")"
  elif [ -s "$tmp/stdout" ]; then bad "$name: wrote on standard output"
  elif [ -n "$(ls -A "$tmp/out")" ]; then bad "$name: left $(ls -A "$tmp/out")"
  else ok; fi
}

fails "-o into a missing directory" "$tmp/out/none/r.txt: .*No such file or directory" \
  fall "$prof" -o "$tmp/out/none/r.txt"
: >"$tmp/plain"
fails "-o below a plain file" "$tmp/plain/r.txt: .*Not a directory" fall "$prof" -o "$tmp/plain/r.txt"
rm -f "$tmp/plain"
fails "zone --samples-out into a missing directory" "$tmp/out/none/s.csv: .*No such file or directory" \
  zone "$prof" --samples 2000 --threads 1 --quiet -o "$tmp/out/z.txt" \
  --samples-out "$tmp/out/none/s.csv"
fails "sweep -o into a missing directory" "No such file or directory" \
  sweep "$prof" --vary release.height=40m:60m:10m -o "$tmp/out/none/s.txt"
fails "limit -o into a missing directory" "No such file or directory" \
  limit "$prof" --find descent.area --energy-max 40J -o "$tmp/out/none/l.txt"
fails "air -o into a missing directory" "No such file or directory" \
  air --alt 0m:1km:500m -o "$tmp/out/none/a.txt"

# -o naming a directory is the user's slip, not the machine's: exit 2
# before anything is computed, and the directory is left as it was
rm -rf "$tmp/out"; mkdir "$tmp/out"
"$bin" fall "$prof" -o "$tmp/out" >"$tmp/stdout" 2>"$tmp/stderr"
rc=$?
if [ $rc -eq 2 ] && grep -q "is a directory; give a file name" "$tmp/stderr" &&
   [ -d "$tmp/out" ] && [ -z "$(ls -A "$tmp/out")" ]; then ok
else bad "-o a directory: exit $rc ($(cat "$tmp/stderr"))"; fi

# The file size limit (setrlimit RLIMIT_FSIZE, 1 block of 512 bytes): the
# write fails with EFBIG (SIGXFSZ ignored), the temporary file goes.
rm -rf "$tmp/out"; mkdir "$tmp/out"
(trap '' XFSZ; ulimit -f 1 && exec "$bin" fall "$prof" -o "$tmp/out/r.txt") 2>"$tmp/stderr"
rc=$?
check "-o past the file size limit exits 3, found $rc ($(cat "$tmp/stderr"))" test $rc -eq 3
check "-o past the file size limit: the message says why" grep -q "$tmp/out/r.txt: cannot write the report: File too large" "$tmp/stderr"
check "-o past the file size limit: nothing left ($(ls -A "$tmp/out"))" test -z "$(ls -A "$tmp/out")"

# Standard output that cannot be written: a full device given by the shell
# (the report goes to standard output, which plumb never renames).
if [ -c /dev/full ]; then
  "$bin" fall "$prof" >/dev/full 2>"$tmp/stderr"
  rc=$?
  check "standard output full exits 3, found $rc" test $rc -eq 3
  check "standard output full: the message says so" grep -q "cannot write: No space left on device" "$tmp/stderr"
  check "/dev/full is still a character device" test -c /dev/full
fi

# A read-only directory: root may write there anyway, so the check runs only
# when a probe write is refused.
mkdir "$tmp/ro" && chmod 555 "$tmp/ro"
if (: >"$tmp/ro/probe") 2>/dev/null; then
  rm -f "$tmp/ro/probe"
  skipped read-only-dir "running as root: a read-only directory can still be written"
else
  "$bin" fall "$prof" -o "$tmp/ro/r.txt" 2>"$tmp/stderr"
  rc=$?
  check "-o into a read-only directory exits 3, found $rc" test $rc -eq 3
  check "-o into a read-only directory: Permission denied" grep -q "Permission denied" "$tmp/stderr"
  check "-o into a read-only directory: nothing left" test -z "$(ls -A "$tmp/ro")"
fi
chmod 755 "$tmp/ro"

# ---- a mass whose energies would overflow a double: an input error --------
# 1e308 lb is 4.5e307 kg: m g H would be beyond DBL_MAX (IEEE 754
# binary64, about 1.8e308). The mass's range (README.md "Profile keys",
# at most 1e8 kg) refuses it as input, exit 2, before any fall (README,
# "Exit status"); the fall's own refusal of such a spec built in code is
# tests/test_trajectory.c's. No "inf" or "nan" in the message either way.
for f in text json csv; do
  "$bin" fall "$prof" --set "payload.mass=1e308 lb" --format $f >"$tmp/stdout" 2>"$tmp/stderr"
  rc=$?
  if [ $rc -eq 2 ] && [ ! -s "$tmp/stdout" ] &&
     grep -q "^plumb: --set:1:14: payload.mass: must be > 0 kg and <= 1e+08 kg" "$tmp/stderr" &&
     ! grep -q -i -w -E "inf|nan" "$tmp/stderr"; then ok
  else bad "an overflowing mass ($f): exit $rc, $(cat "$tmp/stderr")"; fi
done

check "/dev/null is still a character device" test -c /dev/null

echo "cli: $pass passed, $fail failed, $skip skipped"
[ "$fail" -eq 0 ]
