#!/usr/bin/python3
"""`plumb lint --format json|csv`, `--units us` and `-o` (as
the other commands take them; README.md "plumb lint" and
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
report = {"json": out}  # for the -o checks below: the same command, run once
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

# ---- text: the cautions too (README.md "Cautions": every report, every format)
# after the ok lines, each caution's words in the text (wrapped, so compared
# with the whitespace folded)
text_flat = " ".join(out_t.split())
check(out_t.startswith(f"{GOOD}: ok\n") and "\nCautions\n" in out_t and
      all(" ".join(c.split()) in text_flat for c in CAUTIONS),
      f"text: the ok lines, then the cautions: {out_t[:300]!r}")
# ---- CSV --------------------------------------------------------------------
rc, out, _ = plumb("lint", *args, "--format", "csv")
report["csv"] = out
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
# a mass is > 0 kg and at most 1e8 kg (README.md "Profile keys"): 1e8 kg
# is 220462262.2 lb (NIST SP 811, 2008, B.8: 1 lb = 0.45359237 kg exactly),
# 6 figures toward the inside
mass_hi = math.floor(1e8 / 0.45359237 / 1e3) * 1e3
check(f"[US: > 0 lb and <= {mass_hi:.6g} lb]" in err and
      "payload.drag.cd: must be 0 .. 10 (0: drag-free), found '-0.2'\n"
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
    want = report[fmt] if fmt in report else plumb("lint", *args, "--format", fmt)[1]
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
check(rc_t == 2 and ": ok\n" not in out_t and [e[:4] for e in text_errs] == want,
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

# ---- what lint goes on past, and what it leaves out ----------------------------
# README.md "plumb lint": every error of a profile, in file order, leaving
# out those that follow from one listed. Each case is checked in the three
# formats (the JSON and CSV errors are the text's); the places are found
# in the profile's text here.


def lint_all(path, what):
    """The text errors of `plumb lint path`, once the JSON and CSV are
    checked to list the same ones, each format exiting 2."""
    rc_t, out_t, err_t = plumb("lint", path)
    errs = stderr_errors(err_t)
    rc_j, out_j, _ = plumb("lint", path, "--format", "json")
    d = json.loads(out_j) if out_j.startswith("{") else {}
    jerrs = [(e["file"], e["line"], e["column"], e["key"], e["message"])
             for p in d.get("profiles", []) for e in p.get("errors", [])]
    rc_c, out_c, _ = plumb("lint", path, "--format", "csv")
    cerrs = [(r["file"], int(r["line"]), int(r["column"]), r["key"], r["message"])
             for r in csv_rows(out_c) if r["ok"] == "false"]
    check((rc_t, rc_j, rc_c) == (2, 2, 2) and ": ok\n" not in out_t and
          out_t.startswith("\nCautions\n") and jerrs == errs and cerrs == errs,
          f"{what}: exit 2 in text, JSON and CSV, the same errors in each: "
          f"{(rc_t, rc_j, rc_c)} {errs} / {jerrs} / {cerrs}")
    return errs


def write(name, text):
    path = os.path.join(tmp, name)
    with open(path, "w", encoding="utf-8") as f:
        f.write(text)
    return path


# the criteria directory's ids: its files' names (README.md "Criteria":
# "its id is the file name")
CRIT_IDS = sorted(f[:-5] for f in os.listdir("profiles/criteria") if f.endswith(".yaml"))

# 1. an air section in error does not end the check: the pressure missing
# and the temperature refused (500 degF is 533 K, above the 400 K of the
# key's range) are listed, then the wind speed (800 mph, 357.6 m/s, above
# the 340.294 m/s of sea level) and both unknown criterion ids
PROBE = """name: lint probe
payload: {mass: 2 kg, shape: {kind: sphere, diameter: 0.1 m}}
release: {height: 20 m}
atmosphere: {model: surface, temperature: 500 degF}
wind: {speed: 800 mph}
criteria: [foo, bar-baz]
"""
probe = write("probe.yaml", PROBE)
got = [e[1:4] for e in lint_all(probe, "an air section in error")]
want = [place(PROBE, "{model: surface") + ("atmosphere.pressure",),
        place(PROBE, "500 degF") + ("atmosphere.temperature",),
        place(PROBE, "800 mph") + ("wind.speed",),
        place(PROBE, "foo") + ("criteria[0]",),
        place(PROBE, "bar-baz") + ("criteria[1]",)]
check(got == want, f"the air's two errors, then the wind speed and both ids: {got} / {want}")
# an air table of one row, which no stand-in mends: its error, then the
# other sections' errors
TABLE = PROBE.replace("{model: surface, temperature: 500 degF}",
                      "{model: table, table: [{altitude: 0 m, density: 1.225 kg/m^3}]}")
table = write("table.yaml", TABLE)
got = [e[1:4] for e in lint_all(table, "an air table of one row")]
want = [place(TABLE, "[{altitude") + ("atmosphere.table",),
        place(TABLE, "800 mph") + ("wind.speed",),
        place(TABLE, "foo") + ("criteria[0]",),
        place(TABLE, "bar-baz") + ("criteria[1]",)]
check(got == want, f"an air table of one row, then the other sections: {got} / {want}")

# a descent whose deploy is no map, which no stand-in mends: left out after
# its error, the check goes on; the uncertainty of its cd, given in the
# file, is not then "not given"
DESC = """name: descent left out
payload: {mass: 2.385 kg, drag: {cd_area: 0.0113 m^2}}
release: {height: 31.6 m}
descent: {kind: parachute, cd: 0.8, area: 1.2 m^2, deploy: 5}
wind: {speed: 800 mph}
uncertainty:
  descent.cd: {uniform: [0.7, 0.9]}
criteria: [foo]
"""
desc = write("desc.yaml", DESC)
got = [e[1:4] for e in lint_all(desc, "a descent left out")]
want = [place(DESC, "5}") + ("descent.deploy",),
        place(DESC, "800 mph") + ("wind.speed",),
        place(DESC, "foo") + ("criteria[0]",)]
check(got == want, f"a deploy that is no map, then the wind and the id, not the cd's "
      f"uncertainty: {got} / {want}")

# a deploy that is no map, in a section that has another error: an empty
# deploy map, its trigger stood in, stands in for it, so that the rest
# of the descent is still checked (fill_time and fill_constant together,
# README.md "Profile keys": not with fill_constant); of two devices, the
# second's deploy height above the release (below < release.height)
DEP = """name: deploy no map
payload: {mass: 2.385 kg, drag: {cd_area: 0.0113 m^2}}
release: {height: 131.6 m}
descent: {kind: parachute, cd: 0.8, area: 1.2 m^2, deploy: 5, fill_time: 1 s, fill_constant: 8}
"""
got = [e[1:4] for e in lint_all(write("dep.yaml", DEP), "a deploy that is no map")]
want = [place(DEP, "5, fill") + ("descent.deploy",),
        place(DEP, "fill_constant") + ("descent.fill_constant",)]
check(got == want, f"a deploy that is no map, then the descent's own other error: {got} / {want}")
DEP2 = """name: two devices
payload: {mass: 2.385 kg, drag: {cd_area: 0.0113 m^2}}
release: {height: 131.6 m}
descent:
  - {kind: drogue, cd: 0.8, area: 0.2 m^2, deploy: 5}
  - {kind: parachute, cd: 0.8, area: 1.2 m^2, deploy: {below: 200 m}}
"""
got = [e[1:4] for e in lint_all(write("dep2.yaml", DEP2), "a first device's deploy no map")]
want = [place(DEP2, "5}") + ("descent[0].deploy",),
        place(DEP2, "200 m") + ("descent[1].deploy.below",)]
check(got == want, f"the first device's deploy, then the second device's: {got} / {want}")
# an optional map that is no map is left out, not stood in (its required
# keys would then stand in for an aircraft of our making): the release's
# other error (a speed without its heading) is still found
DW = """name: downwash no map
payload: {mass: 2.385 kg, drag: {cd_area: 0.0113 m^2}}
release:
  height: 31.6 m
  downwash: [25 kg, 1.2 m^2]
  velocity: {speed: 3 m/s}
"""
got = [e[1:4] for e in lint_all(write("dw.yaml", DW), "a downwash that is no map")]
want = [place(DW, "[25 kg") + ("release.downwash",),
        place(DW, "{speed") + ("release.velocity.heading",)]
check(got == want, f"a downwash that is no map, then the velocity's heading: {got} / {want}")

# a site that is no map, left out after its error: a point given by
# latitude and longitude (release.position, zone.target) then "needs the
# site's: site.latitude and site.longitude", a consequence of the site
# left out, not an error of the file: not listed; the check goes on past
# it to the wind's roughness, refused against its reference height (the
# log law holds above the roughness length, README.md "Profile keys":
# roughness < reference_height)
SITE = """name: site left out
payload: {mass: 2.385 kg, drag: {cd_area: 0.0113 m^2}}
release:
  height: 31.6 m
  position: {latitude: 54.2001 deg, longitude: -2.6101 deg}
site: [54.2 deg, -2.61 deg]
zone:
  samples: 1000
  target: {latitude: 54.2002 deg, longitude: -2.6102 deg}
wind: {profile: log, speed: 5 m/s, reference_height: 10 m, roughness: 20 m}
"""
site = write("site.yaml", SITE)
got = [e[1:4] for e in lint_all(site, "a site left out")]
want = [place(SITE, "[54.2 deg") + ("site",),
        place(SITE, "20 m}") + ("wind.roughness",)]
check(got == want, f"a site that is no map, then the wind's roughness, not the points that "
      f"need the site: {got} / {want}")

# an air table whose second altitude is refused (0 m after 100 m): the
# stand-in that sets it aside gives the table a span the file does not
# ("100 m .. 1000 m"), which is not listed: the altitude alone
TAB = """name: table out of order
payload: {mass: 2.385 kg, drag: {cd_area: 0.0113 m^2}}
release: {height: 27.4 m}
atmosphere:
  model: table
  table:
    - {altitude: 100 m, density: 1.2 kg/m^3}
    - {altitude: 0 m, density: 1.19 kg/m^3}
"""
tab = write("tab.yaml", TAB)
errs = lint_all(tab, "an air table out of order")
check([e[1:4] for e in errs] == [place(TAB, "0 m, density: 1.19") +
                                 ("atmosphere.table[1].altitude",)],
      f"a table out of order: the altitude alone, no span of a stand-in: {errs}")

# items written but refused (an empty list, a map where a list of maps is
# wanted): "payload" then missing only follows from setting items aside (a
# profile has payload: or items:, README.md "plumb lint"), so it is not
# listed, and the check goes on with the other sections (the 800 mph wind
# speed, above the 340.294 m/s of sea level)
ITEMS = """name: items refused
items: []
release: {height: 31.6 m}
wind: {speed: 800 mph}
"""
for name, value, key in (("items-empty", "[]", "items"), ("items-map", "{a: 1}", "items")):
    text = ITEMS.replace("items: []", f"items: {value}")
    got = [e[1:4] for e in lint_all(write(name + ".yaml", text), f"items: {value}")]
    want = [place(text, value) + (key,), place(text, "800 mph") + ("wind.speed",)]
    check(got == want, f"items: {value}: its own error and the wind's, not 'payload' "
          f"missing: {got} / {want}")

# 2. a misspelt key that meant one of its map's alternatives: the other
# alternative then missing is its consequence, not listed; the misspelt
# key's value is checked under the name meant (a bare 20 where a length
# is wanted)
ALT = """name: alternatives
payload: {mass: 2.385 kg, drag: {cd_area: 0.0113 m^2}}
descent: {kind: parachute, cd: 0.8, area: 1.2 m^2, deploy: {below: 20 m}}
release: {height: 31.6 m}
"""
for name, text, typo, meant, more in (
        ("belw", ALT.replace("below:", "belw:"), "belw", "descent.deploy.belw", []),
        ("belw-bare", ALT.replace("below: 20 m", "belw: 20"), "belw", "descent.deploy.belw",
         [("20}", "descent.deploy.below")]),
        ("shap", ALT.replace("drag: {cd_area: 0.0113 m^2}",
                             "shap: {kind: sphere, diameter: 0.12 m}"), "shap", "payload.shap", []),
        ("cd_are", ALT.replace("cd_area:", "cd_are:"), "cd_are", "payload.drag.cd_are", []),
        ("diamter", ALT.replace("area: 1.2 m^2", "diamter: 1.24 m"), "diamter",
         "descent.diamter", [])):
    path = write(name + ".yaml", text)
    errs = lint_all(path, f"a misspelt '{typo}'")
    want = [place(text, typo) + (meant,)] + [place(text, n) + (k,) for n, k in more]
    check([e[1:4] for e in errs] == want and "did you mean" in errs[0][4],
          f"'{typo}': the misspelt key alone (and its value's own error), not the "
          f"alternative missing: {errs} / {want}")

# 3. an unknown id near no id: no did-you-mean, the directory's ids once
# (the profile without its air section, which lint listed in full before)
NOATM = PROBE.replace("atmosphere: {model: surface, temperature: 500 degF}\n", "")
noatm = write("noatm.yaml", NOATM)
errs = lint_all(noatm, "unknown ids near none")
ids = [e for e in errs if e[3].startswith("criteria[")]
check(len(ids) == 2 and CRIT_IDS and
      all("did you mean" not in e[4] and all(e[4].count(i) == 1 for i in CRIT_IDS) for e in ids),
      f"foo, bar-baz: no did-you-mean, each of the {len(CRIT_IDS)} ids once: {ids}")
# ... while a near one still names only the nearest (eu-c2: 2 edits from
# eu-c1, within PLUMB_SUGGEST_MAX_EDITS 3 and half its length)
near = write("near.yaml", NOATM.replace("[foo, bar-baz]", "[eu-c2]"))
errs = lint_all(near, "an id near one")
check(len(errs) == 2 and "did you mean 'eu-c1-80j'?" in errs[1][4] and
      errs[1][4].count("'eu-c1-80j'") == 1 and "'us-part107-cat3'" not in errs[1][4],
      f"eu-c2: did you mean 'eu-c1-80j' alone: {errs[-1:]}")

# 4. a former id is told its new one and why. The renames are those the
# criteria files state: z89-type2-30j.yaml "was called z89-type2-31j" (31 J
# rounded up from 30.625 J); ddesb-fragment-58ftlbf.yaml's limit "never the
# rounded 79 J"
with open("profiles/criteria/z89-type2-30j.yaml", encoding="utf-8") as f:
    z89 = f.read()
check("was called z89-type2-31j" in z89, "the Z89 file states its former id")
OLD = NOATM.replace("[foo, bar-baz]", "[z89-type2-31j, ddesb-fragment-79j]")
old = write("old.yaml", OLD)
errs = lint_all(old, "former ids")
msgs = {e[3]: e[4] for e in errs}
check(len(errs) == 3 and
      "criterion 'z89-type2-31j' was renamed 'z89-type2-30j'" in msgs.get("criteria[0]", "") and
      "lenient" in msgs.get("criteria[0]", "") and
      "criterion 'ddesb-fragment-79j' was renamed 'ddesb-fragment-58ftlbf'" in
      msgs.get("criteria[1]", "") and "79 J" in msgs.get("criteria[1]", ""),
      f"former ids: renamed to what, and why: {msgs}")
rc, _, err = plumb("fall", write("old-fall.yaml", """name: former id
payload: {mass: 2.385 kg, drag: {cd_area: 0.0113 m^2}}
release: {height: 31.6 m}
criteria: [z89-type2-31j]
"""))
check(rc == 2 and "was renamed 'z89-type2-30j'" in err,
      f"plumb fall refuses a former id with the same words, exit 2 ({rc}, {err})")

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
