#!/usr/bin/python3
"""A criterion whose figure is not confirmed in its source stays marked
"from memory" in every report that names it, in every format: fall
(single and inventory), sweep, zone and limit; text, CSV and JSON.

The criterion used is en397-shock-49j, whose file says status: memory (the
figure of EN 397:2012+A1:2012 has not been confirmed against the standard).
Usage: criteria_status.py PATH/TO/plumb   (prints `cli: N passed, N failed`)
"""
import json
import os
import sys
import subprocess

sys.path.insert(0, os.path.join(os.path.dirname(os.path.abspath(__file__)), "lib"))
from plumbcli import HERE, PLUMB, ROOT, check, finish, plumb  # noqa: E402

THROWN = os.path.join(HERE, "profiles", "thrown.yaml")
INVENTORY = os.path.join(HERE, "profiles", "inventory.yaml")
CRIT = "criteria=[en397-shock-49j]"
UNC = "uncertainty={payload.drag.cd: {uniform: [0.7, 0.9]}}"
TEXT_NOTE = "figure from memory, not confirmed in the source"


def flat(text):
    return " ".join(text.split())


commands = {
    "fall": ["fall", THROWN, "--set", CRIT],
    "fall inventory": ["fall", INVENTORY, "--set", CRIT],
    "sweep": ["sweep", THROWN, "--set", CRIT, "--vary", "release.height=6m:12m:6m"],
    "zone": ["zone", THROWN, "--set", CRIT, "--set", UNC, "--samples", "2000", "--threads", "1"],
    "limit": ["limit", THROWN, "--find", "payload.mass", "--energy-max", "en397-shock-49j"],
}


def json_statuses(name, d):
    """Every status the JSON gives for the criterion."""
    if name == "fall":
        return [c["status"] for c in d["criteria"]]
    if name == "fall inventory":
        return [c["status"] for it in d["items"] for c in it["criteria"]]
    if name == "sweep":
        return [c["status"] for r in d["rows"] for c in r["criteria"]]
    if name == "zone":
        zones = [d["zone"]] if "zone" in d else [it["zone"] for it in d["items"]]
        return [x["status"] for z in zones for x in z["exceedance"]]
    return [d["limit"]["criterion_status"]]


for name, args in commands.items():
    rc, out, err = plumb(*args)
    check(rc == 0 and TEXT_NOTE in flat(out), f"{name} text marks the figure from memory ({err.strip()})")
    rc, out, err = plumb(*args, "--format", "csv")
    check(rc == 0 and "en397-shock-49j" in out and "status memory" in out,
          f"{name} CSV gives 'status memory' ({err.strip()})")
    rc, out, err = plumb(*args, "--format", "json")
    try:
        got = json_statuses(name, json.loads(out))
    except (ValueError, KeyError, TypeError) as e:
        got = [f"no status: {e!r}"]
    check(rc == 0 and got and all(s == "memory" for s in got), f"{name} JSON status: {got}")

# a new user runs the program from another directory, with no
# PLUMB_CRITERIA_DIR: the criteria are still found (the ones beside the
# program, installed with it, or of the source tree it was built from)
import tempfile  # noqa: E402
with tempfile.TemporaryDirectory(prefix="plumb-elsewhere.", dir=os.environ.get("TMPDIR")) as where:
    env = {k: v for k, v in os.environ.items() if k != "PLUMB_CRITERIA_DIR"}
    r = subprocess.run([os.path.abspath(PLUMB), "fall",
                        os.path.join(os.path.abspath(ROOT), "profiles", "demo", "drone-release.yaml")],
                       capture_output=True, text=True, cwd=where, env=dict(env, LC_ALL="C"))
    check(r.returncode == 0 and "us-part107-cat3" in r.stdout,
          f"run from another directory finds the criteria: exit {r.returncode} {r.stderr.strip()}")

# README.md "Criteria": a figure in foot-pounds is given in joules too, to
# the digits shown, by 1 ft·lbf = 1.3558179483 J (NIST SP 811 (2008), B.8:
# 0.3048 m x 0.45359237 kg x 9.80665 m/s^2); a report prints the limit
# rounded down to 4 figures (README.md "Criteria"), so both are checked
# against the closed form and the README and the report cannot disagree.
import math  # noqa: E402
import re  # noqa: E402
FT_LBF_J = 0.3048 * 0.45359237 * 9.80665
with open(os.path.join(ROOT, "README.md"), encoding="utf-8") as f:
    readme = f.read()
rows = re.findall(r"^\| `([a-z0-9-]+)` \| \w[\w-]* \| ([\d.]+) ft·lbf \(([\d.]+) J\) \|", readme, re.M)
check(len(rows) >= 3, f"README's criteria table has its ft·lbf rows: {rows}")
for cid, ftlbf, joules in rows:
    dec = len(joules.split(".")[1]) if "." in joules else 0
    exact = float(ftlbf) * FT_LBF_J
    check(f"{exact:.{dec}f}" == joules,
          f"README: {cid}: {ftlbf} ft·lbf is {exact:.6f} J, the table says {joules} J")
    rc, out, err = plumb("fall", THROWN, "--set", f"criteria=[{cid}]")
    mag = math.floor(math.log10(exact))
    down = math.floor(exact / 10 ** (mag - 3)) * 10 ** (mag - 3)
    want = f"limit {down:.{max(0, 3 - mag)}f} J"
    check(rc == 0 and want in flat(out), f"fall names {cid}'s limit rounded down: {want!r}")
    # and the table's figure cut to the report's 4 figures is the report's
    # (78.64 J in the table beside 78.63 J in every report read as two limits)
    shown = math.floor(float(joules) / 10 ** (mag - 3) + 1e-9) * 10 ** (mag - 3)
    check(f"limit {shown:.{max(0, 3 - mag)}f} J" == want,
          f"README's {joules} J reads as the report's {want!r} cut to 4 figures")

finish()
