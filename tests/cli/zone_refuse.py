"""What a zone says when its inputs cannot make one.

- A profile with no `uncertainty:` map is refused in every format (GeoJSON
  too, before its need of a site on the map), with
  exit status 2, a message naming the `uncertainty:` map with an example
  of it, nothing on standard output and no -o or --samples-out file.
- Only the mass uncertain, dropped from rest in still air: the impact
  point cannot move (a fall from rest in still air is vertical: Newton's
  second law with drag along the velocity, which stays vertical), so
  every format carries the impact_point_fixed warning, and JSON
  says "impact_point_fixed": true.
- A criterion that is a helmet test energy carries its note ("not a safe
  limit") in the zone's "warnings", as plumb fall's JSON does.
- An uncertainty of zero width (normal sd 0, uniform or triangular whose
  ends meet, "x +- 0") is no uncertainty either (README.md, "plumb zone"):
  refused with exit 2 at its file:line:col and key, saying "zero width",
  alone or beside an input that varies, from the profile or from --set;
  nothing written.
- The impact_point_fixed advice says what is the case: the wind uncertain
  but the payload without drag (the wind cannot move it: the drag is the
  only force that couples them, README.md "Physics"), or a calm wind whose
  direction alone is uncertain, is not told to give the wind's uncertainty.
"""
import json
import shutil
import os
import sys
import tempfile

sys.path.insert(0, os.path.join(os.path.dirname(os.path.abspath(__file__)), "lib"))
from plumbcli import check, finish, plumb  # noqa: E402

tmp = tempfile.mkdtemp(prefix="plumb-zone-refuse.")
bare = os.path.join(tmp, "bare.yaml")
with open(bare, "w") as f:
    f.write("""# Invented test scenario: a hammer dropped 60 m, nothing uncertain.
name: Hammer, no uncertainty
payload: {mass: 2 kg, drag: {cd: 0.9, area: 0.003 m^2}}
release: {height: 60 m}
criteria: [en397-shock-49j]
zone: {samples: 2000, seed: 5}
""")

for fmt in ("text", "json", "csv", "geojson"):
    out = os.path.join(tmp, f"out.{fmt}")
    smp = os.path.join(tmp, f"samples.{fmt}.csv")
    rc, so, se = plumb("zone", bare, "--format", fmt, "-o", out, "--samples-out", smp)
    check(rc == 2, f"{fmt}: no uncertainty exits 2, got {rc}: {se}")
    check("uncertainty:" in se and "{normal:" in se,
          f"{fmt}: the message names the uncertainty: map with an example: {se}")
    check(so == "" and not os.path.exists(out) and not os.path.exists(smp),
          f"{fmt}: nothing written")
    check(not [n for n in os.listdir(tmp) if n.startswith(".")], f"{fmt}: no temporary file left")

# Mass alone in still air from rest: the impact point is fixed.
UNC = "uncertainty.payload.mass={normal: [2 kg, 0.2 kg]}"
rc, so, se = plumb("zone", bare, "--set", UNC, "--format", "json", "--threads", "1")
check(rc == 0, f"mass only: runs, {rc}: {se}")
if rc == 0:
    z = json.loads(so)["zone"]
    check(z["impact_point_fixed"] is True, "JSON impact_point_fixed true")
    check(any(w.startswith("impact_point_fixed") for w in z["warnings"]),
          f"JSON warnings name impact_point_fixed: {z['warnings']}")
    check(any("not a safe limit" in w for w in z["warnings"]),
          f"JSON warnings carry the helmet-test note: {z['warnings']}")
rc, so, se = plumb("zone", bare, "--set", UNC, "--threads", "1")
check(rc == 0 and "impact_point_fixed" in so.split("Uncertain inputs")[0],
      f"text: the warning comes before the figures: {so[:600]}")
rc, so, se = plumb("zone", bare, "--set", UNC, "--format", "csv", "--threads", "1")
check(rc == 0 and any(l.startswith("# warning:") and "impact_point_fixed" in l
                      for l in so.splitlines()), "CSV: # warning: impact_point_fixed line")

# With a wind that varies, the point moves: no such warning, false in JSON.
rc, so, se = plumb("zone", bare, "--set", "wind.speed=4 m/s",
                   "--set", "uncertainty.wind.speed={normal: [4 m/s, 1 m/s]}",
                   "--format", "json", "--threads", "1")
check(rc == 0, f"wind uncertain: runs: {se}")
if rc == 0:
    z = json.loads(so)["zone"]
    check(z["impact_point_fixed"] is False and
          not any(w.startswith("impact_point_fixed") for w in z["warnings"]),
          "wind uncertain: the impact point is not fixed")
# Zero width: each form, at the key's line and column, nothing written.
ZERO = ["{normal: [8 m/s, 0 m/s]}", "{uniform: [8 m/s, 8 m/s]}", '"8 m/s +- 0 m/s"',
        "{triangular: [8 m/s, 8 m/s, 8 m/s]}", "{normal: [17.9 mph, 0 mph]}"]
for z in ZERO:
    for other in ("", "  release.position.east: {normal: [0 m, 1.3 m]}\n"):
        zp = os.path.join(tmp, "zero.yaml")
        with open(zp, "w") as f:
            f.write("# Invented test scenario: a zone whose wind has no spread.\n"
                    "payload: {mass: 5 kg, drag: {cd: 1, area: 0.01 m^2}}\n"
                    "release: {height: 10 m}\n"
                    "wind: {speed: 8 m/s}\n"
                    "uncertainty:\n" + other +
                    "  wind.speed: " + z + "\n")
        line = 7 if other else 6  # after the comment and the map's own line
        out = os.path.join(tmp, "zero.txt")
        rc, so, se = plumb("zone", zp, "--samples", "400", "-o", out)
        what = f"{z}{' beside a varying input' if other else ''}"
        check(rc == 2, f"zero width {what}: exit 2, got {rc}: {se}")
        check(se.startswith(f"plumb: {zp}:{line}:3: wind.speed: ") and "zero width" in se,
              f"zero width {what}: refused at its key, says zero width: {se}")
        check(so == "" and not os.path.exists(out), f"zero width {what}: nothing written")
rc, so, se = plumb("zone", bare, "--set", "uncertainty.wind.from={uniform: [250 deg, 250 deg]}",
                   "--set", "wind.speed=4 m/s", "--format", "json")
check(rc == 2 and "--set" in se and "wind.from" in se and "zero width" in se and so == "",
      f"zero width from --set: refused there: {rc} {se}")

# The advice of impact_point_fixed says what is the case.
def fixed_warning(profile_text, *extra):
    path = os.path.join(tmp, "fixed.yaml")
    with open(path, "w") as f:
        f.write(profile_text)
    rc, so, se = plumb("zone", path, "--format", "json", "--threads", "1", *extra)
    check(rc == 0, f"runs: {rc} {se}")
    if rc != 0:
        return ""
    ws = [w for w in json.loads(so)["zone"]["warnings"] if w.startswith("impact_point_fixed")]
    check(len(ws) == 1, f"one impact_point_fixed warning: {ws}")
    return ws[0] if ws else ""

w = fixed_warning("# Invented: a drag-free 5 kg mass in an uncertain wind.\n"
                  "payload: {mass: 5 kg, drag: {cd: 0, area: 0.01 m^2}}\n"
                  "release: {height: 10 m}\nwind: {speed: 5 m/s}\n"
                  "uncertainty:\n  wind.speed: {normal: [5 m/s, 1 m/s]}\n"
                  "zone: {samples: 400, seed: 3}\n")
check("no drag" in w and "does not move it" in w and "uncertainty of the wind" not in w,
      f"drag-free: the wind cannot move it, not 'give the wind's uncertainty': {w}")
w = fixed_warning("# Invented: a calm wind whose direction alone is uncertain.\n"
                  "payload: {mass: 5 kg, drag: {cd: 1, area: 0.01 m^2}}\n"
                  "release: {height: 10 m}\n"
                  "uncertainty:\n  wind.from: {uniform: [200 deg, 300 deg]}\n"
                  "zone: {samples: 400, seed: 3}\n")
check("calm" in w and "uncertainty of the wind speed" in w,
      f"calm wind: says it is calm, asks for the wind speed's uncertainty: {w}")
w = fixed_warning(open(bare).read(), "--set", UNC)
check("Give the uncertainty of the wind, the release point or the release velocity" in w,
      f"mass only: asks for the wind, release point or velocity: {w}")
shutil.rmtree(tmp)
finish()
