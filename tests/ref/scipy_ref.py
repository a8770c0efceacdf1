#!/usr/bin/python3
"""Cross-check of `plumb fall --format json` against an independent
integration of the same equations (README.md "The model") with SciPy's
solve_ivp (DOP853, Hairer, Norsett & Wanner, Solving ODEs I, 1993), its
event location on the dense output for the impact, and a separate
implementation, written here from the published definitions, of:

  - U.S. Standard Atmosphere 1976 (NOAA-S/T 76-1562): layer table,
    geopotential H = r0 z / (r0 + z), hydrostatic pressure, Sutherland
    viscosity; temperature offset with p unchanged;
  - the `surface` model: linear lapse from station values, hydrostatic;
  - humidity by virtual temperature with the Magnus formula of Alduchov &
    Eskridge (1996);
  - WGS 84 normal gravity (Somigliana, NIMA TR8350.2) minus 3.086e-6 s^-2
    per metre of altitude;
  - wind profiles uniform / power / log / table, `from` in the
    meteorological convention;
  - sphere drag by Morrison (2010 handout, eq. 1).

These scenarios have no closed form (wind, release velocity, altitude-
dependent air). Agreement is required to 1e-7 relative.

Usage: scipy_ref.py PATH/TO/plumb   (prints `cli: N passed, N failed`)
"""
import atexit
import json
import math
import os
import shutil
import subprocess
import sys
import tempfile

import numpy as np
from scipy.integrate import solve_ivp

G0 = 9.80665
RSTAR = 8314.32
M0 = 28.9644
R_AIR = RSTAR / M0
R0 = 6356766.0
GAMMA = 1.4
BETA = 1.458e-6
S_SUTH = 110.4
GMR = G0 * M0 / RSTAR  # K per geopotential metre
# base geopotential height (m'), lapse rate (K/m')
LAYERS = [(0.0, -0.0065), (11000.0, 0.0), (20000.0, 0.001), (32000.0, 0.0028),
          (47000.0, 0.0), (51000.0, -0.0028), (71000.0, -0.002)]


def _bases():
    """Base temperature and pressure of each layer, from the equations."""
    out, t, p = [], 288.15, 101325.0
    for i, (hb, lapse) in enumerate(LAYERS):
        out.append((hb, lapse, t, p))
        if i + 1 < len(LAYERS):
            dh = LAYERS[i + 1][0] - hb
            t, p = _step(t, p, lapse, dh)
    return out


def _step(t, p, lapse, dh):
    if lapse == 0.0:
        return t, p * math.exp(-GMR * dh / t)
    t1 = t + lapse * dh
    return t1, p * (t / t1) ** (GMR / lapse)


BASES = _bases()


def std1976(z):
    h = R0 * z / (R0 + z)
    base = BASES[0]
    for b in BASES:
        if h >= b[0]:
            base = b
    hb, lapse, t, p = base
    return _step(t, p, lapse, h - hb)


def magnus_es(t_k):
    tc = t_k - 273.15
    return 610.94 * math.exp(17.625 * tc / (tc + 243.04))


class Air:
    def __init__(self, a, elev):
        self.a = a
        self.elev = elev

    def at(self, alt):
        a = self.a
        if a["model"] == "standard-1976":
            t, p = std1976(alt)
            t += a.get("dt", 0.0)
        else:  # surface
            lapse = a.get("lapse", 0.0065)
            dz = alt - self.elev
            t = a["t_s"] - lapse * dz
            p = a["p_s"] * (t / a["t_s"]) ** (G0 / (R_AIR * lapse))
        rh = a.get("rh", 0.0)
        tv = t
        if rh > 0.0:
            e = rh * magnus_es(t)
            tv = t / (1.0 - (e / p) * (1.0 - 0.622))
        rho = p / (R_AIR * tv)
        mu = BETA * t ** 1.5 / (t + S_SUTH)
        return rho, mu, math.sqrt(GAMMA * R_AIR * t)


def gravity(lat, alt):
    if lat is None:
        return G0
    s2 = math.sin(math.radians(lat)) ** 2
    return 9.7803253359 * (1 + 0.00193185265241 * s2) / math.sqrt(1 - 0.00669437999013 * s2) \
        - 3.086e-6 * alt


def components(speed, frm):
    r = math.radians(frm)
    return -speed * math.sin(r), -speed * math.cos(r)


def wind(w, z):
    if w is None or z <= 0.0:
        return 0.0, 0.0
    kind = w["profile"]
    if kind == "table":
        hs = [r[0] for r in w["rows"]]
        es = [components(r[1], r[2])[0] for r in w["rows"]]
        ns = [components(r[1], r[2])[1] for r in w["rows"]]
        return float(np.interp(z, hs, es)), float(np.interp(z, hs, ns))
    s = w["speed"]
    zr = w.get("ref", 10.0)
    if kind == "power":
        s *= (z / zr) ** w.get("alpha", 1.0 / 7.0)
    elif kind == "log":
        z0 = w.get("z0", 0.03)
        s = s * math.log(z / z0) / math.log(zr / z0) if z > z0 else 0.0
    return components(s, w["from"])


def morrison(re):
    a, b = re / 5.0, re / 263000.0
    return 24.0 / re + 2.6 * a / (1 + a ** 1.52) + 0.411 * b ** -7.94 / (1 + b ** -8.0) \
        + re ** 0.8 / 461000.0


def reference(sc):
    elev = sc.get("elev", 0.0)
    air = Air(sc["air"], elev)
    m = sc["mass"]
    vol = sc.get("volume", 0.0)
    lat = sc.get("lat")
    w = sc.get("wind")

    def rhs(t, y):
        x, yy, z, vx, vy, vz = y
        alt = elev + z
        rho, mu, _ = air.at(alt)
        g = gravity(lat, alt)
        we, wn = wind(w, z)
        vr = np.array([vx - we, vy - wn, vz])
        vra = math.sqrt(vr @ vr)
        if "sphere" in sc:
            d = sc["sphere"]
            re = rho * vra * d / mu
            cda = morrison(re) * math.pi * d * d / 4.0 if re > 0 else 0.0
        else:
            cda = sc["cda"]
        k = 0.5 * rho * cda * vra / m
        a = -k * vr
        a[2] += -g + rho * vol * g / m
        return [vx, vy, vz, a[0], a[1], a[2]]

    def ground(t, y):
        return y[2]
    ground.terminal = True
    ground.direction = -1

    def apex(t, y):
        return y[5]
    apex.direction = -1

    y0 = [0.0, 0.0, sc["height"]] + list(sc.get("vel", (0.0, 0.0, 0.0)))
    sol = solve_ivp(rhs, (0.0, 1e5), y0, method="DOP853", rtol=1e-13, atol=1e-12,
                    events=(ground, apex), dense_output=True)
    t = sol.t_events[0][0]
    ye = sol.y_events[0][0]
    v = ye[3:6]
    speed = math.sqrt(v @ v)
    return {"time_s": t, "speed_m_s": speed, "energy_j": 0.5 * m * speed * speed,
            "east": ye[0], "north": ye[1], "apex_m": max([sc["height"]] + [y[2] for y in sol.y_events[1]]),
            "angle_deg": math.degrees(math.atan2(-v[2], math.hypot(v[0], v[1])))}


def profile_yaml(sc):
    lines = [f"name: {sc['name']}", "payload:", f"  mass: {sc['mass']!r} kg"]
    if "sphere" in sc:
        lines += ["  drag:", "    model: sphere", f"    diameter: {sc['sphere']!r} m"]
    else:
        lines += ["  drag:", f"    cd_area: {sc['cda']!r} m^2"]
    if sc.get("volume"):
        lines.append(f"  volume: {sc['volume']!r} m^3")
    lines += ["release:", f"  height: {sc['height']!r} m"]
    if "vel" in sc:
        e, n, u = sc["vel"]
        lines += ["  velocity:", f"    east: {e!r} m/s", f"    north: {n!r} m/s", f"    up: {u!r} m/s"]
    lines += ["site:", f"  elevation: {sc.get('elev', 0.0)!r} m"]
    if sc.get("lat") is not None:
        lines.append(f"  latitude: {sc['lat']!r} deg")
    a = sc["air"]
    lines += ["atmosphere:", f"  model: {a['model']}"]
    if a["model"] == "standard-1976":
        lines.append(f"  temperature_offset: {a.get('dt', 0.0)!r} K")
    else:
        lines += [f"  pressure: {a['p_s']!r} Pa", f"  temperature: {a['t_s']!r} K"]
        if "lapse" in a:
            lines.append(f"  lapse_rate: {a['lapse']!r} K/m")
    if a.get("rh"):
        lines.append(f"  humidity: {a['rh']!r}")
    w = sc.get("wind")
    if w:
        lines += ["wind:", f"  profile: {w['profile']}"]
        if w["profile"] == "table":
            lines.append("  table:")
            for h, s, f in w["rows"]:
                lines.append(f"    - {{height: {h!r} m, speed: {s!r} m/s, from: {f!r} deg}}")
        else:
            lines += [f"  speed: {w['speed']!r} m/s", f"  from: {w['from']!r} deg"]
            if "ref" in w:
                lines.append(f"  reference_height: {w['ref']!r} m")
            if "alpha" in w:
                lines.append(f"  exponent: {w['alpha']!r}")
            if "z0" in w:
                lines.append(f"  roughness: {w['z0']!r} m")
    return "\n".join(lines) + "\n"


SCENARIOS = [
    {"name": "thrown spanner in power-law wind", "mass": 1.137, "cda": 0.0117, "height": 41.3,
     "vel": (1.21, -0.43, 0.86), "air": {"model": "standard-1976", "dt": 7.5}, "elev": 212.0,
     "wind": {"profile": "power", "speed": 9.4, "from": 243.0, "ref": 10.0, "alpha": 0.16}},
    {"name": "drone pouch at ground speed, hot high site", "mass": 0.853, "cda": 0.0296,
     "height": 87.0, "vel": (-6.3, 9.1, 0.0), "air": {"model": "standard-1976", "dt": 18.2},
     "elev": 1650.0, "lat": 38.7, "wind": {"profile": "log", "speed": 7.2, "from": 12.0,
                                           "ref": 10.0, "z0": 0.25}},
    {"name": "long fall near terminal speed", "mass": 3.71, "cda": 0.0213, "height": 1830.0,
     "air": {"model": "standard-1976", "dt": -4.0}, "elev": 95.0, "lat": 61.2,
     "wind": {"profile": "uniform", "speed": 11.8, "from": 301.0}},
    {"name": "light card in a wind table", "mass": 0.0417, "cda": 0.0189, "height": 63.0,
     "vel": (0.0, 0.0, 2.4), "air": {"model": "standard-1976"},
     "wind": {"profile": "table", "rows": [(5.0, 3.1, 250.0), (20.0, 5.9, 265.0),
                                            (60.0, 8.7, 281.0)]}},
    {"name": "surface air with humidity", "mass": 2.385, "cda": 0.0061, "height": 152.0,
     "vel": (3.3, 0.0, -1.0), "elev": 480.0,
     "air": {"model": "surface", "p_s": 95310.0, "t_s": 306.4, "lapse": 0.0081, "rh": 0.63},
     "wind": {"profile": "power", "speed": 5.5, "from": 90.0}},
    {"name": "rigid sphere with Morrison drag", "mass": 0.0438, "sphere": 0.0427,
     "height": 118.0, "vel": (4.0, 2.0, 0.0), "air": {"model": "standard-1976", "dt": 3.0},
     "elev": 820.0, "wind": {"profile": "uniform", "speed": 4.4, "from": 180.0}},
    {"name": "buoyant-ish foam block", "mass": 0.0913, "cda": 0.0153, "volume": 0.00183,
     "height": 36.0, "air": {"model": "standard-1976"},
     "wind": {"profile": "power", "speed": 6.1, "from": 45.0}},
]


def main():
    plumb = sys.argv[1]
    passed = failed = 0
    tmp = tempfile.mkdtemp(prefix="plumb-ref-")
    atexit.register(shutil.rmtree, tmp, ignore_errors=True)  # make check leaves nothing in /tmp
    for i, sc in enumerate(SCENARIOS):
        path = os.path.join(tmp, f"ref{i}.yaml")
        with open(path, "w") as f:
            f.write(profile_yaml(sc))
        r = subprocess.run([plumb, "fall", path, "--format", "json"], capture_output=True, text=True)
        if r.returncode != 0:
            print(f"FAIL {sc['name']}: plumb exited {r.returncode}: {r.stderr.strip()}")
            failed += 1
            continue
        got = json.loads(r.stdout)
        imp = got["impact"]
        ref = reference(sc)
        scale = max(1.0, math.hypot(ref["east"], ref["north"]))
        checks = [("time_s", imp["time_s"], ref["time_s"], abs(ref["time_s"])),
                  ("speed_m_s", imp["speed_m_s"], ref["speed_m_s"], abs(ref["speed_m_s"])),
                  ("energy_j", imp["energy_j"], ref["energy_j"], abs(ref["energy_j"])),
                  ("angle_deg", imp["angle_deg"], ref["angle_deg"], abs(ref["angle_deg"])),
                  ("point east", imp["point_m"][0], ref["east"], scale),
                  ("point north", imp["point_m"][1], ref["north"], scale),
                  ("apex_m", got["apex_m"], ref["apex_m"], abs(ref["apex_m"]))]
        ok = True
        for name, g, want, s in checks:
            rel = abs(g - want) / s
            if not rel <= 1e-7:
                ok = False
                print(f"FAIL {sc['name']}: {name} plumb {g!r} scipy {want!r} (rel {rel:.2e})")
        if ok:
            worst = max(abs(g - want) / s for _, g, want, s in checks)
            print(f"ok   {sc['name']}: worst relative difference {worst:.1e}")
            passed += 1
        else:
            failed += 1
    print(f"cli: {passed} passed, {failed} failed")
    sys.exit(1 if failed else 0)


main()
