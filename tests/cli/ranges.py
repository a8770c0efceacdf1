#!/usr/bin/python3
"""Ranges on the command line: `plumb sweep --vary` and `plumb air --alt`
(and the temperature offset `plumb air` states).

Each range is checked in the unit it was typed in, counted without
overflow, and refused (exit 2, the option named, nothing written) for a
zero step, a step of the wrong sign, or too many values, before anything
runs; the error is located as a --set's is (README.md "Exit status"):
`--vary:N:COL:`, the N-th --vary, COL where the part at fault starts
(STEP for a step of the wrong sign), then the key. The regression kept fixed: `--vary
atmosphere.table[0].temperature=0degC:30degC:-20degC` passed the sign
check (-20 degC read as +253.15 K), counted about 2^64 values, and with two
such ranges the row cap was passed by wrap-around and the writer looped
for ever.

Sources of the checked values:
  - NIST SP 811 (2008), B.9: T/K = t/degC + 273.15, t/degC = (t/degF - 32)/1.8.
  - U.S. Standard Atmosphere 1976 (NOAA-S/T 76-1562), Table I, 0 m:
    rho = 1.2250 kg/m^3 at 101325 Pa and 288.15 K (transcribed); dry air
    at the same pressure is an ideal gas, so rho scales as 1/T.
  - 1 ft = 0.3048 m exactly (1959 international yard and pound agreement).
Usage: ranges.py PATH/TO/plumb   (prints `cli: N passed, N failed`)
"""
import json
import os
import subprocess
import sys
import tempfile

sys.path.insert(0, os.path.join(os.path.dirname(os.path.abspath(__file__)), "lib"))
import plumbcli  # noqa: E402
from plumbcli import HERE, check, finish  # noqa: E402

SURFACE = os.path.join(HERE, "profiles", "surface-air.yaml")
THROWN = os.path.join(HERE, "profiles", "thrown.yaml")
# Every refusal here must come before any fall is computed; a run that
# needs longer than this has not refused the range up front.
TIMEOUT_S = 20


def plumb(*args):
    try:
        return plumbcli.plumb(*args, timeout=TIMEOUT_S)
    except subprocess.TimeoutExpired:
        return None, "", f"did not finish in {TIMEOUT_S} s"


def refused(args, wants, what):
    """Exit 2, every `want` on stderr, nothing on stdout, no -o file."""
    with tempfile.TemporaryDirectory(prefix="plumb-ranges-") as tmp:
        out = os.path.join(tmp, "out")
        rc, so, se = plumb(*args, "-o", out)
        left = os.listdir(tmp)
    ok = rc == 2 and all(w in se for w in wants) and so == "" and not left
    check(ok, f"{what}: exit {rc}, stderr {se.strip()!r}, wrote {left}")


def sweep_json(*args):
    rc, so, se = plumb("sweep", *args, "--format", "json")
    check(rc == 0, f"sweep {args} exits 0 ({se.strip()})")
    return json.loads(so) if rc == 0 else {"rows": [], "vary": []}


T = "atmosphere.temperature"

# ---- a temperature range is checked in degC / degF --------------------------
refused(["sweep", SURFACE, "--vary", f"{T}=0degC:30degC:-20degC"],
        ["--vary:1:37: atmosphere.temperature: ", "positive STEP"],
        "degC range with a negative step")
refused(["sweep", SURFACE, "--vary", f"{T}=0degC:30degC:-20degC",
         "--vary", "atmosphere.temperature_offset=0degC:30degC:-20degC"],
        ["--vary:1:37: atmosphere.temperature: "], "two such ranges (the writer used to loop for ever)")
refused(["sweep", SURFACE, "--vary", f"{T}=86degF:14degF:18degF"],
        ["--vary:1:38: atmosphere.temperature: ", "negative STEP"], "degF range down with a positive step")
refused(["sweep", SURFACE, "--vary", f"{T}=0degC:30degC:0degC"],
        ["--vary:1:37: atmosphere.temperature: ", "must not be zero"], "zero step")
refused(["sweep", SURFACE, "--vary", f"{T}=0degC:30degC:1e-20degC"],
        ["--vary:1:24: atmosphere.temperature: ", "more than 100000"], "a count past any integer")
# 101 x 100 values: 10100 rows, more than the 10000 of a sweep
refused(["sweep", SURFACE, "--vary", "release.height=1m:101m:1m",
         "--vary", "payload.mass=1kg:100kg:1kg"], ["10100 rows", "more than 10000"],
        "two ranges past the row cap")

# -5 to 35 degC by 10: 5 rows at 268.15 ... 308.15 K; at 15 degC the air is
# the 1976 sea-level air, and rho goes as 1/T at the same pressure.
d = sweep_json(SURFACE, "--vary", f"{T}=-5degC:35degC:10degC")
rows = d["rows"]
check([r["values_as_given"][T] for r in rows] == [-5, 5, 15, 25, 35],
      f"degC values as typed: {[r['values_as_given'][T] for r in rows]}")
check(d["vary"] and d["vary"][0]["unit"] == "degC" and d["vary"][0]["count"] == 5,
      f"range counted in degC: {d['vary']}")
for r in rows:
    want_k = r["values_as_given"][T] + 273.15
    got_k = r["inputs"]["atmosphere"]["strike_level"]["temperature_k"]
    check(abs(got_k - want_k) <= 1e-9, f"{r['values_as_given'][T]} degC is {want_k} K, got {got_k}")
    rho = r["inputs"]["atmosphere"]["strike_level"]["density_kg_m3"]
    want_rho = 1.2250 * 288.15 / want_k
    check(abs(rho - want_rho) <= 5e-5 * 288.15 / want_k,
          f"density at {want_k} K: {rho}, ideal gas from the 1976 table gives {want_rho}")

# 14 to 86 degF by 36: 263.15, 283.15, 303.15 K
d = sweep_json(SURFACE, "--vary", f"{T}=14degF:86degF:36degF")
got = [round(r["inputs"]["atmosphere"]["strike_level"]["temperature_k"], 9) for r in d["rows"]]
check(got == [263.15, 283.15, 303.15], f"degF rows in K: {got}")

# ---- a range may run down ---------------------------------------------------
d = sweep_json(THROWN, "--vary", "release.height=20m:5m:-5m")
got = [r["values_as_given"]["release.height"] for r in d["rows"]]
check(got == [20, 15, 10, 5], f"a sweep down from 20 m: {got}")
rc, so, se = plumb("sweep", THROWN, "--vary", "release.height=20m:5m:-5m")
check(rc == 0 and "from 20 to 5 m in steps of -5 m (4 values)\n" in so,
      f"the text says where a range down runs ({so[:200]!r})")

# ---- plumb air --alt, read by the same parser --------------------------------
rc, so, se = plumb("air", "--alt", "20km:0km:-10km", "--format", "json")
alts = [r["altitude_m"] for r in json.loads(so)["rows"]] if rc == 0 else None
check(alts == [20000, 10000, 0], f"air --alt 20km:0km:-10km: {alts} ({se.strip()})")
rc, so, se = plumb("air", "--alt", "0ft:1000ft:250ft", "--format", "json")
alts = [r["altitude_m"] for r in json.loads(so)["rows"]] if rc == 0 else None
want = [i * 250 * 0.3048 for i in range(5)]
check(alts is not None and len(alts) == 5 and all(abs(a - b) <= 1e-9 for a, b in zip(alts, want)),
      f"air --alt in feet: {alts}, want {want}")
refused(["air", "--alt", "0m:20km:-1km"], ["--alt:1:9: ", "positive STEP"],
        "air --alt with a step of the wrong sign")
refused(["air", "--alt", "0m:20km:0km"], ["--alt:1:9: ", "must not be zero"], "air --alt zero step")
refused(["air", "--alt", "0m:20km:0.1m"], ["--alt:1:1: ", "200001 values"], "air --alt too many rows")
# counts past what a double holds are refused without printing "inf", and
# ends near the largest double (1.8e308, IEEE 754) are counted exactly
refused(["air", "--alt", "0m:1e300m:1e-300m"], ["--alt:1:1: ", "more values than can be counted"],
        "air --alt a count past the largest double")
refused(["air", "--alt", "-1e308m:1e308m:1e300m"], ["--alt:1:1: ", "makes 200000001 values"],
        "air --alt ends near the largest double")
rc, so, se = plumb("air", "--alt", "0m:1e300m:1e-300m")
check("inf" not in se and "nan" not in se, f"no inf or nan in the message: {se.strip()!r}")

# ---- plumb air states its temperature offset in every format ----------------
# 18 degF as a difference is 10 K (NIST SP 811 B.9); T0 = 288.15 K (1976).
rc, so, se = plumb("air", "--alt", "0m:0m:1m", "--temperature-offset", "18degF", "--format", "json")
d = json.loads(so) if rc == 0 else {}
check(d.get("temperature_offset_k") == 10 and "plumb_version" in d
      and abs(d["rows"][0]["temperature_k"] - 298.15) <= 1e-9,
      f"air JSON states the offset and the version: {so[:200]!r}")
for fmt, want in [("text", "temperature offset +10 K"), ("csv", "# model: U.S. Standard Atmosphere "
                                                                 "1976, temperature offset +10 K")]:
    rc, so, se = plumb("air", "--alt", "0m:0m:1m", "--temperature-offset", "10K", "--format", fmt)
    check(rc == 0 and want in so, f"air {fmt} states the offset ({so[:300]!r})")

finish()
