#!/usr/bin/python3
"""Number layout: a warning's number stays on the line of its unit or %,
and an inventory's drift column is formatted as a single fall's drift.

README.md "plumb fall": the text keeps to 80 columns and wraps sentences;
a number and its unit stay on one line (textout.h, wrapped), and a
percent sign is the number's as a unit is (SI Brochure, 9th ed., 2019,
5.4.7: "25 %", a space before %). A canopy still filling at impact
gives a warning with "(29.2 %)" that was broken as "(29.2" / "%)".
A fall's drift is given to 4 significant figures, "none" below half the
last digit shown (1 cm): the kit's table printed "8.57" and "0.00" with
2 fixed decimals where the single fall says "8.572 ft" and "none".
Usage: number_layout.py PATH/TO/plumb   (prints `cli: N passed, N failed`)
"""
import json
import math
import os
import re
import sys

sys.path.insert(0, os.path.join(os.path.dirname(os.path.abspath(__file__)), "lib"))
from plumbcli import HERE, check, finish, plumb  # noqa: E402

LATE = os.path.join(HERE, "profiles", "canopy-late.yaml")
KIT = os.path.join(HERE, "profiles", "inventory.yaml")
UNITS = r"(%|(?:s|m|ft|J|N|lbf|kg|lb|mph|kn|m/s|ft/s|m²|ft²)\b)"

# a late canopy (deploy after 1.9 s, 1.5 s fill) over heights that put its
# "(N %)" at every place of the line
for h in [25 + 0.5 * k for k in range(30)]:
    for units in ("si", "us"):
        rc, out, err = plumb("fall", LATE, "--set", "descent.deploy.after=1.9 s",
                             "--set", "descent.fill_time=1.5 s", "--set", f"release.height={h} m",
                             "--units", units)
        check(rc == 0, f"{h} m {units}: exit 0 (got {rc}: {err.strip()})")
        lines = out.splitlines()
        check(any("fill time" in ln for ln in lines), f"{h} m {units}: the filling warning is given")
        split = [(a, b) for a, b in zip(lines, lines[1:])
                 if re.search(r"[0-9]$", a) and re.match(r"\s+" + UNITS, b)]
        check(not split, f"{h} m {units}: no number is parted from its unit or %: {split[:1]}")

# the kit's drift column against each item's drift (JSON) as a single fall
# formats it: 4 significant figures in the report's unit, none below 1 cm
kit_json = {}
for units, unit_m in (("si", 1.0), ("us", 0.3048)):
    for wind in ("6.1 m/s", "0 m/s"):
        sets = ["--set", f"wind.speed={wind}", "--set", "release.velocity.east=0 m/s"] \
            if wind == "0 m/s" else []
        rc, out, err = plumb("fall", KIT, "--units", units, *sets)
        # the same JSON command for both unit systems (JSON is always SI):
        # run once per wind
        if wind not in kit_json:
            kit_json[wind] = plumb("fall", KIT, "--format", "json", *sets)
        rc2, js, err2 = kit_json[wind]
        check(rc == 0 and rc2 == 0, f"kit {units} wind {wind}: exit 0")
        if rc or rc2:
            continue
        items = json.loads(js)["items"]
        for n, it in enumerate(items, 1):
            row = next((ln for ln in out.splitlines()
                        if re.match(rf"^\s+{n} {re.escape(it['name'])}\b", ln)), "")
            cell = row.split()[-1] if row else ""
            d = it["impact"]["drift_m"]
            x = d / unit_m
            want = "none" if d < 0.005 else f"{x:.{max(0, 3 - math.floor(math.log10(x)))}f}"
            check(cell == want,
                  f"kit {units} wind {wind}: item {n} drift cell {cell!r}, the fall's {want!r}")

finish()
