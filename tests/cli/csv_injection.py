#!/usr/bin/python3
'''Every CSV writer neutralises a text cell a spreadsheet would evaluate.

OWASP, "CSV Injection" (owasp.org/www-community/attacks/CSV_Injection):
a cell starting with = + - @, a tab or a carriage return may be run as a
formula when the file is opened in a spreadsheet; the guidance is to
prefix such a cell with a single quote (and quote it as RFC 4180 asks).
README.md "plumb fall" (CSV): text cells (names, keys, messages) are
neutralised so; numbers never are, so a negative number stays a number.
An item named `=1+2 formula, "hammer"` was written `"=1+2 formula,
""hammer"""`, which a spreadsheet evaluates.
Usage: csv_injection.py PATH/TO/plumb   (prints `cli: N passed, N failed`)
'''
import csv
import io
import os
import sys

sys.path.insert(0, os.path.join(os.path.dirname(os.path.abspath(__file__)), "lib"))
from plumbcli import HERE, check, finish, plumb  # noqa: E402

PROFILE = os.path.join(HERE, "profiles", "formula-names.yaml")
NAMES = ['=1+2 formula, "hammer"', "-2+3 spanner", "+SUM(A1:A2) pliers", "plain level"]
FORMULA = tuple("=+-@\t\r")


def rows_of(out):
    return list(csv.reader(io.StringIO("\n".join(
        ln for ln in out.splitlines() if not ln.startswith("#")))))


def is_number(cell):
    try:
        float(cell)
        return True
    except ValueError:
        return False


RUNS = [
    ("fall", ["fall", PROFILE, "--format", "csv"], "name"),
    ("sweep", ["sweep", PROFILE, "--vary", "release.height=10m:12m:2m", "--format", "csv"], "name"),
    ("limit", ["limit", PROFILE, "--find", "release.height", "--energy-max", "us-part107-cat3",
               "--format", "csv"], "name"),
    ("zone", ["zone", PROFILE, "--threads", "1", "--quiet", "--format", "csv"], "item"),
]
for label, args, col in RUNS:
    rc, out, err = plumb(*args)
    check(rc == 0, f"{label}: exit 0 (got {rc}: {err.strip()})")
    rows = rows_of(out)
    if not rows:
        check(False, f"{label}: a CSV table")
        continue
    head, body = rows[0], rows[1:]
    check(col in head, f"{label}: a {col!r} column")
    if col not in head:
        continue
    k = head.index(col)
    seen = {r[k] for r in body}
    for name in NAMES:
        want = ("'" + name) if name.startswith(FORMULA) else name
        check(want in seen, f"{label}: {name!r} written as {want!r} (cells: {sorted(seen)})")
    # no cell of the table starts a formula, unless it is a number
    bad = [c for r in body for c in r if c.startswith(FORMULA) and not is_number(c)]
    check(not bad, f"{label}: no text cell starts with = + - @ (found {bad[:3]})")
    negatives = [c for r in body for c in r if c.startswith("-") and is_number(c)]
    check(label == "limit" or negatives,
          f"{label}: a negative figure (the westward drift) stays a plain number")

finish()
