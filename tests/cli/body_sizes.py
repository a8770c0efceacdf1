#!/usr/bin/python3
"""The size of the body itself is in inches in a US report (--units us is
US throughout a report: a US reader should convert nothing): a shape's edges, length,
diameter and thickness and a sphere's diameter, as a tool or a box is
measured, while heights and distances stay in feet and a canopy's diameter
in feet beside its area in ft². In the text (fall, limit; a zone's
uncertain height stays in feet), the CSV of a limit and the PDF sheet
(its inputs are the text report's):
  - the unit words: "in" for each size, "ft" for the release height;
  - each figure in inches is the SI run's figure in metres divided by
    0.0254 (1 in = 0.0254 m exactly: 1959 international yard and pound
    agreement; NIST SP 811 (2008), Appendix B.8, seen), to the digits
    printed.
Usage: body_sizes.py PATH/TO/plumb   (prints `cli: N passed, N failed`)
"""
import atexit
import csv
import io
import os
import re
import shutil
import subprocess
import sys
import tempfile

sys.path.insert(0, os.path.join(os.path.dirname(os.path.abspath(__file__)), "lib"))
from plumbcli import PLUMB, ROOT, check, finish, plumb  # noqa: E402

INCH, FT = 0.0254, 0.3048
tmp = tempfile.mkdtemp(prefix="plumb-body-sizes.", dir=os.environ.get("TMPDIR"))
atexit.register(shutil.rmtree, tmp, True)

# Test profile (invented): four items knocked off a gantry 17.3 m up, each
# size a high-entropy figure, one given in inches.
KIT = os.path.join(tmp, "kit.yaml")
with open(KIT, "w") as f:
    f.write("""name: gantry kit
items:
  - name: tool case
    mass: 3.17 kg
    shape: {kind: box, edges: [0.3137 m, 0.2083 m, 0.0971 m], attitude: tumbling}
  - name: drift pin
    mass: 0.611 kg
    shape: {kind: cylinder, length: 0.4127 m, diameter: 0.0283 m, attitude: broadside}
  - name: ball
    mass: 0.742 kg
    shape: {kind: sphere, diameter: 0.0637 m}
  - name: shim plate
    mass: 0.388 kg
    shape: {kind: plate, edges: [7.25 in, 3.1 in], thickness: 0.0063 m, attitude: tumbling}
release:
  height: 17.3 m
""")
# the sphere drag model's own diameter
BALL = os.path.join(tmp, "ball.yaml")
with open(BALL, "w") as f:
    f.write("name: bearing ball\npayload:\n  mass: 0.287 kg\n"
            "  drag: {model: sphere, diameter: 0.0413 m}\nrelease: {height: 11.9 m}\n")

FIG = re.compile(r"(?<![\w.-])(\d+(?:\.\d+)?(?:e[-+]?\d+)?) (in|ft|m)(?![\w/²·])")


def flat(text):
    return " ".join(text.split())


def figs(text):
    """(value in m, one unit of the last digit in m, unit) of each length."""
    out = []
    for num, unit in FIG.findall(text):
        f = {"in": INCH, "ft": FT, "m": 1.0}[unit]
        mant, _, exp = num.partition("e")
        dec = len(mant.split(".")[1]) if "." in mant else 0
        out.append((float(num) * f, 10.0 ** (-dec + int(exp or 0)) * f, unit))
    return out


def agree(us, si):
    """Same figures, each US one the SI one to the digits printed."""
    if len(us) != len(si):
        return f"{len(us)} figures in US, {len(si)} in SI"
    for a, b in zip(us, si):
        if abs(a[0] - b[0]) > a[1] + b[1]:
            return f"{a[0] / {'in': INCH, 'ft': FT, 'm': 1.0}[a[2]]} {a[2]} is not {b[0]} m"
    return ""


def sizes(text, phrase):
    """The figures of the text from `phrase` up to the next ';' or ' Cd '."""
    t = flat(text)
    i = t.find(phrase)
    if i < 0:
        return ""
    part = t[i:]
    return re.split(r"; | Cd ", part, 1)[0]


# ---- fall: the inputs as understood ---------------------------------------------
rc_si, si, e1 = plumb("fall", KIT)
rc_us, us, e2 = plumb("fall", KIT, "--units", "us")
check(rc_si == 0 and rc_us == 0, f"fall runs ({e1.strip()} {e2.strip()})")
for phrase, n in (("box ", 3), ("cylinder ", 2), ("sphere of diameter", 1), ("plate ", 3)):
    s_si, s_us = sizes(si, "drag " + phrase), sizes(us, "drag " + phrase)
    f_si, f_us = figs(s_si), figs(s_us)
    check(len(f_us) == n and all(u == "in" for _, _, u in f_us),
          f"fall US: the {phrase.strip()}'s sizes in inches: {s_us!r}")
    check(len(f_si) == n and all(u == "m" for _, _, u in f_si),
          f"fall SI: the {phrase.strip()}'s sizes in metres: {s_si!r}")
    msg = agree(f_us, f_si)
    check(not msg, f"fall: the {phrase.strip()}'s inches are its metres / 0.0254 ({msg})")
# the shim plate's 7.25 in comes back as typed (to the 4 digits shown)
check("plate 7.25 in x 3.1 in, 0.248 in thick" in flat(us),
      f"fall US: a size given in inches reads as given: {sizes(us, 'drag plate')!r}")
# no length in metres in the inputs as understood (the drag's source words
# the faces and edges without figures: the figures are those printed
# before it)
def inputs(text):
    return flat(text.split("\nInputs as understood\n")[-1].split("\nProfile ")[0])


m_us = [f for f in figs(inputs(us)) if f[2] == "m"]
check("Inputs as understood" in us and not m_us, f"fall US: no length in metres: {m_us}")
# heights stay in feet: 17.3 m = 56.76 ft
check("56.76 ft above the strike level" in flat(us), "fall US: the release height in feet")

rc_si, si, _ = plumb("fall", BALL)
rc_us, us, _ = plumb("fall", BALL, "--units", "us")
s_si, s_us = sizes(si, "sphere of diameter"), sizes(us, "sphere of diameter")
check(rc_si == 0 and rc_us == 0 and re.search(r"diameter \d[\d.]* in,", s_us)
      and not agree(figs(s_us)[:1], figs(s_si)[:1]),
      f"fall US: a sphere drag model's diameter in inches: {s_us!r} / {s_si!r}")
m_us = [f for f in figs(inputs(us)) if f[2] == "m"]
check(not m_us, f"fall US: no length in metres for a sphere model: {m_us}")

# ---- limit: the answer, the scan and the profile's own value ---------------------
args = ("limit", KIT, "--find", "payload.shape.thickness", "--energy-max", "7.3J")
rc_si, si, _ = plumb(*args)
rc_us, us, _ = plumb(*args, "--units", "us")
shim_us = flat(us.split("shim plate")[1].split("Profile")[0]) if "shim plate" in us else ""
shim_si = flat(si.split("shim plate")[1].split("Profile")[0]) if "shim plate" in si else ""
m = re.search(r"items\[\d+\]\.shape\.thickness = ([\d.]+) in \(([\d.]+) m, the unit it was given in\)",
              shim_us)
check(rc_us == 0 and m and abs(float(m.group(1)) * INCH / float(m.group(2)) - 1) < 2e-6,
      f"limit US: the thickness in inches and in the metres it was given in:\n{shim_us}")
strip = re.compile(r" \([^()]*, the unit it was given in\)")
f_us, f_si = figs(strip.sub("", shim_us)), figs(strip.sub("", shim_si))
check(f_us and all(u == "in" for _, _, u in f_us) and not agree(f_us, f_si),
      f"limit US: every thickness in inches, the SI figures / 0.0254 ({agree(f_us, f_si)}):\n"
      f"{shim_si}\n{shim_us}")
for rc, out, unit in ((rc_si, plumb(*args, "--format", "csv")[1], "m"),
                      (rc_us, plumb(*args, "--format", "csv", "--units", "us")[1], "in")):
    rows = list(csv.DictReader(io.StringIO("\n".join(l for l in out.splitlines()
                                                     if not l.startswith("#")))))
    ex = next((r["explanation"] for r in rows if r["name"] == "shim plate"), "")
    check(ex and {u for _, _, u in figs(ex)} == {unit},
          f"limit CSV --units {'us' if unit == 'in' else 'si'}: thickness in {unit}: {ex}")

# a canopy's diameter stays in feet (it is sized with its area, in ft²)
rc, out, _ = plumb("limit", os.path.join(ROOT, "profiles/demo/drone-canopy.yaml"), "--find",
                   "descent.diameter", "--speed-max", "5m/s", "--units", "us")
check(rc == 0 and re.search(r"descent\.diameter = [\d.]+ ft", out),
      "limit US: a canopy's diameter in feet")

# ---- zone: an uncertain height stays in feet ---------------------------------------
# (no size of the body can carry an uncertainty: the loader turns a shape
# into cd and area; the zone's lengths are heights and distances). The
# line checked echoes the input, whatever the count: 50 samples of a 90 %
# zone (bounded from 29, 0.9^29 < 0.05, order statistics), not 500.
zargs = ("zone", BALL, "--samples", "50", "--confidence", "0.9", "--threads", "1",
         "--set", "uncertainty={release.height: {uniform: [11.3 m, 12.7 m]}}")
rc_si, si, e1 = plumb(*zargs)
rc_us, us, e2 = plumb(*zargs, "--units", "us")
line_si = next((l for l in si.splitlines() if "release.height" in l), "")
line_us = next((l for l in us.splitlines() if "release.height" in l), "")
f_si, f_us = figs(line_si), figs(line_us)
check(rc_si == 0 and rc_us == 0 and len(f_us) == 2 and {u for _, _, u in f_us} == {"ft"}
      and not agree(f_us, f_si),
      f"zone US: the uncertain height in feet ({e1.strip()} {e2.strip()}):\n"
      f"{line_si}\n{line_us}")

# ---- the sheet: its inputs are the text report's -----------------------------------
pdf = os.path.join(tmp, "kit.pdf")
# under the sanitizer build: fontconfig's process-long caches are not
# leaks of ours (tests/lsan.supp says why), as in sheet.py
supp = "suppressions=" + os.path.join(ROOT, "tests/lsan.supp") + ":print_suppressions=0"
r = subprocess.run([PLUMB, "sheet", KIT, "-o", pdf, "--units", "us"], capture_output=True,
                   text=True, env=dict(os.environ, LC_ALL="C", LSAN_OPTIONS=supp + ":" +
                                       os.environ.get("LSAN_OPTIONS", "")))
rc, err = r.returncode, r.stderr
text = subprocess.run(["pdftotext", "-layout", pdf, "-"], capture_output=True,
                      text=True).stdout if rc == 0 else ""
s_us = sizes(text, "box ")
check(rc == 0 and len(figs(s_us)) == 3 and {u for _, _, u in figs(s_us)} == {"in"},
      f"sheet US: the box's edges in inches ({err.strip()}): {s_us!r}")

finish()
