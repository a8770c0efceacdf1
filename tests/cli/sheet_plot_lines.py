"""`plumb sheet`: the energy-against-height plot of a kit with four items
drawn (tests/cli/profiles/four-curves.yaml: the lightest reaches its
limit far above the planned height, the others near the ground), read back from the PDF's content
stream (pdfseparate, then the page's stroked paths with the dash pattern
and width each is stroked with, "[a b] o d" and "w", PDF 32000-1:2008
8.4.3.6): every curve's line differs from every other curve's and from
the criteria's limit lines and the planned height's (README: "Nothing
relies on colour: lines differ by weight and dash"); every curve runs over
the same heights (their right ends at one x); on a logarithmic axis the
caption says what its 1, 2, 5 marks mean, not "each step up is ten times
the energy".
"""
import os
import re
import shutil
import subprocess
import sys
import tempfile
import zlib

sys.path.insert(0, os.path.join(os.path.dirname(os.path.abspath(__file__)), "lib"))
from plumbcli import HERE, PLUMB, ROOT, check, finish  # noqa: E402

KIT = os.path.join(HERE, "profiles/four-curves.yaml")
SUPP = "suppressions=" + os.path.join(ROOT, "tests/lsan.supp") + ":print_suppressions=0"
tmp = tempfile.mkdtemp(prefix="plumb-sheet-lines.", dir=os.environ.get("TMPDIR"))
pdf = os.path.join(tmp, "kit.pdf")
env = dict(os.environ, LC_ALL="C", SOURCE_DATE_EPOCH="1767225600",
           LSAN_OPTIONS=SUPP + ":" + os.environ.get("LSAN_OPTIONS", ""))
r = subprocess.run([PLUMB, "sheet", KIT, "-o", pdf], capture_output=True, text=True, env=env,
                   timeout=300)
check(r.returncode == 0 and os.path.exists(pdf), f"exit {r.returncode}: {r.stderr}")
text = subprocess.run(["pdftotext", pdf, "-"], capture_output=True, text=True).stdout
pages = text.split("\f")
page = next((i + 1 for i, p in enumerate(pages) if "Impact energy against drop height" in p
             and "the planned drop height" in p), 0)
check(page > 0, "the energy plot's page found")


def stroked(pdf, page):
    """The page's stroked paths: (points, dash, width), points (x, y), dash
    the dash array (() for solid)."""
    one = os.path.join(tmp, "page.pdf")
    subprocess.run(["pdfseparate", "-f", str(page), "-l", str(page), pdf, one], check=True)
    with open(one, "rb") as f:
        data = f.read()
    os.remove(one)
    out = []
    for m in re.finditer(rb"stream\r?\n(.*?)\r?\nendstream", data, re.S):
        try:
            body = zlib.decompress(m.group(1)).decode("latin-1")
        except zlib.error:
            continue
        dash, width, cur, nums = (), 1.0, [], []
        for tok in re.findall(r"\[[\d.\s]*\]\s*[\d.]+\s+d|\(.*?\)|\S+", body):
            if re.fullmatch(r"\[[\d.\s]*\]\s*[\d.]+\s+d", tok):
                # the dash array, () for a solid line
                dash = tuple(float(v) for v in tok[1:tok.index("]")].split())
                continue
            if re.fullmatch(r"-?(\d+\.?\d*|\.\d+)", tok):
                nums.append(float(tok))
                continue
            if tok == "w" and nums:
                width = nums[-1]
            elif tok == "m":
                cur = [(nums[-2], nums[-1])]
            elif tok == "l" and cur:
                cur.append((nums[-2], nums[-1]))
            elif tok in ("S", "s") and len(cur) > 1:
                out.append((cur, dash, width))
                cur = []
            elif tok in ("n", "f", "f*", "B", "W"):
                cur = []
            nums = []
    return out


# the plot's band of the page: from its heading down to its x axis's
# title (pdftotext -bbox), so that the side view above is left out
html = subprocess.run(["pdftotext", "-bbox", "-f", str(page), "-l", str(page), pdf, "-"],
                      capture_output=True, text=True).stdout if page else ""
bw = [(float(a), float(b), t) for a, b, t in
      re.findall(r'<word xMin="[\d.]+" yMin="([\d.]+)" xMax="[\d.]+" yMax="([\d.]+)">(.*?)</word>',
                 html)]
top = next((bw[i][1] for i in range(len(bw) - 2)
            if [w[2] for w in bw[i:i + 3]] == ["Impact", "energy", "against"]), None)
bottom = next((bw[i][0] for i in range(len(bw) - 3) if top and bw[i][0] > top and
               [w[2] for w in bw[i:i + 4]] == ["drop", "height", "above", "the"]), None)
check(top is not None and bottom is not None, f"the plot's band found: {top} to {bottom}")
paths = [p for p in (stroked(pdf, page) if page and bottom else [])
         if sum(top < y < bottom for _, y in p[0]) > len(p[0]) / 2]  # a curve clipped below
# the curves: the long polylines; the limit lines: dashed horizontal
# two-point lines across the curves' span; the planned height: vertical
curves = [p for p in paths if len(p[0]) > 20]
check(len(curves) == 4, f"four curves drawn: {len(curves)}")
styles = [(dash, round(w, 2)) for _, dash, w in curves]
check(len(set(styles)) == len(styles), f"every curve's line differs from the others': {styles}")
x0 = min(x for c, _, _ in curves for x, _ in c) if curves else 0
x1 = max(x for c, _, _ in curves for x, _ in c) if curves else 0
limits = [(dash, round(w, 2)) for c, dash, w in paths if len(c) == 2 and dash != ()
          and abs(c[0][1] - c[1][1]) < 0.01 and c[0][0] <= x0 + 1 and c[1][0] >= x1 - 40]
check(len(limits) >= 1, f"the limit lines found: {len(limits)}")
planned = [(dash, round(w, 2)) for c, dash, w in paths if len(c) == 2
           and abs(c[0][0] - c[1][0]) < 0.01 and x0 < c[0][0] < x1 and dash != ()]
check(len(planned) == 1, f"the planned height's line found: {planned}")
for s in styles:
    check(all(s[0] != dash for dash, _ in limits + planned),
          f"a curve ({s}) dashed unlike the limits' and the planned height's lines "
          f"{sorted(set(limits + planned))}")
ends = [max(x for x, _ in c) for c, _, _ in curves]
check(ends and max(ends) - min(ends) < 1.0, f"every curve over the same heights: right ends {ends}")
if "logarithmic scale" in text:
    check("each step up is ten times the energy" not in text and
          "1, 2 and 5 times each power of ten" in re.sub(r"\s+", " ", text),
          "the logarithmic axis's caption matches its 1, 2, 5 marks")

shutil.rmtree(tmp)
finish()
