#!/usr/bin/python3
"""A warning's figures in the report's units (--units us is US
throughout a report). The rotor-downwash and gust warnings are made below
the report layer; before the fix they were written in SI whatever --units
said ("hover thrust 62.3 N over 0.93 m^2 gives v_i 5.27 m/s", "W20 7.72
m/s", "leans 74 deg"), and plumb zone copied them so. Checked here, on an
invented test scenario (a pouch let go from a moving multirotor in light
turbulence):
  - with --units us, text and CSV, the warnings of plumb fall and plumb
    zone carry US units (lbf, ft², mph with knots for speeds of air) and no
    SI unit, and the same sentences in both commands;
  - without it, SI (N, m², m/s), and angles as ° in both, never "deg";
  - JSON is SI whatever --units says (README.md "Common options"), and the SI
    and US sentences state the same figures to their printed precision;
  - the gusts' W20 of `intensity: light` is 15 kn (MIL-F-8785C low-altitude
    light turbulence, as README.md "Gusts" gives it; from memory), printed
    as 17.3 mph (15.0 kn);
  - a sweep over a small range of the release height says each warning
    once, in all its rows, in either units;
  - the hover thrust is the aircraft's weight, 6.35 kg x g: 14.0 lbf
    (g between 9.78 and 9.83 m/s^2 anywhere on the ground, WGS 84; 1 lbf
    = 4.4482216152605 N); its disk of 0.93 m² is 10.0 ft².
Conversions (NIST SP 811, 2008, Appendix B.8): ft = 0.3048 m, lbf =
4.4482216152605 N, mph = 0.44704 m/s, kn = 1852/3600 m/s.
Usage: warning_units.py PATH/TO/plumb   (prints `cli: N passed, N failed`)
"""
import json
import os
import re
import shutil
import sys
import tempfile

sys.path.insert(0, os.path.join(os.path.dirname(os.path.abspath(__file__)), "lib"))
from plumbcli import check, finish, plumb  # noqa: E402

FT, LBF, MPH, KN = 0.3048, 4.4482216152605, 0.44704, 1852.0 / 3600.0

PROFILE = """name: pouch let go from a moving multirotor in gusts
payload:
  mass: 0.85 kg
  drag: {cd: 1.05, area: 0.0376 m^2, source: invented test value}
release:
  height: 27.3 m
  velocity: {speed: 3.7 m/s, heading: 283 deg, climb: 0 m/s}
  downwash: {aircraft_mass: 6.35 kg, disk_area: 0.93 m^2}
site:
  elevation: 143 m
  latitude: 51.3 deg
wind:
  profile: uniform
  speed: 6.3 m/s
  from: 251 deg
  turbulence: {model: dryden, intensity: light}
uncertainty:
  wind.speed: {normal: [6.3 m/s, 1.1 m/s]}
"""
NUM = r"(-?\d+(?:\.\d+)?)"
# an SI unit after a figure; "m" only as a word ("m/s", "m²", "m^2", " m ")
SI_UNIT = re.compile(NUM + r" ?(m/s|m²|m\^2|m\b|N\b|kg\b|J\b|Pa\b|K\b|mm\b|km\b)")
US_UNIT = re.compile(NUM + r" ?(ft/s|ft²|ft\b|lbf\b|lb\b|mph\b|kn\b|in\b)")
MARKS = ("\x02", "\x03")


def squeeze(text):
    return " ".join(text.split())


def text_warnings(out):
    """The sentences of the text report's Warnings section, each on one line."""
    lines = out.splitlines()
    if "Warnings" not in lines:
        return []
    said, cur = [], None
    for line in lines[lines.index("Warnings") + 1:]:
        if not line.strip():
            break
        if line.startswith("  - "):
            if cur is not None:
                said.append(squeeze(cur))
            cur = line[4:]
        elif cur is not None:
            cur += " " + line.strip()
    if cur is not None:
        said.append(squeeze(cur))
    return said


def csv_warnings(out, prefix):
    return [l[len(prefix):] for l in out.splitlines() if l.startswith(prefix)]


def ours(ws):
    """The warnings with figures: the rotor wake and the gusts."""
    return [w for w in ws if w.startswith("Rotor downwash") or w.startswith("Gusts")]


def after(sentence, words):
    """The figure (as a float) that follows `words` in a sentence."""
    m = re.search(re.escape(words) + " " + NUM, sentence)
    return float(m.group(1)) if m else None


def agrees(shown_us, si, factor, label):
    """A US figure (3 significant digits) against an SI figure (3 digits)
    converted: within half a unit in the last place of each."""
    if shown_us is None or si is None:
        check(False, f"{label}: a figure is missing (us {shown_us}, si {si})")
        return
    want = si / factor

    def half_ulp(x):  # half a unit in the third significant digit
        return 0.5 * 10 ** (int(f"{abs(x):e}".split("e")[1]) - 2)

    tol = half_ulp(shown_us) + half_ulp(si) / factor
    check(abs(shown_us - want) <= tol * 1.0001,
          f"{label}: US {shown_us} against SI {si} / {factor} = {want:.5g} (+- {tol:.3g})")


tmp = tempfile.mkdtemp(prefix="plumb-warning-units.", dir=os.environ.get("TMPDIR"))
try:
    path = os.path.join(tmp, "gusty-drone.yaml")
    with open(path, "w") as f:
        f.write(PROFILE)
    # The zone's warnings are of the scene (the downwash, the gusts, the
    # criteria), not of the fraction or the sample count: at 50 samples and
    # a 90 % zone they are byte for byte those of 400 samples at the
    # profile's 99 % in every format and units (compared when this was
    # chosen). A 90 % radius needs 29 samples to be bounded at 95 %
    # confidence (0.9^29 < 0.05, order statistics), a 99 % one 368; a
    # sixth of the CPU time.
    zone = ("zone", path, "--samples", "50", "--confidence", "0.9", "--threads", "1")
    runs = {}
    for units in ("us", "si"):
        for fmt in ("text", "csv", "json"):
            for cmd in (("fall", path), zone):
                rc, out, err = plumb(*cmd, "--units", units, "--format", fmt)
                check(rc == 0, f"{cmd[0]} --units {units} --format {fmt}: exit {rc} "
                      f"{err.strip()[:200]}")
                check(not any(m in out for m in MARKS),
                      f"{cmd[0]} --units {units} --format {fmt}: a figure's mark is printed")
                runs[(cmd[0], units, fmt)] = out

    def warnings_of(cmd, units, fmt):
        out = runs[(cmd, units, fmt)]
        if fmt == "text":
            return text_warnings(out)
        if fmt == "csv":
            # one profile: the sentence alone in both (plumbp_who_text)
            return csv_warnings(out, "# warning: ")
        try:
            d = json.loads(out)
        except ValueError:
            return []
        return d.get("warnings", []) if cmd == "fall" else d.get("zone", {}).get("warnings", [])

    def fall_only(w):
        return w.startswith("Gusts of the ") and "this single fall uses the mean wind" in w

    for units in ("us", "si"):
        for fmt in ("text", "csv"):
            fw, zw = warnings_of("fall", units, fmt), warnings_of("zone", units, fmt)
            label = f"--units {units} {fmt}"
            # both downwash sentences (hover, and air moving past) and the gusts
            check(len(ours(fw)) == 3, f"fall {label}: three warnings with figures: {fw}")
            # fall and zone say the same sentences, but for the note on what
            # the single fall leaves out (its gusts), which the zone's samples
            # include (include/plumb/judge.h)
            for w in fw:
                if fall_only(w):
                    check(w not in zw, f"zone {label}: has the single fall's note {w!r}")
                else:
                    check(w in zw, f"zone {label}: lacks the fall's warning {w!r}; has {zw}")
            for said in ours(fw) + ours(zw):
                check("deg" not in said.split(), f"{label}: 'deg' in {said!r}")
                # W20 is the name of the wind at 20 ft (MIL-F-8785C) in either units
                w = said.replace("the mean wind at 20 ft", "the mean wind at W20's height")
                if units == "us":
                    check(not SI_UNIT.search(w), f"{label}: an SI unit "
                          f"{SI_UNIT.search(w).group(0) if SI_UNIT.search(w) else ''!r} in {w!r}")
                    check(US_UNIT.search(w), f"{label}: no US unit in {w!r}")
                else:
                    check(not US_UNIT.search(w), f"{label}: a US unit in {w!r}")
                    check(SI_UNIT.search(w), f"{label}: no SI unit in {w!r}")
            joined = " ".join(ours(fw))
            if units == "us":
                for unit in ("lbf", "ft²", "mph", "kn", "°"):
                    check(unit in joined, f"fall {label}: no {unit!r} in {joined!r}")
                check("hover thrust 14.0 lbf over 10.0 ft²" in joined,
                      f"fall {label}: hover thrust 14.0 lbf over 10.0 ft²: {joined!r}")
                check("W20 = 17.3 mph (15.0 kn)" in joined,
                      f"fall {label}: W20 = 17.3 mph (15.0 kn): {joined!r}")
            else:
                for unit in ("N", "m²", "m/s", "°"):
                    check(re.search(r"\d " + re.escape(unit), joined) or unit == "°" and "°" in joined,
                          f"fall {label}: no {unit!r} in {joined!r}")
                check("W20 = 7.72 m/s" in joined, f"fall {label}: W20 = 7.72 m/s: {joined!r}")

    # JSON is SI with either --units, the same sentences in fall and zone
    js = ours(warnings_of("fall", "si", "json"))
    check(len(js) == 3, f"fall json: three warnings with figures: {js}")
    zs = [w for w in js if not fall_only(w)]
    for cmd, want in (("fall", js), ("zone", zs)):
        ju = ours(warnings_of(cmd, "us", "json"))
        check(ju == want, f"{cmd} --units us json: SI as without it: {ju} against {want}")
    check(ours(warnings_of("zone", "si", "json")) == zs,
          "zone json: the fall's warnings but the single fall's note on gusts")
    check(js == ours(warnings_of("fall", "si", "text")), "fall: the SI text says what JSON says")

    # the same figures in both units, to their printed precision
    us = ours(warnings_of("fall", "us", "text"))
    if len(us) == 3 and len(js) == 3:
        for words, factor in (("hover thrust", LBF), ("over", FT * FT), ("gives v_i", MPH),
                              ("a far wake of", MPH)):
            agrees(after(us[0], words), after(js[0], words), factor, f"downwash, {words}")
        for words, factor in (("past the rotor at", MPH), ("so v_i is", MPH),
                              ("below about", MPH)):
            agrees(after(us[1], words), after(js[1], words), factor, f"downwash, {words}")
        agrees(after(us[2], "W20 ="), after(js[2], "W20 ="), MPH, "gusts, W20")
        lean_us, lean_si = after(us[1], "the wake leans"), after(js[1], "the wake leans")
        check(lean_us is not None and lean_us == lean_si,
              f"the wake's lean is the same angle in both: {lean_us} and {lean_si}")

    # a sweep says a sentence once with the rows it is in: rows whose figures
    # differ beyond the digits shown say the same sentence (before the marks
    # it was grouped by its SI text; the marks must not split it)
    vary = ("sweep", path, "--vary", "release.height=27.2m:27.4m:0.1m")
    for units in ("si", "us"):
        rc, out, err = plumb(*vary, "--units", units, "--format", "csv")
        check(rc == 0, f"sweep --units {units}: exit {rc} {err.strip()[:200]}")
        # numbered "# warning N: " in order, N the rows' `warnings` column
        sw = [l for l in out.splitlines() if re.match(r"# warning \d+: ", l)]
        check([int(l.split()[2][:-1]) for l in sw] == list(range(1, len(sw) + 1)),
              f"sweep --units {units}: warnings numbered 1 .. N in order: {sw}")
        body = [l.split(": ", 1)[1] for l in sw]  # the sentence, without its number
        said = [b[:b.rfind(" (")] for b in body]
        check(len(said) == len(set(said)), f"sweep --units {units}: a sentence said twice: {sw}")
        check(len(sw) == 4 and all(l.endswith("(3 of 3 rows)") for l in sw),
              f"sweep --units {units}: each warning once, in 3 of 3 rows: {sw}")
        for l in ours(said):
            bad = SI_UNIT if units == "us" else US_UNIT
            check(not bad.search(l.replace("the mean wind at 20 ft", "")),
                  f"sweep --units {units}: a unit of the other system in {l!r}")
    # the rotor's inputs are stated with the other inputs, in the report's
    # units (1 lb = 0.45359237 kg, 1 ft = 0.3048 m: NIST SP 811), and JSON
    # gives them in SI under release.downwash
    si_in = " ".join(runs[("fall", "si", "text")].split("Inputs as understood", 1)[-1].split())
    us_in = " ".join(runs[("fall", "us", "text")].split("Inputs as understood", 1)[-1].split())
    check("downwash aircraft mass 6.35 kg, rotor disk area 0.93 m² (all rotors)" in si_in,
          f"fall --units si: the downwash inputs stated: {si_in[:300]!r}")
    want_us = (f"downwash aircraft mass {6.35 / 0.45359237:.4g} lb [6.35 kg], rotor disk area "
               f"{0.93 / 0.3048 ** 2:.4g} ft²")
    check(want_us in us_in, f"fall --units us: {want_us!r} in {us_in[:300]!r}")
    dj = json.loads(runs[("fall", "si", "json")])
    dw = (dj.get("inputs") or dj).get("release", {}).get("downwash") or {}
    check(dw.get("aircraft_mass_kg") == 6.35 and dw.get("disk_area_m2") == 0.93,
          f"fall json: release.downwash {dw}")
finally:
    shutil.rmtree(tmp)
finish()
