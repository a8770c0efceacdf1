#!/usr/bin/python3
"""`plumb lint --format json|csv`, `--units us` and `-o` (issue 9,
"Commands that behave like Unix tools"; README.md "plumb lint" and
"Cautions").

What each check is measured against:
  - where an error is: the `# expect: ... @ LINE:COL key=KEY` line each file
    of tests/bad/ states for its one fault, and the fault's own text found
    in the file here (the column of the value the key is given);
  - what an error says: the same errors in the same order as the text
    format prints on standard error (`plumb: FILE:LINE:COL: KEY: MESSAGE`,
    the form DEVELOPERS.md "Errors" fixes), so the formats cannot disagree;
  - the cautions: the list every report carries (README.md "Cautions"),
    taken from `plumb verify --format json`, a report of another writer;
  - US limits (`--units us`): the sea-level speed of sound 340.294 m/s
    (U.S. Standard Atmosphere 1976, Table I, transcribed) over the
    international foot 0.3048 m (NIST SP 811, 2008, B.8, exact), rounded
    down to 6 figures; t/degF = 1.8 T/K - 459.67 (NIST SP 811, B.8) for
    the air-temperature range 150 K .. 400 K;
  - Unix conventions (README "Command reference"): exit 2 when a profile
    is bad, the report still whole on stdout or -o; a usage error writes
    nothing; -o is atomic (no temporary file left) and its .json/.csv/.txt
    name sets the format; JSON is SI whatever --units says.
Usage: lint.py PATH/TO/plumb   (prints `cli: N passed, N failed`)
"""
import atexit
import csv
import io
import json
import math
import os
import re
import shutil
import sys
import tempfile

sys.path.insert(0, os.path.join(os.path.dirname(os.path.abspath(__file__)), "lib"))
from plumbcli import ROOT, check, finish, plumb  # noqa: E402

os.chdir(ROOT)
tmp = tempfile.mkdtemp(prefix="plumb-lint.", dir=os.environ.get("TMPDIR"))
atexit.register(shutil.rmtree, tmp, True)

GOOD = "profiles/demo/hand-tool.yaml"
BAD = ["tests/bad/cd-negative.yaml", "tests/bad/item-mass-negative.yaml",
       "tests/bad/release-speed-supersonic.yaml"]


def expected(path):
    """(line, col, key) that the file's `# expect:` header states."""
    with open(path, encoding="utf-8") as f:
        m = re.search(r"^# expect: .* @ (\d+):(\d+) key=(\S+)", f.read(), re.M)
    return int(m.group(1)), int(m.group(2)), m.group(3)


def stderr_errors(err):
    """The located errors of the text format: (file, line, col, key, message)."""
    out = []
    for line in err.splitlines():
        m = re.match(r"plumb: (.+?):(\d+):(\d+): ([^:]+): (.*)$", line)
        if m:
            out.append((m.group(1), int(m.group(2)), int(m.group(3)), m.group(4), m.group(5)))
    return out


def csv_rows(text):
    body = "".join(l + "\n" for l in text.splitlines() if not l.startswith("#"))
    return list(csv.DictReader(io.StringIO(body)))


rc, vout, _ = plumb("verify", "--format", "json")
CAUTIONS = json.loads(vout)["cautions"] if rc == 0 else None
rc, version, _ = plumb("--version")
check(CAUTIONS and rc == 0, "the reference cautions and version are read")

# ---- JSON -------------------------------------------------------------------
args = [GOOD] + BAD
rc_t, out_t, err_t = plumb("lint", *args)
rc, out, err = plumb("lint", *args, "--format", "json")
d = json.loads(out) if out.startswith("{") else {}
check(rc == 2 and rc_t == 2, f"lint with bad profiles exits 2 in text and JSON ({rc_t}, {rc})")
check(d.get("plumb_version") and d["plumb_version"] in version,
      f"JSON names plumb_version {d.get('plumb_version')!r} ({version.strip()})")
check(d.get("cautions") == CAUTIONS, "JSON carries the cautions of every report (README.md Cautions)")
profs = d.get("profiles", [])
check([p.get("name") for p in profs] == args, f"one entry per profile, in order: {profs!r:.200}")
check(d.get("passed") == 1 and d.get("failed") == len(BAD),
      f"passed/failed count the good and bad profiles: {d.get('passed')}, {d.get('failed')}")
check(profs and profs[0].get("ok") is True and profs[0].get("errors") == [],
      f"a good profile: ok true, no errors ({profs[:1]})")
flat = [(e["file"], e["line"], e["column"], e["key"], e["message"])
        for p in profs[1:] for e in p.get("errors", [])]
check(flat == stderr_errors(err_t),
      f"JSON errors are the text format's, in order, their parts apart: {flat} / {err_t}")
for p, path in zip(profs[1:], BAD):
    line, col, key = expected(path)
    e = (p.get("errors") or [{}])[0]
    check(p.get("ok") is False and p.get("listed_all") is True and
          (e.get("file"), e.get("line"), e.get("column"), e.get("key")) == (path, line, col, key),
          f"{path}: JSON error at {line}:{col} {key} as its `# expect:` states: {e}")
    with open(path, encoding="utf-8") as f:
        text = f.read().splitlines()[line - 1]
    check(text[col - 1:].startswith(tuple("-0123456789")),
          f"{path}: column {col} is where the refused value starts in '{text}'")
check(not err.strip() or ("errors in 3 of 4 profiles" in err and "plumb:" not in err),
      f"JSON: stderr has the count only, not the errors again: {err}")
rc, _, err = plumb("lint", *args, "--format", "json", "--quiet")
check(rc == 2 and err == "", f"JSON --quiet: nothing on stderr, still exit 2 ({err})")
rc, out, _ = plumb("lint", GOOD, "--format", "json")
check(rc == 0 and json.loads(out).get("failed") == 0, f"all good: exit 0, failed 0 ({rc})")
rc, out_us, _ = plumb("lint", *args, "--format", "json", "--units", "us")
check(rc == 2 and json.loads(out_us) == d, "JSON is SI whatever --units says (README.md Common options)")

# a file that cannot be read is an error of that profile, in the report
missing = os.path.join(tmp, "no-such.yaml")
rc, out, _ = plumb("lint", GOOD, missing, "--format", "json")
e = json.loads(out)["profiles"][1] if out.startswith("{") else {}
check(rc == 2 and e.get("ok") is False and e["errors"][0]["file"] == missing and
      e["errors"][0]["line"] is None, f"an unreadable profile is listed, line null: {e}")
# a file name that is not UTF-8 still gives JSON (RFC 8259 requires UTF-8):
# '?' for its bytes above ASCII
odd = os.path.join(tmp, os.fsdecode(b"b\xffd.yaml"))
shutil.copy(BAD[0], odd)
rc, out, _ = plumb("lint", odd, "--format", "json")
e = json.loads(out)["profiles"][0] if out.startswith("{") else {}
check(rc == 2 and e.get("name") == os.path.join(tmp, "b?d.yaml"),
      f"a name that is not UTF-8 is written with '?': {e.get('name')!r}")
os.remove(odd)
# standard input is named <stdin>
with open(BAD[0], encoding="utf-8") as f:
    rc, out, _ = plumb("lint", "-", "--format", "json", stdin=f)
e = json.loads(out)["profiles"][0] if out.startswith("{") else {}
check(rc == 2 and e.get("name") == "<stdin>" and e["errors"][0]["file"] == "<stdin>" and
      e["errors"][0]["line"] == expected(BAD[0])[0], f"'-' is <stdin> in the report: {e}")

# ---- CSV --------------------------------------------------------------------
rc, out, _ = plumb("lint", *args, "--format", "csv")
comments = [l[2:] for l in out.splitlines() if l.startswith("# ")]
rows = csv_rows(out)
check(rc == 2 and out.startswith("# ") and comments[:len(CAUTIONS)] == CAUTIONS,
      f"CSV: exit 2, the cautions as leading '# ' lines: {comments}")
check(rows and list(rows[0]) == ["profile", "ok", "file", "line", "column", "key", "message"],
      f"CSV columns: {list(rows[0]) if rows else None}")
check([r["profile"] for r in rows] == args and rows[0]["ok"] == "true" and
      rows[0]["message"] == "" and all(r["ok"] == "false" for r in rows[1:]),
      f"CSV: a row per good profile and per error: {rows}")
check([(r["file"], int(r["line"]), int(r["column"]), r["key"], r["message"])
       for r in rows[1:]] == flat, "CSV errors are the JSON's (and the text's)")

# ---- --units us -------------------------------------------------------------
rc, _, err = plumb("lint", *BAD, "tests/bad/air-temperature-kelvin-for-celsius.yaml",
                   "--units", "us")
hi = math.floor(340.294 / 0.3048 * 100) / 100  # 6 figures, toward the inside
check(rc == 2 and f"[US: 0 ft/s .. {hi:.2f} ft/s]" in err,
      f"--units us: the subsonic limit in ft/s ({hi:.2f}) after the message: {err}")
lo_f, hi_f = 1.8 * 150 - 459.67, 1.8 * 400 - 459.67
check(f"[US: {lo_f:.2f} °F .. {hi_f:.2f} °F]" in err,
      f"--units us: 150 K .. 400 K is {lo_f:.2f} .. {hi_f:.2f} degF: {err}")
check("[US: > 0 lb]" in err and "payload.drag.cd: must be 0 .. 10 (0: drag-free), found '-0.2'\n"
      in err, f"--units us: > 0 kg is > 0 lb; a bare number gets nothing: {err}")
rc, out, _ = plumb("lint", *BAD, "--units", "us", "--format", "csv")
check(rc == 2 and any(r["message"].endswith(f"[US: 0 ft/s .. {hi:.2f} ft/s]")
                      for r in csv_rows(out)), "--units us: CSV messages carry the US limits")
rc, _, err = plumb("lint", *BAD)
check(rc == 2 and "[US:" not in err, "SI: no US limits")

# ---- -o -----------------------------------------------------------------------
for name, fmt in (("r.json", "json"), ("r.csv", "csv"), ("r.txt", "text")):
    dest = os.path.join(tmp, name)
    rc, out, err = plumb("lint", *args, "-o", dest, "--quiet")
    _, want, _ = plumb("lint", *args, "--format", fmt)
    got = open(dest, encoding="utf-8").read() if os.path.exists(dest) else None
    check(rc == 2 and out == "" and got == want,
          f"-o {name}: exit 2, the {fmt} report whole in the file, nothing on stdout ({rc})")
    os.remove(dest) if got is not None else None
check(os.listdir(tmp) == [], f"-o leaves no temporary file: {os.listdir(tmp)}")

prof = os.path.join(tmp, "p.yaml")
shutil.copy(GOOD, prof)
before = open(prof, encoding="utf-8").read()
rc, _, err = plumb("lint", prof, "-o", prof)
check(rc == 2 and open(prof, encoding="utf-8").read() == before and "overwrite" in err,
      f"-o naming a profile linted: usage error, the profile untouched ({err})")
os.remove(prof)

# ---- an unknown criterion among the profile's other errors --------------------
# A profile with a bare-number mass, two unknown criterion ids and a wind
# speed in a length: every error in one run, in file order, each at the
# line and column where its text starts in the file (found here in the
# text), in all three formats; an unknown id's message is the one `plumb
# fall` gives for it once the rest is fixed (the nearest ids), and the
# second id keeps its own index, criteria[2].
MIXED = """name: crane hook block
payload:
  mass: 2.385
  drag: {cd: 0.9, area: 0.021 m^2}
release:
  height: 31.6 m
criteria: [eu-c9, us-part107-cat3, en397]
wind:
  profile: uniform
  speed: 7.3 furlong
  from: 270 deg
"""
mixed = os.path.join(tmp, "mixed.yaml")
with open(mixed, "w", encoding="utf-8") as f:
    f.write(MIXED)


def place(text, needle):
    """1-based line and column where needle first starts in text."""
    for i, l in enumerate(text.splitlines()):
        if needle in l:
            return i + 1, l.index(needle) + 1
    return None


want = [(mixed,) + place(MIXED, "2.385") + ("payload.mass",),
        (mixed,) + place(MIXED, "eu-c9") + ("criteria[0]",),
        (mixed,) + place(MIXED, "en397") + ("criteria[2]",),
        (mixed,) + place(MIXED, "7.3 furlong") + ("wind.speed",)]
fixed = os.path.join(tmp, "fixed.yaml")
with open(fixed, "w", encoding="utf-8") as f:
    f.write(MIXED.replace("2.385\n", "2.385 kg\n").replace("7.3 furlong", "7.3 m/s"))
fall_msgs = []
for ids in ("[eu-c9]", "[en397]"):
    rc, _, err = plumb("fall", fixed, "--set", f"criteria={ids}")
    m = re.search(r": criteria\[0\]: (unknown criterion .*)$", err, re.M)
    fall_msgs.append(m.group(1) if rc == 2 and m else None)
check(all(fall_msgs) and "did you mean 'eu-c1-80j'?" in fall_msgs[0] and
      "'en397-penetration-29j' or 'en397-shock-49j'" in fall_msgs[1],
      f"plumb fall names the nearest ids of an unknown criterion: {fall_msgs}")
rc_t, out_t, err_t = plumb("lint", mixed)
text_errs = stderr_errors(err_t)
check(rc_t == 2 and out_t == "" and [e[:4] for e in text_errs] == want,
      f"text: the bad mass, both unknown ids and the wind speed, in file order at their "
      f"places: {text_errs} / {want}")
check(len(text_errs) == 4 and [text_errs[1][4], text_errs[2][4]] == fall_msgs,
      f"text: an unknown id's message is plumb fall's: {[e[4] for e in text_errs[1:3]]}")
rc, out, _ = plumb("lint", mixed, "--format", "json")
d = json.loads(out) if out.startswith("{") else {}
jerrs = [(e["file"], e["line"], e["column"], e["key"], e["message"])
         for p in d.get("profiles", []) for e in p.get("errors", [])]
check(rc == 2 and jerrs == text_errs and d["profiles"][0]["listed_all"] is True,
      f"JSON: the same errors as the text, in order: {jerrs}")
rc, out, _ = plumb("lint", mixed, "--format", "csv")
cerrs = [(r["file"], int(r["line"]), int(r["column"]), r["key"], r["message"])
         for r in csv_rows(out)]
check(rc == 2 and cerrs == text_errs, f"CSV: the same errors as the text, in order: {cerrs}")
# block style, read from standard input; the unknown ids alone
with open(fixed, encoding="utf-8") as f:
    block = f.read().replace("criteria: [eu-c9, us-part107-cat3, en397]",
                             "criteria:\n  - eu-c9\n  - us-part107-cat3\n  - en397")
blockf = os.path.join(tmp, "block.yaml")
with open(blockf, "w", encoding="utf-8") as f:
    f.write(block)
with open(blockf, encoding="utf-8") as f:
    rc, _, err = plumb("lint", "-", stdin=f)
got = [e[:4] for e in stderr_errors(err)]
check(rc == 2 and got == [("<stdin>",) + place(block, "eu-c9") + ("criteria[0]",),
                          ("<stdin>",) + place(block, "en397") + ("criteria[2]",)],
      f"block list from stdin: both unknown ids, each at its place: {got}")
# the good ids alone: the profile is good
rc, _, err = plumb("lint", fixed, "--set", "criteria=[us-part107-cat3]")
check(rc == 0 and err == "", f"known ids only: exit 0 ({rc}, {err})")

# ---- usage errors -------------------------------------------------------------
dest = os.path.join(tmp, "x.json")
rc, out, err = plumb("lint", GOOD, "--format", "xml", "-o", dest)
check(rc == 2 and out == "" and "--format must be text, json or csv, found 'xml'" in err and
      not os.path.exists(dest), f"unknown --format: exit 2, says what it takes, no file ({err})")
rc, out, err = plumb("lint", GOOD, "--format", "csv", "-o", dest)
check(rc == 2 and not os.path.exists(dest) and "make them agree" in err,
      f"-o x.json with --format csv: usage error, no file ({err})")
rc, out, err = plumb("lint", "--format", "json")
check(rc == 2 and out == "" and "needs at least one PROFILE" in err, f"no PROFILE: exit 2 ({err})")
rc, out, err = plumb("lint", "--help")
check(rc == 0 and all(o in out for o in ("--format", "--units", "--output", "--quiet")) and
      "--units us" in out and "exit status is 2" in out,
      "--help lists the options, what --units us changes and the exit status")

finish()
