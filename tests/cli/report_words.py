#!/usr/bin/python3
"""How reports word places and units (issue 9, "Reports that state what
they computed"):
  - no "0 m S": a coordinate that prints as zero has no south or west;
  - no bearing when there is no drift (text and CSV);
  - one spelling of square metres ("m²") in text and CSV, whatever the
    user typed ("m^2", "m2").
Sources: a fall with no wind and no release velocity has no horizontal
motion, so no drift and no direction (closed form: x(t) = 0); the SI
brochure (BIPM, 9th edition, 2019, section 5.4.3) writes the square metre
m², with a superscript.
Usage: report_words.py PATH/TO/plumb   (prints `cli: N passed, N failed`)
"""
import csv
import io
import os
import sys

sys.path.insert(0, os.path.join(os.path.dirname(os.path.abspath(__file__)), "lib"))
from plumbcli import HERE, check, finish, plumb  # noqa: E402

PROF = os.path.join(HERE, "profiles")
CANOPY = os.path.join(PROF, "canopy.yaml")
LIGHT = os.path.join(PROF, "light.yaml")
THROWN = os.path.join(PROF, "thrown.yaml")


# ---- no "0 m S" ----------------------------------------------------------------
# a target 0.1 mm south of the east axis prints as 0 m north/south: no S
rc, out, err = plumb("zone", THROWN, "--samples", "2000", "--threads", "1",
                     "--set", "uncertainty={payload.drag.cd: {uniform: [0.7, 0.9]}}",
                     "--target", "40m,-0.0001m")
check(rc == 0 and "Target 40.00 m E, 0 m N" in out and " 0 m S" not in out
      and " 0 m W" not in out, f"zone: no '0 m S' ({err.strip()}):\n{out[:1500]}")
rc, out, err = plumb("fall", THROWN, "--set", "release.position.north=-0.0001 m")
check(rc == 0 and "0.0001 m south of the planned drop point" in " ".join(out.split()),
      f"fall: a release 0.1 mm south says south ({err.strip()}):\n{out[-1800:]}")

# ---- no bearing without drift ----------------------------------------------------
rc, out, err = plumb("fall", LIGHT, "--format", "csv")
rows = list(csv.DictReader(io.StringIO("\n".join(l for l in out.splitlines() if not l.startswith("#")))))
check(rc == 0 and rows and rows[0]["drift_m"] == "0" and rows[0]["bearing_deg"] == "",
      f"fall CSV: no bearing for no drift ({rows[0] if rows else out})")
rc, out, err = plumb("fall", LIGHT)
check(rc == 0 and "drift      none" in out and "toward" not in out.split("Criteria")[0],
      "fall text: no bearing for no drift")
rc, out, err = plumb("sweep", LIGHT, "--vary", "release.height=10m:20m:10m")
body = out.split("\n\n")[1].splitlines()[2:] if rc == 0 else []
check(len(body) == 2 and all(l.split()[5] == "0" and l.split()[6] == "-" for l in body),
      "sweep text: drift 0 and bearing '-':\n" + "\n".join(body))
rc, out, err = plumb("sweep", LIGHT, "--vary", "release.height=10m:20m:10m", "--format", "csv")
rows = list(csv.DictReader(io.StringIO("\n".join(l for l in out.splitlines() if not l.startswith("#")))))
check(rc == 0 and len(rows) == 2 and all(r["bearing_deg"] == "" for r in rows),
      "sweep CSV: no bearing for no drift")

# ---- one spelling of square metres ---------------------------------------------------
runs = [
    ("fall", THROWN),
    ("sweep", CANOPY, "--vary", "descent.area=0.8m^2:1.2m^2:0.2m^2"),
    ("sweep", CANOPY, "--vary", "descent.area=0.8m2:1.2m2:0.2m2"),
    ("limit", CANOPY, "--find", "descent.area", "--speed-max", "5.5m/s"),
    ("zone", CANOPY, "--samples", "2000", "--threads", "1",
     "--set", "uncertainty={descent.area: {uniform: [0.8 m^2, 1.1 m^2]}}"),
]
for args in runs:
    for fmt in ("text", "csv"):
        rc, out, err = plumb(*args, "--format", fmt)
        odd = [s for s in ("m^2", "m2 ", "m2,", "m2)", "sq m", "m**2") if s in out]
        # fall and zone CSV name no area; everything else shows one
        shown = "m²" in out or (fmt == "csv" and args[0] in ("fall", "zone"))
        check(rc == 0 and shown and not odd,
              f"{' '.join(args[:1])} {fmt}: square metres spelt {odd} ({err.strip()})")

finish()
