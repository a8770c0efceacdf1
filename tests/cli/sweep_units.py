#!/usr/bin/python3
"""A sweep's varied values are shown in the report's units.

A US report is US throughout (README.md "Common options", --units): a
range typed in another unit than the report's for its key is shown
converted, in the text table and its range line, and in the CSV, where the
values as typed keep a column of their own (so the exact input is never
lost); JSON is SI with the values as given, as before. A range typed in
the report's own unit is shown as typed. CSV headers name the unit as
every other header does, with '_' (speed_m_s, energy_ft_lbf): no spaces.

Sources of the checked values:
  - the international foot, 0.3048 m exactly, and the statute mile, 1609.344
    m exactly, so 1 mph = 0.44704 m/s (International Yard and Pound
    Agreement, 1959);
  - the international nautical mile, 1852 m exactly, so 1 kn = 1852/3600
    m/s (International Hydrographic Conference, 1929).
Usage: sweep_units.py PATH/TO/plumb   (prints `cli: N passed, N failed`)
"""
import csv
import io
import json
import os
import sys

sys.path.insert(0, os.path.join(os.path.dirname(os.path.abspath(__file__)), "lib"))
from plumbcli import ROOT, check, finish, plumb  # noqa: E402

FT = 0.3048
MPH = 0.44704
KN = 1852.0 / 3600.0
HAND = os.path.join(ROOT, "profiles", "demo", "hand-tool.yaml")
DRONE = os.path.join(ROOT, "profiles", "demo", "drone-release.yaml")


def table(out):
    lines = [l for l in out.splitlines() if not l.startswith("#")]
    rows = list(csv.reader(io.StringIO("\n".join(lines))))
    return (rows[0], rows[1:]) if rows else ([], [])


def text_rows(out, n):
    """The unit line under the header, and the first n rows of the table."""
    lines = out.splitlines()
    i = next((k for k, l in enumerate(lines) if l.lstrip().startswith(("release.height",
                                                                       "wind.speed", "height",
                                                                       "speed"))
              and "speed" in l and "energy" in l), None)
    if i is None:
        return "", []
    return lines[i + 1], [l.split() for l in lines[i + 2:i + 2 + n]]


def near(a, b, rel=1e-9):
    return abs(a - b) <= rel * max(abs(b), 1.0)


# a height typed in metres, reported in US units: feet in the text and CSV
rc, out, err = plumb("sweep", HAND, "--vary", "release.height=20m:60m:20m", "--units", "us")
units, rows = text_rows(out, 3)
check(rc == 0 and units.split()[:1] == ["ft"], f"US text: the height's unit is ft: {units!r}")
check([r[0] for r in rows] == ["65.62", "131.2", "196.9"],
      f"US text: 20, 40, 60 m are 65.62, 131.2, 196.9 ft (0.3048 m/ft): {[r[:1] for r in rows]}")
check("release.height from 65.62 to 196.9 ft in steps of 65.62 ft" in " ".join(out.split())
      and "typed as 20 to 60 m in steps of 20 m" in " ".join(out.split()),
      f"US text: the range line in ft, and as typed:\n{out[:400]}")
check(units != "" and not {"m", "m/s", "kg", "J"} & set(units.split()[:1] + units.split()[2:3]),
      f"US text: no leading column of the table is SI: {units!r}")

rc, out, err = plumb("sweep", HAND, "--vary", "release.height=20m:60m:20m", "--units", "us",
                     "--format", "csv")
head, body = table(out)
check(rc == 0 and head[:2] == ["release.height_ft", "release.height_m"],
      f"US CSV: the height in ft, then as typed in m: {head[:3]}")
check(all(" " not in h for h in head), f"CSV headers have no spaces: {[h for h in head if ' ' in h]}")
check([float(r[1]) for r in body] == [20.0, 40.0, 60.0]
      and all(near(float(r[0]), float(r[1]) / FT) for r in body),
      f"US CSV: ft = m / 0.3048, and m exactly as typed: {[r[:2] for r in body]}")

# a wind typed in knots, reported in US units: mph, as the report gives a wind
rc, out, err = plumb("sweep", DRONE, "--vary", "wind.speed=0kn:20kn:10kn", "--units", "us")
units, rows = text_rows(out, 3)
check(rc == 0 and units.split()[:1] == ["mph"], f"US text: the wind's unit is mph: {units!r}")
check([r[0] for r in rows] == ["0", "11.51", "23.02"],
      f"US text: 10 kn = 1852/3600 / 0.44704 = 11.508 mph: {[r[:1] for r in rows]}")
rc, out, err = plumb("sweep", DRONE, "--vary", "wind.speed=0kn:20kn:10kn", "--units", "us",
                     "--format", "csv")
head, body = table(out)
check(rc == 0 and head[:2] == ["wind.speed_mph", "wind.speed_kn"]
      and all(near(float(r[0]), float(r[1]) * KN / MPH) for r in body)
      and [r[1] for r in body] == ["0", "10", "20"],
      f"US CSV: wind in mph, then kn as typed: {head[:2]} {[r[:2] for r in body]}")

# an SI report of a range typed in feet: metres, the feet kept in CSV
rc, out, err = plumb("sweep", HAND, "--vary", "release.height=20ft:60ft:20ft", "--format", "csv")
head, body = table(out)
check(rc == 0 and head[:2] == ["release.height_m", "release.height_ft"]
      and all(near(float(r[0]), float(r[1]) * FT) for r in body),
      f"SI CSV of a range in ft: m, then ft as typed: {head[:2]} {[r[:2] for r in body]}")
rc, out, err = plumb("sweep", HAND, "--vary", "release.height=20ft:60ft:20ft")
units, rows = text_rows(out, 3)
check(units.split()[:1] == ["m"] and [r[0] for r in rows] == ["6.096", "12.19", "18.29"],
      f"SI text of a range in ft: 6.096, 12.19, 18.29 m: {units!r} {[r[:1] for r in rows]}")

# typed in the report's own unit: shown as typed, one column
for args, want in [(["--vary", "release.height=20m:60m:20m"], "release.height_m"),
                   (["--vary", "release.height=20ft:60ft:20ft", "--units", "us"], "release.height_ft")]:
    rc, out, err = plumb("sweep", HAND, *args, "--format", "csv")
    head, body = table(out)
    check(rc == 0 and head[0] == want and head[1] == "item_number"
          and [r[0] for r in body] == ["20", "40", "60"],
          f"{' '.join(args)}: one column {want}, values as typed: {head[:2]}")

# JSON stays SI with the values as given (README.md "plumb sweep")
rc, out, err = plumb("sweep", HAND, "--vary", "release.height=20m:60m:20m", "--units", "us",
                     "--format", "json")
d = json.loads(out) if rc == 0 else {"rows": []}
check([r["values_as_given"]["release.height"] for r in d["rows"]] == [20, 40, 60]
      and [r["values_si"]["release.height"] for r in d["rows"]] == [20, 40, 60]
      and d.get("vary", [{}])[0].get("unit") == "m",
      "US JSON: values as given and in SI, unchanged")

# a two-way US table: both keys and the boundary in US units
rc, out, err = plumb("sweep", DRONE, "--vary", "release.height=10m:40m:10m", "--vary",
                     "payload.mass=0.5kg:1.5kg:0.5kg", "--units", "us")
flat = " ".join(out.split())
check(rc == 0 and "the payload.mass (lb) at which" in flat and "for each release.height (ft)" in flat
      and "32.81 up to" in flat,
      f"US two-way: the boundary in lb for each height in ft:\n{out[-1500:]}")

# a failed row keeps its value, in the report's units
rc, out, err = plumb("sweep", HAND, "--vary", "release.height=-2m:6m:4m", "--units", "us")
check(rc == 3 and "release.height = -6.562 ft" in out,
      f"US text: a failed row's value in ft (-2 m = -6.562 ft): exit {rc}")

finish()
