#!/usr/bin/python3
"""`plumb verify` (README.md "plumb verify": published reference checks,
text/JSON, exit 1 on a failure). On a sound build every check passes and
the command exits 0. The published values it compares with are checked
here against the sources themselves, written out independently of the
library's table:
  - U.S. Standard Atmosphere 1976 (NOAA-S/T 76-1562), Table I, transcribed:
    rho(0) = 1.2250 kg/m^3, T(1000 m) = 281.651 K, p(2000 m) = 79501 Pa,
    rho(11000 m) = 0.36480, p(20000 m) = 5529.3 Pa, T(32000 m) = 228.490 K,
    rho(50000 m) = 1.0269e-3, rho(86000 m) = 6.958e-6; Table 2:
    mu(0) = 1.7894e-5 Pa s;
  - WGS 84 normal gravity (NIMA TR8350.2, eq. 4-1, transcribed): 9.7803253359
    m/s^2 at the equator, 9.8321849378 at the pole;
  - Morrison's sphere drag Cd(200) = 0.767731559965325 (transcribed);
  - Pflanz's X1 (A 1, j 1) = 0.4593, (A 0.1, j 6) = 0.1880 (computed from
    its closed form under Pflanz's assumptions, the method as Knacke,
    NWC TP 6575 (1991), ch. 5 presents it; not published figures);
  - the closed forms of a fall (v = sqrt(2 g h), t = sqrt(2 h / g);
    v_t = sqrt(2 m g / (rho CdA)), v(y) = v_t sqrt(1 - exp(-2 g y / v_t^2)),
    g0 = 9.80665 m/s^2), recomputed here.
Every format carries the cautions; text fits 80 columns; arguments are a
usage error (exit 2).
--units us adds US customary figures beside the SI ones (text in
brackets, CSV in columns of their own; JSON stays SI, README.md
"plumb verify"). They are checked against conversions written out here
from NIST SP 811 (2008), Appendix B.8: the international foot 0.3048 m
and pound 0.45359237 kg (exact, 1959 agreement), standard gravity
9.80665 m/s^2 (exact; the pound-force is the pound under it), t/degF =
1.8 T/K - 459.67, the conventional inch of mercury 3.386 389 E+03 Pa.
Usage: verify.py PATH/TO/plumb   (prints `cli: N passed, N failed`)
"""
import csv
import io
import json
import math
import os
import sys

sys.path.insert(0, os.path.join(os.path.dirname(os.path.abspath(__file__)), "lib"))
from plumbcli import check, finish, plumb  # noqa: E402

G0 = 9.80665
VT = math.sqrt(2 * 2.0 * G0 / (1.225 * 0.02))
# name: the published value as the source prints it (its last digit sets
# the tolerance a check may take: one unit there), or a closed form with
# the solver's accuracy (relative 1e-6 at most)
PUBLISHED = {
    "air density at 0 m": "1.2250",
    "air temperature at 1000 m": "281.651",
    "air pressure at 2000 m": "79501",
    "air density at 11000 m": "0.36480",
    "air pressure at 20000 m": "5529.3",
    "air temperature at 32000 m": "228.490",
    "air density at 50000 m": "1.0269e-3",
    "air density at 86000 m": "6.958e-6",
    "air viscosity at 0 m": "1.7894e-5",
    "normal gravity at the equator": "9.7803253359",
    "normal gravity at the pole": "9.8321849378",
    "sphere drag coefficient at Re 200": "0.767731559965325",
    "Pflanz force-reduction factor X1 at A 1, j 1": "0.4593",
    "Pflanz force-reduction factor X1 at A 0.1, j 6": "0.1880",
    "terminal speed, 2 kg, CdA 0.02 m^2, 1.225 kg/m^3": VT,
    "impact speed after 30 m, 2 kg, CdA 0.02 m^2, 1.225 kg/m^3":
        VT * math.sqrt(1 - math.exp(-2 * G0 * 30 / VT ** 2)),
    "impact speed after 30 m without drag": math.sqrt(2 * G0 * 30),
    "fall time of 30 m without drag": math.sqrt(2 * 30 / G0),
}


def last_digit(text):
    """One unit of the last digit of a number as printed: "6.958e-6" -> 1e-9."""
    mant, _, exp = text.partition("e")
    dec = len(mant.split(".")[1]) if "." in mant else 0
    return 10.0 ** (int(exp or 0) - dec)


rc, out, err = plumb("verify", "--format", "json")
d = json.loads(out) if rc == 0 else {}
checks = {c["name"]: c for c in d.get("checks", [])}
check(rc == 0 and d.get("failed") == 0 and d.get("passed") == len(PUBLISHED),
      f"verify: exit 0, every check passed: exit {rc}, {d.get('passed')} passed, "
      f"{d.get('failed')} failed ({err.strip()})")
check(set(checks) == set(PUBLISHED), f"the checks are the ones listed: {sorted(checks)}")
for name, given in PUBLISHED.items():
    c = checks.get(name, {})
    value = float(given) if isinstance(given, str) else given
    most = last_digit(given) if isinstance(given, str) else 1e-6 * value
    ok = (c.get("passed") is True and abs(c["published"] - value) <= 1e-12 * abs(value)
          and abs(c["computed"] - value) <= c["tolerance"] <= most * (1 + 1e-9)
          and c.get("source"))
    check(ok, f"{name}: published {value!r}, the check says {c}")
check(d.get("cautions") and len(d["cautions"]) >= 4, "JSON carries the cautions")

rc, out, _ = plumb("verify")
check(rc == 0 and "verify: 18 passed, 0 failed" in out and "Cautions" in out and
      all(len(l) <= 80 for l in out.splitlines()),
      f"text: the count, the cautions, 80 columns: {out[-300:]}")
rc, out, _ = plumb("verify", "--format", "csv")
rows = list(csv.DictReader(io.StringIO("".join(l + "\n" for l in out.splitlines()
                                               if not l.startswith("#")))))
check(rc == 0 and out.startswith("# ") and len(rows) == len(PUBLISHED) and
      all(r["passed"] == "true" for r in rows), f"CSV: cautions and a row per check: {rows[:1]}")
# --units us: the published values stay SI; the US figure beside each is
# its conversion by NIST SP 811's factors (see the top of this file)
FT, LB, G0_EXACT, INHG = 0.3048, 0.45359237, 9.80665, 3386.389
US = {  # SI unit: (US unit, SI -> US, size of the figure for the tolerance)
    "m/s": ("ft/s", lambda x: x / FT, abs),
    "m/s²": ("ft/s²", lambda x: x / FT, abs),
    "kg/m³": ("lb/ft³", lambda x: x * FT ** 3 / LB, abs),
    "K": ("°F", lambda x: 1.8 * x - 459.67, lambda f: abs(f) + 459.67),
    "Pa": ("inHg", lambda x: x / INHG, abs),
    "Pa·s": ("lbf·s/ft²", lambda x: x * FT ** 2 / (LB * G0_EXACT), abs),
}
rc, out, _ = plumb("verify", "--units", "us", "--format", "csv")
urows = list(csv.DictReader(io.StringIO("".join(l + "\n" for l in out.splitlines()
                                                if not l.startswith("#")))))
check(rc == 0 and out.startswith("# ") and len(urows) == len(PUBLISHED),
      f"verify --units us CSV: exit 0, cautions, a row per check ({rc}, {len(urows)})")
for r in urows:
    unit = r["unit"]
    if unit in ("", "s"):
        check(r["computed_us"] == r["published_us"] == r["unit_us"] == "",
              f"{r['name']}: no US figure for a unit the same in both systems ({r})")
        continue
    want = US.get(unit)
    if not want:
        check(False, f"{r['name']}: unit {unit!r} has no US conversion in this test")
        continue
    us_unit, conv, size = want
    ok = r["unit_us"] == us_unit
    for col in ("computed", "published"):
        si = float(r[col])  # 10 significant figures each, so 2e-9 relative
        exp = conv(si)
        ok = ok and abs(float(r[col + "_us"]) - exp) <= 2e-9 * size(exp)
    check(ok, f"{r['name']}: US figures {r['computed_us']}, {r['published_us']} "
          f"{r['unit_us']} are {r['computed']}, {r['published']} {unit} by NIST SP 811")
    check(r["published"] == next(x for x in rows if x["name"] == r["name"])["published"],
          f"{r['name']}: the published value stays SI under --units us")
# one spelling of units in a CSV, as the text and every other CSV write
# them (the zone CSV's "m²"): the SI column like the US one, "kg/m³" beside
# "lb/ft³", never "kg/m^3" (it mixed the two)
check(all(r["unit"] in US or r["unit"] in ("", "s") for r in urows) and
      not [r["unit"] for r in urows if "^" in r["unit"] or " " in r["unit"]],
      f"verify CSV: SI units spelt as the US ones: {sorted({r['unit'] for r in urows})}")
# the sphere-drag check cites what plumb computes: eq. (1) of Morrison's
# 2010 handout (src/physics/drag.c, README.md "Sources"), not her book
src = checks.get("sphere drag coefficient at Re 200", {}).get("source", "")
check("Data Correlation for Drag Coefficient for Sphere" in src and "2010" in src
      and "2013" not in src, f"the sphere-drag check's source: {src!r}")
rc, out, _ = plumb("verify", "--units", "us")
flat = " ".join(out.split())
for name, unit, si in (("air temperature at 1000 m", "K", 281.651),
                       ("air pressure at 2000 m", "Pa", 79501.0),
                       ("air viscosity at 0 m", "Pa·s", 1.7894e-5),
                       ("air density at 0 m", "kg/m³", 1.225),
                       ("normal gravity at the pole", "m/s²", 9.8321849378)):
    us_unit, conv, _ = US[unit]
    want = f"[{conv(si):#.7g} {us_unit}]"
    check(rc == 0 and want in flat, f"verify --units us text: {name} published {si} {unit} "
          f"shows {want} (7 figures)")
check(rc == 0 and "verify: 18 passed, 0 failed" in out and
      all(len(l) <= 80 for l in out.splitlines()) and "Cautions" in out,
      "verify --units us text: the count, the cautions, 80 columns")
check("[" not in flat.split("fall time of 30 m without drag")[1].split("ok ")[0],
      "verify --units us text: seconds get no bracket")
rc1, j_si, _ = plumb("verify", "--format", "json")
rc2, j_us, _ = plumb("verify", "--format", "json", "--units", "us")
check(rc1 == rc2 == 0 and json.loads(j_si) == json.loads(j_us),
      "verify JSON is SI whatever --units says (README.md plumb verify)")

rc, out, err = plumb("verify", "extra")
check(rc == 2 and not out and "takes no arguments" in err, f"verify extra: usage error ({err})")

finish()
