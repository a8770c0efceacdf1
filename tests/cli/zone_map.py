"""The zone where things land, and on a map.

Checks, each against something outside plumb:
- Coverage on a closed form: a drag-free fall (cd_area 0) from H with the
  release velocity normal, sd s_e east and s_n north, lands at
  v t, t = sqrt(2 H / g0) (g0 = 9.80665 m/s^2, the standard gravity), so
  the impacts are exactly bivariate normal with sd s t (any mechanics
  text, e.g. Marion & Thornton, Classical Dynamics, ch. 2). Fresh draws
  from that normal (numpy) fall inside the landing circle and the landing
  polygon at least the stated fraction p of the time; each bound holds
  with 95 % confidence, so over 12 seeds more than 3 shortfalls would have
  probability < 0.003 (binomial(12, 0.05) tail).
- GeoJSON (RFC 7946) read back by GDAL's ogrinfo (an independent GIS
  reader): the feature count, the geometry types, every geometry valid
  (ST_IsValid through ogrinfo's SQLite dialect); every ring closed and
  counter-clockwise (shoelace, RFC 7946 sec. 3.1.6).
- The map positions converted back with PROJ's geodesic (pyproj.Geod,
  C. F. F. Karney, J. Geodesy 87, 43-55, 2013) to east, north metres from
  the site: within 1 mm of the local figures, and the --regions-out
  polygons the same shapes as the GeoJSON ones.
- Sectors and quadrants: a wind from each quadrant and across north moves
  the landing circle's centre downwind (the mean drift of a light payload
  goes with the wind).
- A kit names the item that sets its zone in text, JSON and GeoJSON, and
  the item of the largest landing circle; none when that circle is open
  (JSON null, as the text and CSV say "open").
- Attitude as an uncertain input: drawn by weight (the counts within 4
  binomial standard deviations of N w), the end-on fall (the smaller
  cd x area: the faster fall, Newton's drag law) sets the largest energy
  and the broadside one (the larger cd x area: the more drift) the
  farthest impact; named attitudes on shapes for a kit; bad forms exit 2.
- The GeoJSON is byte for byte the same for 1 and 3 threads; without the
  site on the map it is refused with exit status 2 and nothing written.
"""
import csv
import io
import json
import math
import os
import shutil
import subprocess
import sys
import tempfile

import numpy as np
from pyproj import Geod

sys.path.insert(0, os.path.join(os.path.dirname(os.path.abspath(__file__)), "lib"))
from plumbcli import ROOT, check, finish, plumb  # noqa: E402

tmp = tempfile.mkdtemp(prefix="plumb-zone-map.")
G0 = 9.80665
H = 45.0
SE, SN, VE = 2.0, 1.0, 3.0


def write(name, text):
    p = os.path.join(tmp, name)
    with open(p, "w") as f:
        f.write(text)
    return p


normal = write("normal.yaml", f"""# Invented test case: drag-free, normal release velocity.
name: drag-free normal release
payload: {{mass: 1 kg, drag: {{cd_area: 0 m^2}}}}
release:
  height: {H} m
  velocity: {{east: {VE} m/s, north: 0 m/s, up: 0 m/s}}
site: {{latitude: 47.25 deg, longitude: 8.5 deg}}
uncertainty:
  release.velocity.east: {{normal: [{VE} m/s, {SE} m/s]}}
  release.velocity.north: {{normal: [0 m/s, {SN} m/s]}}
zone: {{samples: 4000, seed: 1, confidence: 0.9, scatter: 1.5 m}}
""")


def in_polygon(rings, x, y):
    """Even-odd rule over every ring (O'Rourke, Computational Geometry in C, 7.4)."""
    inside = np.zeros(x.shape, dtype=bool)
    for ring in rings:
        r = np.asarray(ring)
        hit = np.zeros(x.shape, dtype=bool)
        for i in range(len(r) - 1):
            (x1, y1), (x2, y2) = r[i], r[i + 1]
            c = (y1 > y) != (y2 > y)
            with np.errstate(divide="ignore", invalid="ignore"):
                xs = (x2 - x1) * (y - y1) / (y2 - y1) + x1
            hit ^= c & (x < xs)
        inside |= hit
    return inside


# ---- coverage on the closed form ---------------------------------------------
t = math.sqrt(2 * H / G0)
rng = np.random.default_rng(20261202)
fresh = rng.normal(size=(200000, 2)) * [SE * t, SN * t] + [VE * t, 0.0]
short_circle = short_poly = 0
for seed in range(1, 13):
    rc, so, se = plumb("zone", normal, "--seed", str(seed), "--format", "json", "--threads", "2")
    check(rc == 0, f"normal, seed {seed}: runs: {se}")
    if rc:
        continue
    L = json.loads(so)["zone"]["landing"]
    c = L["circle"]
    cx, cy = c["centre_m"]
    d = np.hypot(fresh[:, 0] - cx, fresh[:, 1] - cy)
    if np.mean(d <= c["radius_bound_m"]) < 0.9:
        short_circle += 1
    pg = L["polygon"]
    check(not pg["open"], f"seed {seed}: the polygon is bounded")
    if not pg["open"]:
        if np.mean(in_polygon(pg["rings_m"], fresh[:, 0], fresh[:, 1])) < 0.9:
            short_poly += 1
        # the highest-density region of a normal is the ellipse of area
        # -2 ln(1 - p) pi sd_e sd_n (Johnson & Wichern, result 4.7); the
        # grid and the bound only add area
        ell = -2 * math.log(0.1) * math.pi * SE * t * SN * t
        check(0.95 * ell <= pg["area_m2"] <= 1.2 * ell,
              f"seed {seed}: polygon area {pg['area_m2']:.1f} m2 near the ellipse's {ell:.1f}")
        check(pg["buffered_area_m2"] > pg["area_m2"], "the buffered polygon is larger")
    check(abs(c["clearance_radius_m"] - c["radius_bound_m"] - 1.5) < 1e-9,
          "the circle carries the 1.5 m scatter allowance")
check(short_circle <= 3, f"landing circle short of 90 % in {short_circle} of 12 seeds")
check(short_poly <= 3, f"landing polygon short of 90 % in {short_poly} of 12 seeds")

# ---- GeoJSON read back --------------------------------------------------------
gj = os.path.join(tmp, "zone.geojson")
rcsv = os.path.join(tmp, "regions.csv")
rc, so, se = plumb("zone", normal, "--format", "geojson", "-o", gj, "--regions-out", rcsv,
                   "--threads", "1", "--target", "5m,-3m", "--quiet")
check(rc == 0, f"geojson: runs: {se}")
g = json.load(open(gj))
check(g["type"] == "FeatureCollection", "a FeatureCollection")
props = g["properties"]
check(len(props["cautions"]) >= 5 and any("SAFETY.md" in c for c in props["cautions"]),
      "the cautions are in the collection's properties")
kinds = [f["properties"]["kind"] for f in g["features"]]
for k in ("release_point", "mean_impact", "median_impact", "landing_circle", "landing_region",
          "landing_region_buffered", "clearance_circle", "target"):
    check(k in kinds, f"feature {k} present")
info = subprocess.run(["ogrinfo", "-ro", "-so", "-al", gj], capture_output=True, text=True)
check(info.returncode == 0 and f"Feature Count: {len(g['features'])}" in info.stdout,
      f"ogrinfo reads {len(g['features'])} features: {info.stdout[:300]} {info.stderr[:300]}")
sql = subprocess.run(["ogrinfo", "-ro", "-q", "-dialect", "sqlite", "-sql",
                      "SELECT kind, ST_IsValid(geometry) AS valid, ST_GeometryType(geometry) AS gt "
                      "FROM zone", gj], capture_output=True, text=True)
rows = [ln.split("=", 1)[1].strip() for ln in sql.stdout.splitlines() if "=" in ln]
triples = [rows[i:i + 3] for i in range(0, len(rows), 3)]
check(len(triples) == len(g["features"]), f"ogrinfo SQL lists every feature: {sql.stderr[:300]}")
for kind, valid, gt in triples:
    want = "POINT" if kind in ("release_point", "mean_impact", "median_impact", "target",
                               "aim_release_point") else ("POLYGON", "MULTIPOLYGON")
    check(gt == want or gt in want, f"{kind}: geometry {gt}")
    check(valid == "1", f"{kind}: GDAL finds the geometry valid")
geod = Geod(ellps="WGS84")
slat, slon = 47.25, 8.5


def back(lon, lat):
    az, _, dist = geod.inv(slon, slat, lon, lat)
    return dist * math.sin(math.radians(az)), dist * math.cos(math.radians(az))


worst = 0.0
for f in g["features"]:
    geom, pr = f["geometry"], f["properties"]
    if geom["type"] == "Point":
        e, n = back(*geom["coordinates"])
        worst = max(worst, math.hypot(e - pr["east_north_m"][0], n - pr["east_north_m"][1]))
        continue
    polys = [geom["coordinates"]] if geom["type"] == "Polygon" else geom["coordinates"]
    for poly in polys:
        ring = poly[0]
        check(ring[0] == ring[-1] and len(ring) >= 4, f"{pr['kind']}: ring closed")
        en = [back(*p) for p in ring]
        a = sum(en[i][0] * en[i + 1][1] - en[i + 1][0] * en[i][1] for i in range(len(en) - 1))
        check(a > 0, f"{pr['kind']}: ring counter-clockwise")
        if "radius_m" in pr:
            ce, cn = pr["centre_east_north_m"]
            r = [math.hypot(x - ce, y - cn) for x, y in en]
            worst = max(worst, max(abs(x - pr["radius_m"] / math.cos(math.pi / 72)) for x in r))
check(worst < 1e-3, f"map positions back to local metres within 1 mm (worst {worst:.2e} m)")

# --regions-out: the same polygons in local metres
rows = [r for r in csv.reader(l for l in open(rcsv) if not l.startswith("#"))]
head, rows = rows[0], rows[1:]
check(head[:7] == ["item", "shape", "run", "part", "vertex", "east_m", "north_m"],
      f"regions CSV header: {head}")
reg = [r for r in rows if r[1] == "landing_region"]
feat = [f for f in g["features"] if f["properties"]["kind"] == "landing_region"][0]
ring = feat["geometry"]["coordinates"][0] if feat["geometry"]["type"] == "Polygon" else \
    feat["geometry"]["coordinates"][0][0]
check(len(reg) >= len(ring), "regions CSV has the landing region's vertices")
dev = max(math.hypot(float(r[5]) - back(*p)[0], float(r[6]) - back(*p)[1])
          for r, p in zip(reg, ring))
check(dev < 1e-3, f"regions CSV and GeoJSON are the same polygon (within {dev:.1e} m)")

# the same for any thread count
gj3 = os.path.join(tmp, "zone3.geojson")
rc, so, se = plumb("zone", normal, "--format", "geojson", "-o", gj3, "--threads", "3",
                   "--target", "5m,-3m", "--quiet")
check(rc == 0 and open(gj, "rb").read() == open(gj3, "rb").read(),
      "GeoJSON identical for 1 and 3 threads")

# without the site: refused, nothing written
nosite = os.path.join(tmp, "nosite.geojson")
rc, so, se = plumb("zone", normal, "--set", "site.longitude=~", "--format", "geojson",
                   "-o", nosite)
check(rc == 2 and "site.longitude" in se and not os.path.exists(nosite),
      f"GeoJSON without a site longitude: exit 2, nothing written ({rc}: {se})")

# ---- wind from every quadrant and across north ---------------------------------
windy = write("windy.yaml", """# Invented test case: a light bag in a steady wind.
name: light bag in wind
payload: {mass: 0.2 kg, drag: {cd: 1.0, area: 0.02 m^2}}
release: {height: 30 m}
wind: {profile: uniform, speed: 6 m/s, from: 0 deg}
uncertainty:
  wind.speed: {normal: [6 m/s, 1 m/s]}
zone: {samples: 1200, seed: 2, confidence: 0.9}
""")
for frm in (45, 135, 225, 315):
    rc, so, se = plumb("zone", windy, "--set", f"wind.from={frm} deg",
                       "--set", f"uncertainty.wind.from=\"{frm} deg +- 10 deg\"",
                       "--format", "json", "--threads", "2")
    check(rc == 0, f"wind from {frm}: runs: {se}")
    if rc:
        continue
    ce, cn = json.loads(so)["zone"]["landing"]["circle"]["centre_m"]
    to = math.radians(frm + 180)
    check(ce * math.sin(to) + cn * math.cos(to) > 0.9 * math.hypot(ce, cn),
          f"wind from {frm}: the landing centre ({ce:.1f}, {cn:.1f}) lies downwind")
rc, so, se = plumb("zone", windy, "--set", "uncertainty.wind.from={uniform: [350 deg, 10 deg]}",
                   "--format", "json", "--threads", "2")
if rc == 0:
    ce, cn = json.loads(so)["zone"]["landing"]["circle"]["centre_m"]
    check(cn < 0 and abs(ce) < 0.1 * abs(cn), f"wind across north: centre due south ({ce}, {cn})")
else:
    check(False, f"wind across north runs: {se}")

# ---- a kit names the item that sets its zone -------------------------------------
kit = write("kit.yaml", """# Invented test case: two items, one much lighter.
name: two-item kit
items:
  - {name: heavy bolt, mass: 0.3 kg, drag: {cd: 0.9, area: 0.0005 m^2}}
  - {name: glove, mass: 0.05 kg, drag: {cd: 1.1, area: 0.02 m^2}}
release: {height: 25 m}
site: {latitude: 51 deg, longitude: -2 deg}
wind: {profile: uniform, speed: 5 m/s, from: 270 deg}
uncertainty:
  wind.speed: {normal: [5 m/s, 1.5 m/s]}
zone: {samples: 1000, seed: 4, confidence: 0.9}
""")
rc, so, se = plumb("zone", kit, "--threads", "2")
check(rc == 0 and "Kit" in so and "set by glove" in so, f"kit text names the glove: {so[-1500:]}")
rc, so, se = plumb("zone", kit, "--format", "json", "--threads", "2")
if rc == 0:
    d = json.loads(so)
    check(d["kit"]["set_by"] == "glove", f"kit JSON names the glove: {d.get('kit')}")
    # the bounded landing circle: set by the item whose own circle is largest
    circles = {i["name"]: i["zone"]["landing"]["circle"] for i in d["items"]}
    check(not any(c["open"] for c in circles.values()) and
          d["kit"]["landing_circle_set_by"] == max(circles, key=lambda k: circles[k]["clearance_radius_m"])
          and d["kit"]["landing_circle_m"] == circles[d["kit"]["landing_circle_set_by"]]["clearance_radius_m"],
          f"kit JSON: the landing circle set by the item of the largest: {d.get('kit')}")
# Too few counted samples to bound a 90 % circle at 95 % confidence: an
# upper bound needs P(all m counted samples below the 90 % quantile) =
# 0.9^m <= 0.025 (two-sided 95 %), i.e. m >= 36 (order statistics, closed
# form). 40 samples, some of them training, count fewer: the circle is open,
# and no item sets an open circle (JSON once named the first item).
rc, so, se = plumb("zone", kit, "--samples", "40", "--format", "json", "--threads", "2")
if rc == 0:
    d = json.loads(so)
    m = [i["zone"]["landing"]["counted_samples"] for i in d["items"]]
    check(all(0.9 ** k > 0.025 for k in m) and all(i["zone"]["landing"]["circle"]["open"] for i in d["items"]),
          f"40 samples: every item's landing circle open ({m} counted)")
    check(d["kit"]["landing_circle_m"] is None and d["kit"]["landing_circle_set_by"] is None
          and d["kit"]["set_by"] == "glove",
          f"kit JSON: an open landing circle is set by no item: {d.get('kit')}")
else:
    check(False, f"40 samples runs: {se}")
rc, so, se = plumb("zone", kit, "--samples", "40", "--format", "csv", "--threads", "2")
kl = [l for l in so.splitlines() if l.startswith("# kit:")]
check(rc == 0 and len(kl) == 1 and "landing circle open" in kl[0] and "kit_landing_circle" not in so,
      f"kit CSV: an open landing circle says open, no row: {kl}")
rc, so, se = plumb("zone", kit, "--format", "geojson", "--threads", "2")
if rc == 0:
    d = json.loads(so)
    check(d["properties"]["kit_zone_item"] == "glove", "kit GeoJSON names the glove")
    check(any(f["properties"].get("sets_kit_zone") for f in d["features"]),
          "kit GeoJSON marks the glove's features")

# ---- attitude as an uncertain input ---------------------------------------------
att = write("att.yaml", """# Invented test case: a hammer in wind, either attitude.
name: hammer attitudes
payload: {mass: 0.68 kg, drag: {cd: 0.99, area: 0.000804 m^2}}
release: {height: 30 m}
wind: {profile: uniform, speed: 6 m/s, from: 270 deg}
uncertainty:
  payload.attitude:
    choice:
      - {name: end-on, cd: 0.99, area: 0.000804 m^2, weight: 1}
      - {name: broadside, cd: 0.82, area: 0.0106 m^2, weight: 3}
  wind.speed: {normal: [6 m/s, 1 m/s]}
zone: {samples: 2000, seed: 3, confidence: 0.9}
""")
rc, so, se = plumb("zone", att, "--format", "json", "--threads", "2")
check(rc == 0, f"attitude choice runs: {se}")
if rc == 0:
    z = json.loads(so)["zone"]
    check(z["attitude_sets_energy"] == "end-on", f"energy set by end-on: {z.get('attitudes')}")
    check(z["attitude_sets_radius"] == "broadside", "radius set by broadside")
    nb = [a["samples"] for a in z["attitudes"] if a["attitude"] == "broadside"][0]
    sd = math.sqrt(2000 * 0.75 * 0.25)
    check(abs(nb - 1500) <= 4 * sd, f"broadside drawn {nb} of 2000 at weight 3:1")
rc, so, se = plumb("zone", att, "--threads", "2")
check(rc == 0 and "Attitude" in so and "end-on" in so.split("Attitude")[1][:300],
      "text names the attitude of the largest energy")
kit2 = write("kitshape.yaml", """# Invented test case: two rods, any attitude.
name: rods
items:
  - {name: long rod, mass: 0.5 kg, shape: {kind: cylinder, length: 0.4 m, diameter: 0.03 m}}
  - {name: short rod, mass: 0.3 kg, shape: {kind: cylinder, length: 0.15 m, diameter: 0.03 m}}
release: {height: 20 m}
wind: {profile: uniform, speed: 5 m/s, from: 90 deg}
uncertainty:
  payload.attitude: {choice: [tumbling, broadside, end-on]}
  wind.speed: {normal: [5 m/s, 1 m/s]}
zone: {samples: 1000, seed: 8, confidence: 0.9}
""")
rc, so, se = plumb("zone", kit2, "--format", "json", "--threads", "2")
check(rc == 0, f"named attitudes on a kit of shapes: {se}")
if rc == 0:
    for it in json.loads(so)["items"]:
        at = it["zone"]["attitudes"]
        check(len(at) == 3 and sum(a["samples"] for a in at) == 1000,
              f"{it['name']}: three attitudes, every sample in one")
        ch = [i for i in it["zone"]["inputs"] if i["key"] == "payload.attitude"][0]["choice"]
        cda = {c["attitude"]: c["cd"] * c["area_m2"] for c in ch}
        check(cda["end-on"] < cda["broadside"], f"{it['name']}: end-on has the least cd x area")
for bad_set, why in (("uncertainty.payload.attitude={choice: [tumbling, sideways]}", "unknown"),
                     ("uncertainty.payload.drag.cd={uniform: [0.8, 1.0]}", "drag")):
    rc, so, se = plumb("zone", kit2 if why == "unknown" else att, "--set", bad_set)
    check(rc == 2 and so == "", f"bad attitude ({why}): exit 2, got {rc}: {se}")

shutil.rmtree(tmp)
finish()
