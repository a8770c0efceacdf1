#!/usr/bin/python3
"""A limit answer's words are in the report's units (--units us is
US throughout a report): for every kind of answer (found, found at several
crossings, not reached at the top of the range scanned, exceeded all the
way down, already over at zero height, not applicable to an item) and every
kind of limit (--energy-max, --speed-max, --drift-max):
  - the US text and CSV name no SI unit but the joules beside foot
    pound-force (every energy is shown in both) and the unit a key was
    given in, where the answer says so;
  - every figure of the US explanation is the SI run's figure converted by
    an independent factor, to the digits printed;
  - the JSON is SI whatever --units says (README.md "Common options"): the same
    bytes from --units si and --units us;
  - no line of the text is wider than 80 columns.
Factors (exact by definition; NIST SP 811 (2008), Appendix B.8, seen):
1 ft = 0.3048 m, 1 in = 0.0254 m, 1 lb = 0.45359237 kg, 1 mph = 0.44704 m/s,
1 ft·lbf = 0.3048 m x 0.45359237 kg x 9.80665 m/s² (standard gravity,
3rd CGPM 1901), 1 degF of difference = 5/9 K.
Usage: limit_words.py PATH/TO/plumb   (prints `cli: N passed, N failed`)
"""
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
from plumbcli import HERE, ROOT, check, finish, plumb  # noqa: E402
from functools import lru_cache  # noqa: E402

# A command that two checks run with the same arguments runs once and both
# read its output (plumb is deterministic, and no file it reads here is
# changed between the two).
plumb = lru_cache(maxsize=None)(plumb)

FT, INCH, LB, MPH, G0 = 0.3048, 0.0254, 0.45359237, 0.44704, 9.80665
FT_LBF = FT * LB * G0
# unit -> (dimension, factor to SI, offset); SI units factor 1
UNITS = {
    "m": ("length", 1.0), "ft": ("length", FT), "in": ("length", INCH),
    "m/s": ("speed", 1.0), "ft/s": ("speed", FT), "mph": ("speed", MPH),
    "J": ("energy", 1.0), "ft·lbf": ("energy", FT_LBF),
    "kg": ("mass", 1.0), "lb": ("mass", LB),
    "m²": ("area", 1.0), "ft²": ("area", FT * FT),
    "K": ("tempdiff", 1.0), "°F": ("tempdiff", 5.0 / 9.0),
}
SI = {"m", "m/s", "J", "kg", "m²", "K"}
FIG = re.compile(r"(?<![\w.])(-?\d+(?:\.\d+)?(?:e[-+]?\d+)?) (ft·lbf|ft/s|ft²|m/s|m²|mph|°F|ft|in|lb|kg|m|J|K)(?![\w/²·])")

DEMO = os.path.join(ROOT, "profiles", "demo")
TOOL = os.path.join(DEMO, "hand-tool.yaml")
CANOPY = os.path.join(DEMO, "drone-canopy.yaml")
KIT = os.path.join(DEMO, "tower-kit.yaml")

CASES = [  # (what, args, outcomes wanted)
    ("found", [TOOL, "--find", "release.height", "--energy-max", "40J"], {"found"}),
    ("found, lighter", [TOOL, "--find", "payload.mass", "--energy-max", "40J"], {"found"}),
    ("found at two crossings", [TOOL, "--find", "release.velocity.climb", "--energy-max", "360J"],
     {"found"}),
    ("found, a speed limit, two crossings", [CANOPY, "--find", "descent.diameter",
                                             "--speed-max", "5m/s"], {"found"}),
    ("found, a temperature offset", [TOOL, "--find", "atmosphere.temperature_offset",
                                     "--energy-max", "350J"], {"found"}),
    ("not reached at the top of the scan", [TOOL, "--find", "release.height",
                                            "--energy-max", "1000000J"], {"unlimited"}),
    ("not reached, a drift limit in mph", [TOOL, "--find", "wind.speed", "--drift-max", "3000m"],
     {"unlimited"}),
    ("exceeded even at the largest canopy", [CANOPY, "--find", "descent.area",
                                             "--speed-max", "0.05m/s"], {"impossible"}),
    ("already over at zero height", [TOOL, "--find", "release.height", "--energy-max", "0.001J"],
     {"impossible"}),
    ("not applicable to some items", [KIT, "--find", "payload.shape.diameter",
                                      "--energy-max", "40J"], {"found", "not applicable"}),
]


def figures(text):
    """(dimension, SI value, SI ulp) of every figure with a unit in text."""
    out = []
    for num, unit in FIG.findall(text.replace("\u00a0", " ")):
        dim, f = UNITS[unit]
        x = float(num)
        mant, _, exp = num.lstrip("-").partition("e")
        if "." in mant:
            last = -len(mant.split(".")[1])
        else:  # trailing zeros of a whole number may be rounding's
            last = len(mant) - len(mant.rstrip("0")) if mant.strip("0") else 0
        # a figure is within one unit of its last digit of the true value
        # (rounded, or rounded toward the side that meets a limit)
        ulp = 10.0 ** (last + (int(exp) if exp else 0))
        out.append((dim, x * f, ulp * abs(f), unit))
    return out


def rows(out):
    return list(csv.DictReader(io.StringIO("\n".join(l for l in out.splitlines()
                                                     if not l.startswith("#")))))


def body(text):
    """The answer's lines of a text report, between the header and Profile,
    as one line (a sentence may wrap anywhere but inside a figure)."""
    b = text.split("\n\n", 1)[1].split("\nProfile ")[0] if "\n\n" in text else ""
    return " ".join(b.split())


def agree(us, si):
    """Every US figure matches the SI run's figure of its dimension in the
    same place, both read as SI (energy is printed in both units, in the
    report system's order, so figures are matched per dimension)."""
    if len(us) != len(si):
        return f"{len(us)} figures in US, {len(si)} in SI"
    by = {}
    for f in si:
        by.setdefault(f[0], []).append(f)
    for f in us:
        cands = by.get(f[0], [])
        hit = next((g for g in cands if abs(f[1] - g[1]) <= f[2] + g[2] + 1e-12 * abs(g[1])), None)
        if hit is None:
            return f"{f[3]} figure {f[1]!r} (SI) matches no SI figure of {[g[1] for g in cands]}"
        cands.remove(hit)
    return ""


def us_words_ok(text, given=()):
    """SI units appear only as the joules beside ft·lbf, or as a unit given."""
    bad = []
    for m in FIG.finditer(text.replace("\u00a0", " ")):
        unit = m.group(2)
        if unit not in SI:
            continue
        before = text[:m.start()].rstrip()
        if unit == "J" and before.endswith("ft·lbf ("):
            continue
        if unit in given and text[m.end():].startswith(", the unit it was given in"):
            continue
        bad.append(m.group(0))
    return bad


for what, args, outcomes in CASES:
    # CSV: the explanation column, per item
    rc_si, out_si, err_si = plumb("limit", *args, "--format", "csv")
    rc_us, out_us, err_us = plumb("limit", *args, "--format", "csv", "--units", "us")
    r_si, r_us = rows(out_si), rows(out_us)
    check(rc_si == 0 and rc_us == 0 and r_si and len(r_si) == len(r_us)
          and {r["outcome"] for r in r_us} == outcomes,
          f"{what}: CSV answers {outcomes} ({err_si.strip()} {err_us.strip()})")
    for a, b in zip(r_si, r_us):
        ex_si, ex_us = a["explanation"], b["explanation"]
        bad = us_words_ok(ex_us)
        check(not bad, f"{what}: US CSV explanation names SI units {bad}: {ex_us}")
        msg = agree(figures(ex_us), figures(ex_si))
        check(not msg and (figures(ex_si) or b["outcome"] == "not applicable"),
              f"{what}: US CSV figures agree with SI ({msg}):\n  {ex_si}\n  {ex_us}")

    # text: the answer's lines
    rc_si, t_si, _ = plumb("limit", *args)
    rc_us, t_us, _ = plumb("limit", *args, "--units", "us")
    b_si, b_us = body(t_si), body(t_us)
    given = {u for _, _, _, u in figures(b_us)
             if re.search(r"\d " + re.escape(u) + ", the unit it was given in", b_us)}
    bad = us_words_ok(b_us, given)
    check(rc_si == 0 and rc_us == 0 and b_us and not bad,
          f"{what}: US text names SI units {bad}:\n{b_us}")
    # the bracket in the unit given is the same in both runs: leave it out
    strip = re.compile(r" \([^()]*, the unit it was given in\)")
    msg = agree(figures(strip.sub("", b_us)), figures(strip.sub("", b_si)))
    check(not msg, f"{what}: US text figures agree with SI ({msg}):\n{b_si}\n{b_us}")
    wide = [l for l in (t_si + t_us).splitlines() if len(l) > 80]
    check(not wide, f"{what}: text wider than 80 columns: {wide}")

    # JSON: SI whatever --units says, its explanation the SI CSV's
    rc_a, j_si, _ = plumb("limit", *args, "--format", "json")
    rc_b, j_us, _ = plumb("limit", *args, "--format", "json", "--units", "us")
    ex = [it["explanation"] for it in json.loads(j_si)["limit"]["items"]] if rc_a == 0 else []
    check(rc_b == 0 and j_si == j_us and ex == [r["explanation"] for r in r_si],
          f"{what}: JSON the same in SI and US, its explanation in SI:\n{ex}")

# The warnings of the fall at the answer (limit reports once printed
# none, though that fall is the one a user would make). At 500 kJ a 20 kg weight strikes at sqrt(2 E / m) = 223.6 m/s,
# Mach 0.657 in sea-level air (a = 340.294 m/s, U.S. Standard Atmosphere
# 1976), above the Mach 0.5 of the warning; its own 10 m fall (14 m/s) is
# far below it, so the warning comes from the answer's fall, not the
# profile's.
IRON = os.path.join(HERE, "profiles", "iron-weight.yaml")
rc, out, _ = plumb("fall", IRON)
check(rc == 0 and "Mach" not in out, "iron weight: no Mach warning at its own 10 m")
rc, out, _ = plumb("limit", IRON, "--find", "release.height", "--energy-max", "500kJ")
words = " ".join(out.split())
check(rc == 0 and "Warnings, of the fall at the answer - The air speed reaches Mach 0.6" in words,
      f"limit text: the Mach warning of the fall at the answer:\n{out}")
rc, out, _ = plumb("limit", IRON, "--find", "release.height", "--energy-max", "500kJ",
                   "--format", "csv")
check(rc == 0 and "\n# warning: The air speed reaches Mach 0.6" in out,
      f"limit CSV: the Mach warning as a comment line:\n{out}")
rc, out, _ = plumb("limit", IRON, "--find", "release.height", "--energy-max", "500kJ",
                   "--format", "json")
warn = json.loads(out)["limit"]["items"][0].get("warnings", []) if rc == 0 else []
check(any(x.startswith("The air speed reaches Mach 0.6") for x in warn),
      f"limit JSON: the item's warnings hold the Mach warning: {warn}")
# where no value meets the limit, the warnings are those of the profile's
# own value, and the heading says so
rc, out, _ = plumb("limit", TOOL, "--find", "release.height", "--energy-max", "0.01J")
check(rc == 0 and "Warnings, of the fall at the profile's own value (no value meets the limit)"
      in out, f"limit text: warnings of the own value where none is found:\n{out}")

# A scan that starts above the key's own lower end because the profile
# refuses lower values (a parachute set to open below 40 m needs a higher
# release) must say so, not "even at (almost) zero height": a 2.5 kg
# parcel dropped 3 m strikes with at most m g h = 73.5 J < 80 J.
LOW = os.path.join(HERE, "profiles", "low-canopy.yaml")
rc, out, _ = plumb("limit", LOW, "--find", "release.height", "--energy-max", "80J")
words = " ".join(out.split())
m = re.search(r"scanned from ([0-9.]+) m", words)
check(rc == 0 and "zero height" not in words and m and float(m.group(1)) > 40.0 and
      "lower values are refused by the profile's check of descent.deploy.below" in words,
      f"limit over a refused low range says why it starts at {m and m.group(1)} m:\n{out}")

# The CSV's answer is rounded toward the side that meets the limit, as the
# text's is (its 10 figures to nearest could fall on the other side: the
# drone canopy's 1.106628756 m, fed back, exceeded its limit): against the
# JSON's full double, down when lower values meet the limit, else up; and
# fed back through plumb fall --set it meets the limit (ratio <= 1).
# In an inventory each item is answered against its own checks: the bag's
# parachute (deploy below 60 m) bounds the bag's release height only; the
# wrench (2.4 kg, no device) meets 25 ft·lbf = 33.895 J near 1.4 m (m g0 H
# = 33.895 J gives H = 1.44 m; its drag takes a little, the wind adds a
# little), far below the bag's 60 m.
BAG = os.path.join(HERE, "profiles", "kit-bag.yaml")
rc, out, err = plumb("limit", BAG, "--find", "release.height", "--energy-max", "us-part107-cat3",
                     "--format", "json")
items = json.loads(out)["limit"]["items"] if rc == 0 else []
h = items[0].get("value_si", 0.0) if items else 0.0
check(rc == 0 and items[0]["outcome"] == "found" and 1.3 < h < 1.6 and
      items[2]["outcome"] == "impossible" and items[2]["scanned_from_si"] > 60.0 and
      "descent.deploy.below" in items[2]["explanation"],
      f"kit limit: each item against its own checks: {h} m; {items[2:] if items else err}")
# an item's own canopy is found for that item (--find descent.X; the
# others have none, which the answer says), and fed back through --set
# items[3].descent.diameter it meets the limit
rc, out, err = plumb("limit", BAG, "--find", "descent.diameter", "--energy-max", "80J",
                     "--format", "json")
items = json.loads(out)["limit"]["items"] if rc == 0 else []
d3 = items[2].get("value_si", 0.0) if items else 0.0
d3s = (math.floor if items and items[2].get("lower_values_meet_limit") else math.ceil)(d3 * 1e6) / 1e6
rc2, f, _ = plumb("fall", BAG, "--set", f"items[3].descent.diameter={d3s:.6f} m", "--format", "json")
e3 = json.loads(f)["items"][2]["impact"]["energy_j"] if rc2 == 0 else 1e9
check(rc == 0 and items[0]["outcome"] == "not applicable" and "no descent device" in
      items[0]["explanation"] and items[2]["outcome"] == "found" and e3 <= 80.0,
      f"kit limit on the bag's own canopy: {d3} m gives {e3} J ({err.strip()})")
# asked of item 3 alone (items[3].descent.X), the same answer, and only it
rc, out, err = plumb("limit", BAG, "--find", "items[3].descent.diameter", "--energy-max", "80J",
                     "--format", "json")
one = json.loads(out)["limit"]["items"] if rc == 0 else []
check(rc == 0 and len(one) == 1 and one[0]["item_number"] == 3 and
      one[0]["set_key"] == "items[3].descent.diameter" and
      abs(one[0].get("value_si", 0.0) - d3) <= 1e-9 * d3,
      f"items[3].descent: {one} ({err.strip()})")
CLIMB = os.path.join(HERE, "profiles", "climbing-drone.yaml")
for args in ([CLIMB, "--find", "descent.diameter", "--energy-max", "us-part107-cat3",
              "--set", "wind.speed=0 m/s"],
             [CANOPY, "--find", "descent.diameter", "--energy-max", "us-part107-cat3"],
             [TOOL, "--find", "release.height", "--energy-max", "40J"],
             [TOOL, "--find", "payload.mass", "--energy-max", "40J"]):
    rc, c, _ = plumb("limit", *args, "--format", "csv")
    rc2, j, _ = plumb("limit", *args, "--format", "json")
    rows = list(csv.DictReader(io.StringIO("".join(l + "\n" for l in c.splitlines()
                                                   if not l.startswith("#")))))
    it = json.loads(j)["limit"]["items"][0] if rc2 == 0 else {}
    v, vj = float(rows[0]["value_si"]), it.get("value_si", 0.0)
    side_ok = v <= vj if it.get("lower_values_meet_limit") else v >= vj
    rc3, f, _ = plumb("fall", args[0], *args[5:], "--set",
                      f"{args[2]}={rows[0]['value']} {rows[0]['unit']}", "--format", "json")
    limit_j = 33.895448708285009 if "us-part107-cat3" in args else 40.0
    e = json.loads(f)["impact"]["energy_j"] if rc3 == 0 else float("inf")
    check(rc == 0 and side_ok and e <= limit_j,
          f"limit CSV {args[2]}: {rows[0]['value']} (JSON {vj!r}) fed back gives {e} J <= {limit_j}")

# One value scanned: a bag under a parachute set to open below 29.5 m,
# let go 30 m above a site at 85 970 m, so 30 m is the top of the U.S.
# Standard Atmosphere 1976 (86 km geometric, NOAA/NASA/USAF 1976, section
# 1.2, seen; README.md "The model"): lower heights are refused by the
# deploy height, higher ones are above the air model, and only the
# profile's own value is computed. It is said as one value, never as
# "1 values" (invented test scenario).
ONE = """name: bag at the top of the air model
payload: {mass: 1.2 kg, drag: {cd: 0.93, area: 0.0187 m^2, source: invented test value}}
descent: {kind: parachute, cd: 0.78, area: 1.47 m^2, deploy: {below: 29.5 m}, fill_time: 0.8 s}
release: {height: 30 m}
site: {elevation: 85970 m}
"""
tmp = tempfile.mkdtemp(prefix="plumb-limit-words.", dir=os.environ.get("TMPDIR"))
try:
    one = os.path.join(tmp, "one.yaml")
    with open(one, "w") as f:
        f.write(ONE)
    for units in ("si", "us"):
        rc, out, err = plumb("limit", one, "--find", "release.height", "--energy-max", "0.1J",
                             "--units", units)
        flat = " ".join(out.split())
        check(rc == 0 and "the only value of release.height" in flat
              and not re.search(r"\b1 values\b", flat),
              f"one value scanned, --units {units}: 'the only value', never '1 values': {flat[:500]} "
              f"({err.strip()})")
    rc, out, _ = plumb("limit", one, "--find", "release.height", "--energy-max", "0.1J",
                       "--format", "json")
    check(rc == 0 and json.loads(out)["limit"]["items"][0].get("values_scanned") == 1,
          f"one value scanned: JSON values_scanned 1: {out[:300]}")
    # One value is no range: worded as the single height it is, never "from
    # 30 m to 30 m" (before the fix), in every format; and nothing is said
    # to level off, which one value cannot show. 30 m = 98.4252 ft (1 ft =
    # 0.3048 m exactly, NIST SP 811 (2008), B.8), to the 6 figures shown.
    expl = json.loads(out)["limit"]["items"][0].get("explanation", "") if rc == 0 else ""
    for fmt, units, height in (("text", "si", "30 m"), ("text", "us", "98.4252 ft"),
                               ("csv", "si", "30 m"), ("json", "si", "30 m")):
        for limit_j, outcome in (("0.1J", "exceeds the limit"),
                                 ("400J", "not reached within the values")):
            rc, out, err = plumb("limit", one, "--find", "release.height", "--energy-max",
                                 limit_j, "--units", units, "--format", fmt)
            flat = " ".join(out.split())
            check(rc == 0 and f"the only value{'' if 'not' in outcome else ' of release.height'}"
                  f" that could be computed, {height}, where it is" in flat
                  and outcome in flat and f"from {height} to {height}" not in flat
                  and "levels off" not in flat
                  and "lower values are refused by the profile's check of "
                      "descent.deploy.below" in flat,
                  f"one value scanned, {fmt} --units {units} --energy-max {limit_j}: a single "
                  f"height, why the scan ends below and above it: {flat[:900]} ({err.strip()})")
finally:
    shutil.rmtree(tmp)

finish()
