#!/usr/bin/python3
"""A fall with no terminal speed says there is none, in every format.

include/plumb/trajectory.h: a body has no terminal speed when it has no
drag, or so little that drag balances its weight at no speed up to
PLUMB_TERMINAL_MAX_M_S (1e6 m/s). `plumb fall` then prints "none" in text,
null in JSON (README: `terminal_speed_m_s` is null when there is none; the
steady descent speed under devices likewise), an empty CSV field, never a
huge number; the keys README.md "plumb fall" fixes stay.

Sources of the checked values:
  - work-energy theorem, no drag: v = sqrt(v0^2 + 2 g0 H), g0 = 9.80665
    m/s^2 (3rd CGPM, 1901). The clamp of tests/cli/profiles/thrown.yaml:
    v0 = (3, 0, -11) m/s, H = 12 m.
  - closed form v_t = sqrt(2 m g / (rho CdA)): for the clamp's 2.31 kg on
    CdA 0.8 x 1e-18 m^2 in sea-level air (rho 1.2250 kg/m^3, U.S. Standard
    Atmosphere 1976, Table I, transcribed) it is 6.8e9 m/s, above 1e6 m/s.
Usage: no_terminal_speed.py PATH/TO/plumb   (prints `cli: N passed, N failed`)
"""
import csv
import io
import json
import math
import os
import re
import sys

sys.path.insert(0, os.path.join(os.path.dirname(os.path.abspath(__file__)), "lib"))
from plumbcli import HERE, check, finish, plumb  # noqa: E402

THROWN = os.path.join(HERE, "profiles", "thrown.yaml")
CANOPY = os.path.join(HERE, "profiles", "canopy.yaml")
G0 = 9.80665
V_DRAG_FREE = math.sqrt(3.0 ** 2 + 11.0 ** 2 + 2.0 * G0 * 12.0)
FIXED_KEYS = ("impact", "terminal_speed_m_s", "apex_m", "drag_free", "criteria", "cautions")


def numbers_above_bound(line):
    """The numbers in a line above 1e6 (the bound itself may be named)."""
    return [x for x in re.findall(r"\d+(?:\.\d+)?(?:e[+-]?\d+)?", line.replace(",", ""))
            if float(x) > 1e6]


for label, sets, tiny in [
        ("no drag (cd 0)", ["--set", "payload.drag.cd=0"], False),
        ("CdA 8e-19 m^2", ["--set", "payload.drag.area=1e-18 m^2"], True)]:
    rc, out, err = plumb("fall", THROWN, *sets)
    check(rc == 0, f"{label}: exit 0 (got {rc}: {err.strip()})")
    line = next((ln for ln in out.splitlines() if ln.strip().startswith("terminal speed")), "")
    check(line.split(None, 2)[2:3] and line.split(None, 2)[2].startswith("none"),
          f"{label}: text says there is no terminal speed: {line!r}")
    check(not tiny or "too little drag" in line, f"{label}: text says why: {line!r}")
    check(tiny or "without drag" in line, f"{label}: text says why: {line!r}")
    check(line and not numbers_above_bound(line),
          f"{label}: no number above 1e6 in the line: {numbers_above_bound(line)}")

    rc, out, err = plumb("fall", THROWN, *sets, "--format", "json")
    d = json.loads(out) if rc == 0 and out else {}
    check(d.get("terminal_speed_m_s", 0) is None, f"{label}: JSON terminal_speed_m_s is null")
    check(all(k in d for k in FIXED_KEYS), f"{label}: JSON keeps the fixed keys (README.md plumb fall)")
    v = d.get("impact", {}).get("speed_m_s", 0.0)
    check(abs(v - V_DRAG_FREE) <= 1e-9 * V_DRAG_FREE,
          f"{label}: lands at sqrt(v0^2 + 2 g H) = {V_DRAG_FREE} m/s (got {v})")

    rc, out, err = plumb("fall", THROWN, *sets, "--format", "csv")
    rows = list(csv.DictReader(io.StringIO("\n".join(
        ln for ln in out.splitlines() if not ln.startswith("#")))))
    check(rc == 0 and len(rows) == 1 and rows[0].get("terminal_speed_m_s") == "",
          f"{label}: CSV terminal_speed_m_s is empty")

# A canopy of CdS 0.78 x 7.9e-19 m^2 on a body without drag: no steady descent either.
sets = ["--set", "payload.drag.cd=0", "--set", "descent.diameter=1e-9 m"]
rc, out, err = plumb("fall", CANOPY, *sets)
check(rc == 0, f"tiny canopy: exit 0 (got {rc}: {err.strip()})")
line = next((ln for ln in out.splitlines() if ln.strip().startswith("steady descent")), "")
check(line.split(None, 2)[2:3] and line.split(None, 2)[2].startswith("none")
      and not numbers_above_bound(line),
      f"tiny canopy: text says there is no steady descent speed: {line!r}")
rc, out, err = plumb("fall", CANOPY, *sets, "--format", "json")
d = json.loads(out) if rc == 0 and out else {}
check(d.get("descent", {}).get("steady_speed_m_s", 0) is None,
      "tiny canopy: JSON descent.steady_speed_m_s is null")
check(d.get("terminal_speed_m_s", 0) is None, "tiny canopy: JSON terminal_speed_m_s is null")

# a body with drag keeps its figure: v_t = sqrt(2 m g / (rho Cd A)) at sea level
rc, out, err = plumb("fall", THROWN, "--format", "json")
d = json.loads(out) if rc == 0 and out else {}
vt = math.sqrt(2.0 * 2.31 * G0 / (1.2250 * 0.8 * 0.0093))
got = d.get("terminal_speed_m_s") or 0.0
check(abs(got - vt) <= 1e-4 * vt, f"the clamp's terminal speed is {vt:.2f} m/s (got {got})")

finish()
