#!/usr/bin/python3
"""`plumb limit --drift-max` on a dense sphere in wind whose drift keeps
growing with the release height: where the limit is not reached at any
height plumb can compute, the answer says so ("not reached", the highest
height computed and its drift) in text, JSON and CSV, with exit status 0,
never a failed computation (exit 3) nor "unlimited"; where it is reached,
the answer is checked against the fall at it and an independent estimate.
Profile: tests/cli/profiles/dense-sphere-wind.yaml (invented), a 19.05 mm
steel ball released 118 m above a strike level at 230 m, uniform wind
9.4 m/s.
Sources:
  - U.S. Standard Atmosphere 1976 ends at 86 km geometric altitude
    (NOAA/NASA/USAF 1976, section 1.2, seen; README.md, "The model"): the
    highest release it can follow here is 86 000 m - 230 m = 85 770 m.
  - inverse.h (the contract): re-running `plumb fall --set KEY=VALUE` at
    the answer meets the limit; the answer is rounded to the side that
    meets it; Brent's tolerance 1e-10 relative on the key.
  - Uniform horizontal wind w, released at rest: the horizontal velocity
    relative to the air, r = u - w, obeys dr/dt = -(rho Cd A / 2m) |v - w| r
    (README.md, "The model"), so it decays from -w towards 0 without changing
    sign: 0 <= u < w, and the drift is below w T (T the fall time).
  - The lag behind the wind, closed form: falling from rest in still air
    with quadratic drag, v_z = v_t tanh(t / tau), tau = v_t / g; with
    |v - w| ~ |v_z|, |r| / w = sech(t / tau), so the drift is
    w (T - tau gd(T / tau)), gd the Gudermannian, gd(x) = 2 atan(tanh(x/2)).
    It leaves out the wind's share of |v - w| (second order in w / v_t:
    (9.4 / 62.5)^2 / 2 = 1.1 %) and the change of the air over the fall
    (1976 atmosphere: density 5 % lower 494 m up, v_t 2.5 % higher), so
    the lag w tau gd(T/tau) is checked to 3 %.
Usage: limit_not_reached.py PATH/TO/plumb   (prints `cli: N passed, N failed`)
"""
import csv
import io
import json
import math
import os
import sys

sys.path.insert(0, os.path.join(os.path.dirname(os.path.abspath(__file__)), "lib"))
from plumbcli import HERE, check, finish, plumb  # noqa: E402

PROFILE = os.path.join(HERE, "profiles", "dense-sphere-wind.yaml")
W_M_S, G0 = 9.4, 9.80665   # the profile's wind; standard gravity (3rd CGPM, 1901)
TOP_M = 86000.0 - 230.0    # U.S. Standard Atmosphere 1976's top above the strike level


def fall_at(height_m):
    rc, out, err = plumb("fall", PROFILE, "--set", f"release.height={height_m!r} m",
                         "--format", "json")
    check(rc == 0, f"fall at {height_m} m: exit {rc}: {err}")
    return json.loads(out) if rc == 0 else None


def limit(drift, fmt):
    return plumb("limit", PROFILE, "--find", "release.height", "--drift-max", drift,
                 "--format", fmt)


# ---- not reached below the top of the air model ------------------------------
LIMIT_M = 4000.0
rc, text, err = limit(f"{LIMIT_M} m", "text")
text = " ".join(text.split())  # the words, whatever the wrapping
check(rc == 0 and err == "", f"not reached, text: exit {rc}, stderr {err!r}")
check("release.height: the limit is not reached" in text, f"not reached, text: {text}")
check("not reached within the values of release.height that can be computed" in text
      and "85770 m" in text and "the top of the U.S. Standard Atmosphere 1976" in text,
      f"not reached, text names the highest height and why: {text}")
check("no limit in the physical range" not in text, f"not reached is not unlimited: {text}")

rc, out, err = limit(f"{LIMIT_M} m", "json")
check(rc == 0 and err == "", f"not reached, JSON: exit {rc}, stderr {err!r}")
item = json.loads(out)["limit"]["items"][0] if rc == 0 else {}
check(item.get("outcome") == "not reached", f"not reached, JSON outcome: {item.get('outcome')}")
check("value_si" not in item, f"not reached, JSON gives no value: {item}")
top = item.get("scanned_to_si", 0.0)
check(abs(top - TOP_M) <= 1e-12 * TOP_M, f"highest height computed {top} m, want {TOP_M} m")
d_top = item.get("drift_at_scanned_to_m", math.inf)
check(0.0 < d_top < LIMIT_M, f"drift at the top {d_top} m is below the limit {LIMIT_M} m")
check("not reached within the values" in item.get("explanation", ""),
      f"not reached, JSON explanation: {item.get('explanation')}")
f = fall_at(top)
if f:
    # the same fall as `plumb fall` computes it (inverse.h), and below w T
    check(abs(f["impact"]["drift_m"] - d_top) <= 1e-9 * d_top,
          f"drift at the top: limit says {d_top}, fall says {f['impact']['drift_m']}")
    check(d_top < W_M_S * f["impact"]["time_s"],
          f"drift at the top {d_top} m is below w T = {W_M_S * f['impact']['time_s']} m")

rc, out, err = limit(f"{LIMIT_M} m", "csv")
check(rc == 0 and err == "", f"not reached, CSV: exit {rc}, stderr {err!r}")
rows = list(csv.DictReader(io.StringIO("".join(l for l in out.splitlines(True)
                                               if not l.startswith("#")))))
check(len(rows) == 1 and rows[0]["outcome"] == "not reached" and rows[0]["value"] == ""
      and "85770 m" in rows[0]["explanation"], f"not reached, CSV: {rows}")

# ---- reached: the answer against the fall at it and the lag's closed form ----
LIMIT_M = 37.9
rc, out, err = limit(f"{LIMIT_M} m", "json")
check(rc == 0, f"reached, JSON: exit {rc}, stderr {err!r}")
item = json.loads(out)["limit"]["items"][0] if rc == 0 else {}
check(item.get("outcome") == "found" and item.get("lower_values_meet_limit") is True,
      f"reached: {item.get('outcome')}, lower values meet it: {item.get('lower_values_meet_limit')}")
h = item.get("value_si")
if h:
    f = fall_at(h)
    if f:
        d, t = f["impact"]["drift_m"], f["impact"]["time_s"]
        check(d <= LIMIT_M and d >= LIMIT_M * (1.0 - 1e-6),
              f"plumb fall at the answer {h} m drifts {d} m, limit {LIMIT_M} m")
        check(d < W_M_S * t, f"drift {d} m below w T = {W_M_S * t} m")
        tau = f["terminal_speed_m_s"] / G0
        x = t / tau
        lag = W_M_S * tau * 2.0 * math.atan(math.tanh(0.5 * x))
        check(abs((W_M_S * t - d) - lag) <= 0.03 * lag,
              f"lag behind the wind {W_M_S * t - d} m, closed form {lag} m (3 %)")
        # the fall just above the answer breaks the limit (the drift grows with height)
        f2 = fall_at(h * 1.001)
        check(f2 is not None and f2["impact"]["drift_m"] > LIMIT_M,
              f"0.1 % higher than the answer the drift exceeds {LIMIT_M} m")

finish()
