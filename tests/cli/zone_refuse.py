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
shutil.rmtree(tmp)
finish()
