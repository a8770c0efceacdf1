#!/usr/bin/python3
"""At a limit, the energy and the limit it is judged against never print
the wrong way round for their verdict, in any format.

README.md "Criteria": a limit is printed rounded down, so that a figure
shown within it is within it; the energy beside it is printed to the
nearest. At 4 figures a drop just below a limit of 78.637 J printed
"78.64 J" beside "limit 78.63 J", "ratio 1.00, within". Each compared
pair (energy and limit, in J and in ft·lbf; ratio and 1) must show the
side the verdict says, with more figures where 4 (3 for a ratio) do not:
below the limit printed below it, above printed above it, never equal
unless they are.

Sources of the checked values:
  - work-energy theorem, no drag: E = m g0 h, g0 = 9.80665 m/s^2
    (standard gravity, 3rd CGPM, 1901); the profile's body has Cd 0 and
    1 kg, and no site latitude (gravity g0).
  - 58 ft·lbf = 58 x 1.3558179483 J = 78.6374410 J (NIST SP 811, 2008,
    Appendix B.8, 1 ft·lbf = 1.355818 J; the criterion file's factor);
    exceeded above it (profiles/criteria/ddesb-fragment-58ftlbf.yaml).
  - eu-c1-80j: "less than 80 J" (Commission Delegated Regulation (EU)
    2019/945, Annex, Part 2), exceeded at or above 80 J.
Usage: verdict_digits.py PATH/TO/plumb   (prints `cli: N passed, N failed`)
"""
import csv
import io
import os
import re
import sys

sys.path.insert(0, os.path.join(os.path.dirname(os.path.abspath(__file__)), "lib"))
from plumbcli import HERE, check, finish, plumb  # noqa: E402

PROFILE = os.path.join(HERE, "profiles", "at-the-limit.yaml")
G0 = 9.80665
FT_LBF_J = 1.3558179483
LIMITS = {"ddesb-fragment-58ftlbf": (58.0 * FT_LBF_J, False), "eu-c1-80j": (80.0, True)}
NUM = r"([0-9]+(?:\.[0-9]+)?)"


def truth(e, crit):
    """(exceeds, order) of energy e against crit: order -1 below, 0 at, +1 above."""
    lim, strict = LIMITS[crit]
    return (e >= lim if strict else e > lim), (e > lim) - (e < lim)


def agrees(label, shown_e, shown_l, e, crit, word):
    """The pair shown (energy, limit) reads as the truth, and the word says it."""
    exceeds, order = truth(e, crit)
    check(word == ("exceeds" if exceeds else "within"),
          f"{label}: verdict {word!r} for {e!r} J against {crit}")
    shown = (shown_e > shown_l) - (shown_e < shown_l)
    check(shown == order, f"{label}: {shown_e} shown beside {shown_l} reads "
          f"{'above' if shown > 0 else 'below' if shown < 0 else 'at'} the limit, but {e!r} J is "
          f"{'above' if order > 0 else 'below' if order < 0 else 'at'} it ({crit})")


# heights (m) just either side of each limit: E = g0 h (1 kg)
CASES = [
    ("below 58 ft·lbf", 8.018705, "ddesb-fragment-58ftlbf"),  # 78.63663 J < 78.63744 J
    ("just below 58 ft·lbf", 8.01878, "ddesb-fragment-58ftlbf"),  # 78.63737 J
    ("just above 58 ft·lbf", 8.0188, "ddesb-fragment-58ftlbf"),   # 78.63756 J
    ("just below 80 J", 8.1577, "eu-c1-80j"),                     # 79.99970 J < 80 J
]

for label, h, crit in CASES:
    e = G0 * h
    for units in ("si", "us"):
        tag = f"{label}, {units}"
        rc, out, err = plumb("fall", PROFILE, "--set", f"release.height={h} m", "--units", units)
        check(rc == 0, f"{tag}: exit 0 (got {rc}: {err.strip()})")
        text = re.sub(r"\s+", " ", out)
        m = re.search(r"against " + NUM + r" (J|ft·lbf) \(" + NUM + r" (?:J|ft·lbf)\) at impact", text)
        check(m is not None, f"{tag}: the criteria's heading gives the energy")
        if not m:
            continue
        e1, e2 = float(m.group(1)), float(m.group(3))
        first_j = m.group(2) == "J"
        name = "Explosives-safety" if crit.startswith("ddesb") else "EU unmanned"
        v = re.search(name + r"[^\n]*? limit " + NUM + r" (?:J|ft·lbf) \(" + NUM +
                      r" (?:J|ft·lbf)\), ratio " + NUM + r", (within|exceeds)", text)
        check(v is not None, f"{tag}: the verdict line of {crit}")
        if not v:
            continue
        l1, l2, ratio, word = float(v.group(1)), float(v.group(2)), float(v.group(3)), v.group(4)
        ej, ef = (e1, e2) if first_j else (e2, e1)
        lj, lf = (l1, l2) if first_j else (l2, l1)
        agrees(f"{tag}: J", ej, lj, e, crit, word)
        agrees(f"{tag}: ft·lbf", ef, lf, e, crit, word)
        agrees(f"{tag}: ratio", ratio, 1.0, e, crit, word)
        # the impact block gives the same figure as the heading
        check(f"energy {m.group(1)} {m.group(2)}" in text,
              f"{tag}: the impact energy reads as the heading's {m.group(1)} {m.group(2)}")

    # a sweep over the height (one row): the
    # table's energy and ratio beside the legend's limit
    rc, out, err = plumb("sweep", PROFILE, "--vary", f"release.height={h}m:{h}m:1m")
    check(rc == 0, f"{label}: sweep exits 0 (got {rc}: {err.strip()})")
    k = 1 if crit.startswith("ddesb") else 2
    row = re.search(r"^\s+[0-9.]+\s+" + NUM + r"\s+" + NUM + r"\s+" + NUM, out, re.M)
    legend = out.split("\nCriteria (ratio = energy / limit)\n")[-1]
    lim = re.search(rf"^  C{k}  [^\n]*(?:\n      [^\n]*)*?limit " + NUM + r" J \(" + NUM + r" ft·lbf\)",
                    legend, re.M)
    cells = re.findall(r"^\s+[0-9.]+\s+" + NUM + r" (EXCEEDS|within)\s+" + NUM +
                       r" (EXCEEDS|within)$", out, re.M)
    check(row is not None and lim is not None and len(cells) == 1,
          f"{label}: sweep table row, ratio row and legend found")
    if row and lim and cells:
        ratio, word = cells[0][2 * (k - 1)], cells[0][2 * (k - 1) + 1].lower()
        agrees(f"{label}: sweep J", float(row.group(2)), float(lim.group(1)), e, crit, word)
        agrees(f"{label}: sweep ft·lbf", float(row.group(3)), float(lim.group(2)), e, crit, word)
        agrees(f"{label}: sweep ratio", float(ratio), 1.0, e, crit, word)

    # CSV: the energy column, the ratio column, the limit in its comment line
    rc, out, err = plumb("fall", PROFILE, "--set", f"release.height={h} m", "--format", "csv")
    check(rc == 0, f"{label}: CSV exits 0 (got {rc}: {err.strip()})")
    lim = re.search(r"^# criterion " + re.escape(crit) + r":.*?, limit ([0-9.e+-]+) J,", out, re.M)
    rows = list(csv.DictReader(io.StringIO("\n".join(
        ln for ln in out.splitlines() if not ln.startswith("#")))))
    check(lim is not None and len(rows) == 1, f"{label}: CSV limit comment and row found")
    if lim and rows:
        word = rows[0][f"{crit}_verdict"]
        agrees(f"{label}: CSV J", float(rows[0]["energy_j"]), float(lim.group(1)), e, crit, word)
        agrees(f"{label}: CSV ratio", float(rows[0][f"{crit}_ratio"]), 1.0, e, crit, word)

finish()
