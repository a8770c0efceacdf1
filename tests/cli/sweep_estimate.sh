#!/bin/sh
# A sweep that will take long says so on standard error, estimated from its
# first rows, and its report is the same (the
# estimate is on standard error only). The thresholds are
# lowered with PLUMB_TEST_ESTIMATE_TIMES (tests only, DEVELOPERS.md) so a
# small sweep counts as long.
. "$(dirname "$0")/lib/setup.sh"
pass=0; fail=0
ok() { pass=$((pass + 1)); }
bad() { fail=$((fail + 1)); echo "FAIL: $*"; }
tmp=$(mktemp -d "${TMPDIR:-/tmp}/plumb-sweep-estimate.XXXXXX") || exit 2
trap 'rm -rf "$tmp"' EXIT
p=profiles/demo/hand-tool.yaml
v=release.height=5m:25m:5m

"$bin" sweep "$p" --vary "$v" >"$tmp/plain" 2>"$tmp/plain.err" || bad "plain sweep failed"
if [ -s "$tmp/plain.err" ]; then bad "a short sweep says something: $(cat "$tmp/plain.err")"; else ok; fi

PLUMB_TEST_ESTIMATE_TIMES=0,0,1000 "$bin" sweep "$p" --vary "$v" >"$tmp/note" 2>"$tmp/note.err"
if grep -q '^plumb sweep: this sweep will take about .* (timed on the first 1 of 5 rows)$' "$tmp/note.err"; then ok
else bad "no estimate note: $(cat "$tmp/note.err")"; fi
if cmp -s "$tmp/plain" "$tmp/note"; then ok; else bad "the note changed the report"; fi

PLUMB_TEST_ESTIMATE_TIMES=0,0,0 "$bin" sweep "$p" --vary "$v" --format json >"$tmp/w.json" 2>"$tmp/warn.err"
if grep -q '^plumb sweep: warning: this sweep will take about .*Ctrl-C stops it$' "$tmp/warn.err"; then ok
else bad "no warning: $(cat "$tmp/warn.err")"; fi
if /usr/bin/python3 -c 'import json,sys; json.load(open(sys.argv[1]))' "$tmp/w.json"; then ok
else bad "the warning reached the JSON"; fi

PLUMB_TEST_ESTIMATE_TIMES=0,0,0 "$bin" sweep "$p" --vary "$v" --quiet >/dev/null 2>"$tmp/q.err"
if [ -s "$tmp/q.err" ]; then bad "--quiet did not silence the estimate"; else ok; fi

# on a terminal (a pseudo-terminal, Python's pty module) the progress is
# shown after the estimate and cleared before the report; never in a file
if PLUMB_TEST_ESTIMATE_TIMES=0,1000,1000 /usr/bin/python3 - "$bin" "$p" "$v" "$tmp/tty.out" <<'PY'
import os, pty, subprocess, sys
master, slave = pty.openpty()
r = subprocess.run([sys.argv[1], "sweep", sys.argv[2], "--vary", sys.argv[3]],
                   stdout=open(sys.argv[4], "w"), stderr=slave)
os.close(slave)
seen = b""
while True:
    try:
        chunk = os.read(master, 4096)
    except OSError:
        break
    if not chunk:
        break
    seen += chunk
text = seen.decode()
ok = (r.returncode == 0 and "\rplumb sweep: " in text and " rows, about " in text
      and text.rstrip(" ").endswith("\r"))
if not ok:
    print(repr(text))
sys.exit(0 if ok else 1)
PY
then ok; else bad "no progress line on a terminal"; fi
if cmp -s "$tmp/plain" "$tmp/tty.out"; then ok; else bad "the progress changed the report"; fi

echo "cli: $pass passed, $fail failed"
[ "$fail" -eq 0 ]
