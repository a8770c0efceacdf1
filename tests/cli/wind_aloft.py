"""The power and log wind laws used above the atmospheric boundary layer
are said to be extrapolated, in every format (SAFETY.md section 3.3).

The layer reaches "up to around 1 km" above the ground, the free
atmosphere above it (Wikipedia, "Log wind profile", read in a copy); the
new-user review's case, a 0.1 g card from 30 km in a power-law wind,
printed a drift of 962600 m with no word of it.

- plumb fall in text, JSON and CSV (SI and US), plumb zone in text, JSON
  and CSV, and plumb sweep's rows above 1 km carry the warning, naming the
  law and the way out (wind.profile: table);
- none below 1 km, none for a uniform or tabulated wind and none for a
  calm one (the laws give no wind to extrapolate), at the same height;
- a fall thrown up from below 1 km past it is warned of too (a 2.37 kg
  ball at 70 m/s up from 900 m: drag-free it would climb v^2 / 2g =
  70^2 / 19.6 = 250 m; its apex, checked above 1000 m in the JSON, is
  what the warning is judged on).
"""
import json
import os
import shutil
import sys
import tempfile

sys.path.insert(0, os.path.join(os.path.dirname(os.path.abspath(__file__)), "lib"))
from plumbcli import check, finish, plumb  # noqa: E402

WORDS = "about the top of the atmospheric boundary layer"
tmp = tempfile.mkdtemp(prefix="plumb-wind-aloft.")


CARD = "{mass: 0.1 g, drag: {cd: 1.2, area: 0.01 m^2}}"


def profile(name, height, wind, extra="", payload=CARD):
    path = os.path.join(tmp, name + ".yaml")
    with open(path, "w") as f:
        f.write("# Invented test scenario: an object let go high up.\n"
                f"payload: {payload}\n"
                f"release: {{height: {height}}}\nwind: {wind}\n" + extra)
    return path


def fall_warnings(path, *extra):
    rc, so, se = plumb("fall", path, "--format", "json", *extra)
    check(rc == 0, f"{path}: runs: {rc} {se}")
    return json.loads(so).get("warnings", []) if rc == 0 else []


hi = profile("power30km", "30 km", "{profile: power, speed: 10 m/s}")
ws = [w for w in fall_warnings(hi) if WORDS in w]
check(len(ws) == 1 and "power law" in ws[0] and "wind.profile: table" in ws[0]
      and "1000 m" in ws[0], f"fall JSON: the power law above 1 km is warned of: {ws}")
rc, so, se = plumb("fall", hi)
check(rc == 0 and WORDS in " ".join(so.split()), f"fall text: warned: {so[:400]}")
rc, so, se = plumb("fall", hi, "--format", "csv", "--units", "us")
check(rc == 0 and any(l.startswith("# warning:") and WORDS in l and "ft" in l
                      for l in so.splitlines()), "fall CSV (US): a # warning: line in feet")

log = profile("log1500", "1.5 km", "{profile: log, speed: 6 m/s}",
              "uncertainty:\n  wind.speed: {normal: [6 m/s, 1 m/s]}\n")
ws = [w for w in fall_warnings(log) if WORDS in w]
check(len(ws) == 1 and "log law" in ws[0], f"fall JSON: the log law too: {ws}")
# The zone drops the 2.37 kg ball of the last case, not the card, in the
# same log wind from the same 1.5 km: the warning is of the wind law along
# the path, whatever falls through it. The card falls for about an hour
# at some 0.4 m/s (terminal speed sqrt(2 m g / (rho Cd A))), 1.3 s of CPU
# for a zone of 400; the ball about 21 s, 0.06 s.
logz = profile("log1500ball", "1.5 km", "{profile: log, speed: 6 m/s}",
               "uncertainty:\n  wind.speed: {normal: [6 m/s, 1 m/s]}\n",
               payload="{mass: 2.37 kg, drag: {cd: 0.47, area: 0.0071 m^2}}")
rc, so, se = plumb("zone", logz, "--samples", "400", "--format", "json", "--threads", "2")
check(rc == 0 and any(WORDS in w and "log law" in w for w in json.loads(so)["zone"]["warnings"]),
      f"zone JSON: warned: {se}")
rc, so, se = plumb("zone", logz, "--samples", "400", "--threads", "2")
check(rc == 0 and WORDS in " ".join(so.split("Uncertain inputs")[0].split()), "zone text: warned")
rc, so, se = plumb("zone", logz, "--samples", "400", "--format", "csv", "--threads", "2")
check(rc == 0 and any(l.startswith("# warning:") and WORDS in l for l in so.splitlines()),
      "zone CSV: warned")
rc, so, se = plumb("sweep", log, "--vary", "release.height=0.6km:1.4km:0.8km", "--format", "csv")
lines = so.splitlines()
num = [l.split(":")[0].split()[-1] for l in lines if l.startswith("# warning") and WORDS in l]
check(rc == 0 and len(num) == 1, f"sweep CSV: the warning said once: {num}")
if num:
    hdr = next(l for l in lines if not l.startswith("#")).split(",")
    rows = [l.split(",") for l in lines if not l.startswith("#")][1:]
    wcol = hdr.index("warnings")
    marked = [r[0] for r in rows if num[0] in r[wcol].split(";")]
    check(marked == ["1400"], f"sweep CSV: only the row above 1 km is marked: {marked}")

# None where the law is not extrapolated past the layer.
for name, height, wind in (("below", "999 m", "{profile: power, speed: 10 m/s}"),
                           ("uniform", "30 km", "{profile: uniform, speed: 10 m/s}"),
                           ("calm", "30 km", "{profile: power, speed: 0 m/s}"),
                           ("table", "30 km", "{profile: table, table: [{height: 0 m, speed: 10 m/s, from: 270 deg}]}")):
    p = profile(name, height, wind)
    ws = fall_warnings(p)
    check(not any(WORDS in w for w in ws), f"{name}: no such warning: {ws}")

# Thrown up through 1 km from 900 m.
up = profile("thrown", "900 m", "{profile: power, speed: 5 m/s}",
             payload="{mass: 2.37 kg, drag: {cd: 0.47, area: 0.0071 m^2}}")
rc, so, se = plumb("fall", up, "--set", "release.velocity.up=70 m/s", "--format", "json")
d = json.loads(so) if rc == 0 else {}
check(rc == 0 and d["apex_m"] > 1000.0 and any(WORDS in w for w in d.get("warnings", [])),
      f"thrown past 1 km: warned (apex {d.get('apex_m')}): {se}")
shutil.rmtree(tmp)
finish()
