"""A parachute whose line stretch comes before impact but whose fill does
not end before it is still filling at impact: plumb fall, sweep and zone
say so (the warning, the descent text, JSON's at_impact and
steady_speed_opened_m_s, CSV's warning lines, a sweep row's mark, the
zone's counts), and never as if the canopy had opened (README.md "plumb
fall PROFILE", "Descent devices"). The times are checked against closed
forms computed here from the printed figures:

- drag-free fall from rest: t0 = sqrt(2 H / g), z(t) = H - g t^2 / 2
  (elementary mechanics); drag only delays the fall and slows it;
- fall from rest with quadratic drag in air of constant density:
  t = (v_t / g) arccosh(exp(g H / v_t^2)), v_t = sqrt(2 m g / (rho CdA))
  (the closed form of dv/dt = g (1 - v^2 / v_t^2); any mechanics text);
- fill time t_f = n D0 / v at line stretch (Knacke, Parachute Recovery
  Systems Design Manual, NWC TP 6575, 1991, filling time; n = 8 for a flat
  circular canopy, from memory), and drag area CdS(t) = CdS_0 (t / t_f)^j
  over the fill (the same, j = 6 from memory);
- the fill fraction at impact, (t_impact - t_stretch) / t_f, from the
  printed times.
$1: plumb."""
import json
import math
import os
import re
import sys

sys.path.insert(0, os.path.join(os.path.dirname(os.path.abspath(__file__)), "lib"))
from plumbcli import HERE, check, finish, plumb  # noqa: E402

BOTTLE = os.path.join(HERE, "profiles", "sample-bottle.yaml")
G0 = 9.80665            # standard gravity (CGPM 1901); the profile gives no latitude
H = 41.3                # release height, m (the profile)
MASS, CDA = 2.37, 0.82 * 0.0095           # the profile's body
N_FILL, D0, J = 8.0, 1.26, 6.0            # flat circular canopy (Knacke 1991, from memory)
CDS0 = 0.78 * math.pi * D0 * D0 / 4.0     # cd x nominal area of the 1.26 m canopy


def squeeze(text):
    return " ".join(text.split())


def fall_json(*sets):
    args = ["fall", BOTTLE, "--format", "json"]
    for s in sets:
        args += ["--set", s]
    rc, out, err = plumb(*args)
    return json.loads(out) if rc == 0 else {}


# ---- the body alone (the timer set past the landing) against the closed form
alone = fall_json("descent.deploy.after=60s")
t_body = alone.get("impact", {}).get("time_s", 0.0)
rc, out, err = plumb("air", "--alt", f"{H / 2 + 212}m:{H / 2 + 212}m:1m", "--format", "json")
rho = json.loads(out)["rows"][0]["density_kg_m3"] if rc == 0 else 1.2
vt = math.sqrt(2.0 * MASS * G0 / (rho * CDA))
t_cf = vt / G0 * math.acosh(math.exp(G0 * H / (vt * vt)))
t0 = math.sqrt(2.0 * H / G0)
# the air's density changes by about 0.5 % over the 41.3 m: 1e-4 of a fall
# time that drag changes by 1.4 % (our estimate: 0.5 % x 1.4 %, doubled)
check(abs(t_body - t_cf) <= 2e-4 * t_cf and t_body > t0,
      f"body alone: impact {t_body} s against the closed form {t_cf} s (drag-free {t0} s)")

# ---- the timer at 2.62 s: line stretch before impact, the fill not done
d = fall_json()
dev = (d.get("descent") or {}).get("devices") or [{}]
dv = dev[0]
ls = dv.get("line_stretch") or {}
t_imp = d.get("impact", {}).get("time_s", 0.0)
t_ls = ls.get("time_s", -1.0)
t_f = dv.get("fill_time_used_s", 0.0)
check(abs(t_ls - 2.62) <= 1e-9, f"line stretch at the timer's 2.62 s: {t_ls}")
# before line stretch: between the drag-free fall (lowest height, highest
# speed) and the closed form with quadratic drag in constant air,
# fallen = (v_t^2 / g) ln cosh(g t / v_t), v = v_t tanh(g t / v_t), which
# the body follows to 1e-3 (the density's 0.5 % change, our estimate)
z_free = H - 0.5 * G0 * t_ls ** 2
z_cf = H - vt * vt / G0 * math.log(math.cosh(G0 * t_ls / vt))
v_cf = vt * math.tanh(G0 * t_ls / vt)
z_ls, v_ls = ls.get("height_m", 0.0), ls.get("airspeed_m_s", 1e9)
check(z_free < z_ls and v_ls < G0 * t_ls and abs(z_ls - z_cf) <= 1e-3 * (H - z_cf) and
      abs(v_ls - v_cf) <= 1e-3 * v_cf,
      f"line stretch at {z_ls} m, {v_ls} m/s; closed form {z_cf} m, {v_cf} m/s; drag-free "
      f"{z_free} m, {G0 * t_ls} m/s")
# impact bounds: no sooner than drag-free, no sooner than the body alone
# (the canopy only adds drag), after line stretch
check(t0 < t_body <= t_imp and t_imp > t_ls,
      f"impact {t_imp} s after drag-free {t0} s, body alone {t_body} s, line stretch {t_ls} s")
# Knacke's fill time from the printed line-stretch air speed
tf_knacke = N_FILL * D0 / ls.get("airspeed_m_s", 1.0)
check(abs(t_f - tf_knacke) <= 1e-12 * tf_knacke, f"fill time {t_f} s, n D0 / v = {tf_knacke} s")
check(t_ls < t_imp < t_ls + t_f, f"the case: impact {t_imp} s within the fill "
      f"{t_ls} .. {t_ls + t_f} s")
frac = (t_imp - t_ls) / t_f
ai = dv.get("at_impact") or {}
check(ai.get("state") == "filling", f"at_impact state filling: {ai}")
check(abs(ai.get("fill_fraction", -1.0) - frac) <= 1e-12,
      f"fill fraction {ai.get('fill_fraction')} = (t_impact - t_stretch) / t_f = {frac}")
check(abs(ai.get("drag_area_full_m2", 0.0) - CDS0) <= 1e-12 * CDS0 and
      abs(ai.get("drag_area_m2", 0.0) - CDS0 * frac ** J) <= 1e-12 * CDS0,
      f"drag area at impact {ai.get('drag_area_m2')} = CdS0 frac^6 = {CDS0 * frac ** J}")
pf = dv.get("pflanz") or {}
check(pf.get("full_fill_reached") is False and pf.get("opening_force_n", 0) > 0,
      f"Pflanz's force is kept, marked a full fill's that was not reached: {pf}")
desc = d.get("descent") or {}
check("steady_speed_opened_m_s" in desc and desc["steady_speed_opened_m_s"] is None and
      desc.get("steady_speed_m_s", 0) > 0,
      f"steady_speed_opened_m_s null (nothing opened), steady_speed_m_s kept: {desc}")
ws = [w for w in d.get("warnings", []) if "still filling at impact" in w]
check(len(ws) == 1 and ws[0].startswith("The parachute (descent[0]) was still filling at impact")
      and "Pflanz's opening force is that of a full fill" in ws[0],
      f"JSON: one warning of the filling canopy: {d.get('warnings')}")

# ---- the text report: the warning's printed times give its printed share
rc, text, err = plumb("fall", BOTTLE)
flat = squeeze(text)
m = re.search(r"line stretch at ([\d.]+) s, impact at ([\d.]+) s, ([\d.]+) s into its "
              r"([\d.]+) s fill time \(([\d.]+) %\); its drag area was ([\d.]+) m² of the full "
              r"([\d.]+) m² \(([\d.]+) %\)", flat)
check(rc == 0 and m is not None, f"text: the filling warning with its figures: {flat[-1500:]!r}")
if m:
    a, b, c, f, p, s_at, s_full, p_area = (float(x) for x in m.groups())
    # four decimals on each time: the share from them is good to
    # (3 x 0.5e-4) / t_f, plus the printed share's own 0.05 %
    tol = 100.0 * 1.5e-4 / f + 0.05
    check(abs(100.0 * (b - a) / f - p) <= tol and abs((b - a) - c) <= 1e-4,
          f"text: {p} % = 100 (t_impact - t_stretch) / t_f from the printed times "
          f"{a}, {b}, {f}")
    check(abs(p_area - 100.0 * (p / 100.0) ** J) <= 0.06 * p_area + 0.05,
          f"text: drag area share {p_area} % = (fill share)^6 = {100 * (p / 100) ** J} %")
steady = squeeze(text.split("steady descent", 1)[-1].split("\n\n")[0])
check(steady.startswith("not reached (the parachute is still filling at impact);") and
      "with the parachute fully open" in steady,
      f"text: steady descent not reached, not 'with the parachute open': {steady!r}")
check("still filling at impact" in flat.split("Descent devices")[-1].split("peak drag")[0] and
      "for a full fill, which this fall did not reach" in flat,
      "text: the device says it is still filling, the opening force is a full fill's")

# ---- CSV: the warning among the comment lines
rc, csv, err = plumb("fall", BOTTLE, "--format", "csv")
check(rc == 0 and any(l.startswith("# warning: The parachute (descent[0]) was still filling")
                      for l in csv.splitlines()), "CSV: the filling warning as a comment line")

# ---- the other states: opened well before impact, never deployed
early = fall_json("descent.deploy.after=1.5s")
e0 = ((early.get("descent") or {}).get("devices") or [{}])[0]
check((e0.get("at_impact") or {}).get("state") == "open" and
      (e0.get("at_impact") or {}).get("fill_fraction") == 1.0 and
      (e0.get("pflanz") or {}).get("full_fill_reached") is True and
      early["descent"]["steady_speed_opened_m_s"] == early["descent"]["steady_speed_m_s"] and
      not any("filling" in w or "does not open" in w for w in early.get("warnings", [])),
      f"opened at 1.5 s: open, no warning: {e0.get('at_impact')}")
late = ((alone.get("descent") or {}).get("devices") or [{}])[0]
check((late.get("at_impact") or {}).get("state") == "not_deployed" and
      any("does not open before impact" in w for w in alone.get("warnings", [])),
      f"timer at 60 s: not deployed: {late.get('at_impact')}")

# ---- sweep: each row marked by its own state, as plumb fall gives it
vary = "descent.deploy.after=2.4s:3.0s:0.1s"
rc, out, err = plumb("sweep", BOTTLE, "--vary", vary, "--format", "json")
rows = json.loads(out)["rows"] if rc == 0 else []
rc2, tab, err2 = plumb("sweep", BOTTLE, "--vary", vary)
lines = [l for l in tab.split("\n\n")[1].splitlines()[2:]] if rc2 == 0 else []
states = []
for k, row in enumerate(rows):
    r0 = row["descent"]["devices"][0]
    st = r0["at_impact"]["state"]
    states.append(st)
    t_i, ls_r = row["impact"]["time_s"], r0.get("line_stretch")
    want = ("not_deployed" if ls_r is None else
            "filling" if t_i < ls_r["time_s"] + r0["fill_time_used_s"] else "open")
    marked = k < len(lines) and re.search(r"W\d+$", lines[k].rstrip()) is not None
    check(st == want and marked == (st != "open"),
          f"sweep row {k}: state {st}, from its times {want}; marked {marked}: "
          f"{lines[k] if k < len(lines) else ''!r}")
check(len(rows) == 7 and "open" in states and "filling" in states and "not_deployed" in states,
      f"sweep: the three states among the rows: {states}")

# ---- zone: samples not fully open, both counts, in every format
rc, out, err = plumb("zone", BOTTLE, "--threads", "2", "--format", "json")
zw = json.loads(out)["zone"]["warnings"] if rc == 0 else []
pat = (r"The parachute \(descent\[0\]\) was not fully open at impact in (\d+) of (\d+) samples "
       r"\(([\d.]+) %\): in (\d+) \(([\d.]+) %\) it did not open before impact, in (\d+) "
       r"\(([\d.]+) %\) it was still filling\.")
ms = [re.match(pat, w) for w in zw]
ms = [x for x in ms if x]
check(len(ms) == 1, f"zone JSON: one warning with both counts: {zw}")
if ms:
    tot, n, ptot, k, pk, f, pf_ = ms[0].groups()
    tot, n, k, f = int(tot), int(n), int(k), int(f)
    check(n == 600 and k > 0 and f > 0 and tot == k + f and tot < n,
          f"zone: {tot} = {k} not opened + {f} filling, of {n}")
    check(all(abs(float(p) - 100.0 * c / n) <= 0.05 + 1e-9
              for p, c in ((ptot, tot), (pk, k), (pf_, f))),
          f"zone: shares {ptot}, {pk}, {pf_} % of {tot}, {k}, {f} in {n}")
rc, out, err = plumb("zone", BOTTLE, "--threads", "2", "--format", "csv")
check(rc == 0 and any(l.startswith("# warning: ") and "it was still filling." in l
                      for l in out.splitlines()), "zone CSV: the warning with both counts")
rc, out, err = plumb("zone", BOTTLE, "--threads", "2")
check(rc == 0 and "it was still filling. Those land faster than under the open parachute"
      in squeeze(out), "zone text: the warning with both counts")
finish()
