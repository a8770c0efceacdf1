"""The text of a two-way `plumb sweep` is its boundary (what a
crew reads off such a table): for each
value of the first input and each criterion, the value of the second at
which the impact energy reaches the limit. Checked against a closed form,
the work-energy theorem for a drag-free fall from rest (1/2 m v^2 = m g H,
so the mass at which the energy is E from height H is m = E / (g0 H);
standard gravity g0 = 9.80665 m/s^2, 3rd CGPM 1901; 25 ft lbf = 25 x
0.3048 x 0.45359237 x 9.80665 J by the 1959 agreement), printed to 4
significant digits, rounded down (the side that keeps within the limit),
so below the closed form by less than a unit of the 4th digit. Also: no grid
of energies with `!` flags remains; CSV and JSON keep every row's figures;
a boundary beyond the range swept is marked `*`; "never reached" when no
value reaches the limit.
"""
import json
import math
import os
import re
import sys
import tempfile

sys.path.insert(0, os.path.join(os.path.dirname(os.path.abspath(__file__)), "lib"))
from plumbcli import check, finish, plumb  # noqa: E402

G0 = 9.80665
FT_LBF = 0.3048 * 0.45359237 * 9.80665
LIMITS = {"us-part107-cat3": 25.0 * FT_LBF, "eu-c1-80j": 80.0}

tmp = tempfile.mkdtemp(prefix="plumb-boundary.", dir=os.environ.get("TMPDIR"))
prof = os.path.join(tmp, "free.yaml")
with open(prof, "w") as f:
    f.write("# Invented test profile: a drag-free payload dropped from rest.\n"
            "name: drag-free payload\n"
            "payload: {mass: 1.3 kg, drag: {cd: 0, area: 0.0117 m^2}}\n"
            "release: {height: 12.5 m}\n"
            "criteria: [us-part107-cat3, eu-c1-80j]\n")

heights = [5.0, 10.0, 15.0, 20.0]
rc, out, err = plumb("sweep", prof, "--vary", "release.height=5m:20m:5m",
                     "--vary", "payload.mass=0.1kg:1kg:0.3kg")
check(rc == 0, f"two-way sweep: exit {rc}: {err}")
check("! = a criterion exceeded" not in out and not re.search(r"\d!", out),
      "no energy grid with ! flags")
check("Where each limit is reached" in out, "the boundary table is there")
rows = {}
for line in out.splitlines():
    m = re.match(r"\s+(\d+)\s+up to ([\d.]+)(\*?)\s+up to ([\d.]+)(\*?)\s*$", line)
    if m:
        rows[float(m.group(1))] = (float(m.group(2)), m.group(3), float(m.group(4)), m.group(5))
check(sorted(rows) == heights, f"one boundary row per height: {sorted(rows)}")
for h, (m1, star1, m2, star2) in rows.items():
    for got, star, cid in ((m1, star1, "us-part107-cat3"), (m2, star2, "eu-c1-80j")):
        want = LIMITS[cid] / (G0 * h)
        # 4 significant digits, rounded down ("up to": the side that keeps
        # within the limit, as plumb limit reports it): below the closed
        # form by less than a unit of the 4th digit
        unit = 10 ** (math.floor(math.log10(want)) - 3)
        check(want - unit * 1.0001 <= got <= want * (1 + 1e-12),
              f"H {h} m, {cid}: mass {got} kg, closed form E/(g0 H) = {want:.6g} kg, "
              f"rounded down")
        beyond = want < 0.1 or want > 1.0
        check((star == "*") == beyond, f"H {h} m, {cid}: '*' exactly when beyond 0.1-1 kg")

# the full figures stay in CSV and JSON: 4 heights x 4 masses
rc, out, _ = plumb("sweep", prof, "--vary", "release.height=5m:20m:5m",
                   "--vary", "payload.mass=0.1kg:1kg:0.3kg", "--format", "json")
check(rc == 0 and len(json.loads(out)["rows"]) == 16, "JSON keeps all 16 rows")
rc, out, _ = plumb("sweep", prof, "--vary", "release.height=5m:20m:5m",
                   "--vary", "payload.mass=0.1kg:1kg:0.3kg", "--format", "csv")
data = [ln for ln in out.splitlines() if ln and not ln.startswith("#")]
check(rc == 0 and len(data) == 17, f"CSV keeps a header and all 16 rows ({len(data)} lines)")

# a second input that cannot reach the limit: the wind, in still air from
# rest, does not change a drag-free fall's energy
rc, out, err = plumb("sweep", prof, "--vary", "payload.mass=0.1kg:0.2kg:0.1kg",
                     "--vary", "wind.speed=0m/s:10m/s:5m/s")
check(rc == 0 and "never reached" in out and "Where each limit is reached" in out,
      f"a limit no wind reaches: 'never reached' (exit {rc}: {err.strip()})")

# An inventory's boundary over items[N].X is that of item N, the item the
# key belongs to: the other items do not depend on it (the review found
# every boundary "-", said to be a refused value or a failed fall, when
# the table judged the heaviest item against the wrench's mass). Same
# closed form, m = E / (g0 H), for the item varied (2 of 2, the light one).
kit = os.path.join(tmp, "kit.yaml")
with open(kit, "w") as f:
    f.write("# Invented test profile: two drag-free items dropped from rest.\n"
            "name: drag-free kit\n"
            "items:\n"
            "  - {name: anvil block, mass: 7.31 kg, drag: {cd: 0, area: 0.0117 m^2}}\n"
            "  - {name: hex key, mass: 0.137 kg, drag: {cd: 0, area: 0.0003 m^2}}\n"
            "release: {height: 12.5 m}\n"
            "criteria: [us-part107-cat3, eu-c1-80j]\n")
kit_heights = [5.0, 10.0, 15.0, 20.0]
for key in ("items[2].mass", "items[hex key].mass"):
    rc, out, err = plumb("sweep", kit, "--vary", "release.height=5m:20m:5m",
                         "--vary", f"{key}=0.1kg:1kg:0.3kg")
    check(rc == 0, f"kit sweep over {key}: exit {rc}: {err}")
    flat = " ".join(out.split())
    check(f"(hex key, the item whose {key} is varied)" in flat,
          f"kit {key}: the boundary names the item the key belongs to: {flat[:400]!r}")
    check("- = no answer" not in out and "refused or a fall fails" not in out,
          f"kit {key}: no boundary missing, no false reason")
    got = {}
    for line in out.splitlines():
        m = re.match(r"\s+(\d+)\s+up to ([\d.]+)\*?\s+up to ([\d.]+)\*?\s*$", line)
        if m:
            got[float(m.group(1))] = (float(m.group(2)), float(m.group(3)))
    check(sorted(got) == kit_heights, f"kit {key}: one boundary row per height: {sorted(got)}")
    for h, (m1, m2) in got.items():
        for val, cid in ((m1, "us-part107-cat3"), (m2, "eu-c1-80j")):
            want = LIMITS[cid] / (G0 * h)
            unit = 10 ** (math.floor(math.log10(want)) - 3)
            check(want - unit * 1.0001 <= val <= want * (1 + 1e-12),
                  f"kit {key}, H {h} m, {cid}: mass {val} kg, closed form E/(g0 H) = "
                  f"{want:.6g} kg")

# a direction moves no limit one way: said once, for the key, with no
# table of dashes and no claim that a value was refused
rc, out, err = plumb("sweep", kit, "--vary", "release.height=5m:20m:5m",
                     "--vary", "wind.from=0deg:90deg:45deg")
flat = " ".join(out.split())
check(rc == 0 and "not found for wind.from; a direction does not raise or lower the energy"
      in flat and "- = no answer" not in out and "refused or a fall fails" not in out,
      f"a direction: one honest reason (exit {rc}): {flat[flat.find('Where'):][:300]!r}")

# values the profile refuses: the "-" legend gives the loader's reasons
rc, out, err = plumb("sweep", kit, "--vary", "release.height=-5m:10m:5m",
                     "--vary", "items[2].mass=0.1kg:1kg:0.3kg")
check(rc == 3 and "- = no answer at that value, for these reasons:" in out
      and "release.height: must be > 0 m, found '-5 m'" in out
      and "release.height: must be > 0 m, found '0 m'" in out,
      f"refused heights: each reason given (exit {rc}): {out[out.find('Where'):][:600]!r}")

os.remove(kit)
os.remove(prof)
os.rmdir(tmp)
finish()
