"""`plumb sheet`: the inventory table breaks an item name with no spaces
after its own '_', '-' or '/', and cuts one with none where the column
ends, marking each cut with a trailing backslash as the text reports do
(src/report/textout.h, CUT_MARK); the name column stays within a cap (it
took half the page for one 57-letter name); the masses without padding
zeros, and "Prepared by" and "Checked by" with their signatures in one
column whether a name is given or not. Read back with poppler's
pdftotext -bbox (independent of cairo and pango, which wrote it).
"""
import os
import re
import shutil
import subprocess
import sys
import tempfile
from html import unescape

sys.path.insert(0, os.path.join(os.path.dirname(os.path.abspath(__file__)), "lib"))
from plumbcli import HERE, PLUMB, check, finish  # noqa: E402

KIT = os.path.join(HERE, "profiles/unbroken-names.yaml")
UNDER = "Ratschenschlüssel_mit_Verlängerung_und_extra_langem_Griff"
BARE = "PN4471290035XQ7781234509876ABCDEFGHJKLMNPQRSTUVWXYZ0987654321ZYXW"
SUPP = "suppressions=" + os.path.join(os.path.dirname(os.path.dirname(HERE)),
                                      "tests/lsan.supp") + ":print_suppressions=0"
MM = 72.0 / 25.4
BODY_W = 595.276 - 2 * 15 * MM  # A4 less the 15 mm margins

tmp = tempfile.mkdtemp(prefix="plumb-sheet-names.", dir=os.environ.get("TMPDIR"))
pdf = os.path.join(tmp, "names.pdf")
env = dict(os.environ, LC_ALL="C", SOURCE_DATE_EPOCH="1767225600",
           LSAN_OPTIONS=SUPP + ":" + os.environ.get("LSAN_OPTIONS", ""))
r = subprocess.run([PLUMB, "sheet", KIT, "-o", pdf], capture_output=True, text=True, env=env,
                   timeout=300)
check(r.returncode == 0 and os.path.exists(pdf), f"exit {r.returncode}: {r.stderr}")
html = subprocess.run(["pdftotext", "-bbox", pdf, "-"], capture_output=True, text=True).stdout
words = [(float(a), float(b), unescape(t).replace("\u00a0", " "))
         for a, b, t in re.findall(r'<word xMin="([\d.]+)" yMin="[\d.]+" xMax="([\d.]+)" '
                                   r'yMax="[\d.]+">(.*?)</word>', html)]


def pieces(name, mark):
    """The table's lines of name: among the words (pdftotext -bbox: a
    line's end is a word's end) that are a part of it of 6 letters or more
    (a trailing mark taken off when mark is given), the first run that
    makes it up. [] if none."""
    cand = []
    for x0, x1, t in words:
        bare = t[:-1] if mark and t.endswith(mark) else t
        if len(bare) >= 6 and bare != name and bare in name:
            cand.append((x0, x1, t, bare))
    for i in range(len(cand)):
        got = ""
        for j in range(i, len(cand)):
            if not name.startswith(got + cand[j][3]):
                break
            got += cand[j][3]
            if got == name:
                return [c[:3] for c in cand[i:j + 1]]
    return []


ps = pieces(UNDER, None)
text = "".join(t for _, _, t in ps)
check(text == UNDER, f"the '_' name's lines make it up whole: {[t for _, _, t in ps]}")
check(len(ps) >= 2 and all(t.endswith(("_", "-", "/")) for _, _, t in ps[:-1]),
      f"the '_' name broken only after its '_': {[t for _, _, t in ps]}")
check("\\" not in text, "the '_' name is never cut with a mark")
widest = max((x1 - x0 for x0, x1, _ in ps), default=BODY_W)
check(widest < 0.35 * BODY_W, f"the name column within a cap: {widest:.0f} pt of {BODY_W:.0f}")

ps = pieces(BARE, "\\")
check(len(ps) >= 2 and all(t.endswith("\\") for _, _, t in ps[:-1]) and not ps[-1][2].endswith("\\"),
      f"the name with no break character cut with a trailing '\\': {[t for _, _, t in ps]}")
check("".join(t.rstrip("\\") for _, _, t in ps) == BARE, "its lines, marks taken off, make it up whole")
widest = max((x1 - x0 for x0, x1, _ in ps), default=BODY_W)
check(widest < 0.35 * BODY_W, f"the cut name within the cap: {widest:.0f} pt of {BODY_W:.0f}")

# the masses as the text report's table gives them (plumb fall: %.4g),
# not padded with zeros the profile did not give
plain = re.sub(r"\s+", " ", subprocess.run(["pdftotext", pdf, "-"], capture_output=True,
                                           text=True).stdout.replace("\u00a0", " "))
for m in ("0.9 kg", "0.381 kg", "0.212 kg"):
    check(m in plain, f"the table's mass '{m}'")
check("0.9000 kg" not in plain and "0.2120 kg" not in plain, "no mass padded with zeros")
# "Prepared by" with a name and "Checked by" without: one signature column
sig = [x0 for x0, _, t in words if t == "signature"]
check(len(sig) == 2 and abs(sig[0] - sig[1]) < 0.5, f"the signature lines under each other: {sig}")

shutil.rmtree(tmp)
finish()
