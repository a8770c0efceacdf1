"""A sweep's warnings say which rows they are about, in text and CSV
(a new-user review: the text said "(2 of 5 rows)" with no mark on the rows,
and the CSV had no per-row column; only JSON had per-row warnings).

The rows a warning belongs to are checked against two things outside the
text writer: JSON's per-row, per-item "warnings" (the existing keys,
unchanged), and for the parachute the meaning of `descent.deploy: {after:
3 s}` in README.md's profile format: a device that deploys 3 s after
release cannot open in a fall that lasts less than 3 s, so every row whose
impact time is under 3 s must carry the warning that it did not open, and
a fall over twice that long (the canopy has had 3 s to open) must not.
Also: every line at most 80 columns (the classic terminal width, VT100 /
ECMA-48 default line; common practice, no source; TABLE_WIDTH), each
table's marks in the column of its `warn` header, the warnings numbered
W1 ... in the block with the rows listed, and the CSV's `warnings` column
holding the numbers of the `# warning N:` lines.
"""
import csv
import io
import json
import os
import re
import sys

sys.path.insert(0, os.path.join(os.path.dirname(os.path.abspath(__file__)), "lib"))
from plumbcli import ROOT, check, finish, plumb  # noqa: E402

CANOPY = os.path.join(ROOT, "profiles", "demo", "drone-canopy.yaml")
KIT = os.path.join(ROOT, "profiles", "demo", "tower-kit.yaml")
DEPLOY_AFTER_S = 3.0
NOT_OPEN = "does not open before impact"


def squeeze(s):
    return " ".join(s.split())


def json_rows(*args):
    rc, out, err = plumb("sweep", *args, "--format", "json")
    check(rc == 0, f"json sweep {args}: exit {rc}: {err.strip()[:200]}")
    return json.loads(out)["rows"] if rc == 0 else []


def block(out):
    """The Warnings block: {number: sentence (squeezed, without the rows)}
    and {number: the rows' parenthesis}."""
    text = out.split("\nWarnings", 1)[-1].split("\n\n", 1)[0]
    said, rows = {}, {}
    for m in re.finditer(r"^  W(\d+)\s+(.*?)(?=^  W\d|\Z)", text, re.M | re.S):
        whole = squeeze(m.group(2))
        cut = whole.rfind(" (")
        said[int(m.group(1))], rows[int(m.group(1))] = whole[:cut], whole[cut + 2:-1]
    return said, rows


def tables(out):
    """Each table with a `warn` header: (column of the header, its lines up
    to the next blank line)."""
    found, lines = [], out.splitlines()
    for i, l in enumerate(lines):
        if l.endswith("  warn") and not l.startswith(" " * 4 + "W"):
            body = []
            for b in lines[i + 1:]:
                if not b.strip():
                    break
                body.append(b)
            found.append((len(l) - len("warn"), body))
    return found


# ---- one-way: a parachute that deploys after 3 s -----------------------------
args = (CANOPY, "--set", "descent.deploy={after: 3 s}", "--vary", "release.height=20m:100m:20m")
rows = json_rows(*args)
times = [r["items"][0]["impact"]["time_s"] for r in rows]
warned = [any(NOT_OPEN in w for w in r["items"][0]["warnings"]) for r in rows]
check(len(rows) == 5, f"5 rows: {len(rows)}")
for t, w in zip(times, warned):
    if t < DEPLOY_AFTER_S:
        check(w, f"a fall of {t:.3f} s < {DEPLOY_AFTER_S} s: JSON says the canopy did not open")
    if t > 2 * DEPLOY_AFTER_S:
        check(not w, f"a fall of {t:.3f} s: JSON says the canopy opened")
check(any(warned) and not all(warned), f"some rows warned, not all: {warned}")

rc, out, err = plumb("sweep", *args)
check(rc == 0, f"text sweep: exit {rc}: {err.strip()[:200]}")
wide = [l for l in out.splitlines() if len(l) > 80]
check(not wide, f"no line over 80 columns: {wide[:2]}")
said, listed = block(out)
check(list(said) == [1] and NOT_OPEN in said.get(1, ""),
      f"one warning, numbered W1: {said}")
heights = [20, 40, 60, 80, 100]
want_rows = ", ".join(f"{h} m" for h, w in zip(heights, warned) if w)
check(listed.get(1) == f"{sum(warned)} of 5 rows: {want_rows}",
      f"W1 lists its rows: {listed.get(1)!r}, want '{sum(warned)} of 5 rows: {want_rows}'")
tabs = tables(out)
check(len(tabs) >= 1, f"a table with a warn column: {len(tabs)}")
for col, body in tabs:
    data = [l for l in body if re.match(r"\s+\d+\s", l) and not l.strip().startswith("m ")]
    check(len(data) == 5, f"5 rows in the table: {data}")
    for h, w, l in zip(heights, warned, data):
        check(l.split()[0] == str(h), f"row {h} m in order: {l!r}")
        mark = l[col:] if len(l) > col else ""
        check(mark == ("W1" if w else ""),
              f"row {h} m: mark {mark!r} in the warn column ({col}), JSON warned {w}: {l!r}")
        check(w or not l.rstrip().endswith("W1"), f"row {h} m: no stray mark: {l!r}")

rc, out, err = plumb("sweep", *args, "--format", "csv")
check(rc == 0, f"csv sweep: exit {rc}")
comments = [l for l in out.splitlines() if l.startswith("# warning")]
check(len(comments) == 1 and comments[0].startswith("# warning 1: ") and NOT_OPEN in comments[0]
      and comments[0].endswith(f"({sum(warned)} of 5 rows)"),
      f"CSV: '# warning 1: ...' with its row count: {comments}")
table = list(csv.DictReader(io.StringIO("\n".join(l for l in out.splitlines()
                                                   if not l.startswith("#")))))
check(table and list(table[0])[-2:] == ["warnings", "error"],
      f"CSV: a warnings column before error: {list(table[0])[-3:] if table else None}")
check([r.get("warnings") for r in table] == ["1" if w else "" for w in warned],
      f"CSV: each row's warning numbers: {[r.get('warnings') for r in table]} vs {warned}")

# ---- an inventory: marks per item, numbers match JSON's sentences --------------
args = (KIT, "--vary", "release.height=3m:40m:18.5m")
rows = json_rows(*args)
rc, out, err = plumb("sweep", *args)
check(rc == 0, f"kit text: exit {rc}")
check(not [l for l in out.splitlines() if len(l) > 80], "kit: no line over 80 columns")
said, listed = block(out)
number = {s: n for n, s in said.items()}
check(len(said) >= 2, f"kit: several warnings numbered: {list(said)}")
rc, cout, _ = plumb("sweep", *args, "--format", "csv")
table = list(csv.DictReader(io.StringIO("\n".join(l for l in cout.splitlines()
                                                   if not l.startswith("#")))))
check(len(table) == sum(len(r["items"]) for r in rows), "kit CSV: a line per row and item")
k = 0
for r in rows:
    for it in r["items"]:
        want = sorted({number.get(squeeze(w), -1) for w in it["warnings"]})
        check(-1 not in want, f"kit: each JSON sentence is a numbered warning: {it['warnings']}")
        got = table[k]["warnings"] if k < len(table) else None
        check(got == ";".join(map(str, want)),
              f"kit CSV row {k}, item {it['item_number']}: warnings {got!r}, JSON {want}")
        k += 1
# the plate warning is one item's: the block says which
plate = [n for n, s in said.items() if s.startswith("Plate-like")]
check(len(plate) == 1 and listed[plate[0]].endswith("; item 5"),
      f"kit: the plate's warning names its item: {[listed.get(n) for n in plate]}")
# the text's marks: each item's line (the figures' line) ends with its numbers
marks = re.findall(r"  (W\d+(?:,W\d+)*)$", out, re.M)
want_marks = []
for r in rows:
    for it in r["items"]:
        nums = sorted({number.get(squeeze(w), -1) for w in it["warnings"]})
        if nums:
            want_marks.append(",".join(f"W{n}" for n in nums))
check(marks[:len(want_marks)] == want_marks,
      f"kit text: each item's marks in the first table: {marks[:8]} vs {want_marks[:8]}")

# ---- no warnings: no warn column, no block, an empty CSV column ------------------
rc, out, _ = plumb("sweep", CANOPY, "--vary", "release.height=60m:100m:20m")
check(rc == 0 and "warn" not in out.split("Criteria", 1)[0] and "\nWarnings" not in out,
      "no warnings: no mark column and no block")
rc, out, _ = plumb("sweep", CANOPY, "--vary", "release.height=60m:100m:20m", "--format", "csv")
table = list(csv.DictReader(io.StringIO("\n".join(l for l in out.splitlines()
                                                   if not l.startswith("#")))))
check(rc == 0 and table and all(r["warnings"] == "" for r in table),
      "no warnings: the CSV column is there, empty")

finish()
