#!/usr/bin/python3
"""How reports word places and units (a report states what it
computed, no more):
  - no "0 m S": a coordinate that prints as zero has no south or west;
  - no bearing when there is no drift (text and CSV; 0 in JSON, which
    keeps the key a number, below the 5 mm the text calls none), nor for
    a zone's ellipse when every sample lands on one point (text "none",
    CSV empty, JSON null);
  - one spelling of square metres ("m²") in text and CSV, whatever the
    user typed ("m^2", "m2");
  - a count of one takes the singular: "1 step", "1 sample", never
    "1 steps" (English grammar).
Sources: a fall with no wind and no release velocity has no horizontal
motion, so no drift and no direction (closed form: x(t) = 0); the SI
brochure (BIPM, 9th edition, 2019, section 5.4.3) writes the square metre
m², with a superscript.
Usage: report_words.py PATH/TO/plumb   (prints `cli: N passed, N failed`)
"""
import csv
import io
import json
import os
import re
import shutil
import sys
import tempfile

sys.path.insert(0, os.path.join(os.path.dirname(os.path.abspath(__file__)), "lib"))
from plumbcli import HERE, check, finish, plumb  # noqa: E402

PROF = os.path.join(HERE, "profiles")
CANOPY = os.path.join(PROF, "canopy.yaml")
LIGHT = os.path.join(PROF, "light.yaml")
THROWN = os.path.join(PROF, "thrown.yaml")


# ---- no "0 m S" ----------------------------------------------------------------
# a target 0.1 mm south of the east axis prints as 0 m north/south: no S
# 500 samples in the zones below: a round count over the 490 that bound
# the landing polygon at 99 % and 95 % confidence (100 fix its centre,
# 390 are counted against it; plumb's own message at 400, which leaves
# the polygon open and its axis_bearing_deg out of the JSON checked
# below); the words checked (no "0 m S", "none", the bearings, the
# spelling of m²) do not depend on how many more.
rc, out, err = plumb("zone", THROWN, "--samples", "500", "--threads", "1",
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

# JSON keeps bearing_deg a number (README.md "plumb fall"): 0 for a drift
# the text calls none, below 0.005 m. A wind of 1.37 mm/s
# from the north moves a fall from rest at most w T (its horizontal speed
# never exceeds the wind's: drag pulls it toward the air's velocity), under
# 5 mm, but not nothing; 2.3 m/s moves it due south, bearing 180 (JSON
# once gave 180 for the negligible drift too).
def fall_json(*args):
    rc, out, err = plumb("fall", LIGHT, "--set", "wind.from=N", *args, "--format", "json")
    return json.loads(out)["impact"] if rc == 0 else {}
w = 0.00137
i = fall_json("--set", f"wind.speed={w} m/s")
check(i and 0.0 < i["drift_m"] <= w * i["time_s"] < 0.005 and i["bearing_deg"] == 0,
      f"fall JSON: bearing 0 for a drift under 5 mm: {i}")
rc, out, err = plumb("fall", LIGHT, "--set", "wind.from=N", "--set", f"wind.speed={w} m/s")
check(rc == 0 and "drift      none" in out, "fall text: the same drift is none")
i = fall_json("--set", "wind.speed=2.3 m/s")
check(i and i["drift_m"] > 0.005 and abs(i["bearing_deg"] - 180.0) < 1e-6,
      f"fall JSON: a wind from the north carries it due south, bearing 180: {i}")
rc, out, err = plumb("sweep", LIGHT, "--set", "wind.from=N", "--set", f"wind.speed={w} m/s",
                     "--vary", "release.height=10m:20m:10m", "--format", "json")
rows = json.loads(out)["rows"] if rc == 0 else []
check(len(rows) == 2 and all(0.0 < r["impact"]["drift_m"] < 0.005 and r["impact"]["bearing_deg"] == 0
                             for r in rows), f"sweep JSON: bearing 0 for a drift under 5 mm: {rows}")

# No ellipse, so no bearing, in a zone whose samples all land on one point:
# only the mass uncertain, dropped from rest in still air, every fall is
# vertical (x(t) = 0 above). The text says "none"; CSV leaves the bearing
# cell empty, JSON keeps its keys with null (it once gave "90", east,
# the atan2(0, 0) of a zero covariance). A wind that varies spreads them along
# its line (from 270 deg: east-west, bearing 90), and the bearing is given.
ZONE = ("zone", LIGHT, "--samples", "500", "--threads", "1")
MASS = ("--set", "uncertainty.payload.mass={normal: [0.047 kg, 0.0042 kg]}")
WIND = ("--set", "wind.from=270 deg", "--set", "wind.speed=3.1 m/s",
        "--set", "uncertainty.wind.speed={normal: [3.1 m/s, 0.8 m/s]}")
for unc, spread in ((MASS, False), (WIND, True)):
    what = "wind" if spread else "mass only"
    rc, out, err = plumb(*ZONE, *unc)
    check(rc == 0 and ("95 % ellipse    none" in out) != spread, f"zone text, {what}: ellipse {err}")
    rc, out, err = plumb(*ZONE, *unc, "--format", "csv")
    rows = {r["quantity"]: r for r in csv.DictReader(
        io.StringIO("\n".join(l for l in out.splitlines() if not l.startswith("#"))))}
    b = rows.get("ellipse95_bearing", {}).get("value")
    check(rc == 0 and (b == "" if not spread else abs(float(b) - 90.0) < 1.0),
          f"zone CSV, {what}: ellipse95_bearing {b!r}")
    rc, out, err = plumb(*ZONE, *unc, "--format", "json")
    z = json.loads(out)["zone"] if rc == 0 else {}
    el = z.get("ellipse95", {})
    pg = z.get("landing", {}).get("polygon", {})
    check(set(el) >= {"semi_major_m", "semi_minor_m", "bearing_deg"} and "axis_bearing_deg" in pg,
          f"zone JSON, {what}: the ellipse and polygon keep their keys: {el} {sorted(pg)}")
    if spread:
        check(el.get("semi_major_m", 0) > 0 and abs(el.get("bearing_deg", 0) - 90.0) < 1.0
              and isinstance(pg.get("axis_bearing_deg"), float),
              f"zone JSON, {what}: bearings given: {el} {pg.get('axis_bearing_deg')}")
    else:
        check(el.get("semi_major_m") == 0 and el.get("bearing_deg", 0) is None
              and pg.get("axis_bearing_deg", 0) is None,
              f"zone JSON, {what}: no bearing without an ellipse: {el} {pg.get('axis_bearing_deg')}")

# the polygon's main axis is the major principal axis of the sample
# covariance of every impact (K. Pearson, Phil. Mag. 2 (1901) 559-572), as
# the 95 % ellipse's is: one figure computed twice (the zone's statistics,
# the landing region's own moments), the same to rounding, for a cloud
# spread both ways (wind speed and direction uncertain), not a line
rc, out, err = plumb(*ZONE, *WIND, "--set", "uncertainty.wind.from={normal: [270 deg, 23 deg]}",
                     "--format", "json")
z = json.loads(out)["zone"] if rc == 0 else {}
ab = z.get("landing", {}).get("polygon", {}).get("axis_bearing_deg")
eb = z.get("ellipse95", {}).get("bearing_deg")
check(isinstance(ab, float) and isinstance(eb, float)
      and abs((ab - eb + 90.0) % 180.0 - 90.0) < 1e-6,
      f"zone JSON: the polygon's axis {ab} is the ellipse's {eb} (all samples)")

# ---- one spelling of square metres ---------------------------------------------------
runs = [
    ("fall", THROWN),
    ("sweep", CANOPY, "--vary", "descent.area=0.8m^2:1.2m^2:0.2m^2"),
    ("sweep", CANOPY, "--vary", "descent.area=0.8m2:1.2m2:0.2m2"),
    ("limit", CANOPY, "--find", "descent.area", "--speed-max", "5.5m/s"),
    ("zone", CANOPY, "--samples", "500", "--threads", "1",
     "--set", "uncertainty={descent.area: {uniform: [0.8 m^2, 1.1 m^2]}}"),
]
for args in runs:
    for fmt in ("text", "csv"):
        rc, out, err = plumb(*args, "--format", fmt)
        # a CSV header names its columns with ASCII unit suffixes, as
        # density_kg_m3 does (the sweep's varied key: descent.area_m2);
        # only the rest is checked for the spelling of a figure's unit
        head = next((l for l in out.splitlines() if not l.startswith("#")), "")
        body = out.replace(head, "", 1) if fmt == "csv" else out
        odd = [s for s in ("m^2", "m2 ", "m2,", "m2)", "sq m", "m**2") if s in body]
        if fmt == "csv" and args[0] == "sweep":
            check(head.startswith("descent.area_m2,item_number,"),
                  f"sweep csv: the varied area's column is descent.area_m2: {head[:40]!r}")
        # fall and zone CSV name no area; everything else shows one
        shown = "m²" in out or (fmt == "csv" and args[0] in ("fall", "zone", "sweep"))
        check(rc == 0 and shown and not odd,
              f"{' '.join(args[:1])} {fmt}: square metres spelt {odd} ({err.strip()})")

# ---- a per-item warning: no capital after a colon ------------------------------
# "cable tie bundle: Plate-like: ..." put a sentence's capital after a colon;
# the sentence is given whole and the items it is about after it, in
# brackets, as the sweep's Warnings give rows and items (README.md "plumb
# fall").
KIT = os.path.join(os.path.dirname(os.path.dirname(HERE)), "profiles", "demo", "tower-kit.yaml")
with open(KIT, encoding="utf-8") as f:
    names = re.findall(r"^  - name: (.+?)\s*$", f.read(), re.M)
for fmt in ("text", "csv"):
    rc, out, err = plumb("fall", KIT, "--format", fmt)
    lines = out.split("\nWarnings\n", 1)[-1].split("\n\n")[0].split("\n  - ") \
        if fmt == "text" else [l for l in out.splitlines() if l.startswith("# warning: ")]
    flat_lines = [" ".join(l.split()) for l in lines]
    colon_cap = [l for l in flat_lines for n in names if re.search(re.escape(n) + r": [A-Z]", l)]
    check(rc == 0 and len(names) >= 3 and not colon_cap,
          f"fall {fmt}: an item's name then a capital after a colon: {colon_cap[:2]}")
    check(any(re.search(r"is used\. \([^()]*" + re.escape(names[4]) + r"\)$", l)
              for l in flat_lines),
          f"fall {fmt}: the items after the sentence, in brackets: {flat_lines[:2]}")

# ---- one, not "1 steps" ---------------------------------------------------------
# a fall of 1 cm takes the solver one step; a zone of 1 sample is refused
# saying so; a sweep of one value says "one value"
ONE = r"(?<![\d.])1 (step|sample|row|value|draw|evaluation|device|item|error|fall|time)s\b"
for args in [("fall", THROWN, "--set", "release.height=0.01m"),
             ("fall", THROWN, "--set", "release.height=0.01m", "--units", "us"),
             ("zone", THROWN, "--samples", "1", "--set",
              "uncertainty={payload.drag.cd: {uniform: [0.7, 0.9]}}"),
             ("sweep", THROWN, "--vary", "release.height=2m:2m:1m"),
             ("sweep", THROWN, "--vary", "release.height=2m:2m:1m", "--format", "csv"),
             ("sweep", THROWN, "--vary", "release.height=2m:2m:1m", "--units", "us")]:
    rc, out, err = plumb(*args)
    if args == ("fall", THROWN, "--set", "release.height=0.01m"):
        one_cm = (rc, out)  # checked for '1 step,' below: the same run
    found = re.findall(ONE, " ".join((out + err).split()))
    check(rc in (0, 2) and (out or err) and not found,
          f"{' '.join(args[:1] + args[2:])}: a plural after one: {found} (exit {rc})")
rc, out = one_cm
check(rc == 0 and re.search(r"solver +\w+, 1 step, ", out), "fall of 1 cm: '1 step,'")
# two drogues, the second deployed after impact (60 s; the fall from 63.2 m
# under the first takes a few seconds): "the drogue does not open" beside
# "with the drogue open" would not say which; counted, with the verb
# agreeing with its count
TWO = os.path.join(HERE, "profiles", "two-devices.yaml")
rc, out, err = plumb("fall", TWO, "--set", "descent[1].kind=drogue",
                     "--set", "descent[1].deploy.after=60 s")
flat = " ".join(out.split())
check(rc == 0 and "(1 of the 2 devices does not open before impact)" in flat and
      "the drogue does not open" not in flat,
      f"two drogues, one open: counted, '1 of the 2 devices does not open' (exit {rc}) {err}")

# A drogue cut away while still filling (invented: tests/cli/profiles/
# two-devices.yaml with a 0.8 s fill and the parachute at 0.9 s) is said
# to be cut away part-filled, never "replaced" as one that filled: the
# drogue and the parachute reach line stretch at their `after` times, 0.5 s
# and 0.9 s, so the cut comes (0.9 - 0.5) / 0.8 = 50 % into its fill time
# (README.md, "fill_fraction"); its drag area there, on the linear fill
# Knacke gives with no canopy type, (t / t_f)^1 (Knacke, Parachute Recovery
# Systems Design Manual, 1991, seen through README.md "The model"), is
# 0.5 x 0.6 x 0.2 m^2 = 0.06 m^2 of the full 0.12 m^2.
CUT = ["fall", TWO, "--set", "descent[0].fill_time=0.8 s", "--set",
       "descent[1].deploy.after=0.9 s"]
rc, out, err = plumb(*CUT)
flat = " ".join(out.split())
check(rc == 0 and "cut away while still filling, at the parachute's line stretch 0.4000 s "
      "later: 50.0 % of its fill time, drag area 0.06000 m² of the full 0.1200 m²" in flat
      and "for a full fill, which it did not reach before it was cut away" in flat,
      f"drogue cut away while filling, text: its part fill at the cut (exit {rc}) {err} {flat[:3000]}")
WARN = ("The drogue (descent[0]) was cut away while still filling: the parachute "
        "(descent[1]) reached line stretch at 0.9000 s, 0.4000 s into the drogue's 0.8000 s "
        "fill time (50.0 %), when the drogue's drag area was 0.0600 m² of the full 0.120 m² "
        "(50 %).")
check(WARN in flat, f"drogue cut away while filling, text warning: {flat[:3000]}")
rc, out, err = plumb(*CUT, "--format", "json")
doc = json.loads(out) if rc == 0 else {}
devs = doc.get("descent", {}).get("devices", [{}, {}])
ai = devs[0].get("at_impact", {})
check(ai.get("state") == "cut_away_filling" and abs(ai.get("fill_fraction", 0) - 0.5) <= 1e-12
      and devs[1].get("at_impact", {}).get("state") == "open"
      and devs[0].get("pflanz", {}).get("full_fill_reached") is False
      and any(w.startswith(WARN) for w in doc.get("warnings", [])),
      f"drogue cut away while filling, JSON: state, fill fraction 0.5, warning: {ai} "
      f"{doc.get('warnings')}")
rc, out, err = plumb(*CUT, "--format", "csv")
check(rc == 0 and any(l.startswith("# warning: " + WARN) for l in out.splitlines()),
      f"drogue cut away while filling, CSV warning line: {out[:1500]}")
# a drogue that filled before the parachute replaced it (0.8 s fill, the
# parachute at 1.5 s, 1.25 fill times later) is "replaced", with no warning
rc, out, err = plumb("fall", TWO, "--set", "descent[0].fill_time=0.8 s", "--set",
                     "descent[1].deploy.after=1.5 s", "--format", "json")
doc = json.loads(out) if rc == 0 else {}
devs = doc.get("descent", {}).get("devices", [{}])
check(devs[0].get("at_impact", {}).get("state") == "replaced"
      and not any("cut away" in w for w in doc.get("warnings", [])),
      f"drogue that filled, then replaced: 'replaced', no cut-away warning: {devs[0]}")

# A kit of one item (invented): "1 item", never "1 items".
tmp = tempfile.mkdtemp(prefix="plumb-report-words.", dir=os.environ.get("TMPDIR"))
try:
    kit1 = os.path.join(tmp, "kit1.yaml")
    with open(kit1, "w") as f:
        f.write("name: kit of one\nitems:\n  - name: bag\n    mass: 1.2 kg\n"
                "    drag: {cd: 0.93, area: 0.0187 m^2, source: invented test value}\n"
                "release: {height: 30 m}\n")
    for units in ("si", "us"):
        rc, out, err = plumb("fall", kit1, "--units", units)
        found = re.findall(ONE, " ".join((out + err).split()))
        check(rc == 0 and re.search(r"^1 item, each falling alone", out, re.M) and not found,
              f"fall of a kit of one, --units {units}: '1 item,', no plural after one: {found} "
              f"(exit {rc}) {out[:200]}")
finally:
    shutil.rmtree(tmp)

finish()
