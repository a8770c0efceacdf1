"""Shared start and end of the Python CLI test scripts (tests/cli/*.py),
as lib/setup.sh is for the shell ones. A script puts this directory on
its path and imports what it needs:

    sys.path.insert(0, os.path.join(os.path.dirname(os.path.abspath(__file__)), "lib"))
    from plumbcli import HERE, PLUMB, check, finish, plumb

PLUMB   the plumb binary, the script's first argument
HERE    tests/cli (the profiles are in HERE/profiles)
ROOT    the source root, from this file's place
check   counts one check; prints `FAIL what` when it fails
plumb   runs PLUMB with LC_ALL=C: (exit status, stdout, stderr)
finish  prints `cli: N passed, N failed` (read by tests/run.sh) and exits,
        1 when any check failed
Debian's /usr/bin/python3 and its standard library only.
"""
import os
import subprocess
import sys

PLUMB = sys.argv[1]
HERE = os.path.dirname(os.path.dirname(os.path.abspath(__file__)))
ROOT = os.path.dirname(os.path.dirname(HERE))

_count = {"passed": 0, "failed": 0}


def check(ok, what):
    if ok:
        _count["passed"] += 1
    else:
        _count["failed"] += 1
        print(f"FAIL {what}")


def plumb(*args, timeout=None, stdin=None):
    """Runs PLUMB ARGS under LC_ALL=C; a timeout raises subprocess.TimeoutExpired."""
    r = subprocess.run([PLUMB, *args], capture_output=True, text=True, stdin=stdin,
                       timeout=timeout, env=dict(os.environ, LC_ALL="C"))
    return r.returncode, r.stdout, r.stderr


def finish():
    print(f"cli: {_count['passed']} passed, {_count['failed']} failed")
    sys.exit(1 if _count["failed"] else 0)
