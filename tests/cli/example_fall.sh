#!/bin/sh
# examples/fall.py, the ctypes example, against the shared library built
# beside PLUMB: for every demo profile its impact speeds and energies must
# be those of `plumb fall --format json`, bit for bit (the same library
# functions with the same default options, reached from another language);
# its copies of plumb_fall_result and plumb_diag must have the C layout;
# an input error reaches Python as the same diagnostic and exit status 2.
#
#   sh tests/cli/example_fall.sh PLUMB
#
# A sanitizer build is skipped (skip ID sanitized-build): its libplumb.so
# needs the ASan runtime loaded before anything else, which python3 can
# only get through LD_PRELOAD. The plain build runs it.
# Ends with one line `cli: N passed, N failed, N skipped`.
. "$(dirname "$0")/lib/setup.sh"
py=/usr/bin/python3
so=$(dirname "$bin")/libplumb.so

pass=0
fail=0
ok() { pass=$((pass + 1)); }
bad() { fail=$((fail + 1)); echo "FAIL: $*"; }
finish() { echo "cli: $pass passed, $fail failed, ${1:-0} skipped"; [ "$fail" -eq 0 ]; exit $?; }

if [ ! -f "$so" ]; then
  bad "no $so beside the binary"
  finish
fi
if readelf -d "$so" 2>/dev/null | grep -q 'NEEDED.*libasan'; then
  echo "skip: sanitized-build: $so needs the ASan runtime preloaded into python3"
  finish 1
fi
if ! "$py" -c 'import ctypes' 2>/dev/null; then
  echo "skip: no-python: $py with ctypes is not installed"
  finish 1
fi

tmp=$(mktemp -d "${TMPDIR:-/tmp}/plumb-example.XXXXXX") || exit 2
trap 'rm -rf "$tmp"' EXIT
trap 'exit 2' INT TERM

# ---- the ctypes structures have the C layout ---------------------------------
cat >"$tmp/layout.c" <<'C'
#include <stddef.h>
#include <stdio.h>
#include "plumb/plumb.h"
int main(void)
{
    printf("%zu %zu %zu %zu %zu %zu\n", sizeof(plumb_fall_result),
           offsetof(plumb_fall_result, speed_m_s), offsetof(plumb_fall_result, energy_j),
           offsetof(plumb_fall_result, solver), sizeof(plumb_diag),
           offsetof(plumb_diag, message));
    return 0;
}
C
if ${CC:-cc} -std=c11 -Iinclude -o "$tmp/layout" "$tmp/layout.c" 2>"$tmp/cc.err"; then
  want=$("$tmp/layout")
  got=$(cd examples && "$py" -B -c 'import ctypes, fall
R, D = fall.FallResult, fall.Diag
print(ctypes.sizeof(R), R.speed_m_s.offset, R.energy_j.offset, R.solver.offset,
      ctypes.sizeof(D), D.message.offset)')
  if [ "$got" = "$want" ]; then ok
  else bad "examples/fall.py structures (size, offsets) $got, C has $want: update its copies"; fi
else
  bad "cannot compile the layout probe: $(head -n 3 "$tmp/cc.err")"
fi

# ---- the same numbers as plumb fall --format json -----------------------------
for prof in profiles/demo/*.yaml; do
  if ! "$py" examples/fall.py --lib "$so" "$prof" >"$tmp/py.out" 2>"$tmp/py.err"; then
    bad "fall.py $prof failed: $(cat "$tmp/py.err")"
    continue
  fi
  if ! "$bin" fall "$prof" --format json >"$tmp/cli.json" 2>"$tmp/cli.err"; then
    bad "plumb fall $prof failed: $(cat "$tmp/cli.err")"
    continue
  fi
  if msg=$("$py" - "$tmp/py.out" "$tmp/cli.json" <<'PY'
import json, re, sys
def die(msg):
    print(msg)
    sys.exit(1)
lines = open(sys.argv[1]).read().splitlines()[1:]
doc = json.load(open(sys.argv[2]))
items = doc["items"] if "items" in doc else [doc]
rows = [re.fullmatch(r"(.*): impact speed (\S+) m/s, energy (\S+) J", l) for l in lines]
if len(rows) != len(items) or not all(rows):
    die(f"{len(lines)} lines for {len(items)} payloads: {lines}")
for m, it in zip(rows, items):
    got = (float(m.group(2)), float(m.group(3)))
    want = (it["impact"]["speed_m_s"], it["impact"]["energy_j"])
    if got != want:
        die(f"{m.group(1)}: ctypes {got!r}, plumb fall {want!r}")
PY
  ); then ok
  else bad "$prof: $msg"; fi
done

# ---- the README shows what it prints --------------------------------------------
# The indented block after "$ python3 examples/fall.py PROFILE" in README.md
# is the script's output for that profile, word for word (an example
# that is run cannot go stale).
if "$py" - README.md "$py" "$so" <<'PY'
import subprocess, sys
lines = open(sys.argv[1]).read().splitlines()
at = [i for i, l in enumerate(lines) if l.startswith("    $ python3 examples/fall.py ")]
assert len(at) == 1, f"{len(at)} fall.py examples in README"
shown = []
for l in lines[at[0] + 1:]:
    if not l.startswith("    "):
        break
    shown.append(l[4:])
prof = lines[at[0]].split()[-1]
run = subprocess.run([sys.argv[2], "examples/fall.py", "--lib", sys.argv[3], prof],
                     capture_output=True, text=True)
assert run.returncode == 0 and run.stdout.splitlines() == shown, (shown, run.stdout, run.stderr)
PY
then ok; else bad "README's examples/fall.py block differs from what it prints"; fi

# ---- an input error reaches Python whole ---------------------------------------
bad_prof=tests/bad/nan.yaml
"$py" examples/fall.py --lib "$so" "$bad_prof" >"$tmp/out" 2>"$tmp/err"
rc=$?
"$bin" fall "$bad_prof" >/dev/null 2>"$tmp/cli.err"
if [ "$rc" -eq 2 ] && [ ! -s "$tmp/out" ] &&
   [ "$(sed 's/^fall.py: //' "$tmp/err")" = "$(sed 's/^plumb: //' "$tmp/cli.err")" ]; then ok
else bad "$bad_prof: exit $rc, stderr '$(cat "$tmp/err")', plumb says '$(cat "$tmp/cli.err")'"; fi

finish
