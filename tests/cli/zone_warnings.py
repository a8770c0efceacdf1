#!/usr/bin/python3
"""A zone's warnings, whole (a cut warning hides what it warns of):
plumb zone carries the warnings of
each item's fall (the glide of a plate, the rotor downwash) and must print
every one of them whole, as plumb fall does, in text, JSON and CSV; none
may end cut mid-word or carry the library's mark of a cut warning. Before
the fix a zone kept 320 bytes of each: the glide warning ended
`..."radius = drop height" is not conservati` and the downwash one
`...release velocity for the whol`.

The profiles are invented test scenarios (a tumbling plate in wind; a
payload let go from a moving multirotor, so that both downwash warnings
appear; a kit of the two); the figures are not checked here, only that
the sentences are the same in both commands.
Usage: zone_warnings.py PATH/TO/plumb   (prints `cli: N passed, N failed`)
"""
import json
import os
import shutil
import sys
import tempfile

sys.path.insert(0, os.path.join(os.path.dirname(os.path.abspath(__file__)), "lib"))
from plumbcli import check, finish, plumb  # noqa: E402

CUT = "warning cut short"

SCENE = """release:
  height: 27.3 m
  velocity: {speed: 3.7 m/s, heading: 283 deg, climb: 0 m/s}
  downwash: {aircraft_mass: 6.35 kg, disk_area: 0.93 m^2}
site:
  elevation: 143 m
  latitude: 51.3 deg
wind:
  profile: uniform
  speed: 6.3 m/s
  from: 251 deg
uncertainty:
  wind.speed: {normal: [6.3 m/s, 1.1 m/s]}
"""
PLATE = """name: tumbling plate in wind
payload:
  mass: 0.437 kg
  shape: {kind: plate, edges: [0.31 m, 0.23 m], thickness: 0.004 m, attitude: tumbling}
  glide: tumble
release:
  height: 23.7 m
site:
  elevation: 120 m
  latitude: 51.3 deg
wind:
  profile: uniform
  speed: 6.3 m/s
  from: 250 deg
uncertainty:
  wind.speed: {normal: [6.3 m/s, 1.1 m/s]}
"""
DRONE = """name: pouch let go from a moving multirotor
payload:
  mass: 0.85 kg
  drag: {cd: 1.05, area: 0.0376 m^2, source: invented test value}
""" + SCENE
KIT = """name: kit of a plate and a pouch under a multirotor
items:
  - name: tumbling plate
    mass: 0.437 kg
    shape: {kind: plate, edges: [0.31 m, 0.23 m], thickness: 0.004 m, attitude: tumbling}
    glide: tumble
  - name: pouch
    mass: 0.85 kg
    drag: {cd: 1.05, area: 0.0376 m^2, source: invented test value}
""" + SCENE


def fall_only(w):
    """A note on what one fall leaves out, which plumb zone's samples include."""
    return (w.startswith("Plate-like:") and "plumb zone adds the glide, this fall does not" in w or
            w.startswith("Gusts of the ") and "this single fall uses the mean wind" in w)


def squeeze(text):
    return " ".join(text.split())


def fall_warnings(path):
    """{item name: [warnings]} of plumb fall --format json."""
    rc, out, err = plumb("fall", path, "--format", "json")
    check(rc == 0, f"fall {path}: exit {rc} {err.strip()[:200]}")
    if rc != 0:
        return {}
    d = json.loads(out)
    if d.get("inventory"):
        return {it["name"]: it.get("warnings", []) for it in d["items"]}
    return {d.get("profile", {}).get("name", ""): d.get("warnings", [])}


tmp = tempfile.mkdtemp(prefix="plumb-zone-warnings.", dir=os.environ.get("TMPDIR"))
try:
    for label, text, want in (("plate", PLATE, ['"radius = drop height" is not conservative '
                                                'for plates.']),
                              ("drone", DRONE, ["release velocity for the whole fall.",
                                                "this is a rough guide only."]),
                              ("kit", KIT, ['is not conservative for plates.',
                                            "release velocity for the whole fall."])):
        path = os.path.join(tmp, label + ".yaml")
        with open(path, "w") as f:
            f.write(text)
        fw = fall_warnings(path)
        every = [w for ws in fw.values() for w in ws]
        # the fall itself gives the long warnings whole (the reference here)
        for end in want:
            check(any(w.endswith(end) for w in every),
                  f"{label}: plumb fall has a warning ending {end!r}: {every}")
        check(all(w.endswith(".") and CUT not in w for w in every),
              f"{label}: plumb fall's warnings end their sentences: {every}")
        # the zone carries the fall's warnings but the notes on what the
        # single fall leaves out (the plate glide, the gusts), which its
        # samples include (include/plumb/judge.h)
        only = [w for w in every if fall_only(w)]
        fw = {name: [w for w in ws if not fall_only(w)] for name, ws in fw.items()}
        run = ("zone", path, "--samples", "400", "--threads", "1")
        rc, out, err = plumb(*run, "--format", "json")
        check(rc == 0, f"zone {label} json: exit {rc} {err.strip()[:200]}")
        if rc == 0:
            d = json.loads(out)
            if d.get("inventory"):
                zw = {it["name"]: it["zone"]["warnings"] for it in d["items"]}
            else:
                zw = {name: d["zone"]["warnings"] for name in fw}
            for name, ws in fw.items():
                for w in ws:
                    check(w in zw.get(name, []), f"zone {label} json, {name}: lacks the whole "
                          f"warning {w!r}; has {zw.get(name)}")
            allz = [w for ws in zw.values() for w in ws]
            check(all(w.endswith(".") and CUT not in w for w in allz),
                  f"zone {label} json: a warning cut: {allz}")
        rc, out, err = plumb(*run, "--format", "csv")
        check(rc == 0, f"zone {label} csv: exit {rc} {err.strip()[:200]}")
        lines = out.splitlines()
        # said as plumb fall says it: the sentence whole, then, in a kit, the
        # item it is said of in brackets (src/report/report.c, plumbp_who_text)
        kit = label == "kit"
        said = {name: [f"{w} ({name})" if kit else w for w in ws] for name, ws in fw.items()}
        for name, ws in said.items():
            for w in ws:
                check(f"# warning: {w}" in lines,
                      f"zone {label} csv: lacks the line '# warning: {w}'")
        warn = [l for l in lines if l.startswith("# warning: ")]
        ends = tuple(f". ({name})" for name in fw) if kit else (".",)
        check(warn and all(l.endswith(ends) and CUT not in l for l in warn),
              f"zone {label} csv: a warning cut: {warn}")
        # the map's warnings, in the same form
        rc, out, err = plumb(*run, "--format", "geojson", "--set", "site.longitude=-1.8 deg")
        check(rc == 0, f"zone {label} geojson: exit {rc} {err.strip()[:200]}")
        gw = json.loads(out)["properties"]["warnings"] if rc == 0 else []
        for name, ws in said.items():
            for w in ws:
                check(w in gw, f"zone {label} geojson: lacks the warning {w!r}; has {gw}")
        rc, out, err = plumb(*run)
        check(rc == 0, f"zone {label} text: exit {rc} {err.strip()[:200]}")
        flat = squeeze(out)
        for w in every:
            if w in only:
                check(squeeze(w) not in flat, f"zone {label} text: has the single fall's note {w!r}")
            else:
                check(squeeze(w) in flat, f"zone {label} text: lacks the whole warning {w!r}")
        check(CUT not in flat, f"zone {label} text: a warning is marked cut")
    # A parachute set to open 60 s after release from 30 m: every fall has
    # landed by then (plumb fall warns that it does not open), and the zone
    # says so in every format, with the count of samples (the count itself
    # is checked by logic in test_dispersion.c); the same with the deploy
    # time uncertain, so that only some samples open it.
    late = os.path.join(tmp, "late.yaml")
    with open(late, "w") as f:
        f.write("""name: bag under a late parachute
payload: {mass: 1.213 kg, drag: {cd: 0.93, area: 0.0187 m^2, source: invented test value}}
descent: {kind: parachute, cd: 0.78, area: 1.47 m^2, deploy: {after: 60 s}, fill_time: 0.8 s}
release: {height: 30 m}
wind: {speed: 3.1 m/s, from: 250 deg}
uncertainty:
  wind.speed: {normal: [3.1 m/s, 0.9 m/s]}
""")
    ws = fall_warnings(late).get("bag under a late parachute", [])
    check(any("(descent[0]) does not open before impact" in w for w in ws),
          f"late chute: plumb fall warns it does not open: {ws}")
    every = ("The parachute (descent[0]) did not open before impact in any of the 400 samples: "
             "every figure is that of a fall without it.")
    # with the deploy time uncertain over the fall time (about 2.6 s), some
    # samples never open it and some are still filling (0.8 s) at impact:
    # one warning gives both counts (checked by logic in test_dispersion.c)
    some = ("--set", "uncertainty.descent.deploy.after={uniform: [1.3 s, 4.7 s]}")
    part = (" of 400 samples (", "parachute (descent[0]) was not fully open at impact in ",
            ") it did not open before impact, in ", ") it was still filling.")
    for args, want in (((), (every, "parachute (descent[0]) did not open")), (some, part)):
        run = ("zone", late, "--samples", "400", "--threads", "2") + args
        rc, out, err = plumb(*run, "--format", "json")
        zw = json.loads(out)["zone"]["warnings"] if rc == 0 else []
        check(rc == 0 and any(all(p in w for p in want) for w in zw),
              f"late chute {args}: JSON warning {want!r}: {zw}")
        want = want[0]
        for units in ("si", "us"):
            rc, out, err = plumb(*run, "--format", "csv", "--units", units)
            warn = [l for l in out.splitlines() if "did not open before impact" in l]
            # one profile, not a kit: the sentence alone, as plumb fall's CSV
            check(rc == 0 and len(warn) == 1 and warn[0].startswith(
                  "# warning: The parachute (descent[0])")
                  and warn[0].endswith(".") and want in warn[0]
                  and (args or warn[0] == "# warning: " + want),
                  f"late chute {args} csv {units}: {warn}")
            rc, out, err = plumb(*run, "--units", units)
            check(rc == 0 and want in squeeze(out.split("Uncertain inputs")[0]),
                  f"late chute {args} text {units}: a warning {want!r} before the inputs")
finally:
    shutil.rmtree(tmp)
finish()
