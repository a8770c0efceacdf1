#!/usr/bin/python3
"""`plumb sweep` and `plumb limit` end to end.

Checks (the reference is `plumb fall` itself, which the other tests check
against closed forms and SciPy):
  - every sweep row equals `plumb fall --set KEY=VALUE` bit for bit, for
    one-way and two-way sweeps, SI and US units, and an inventory;
  - `plumb limit` answers, re-run through `plumb fall --set KEY=VALUE`, meet
    the limit within 1e-6 relative, for every kind of key: release height,
    payload mass, drag coefficient, wind speed, canopy area, release speed;
  - the unlimited case (terminal speed keeps the energy below the limit at
    any height) and the impossible case (exceeded even at almost zero
    height) are answered in words;
  - bad --vary / --find input gets exit status 2, a message naming the key,
    and writes nothing.
Usage: sweep_limit.py PATH/TO/plumb   (prints `cli: N passed, N failed`)
"""
import atexit
import json
import os
import shutil
import sys
import tempfile

sys.path.insert(0, os.path.join(os.path.dirname(os.path.abspath(__file__)), "lib"))
from plumbcli import HERE, check, finish, plumb  # noqa: E402

PROF = os.path.join(HERE, "profiles")


def fall_json(profile, *sets):
    args = ["fall", profile, "--format", "json"]
    for s in sets:
        args += ["--set", s]
    rc, out, err = plumb(*args)
    assert rc == 0, err
    return json.loads(out)


STRIP = ("inputs",)  # the inputs echo names the --set values; the figures must agree


def figures(obj):
    return {k: v for k, v in obj.items() if k not in STRIP}


def sweep_rows_equal_falls(profile, varies, units=None):
    args = ["sweep", profile, "--format", "json"]
    for v in varies:
        args += ["--vary", v]
    rc, out, err = plumb(*args)
    check(rc == 0, f"sweep {varies} exits 0 ({err.strip()})")
    if rc != 0:
        return
    d = json.loads(out)
    check(bool(d.get("cautions")), "sweep JSON carries the cautions")
    vary_units = {v["key"]: v["unit"] for v in d["vary"]}
    for row in d["rows"]:
        sets = [f"{k}={v!r} {vary_units[k]}".rstrip() for k, v in row["values_as_given"].items()]
        f = fall_json(profile, *sets)
        if "items" in f:
            ok = all(figures(a) == figures(b) for a, b in zip(row["items"], f["items"]))
            ok = ok and row["worst"] == f["worst"]
        else:
            ok = all(row[k] == f[k] for k in ("impact", "criteria", "terminal_speed_m_s",
                                              "apex_m", "drag_free", "solver"))
        check(ok, f"sweep row {row['values_as_given']} of {os.path.basename(profile)} equals plumb fall")


def limit_meets(profile, key, flag, limit, metric, unit, expect_unlimited=()):
    rc, out, err = plumb("limit", profile, "--find", key, flag, limit, "--format", "json")
    check(rc == 0, f"limit {key} {flag} {limit} exits 0 ({err.strip()})")
    if rc != 0:
        return None
    d = json.loads(out)["limit"]
    target = d[{"energy": "energy_max_j", "speed": "speed_max_m_s", "drift": "drift_max_m"}[metric]]
    for i, item in enumerate(d["items"]):
        if expect_unlimited and i in expect_unlimited:
            check(item["outcome"] == "unlimited", f"limit {key}: item {i} unlimited")
            continue
        check(item["outcome"] == "found", f"limit {key}: found ({item['explanation']})")
        if item["outcome"] != "found":
            continue
        set_key = key
        if len(d["items"]) > 1 and key.startswith("payload."):
            set_key = f"items[{i + 1}].{key[len('payload.'):]}"  # items count from 1
        f = fall_json(profile, f"{set_key}={item['value_si']!r} {unit}".rstrip())
        imp = f["items"][i]["impact"] if "items" in f else f["impact"]
        got = {"energy": imp["energy_j"], "speed": imp["speed_m_s"], "drift": imp["drift_m"]}[metric]
        rel = abs(got - target) / target
        check(rel <= 1e-6, f"limit {key}: fall at {item['value_si']} gives {got}, limit {target} "
                           f"(rel {rel:.1e})")
        # the value reported is on the side that meets the limit, never past it
        check(got <= target, f"limit {key}: the value {item['value_si']} meets the limit "
                             f"({got} <= {target})")
    return d


canopy = os.path.join(PROF, "canopy.yaml")
light = os.path.join(PROF, "light.yaml")
thrown = os.path.join(PROF, "thrown.yaml")
inventory = os.path.join(PROF, "inventory.yaml")

# sweeps
sweep_rows_equal_falls(thrown, ["release.height=2m:20m:4.5m"])
sweep_rows_equal_falls(thrown, ["release.height=5ft:40ft:5ft"])
sweep_rows_equal_falls(canopy, ["wind.speed=0kn:20kn:5kn", "descent.cd=0.6:0.9:0.15"])
sweep_rows_equal_falls(inventory, ["release.height=6m:18m:6m"])

# text and CSV carry the cautions too
for fmt in ("text", "csv"):
    rc, out, _ = plumb("sweep", thrown, "--vary", "release.height=2m:6m:2m", "--format", fmt)
    check(rc == 0 and "competent or" in out.replace("\n", " ").replace("#", ""),
          f"sweep {fmt} carries the cautions")

# limits on every kind of key
limit_meets(canopy, "release.height", "--energy-max", "40 J", "energy", "m")
limit_meets(canopy, "payload.mass", "--energy-max", "us-part107-cat3", "energy", "kg")
limit_meets(canopy, "descent.area", "--speed-max", "5.5 m/s", "speed", "m^2")
limit_meets(canopy, "wind.speed", "--drift-max", "50 m", "drift", "m/s")
limit_meets(canopy, "payload.drag.cd", "--drift-max", "80 m", "drift", "")
limit_meets(thrown, "release.velocity.east", "--drift-max", "3.1 m", "drift", "m/s")
# the glove's terminal speed keeps it under 30 J at any height
limit_meets(inventory, "release.height", "--energy-max", "30 J", "energy", "m", (2,))
limit_meets(inventory, "payload.mass", "--energy-max", "30 J", "energy", "kg")

# unlimited: a 47 g grip's terminal-speed energy (2.6 J) is below 14.9 J at any height
rc, out, err = plumb("limit", light, "--find", "release.height", "--energy-max", "us-part107-cat2",
                     "--format", "json")
d = json.loads(out)["limit"]["items"][0] if rc == 0 else {}
check(rc == 0 and d.get("outcome") == "unlimited" and "terminal speed" in d.get("explanation", ""),
      f"unlimited height is explained ({d.get('explanation')})")
# impossible: thrown down at 11 m/s, 2.31 kg carries 150 J even at zero height
rc, out, err = plumb("limit", thrown, "--find", "release.height", "--energy-max",
                     "ddesb-fragment-58ftlbf", "--format", "json")
d = json.loads(out)["limit"]["items"][0] if rc == 0 else {}
check(rc == 0 and d.get("outcome") == "impossible" and "zero height" in d.get("explanation", ""),
      f"impossible height is explained ({d.get('explanation')})")

# bad input: exit 2, the key named, nothing written
tmp = tempfile.mkdtemp(prefix="plumb-sweep-")
atexit.register(shutil.rmtree, tmp, ignore_errors=True)  # make check leaves nothing in /tmp
out_file = os.path.join(tmp, "out.json")
bad = [
    (["sweep", thrown, "--vary", "release.height=2m:20m"], "release.height"),
    (["sweep", thrown, "--vary", "release.height=2m:20s:1m"], "release.height"),
    (["sweep", thrown, "--vary", "release.height=2:20:1"], "release.height"),
    (["sweep", thrown, "--vary", "release.height=20m:2m:1m"], "release.height"),
    (["sweep", thrown, "--vary", "release.height=2m:20m:0m"], "release.height"),
    (["sweep", thrown, "--vary", "release.hieght=2m:20m:1m"], "release.hieght"),
    (["sweep", thrown, "--vary", "wind.profile=1:2:1"], "wind.profile"),
    (["sweep", thrown], "--vary"),
    (["limit", thrown, "--find", "wind.profile", "--energy-max", "30 J"], "wind.profile"),
    (["limit", thrown, "--find", "payload.mass", "--energy-max", "30"], "--energy-max"),
    (["limit", thrown, "--find", "payload.mass", "--energy-max", "30 m"], "--energy-max"),
    (["limit", thrown, "--find", "payload.mass"], "--energy-max"),
    (["limit", thrown, "--find", "payload.mas", "--speed-max", "9 m/s"], "payload.mas"),
]
# a criterion id with a typo: located at its entry, with a did-you-mean
typo = os.path.join(PROF, "criterion-typo.yaml")
# (one run, both parts of its message checked)
bad.append((["fall", typo], ("criterion-typo.yaml:7:23: criteria[1]", "did you mean 'us-part107-cat3'")))
bad.append((["limit", typo, "--find", "release.height", "--energy-max", "50J"],
            "criterion-typo.yaml:7:23: criteria[1]"))
for args, keys in bad:
    rc, out, err = plumb(*args, "-o", out_file)
    for key in keys if isinstance(keys, tuple) else (keys,):
        check(rc == 2 and key in err and not os.path.exists(out_file),
              f"{' '.join(args[2:])}: exit {rc}, {key!r} in the message {err.strip()!r}")

rc, out, err = plumb("lint", typo)
check(rc == 2 and "criterion-typo.yaml:7:23: criteria[1]" in err,
      f"lint of a criterion typo: exit {rc}, message {err.strip()!r}")

finish()
