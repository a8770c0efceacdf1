"""`plumb sheet` says what the clearance zone's samples say, the PDF read
back with poppler's pdftotext (independent of cairo and pango):
- a canopy that opens late in some samples (tests/cli/profiles/
  canopy-late.yaml): the sheet carries a "Spread over N samples" block
  with the zone's warnings word for word as `plumb zone --format json`
  gives them, the energy at 50, 95 and 99 % (the zone's JSON figures to
  the text report's 4 significant digits), the share of samples above
  each criterion's limit and its upper bound (as `plumb zone` prints them),
  and the uncertain inputs as `plumb zone` echoes them; the verdict table's
  nominal "within" is followed by the share of samples above that limit;
- with no zone.scatter the sheet says, in the text report's words, that
  bounce and deflection are not included;
- a zone whose samples all land on one point (tests/cli/profiles/
  still-mass.yaml: only the mass uncertain, from rest, no wind) gives no
  bearing for an ellipse it does not have ("every sample lands on the same
  point", as the text report says) and no bare "Keep clear: 0 m";
- a kit (profiles/demo/tower-kit.yaml): the spread and the verdicts
  shares are of the worst item, the one the verdict table judges; every
  warning of its falls (`plumb fall --format json`) and of its zones
  (`plumb zone --format json`) is said exactly once on the whole sheet,
  never as "item: sentence" once per item (the text report says a shared
  warning once, "sentence. (item, item)", README "Warnings");
- the landing region's area says whether the scatter allowance is in it
  (profiles/demo/drone-canopy.yaml has one);
- on every page the footer's short caution.
"""
import json
import math
import os
import re
import shutil
import subprocess
import sys
import tempfile

sys.path.insert(0, os.path.join(os.path.dirname(os.path.abspath(__file__)), "lib"))
from plumbcli import HERE, PLUMB, check, finish, plumb  # noqa: E402

LATE = os.path.join(HERE, "profiles/canopy-late.yaml")
STILL = os.path.join(HERE, "profiles/still-mass.yaml")
SUPP = "suppressions=" + os.path.join(os.path.dirname(os.path.dirname(HERE)),
                                      "tests/lsan.supp") + ":print_suppressions=0"
NO_SCATTER = "no scatter allowance given (zone.scatter): bounce and deflection are not included"

tmp = tempfile.mkdtemp(prefix="plumb-sheet-spread.", dir=os.environ.get("TMPDIR"))


def sheet(profile, name, *opts):
    pdf = os.path.join(tmp, name)
    env = dict(os.environ, LC_ALL="C", SOURCE_DATE_EPOCH="1767225600",
               LSAN_OPTIONS=SUPP + ":" + os.environ.get("LSAN_OPTIONS", ""))
    r = subprocess.run([PLUMB, "sheet", profile, "-o", pdf, *opts], capture_output=True,
                       text=True, env=env, timeout=300)
    check(r.returncode == 0 and os.path.exists(pdf), f"{name}: exit {r.returncode}: {r.stderr}")
    t = subprocess.run(["pdftotext", "-enc", "UTF-8", pdf, "-"], capture_output=True,
                       text=True).stdout.replace("\u00a0", " ")
    pages = [re.sub(r"\s+", " ", p) for p in t.split("\f") if p.strip()]
    return pages


def sig4(x):
    """x to 4 significant digits, trailing zeros kept, as the text report writes it."""
    dec = max(0, 3 - int(math.floor(math.log10(abs(x))))) if x != 0 else 0
    return f"{x:.{dec}f}"


def squeeze(s):
    return re.sub(r"\s+", " ", s).strip()


def footers(pages, what):
    for i, p in enumerate(pages, 1):
        check("competent or licensed person" in p and "local codes" in p,
              f"{what}: page {i} has the footer's caution")


# ---- a canopy that does not always open ------------------------------------------
# 800 samples, not the profile's 2000 (CPU time): the sheet and both zones
# run the same count, so the same samples; the checks below need the
# late-canopy warning, some samples above eu-c1-80j and a bounded landing
# region (its area's "no scatter allowance added"), which this seed's
# region first has at 600 (at 500 it is open: the 99 % bound reaches cells
# of no density).
LATE_N = ("--samples", "800")
pages = sheet(LATE, "late.pdf", *LATE_N)
text = " ".join(pages)
rc, out, err = plumb("zone", LATE, "--format", "json", *LATE_N)
z = json.loads(out)["zone"]
check(z["samples"] == 800, f"the late canopy's zone ran {z['samples']} samples, the sheet's count")
rc, ztext, err = plumb("zone", LATE, *LATE_N)
check(z["warnings"] and any("did not open before impact" in w for w in z["warnings"]),
      "the test profile's zone warns that the canopy did not open")
check(f"Spread over {z['samples']} samples" in text, "a 'Spread over N samples' block")
for w in z["warnings"]:
    check(squeeze(w) in text, f"the zone's warning on the sheet: {w[:60]}")
for k in ("p50", "p95", "p99"):
    fig = sig4(z["energy_j"][k]) + " J"
    check(fig in text, f"energy {k} {fig} of plumb zone on the sheet")
# the shares as plumb zone's text prints them: "37.2 %    35.08 % – 39.36 %, 744 of 2000"
shares = re.findall(r"^  (\S+) %\s+(\S+) % – (\S+) %, (\d+) of (\d+) samples above", ztext, re.M)
check(len(shares) == len(z["exceedance"]), f"plumb zone's exceedance lines read: {shares}")
for (p, lo, hi, n, tot), x in zip(shares, z["exceedance"]):
    # Clopper-Pearson's point is the share counted: count / samples
    check(int(n) == x["count"] and abs(float(p) / 100 - x["count"] / x["samples"] if "samples" in x
                                      else float(p) / 100 - x["count"] / z["samples"]) < 5e-4,
          f"{x['criterion']}: {p} % is {n} of {tot}")
    m = re.search(re.escape(f"[{x['criterion']}]") + r".{0,200}?" + re.escape(f"{p} % of samples above"),
                  text)
    check(m is not None, f"{x['criterion']}: '{p} % of samples above' on the sheet")
    check(f"up to {hi} %" in text, f"{x['criterion']}: the share's upper bound 'up to {hi} %'")
# the nominal verdict is not alone: "within" is followed by the share of samples above
eu = [x for x in z["exceedance"] if x["criterion"] == "eu-c1-80j"][0]
p_eu = [s[0] for s, x in zip(shares, z["exceedance"]) if x["criterion"] == "eu-c1-80j"][0]
check(eu["count"] > 0 and re.search(r"within \(nominal\) " + re.escape(p_eu) + r" % of samples above",
                                    pages[0]) is not None,
      f"page 1: the nominal 'within' of eu-c1-80j followed by '{p_eu} % of samples above'")
# the uncertain inputs, as plumb zone echoes them
block = ztext.split("Uncertain inputs\n", 1)[1].split("\n\n", 1)[0]
for line in block.splitlines():
    if line.startswith("  ") and not line.startswith("   "):
        key, _, rest = line.strip().partition(" ")
        words = squeeze(rest).split(";")[0]
        check(f"{key} {words}" in text, f"the uncertain input '{key} {words}' on the sheet")
check(NO_SCATTER in text, "no zone.scatter: the sheet says bounce and deflection are not included")
check(re.search(r"of impacts inside \([^)]*, no scatter allowance added\)", text) is not None,
      "no zone.scatter: the landing region's area says no allowance was added")
footers(pages, "late canopy")

# ---- with a scatter allowance: the landing region's area includes it, and says so
# 1000 samples, not the profile's 5000 (CPU time): the fewest hundreds at
# which this seed's landing region is bounded (open at 800), so its area
# is on the sheet
pages = sheet(os.path.join(os.path.dirname(os.path.dirname(HERE)), "profiles/demo/drone-canopy.yaml"),
              "canopy.pdf", "--samples", "1000")
text = " ".join(pages)
check(re.search(r"of impacts inside \([^)]* with the scatter allowance as a buffer\)", text)
      is not None, "zone.scatter given: the landing region's area is said to include it")
check(NO_SCATTER not in text, "zone.scatter given: not said to be missing")

# ---- a kit: the spread is of the item the verdict table judges (the worst),
# not only of the one that sets the clearance
# 500 samples, not the profile's 4000 (CPU time), for the sheet and the
# zone alike: the warnings checked are of the shapes and criteria, not of
# the count (the same set at 500 as at 4000), and at 500 the sheet still
# has every block the profile's own count gives it (its landing circle
# and region bounded: at p = 0.99 at least 368 samples counted against
# the centre fixed by the first quarter, README "Where the impacts land")
KIT = os.path.join(os.path.dirname(os.path.dirname(HERE)), "profiles/demo/tower-kit.yaml")
KIT_N = ("--samples", "500")
pages = sheet(KIT, "kit.pdf", *KIT_N)
text = " ".join(pages)
rc, out, err = plumb("fall", KIT, "--format", "json")
worst = json.loads(out)["worst"]
worst = worst["name"] if isinstance(worst, dict) else worst
check(f"samples of {worst}, the item judged above" in text,
      f"kit: the spread is of the worst item, {worst}")
check(re.search(r"(within|exceeds) \(nominal\) [\d.]+ % of samples above", pages[0]) is not None,
      "kit: the worst item's verdicts carry its share of samples above")
fall_items = json.loads(out)["items"]
rc, zout, err = plumb("zone", KIT, "--format", "json", *KIT_N)
said = {squeeze(w) for it in fall_items for w in it["warnings"]}
said |= {squeeze(w) for it in json.loads(zout)["items"] for w in it["zone"]["warnings"]}
check(len(said) >= 3, f"kit: the profile's falls and zones warn: {len(said)} warnings")
flat = squeeze(text)
for w in sorted(said):
    # its first 60 characters: a warning is not split across a page there
    n = flat.count(w[:60])
    check(n == 1, f"kit: said once on the sheet, not {n} times: {w[:60]}")
per_item = [f"{it['name']}: {w[:30]}" for it in fall_items for w in sorted(said)
            if f"{it['name']}: {w[:30]}" in flat]
check(not per_item, f"kit: no warning as 'item: sentence': {per_item}")

# ---- a kit of two whose zones give the same warning (a late canopy,
# which their falls do not give): said once, with both items, in the
# profile's order, as `plumb zone` gives it word for word
latekit = os.path.join(tmp, "latekit.yaml")
with open(LATE) as f:
    late = f.read()
with open(latekit, "w") as f:
    f.write(late.replace("payload:\n  mass: 1.93 kg\n  drag: {cd: 1.05, area: 0.0187 m^2}\n",
                         "items:\n  - name: marker A\n    mass: 1.93 kg\n"
                         "    drag: {cd: 1.05, area: 0.0187 m^2}\n  - name: marker B\n"
                         "    mass: 1.95 kg\n    drag: {cd: 1.05, area: 0.0187 m^2}\n")
            .replace("  payload.mass: {uniform: [1.7 kg, 2.2 kg]}\n", "")
            .replace("samples: 2000", "samples: 500"))
pages = sheet(latekit, "latekit.pdf")
flat = squeeze(" ".join(pages))
rc, zout, err = plumb("zone", latekit, "--format", "json")
zk = json.loads(zout)["items"]
shared = [squeeze(w) for w in zk[0]["zone"]["warnings"]
          if "did not open before impact" in w and w in zk[1]["zone"]["warnings"]]
check(len(zk) == 2 and len(shared) == 1, f"two items' zones give the same late-canopy warning: {shared}")
for w in shared:
    check(flat.count(w[:60]) == 1, f"the shared warning said once: {flat.count(w[:60])}")
    check(w + " (marker A, marker B)" in flat, "the shared warning names both items, in order")
    check(f"marker A: {w[:30]}" not in flat and f"marker B: {w[:30]}" not in flat,
          "the shared warning not once per item")
os.remove(latekit)

# ---- every sample on one point -----------------------------------------------------
pages = sheet(STILL, "still.pdf")
text = " ".join(pages)
rc, out, err = plumb("zone", STILL, "--format", "json")
zs = json.loads(out)["zone"]
check(zs["ellipse95"] is None or zs["ellipse95"].get("bearing_deg") is None,
      f"plumb zone gives no ellipse bearing: {zs['ellipse95']}")
check("major axis" not in text, "one landing point: no major axis and no bearing on the sheet")
check("every sample lands on the same point" in text, "one landing point: said as the text says it")
check(not re.search(r"Keep clear: 0 m \(0 ft\) around", text), "no bare 'Keep clear: 0 m'")
check("no spread computed" in text and "keep clear as local practice requires" in text,
      "a 0 m keep-clear says what it means")
check(NO_SCATTER in text, "one landing point: bounce and deflection not included, said")
footers(pages, "still air")

shutil.rmtree(tmp)
finish()
