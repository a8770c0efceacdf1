"""What a kit zone says of its clearance radius is true of the figures it
prints (README.md, "Kits"). The new-user review's stage-rig kit: the gel
frame's landing circle (66.50 ft around a centre 1.922 ft N) reached past
the kit clearance radius (65.46 ft around the drop point) while the text
said "every item's zone lies within it".

Checked from the JSON, by plane geometry (a circle of radius r around c
lies within the circle of radius R around o when |c - o| + r <= R):
- every item's clearance circle is around the planned drop point and no
  larger than the kit clearance radius, so it lies within the kit's circle;
- the text and CSV say of the landing circles what holds: the one that
  reaches farthest from the drop point is named with that reach (printed
  rounded up, never below it), and said to lie beyond the kit radius
  exactly when it does;
- the figure the text says to fence holds every item's clearance circle
  and landing circle;
- the old claim "every item's zone lies within it" is gone.
"""
import json
import math
import os
import re
import shutil
import sys
import tempfile

sys.path.insert(0, os.path.join(os.path.dirname(os.path.abspath(__file__)), "lib"))
from plumbcli import check, finish, plumb  # noqa: E402

FT = 0.3048  # m per international foot (exact, by definition, 1959)
tmp = tempfile.mkdtemp(prefix="plumb-zone-kit-reach.")
kit = os.path.join(tmp, "truss.yaml")
with open(kit, "w") as f:
    f.write("""# Invented test scenario: a stage rig's truss grid kit (the review's).
name: Stage rig truss grid kit
items:
  - {name: C-clamp, mass: 2.2 lb, drag: {cd: 1.1, area: 0.15 ft^2}}
  - {name: spanner 3/4in, mass: 10 oz, drag: {cd_area: 0.0008 m^2}}
  - {name: gel frame, mass: 3 oz, shape: {kind: plate, edges: [7.5 in, 7.5 in], thickness: 0.1 in, attitude: broadside}}
release: {height: 45 ft}
atmosphere: {model: surface, pressure: 29.92 inHg, temperature: 72 degF}
criteria: [z89-type1-54j]
uncertainty:
  release.height: {uniform: [40 ft, 50 ft]}
  release.velocity.east: {normal: [0 ft/s, 3 ft/s]}
zone: {samples: 2000, seed: 5}
""")

rc, so, se = plumb("zone", kit, "--format", "json", "--threads", "2")
check(rc == 0, f"JSON runs: {rc} {se}")
d = json.loads(so) if rc == 0 else {"kit": {"clearance_radius_m": 0.0}, "items": []}
R = d["kit"]["clearance_radius_m"]
reach = {}
for it in d["items"]:
    z = it["zone"]
    check(z["centre_m"] == z["release_point_m"],
          f"{it['name']}: the clearance circle is around the planned drop point")
    check(z["clearance_radius_m"] <= R,
          f"{it['name']}: clearance {z['clearance_radius_m']} m within the kit's {R} m")
    c = z["landing"]["circle"]
    if not c["open"]:
        reach[it["name"]] = math.hypot(c["centre_m"][0] - z["release_point_m"][0],
                                       c["centre_m"][1] - z["release_point_m"][1]) + c["clearance_radius_m"]
check(R == max(it["zone"]["clearance_radius_m"] for it in d["items"]) if d["items"] else False,
      "the kit clearance radius is the largest item's")
far = max(reach, key=reach.get) if reach else None
check(far == "gel frame" and reach[far] > R,
      f"this profile exercises the case: a landing circle reaches past the kit radius {reach} > {R}")

rc, so, se = plumb("zone", kit, "--units", "us", "--threads", "2")
check(rc == 0, f"text runs: {rc} {se}")
block = " ".join(so.split("==== The kit", 1)[-1].split("\nProfile", 1)[0].split())
check("every item's zone lies within it" not in block, f"no claim of every zone: {block}")
check("every item's clearance circle, around the same point, lies within it" in block,
      f"the claim made is of the clearance circles: {block}")
m = re.search(r"Kit clearance radius at 99 %: ([0-9.]+) ft around the planned drop point", block)
check(m is not None and float(m.group(1)) * FT >= R and (float(m.group(1)) - 0.01) * FT < R,
      f"the kit radius printed is the JSON's, rounded up: {m and m.group(1)} ft vs {R / FT} ft")
if far:
    m = re.search(re.escape(far) + r"'s reaches ([0-9.]+) ft from the drop point, beyond this radius; "
                  r"fence ([0-9.]+) ft to keep it clear too", block)
    check(m is not None, f"the text names the farthest landing circle and its reach: {block}")
    if m:
        shown, fence = float(m.group(1)) * FT, float(m.group(2)) * FT
        check(shown >= reach[far] and shown - 0.01 * FT < reach[far],
              f"its reach printed rounded up: {m.group(1)} ft vs {reach[far] / FT} ft")
        check(fence >= max(reach.values()) and fence >= R,
              f"the fence {m.group(2)} ft holds every clearance and landing circle")
    check("lies within it too" not in block, "a circle beyond is not said to lie within")

rc, so, se = plumb("zone", kit, "--format", "csv", "--threads", "2")
kl = [l for l in so.splitlines() if l.startswith("# kit: the landing circle reaching farthest")]
check(rc == 0 and len(kl) == 1, f"CSV: one reach line: {kl}")
if kl and far:
    m = re.search(re.escape(far) + r"'s, reaches ([0-9.]+) m, beyond the kit clearance radius", kl[0])
    check(m is not None and float(m.group(1)) >= reach[far],
          f"CSV: the reach, never below it, and beyond: {kl[0]}")
check("every item's zone lies within it" not in so, "CSV: no claim of every zone")

# The kit without its gel frame: its landing circles stay inside, and the
# text says so, with the farthest reach.
kit2 = os.path.join(tmp, "tools.yaml")
with open(kit) as f, open(kit2, "w") as g:
    g.write("".join(l for l in f if "gel frame" not in l))
rc, so, se = plumb("zone", kit2, "--threads", "2", "--format", "json")
check(rc == 0, f"tools only runs: {se}")
if rc == 0:
    d2 = json.loads(so)
    R2 = d2["kit"]["clearance_radius_m"]
    r2 = {}
    for it in d2["items"]:
        z, c = it["zone"], it["zone"]["landing"]["circle"]
        if not c["open"]:
            r2[it["name"]] = math.hypot(*[c["centre_m"][k] - z["release_point_m"][k]
                                          for k in (0, 1)]) + c["clearance_radius_m"]
    check(r2 and max(r2.values()) <= R2, f"tools only: the circles stay inside {r2} <= {R2}")
    rc, so, se = plumb("zone", kit2, "--threads", "2")
    block = " ".join(so.split("==== The kit", 1)[-1].split("\nProfile", 1)[0].split())
    far2 = max(r2, key=r2.get) if r2 else ""
    m = re.search(r"every item's landing circle, around its own centre, lies within it too "
                  r"\(the farthest, " + re.escape(far2) + r"'s, reaches ([0-9.]+) m", block)
    check(m is not None and float(m.group(1)) >= r2[far2] and "beyond" not in block,
          f"tools only: said to lie within, with the farthest reach: {block}")
shutil.rmtree(tmp)
finish()
